// Sinecheck's signal library: the public API in one file. Re-exports only.
// Each area's own index.ts lists what it exports; names must be unique across areas.
export * from './capture.js';
export * from './channel-identity.js';
export * from './io/index.js';
export * from './signal/index.js';
export * from './spectrum/index.js';
export * from './power/index.js';
export * from './polyphase/index.js';
export * from './limits/index.js';
export * from './flicker/index.js';
export * from './trend/index.js';
export * from './report/index.js';
export * from './next-steps/index.js';
