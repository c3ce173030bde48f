// Public API of lib/polyphase: re-exports only.
export * from './sequence.js';
export * from './rotation.js';
export * from './unbalance.js';
export * from './line-voltages.js';
export * from './neutral.js';
export * from './connection.js';
export * from './from-samples.js';
export * from './artificial-neutral.js';
