/**
 * The thresholds that turn figures into findings ("fine" / "look at this"), as data with their sources.
 * One table for every front end: lib/report's findings use it, the JSON report lists it, the CLI table
 * and the UI show the findings built from it. A threshold decides wording and level, never a figure.
 */

/** One threshold: its value, what it decides and where it comes from (standard and clause, or common practice). */
export interface VerdictThreshold {
	id: VerdictThresholdId;
	value: number;
	/** '%', '' for a ratio. */
	unit: string;
	/** What crossing it means, in plain words. */
	meaning: string;
	/** Standard and clause, or 'common practice' / 'our choice' with the reason. */
	source: string;
}

export type VerdictThresholdId =
	| 'meterErrorPercent'
	| 'meterCrestFactor'
	| 'lowPowerFactor'
	| 'displacementExplainsPowerFactor'
	| 'nearUnityDisplacement'
	| 'sinusoidalCurrentThdPercent'
	| 'voltageUnbalancePercent'
	| 'flickerIrritation'
	| 'stepDmaxPercent'
	| 'stepDcPercent';

/** Every threshold, keyed by id. */
export const VERDICT_THRESHOLDS: Readonly<Record<VerdictThresholdId, VerdictThreshold>> = {
	meterErrorPercent: {
		id: 'meterErrorPercent',
		value: 1,
		unit: '%',
		meaning: 'an average-responding meter whose error stays within this reads right',
		source: 'common practice: about the basic AC-volts accuracy of a general-purpose digital multimeter',
	},
	meterCrestFactor: {
		id: 'meterCrestFactor',
		value: 3,
		unit: '',
		meaning: 'above this crest factor many true-RMS meters lose accuracy',
		source: 'common practice: true-RMS meters are commonly specified up to a crest factor of 3 at full scale',
	},
	lowPowerFactor: {
		id: 'lowPowerFactor',
		value: 0.9,
		unit: '',
		meaning: 'a power factor below this is flagged',
		source: 'common practice: many supply contracts charge reactive energy below a power factor of 0.9',
	},
	displacementExplainsPowerFactor: {
		id: 'displacementExplainsPowerFactor',
		value: 0.95,
		unit: '',
		meaning:
			'with a displacement power factor at or above this, a low power factor comes from harmonic current (PF = DPF × I1/I, IEEE 1459-2010)',
		source: 'our choice: the displacement then costs at most 5 % of the power factor',
	},
	nearUnityDisplacement: {
		id: 'nearUnityDisplacement',
		value: 0.99,
		unit: '',
		meaning: 'a displacement power factor at or above this is called near unity (current in step with the voltage)',
		source:
			'our choice: within 8° of the voltage, the phase error of an ordinary clamp plus a small filter capacitor or magnetising current',
	},
	sinusoidalCurrentThdPercent: {
		id: 'sinusoidalCurrentThdPercent',
		value: 10,
		unit: '%',
		meaning:
			'below this current THD the current is close enough to a sine that the words inductive/capacitive (a fundamental-only model) fit',
		source: 'our choice: at 10 % THD the harmonics carry under 1 % of the current RMS (√(1 + 0.1²) = 1.005)',
	},
	voltageUnbalancePercent: {
		id: 'voltageUnbalancePercent',
		value: 2,
		unit: '%',
		meaning: 'voltage unbalance (negative / positive sequence) above this is flagged',
		source:
			'EN 50160:2010, 4.2.5: negative-sequence up to 2 % of positive-sequence (10-minute means, 95 % of each week)',
	},
	flickerIrritation: {
		id: 'flickerIrritation',
		value: 1,
		unit: '',
		meaning:
			'a Pst or Plt above this may irritate people (half of observers find a 60 W filament lamp irritating at 1)',
		source: 'IEC 61000-4-15: the flickermeter scale (common practice)',
	},
	stepDmaxPercent: {
		id: 'stepDmaxPercent',
		value: 4,
		unit: '%',
		meaning: 'largest voltage change an appliance alone may cause, % of nominal',
		source: 'IEC 61000-3-3:2013, 5 (dmax)',
	},
	stepDcPercent: {
		id: 'stepDcPercent',
		value: 3.3,
		unit: '%',
		meaning: 'largest lasting voltage change an appliance alone may cause, % of nominal',
		source: 'IEC 61000-3-3:2013, 5 (dc)',
	},
};

/** The value of one threshold. */
export function threshold(id: VerdictThresholdId): number {
	return VERDICT_THRESHOLDS[id].value;
}
