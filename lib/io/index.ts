// Public API of lib/io: text or bytes -> Capture. Re-exports only.
export * from './import-error.js';
