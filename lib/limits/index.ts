// Public API of lib/limits: re-exports only. The owner of this folder fills it in.
export {};
