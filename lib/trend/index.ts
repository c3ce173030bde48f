// Public API of lib/trend: re-exports only.
export * from './types.js';
export { createTrendAnalyser, TREND_DEFAULT_THRESHOLDS, type TrendAnalyser } from './analyser.js';
export { analyseTrend } from './analyse-capture.js';
export { declaredVoltageFromRms, COMMON_NOMINAL_VOLTAGES_V } from './declared-voltage.js';
export { TREND_MAX_ORDER } from './window-thd.js';
export { TrendFlickerTracker, type TrendFlicker, type TrendFlickerRow } from './flicker-tracker.js';
export {
	trendLimitProblem,
	TREND_MIN_SAMPLE_RATE_HZ,
	TREND_MAX_SAMPLE_RATE_HZ,
	TREND_MAX_CHANNELS,
	TREND_RING_BUDGET_BYTES,
	type TrendLimitProblem,
} from './limits.js';
export { clockTimeOf } from './clock.js';
export {
	createRecordingAnalyser,
	CONTIGUOUS_TOLERANCE_S,
	RecordingMismatch,
	type RecordingAnalyser,
	type RecordingOptions,
	type RecordingPartHeader,
} from './recording.js';
export type { RecordingGap, RecordingOverlap, RecordingPart, RecordingResult } from './recording-types.js';
export {
	byName,
	orderRecordingParts,
	planRecording,
	type RecordingOrder,
	type RecordingPartInfo,
	type RecordingPlan,
} from './recording-order.js';
export {
	runTrendHelperSession,
	type TrendHelperChannel,
	type TrendHelperInit,
	type TrendHelperResult,
} from './helper-link.js';
export { fileList } from './file-list.js';
// the window resampler's WebAssembly text, for the build step that compiles it (src/cli/build-resample-simd.ts)
export { resampleSimdWat } from './resample-simd-source.js';
