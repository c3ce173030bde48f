/**
 * Total harmonic distortion from per-order RMS values (a HarmonicSet, or plain arrays indexed by order).
 */
import type { HarmonicSet, HarmonicThd } from './types.js';

/** RMS values indexed by order (index 0 = DC), from a set or an array. */
type ByOrder = HarmonicSet | ArrayLike<number>;

function orderRms(x: ByOrder): ArrayLike<number> {
	if ('orders' in x) return x.orders.map((o) => o.rms);
	return x;
}

function harmonicPower(rms: ArrayLike<number>, maxOrder: number): number {
	let s = 0;
	for (let h = 2; h <= maxOrder; h++) s += rms[h] * rms[h];
	return s;
}

/**
 * THD relative to the fundamental, percent:  THD_F = 100 · √(Σ_{h=2}^{H} I_h²) / I_1.
 * Ref: IEC 60050-551-20-13 via the IEC terms database (READ in docs/methods.md §2.2); H = 40 as in
 * IEC 61000-4-7 / EN 50160, H = 50 as in IEEE 519 and IEC 61000-4-30 Ed.3 (from memory).
 * @param x  a HarmonicSet or RMS values indexed by order (index 1 = fundamental)
 * @param maxOrder  H, the highest order included (default 40)
 * @returns percent; NaN when orders up to H are missing or NaN, or the fundamental is 0
 * @example thdFPercent([0, 230, 0, 4.6, 0, 11.5, 0, 6.9], 7) // 6.16441 (docs/methods.md §1.3)
 */
export function thdFPercent(x: ByOrder, maxOrder = 40): number {
	const rms = orderRms(x);
	if (rms.length <= maxOrder || !(rms[1] > 0)) return NaN;
	return (100 * Math.sqrt(harmonicPower(rms, maxOrder))) / rms[1];
}

/**
 * THD relative to the RMS of orders 1…H (DC and interharmonics excluded), percent:
 * THD_R = 100 · √(Σ_{h=2}^{H} I_h²) / √(Σ_{h=1}^{H} I_h²)  ( = THD_F / √(1 + THD_F²) ).
 * Never exceeds 100 %. Ref: the "distortion factor" form of THD (common practice, from memory).
 * @returns percent; NaN as for thdFPercent
 * @example thdRPercent([0, 1, 0, 1 / 3], 3) // 31.623 (a 3rd of a third of the fundamental)
 */
export function thdRPercent(x: ByOrder, maxOrder = 40): number {
	const rms = orderRms(x);
	if (rms.length <= maxOrder || !(rms[1] > 0)) return NaN;
	const h = harmonicPower(rms, maxOrder);
	return (100 * Math.sqrt(h)) / Math.sqrt(h + rms[1] * rms[1]);
}

/**
 * The eight THD figures of a window: THD_F and THD_R to orders 40 and 50 from the order RMS values,
 * THDG and THDS (Ref: IEC 61000-4-7 Annex / docs/methods.md §2.2, from memory) from harmonic groups and
 * subgroups, each relative to its own order-1 value.
 */
export function thdFigures(
	orderRmsValues: ArrayLike<number>,
	groupRms: ArrayLike<number>,
	subgroupRms: ArrayLike<number>,
): HarmonicThd {
	return {
		thdF40Percent: thdFPercent(orderRmsValues, 40),
		thdF50Percent: thdFPercent(orderRmsValues, 50),
		thdR40Percent: thdRPercent(orderRmsValues, 40),
		thdR50Percent: thdRPercent(orderRmsValues, 50),
		thdG40Percent: thdFPercent(groupRms, 40),
		thdG50Percent: thdFPercent(groupRms, 50),
		thdS40Percent: thdFPercent(subgroupRms, 40),
		thdS50Percent: thdFPercent(subgroupRms, 50),
	};
}
