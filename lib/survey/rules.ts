/**
 * The rules of the voltage-characteristics standards, as data: which statistic of which series, the
 * limit, and the clause. Harmonic limits per order come from lib/limits (the same tables `analyse` uses).
 */
import { EN50160_TABLE } from '../limits/en50160.js';
import { IEC61000_2_2_TABLE } from '../limits/iec61000-2-2.js';
import type { OrderLimitTable } from '../limits/types.js';
import type { SurveyStandardId } from './types.js';

/** A share of values that must lie in a band around a nominal value (e.g. 95 % within Un ± 10 %). */
export interface BandRule {
	kind: 'band';
	id: string;
	series: 'voltage' | 'frequency';
	/** Band edges as fractions of the nominal value. */
	lowFactor: number;
	highFactor: number;
	/** Share of the values that must lie in the band, %. */
	requiredSharePercent: number;
	quantity: string;
	source: string;
}

/** A percentile of the values that must not exceed a limit (e.g. 95 % of 10-minute unbalance values ≤ 2 %). */
export interface PercentileRule {
	kind: 'percentile';
	id: string;
	series: 'thd' | 'unbalance' | 'plt';
	percent: number;
	limit: number;
	unit: string;
	quantity: string;
	source: string;
}

export interface SurveyStandard {
	id: SurveyStandardId;
	name: string;
	rules: (BandRule | PercentileRule)[];
	/** Per-order harmonic limits, judged on the same percentile as THD. */
	harmonics: { table: OrderLimitTable; percent: number };
	/** Whether a week is the assessment period, in words. */
	period: string;
	notes: string[];
}

// EN 50160:2010 clauses for LV supply: frequency 4.2.1, supply voltage variations 4.2.2, flicker 4.2.3.2,
// unbalance 4.2.4, harmonics 4.2.5 and Table 1. Frequency, flicker, unbalance and harmonics read in a
// secondary source; the voltage bands from memory (docs/methods.md §4.1).
const EN = 'EN 50160:2010';

export const EN50160_SURVEY: SurveyStandard = {
	id: 'en50160',
	name: 'EN 50160 voltage characteristics of the public LV supply',
	rules: [
		{
			kind: 'band',
			id: 'supply-voltage-95',
			series: 'voltage',
			lowFactor: 0.9,
			highFactor: 1.1,
			requiredSharePercent: 95,
			quantity: 'Supply voltage, 10-minute means',
			source: `${EN}, 4.2.2 (supply voltage variations)`,
		},
		{
			kind: 'band',
			id: 'supply-voltage-100',
			series: 'voltage',
			lowFactor: 0.85,
			highFactor: 1.1,
			requiredSharePercent: 100,
			quantity: 'Supply voltage, 10-minute means',
			source: `${EN}, 4.2.2 (supply voltage variations)`,
		},
		{
			kind: 'band',
			id: 'frequency-99.5',
			series: 'frequency',
			lowFactor: 0.99,
			highFactor: 1.01,
			requiredSharePercent: 99.5,
			quantity: 'Power frequency, 10-second means',
			source: `${EN}, 4.2.1 (power frequency, synchronous connection)`,
		},
		{
			kind: 'band',
			id: 'frequency-100',
			series: 'frequency',
			lowFactor: 0.94,
			highFactor: 1.04,
			requiredSharePercent: 100,
			quantity: 'Power frequency, 10-second means',
			source: `${EN}, 4.2.1 (power frequency, synchronous connection)`,
		},
		{
			kind: 'percentile',
			id: 'flicker-plt',
			series: 'plt',
			percent: 95,
			limit: 1,
			unit: '',
			quantity: 'Long-term flicker severity Plt',
			source: `${EN}, 4.2.3.2 (flicker severity)`,
		},
		{
			kind: 'percentile',
			id: 'unbalance',
			series: 'unbalance',
			percent: 95,
			limit: 2,
			unit: '%',
			quantity: 'Voltage unbalance (negative sequence), 10-minute means',
			source: `${EN}, 4.2.4 (supply voltage unbalance)`,
		},
		{
			kind: 'percentile',
			id: 'thd',
			series: 'thd',
			percent: 95,
			limit: 8,
			unit: '%',
			quantity: 'Voltage THD (orders 2-40), 10-minute means',
			source: `${EN}, 4.2.5 (harmonic voltage)`,
		},
	],
	harmonics: { table: EN50160_TABLE, percent: 95 },
	period: 'EN 50160 states its values for each period of one week (power frequency: a year).',
	notes: [
		'EN 50160 describes what a supply gives under normal operating conditions; it is not an equipment emission or immunity limit.',
		'The power-frequency bands are written for 50 Hz; for a 60 Hz supply the same relative bands are used here.',
		'Values during dips, swells and interruptions are flagged and left out of the statistics (IEC 61000-4-30:2015, 4.7).',
	],
};

// IEC 61000-2-2:2002+A1:2017+A2:2018: compatibility levels (from memory, docs/methods.md §4.2). The
// levels are set at a 95 % probability (IEC 61000-2-1 concept, from memory), so the 95th percentile of
// 10-minute values is compared with each level.
const IEC = 'IEC 61000-2-2:2002+A1:2017+A2:2018';

export const IEC61000_2_2_SURVEY: SurveyStandard = {
	id: 'iec61000-2-2',
	name: 'IEC 61000-2-2 compatibility levels, public LV networks',
	rules: [
		{
			kind: 'band',
			id: 'frequency',
			series: 'frequency',
			lowFactor: 0.98,
			highFactor: 1.02,
			requiredSharePercent: 95,
			quantity: 'Power frequency, 10-second means',
			source: `${IEC}, 4.9 (frequency variation ±1 Hz at 50 Hz)`,
		},
		{
			kind: 'percentile',
			id: 'flicker-plt',
			series: 'plt',
			percent: 95,
			limit: 0.8,
			unit: '',
			quantity: 'Long-term flicker severity Plt',
			source: `${IEC}, 4.2 (voltage fluctuations and flicker)`,
		},
		{
			kind: 'percentile',
			id: 'unbalance',
			series: 'unbalance',
			percent: 95,
			limit: 2,
			unit: '%',
			quantity: 'Voltage unbalance (negative sequence), 10-minute means',
			source: `${IEC}, 4.5 (voltage unbalance)`,
		},
		{
			kind: 'percentile',
			id: 'thd',
			series: 'thd',
			percent: 95,
			limit: 8,
			unit: '%',
			quantity: 'Voltage THD, 10-minute means',
			source: `${IEC}, Table 1 (THD)`,
		},
	],
	harmonics: { table: IEC61000_2_2_TABLE, percent: 95 },
	period: 'Compatibility levels are set at a 95 % probability over time and place; a week is the usual survey period.',
	notes: [
		'Compatibility levels are the disturbance levels equipment is designed to tolerate, not a supply guarantee.',
		'The frequency level is ±1 Hz of 50 Hz; for a 60 Hz supply the same relative band (±2 %) is used here.',
		'Values during dips, swells and interruptions are flagged and left out of the statistics (IEC 61000-4-30:2015, 4.7).',
	],
};

export const SURVEY_STANDARDS: Record<SurveyStandardId, SurveyStandard> = {
	en50160: EN50160_SURVEY,
	'iec61000-2-2': IEC61000_2_2_SURVEY,
};
