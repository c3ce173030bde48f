// Public API of lib/limits: re-exports only.
export * from './types.js';
export { EN50160_TABLE } from './en50160.js';
export { IEC61000_2_2_TABLE } from './iec61000-2-2.js';
export { IEEE519_TABLE } from './ieee519.js';
export { evaluateLimits, LIMIT_TABLES, ONE_OFF_CAPTURE_NOTE } from './evaluate.js';
export {
	FLICKER_LIMIT_TABLES,
	evaluateFlickerLimits,
	levelNotExceeded,
	type FlickerFigure,
	type FlickerLimitCheck,
	type FlickerLimitEvaluation,
	type FlickerLimitRow,
	type FlickerLimitTable,
	type FlickerLimitTableId,
	type FlickerMeasured,
} from './flicker.js';
export * from './en50160-events.js';
