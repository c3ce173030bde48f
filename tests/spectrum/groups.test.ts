import { describe, expect, it } from 'vitest';
import { harmonicWindow, iecHarmonicGroups } from '../../lib/index.js';
import { harmonicSamples } from '../helpers/synth.js';

describe('iecHarmonicGroups via harmonicWindow', () => {
	it('docs/methods.md §2.4 vector (computed vector from the shared reference script; every tone on a bin): C_50, G_sg,5, G_g,5, G_g,6, C_ig,5, C_isg,5', () => {
		// 230 V at 50 Hz, 10 V at 250, 3 V at 255, 2 V at 270, 1 V at 275, 0.5 V at 285 Hz (RMS), fs 10 240, 2048 samples
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 10 },
				{ order: 5.1, rms: 3 },
				{ order: 5.4, rms: 2 },
				{ order: 5.5, rms: 1 },
				{ order: 5.7, rms: 0.5 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_240, samples: 2048 },
		);
		const w = harmonicWindow(x, 10_240, { fundamentalHz: 50 });
		const g = w.groups;
		expect(w.binHz).toBe(5);
		expect(w.binRms[50]).toBeCloseTo(10, 9);
		expect(g.harmonicSubgroupRms[5]).toBeCloseTo(10.4403, 4);
		expect(g.harmonicGroupRms[5]).toBeCloseTo(10.6536, 4);
		expect(g.harmonicGroupRms[6]).toBeCloseTo(0.866, 4);
		expect(g.harmonicSubgroupRms[6]).toBeLessThan(1e-9);
		expect(g.interharmonicGroupRms[5]).toBeCloseTo(3.7749, 4);
		expect(g.interharmonicSubgroupRms[5]).toBeCloseTo(2.2913, 4);
		expect(g.harmonicGroupRms[1]).toBeCloseTo(230, 9);
		// THDG uses groups: √(G_g5² + G_g6²)/G_g1 (every other group is 0)
		expect(w.thd.thdG40Percent).toBeCloseTo((100 * Math.sqrt(113.5 + 0.75)) / 230, 6);
		expect(w.thd.thdS40Percent).toBeCloseTo((100 * Math.sqrt(109)) / 230, 6);
	});

	it('tones between bins: groups equal the IEC 61000-4-7 sums over bins (docs/methods.md §2.2, equations from memory) taken from the DFT closed form', () => {
		// fs 10 kS/s, 2000 samples (10 cycles of 50 Hz); tones at 252.5 Hz (bin 50.5), 277.3 Hz and 612.25 Hz, sine reference
		const fs = 10_000;
		const n = 2000;
		const tones = [
			{ f: 50, rms: 230, ph: 0.3 },
			{ f: 252.5, rms: 4, ph: 1.1 },
			{ f: 277.3, rms: 2.5, ph: -0.4 },
			{ f: 612.25, rms: 1.5, ph: 2.0 },
		];
		const x = harmonicSamples(
			tones.map((t) => ({ order: t.f / 50, rms: t.rms, phaseDeg: (t.ph * 180) / Math.PI })),
			{ frequencyHz: 50, sampleRateHz: fs, samples: n },
		);
		const w = harmonicWindow(x, fs, { fundamentalHz: 50, maxOrder: 20 });
		// X_k of √2·a·sin(2πα i/N + φ): (√2a/2j)·[e^{jφ}·D(α − k) − e^{−jφ}·D(−α − k)],
		// D(β) = Σ_{i<N} e^{j2πβi/N} = (1 − e^{j2πβ}) / (1 − e^{j2πβ/N})
		const dk = (beta: number): [number, number] => {
			if (Math.abs(beta % n) < 1e-12) return [n, 0]; // every term is 1
			const nr = 1 - Math.cos(2 * Math.PI * beta);
			const ni = -Math.sin(2 * Math.PI * beta);
			const dr = 1 - Math.cos((2 * Math.PI * beta) / n);
			const di = -Math.sin((2 * Math.PI * beta) / n);
			const den = dr * dr + di * di;
			return [(nr * dr + ni * di) / den, (ni * dr - nr * di) / den];
		};
		const c = new Float64Array(211);
		for (let k = 1; k <= 210; k++) {
			let re = 0;
			let im = 0;
			for (const t of tones) {
				const alpha = (t.f * n) / fs;
				const [ar, ai] = dk(alpha - k);
				const [br, bi] = dk(-alpha - k);
				const s = (Math.SQRT2 * t.rms) / 2;
				// (e^{jφ}·A − e^{−jφ}·B) / j
				const pr = Math.cos(t.ph) * ar - Math.sin(t.ph) * ai - (Math.cos(t.ph) * br + Math.sin(t.ph) * bi);
				const pi = Math.cos(t.ph) * ai + Math.sin(t.ph) * ar - (Math.cos(t.ph) * bi - Math.sin(t.ph) * br);
				re += s * pi;
				im += -s * pr;
			}
			c[k] = (Math.SQRT2 * Math.hypot(re, im)) / n;
		}
		for (let k = 1; k <= 200; k++) expect(w.binRms[k]).toBeCloseTo(c[k], 9);
		const p = (k: number) => c[k] * c[k];
		for (const h of [5, 6, 12]) {
			const k = 10 * h;
			let g = p(k - 5) / 2 + p(k + 5) / 2;
			for (let i = -4; i <= 4; i++) g += p(k + i);
			let ig = 0;
			for (let i = 1; i <= 9; i++) ig += p(k + i);
			let isg = 0;
			for (let i = 2; i <= 8; i++) isg += p(k + i);
			expect(w.groups.harmonicGroupRms[h]).toBeCloseTo(Math.sqrt(g), 9);
			expect(w.groups.harmonicSubgroupRms[h]).toBeCloseTo(Math.sqrt(p(k - 1) + p(k) + p(k + 1)), 9);
			expect(w.groups.interharmonicGroupRms[h]).toBeCloseTo(Math.sqrt(ig), 9);
			expect(w.groups.interharmonicSubgroupRms[h]).toBeCloseTo(Math.sqrt(isg), 9);
		}
	});

	it('a tone half-way between bins (252.5 Hz = bin 50.5) puts 95.9 % of its power in group 5, as the Dirichlet kernel splits it', () => {
		// Closed form: a tone at bin α = k0 + ½ of a rectangular N-point window lands in bin k with the share
		// |D(α − k)|²/N² = sin²(π(α − k)) / (N² sin²(π(α − k)/N)) → 1/(π²(α − k)²) for |α − k| ≪ N (the shares
		// over all k sum to (2/π²)·Σ_m 1/(m + ½)² = (8/π²)·(π²/8) = 1). Group 5 = bins 46…54 in full, 45 and 55 half
		// (IEC 61000-4-7, docs/methods.md §2.2, from memory): distances ½ (twice), 1½ (twice), 2½ (twice), 3½ (twice),
		// 4½ (bin 46), and the half-weighted 5½ (bin 45) and 4½ (bin 55):
		// share = (1/π²)·[2·(4 + 0.4444 + 0.16 + 0.08163) + 0.04938 + ½·0.03306 + ½·0.04938] = 9.4627/π² = 0.95878,
		// so G_g,5 = 4 V·√0.95878 = 3.9167 V.
		// Left out: sin(πd/N) ≈ πd/N (relative error ≤ (π·5.5/2000)²/6 ≈ 1e-5) and the cross term with the
		// tone's negative-frequency image at −α, whose share in bin k is 1/(π²(α + k)²): bounded by
		// Σ_k 2/(π²|α − k|·|α + k|) = 0.0143 of the tone's power (1.5 % of the group's), i.e. ≤ 0.75 % of G_g,5; the test allows 1 %.
		const alpha = 50.5;
		let share = 0;
		for (let k = 45; k <= 55; k++) share += (k === 45 || k === 55 ? 0.5 : 1) / (Math.PI ** 2 * (alpha - k) ** 2);
		expect(share).toBeCloseTo(0.95878, 5); // the hand sum above
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230, phaseDeg: 17 },
				{ order: 5.05, rms: 4, phaseDeg: 63 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_000, samples: 2000 },
		);
		const w = harmonicWindow(x, 10_000, { fundamentalHz: 50, maxOrder: 20 });
		// the 50 Hz fundamental sits on bin 10 and leaks nothing into group 5 (D(integer ≠ 0) = 0)
		const expected = 4 * Math.sqrt(share);
		expect(Math.abs(w.groups.harmonicGroupRms[5] / expected - 1)).toBeLessThan(0.01);
	});

	it('12-cycle windows (60 Hz): the edge bins k ± 6 are half-weighted (IEC 61000-4-7, docs/methods.md §2.2, from memory; N = 12)', () => {
		const bins = new Float64Array(12 * 4 + 1);
		bins[12 * 2] = 3; // h2
		bins[12 * 2 + 6] = 2; // half-way between h2 and h3
		bins[12 * 2 + 1] = 1;
		const g = iecHarmonicGroups(bins, 12, 3);
		expect(g.harmonicGroupRms[2]).toBeCloseTo(Math.sqrt(9 + 1 + 4 / 2), 12);
		expect(g.harmonicGroupRms[3]).toBeCloseTo(Math.sqrt(4 / 2), 12);
		expect(g.harmonicSubgroupRms[2]).toBeCloseTo(Math.sqrt(10), 12);
		expect(g.interharmonicGroupRms[2]).toBeCloseTo(Math.sqrt(1 + 4), 12);
		expect(g.interharmonicSubgroupRms[2]).toBeCloseTo(2, 12);
	});

	it('Σ over harmonic groups of G_g² equals Σ over bins of C² from bin c/2 on (each bin counted once; invariant)', () => {
		const bins = new Float64Array(10 * 6 + 1).map((_, k) => Math.abs(Math.sin(k * 1.7)) + 0.1);
		const g = iecHarmonicGroups(bins, 10, 5);
		let groups = 0;
		for (let h = 1; h <= 5; h++) groups += g.harmonicGroupRms[h] ** 2;
		let total = bins[5] ** 2 / 2 + bins[55] ** 2 / 2;
		for (let k = 6; k <= 54; k++) total += bins[k] ** 2;
		expect(groups).toBeCloseTo(total, 12);
	});

	it('throws RangeError when there are too few bins for the orders asked', () => {
		expect(() => iecHarmonicGroups(new Float64Array(20), 10, 5)).toThrow(RangeError);
		expect(() => iecHarmonicGroups(new Float64Array(100), 0, 5)).toThrow(RangeError);
	});
});
