// Public API of lib/report: re-exports only. The owner of this folder fills it in.
export {};
