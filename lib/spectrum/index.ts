// Public API of lib/spectrum: re-exports only. The owner of this folder fills it in.
export {};
export * from './types.js';
