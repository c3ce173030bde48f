import { describe, expect, it } from 'vitest';
import { findWholeCycles, perCycleFigures, waveformFigures, type CycleWindow } from '../../lib/signal/index.js';
import { windowIntegral } from '../../lib/signal/window-integral.js';
import { harmonicAnalysis } from '../../lib/spectrum/harmonic-analysis.js';
import { harmonicWindow } from '../../lib/spectrum/harmonics.js';
import { shapeSamples } from '../helpers/synth.js';

// A record of exactly k cycles that starts at a rising zero crossing (a scope at 20 ms/div × 10 div exports
// 200 ms = 10 cycles of 50 Hz). Each sample stands for the interval [n/fs, (n + 1)/fs), so N samples cover
// N/fs seconds, indices [0, N), and the closing crossing at index N lies inside the record.
// Expected values are closed form:
// - crossings of U·sin(2π f n/fs) at n = k·fs/f (the sine's rising zeros);
// - RMS of a sum of sines of distinct orders = √(Σ Uh²/2) (orthogonality of sines over whole periods;
//   for a whole number P of samples per period the sample mean of sin² is exactly 1/2, discrete orthogonality);
// - 5th-harmonic share = its amplitude ÷ the fundamental's (definition of % of fundamental, IEC 61000-4-7).

const U1 = 325.27;
const U5 = 0.05 * U1; // a 5 % 5th harmonic

/** N samples of U1·sin(2π f n/fs) + U5·sin(2π·5f n/fs) (+ phase of the fundamental, degrees). */
function mains(f: number, fs: number, n: number, phaseDeg = 0): Float64Array {
	const w = (2 * Math.PI * f) / fs;
	const ph = (phaseDeg * Math.PI) / 180;
	return Float64Array.from({ length: n }, (_, i) => U1 * Math.sin(w * i + ph) + U5 * Math.sin(5 * (w * i + ph)));
}

function ok(r: ReturnType<typeof findWholeCycles>): CycleWindow {
	if (!r.ok) throw new Error(`${r.code}: ${r.message}`);
	return r;
}

// closed form: √(U1²/2 + U5²/2)
const RMS = Math.sqrt((U1 * U1 + U5 * U5) / 2);

describe('a record of exactly 10 cycles (window ending at index N)', () => {
	it.each([
		// [f, fs, N]: 10 cycles = 10·fs/f samples exactly
		[50, 10_000, 2000], // 200 samples per cycle
		[50, 7_800, 1560], // 156 samples per cycle
		[50, 7_680, 1536], // 153.6 samples per cycle: a cycle is not whole, 10 cycles are
	])(
		'findWholeCycles(10 cycles of %s Hz at %s S/s, N = %s, toRecordEnd) gives 10 cycles, crossings at k·fs/f',
		(f, fs, n) => {
			const x = mains(f, fs, n);
			const w = ok(findWholeCycles(x, fs, { toRecordEnd: true }));
			expect(w.cycles).toBe(10);
			// closed form: crossings at n = k·fs/f, k = 0 … 10, the last at N
			for (let k = 0; k <= 10; k++) expect(Math.abs(w.crossings[k] - (k * fs) / f)).toBeLessThan(1e-6);
			expect(w.endIndex).toBeCloseTo(n, 6);
			expect(w.frequencyHz).toBeCloseTo(f, 6);
		},
	);

	it('findWholeCycles without toRecordEnd stops at the last sample (N − 1): 9 cycles (the default until lib/power accepts N)', () => {
		// closed form: crossings at 200k; 2000 > N − 1 = 1999
		expect(ok(findWholeCycles(mains(50, 10_000, 2000), 10_000)).cycles).toBe(9);
	});

	it('a closing crossing between N − 1 and N counts: 10 cycles of 49.97 Hz at 10 kS/s span 2001.2 samples, N = 2002', () => {
		// closed form: period 10 000/49.97 = 200.12 samples, 10th crossing at 2001.2 ∈ (N − 1, N]
		const x = mains(49.97, 10_000, 2002);
		const w = ok(findWholeCycles(x, 10_000, { toRecordEnd: true }));
		expect(w.cycles).toBe(10);
		expect(Math.abs(w.endIndex - 100_000 / 49.97)).toBeLessThan(1e-6);
	});

	it('a first crossing before index 0 is not used: crossings at −0.3 + 200k give 9 cycles in 2000 samples', () => {
		// phase φ with crossing at n = −0.3: φ = 2π·0.3/200 = 0.54°; crossings at −0.3, 199.7, …, 1999.7: the
		// record [0, 2000) holds the 9 whole cycles from 199.7 to 1999.7
		const x = mains(50, 10_000, 2000, (0.3 / 200) * 360);
		const w = ok(findWholeCycles(x, 10_000, { toRecordEnd: true }));
		expect(w.cycles).toBe(9);
		expect(w.startIndex).toBeCloseTo(199.7, 6);
		expect(w.endIndex).toBeCloseTo(1999.7, 6);
	});

	it.each([
		[50, 10_000, 2000],
		[50, 7_800, 1560],
		[50, 7_680, 1536],
	])(
		'waveformFigures(10 cycles of %s Hz at %s S/s) covers 10 cycles and gives the closed-form RMS √(U1²/2 + U5²/2)',
		(f, fs, n) => {
			const figs = waveformFigures(mains(f, fs, n), fs);
			expect(figs.span).toBe('whole-cycles');
			expect(figs.cycles).toBe(10);
			// whole samples per cycle: exact to rounding; 153.6 per cycle: the value at N is interpolated one period back
			expect(Math.abs(figs.rms / RMS - 1)).toBeLessThan(fs === 7_680 ? 1e-6 : 1e-12);
			expect(Math.abs(figs.mean)).toBeLessThan(1e-6 * RMS); // closed form: 0 (sines over whole periods)
			expect(figs.warnings.some((d) => /cycle/i.test(d.message) && /few|only/i.test(d.message))).toBe(false);
		},
	);

	it('perCycleFigures over a window ending at N gives 10 cycles, each of the closed-form RMS', () => {
		const x = mains(50, 10_000, 2000);
		const w = ok(findWholeCycles(x, 10_000, { toRecordEnd: true }));
		const p = perCycleFigures(x, w);
		expect(p.rms.length).toBe(10);
		for (let k = 0; k < 10; k++) expect(Math.abs(p.rms[k] / RMS - 1)).toBeLessThan(1e-9);
	});

	it('harmonicWindow: the default 10-cycle window fits a window ending at N and reads the 5 % 5th as 5.00 % (direct DFT)', () => {
		const x = mains(50, 10_000, 2000);
		const w = ok(findWholeCycles(x, 10_000, { toRecordEnd: true }));
		const h = harmonicWindow(x, 10_000, { fundamentalHz: w.frequencyHz, startIndex: w.startIndex });
		expect(h.set.cycles).toBe(10);
		expect(h.resampled).toBe(false);
		// closed form: rms_1 = U1/√2, 5th = 5 % of it
		expect(h.set.orders[1].rms).toBeCloseTo(U1 / Math.SQRT2, 6);
		expect(h.percentOfFundamental[5]).toBeCloseTo(5, 6);
		const a = harmonicAnalysis(x, 10_000, {
			fundamentalHz: w.frequencyHz,
			startIndex: w.startIndex,
			endIndex: w.endIndex,
		});
		expect(a.windows.length).toBe(1);
	});

	it('harmonicWindow on 10 cycles of 49.97 Hz spanning 2001.2 of N = 2002 samples (resampled) reads the 5th as 5.00 %', () => {
		const x = mains(49.97, 10_000, 2002);
		const w = ok(findWholeCycles(x, 10_000, { toRecordEnd: true }));
		const h = harmonicWindow(x, 10_000, { fundamentalHz: w.frequencyHz, startIndex: w.startIndex });
		expect(h.resampled).toBe(true);
		// resampler accuracy < 2e-5 of the amplitude (sync-resample.ts): 5 % ± 0.0002 %
		expect(Math.abs(h.percentOfFundamental[5] - 5)).toBeLessThan(2e-4);
		expect(Math.abs(h.set.orders[1].rms / (U1 / Math.SQRT2) - 1)).toBeLessThan(2e-5);
		const a = harmonicAnalysis(x, 10_000, {
			fundamentalHz: w.frequencyHz,
			startIndex: w.startIndex,
			endIndex: w.endIndex,
		});
		expect(a.windows.length).toBe(1);
	});
});

describe('windowIntegral to the record end (index N)', () => {
	it('over [0, N] of 10 whole periods of a square wave equals the plain sum of the N samples (G(N) := G(N − P))', () => {
		// identity: x[N − P] = x[0] for a periodic record with whole P, and the trapezoid over [a, a + M] with
		// x[a + M] := x[a] is the plain sum Σ_{j<M} g(x[a + j]) (composite trapezoid rule on a periodic integrand)
		const x = shapeSamples('square', { amplitude: 3, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		const g = (v: number) => v * v + v;
		let plain = 0;
		for (let j = 0; j < x.length; j++) plain += g(x[j]);
		expect(windowIntegral(x, 0, x.length, g, 200)).toBeCloseTo(plain, 9);
		expect(windowIntegral(x, 0, x.length, g)).toBeCloseTo(plain, 9); // default wrap: the window length
	});

	it('a window ending past N is a RangeError', () => {
		const x = new Float64Array([1, 2, 3, 4]);
		expect(() => windowIntegral(x, 0, 4.5, (v) => v)).toThrow(RangeError);
		expect(() => windowIntegral(x, -0.5, 3, (v) => v)).toThrow(RangeError);
	});
});
