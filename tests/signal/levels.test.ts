import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	AVERAGE_RESPONDING_FACTOR,
	averageRespondingReading,
	findWholeCycles,
	waveformFigures,
} from '../../lib/signal/index.js';
import { harmonicSamples, shapeSamples, sineSamples } from '../helpers/synth.js';

// Closed forms. Continuous values: docs/methods.md §1.2 table (textbook closed forms, from memory there; the
// sine's 0.637 / 0.707 / 1.11 / 1.414 are common practice, docs/methods.md §1.2). Sampled values: exact sums over the
// samples the synth helper makes (P = 200 samples per cycle), derived below from the finite-sum identities
//   Σ_{n=0}^{P/2−1} sin(2πn/P) = cot(π/P)        (sum of sines in arithmetic progression)
//   Σ_{k=1}^{M} k² = M(M+1)(2M+1)/6               (sum of squares)
// so the figures are checked exactly (1e-12) and against the continuous table with a tolerance the
// difference of the two formulas bounds.

const A = 1;
const F = 50;
const FS = 10_000;
const P = FS / F; // 200 samples per cycle
const K = Math.PI / (2 * Math.SQRT2); // sine form factor, docs/methods.md §1.1

function closeRel(actual: number, expected: number, rel: number): void {
	expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));
}

describe('AVERAGE_RESPONDING_FACTOR and averageRespondingReading', () => {
	it('AVERAGE_RESPONDING_FACTOR equals π/(2√2) = 1.110720735 (docs/methods.md §1.1)', () => {
		expect(AVERAGE_RESPONDING_FACTOR).toBeCloseTo(1.110720735, 9);
	});
	it('averageRespondingReading(2A/π) of a sine equals its RMS A/√2 (the meter is sine-calibrated)', () => {
		expect(averageRespondingReading((2 * 325) / Math.PI)).toBeCloseTo(325 / Math.SQRT2, 10);
	});
});

describe('waveformFigures closed forms (A = 1, 50 Hz, 10 kS/s, 10.3 cycles recorded)', () => {
	const opts = { amplitude: A, frequencyHz: F, sampleRateHz: FS, cycles: 10.3 };

	it('sine: rms = A/√2, rectified mean = (2A/P)·cot(π/P) → 2A/π, FF → 1.1107, CF = √2, meter error → 0 %', () => {
		const w = waveformFigures(sineSamples(opts), FS);
		expect(w.span).toBe('whole-cycles');
		expect(w.rms).toBeCloseTo(A / Math.SQRT2, 12);
		expect(w.acRms).toBeCloseTo(A / Math.SQRT2, 12);
		expect(w.mean).toBeCloseTo(0, 12);
		const mavSampled = (2 * A) / P / Math.tan(Math.PI / P);
		expect(w.rectifiedMean).toBeCloseTo(mavSampled, 12);
		// continuous: 2A/π = 0.63662·A (common practice); sampled sum differs by ≈ (π/P)²/3 = 8.2e-5
		closeRel(w.rectifiedMean, (2 * A) / Math.PI, 1e-4);
		closeRel(w.formFactor, K, 1e-4);
		expect(w.peak).toBeCloseTo(A, 12);
		expect(w.peakNegative).toBeCloseTo(-A, 12);
		expect(w.peakToPeak).toBeCloseTo(2 * A, 12);
		expect(w.crestFactor).toBeCloseTo(Math.SQRT2, 10);
		// sampled meter error: K·mavSampled/(A/√2) − 1 = (π/P)·cot(π/P) − 1
		expect(w.averageResponding.errorPercent).toBeCloseTo(100 * (Math.PI / P / Math.tan(Math.PI / P) - 1), 9);
		expect(Math.abs(w.averageResponding.errorPercent)).toBeLessThan(0.01);
	});

	it('square ±A: rms = rectified mean = peak = A, FF = CF = 1, meter error = +11.07 % (docs/methods.md §1.2)', () => {
		const w = waveformFigures(shapeSamples('square', opts), FS);
		expect(w.rms).toBeCloseTo(A, 12);
		expect(w.rectifiedMean).toBeCloseTo(A, 12);
		expect(w.formFactor).toBeCloseTo(1, 12);
		expect(w.crestFactor).toBeCloseTo(1, 12);
		expect(w.averageResponding.reading).toBeCloseTo(K * A, 12);
		expect(w.averageResponding.errorPercent).toBeCloseTo(100 * (K - 1), 9);
		expect(w.averageResponding.errorPercent).toBeCloseTo(11.07, 2);
	});

	it('triangle ±A: rms² = A²(1/3 + 1/(6M²)) sampled (M = P/4) → A/√3, MAV = A/2, FF → 2/√3, CF → √3, error → −3.81 %', () => {
		const w = waveformFigures(shapeSamples('triangle', opts), FS);
		const m = P / 4;
		// samples are A·k/M; over a period Σ(k/M)² = (4·ΣK² − 2M²)/M² with ΣK² = M(M+1)(2M+1)/6
		const rmsSampled = A * Math.sqrt(1 / 3 + 1 / (6 * m * m));
		expect(w.rms).toBeCloseTo(rmsSampled, 12);
		expect(w.rectifiedMean).toBeCloseTo(A / 2, 12); // Σ|k| over a period = 2M² exactly
		closeRel(w.rms, A / Math.sqrt(3), 1 / (4 * m * m)); // √(1 + 1/(2M²)) − 1 < 1/(4M²)
		closeRel(w.formFactor, 2 / Math.sqrt(3), 1 / (4 * m * m));
		closeRel(w.crestFactor, Math.sqrt(3), 1 / (4 * m * m));
		// docs/methods.md §1.2: K/FF − 1 = −3.81 %
		expect(w.averageResponding.errorPercent).toBeCloseTo(100 * ((K * (A / 2)) / rmsSampled - 1), 9);
		expect(w.averageResponding.errorPercent).toBeCloseTo(-3.81, 1);
	});

	it('sawtooth ±A: samples A·k/M (k = −M…M−1, M = P/2): mean = −A/(2M), rms² = A²(1/3 + 1/(6M²)), MAV = A/2 → docs/methods.md §1.2 row', () => {
		const w = waveformFigures(shapeSamples('sawtooth', opts), FS);
		const m = P / 2;
		expect(w.mean).toBeCloseTo(-A / (2 * m), 12);
		const msSampled = A * A * (1 / 3 + 1 / (6 * m * m));
		expect(w.rms).toBeCloseTo(Math.sqrt(msSampled), 12);
		expect(w.acRms).toBeCloseTo(Math.sqrt(msSampled - (A / (2 * m)) ** 2), 12);
		expect(w.rectifiedMean).toBeCloseTo(A / 2, 12); // |k + ½| summed over the period = M²
		expect(w.peak).toBeCloseTo((A * (m - 1)) / m, 12);
		expect(w.peakNegative).toBeCloseTo(-A, 12);
		closeRel(w.rms, A / Math.sqrt(3), 1 / (4 * m * m));
		closeRel(w.crestFactor, Math.sqrt(3), 1 / (4 * m * m));
		expect(w.averageResponding.errorPercent).toBeCloseTo(-3.81, 1);
	});

	it('half-wave rectified sine: mean → A/π, rms = A/2, CF = 2; rectified mean about the DC and both meter errors from closed form', () => {
		const w = waveformFigures(shapeSamples('half-wave', opts), FS);
		expect(w.rms).toBeCloseTo(A / 2, 12); // Σ sin² over a half period = P/4 exactly
		expect(w.mean).toBeCloseTo(A / P / Math.tan(Math.PI / P), 12); // cot sum; → A/π (docs/methods.md §1.2)
		closeRel(w.mean, A / Math.PI, 1e-4);
		expect(w.crestFactor).toBeCloseTo(2, 12); // docs/methods.md §1.2
		// docs/methods.md §1.1 defines rectified mean = mean|x − DC|. With m = A/π, x − m > 0 on [α, π − α], α = asin(1/π);
		// the positive and negative parts of x − m have equal area, so MAV = 2·(1/2π)∫(A sinθ − m)dθ
		//   = (A/π)·(2 cos α − 1 + 2α/π) = 0.35084·A
		const alpha = Math.asin(1 / Math.PI);
		const mav = (A / Math.PI) * (2 * Math.cos(alpha) - 1 + (2 * alpha) / Math.PI);
		closeRel(w.rectifiedMean, mav, 2e-4); // sampling at 200/cycle, kinks at two crossings of the mean
		closeRel(w.formFactor, A / 2 / mav, 2e-4);
		const acRms = A * Math.sqrt(1 / 4 - 1 / Math.PI ** 2); // √(rms² − mean²) = 0.38559·A (docs/methods.md §1.2)
		const meanSampled = A / P / Math.tan(Math.PI / P);
		expect(w.acRms).toBeCloseTo(Math.sqrt((A * A) / 4 - meanSampled ** 2), 12);
		closeRel(w.acRms, acRms, 1e-4);
		// against true RMS (docs/methods.md §1.2): K·MAV/(A/2) − 1 = −22.05 %
		expect(w.averageResponding.errorPercent).toBeCloseTo(100 * ((K * mav) / (A / 2) - 1), 1);
		// against AC RMS: docs/methods.md §1.2 "AC-coupled average meters", +1.06 %
		expect(w.averageResponding.errorPercentAc).toBeCloseTo(100 * ((K * mav) / acRms - 1), 1);
		expect(w.averageResponding.errorPercentAc).toBeCloseTo(1.06, 1);
		expect(w.averageResponding.reading).toBeCloseTo(0.38969 * A, 3); // docs/methods.md §1.2
	});

	it('full-wave rectified sine: found as 100 Hz; rms = A/√2, mean → 2A/π, CF = √2, AC-coupled meter error −3.26 % (docs/methods.md §1.2)', () => {
		const w = waveformFigures(shapeSamples('full-wave', opts), FS);
		expect(w.cycles).toBeGreaterThanOrEqual(19); // 10.3 × 2 fundamental (100 Hz) cycles recorded
		expect(w.rms).toBeCloseTo(A / Math.SQRT2, 12);
		expect(w.mean).toBeCloseTo((2 * A) / P / Math.tan(Math.PI / P), 12);
		closeRel(w.mean, (2 * A) / Math.PI, 1e-4);
		expect(w.crestFactor).toBeCloseTo(Math.SQRT2, 10);
		// m = 2A/π; x − m > 0 on [β, π − β], β = asin(2/π), over a half period of the 50 Hz sine:
		//   MAV = 2·(1/π)∫(A sinθ − m)dθ = (2A/π)·(2 cos β − (π − 2β)·2/π) = 0.26804·A
		const beta = Math.asin(2 / Math.PI);
		const mav = ((2 * A) / Math.PI) * (2 * Math.cos(beta) - ((Math.PI - 2 * beta) * 2) / Math.PI);
		closeRel(w.rectifiedMean, mav, 3e-4);
		const acRms = A * Math.sqrt(1 / 2 - 4 / Math.PI ** 2); // 0.30776·A (docs/methods.md §1.2)
		const meanSampled = (2 * A) / P / Math.tan(Math.PI / P);
		expect(w.acRms).toBeCloseTo(Math.sqrt((A * A) / 2 - meanSampled ** 2), 12);
		// the sampled mean is low by (π/P)²/3 relative, which moves √(A²/2 − mean²) by about 4e-4 relative
		closeRel(w.acRms, acRms, 6e-4);
		expect(w.averageResponding.errorPercent).toBeCloseTo(100 * ((K * mav) / (A / Math.SQRT2) - 1), 1);
		expect(w.averageResponding.errorPercentAc).toBeCloseTo(-3.26, 1);
		expect(w.averageResponding.reading).toBeCloseTo(0.29771 * A, 3); // docs/methods.md §1.2
	});

	it('docs/methods.md §1.3 vector: 230 V + 4.6 V 3rd + 11.5 V 5th + 6.9 V 7th (RMS), 50 Hz, fs 10 240 Hz → rms 230.43659 V', () => {
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 3, rms: 4.6 },
				{ order: 5, rms: 11.5 },
				{ order: 7, rms: 6.9 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_240, cycles: 10 },
		);
		expect(waveformFigures(x, 10_240).rms).toBeCloseTo(230.43659, 4);
		// √Σ V_h² (docs/methods.md §1.3); 204.8 samples per cycle puts the window end between samples, whose partial
		// sample adds an error of order 1/P² of one sample's share: 1e-6 relative is ample
		closeRel(waveformFigures(x, 10_240).rms, Math.sqrt(230 ** 2 + 4.6 ** 2 + 11.5 ** 2 + 6.9 ** 2), 1e-6);
	});
});

describe('waveformFigures spans and edge cases', () => {
	it("waveformFigures(x, fs, { span: 'whole-record' }) uses plain sample means over all N samples", () => {
		const x = new Float64Array([1, -1, 3, 5]);
		const w = waveformFigures(x, 1000, { span: 'whole-record' });
		expect(w.span).toBe('whole-record');
		expect(w.mean).toBe(2); // (1 − 1 + 3 + 5)/4
		expect(w.rms).toBeCloseTo(Math.sqrt((1 + 1 + 9 + 25) / 4), 14);
		expect(w.acRms).toBeCloseTo(Math.sqrt((1 + 9 + 1 + 9) / 4), 14);
		expect(w.rectifiedMean).toBeCloseTo((1 + 3 + 1 + 3) / 4, 14);
		expect([w.peak, w.peakNegative, w.peakToPeak]).toEqual([5, -1, 6]);
		expect(w.crestFactor).toBeCloseTo(5 / 3, 14);
	});

	it('waveformFigures(empty) gives NaN figures and a no-samples warning', () => {
		const w = waveformFigures(new Float64Array(0), 10_000);
		expect(w.rms).toBeNaN();
		expect(w.mean).toBeNaN();
		expect(w.warnings.map((d) => d.code)).toContain('no-samples');
	});

	it('waveformFigures(one sample) falls back to the whole record with a warning: rms = |x|, ratios NaN', () => {
		const w = waveformFigures(new Float64Array([-7]), 10_000);
		expect(w.span).toBe('whole-record');
		expect(w.warnings.map((d) => d.code)).toContain('whole-record-fallback');
		expect(w.rms).toBe(7);
		expect(w.mean).toBe(-7);
		expect(w.acRms).toBe(0);
		expect(w.formFactor).toBeNaN();
	});

	it('waveformFigures(sine with one NaN) gives NaN figures (never a silent skip) and a non-finite-samples warning', () => {
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		x[123] = NaN;
		const w = waveformFigures(x, 10_000);
		for (const v of [w.mean, w.rms, w.acRms, w.rectifiedMean, w.peak, w.crestFactor, w.formFactor]) expect(v).toBeNaN();
		const nonFinite = w.warnings.find((d) => d.code === 'non-finite-samples');
		expect(nonFinite?.message).toContain('index 123');
	});

	it('waveformFigures(DC only) falls back to the whole record, says why, and gives rms = |DC|, acRms = 0', () => {
		const w = waveformFigures(new Float64Array(500).fill(12), 10_000);
		expect(w.span).toBe('whole-record');
		const fallback = w.warnings.find((d) => d.code === 'whole-record-fallback');
		expect(fallback?.message).toMatch(/constant/);
		expect(w.mean).toBe(12);
		expect(w.rms).toBeCloseTo(12, 12);
		expect(w.acRms).toBe(0);
		expect(w.formFactor).toBeNaN();
	});

	it('waveformFigures(x, fs, { window }) reuses a window found on another channel (current on the voltage window)', () => {
		const v = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 12.6 });
		const i = sineSamples({ amplitude: 10, frequencyHz: 50, sampleRateHz: 10_000, cycles: 12.6, phaseDeg: -30 });
		const win = findWholeCycles(v, 10_000);
		if (!win.ok) throw new Error(win.message);
		const w = waveformFigures(i, 10_000, { window: win });
		expect([w.startIndex, w.endIndex, w.cycles]).toEqual([win.startIndex, win.endIndex, win.cycles]);
		expect(w.rms).toBeCloseTo(10 / Math.SQRT2, 9); // whole cycles of the current too
	});

	it("waveformFigures(sine with a 5-cycle interruption) keeps whole cycles, warns 'fundamental-bridged', and rms = A/√2·√(on-time share)", () => {
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 30.4 });
		x.fill(0, 2000, 3000); // supply off for cycles 10…14 exactly
		const w = waveformFigures(x, 10_000);
		expect(w.span).toBe('whole-cycles');
		expect(w.warnings.map((d) => d.code)).toContain('fundamental-bridged');
		// crossings at 0, 200, …, 6000: 30 cycles, 25 of them live → mean square = (A²/2)·25/30
		expect(w.cycles).toBe(30);
		expect(w.rms).toBeCloseTo((325 / Math.SQRT2) * Math.sqrt(25 / 30), 6);
	});

	it('waveformFigures(x, 0) throws RangeError (a bad parameter, not data)', () => {
		expect(() => waveformFigures(new Float64Array(10), 0)).toThrow(RangeError);
	});
});

describe('waveformFigures properties (fast-check)', () => {
	// A mains-like signal: fundamental plus 3rd/5th/7th harmonics (≤ 30 %), DC, random phase and rate.
	const signal = fc.record({
		f: fc.double({ min: 45, max: 65, noNaN: true }),
		fs: fc.constantFrom(4000, 7800, 10_000, 12_800, 25_600),
		cycles: fc.double({ min: 4, max: 20, noNaN: true }),
		phaseDeg: fc.double({ min: -180, max: 180, noNaN: true }),
		h3: fc.double({ min: 0, max: 0.3, noNaN: true }),
		h5: fc.double({ min: 0, max: 0.3, noNaN: true }),
		h7: fc.double({ min: 0, max: 0.2, noNaN: true }),
		dc: fc.double({ min: -0.2, max: 0.2, noNaN: true }),
	});
	const make = (s: {
		f: number;
		fs: number;
		cycles: number;
		phaseDeg: number;
		h3: number;
		h5: number;
		h7: number;
		dc: number;
	}) =>
		harmonicSamples(
			[
				{ order: 1, rms: 1, phaseDeg: s.phaseDeg },
				{ order: 3, rms: s.h3, phaseDeg: 2 * s.phaseDeg + 40 },
				{ order: 5, rms: s.h5, phaseDeg: 3 * s.phaseDeg - 70 },
				{ order: 7, rms: s.h7, phaseDeg: 10 },
			],
			{ frequencyHz: s.f, sampleRateHz: s.fs, cycles: s.cycles, offset: s.dc },
		);

	it('scaling by k > 0 scales mean, rms, acRms, rectified mean and peaks by k and leaves form and crest factor', () => {
		fc.assert(
			fc.property(signal, fc.double({ min: 1e-3, max: 1e4, noNaN: true }), (s, k) => {
				const x = make(s);
				const a = waveformFigures(x, s.fs);
				const b = waveformFigures(
					x.map((v) => k * v),
					s.fs,
				);
				for (const key of ['rms', 'acRms', 'rectifiedMean', 'peak', 'peakNegative', 'peakToPeak'] as const) {
					expect(Math.abs(b[key] - k * a[key])).toBeLessThanOrEqual(1e-9 * k * a.rms);
				}
				expect(Math.abs(b.mean - k * a.mean)).toBeLessThanOrEqual(1e-9 * k * a.rms);
				expect(b.formFactor).toBeCloseTo(a.formFactor, 9);
				expect(b.crestFactor).toBeCloseTo(a.crestFactor, 9);
			}),
			{ numRuns: 40 },
		);
	});

	it('a time shift by whole samples leaves the figures unchanged (the window moves with the signal)', () => {
		fc.assert(
			fc.property(signal, fc.integer({ min: 1, max: 400 }), (s, shift) => {
				const n = Math.round((s.cycles * s.fs) / s.f);
				const long = make({ ...s, cycles: ((n + 401) * s.f) / s.fs });
				expect(long.length).toBeGreaterThanOrEqual(shift + n);
				const a = waveformFigures(long.subarray(0, n), s.fs);
				const b = waveformFigures(long.subarray(shift, shift + n), s.fs);
				// Whole-cycle figures of a periodic signal do not depend on where the record starts, except for
				// sampling effects near non-smooth points. With s ≥ max|dx/dn| = 2π√2(1 + 3h₃ + 5h₅ + 7h₇)/P:
				// - mean, rms: only the two fractional window ends differ, where the trapezoid chord misses g by at
				//   most (slope of g)/4 over one sample: |Δ mean| ≤ s/(c·P), |Δ rms| ≤ peak·s/(rms·c·P)
				//   (two ends of two windows over c·P samples, c whole cycles);
				// - rectified mean: |x − m| has a kink at each of the ~2c + 2 zero crossings, each costing the
				//   trapezoid rule at most s/4, and with a non-integer P the two windows sample them differently:
				//   |Δ| ≤ s·(c + 1)/(c·P).
				const p = s.fs / s.f;
				const c = Math.min(a.cycles, b.cycles); // 7.01 recorded cycles may give 6 or 7 whole ones
				const slope = (2 * Math.PI * Math.SQRT2 * (1 + 3 * s.h3 + 5 * s.h5 + 7 * s.h7)) / p;
				const tol = slope / (c * p);
				const peak = Math.max(a.peak, -a.peakNegative);
				expect(Math.abs(b.mean - a.mean)).toBeLessThanOrEqual(tol);
				expect(Math.abs(b.rectifiedMean - a.rectifiedMean)).toBeLessThanOrEqual((slope * (c + 1)) / (c * p));
				expect(Math.abs(b.rms - a.rms)).toBeLessThanOrEqual((peak * tol) / a.rms);
				expect(Math.abs(b.acRms - a.acRms)).toBeLessThanOrEqual((peak * tol) / a.acRms);
			}),
			{ numRuns: 40 },
		);
	});

	it('rms² = mean² + acRms² (power of DC and AC parts add: Parseval)', () => {
		fc.assert(
			fc.property(signal, fc.double({ min: -2, max: 2, noNaN: true }), (s, extraDc) => {
				const w = waveformFigures(make({ ...s, dc: s.dc + extraDc }), s.fs);
				expect(w.rms ** 2).toBeCloseTo(w.mean ** 2 + w.acRms ** 2, 10);
			}),
			{ numRuns: 40 },
		);
	});

	it('a non-integer number of cycles gives rms within 0.05 % of the whole-cycle truth √(DC² + Σ rms_h²)', () => {
		fc.assert(
			fc.property(signal, (s) => {
				const w = waveformFigures(make(s), s.fs);
				expect(w.span).toBe('whole-cycles');
				const truth = Math.sqrt(s.dc ** 2 + 1 + s.h3 ** 2 + s.h5 ** 2 + s.h7 ** 2); // docs/methods.md §1.3: RMS = √Σ V_h²
				closeRel(w.rms, truth, 5e-4);
			}),
			{ numRuns: 60 },
		);
	});

	it('inverting a channel (k = −1) keeps rms, acRms and rectified mean, negates the mean and swaps the peaks', () => {
		// 200 samples per cycle: whole-cycle figures equal plain sums over whole periods wherever the window starts
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 3, rms: 30, phaseDeg: 70 },
				{ order: 2, rms: 10 },
			],
			{
				frequencyHz: 50,
				sampleRateHz: 10_000,
				cycles: 10.3,
				offset: 4,
			},
		);
		const a = waveformFigures(x, 10_000);
		const b = waveformFigures(
			x.map((v) => -v),
			10_000,
		);
		expect(b.rms).toBeCloseTo(a.rms, 8);
		expect(b.acRms).toBeCloseTo(a.acRms, 8);
		expect(b.rectifiedMean).toBeCloseTo(a.rectifiedMean, 8);
		expect(b.mean).toBeCloseTo(-a.mean, 8);
		expect(b.peak).toBeCloseTo(-a.peakNegative, 8);
		expect(b.peakNegative).toBeCloseTo(-a.peak, 8);
		expect(b.crestFactor).toBeCloseTo(a.crestFactor, 8);
	});

	it('9.37 cycles of a sine give the same rms as 9 cycles within 0.05 % (a non-whole number of cycles)', () => {
		const nine = waveformFigures(
			sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 7_800, cycles: 9, phaseDeg: 17 }),
			7_800,
		);
		const more = waveformFigures(
			sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 7_800, cycles: 9.37, phaseDeg: 17 }),
			7_800,
		);
		closeRel(more.rms, nine.rms, 5e-4);
		closeRel(more.rms, 325 / Math.SQRT2, 5e-4);
	});
});
