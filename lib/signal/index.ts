// Public API of lib/signal: re-exports only. The owner of this folder fills it in.
export {};
