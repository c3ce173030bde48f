// Public API of lib/flicker: re-exports only.
export * from './constants.js';
export { bilinear, biquadGain, butterworthLowPass, type Biquad } from './iir.js';
export {
	designFlickermeter,
	flickerDecimation,
	weightingSections,
	type FlickerDesign,
	type FlickerSettings,
} from './design.js';
export { BlockSquares, blockSquaresGain } from './block-squares.js';
export {
	pinstLevelExceeded,
	pinstClass,
	pstFromHistogram,
	pltFromPst,
	PINST_CLASSES,
	type PstFigures,
} from './classifier.js';
export {
	createFlickermeter,
	createFlickermeterGroup,
	pltIntervals,
	type Flickermeter,
	type FlickermeterGroup,
	type FlickermeterGroupOptions,
	type FlickermeterOptions,
	type FlickerResult,
	type PinstStatistics,
	type PltInterval,
	type PstInterval,
	FLICKER_SETTLING_S,
} from './flickermeter.js';
export {
	createVoltageChangeTracker,
	STEADY_STATE_BAND_PERCENT,
	STEADY_STATE_S,
	D_T_LEVEL_PERCENT,
	type VoltageChange,
	type VoltageChangeTracker,
} from './voltage-change.js';
export { createHalfPeriodRms, type HalfPeriodRms } from './half-period-rms.js';
