/**
 * Axis helpers for the trend charts: a value range that one bad interval cannot stretch (percentiles of the
 * unflagged values), round tick steps, and label lanes so event labels never print over each other.
 */

/**
 * The p-th percentile (0…100) of finite values by linear interpolation between closest ranks
 * (Hyndman & Fan definition 7, the default of numpy.percentile and Excel's PERCENTILE.INC). NaN when empty.
 * @example percentile([10, 7, 4, 3, 2, 1], 50) // 3.5
 */
export function percentile(values: readonly number[], p: number): number {
	const v = values.filter(Number.isFinite).sort((a, b) => a - b);
	if (v.length === 0) return NaN;
	const h = ((v.length - 1) * Math.min(100, Math.max(0, p))) / 100;
	const lo = Math.floor(h);
	return v[lo] + (h - lo) * ((v[Math.min(lo + 1, v.length - 1)] ?? v[lo]) - v[lo]);
}

/** Share of the values an axis may leave off at each end (1st to 99th percentile): one spike cannot flatten the rest. */
export const ROBUST_PERCENTILE = 1;

/**
 * Axis range from the 1st to 99th percentile of the values not flagged, widened by `padShare` of its span
 * each side (at least 1 % of the level, so a flat line stays visible).
 */
export function robustRange(
	values: readonly number[],
	flagged: readonly boolean[] = [],
	padShare = 0.15,
): { min: number; max: number } {
	const kept = values.filter((x, i) => !flagged[i] && Number.isFinite(x));
	if (kept.length === 0) return { min: 0, max: 1 };
	const lo = percentile(kept, ROBUST_PERCENTILE);
	const hi = percentile(kept, 100 - ROBUST_PERCENTILE);
	const span = hi - lo || Math.max(Math.abs(hi) * 0.01, 0.01);
	return { min: lo - span * padShare, max: hi + span * padShare };
}

/**
 * Round tick values (steps of 1, 2 or 5 × 10^k) inside [lo, hi], about `count` of them.
 * @example niceTicks(0, 10, 5) // [0, 2, 4, 6, 8, 10]
 */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
	if (!(hi > lo)) return [lo];
	const raw = (hi - lo) / Math.max(1, count);
	const mag = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
	const out: number[] = [];
	for (let t = Math.ceil(lo / step - 1e-9) * step; t <= hi + step * 1e-9; t += step)
		out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
	return out;
}

/**
 * Lane (0, 1, 2, …) for each label so that labels in one lane never overlap: labels start at `x[i]` and are
 * `width[i]` wide (same unit), placed in order of x, each in the first lane whose last label ends before it.
 */
export function labelLanes(x: readonly number[], width: readonly number[], gap = 4): number[] {
	const order = x.map((_, i) => i).sort((a, b) => x[a] - x[b]);
	const laneEnd: number[] = [];
	const lane = new Array<number>(x.length).fill(0);
	for (const i of order) {
		let k = laneEnd.findIndex((end) => end + gap <= x[i]);
		if (k < 0) k = laneEnd.push(-Infinity) - 1;
		lane[i] = k;
		laneEnd[k] = x[i] + width[i];
	}
	return lane;
}
