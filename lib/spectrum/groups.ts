/**
 * IEC 61000-4-7 harmonic and interharmonic groups and subgroups from the RMS values of DFT bins.
 */
import type { HarmonicGroups } from './types.js';

/**
 * Groups and subgroups of a synchronised window of `cycles` fundamental cycles (bin k = cycles·n is
 * harmonic n), all as RMS, index = order n:
 *
 *   G_g,n²   = C²_{k−c/2}/2 + Σ_{i=−c/2+1}^{c/2−1} C²_{k+i} + C²_{k+c/2}/2    (c even; edge bins half power)
 *   G_sg,n²  = Σ_{i=−1}^{1} C²_{k+i}
 *   C_ig,n²  = Σ_{i=1}^{c−1} C²_{k+i}            (between orders n and n+1)
 *   C_isg,n² = Σ_{i=2}^{c−2} C²_{k+i}
 *
 * For odd c there is no bin exactly half-way, so G_g,n takes bins k−(c−1)/2 … k+(c−1)/2 at full
 * weight. Index 0 of G_g and G_sg is the DC bin alone. A NaN bin (above the capture's Nyquist
 * frequency) makes every group that contains it NaN.
 *
 * Ref: IEC 61000-4-7:2002+A1:2008, 3.2 and 5.5 (harmonic group, subgroup; interharmonic group,
 * centred subgroup), equations as given in docs/methods.md §2.2 (from memory, not read from the standard).
 *
 * @param binRms  C_k, k = 0 … cycles·(maxOrder+1) at least; same unit as the samples
 * @example
 * // 10 cycles of 50 Hz, 10 V at 250 Hz (bin 50) and 1 V at 275 Hz (bin 55, half-way to h6):
 * // harmonicGroupRms[5] = √(10² + 1²/2) = 10.025 V, interharmonicGroupRms[5] = 1 V
 */
export function iecHarmonicGroups(binRms: Float64Array, cycles: number, maxOrder: number): HarmonicGroups {
	if (!Number.isInteger(cycles) || cycles < 1) throw new RangeError(`cycles must be an integer ≥ 1, got ${cycles}`);
	if (!Number.isInteger(maxOrder) || maxOrder < 0)
		throw new RangeError(`maxOrder must be an integer ≥ 0, got ${maxOrder}`);
	const need = cycles * (maxOrder + 1) + 1;
	if (binRms.length < need)
		throw new RangeError(`need ${need} bins for order ${maxOrder} at ${cycles} cycles, got ${binRms.length}`);
	const c = cycles;
	// bin powers once; plain loops (not prefix sums, which would lose small groups beside a large fundamental)
	const pw = new Float64Array(need);
	for (let k = 0; k < need; k++) pw[k] = binRms[k] * binRms[k];
	const p2 = (k: number) => pw[k];
	const sum = (from: number, to: number) => {
		let s = 0;
		for (let k = from; k <= to; k++) s += pw[k];
		return s;
	};
	const g = new Float64Array(maxOrder + 1);
	const sg = new Float64Array(maxOrder + 1);
	const ig = new Float64Array(maxOrder + 1);
	const isg = new Float64Array(maxOrder + 1);
	const half = c >> 1;
	const even = c % 2 === 0;
	for (let n = 0; n <= maxOrder; n++) {
		const k = c * n;
		if (n === 0) {
			g[0] = binRms[0];
			sg[0] = binRms[0];
		} else {
			const core = even
				? sum(k - half + 1, k + half - 1) + 0.5 * (p2(k - half) + p2(k + half))
				: sum(k - half, k + half);
			g[n] = Math.sqrt(core);
			sg[n] = Math.sqrt(sum(k - 1, k + 1));
		}
		ig[n] = c >= 2 ? Math.sqrt(sum(k + 1, k + c - 1)) : 0;
		isg[n] = c >= 4 ? Math.sqrt(sum(k + 2, k + c - 2)) : 0;
	}
	return { harmonicGroupRms: g, harmonicSubgroupRms: sg, interharmonicGroupRms: ig, interharmonicSubgroupRms: isg };
}
