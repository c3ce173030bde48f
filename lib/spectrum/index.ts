// Public API of lib/spectrum: re-exports only.
export * from './types.js';
export { dftPlan, dftReal, DFT_MAX_LENGTH, type DftPlan } from './dft.js';
export { iecHarmonicGroups } from './groups.js';
export { thdFPercent, thdRPercent, thdFigures } from './thd.js';
export {
	harmonicWindow,
	harmonicWindowCore,
	type HarmonicWindowCore,
	defaultWindowCycles,
	basicWindowCycles,
	MAX_HARMONIC_ORDER,
	type HarmonicWindowOptions,
} from './harmonics.js';
export {
	harmonicAnalysis,
	aggregateHarmonicWindows,
	type HarmonicAggregate,
	type HarmonicAnalysis,
	type HarmonicAnalysisOptions,
} from './harmonic-analysis.js';
export { syncResample, syncResampleHalfTaps } from './sync-resample.js';
export { tddPercent, ulKFactor, factorK, percentOfIl } from './distortion.js';
export { averageMeterExplanation, type AverageMeterExplanation, type AverageMeterReason } from './average-meter.js';
