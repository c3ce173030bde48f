// Public API of lib/trend: re-exports only. The owner of this folder fills it in.
export {};
