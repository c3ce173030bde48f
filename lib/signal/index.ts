// Public API of lib/signal: re-exports only.
export { findWholeCycles, type CycleWindow, type SignalFailure } from './cycles.js';
export { estimateFrequency, FREQUENCY_METHOD } from './frequency.js';
export {
	waveformFigures,
	averageRespondingReading,
	AVERAGE_RESPONDING_FACTOR,
	type WaveformFigures,
} from './levels.js';
export { minOf, maxOf } from './extremes.js';
export { perCycleFigures, type PerCycleFigures } from './per-cycle.js';
export {
	signalWarnings,
	MAINS_FREQUENCY_RANGES_HZ,
	MIN_RECOMMENDED_CYCLES,
	DC_OFFSET_WARNING_RATIO,
} from './warnings.js';
export { fitSharedSine, type SineFit, type SineFitChannel, type SineFitFailure } from './sine-fit.js';
export { channelResolution, type ChannelResolution } from './code-step.js';
export { cyclesText } from './format.js';
