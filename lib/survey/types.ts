/**
 * The contract of lib/survey: what a voltage-characteristics survey takes (the aggregates of a long
 * recording, from one file or merged from many) and what it returns (one line per rule of a standard).
 * Times are seconds on one clock for the whole recording: Unix seconds when the recording's start time is
 * known, else seconds from its first sample (then the survey says the intervals are not clock-aligned).
 */

/** One 10-minute aggregate (IEC 61000-4-30:2015, 4.5.3): values per voltage channel, same order as `channels`. */
export interface SurveyInterval {
	startS: number;
	durationS: number;
	/** False for a partial interval (recording start or end, a gap): excluded from the statistics, counted. */
	complete: boolean;
	/** Overlaps a dip, swell or interruption (IEC 61000-4-30:2015, 4.7): excluded, counted. */
	flagged: boolean;
	/** RMS voltage per channel, V. */
	rmsV: number[];
	/** Voltage THD per channel, % of the fundamental (subgroups, orders 2-40 or 2-50). NaN when not measured. */
	thdPercent?: number[];
	/** Per channel, index = harmonic order 0..50, % of the fundamental. */
	harmonicsPercent?: number[][];
	/** Negative-sequence voltage unbalance u2 = |U2|/|U1|, %, for a three-phase set. */
	unbalancePercent?: number;
	/** Short-term flicker severity per channel. */
	pst?: number[];
}

/** One 2-hour long-term flicker value per channel (IEC 61000-4-15:2010, Plt from 12 Pst). */
export interface SurveyPlt {
	startS: number;
	plt: number[];
	/** Any of its Pst values came from a flagged interval. */
	flagged: boolean;
}

/** Power frequency over one 10-s interval (IEC 61000-4-30:2015, 5.1). */
export interface SurveyFrequency {
	startS: number;
	frequencyHz: number;
	flagged: boolean;
}

/** One voltage event as the event detector reported it (already one event across all channels). */
export interface SurveyEvent {
	kind: 'dip' | 'swell' | 'interruption';
	startS: number;
	durationS: number;
	/** Dips and interruptions: residual voltage, swells: maximum voltage, both in % of the declared voltage. */
	percentOfDeclared: number;
	channels: string[];
}

export interface SurveyInput {
	/** Names of the voltage channels, in the order of every per-channel array. */
	channels: string[];
	/** Declared (nominal) supply voltage Un, V, in the channels' terms (line-to-neutral for L-N channels). */
	declaredV: number;
	nominalHz: 50 | 60;
	/** First and last instant the recording covers (gaps inside are found from the intervals). */
	spanStartS: number;
	spanEndS: number;
	/** True when interval times are on the wall clock (10-minute ticks), false when from the first sample. */
	clockAligned: boolean;
	intervals: SurveyInterval[];
	frequency: SurveyFrequency[];
	plt?: SurveyPlt[];
	events: SurveyEvent[];
}

export type SurveyStandardId = 'en50160' | 'iec61000-2-2';

/** The verdict of one rule over the recording. */
export type SurveyVerdict = 'meets' | 'does not meet' | 'not measured';

/** One line of the survey: the rule, what was measured, the limit, the verdict and the source. */
export interface SurveyLine {
	/** Stable key, e.g. 'supply-voltage-95', 'harmonic-5'. */
	id: string;
	/** What is judged, in words: 'Supply voltage, 10-minute means'. */
	quantity: string;
	/** The rule in words: '95 % of 10-minute means within 230 V ± 10 %'. */
	rule: string;
	/** Voltage channel the line is about; undefined for a line over the whole set. */
	channel?: string;
	/** The statistic, in words with its number: '99.4 % of intervals within the band; 95th percentile 243.1 V'. */
	measured: string;
	/** The statistic as a number in the unit of `limit` (a share in %, a percentile value), NaN when not measured. */
	value: number;
	limit: number;
	/** Unit of value and limit: '%', 'V', 'Hz', '' for Plt. */
	unit: string;
	verdict: SurveyVerdict;
	/** Printable source: standard, edition, clause or table. */
	source: string;
	/** Values the statistic used, and values left out as flagged or partial. */
	used: number;
	excludedFlagged: number;
	excludedPartial: number;
}

/** Events counted in a residual-voltage (or maximum) x duration table. */
export interface SurveyEventTable {
	kind: 'dip' | 'swell';
	/** Row labels, from the residual (or maximum) voltage bands, % of the declared voltage. */
	rows: string[];
	/** Column labels, from the duration bands. */
	columns: string[];
	/** counts[row][column]. */
	counts: number[][];
	/** Events outside every cell (e.g. shorter than 10 ms), counted here. */
	outside: number;
	source: string;
}

export interface SurveyResult {
	standard: SurveyStandardId;
	standardName: string;
	/** How much of the recording span the complete 10-minute intervals cover, and the span itself. */
	coverage: {
		spanS: number;
		measuredS: number;
		intervals: number;
		completeIntervals: number;
		flaggedIntervals: number;
		gaps: { startS: number; endS: number }[];
	};
	/** The standards assess a week (EN 50160: each week); shorter recordings are said to be so. */
	weekNote: string;
	lines: SurveyLine[];
	dips: SurveyEventTable;
	swells: SurveyEventTable;
	interruptions: { short: number; long: number; source: string };
	/** true when every measured line meets its rule; false when any does not; null when nothing was measured. */
	meets: boolean | null;
	notes: string[];
}
