// Public API of lib/power: re-exports only.
export * from './phasor.js';
export * from './sample-span.js';
export * from './phase-angle.js';
export * from './time-lag.js';
export * from './load-character.js';
export * from './single-phase.js';
export * from './three-phase.js';
export * from './phase-label.js';
export * from './pairing.js';
export * from './from-samples.js';
export * from './harmonic-power.js';
