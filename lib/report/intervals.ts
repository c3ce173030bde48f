/**
 * Figures judged per 10/12-cycle interval (the IEC 61000-4-30 basic interval, the report's harmonic
 * windows): the average-responding meter error, the crest factor and, per voltage/current pair, the
 * power factor. On a long record, level changes over time (a swell, a load switching) are not waveform
 * shape: whole-record figures mix them in, per-interval figures do not. Each figure gives its typical
 * interval (the median) and its worst, each with its start time.
 *
 * Intervals that overlap a dip, swell or interruption are flagged and left out of typical and worst
 * (IEC 61000-4-30 flagging: a value measured during an event is not counted as another phenomenon), unless
 * every interval is flagged.
 *
 * Sums run over the whole samples of each interval (from ceil(start) to ceil(end)); a fraction of a
 * sample at each end is left out, under 0.05 % of a 10-cycle window at 10 kS/s.
 */
import { SINE_FORM_FACTOR } from './meter.js';
import type { WindowSlot } from './spectra.js';

/** One figure over the intervals: typical (median) and worst, with the start of each interval (s). */
export interface IntervalFigure {
	typical: number;
	typicalStartS: number;
	worst: number;
	worstStartS: number;
}

/** A channel's per-interval figures; null in the report when there is no interval. */
export interface ChannelIntervals {
	/** Number of intervals and cycles in each. */
	count: number;
	intervalCycles: number;
	/** Intervals overlapping a voltage event, left out of typical and worst (unless all are flagged). */
	flagged: number;
	/** AC-coupled average-responding meter error, %; worst = largest magnitude. */
	meterErrorPercent: IntervalFigure;
	/** Crest factor of the AC part; worst = highest. */
	crestFactor: IntervalFigure;
	/** AC RMS, channel unit; worst = highest, typical = median. */
	acRms: IntervalFigure;
}

/** Sample range [a, b) of each slot; the last ends at the next slot's start or at its own length. */
export function slotRanges(slots: WindowSlot[], sampleRateHz: number, n: number): [number, number][] {
	return slots.map((s) => {
		const end = s.startIndex + (s.cycles * sampleRateHz) / s.fundamentalHz;
		return [Math.min(n, Math.ceil(s.startIndex)), Math.min(n, Math.ceil(end - 1e-9))];
	});
}

/** Whether each slot overlaps one of the spans [startS, startS + durationS] (voltage events). */
export function flaggedSlots(
	slots: WindowSlot[],
	sampleRateHz: number,
	spans: { startS: number; durationS: number }[],
): boolean[] {
	return slots.map((s) => {
		const a = s.startIndex / sampleRateHz;
		const b = a + s.cycles / s.fundamentalHz;
		return spans.some((e) => e.startS < b && e.startS + e.durationS > a);
	});
}

/** Typical (median) and worst of per-interval values, flagged ones left out unless all are; `worse(a, b)`: a is worse than b. */
export function summarise(
	values: number[],
	startsS: number[],
	worse: (a: number, b: number) => boolean,
	flagged: boolean[] = [],
): IntervalFigure {
	const finite = values.map((_, k) => k).filter((k) => Number.isFinite(values[k]));
	const clean = finite.filter((k) => !flagged[k]);
	const idx = clean.length > 0 ? clean : finite;
	if (idx.length === 0) return { typical: NaN, typicalStartS: NaN, worst: NaN, worstStartS: NaN };
	const sorted = [...idx].sort((a, b) => values[a] - values[b]);
	const mid = sorted[Math.floor((sorted.length - 1) / 2)];
	let w = idx[0];
	for (const k of idx) if (worse(values[k], values[w])) w = k;
	return { typical: values[mid], typicalStartS: startsS[mid], worst: values[w], worstStartS: startsS[w] };
}

/** Meter error, crest factor and AC RMS of one channel per interval. */
export function channelIntervals(
	samples: Float64Array,
	sampleRateHz: number,
	slots: WindowSlot[],
	flagged: boolean[] = [],
): ChannelIntervals | null {
	if (slots.length === 0) return null;
	const ranges = slotRanges(slots, sampleRateHz, samples.length);
	const starts = slots.map((s) => s.startIndex / sampleRateHz);
	const err: number[] = [];
	const crest: number[] = [];
	const ac: number[] = [];
	for (const [a, b] of ranges) {
		const m = b - a;
		let s = 0;
		for (let i = a; i < b; i++) s += samples[i];
		const mean = s / m;
		let sq = 0;
		let abs = 0;
		let peak = 0;
		for (let i = a; i < b; i++) {
			const d = samples[i] - mean;
			sq += d * d;
			abs += Math.abs(d);
			if (Math.abs(d) > peak) peak = Math.abs(d);
		}
		const rms = Math.sqrt(sq / m);
		ac.push(rms);
		err.push(rms > 0 ? 100 * ((SINE_FORM_FACTOR * abs) / m / rms - 1) : NaN);
		crest.push(rms > 0 ? peak / rms : NaN);
	}
	return {
		count: slots.length,
		intervalCycles: slots[0].cycles,
		flagged: flagged.filter(Boolean).length,
		meterErrorPercent: summarise(err, starts, (x, y) => Math.abs(x) > Math.abs(y), flagged),
		crestFactor: summarise(crest, starts, (x, y) => x > y, flagged),
		acRms: summarise(ac, starts, (x, y) => x > y, flagged),
	};
}

/** Power factor P/S of a voltage/current pair per interval (P = mean v·i, S = Vrms·Irms, IEEE 1459-2010); worst = lowest |PF|. */
export function powerFactorIntervals(
	v: Float64Array,
	i: Float64Array,
	sampleRateHz: number,
	slots: WindowSlot[],
	flagged: boolean[] = [],
): IntervalFigure | null {
	if (slots.length === 0) return null;
	const ranges = slotRanges(slots, sampleRateHz, Math.min(v.length, i.length));
	const starts = slots.map((s) => s.startIndex / sampleRateHz);
	const pf = ranges.map(([a, b]) => {
		let p = 0;
		let vv = 0;
		let ii = 0;
		for (let k = a; k < b; k++) {
			p += v[k] * i[k];
			vv += v[k] * v[k];
			ii += i[k] * i[k];
		}
		const s = Math.sqrt(vv * ii);
		return s > 0 ? p / s : NaN;
	});
	return summarise(pf, starts, (x, y) => Math.abs(x) < Math.abs(y), flagged);
}

/**
 * True when a channel's per-interval figures say something its whole-record figures do not: two or more
 * intervals, and the worst interval's meter error (to 0.1 %) or crest factor (to 0.001) differs from the
 * whole record's. Outputs show per-interval rows only then.
 */
export function intervalsDiffer(c: {
	intervals: ChannelIntervals | null;
	crestFactor: number;
	averageResponding: { errorPercent: number };
}): boolean {
	const iv = c.intervals;
	if (!iv || iv.count < 2) return false;
	const e = (x: number) => Math.round(10 * x);
	const cf = (x: number) => Math.round(1000 * x);
	return (
		e(iv.meterErrorPercent.worst) !== e(c.averageResponding.errorPercent) ||
		cf(iv.crestFactor.worst) !== cf(c.crestFactor)
	);
}
