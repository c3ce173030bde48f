// Public API of lib/polyphase: re-exports only. The owner of this folder fills it in.
export {};
