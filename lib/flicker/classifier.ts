/**
 * Block 5 of the flickermeter: the cumulative probability of Pinst over an observation interval, the
 * smoothed percentiles and the Pst and Plt formulas.
 *
 * Pinst values are classified by the top 16 bits of their float32 form (sign, 8 exponent bits and 7
 * mantissa bits): 128 classes per octave, each at most 0.78 % wide, covering every positive float with
 * no range to choose and no logarithm per sample. Inside a class the level is interpolated linearly.
 * The standard asks for at least 64 classes (Ref: IEC 61000-4-15:2010, 5.7.1, from memory); this
 * classifier is finer than that everywhere.
 */
import { PST_SMOOTHING, PST_WEIGHTS } from './constants.js';

/** Number of classes: one per value of the top 16 bits of a non-negative float32. */
export const PINST_CLASSES = 1 << 15;

const f32 = new Float32Array(1);
const u32 = new Uint32Array(f32.buffer);

/**
 * For loops that classify inline: write Pinst to `f32[0]`, its class is `u32[0] >>> PINST_CLASS_SHIFT`
 * (what pinstClass does). A call per value, when the optimiser does not inline it, boxes the value in a
 * heap number: the flickermeter's chain ran 2-3 times slower in some processes for it.
 */
export const PINST_CLASS_VIEWS = { f32, u32 } as const;
export const PINST_CLASS_SHIFT = 16;

/** Lower edge of class `i` (the float32 whose top 16 bits are i). */
function classEdge(i: number): number {
	u32[0] = i << 16;
	return f32[0];
}

/** Class index of a non-negative Pinst value (see the module note). */
export function pinstClass(pinst: number): number {
	f32[0] = pinst;
	return u32[0] >>> PINST_CLASS_SHIFT;
}

/**
 * The level exceeded during `percent` % of the classified time: the (100 − percent)th percentile of the
 * cumulative probability function, interpolated linearly inside its class.
 *
 * @param counts  class counts (length PINST_CLASSES)
 * @param total   number of values counted
 * @param percent 0 < percent < 100
 * @returns the level (same unit as Pinst, dimensionless); NaN when nothing was counted
 */
export function pinstLevelExceeded(counts: Uint32Array, total: number, percent: number): number {
	if (total <= 0) return NaN;
	const target = (percent / 100) * total;
	let above = 0;
	for (let i = counts.length - 1; i >= 0; i--) {
		const c = counts[i];
		if (c === 0) continue;
		if (above + c >= target) {
			const upper = i + 1 < PINST_CLASSES ? classEdge(i + 1) : classEdge(i);
			const lower = classEdge(i);
			return upper - ((target - above) / c) * (upper - lower);
		}
		above += c;
	}
	return 0;
}

/** The smoothed percentiles of one observation interval and the Pst they give. */
export interface PstFigures {
	pst: number;
	p01: number;
	p1s: number;
	p3s: number;
	p10s: number;
	p50s: number;
}

/**
 * Short-term flicker severity from the smoothed percentiles:
 *   Pst = √(0.0314 P0.1 + 0.0525 P1s + 0.0657 P3s + 0.28 P10s + 0.08 P50s),
 *   P1s = (P0.7 + P1 + P1.5)/3, P3s = (P2.2 + P3 + P4)/3, P10s = (P6 + P8 + P10 + P13 + P17)/5,
 *   P50s = (P30 + P50 + P80)/3, where Px is the Pinst level exceeded x % of the time.
 * Ref: IEC 61000-4-15:2010, 5.7.2 (from memory).
 *
 * @returns the figures; all NaN when nothing was counted
 * @example a constant Pinst of 1 for 10 minutes gives Pst = √(0.0314 + 0.0525 + 0.0657 + 0.28 + 0.08) ≈ 0.714
 */
export function pstFromHistogram(counts: Uint32Array, total: number): PstFigures {
	const level = (p: number) => pinstLevelExceeded(counts, total, p);
	const mean = (ps: readonly number[]) => ps.reduce((s, p) => s + level(p), 0) / ps.length;
	const p01 = level(0.1);
	const p1s = mean(PST_SMOOTHING.p1s);
	const p3s = mean(PST_SMOOTHING.p3s);
	const p10s = mean(PST_SMOOTHING.p10s);
	const p50s = mean(PST_SMOOTHING.p50s);
	const w = PST_WEIGHTS;
	const pst = Math.sqrt(w.p01 * p01 + w.p1s * p1s + w.p3s * p3s + w.p10s * p10s + w.p50s * p50s);
	return { pst, p01, p1s, p3s, p10s, p50s };
}

/**
 * Long-term flicker severity: Plt = ∛( Σ Pst_i³ / N ), N = 12 consecutive 10-minute values (2 h).
 * Ref: IEC 61000-4-15:2010, 5.7.3 (from memory); IEC 61000-4-30:2015, 5.3 (2 h, from memory).
 *
 * @param pstValues  the Pst values of one 2-hour period (12 normally; any count ≥ 1 is averaged)
 * @returns Plt; NaN for no values or when any value is NaN
 * @example pltFromPst([1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]) // 1
 */
export function pltFromPst(pstValues: readonly number[]): number {
	if (pstValues.length === 0) return NaN;
	let s = 0;
	for (const p of pstValues) s += p * p * p;
	return Math.cbrt(s / pstValues.length);
}
