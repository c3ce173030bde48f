/**
 * Figures of harmonic current: TDD (IEEE 519), UL K-factor and the BS 7821 / IEC 61378 factor K for
 * transformer derating. Each takes a HarmonicSet or RMS values indexed by order (index 0 = DC).
 */
import { MAX_HARMONIC_ORDER } from './harmonics.js';
import type { HarmonicSet } from './types.js';

type ByOrder = HarmonicSet | ArrayLike<number>;

function rmsByOrder(x: ByOrder): ArrayLike<number> {
	return 'orders' in x ? x.orders.map((o) => o.rms) : x;
}

/**
 * Total demand distortion, percent: TDD = 100 · √(Σ_{h=2}^{H} I_h²) / I_L.
 * Ref: IEEE 519-2014, 3.1 (definition) and Table 2 (H = 50) (from memory; the formula is also READ in a
 * public instrument maker's note, docs/methods.md §4.3).
 * @param x  current harmonics, A (a HarmonicSet or RMS values by order)
 * @param ilA  maximum demand load current I_L at the PCC (fundamental), A, > 0
 * @param maxOrder  H, default 50
 * @returns percent of I_L; NaN when an order up to H is missing or NaN
 * @throws RangeError when ilA is not a positive number
 * @example tddPercent([0, 80, 0, 12, 0, 9], 100, 5) // 15.0 (√(12² + 9²) = 15 A of a 100 A demand)
 */
export function tddPercent(x: ByOrder, ilA: number, maxOrder = MAX_HARMONIC_ORDER): number {
	if (!(ilA > 0) || !Number.isFinite(ilA)) throw new RangeError(`ilA must be a positive current in A, got ${ilA}`);
	const r = rmsByOrder(x);
	if (r.length <= maxOrder) return NaN;
	let s = 0;
	for (let h = 2; h <= maxOrder; h++) s += r[h] * r[h];
	return (100 * Math.sqrt(s)) / ilA;
}

/**
 * UL 1561/1562 K-factor (= IEEE C57.110 harmonic loss factor for winding eddy loss):
 * K = Σ_{h=1}^{H} I_h²·h² / Σ_{h=1}^{H} I_h²  (DC excluded). 1 for a pure sine.
 * Ref: UL 1561 / IEEE C57.110-2008 F_HL (READ via docs/methods.md §6).
 * @param x  current harmonics (any unit: only ratios matter)
 * @returns K (dimensionless); NaN when all currents are 0 or an order up to H is NaN/missing
 * @example ulKFactor([0, 1, 0, 0, 0, 0.2]) // (1 + 0.04·25)/(1.04) = 1.923
 */
export function ulKFactor(x: ByOrder, maxOrder?: number): number {
	const r = rmsByOrder(x);
	const top = maxOrder ?? r.length - 1;
	if (r.length <= top) return NaN;
	let num = 0;
	let den = 0;
	for (let h = 1; h <= top; h++) {
		const p = r[h] * r[h];
		num += p * h * h;
		den += p;
	}
	return den > 0 ? num / den : NaN;
}

/**
 * Factor K for derating a transformer that feeds harmonic currents (rated capacity ÷ K):
 * K = √( 1 + (e/(1+e)) · (I_1/I)² · Σ_{n=2}^{N} n^q · (I_n/I_1)² ),  I = √(Σ_{n=1}^{N} I_n²) (DC excluded).
 * The sum starts at n = 2 as written in the standard (docs/methods.md §6 explains why a published
 * worked page that starts it at n = 1 is wrong).
 * Ref: BS 7821-4 / HD 538.3 S1, IEC 61378-1 style "factor K" (from memory; structure READ, docs/methods.md §6).
 * @param x  current harmonics (any unit)
 * @param eddyLossRatio  e: eddy-current loss at the fundamental ÷ resistive (I²R) loss, ≥ 0
 * @param exponentQ  q: 1.7 for round or rectangular conductors, 1.5 for foil; default 1.7
 * @returns K ≥ 1; NaN when the fundamental is 0 or an order is NaN/missing
 * @example factorK(ratios, 0.091 / 0.909, 1.7) // 1.14672 for the docs/methods.md §6 spectrum
 */
export function factorK(x: ByOrder, eddyLossRatio: number, exponentQ = 1.7, maxOrder?: number): number {
	if (!(eddyLossRatio >= 0) || !Number.isFinite(eddyLossRatio))
		throw new RangeError(`eddyLossRatio must be ≥ 0, got ${eddyLossRatio}`);
	if (!(exponentQ > 0) || !Number.isFinite(exponentQ)) throw new RangeError(`exponentQ must be > 0, got ${exponentQ}`);
	const r = rmsByOrder(x);
	const top = maxOrder ?? r.length - 1;
	if (r.length <= top || !(r[1] > 0)) return NaN;
	let total = 0;
	let sum = 0;
	for (let n = 1; n <= top; n++) {
		const rel = r[n] / r[1];
		total += r[n] * r[n];
		if (n >= 2) sum += n ** exponentQ * rel * rel;
	}
	const share = eddyLossRatio / (1 + eddyLossRatio);
	return Math.sqrt(1 + share * ((r[1] * r[1]) / total) * sum);
}

/**
 * Each order's current as a percentage of the maximum demand current: 100 · I_h / I_L (index = order),
 * the per-order input IEEE 519 current limits are stated in.
 * @param ilA  maximum demand load current I_L at the PCC, A, > 0
 * @throws RangeError when ilA is not a positive number
 * @example percentOfIl([0, 80, 0, 12], 100) // Float64Array [0, 80, 0, 12]
 */
export function percentOfIl(x: ByOrder, ilA: number): Float64Array {
	if (!(ilA > 0) || !Number.isFinite(ilA)) throw new RangeError(`ilA must be a positive current in A, got ${ilA}`);
	const r = rmsByOrder(x);
	const out = new Float64Array(r.length);
	for (let h = 0; h < r.length; h++) out[h] = (100 * r[h]) / ilA;
	return out;
}
