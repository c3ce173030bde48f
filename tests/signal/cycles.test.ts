import { describe, expect, it } from 'vitest';
import { findWholeCycles, type CycleWindow } from '../../lib/signal/index.js';
import { gaussianNoise, harmonicSamples, sineSamples } from '../helpers/synth.js';

// Expected crossings come from the closed form of the synthesised fundamental
// x = A·sin(2π f n/fs + φ): it rises through zero where 2π f n/fs + φ = 2πk, i.e. n = (k − φ/2π)·fs/f.

function ok(r: ReturnType<typeof findWholeCycles>): CycleWindow {
	if (!r.ok) throw new Error(`${r.code}: ${r.message}`);
	return r;
}

/** Rising zero crossings of sin(2π f n/fs + φ) inside [0, n − 1]. */
function expectedCrossings(f: number, fs: number, phaseDeg: number, n: number): number[] {
	const period = fs / f;
	const out: number[] = [];
	for (let k = 0; ; k++) {
		const c = (k - phaseDeg / 360) * period;
		if (c > n - 1) break;
		if (c >= -1e-9) out.push(Math.max(0, c));
	}
	return out;
}

function expectCrossingsNear(actual: Float64Array, expected: number[], tolSamples: number): void {
	expect(actual.length).toBe(expected.length);
	for (let i = 0; i < expected.length; i++) expect(Math.abs(actual[i] - expected[i])).toBeLessThanOrEqual(tolSamples);
}

describe('findWholeCycles crossings', () => {
	it.each([
		[50, 10_000, 0],
		[50, 10_000, 73],
		[59.87, 7_800, -140],
		[49.5, 12_800, 10],
	])('findWholeCycles(sine %s Hz at %s S/s, phase %s°) puts each crossing at n = (k − φ/360°)·fs/f', (f, fs, ph) => {
		const x = sineSamples({ amplitude: 325, frequencyHz: f, sampleRateHz: fs, cycles: 12.3, phaseDeg: ph });
		const w = ok(findWholeCycles(x, fs));
		expectCrossingsNear(w.crossings, expectedCrossings(f, fs, ph, x.length), 1e-6);
		expect(w.cycles).toBe(w.crossings.length - 1);
		expect(w.startIndex).toBe(w.crossings[0]);
		expect(w.endIndex).toBe(w.crossings[w.cycles]);
		// contract: frequency = whole cycles / their duration
		expect(w.frequencyHz).toBeCloseTo((w.cycles * fs) / (w.endIndex - w.startIndex), 9);
		expect(w.frequencyHz).toBeCloseTo(f, 6);
	});

	it('findWholeCycles ignores a DC offset of 40 % of the peak (the raw signal would cross 13 samples late)', () => {
		const x = sineSamples({
			amplitude: 1,
			frequencyHz: 50,
			sampleRateHz: 10_000,
			cycles: 10.5,
			phaseDeg: 30,
			offset: 0.4,
		});
		const w = ok(findWholeCycles(x, 10_000));
		expectCrossingsNear(w.crossings, expectedCrossings(50, 10_000, 30, x.length), 1e-6);
	});

	it('findWholeCycles follows the fundamental when 40 % 3rd and 30 % 5th harmonics make the raw signal cross zero three times a cycle', () => {
		const x = harmonicSamples(
			[
				{ order: 1, rms: 1, phaseDeg: 15 },
				{ order: 3, rms: 0.4, phaseDeg: 225 },
				{ order: 5, rms: 0.3, phaseDeg: 255 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 10.2 },
		);
		let rawRising = 0;
		for (let i = 1; i < x.length; i++) if (x[i - 1] < 0 && x[i] >= 0) rawRising++;
		expect(rawRising).toBeGreaterThan(20); // the raw signal has extra crossings: a naive count would fail
		const w = ok(findWholeCycles(x, 10_000));
		// harmonics are orthogonal to the fit over its two-period window; the sampled Hann window leaves ~1e-8
		expectCrossingsNear(w.crossings, expectedCrossings(50, 10_000, 15, x.length), 1e-6);
	});

	it('findWholeCycles follows a frequency ramp of 0.1 Hz/s (49.8 → 50.2 Hz over 4 s) to within 0.01 sample', () => {
		const fs = 5_000;
		const f0 = 49.8;
		const rate = 0.1;
		const x = new Float64Array(4 * fs);
		for (let i = 0; i < x.length; i++) {
			const t = i / fs;
			x[i] = 325 * Math.sin(2 * Math.PI * (f0 * t + (rate * t * t) / 2));
		}
		const w = ok(findWholeCycles(x, fs));
		// phase 2π(f0 t + r t²/2) = 2πk  ⇒  t_k = (−f0 + √(f0² + 2 r k)) / r
		const expected: number[] = [];
		for (let k = 0; ; k++) {
			const n = ((-f0 + Math.sqrt(f0 * f0 + 2 * rate * k)) / rate) * fs;
			if (n > x.length - 1) break;
			expected.push(n);
		}
		// Interior crossings sit within ~0.001 sample. The first one is extrapolated from a window shifted
		// inwards, with the period averaged over the next 4 cycles: that average lags the ramp by about
		// 2.5 cycles × |dP/dk| = 2.5 × fs·r/f³ = 0.01 sample, hence 0.02.
		expectCrossingsNear(w.crossings, expected, 0.02);
		expectCrossingsNear(w.crossings.slice(1, -1), expected.slice(1, -1), 0.002);
		expect(w.frequencyHz).toBeCloseTo((expected.length - 1) / ((expected[expected.length - 1] - expected[0]) / fs), 4);
	});

	it('findWholeCycles bridges a 5-cycle interruption (noise only) at the last period and counts the bridged crossings', () => {
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 30, phaseDeg: 20 });
		const noise = gaussianNoise(1000, 0.5, 9); // 0.5 V of pickup while the supply is off
		for (let i = 0; i < 1000; i++) x[4000 + i] = noise[i];
		const w = ok(findWholeCycles(x, 10_000));
		const expected = expectedCrossings(50, 10_000, 20, x.length);
		// every crossing is where the undisturbed supply would cross: before, during (carried on at the last
		// period) and after; the crossings next to the gap come from one-sided fits, so they stay exact too
		expectCrossingsNear(w.crossings, expected, 0.01);
		expect(w.bridgedCrossings).toBeGreaterThanOrEqual(3);
		expect(w.frequencyHz).toBeCloseTo(50, 3);
	});

	it('findWholeCycles places crossings next to a dip to 40 % (amplitude step inside the fit window) within 0.01 sample', () => {
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 30, phaseDeg: -50 });
		for (let i = 3000; i < 4400; i++) x[i] *= 0.4; // dip starting and ending mid-cycle
		const w = ok(findWholeCycles(x, 10_000));
		expectCrossingsNear(w.crossings, expectedCrossings(50, 10_000, -50, x.length), 0.01);
		expect(w.bridgedCrossings ?? 0).toBe(0);
	});

	it("findWholeCycles(white noise with a 2-cycle burst of sine) still fails with 'no-fundamental' (mostly nothing to bridge from)", () => {
		const x = gaussianNoise(4000, 1, 4);
		const burst = sineSamples({ amplitude: 3, frequencyHz: 50, sampleRateHz: 10_000, samples: 400 });
		for (let i = 0; i < 400; i++) x[1800 + i] += burst[i];
		const r = findWholeCycles(x, 10_000);
		expect(r.ok ? 'ok' : r.code).toBe('no-fundamental');
	});

	it('findWholeCycles(9.37 cycles) gives whole cycles only: 8 or 9 depending on the starting phase', () => {
		for (const ph of [0, 45, 200]) {
			const x = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 10_000, cycles: 9.37, phaseDeg: ph });
			const w = ok(findWholeCycles(x, 10_000));
			expect(w.cycles).toBe(expectedCrossings(50, 10_000, ph, x.length).length - 1);
			expect([8, 9]).toContain(w.cycles);
		}
	});

	it('findWholeCycles(x, fs, { maxCycles: 10 }) keeps the first 10 cycles', () => {
		const x = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 10_000, cycles: 25.5, phaseDeg: 60 });
		const all = ok(findWholeCycles(x, 10_000));
		const ten = ok(findWholeCycles(x, 10_000, { maxCycles: 10 }));
		expect(ten.cycles).toBe(10);
		expect(ten.startIndex).toBeCloseTo(all.startIndex, 9);
		expect(ten.endIndex).toBeCloseTo(all.crossings[10], 9);
	});

	it('findWholeCycles(x, fs, { frequencyHz }) starts from the given frequency and still measures the true one', () => {
		const x = sineSamples({ amplitude: 1, frequencyHz: 50.4, sampleRateHz: 10_000, cycles: 12 });
		expect(ok(findWholeCycles(x, 10_000, { frequencyHz: 50 })).frequencyHz).toBeCloseTo(50.4, 6);
	});
});

describe('findWholeCycles failures', () => {
	it.each([
		[{ maxCycles: 0 }],
		[{ maxCycles: 2.5 }],
		[{ frequencyHz: 6_000 }],
		[{ frequencyHz: -50 }],
		[{ nominalHz: 0 }],
	])("findWholeCycles(x, fs, %o) fails with 'bad-parameter'", (opts) => {
		const x = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		const r = findWholeCycles(x, 10_000, opts);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.code).toBe('bad-parameter');
	});

	it("findWholeCycles(all zeros) fails with 'dc-only' (nothing alternates)", () => {
		const r = findWholeCycles(new Float64Array(1000), 10_000);
		expect(r.ok ? 'ok' : r.code).toBe('dc-only');
	});

	it("findWholeCycles(2.2 cycles starting at 10°) fails with 'too-short': only one whole cycle between crossings", () => {
		const r = findWholeCycles(
			sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 10_000, cycles: 2.2, phaseDeg: 10 }),
			10_000,
		);
		expect(r.ok ? 'ok' : r.code).toBe('too-short');
	});
});
