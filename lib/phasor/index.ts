// Public API of lib/phasor (phasor algebra, the one angle wrap, symmetrical components): re-exports only.
// lib/power and lib/polyphase re-export it too, for their callers.
export * from './phasor.js';
export * from './sequence.js';
