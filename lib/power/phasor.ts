// Phasor algebra moved to lib/phasor (the base lib/power and lib/polyphase both use); kept for callers of this path.
export * from '../phasor/phasor.js';
