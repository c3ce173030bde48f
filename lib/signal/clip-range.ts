/**
 * Clipping judged against the range a file states for a channel (a scope's vertical range, a COMTRADE
 * channel's min and max, an integer WAV's full scale): flat runs at those limits are clipped peaks, a flat
 * run anywhere else (a slow crest on one code) is not. Internal to lib/signal (the clipping warning).
 */
import type { ChannelRange } from '../capture.js';
import { fmt } from './format.js';

/** Fewest equal samples in a row at a limit that count as clipping (one sample on the top code can be a true peak). */
export const MIN_CLIPPED_RUN = 2;
/** Without a code step, a value within this share of the range's span of a limit is at the limit (an 8-bit code is 0.39 %). */
const LIMIT_SHARE_WITHOUT_STEP = 0.005;

/** What the flat runs at a stated range's limits add up to. */
export interface ClippedRuns {
	runs: number;
	samples: number;
	/** 0-based index of the first sample of the first run. */
	firstIndex: number;
	atMax: boolean;
	atMin: boolean;
}

/**
 * Runs of at least `MIN_CLIPPED_RUN` equal samples on the record's highest (lowest) value when that value lies
 * within one code step (smallest non-zero change between neighbours; 0.5 % of the span when the record shows
 * none) of the stated range's max (min): the top code of an 8-bit converter on ±4 V is 3.969 V, one step
 * under the range's 4 V, its bottom code −4 V.
 *
 * Ref: a converter cannot report a value beyond its range, so a signal beyond it is held at the limit
 * (common practice).
 * @returns undefined when no run sits at a limit
 */
export function clippedRuns(samples: Float64Array, range: ChannelRange): ClippedRuns | undefined {
	const n = samples.length;
	let step = Infinity;
	let lo = n > 0 ? samples[0] : NaN;
	let hi = lo;
	for (let i = 1; i < n; i++) {
		const d = Math.abs(samples[i] - samples[i - 1]);
		if (d > 0 && d < step) step = d;
		if (samples[i] > hi) hi = samples[i];
		if (samples[i] < lo) lo = samples[i];
	}
	const span = range.max - range.min;
	const tol = step < Infinity && step < span ? 1.01 * step : LIMIT_SHARE_WITHOUT_STEP * span;
	const out: ClippedRuns = { runs: 0, samples: 0, firstIndex: -1, atMax: false, atMin: false };
	let start = 0;
	for (let i = 1; i <= n; i++) {
		if (i < n && samples[i] === samples[start]) continue;
		const run = i - start;
		const x = samples[start];
		const high = x === hi && x >= range.max - tol;
		const low = x === lo && x <= range.min + tol;
		if (run >= MIN_CLIPPED_RUN && (high || low)) {
			out.runs++;
			out.samples += run;
			if (out.firstIndex < 0) out.firstIndex = start;
			if (high) out.atMax = true;
			if (low) out.atMin = true;
		}
		start = i;
	}
	return out.runs > 0 ? out : undefined;
}

/**
 * The clipping sentence for a channel with a stated range: how many runs and samples, at which limit,
 * where the first starts (time from the record's zero and sample number); undefined when none.
 * @param startS  time of the first sample (negative before a scope's trigger)
 */
export function rangeClippingMessage(
	samples: Float64Array,
	range: ChannelRange,
	sampleRateHz: number,
	startS: number,
): string | undefined {
	const c = clippedRuns(samples, range);
	if (!c) return undefined;
	const limits = [c.atMax ? `its top (${fmt(range.max)})` : '', c.atMin ? `its bottom (${fmt(range.min)})` : '']
		.filter(Boolean)
		.join(' and ');
	const share = (100 * c.samples) / samples.length;
	const atMs = (1000 * (startS + c.firstIndex / sampleRateHz)).toFixed(3);
	return (
		`Clipping: ${c.runs} flat run(s) at the limits of the range ${fmt(range.min)} … ${fmt(range.max)} (${range.source}), at ${limits}; ` +
		`${c.samples} samples in all (${fmt(share)} % of the record), the first at ${Number(atMs)} ms (sample ${c.firstIndex + 1}). ` +
		`The peaks there are cut, so peak, RMS and harmonics read wrong: record again on a larger range.`
	);
}
