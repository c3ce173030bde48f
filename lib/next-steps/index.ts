// Public API of lib/next-steps: re-exports only. From the report's findings and a few site values to the
// next engineering step (capacitor bank, transformer, neutral, motors, meters).
export {
	NEXT_STEP_CAUTION,
	SITE_INPUT_LABELS,
	type SiteInputs,
	type NextStep,
	type NextStepId,
	type NextStepInput,
	type NextStepStatus,
	type ReportNextSteps,
} from './types.js';
export {
	reactivePowerToAdd,
	transformerShortCircuitKva,
	resonanceOrder,
	detunedTuningOrder,
	truePowerFactorAfter,
	ordersPresent,
	powerFactorCorrection,
	DETUNING_REACTOR_PERCENT,
	RESONANCE_NEAR_FRACTION,
	PRESENT_ORDER_PERCENT,
	POWER_FACTOR_TOLERANCE,
	type PhasePowerFigures,
	type CurrentSpectrum,
	type PfCorrectionResult,
} from './pf-correction.js';
export {
	harmonicLossFactor,
	maxLoadCurrentPu,
	kRatedClass,
	transformerLoading,
	K_RATED_CLASSES,
	FACTOR_K_EXPONENT_Q,
	type TransformerResult,
} from './transformer.js';
export {
	neutralSizing,
	neutralConductor,
	NEUTRAL_REDUCTION_BANDS,
	type NeutralSizing,
	type NeutralConductorResult,
} from './neutral-conductor.js';
export {
	motorDeratingFactor,
	extraHeatingPercent,
	motorUnbalance,
	NEMA_DERATING_CURVE,
	NEMA_DERATE_ABOVE_PERCENT,
	NEMA_DO_NOT_OPERATE_ABOVE_PERCENT,
	type MotorUnbalanceResult,
} from './motor-unbalance.js';
export {
	bandLimitedRms,
	averageRespondingRms,
	crestFactorAvailable,
	meterReading,
	METER_READS_RIGHT_PERCENT,
	type MeterChannelFigures,
	type MeterChannelResult,
} from './meter.js';
export { nextStepsSection, checkSiteInputs } from './report-section.js';
export { nextStepsCsv, nextStepsCsvRows, NEXT_STEPS_CSV_COLUMNS } from './csv.js';
