import { describe, expect, it } from 'vitest';
import { signalWarnings } from '../../lib/signal/index.js';
import { shapeSamples, sineSamples } from '../helpers/synth.js';

const codes = (d: { code: string }[]) => d.map((x) => x.code);
const sine = (opts: {
	cycles: number;
	sampleRateHz?: number;
	frequencyHz?: number;
	offset?: number;
	amplitude?: number;
}) =>
	sineSamples({
		amplitude: opts.amplitude ?? 325,
		frequencyHz: opts.frequencyHz ?? 50,
		sampleRateHz: opts.sampleRateHz ?? 10_000,
		cycles: opts.cycles,
		offset: opts.offset,
	});

describe('signalWarnings', () => {
	it('signalWarnings(clean 10-cycle 50 Hz sine at 10 kS/s) raises nothing', () => {
		expect(signalWarnings(sine({ cycles: 10 }), 10_000, { frequencyHz: 50, maxOrder: 50, nominalHz: 50 })).toEqual([]);
	});

	it("signalWarnings(5 cycles) raises 'few-cycles' quoting the count (IEC 61000-4-30 uses 10/12-cycle values)", () => {
		const d = signalWarnings(sine({ cycles: 5 }), 10_000, { frequencyHz: 50, cycles: 4 });
		const w = d.find((x) => x.code === 'few-cycles');
		expect(w?.severity).toBe('warning');
		expect(w?.message).toContain('5 cycles');
		expect(w?.message).toContain('4 whole');
	});

	it("signalWarnings(1 kS/s, f 50 Hz, maxOrder 40) raises 'sample-rate-low-for-harmonics': fs must exceed 2·40·50 = 4000 Hz, highest order 9", () => {
		const d = signalWarnings(sine({ cycles: 10, sampleRateHz: 1000 }), 1000, { frequencyHz: 50, maxOrder: 40 });
		const w = d.find((x) => x.code === 'sample-rate-low-for-harmonics');
		// Nyquist: order h is measurable while h·f1 < fs/2, so the highest is ⌈1000/100⌉ − 1 = 9 (450 Hz < 500 Hz)
		expect(w?.message).toContain('4000 Hz');
		expect(w?.message).toMatch(/highest order measurable is 9\b/);
	});

	it('signalWarnings without a measured frequency judges the sample rate by the nominal one', () => {
		const d = signalWarnings(new Float64Array(100), 1000, { nominalHz: 60, maxOrder: 25 });
		expect(d.find((x) => x.code === 'sample-rate-low-for-harmonics')?.message).toMatch(
			/highest order measurable is 8\b/,
		); // ⌈1000/120⌉ − 1
	});

	it('signalWarnings Nyquist boundary: fs = 2·h·f1 exactly warns, just above does not', () => {
		const x = sine({ cycles: 10, sampleRateHz: 5000 });
		expect(codes(signalWarnings(x, 5000, { frequencyHz: 50, maxOrder: 50 }))).toContain(
			'sample-rate-low-for-harmonics',
		);
		expect(codes(signalWarnings(x, 5000.001, { frequencyHz: 50, maxOrder: 50 }))).not.toContain(
			'sample-rate-low-for-harmonics',
		);
	});

	it("signalWarnings(1 kS/s, peakAccuracyPercent 0.1) raises 'sample-rate-low-for-accuracy': a sampled crest may read 1 − cos(π·50/1000) = 1.23 % low", () => {
		const d = signalWarnings(sine({ cycles: 10, sampleRateHz: 1000 }), 1000, {
			frequencyHz: 50,
			peakAccuracyPercent: 0.1,
		});
		const w = d.find((x) => x.code === 'sample-rate-low-for-accuracy');
		expect(w?.message).toContain(String(Number((100 * (1 - Math.cos(Math.PI / 20))).toPrecision(4))));
		// the rate that meets 0.1 %: π·f / acos(1 − 0.001)
		expect(w?.message).toContain(String(Number(((Math.PI * 50) / Math.acos(1 - 0.001)).toPrecision(4))));
		expect(
			codes(signalWarnings(sine({ cycles: 10 }), 10_000, { frequencyHz: 50, peakAccuracyPercent: 0.1 })),
		).not.toContain('sample-rate-low-for-accuracy');
	});

	it("signalWarnings(sine of 400 V peak clipped at ±325 V) raises 'clipping'", () => {
		const x = sine({ cycles: 10, amplitude: 400 }).map((v) => Math.max(-325, Math.min(325, v)));
		expect(codes(signalWarnings(x, 10_000, { frequencyHz: 50 }))).toContain('clipping');
	});

	it('signalWarnings(8-bit-quantised but unclipped sine) does not cry clipping over its naturally flat crests', () => {
		const step = 650 / 255; // 8-bit converter across ±325 V
		const x = sine({ cycles: 10 }).map((v) => Math.round(v / step) * step);
		expect(codes(signalWarnings(x, 10_000, { frequencyHz: 50 }))).not.toContain('clipping');
	});

	it('signalWarnings(half-wave rectified sine) does not call its zero-current half cycles clipping', () => {
		const x = shapeSamples('half-wave', { amplitude: 10, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		expect(codes(signalWarnings(x, 10_000, { frequencyHz: 50 }))).not.toContain('clipping');
	});

	it("signalWarnings(DC offset 10 % of AC RMS) raises 'dc-offset' with the percentage; 1 % does not", () => {
		const acRms = 325 / Math.SQRT2;
		const d = signalWarnings(sine({ cycles: 10, offset: 0.1 * acRms }), 10_000, { frequencyHz: 50 });
		expect(d.find((x) => x.code === 'dc-offset')?.message).toContain('10 %');
		expect(
			codes(signalWarnings(sine({ cycles: 10, offset: 0.01 * acRms }), 10_000, { frequencyHz: 50 })),
		).not.toContain('dc-offset');
	});

	it('signalWarnings(5.5 cycles of a pure sine) raises no dc-offset: the half cycle alone would fake a mean of A/(5.5π), 8.2 % of the AC RMS', () => {
		// mean of A·sin over 5.5 cycles = A·(1 − cos π)/(2π·5.5) = A/(5.5π); AC RMS ≈ A/√2: ratio √2/(5.5π) = 8.2 %
		const x = sine({ cycles: 5.5 });
		expect(codes(signalWarnings(x, 10_000, { frequencyHz: 50 }))).not.toContain('dc-offset');
		expect(codes(signalWarnings(x, 10_000, {}))).toContain('dc-offset'); // without a frequency, the whole record is all it has
	});

	it.each([
		[41, undefined, true],
		[50, undefined, false],
		[70, undefined, true],
		[60, 50, true], // above 57.5 Hz for a 50 Hz system
		[55, 60, false], // inside 51–69 Hz
		[50, 60, true], // below 51 Hz for a 60 Hz system
		[400, 400, false], // no IEC 61000-4-30 range for 400 Hz systems: not judged
	])(
		"signalWarnings(f %s Hz, nominal %s) 'frequency-out-of-range' = %s (IEC 61000-4-30 ranges 42.5–57.5 / 51–69 Hz)",
		(f, nominal, expected) => {
			const x = sine({ cycles: 12, frequencyHz: f });
			expect(
				codes(signalWarnings(x, 10_000, { frequencyHz: f, nominalHz: nominal })).includes('frequency-out-of-range'),
			).toBe(expected);
		},
	);

	it("signalWarnings(samples with NaN) raises 'non-finite-samples' with the first index", () => {
		const x = sine({ cycles: 10 });
		x[42] = NaN;
		x[43] = Infinity;
		const w = signalWarnings(x, 10_000, {}).find((d) => d.code === 'non-finite-samples');
		expect(w?.message).toContain('2 sample(s)');
		expect(w?.message).toContain('index 42');
	});

	it('signalWarnings(empty) raises nothing; signalWarnings(x, 0) throws RangeError', () => {
		expect(signalWarnings(new Float64Array(0), 10_000, { frequencyHz: 50 })).toEqual([]);
		expect(() => signalWarnings(new Float64Array(4), 0, {})).toThrow(RangeError);
	});
});
