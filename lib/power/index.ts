// Public API of lib/power: re-exports only. The owner of this folder fills it in.
export {};
