import type { CycleWindow } from './cycles.js';
import { extremaIn, windowIntegral } from './window-integral.js';

/** RMS and peaks of each whole cycle of a window, with the worst cycle named. Same unit as samples. */
export interface PerCycleFigures {
	/** True RMS (AC + DC) of cycle k, k = 0 … cycles − 1. */
	rms: Float64Array;
	/** Highest sample of cycle k. */
	peak: Float64Array;
	/** Lowest sample of cycle k. */
	peakNegative: Float64Array;
	/** Start of cycle k: its rising zero crossing, fractional sample index. */
	startIndex: Float64Array;
	/** Index k of the cycle with the highest RMS (first one on a tie); −1 when there are no cycles. */
	worstRmsCycle: number;
	/** Index k of the cycle with the highest max(|peak|, |peakNegative|) (first on a tie); −1 when none. */
	worstPeakCycle: number;
}

/**
 * RMS, positive and negative peak of every whole cycle, from one rising zero crossing of the fundamental
 * to the next, and the worst cycle by RMS and by peak: the figures UPS and generator sizing start from
 * (an inrush or a motor start shows as one cycle far above the rest).
 *
 *   rms_k = √( (1/T_k) ∫ x² dt )  over [crossing_k, crossing_k+1], trapezoid rule, ends interpolated
 *
 * A last cycle ending at index N (one sample interval after the last sample, where a record of exactly k
 * cycles ends) takes the value there from one cycle earlier. Peaks come from the samples inside each cycle. A NaN sample makes its cycle's figures NaN, and NaN
 * cycles are never named worst.
 *
 * Ref: IEC 61000-4-30:2015 5.2, Urms(1) one-cycle RMS from a fundamental zero crossing (from memory).
 *
 * @param samples  signal (V, A, …); not modified
 * @param cycleWindow  whole cycles from `findWholeCycles` on this record (or on a channel recorded with it)
 * @returns per-cycle arrays of length cycleWindow.cycles
 * @example perCycleFigures(current, findWholeCycles(current, 10_000)).worstRmsCycle // 3 (the motor-start cycle)
 */
export function perCycleFigures(samples: Float64Array, cycleWindow: CycleWindow): PerCycleFigures {
	const c = cycleWindow.crossings;
	const cycles = Math.max(0, c.length - 1);
	// The record covers N sample intervals: the last cycle may end at N (see window-integral.ts).
	if (cycles > 0 && !(c[0] >= 0 && c[cycles] <= samples.length)) {
		throw new RangeError(`window ${c[0]}…${c[cycles]} does not lie inside the record's 0…${samples.length}`);
	}
	const rms = new Float64Array(cycles);
	const peak = new Float64Array(cycles);
	const peakNegative = new Float64Array(cycles);
	const startIndex = c.slice(0, cycles);
	let worstRmsCycle = -1;
	let worstPeakCycle = -1;
	let worstPeak = -Infinity;
	const square = (x: number) => x * x;
	for (let k = 0; k < cycles; k++) {
		rms[k] = Math.sqrt(
			windowIntegral(samples, c[k], c[k + 1], square, c[k + 1] - c[k], { kind: 'square', about: 0 }) /
				(c[k + 1] - c[k]),
		);
		const e = extremaIn(samples, c[k], c[k + 1]);
		const nan = !Number.isFinite(rms[k]);
		peak[k] = nan ? NaN : e.max;
		peakNegative[k] = nan ? NaN : e.min;
		if (!nan && (worstRmsCycle < 0 || rms[k] > rms[worstRmsCycle])) worstRmsCycle = k;
		const magnitude = Math.max(Math.abs(e.max), Math.abs(e.min));
		if (!nan && magnitude > worstPeak) {
			worstPeak = magnitude;
			worstPeakCycle = k;
		}
	}
	return { rms, peak, peakNegative, startIndex, worstRmsCycle, worstPeakCycle };
}
