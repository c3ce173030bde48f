/**
 * A voltage-characteristics survey: each rule of the chosen standard applied to the 10-minute and 10-s
 * values of a whole recording, flagged and partial values left out and counted, the dip and swell tables
 * and the interruption counts, and how much of the recording (and of a week) was measured.
 */
import { dipTable, interruptionCounts, swellTable } from './event-table.js';
import { SURVEY_STANDARDS, type BandRule, type PercentileRule, type SurveyStandard } from './rules.js';
import { finiteRange, percentileNearestRank, shareWithinPercent } from './statistics.js';
import type {
	SurveyInput,
	SurveyInterval,
	SurveyLine,
	SurveyResult,
	SurveyStandardId,
	SurveyVerdict,
} from './types.js';

const WEEK_S = 7 * 24 * 3600;
/** Intervals further apart than this (s) leave a gap (clock jitter of a logger is far smaller). */
const GAP_TOLERANCE_S = 1;

interface Counts {
	used: number;
	excludedFlagged: number;
	excludedPartial: number;
}

/** The values of one series over the usable intervals, and how many were left out and why. */
function seriesOf(
	intervals: readonly SurveyInterval[],
	pick: (i: SurveyInterval) => number | undefined,
): { values: number[] } & Counts {
	const values: number[] = [];
	let excludedFlagged = 0;
	let excludedPartial = 0;
	for (const i of intervals) {
		const v = pick(i);
		if (v === undefined || !Number.isFinite(v)) continue;
		if (!i.complete) excludedPartial++;
		else if (i.flagged) excludedFlagged++;
		else values.push(v);
	}
	return { values, used: values.length, excludedFlagged, excludedPartial };
}

function verdictOf(measured: boolean, ok: boolean): SurveyVerdict {
	return !measured ? 'not measured' : ok ? 'meets' : 'does not meet';
}

function bandLine(
	rule: BandRule,
	nominal: number,
	unit: string,
	values: number[],
	counts: Counts,
	channel?: string,
): SurveyLine {
	const low = rule.lowFactor * nominal;
	const high = rule.highFactor * nominal;
	const share = shareWithinPercent(values, low, high);
	const { min, max } = finiteRange(values);
	const digits = unit === 'Hz' ? 3 : 1;
	const measured = Number.isFinite(share)
		? `${share.toFixed(1)} % of ${values.length} values within ${low.toFixed(digits)}-${high.toFixed(digits)} ${unit} (lowest ${min.toFixed(digits)} ${unit}, highest ${max.toFixed(digits)} ${unit})`
		: 'no usable values';
	const pct = (f: number) => Math.abs(Math.round((f - 1) * 1000) / 10);
	const band =
		pct(rule.highFactor) === pct(rule.lowFactor)
			? `± ${pct(rule.highFactor)} %`
			: `+${pct(rule.highFactor)} % / −${pct(rule.lowFactor)} %`;
	return {
		id: rule.id,
		quantity: rule.quantity,
		rule: `${rule.requiredSharePercent} % of values within ${nominal} ${unit} ${band}`,
		channel,
		measured,
		value: share,
		limit: rule.requiredSharePercent,
		unit: '%',
		verdict: verdictOf(Number.isFinite(share), share >= rule.requiredSharePercent),
		source: rule.source,
		...counts,
	};
}

function percentileLine(
	rule: PercentileRule,
	values: number[],
	counts: Counts,
	channel?: string,
	id = rule.id,
	quantity = rule.quantity,
): SurveyLine {
	const p = percentileNearestRank(values, rule.percent);
	const u = rule.unit ? ` ${rule.unit}` : '';
	return {
		id,
		quantity,
		rule: `${rule.percent} % of values ≤ ${Number(rule.limit.toFixed(3))}${u}`,
		channel,
		measured: Number.isFinite(p)
			? `${rule.percent}th percentile ${p.toFixed(2)}${u} over ${values.length} values`
			: 'no usable values',
		value: p,
		limit: rule.limit,
		unit: rule.unit,
		verdict: verdictOf(Number.isFinite(p), p <= rule.limit),
		source: rule.source,
		...counts,
	};
}

function ruleLines(std: SurveyStandard, input: SurveyInput): SurveyLine[] {
	const lines: SurveyLine[] = [];
	const iv = input.intervals;
	for (const rule of std.rules) {
		if (rule.kind === 'band' && rule.series === 'voltage') {
			input.channels.forEach((ch, c) => {
				const s = seriesOf(iv, (i) => i.rmsV[c]);
				lines.push(bandLine(rule, input.declaredV, 'V', s.values, s, ch));
			});
		} else if (rule.kind === 'band') {
			const values = input.frequency
				.filter((f) => !f.flagged && Number.isFinite(f.frequencyHz))
				.map((f) => f.frequencyHz);
			const flagged = input.frequency.filter((f) => f.flagged && Number.isFinite(f.frequencyHz)).length;
			lines.push(
				bandLine(rule, input.nominalHz, 'Hz', values, {
					used: values.length,
					excludedFlagged: flagged,
					excludedPartial: 0,
				}),
			);
		} else if (rule.series === 'unbalance') {
			const s = seriesOf(iv, (i) => i.unbalancePercent);
			lines.push(percentileLine(rule, s.values, s));
		} else if (rule.series === 'thd') {
			input.channels.forEach((ch, c) => {
				const s = seriesOf(iv, (i) => i.thdPercent?.[c]);
				lines.push(percentileLine(rule, s.values, s, ch));
			});
		} else {
			const plt = input.plt ?? [];
			input.channels.forEach((ch, c) => {
				const values = plt.filter((p) => !p.flagged && Number.isFinite(p.plt[c])).map((p) => p.plt[c]);
				const flagged = plt.filter((p) => p.flagged).length;
				lines.push(
					percentileLine(rule, values, { used: values.length, excludedFlagged: flagged, excludedPartial: 0 }, ch),
				);
			});
		}
	}
	return lines;
}

function harmonicLines(std: SurveyStandard, input: SurveyInput): SurveyLine[] {
	const lines: SurveyLine[] = [];
	const { table, percent } = std.harmonics;
	input.channels.forEach((ch, c) => {
		for (const row of table.rows) {
			const s = seriesOf(input.intervals, (i) => i.harmonicsPercent?.[c]?.[row.order]);
			if (s.used + s.excludedFlagged + s.excludedPartial === 0) continue;
			const rule: PercentileRule = {
				kind: 'percentile',
				id: `harmonic-${row.order}`,
				series: 'thd',
				percent,
				limit: row.limitPercent,
				unit: '%',
				quantity: `Harmonic voltage h${row.order}, 10-minute means`,
				source: row.source,
			};
			lines.push(percentileLine(rule, s.values, s, ch));
		}
	});
	return lines;
}

/** Stretches of the span no interval covers (before the first, between two, after the last). */
export function findGaps(
	input: Pick<SurveyInput, 'intervals' | 'spanStartS' | 'spanEndS'>,
): { startS: number; endS: number }[] {
	const sorted = [...input.intervals].sort((a, b) => a.startS - b.startS);
	const gaps: { startS: number; endS: number }[] = [];
	let covered = input.spanStartS;
	for (const i of sorted) {
		if (i.startS > covered + GAP_TOLERANCE_S) gaps.push({ startS: covered, endS: i.startS });
		covered = Math.max(covered, i.startS + i.durationS);
	}
	if (input.spanEndS > covered + GAP_TOLERANCE_S) gaps.push({ startS: covered, endS: input.spanEndS });
	return gaps;
}

function days(s: number): string {
	if (s >= 86_400) return `${(s / 86_400).toFixed(1)} days`;
	if (s >= 3600) return `${(s / 3600).toFixed(1)} hours`;
	return s >= 60 ? `${(s / 60).toFixed(1)} minutes` : `${s.toFixed(1)} seconds`;
}

/**
 * Applies one standard's rules to a recording's aggregates.
 * Ref: EN 50160:2010 clause 4.2 and Tables 1, 5, 6; IEC 61000-2-2:2002+A1+A2 (from memory);
 * IEC 61000-4-30:2015, 4.7 (flagged values left out); docs/methods.md §3-4.
 * @example assessSurvey(weekOfTenMinuteValues, 'en50160').meets // true for a supply inside every band
 */
export function assessSurvey(input: SurveyInput, standard: SurveyStandardId): SurveyResult {
	const std = SURVEY_STANDARDS[standard];
	if (!std) throw new RangeError(`unknown survey standard ${standard}`);
	if (!(input.declaredV > 0 && Number.isFinite(input.declaredV)))
		throw new RangeError('declaredV must be a positive number of volts');
	const lines = [...ruleLines(std, input), ...harmonicLines(std, input)];
	const spanS = Math.max(0, input.spanEndS - input.spanStartS);
	const complete = input.intervals.filter((i) => i.complete);
	const measuredS = complete.reduce((s, i) => s + i.durationS, 0);
	const anyFail = lines.some((l) => l.verdict === 'does not meet');
	const anyMeasured = lines.some((l) => l.verdict !== 'not measured');
	const notes = [...std.notes];
	if (!input.clockAligned)
		notes.push(
			'The recording states no start time: 10-minute intervals count from its first sample, not from the clock.',
		);
	return {
		standard,
		standardName: std.name,
		coverage: {
			spanS,
			measuredS,
			intervals: input.intervals.length,
			completeIntervals: complete.length,
			flaggedIntervals: complete.filter((i) => i.flagged).length,
			gaps: findGaps(input),
		},
		weekNote:
			spanS >= WEEK_S
				? `${std.period} The recording spans ${days(spanS)}.`
				: `${std.period} The recording spans only ${days(spanS)}: the verdicts indicate, they do not assess a week.`,
		lines,
		dips: dipTable(input.events),
		swells: swellTable(input.events),
		interruptions: interruptionCounts(input.events),
		meets: anyFail ? false : anyMeasured ? true : null,
		notes,
	};
}
