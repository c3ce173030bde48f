import { describe, expect, it } from 'vitest';
import { crossCorrelationLag } from '../../lib/power/index.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';

describe('crossCorrelationLag', () => {
	const fs = 10_000;

	it('on a pure 50 Hz sine agrees with the phasor angle (32°, closed form) to 0.05°', () => {
		const ref = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: fs, samples: 2600 });
		const other = sineSamples({ amplitude: 14, frequencyHz: 50, sampleRateHz: fs, samples: 2600, phaseDeg: -32 });
		const r = crossCorrelationLag(ref, other, fs, { startIndex: 200, endIndex: 2200, cycles: 10 });
		expect(Math.abs(r.lagDeg - 32)).toBeLessThan(0.05);
		expect(r.lagS).toBeCloseTo(32 / 360 / 50, 6);
		expect(r.periodS).toBeCloseTo(0.02, 12);
		expect(r.correlationCoefficient).toBeCloseTo(1, 6);
	});

	it('resolves sub-sample lags at 49.95 Hz on a fractional window (7.3° = 4.06 samples) to 0.05°', () => {
		const f = 49.95;
		const ref = sineSamples({ amplitude: 1, frequencyHz: f, sampleRateHz: fs, samples: 2600 });
		const other = sineSamples({ amplitude: 2, frequencyHz: f, sampleRateHz: fs, samples: 2600, phaseDeg: -7.3 });
		// window: rising zero crossings of ref at n = k·fs/f (closed form)
		const r = crossCorrelationLag(ref, other, fs, { startIndex: fs / f, endIndex: (11 * fs) / f, cycles: 10 });
		expect(Math.abs(r.lagDeg - 7.3)).toBeLessThan(0.05);
	});

	it('gives a negative lag for a leading channel and handles lags near ±180°', () => {
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2600 });
		const lead = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2600, phaseDeg: 75 });
		expect(crossCorrelationLag(ref, lead, fs, { startIndex: 200, endIndex: 2200, cycles: 10 }).lagDeg).toBeCloseTo(
			-75,
			1,
		);
		const anti = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2600, phaseDeg: -179.7 });
		expect(crossCorrelationLag(ref, anti, fs, { startIndex: 200, endIndex: 2200, cycles: 10 }).lagDeg).toBeCloseTo(
			179.7,
			1,
		);
	});

	it('of a distorted waveform and its time-shifted copy returns the shift (time-shift invariance: 0.9 ms)', () => {
		// a shift of τ moves harmonic h by −h·360·f·τ degrees
		const tauS = 0.0009;
		const tones = (shiftS: number) =>
			[1, 3, 5].map((h, k) => ({ order: h, rms: [230, 20, 12][k], phaseDeg: [0, 40, -70][k] - h * 360 * 50 * shiftS }));
		const ref = harmonicSamples(tones(0), { frequencyHz: 50, sampleRateHz: fs, samples: 2600 });
		const other = harmonicSamples(tones(tauS), { frequencyHz: 50, sampleRateHz: fs, samples: 2600 });
		const r = crossCorrelationLag(ref, other, fs, { startIndex: 200, endIndex: 2200, cycles: 10 });
		expect(r.lagS).toBeCloseTo(tauS, 6);
	});

	it('uses every cycle of a window from sample 0 to the end (periodic continuation; nothing dropped) and gives 20°', () => {
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2001 });
		const other = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2001, phaseDeg: -20 });
		const r = crossCorrelationLag(ref, other, fs, { startIndex: 0, endIndex: 2000, cycles: 10 });
		expect(r.cyclesUsed).toBe(10);
		expect(Math.abs(r.lagDeg - 20)).toBeLessThan(0.05);
	});

	it('gives the lag from a record of one period only: 20° and 20/360 × 20 ms = 1.111 ms (closed form)', () => {
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 201 });
		const other = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 201, phaseDeg: -20 });
		const r = crossCorrelationLag(ref, other, fs, { startIndex: 0, endIndex: 200, cycles: 1 });
		expect(r.cyclesUsed).toBe(1);
		expect(Math.abs(r.lagDeg - 20)).toBeLessThan(0.05);
		expect(Math.abs(r.lagS - 20 / 360 / 50)).toBeLessThan(0.05 / 360 / 50);
	});

	it('returns NaN fields for a constant channel', () => {
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: fs, samples: 2600 });
		expect(
			crossCorrelationLag(ref, new Float64Array(2600).fill(3), fs, { startIndex: 200, endIndex: 2200, cycles: 10 })
				.lagS,
		).toBeNaN();
	});

	it('gives the same lag after block-averaging a 1 MS/s record (20 000 samples per period): 20° within 0.05°', () => {
		const hi = 1e6;
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: hi, samples: 60_001 });
		const other = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: hi, samples: 60_001, phaseDeg: -20 });
		const r = crossCorrelationLag(ref, other, hi, { startIndex: 0, endIndex: 60_000, cycles: 3 });
		expect(Math.abs(r.lagDeg - 20)).toBeLessThan(0.05);
		expect(Math.abs(r.lagS - 20 / 360 / 50)).toBeLessThan(0.05 / 360 / 50);
	});

	it('throws RangeError for unequal lengths or a bad sample rate', () => {
		const x = new Float64Array(500);
		expect(() =>
			crossCorrelationLag(x, new Float64Array(400), fs, { startIndex: 0, endIndex: 200, cycles: 1 }),
		).toThrow(RangeError);
		expect(() => crossCorrelationLag(x, x, 0, { startIndex: 0, endIndex: 200, cycles: 1 })).toThrow(RangeError);
	});
});

describe('crossCorrelationLag edge cases', () => {
	it('throws RangeError for empty arrays (no window fits) and returns NaN when a sample is NaN', () => {
		expect(() =>
			crossCorrelationLag(new Float64Array(0), new Float64Array(0), 10_000, { startIndex: 0, endIndex: 1, cycles: 1 }),
		).toThrow(RangeError);
		const ref = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 10_000, samples: 2600 });
		const other = ref.slice();
		other[1000] = NaN;
		expect(crossCorrelationLag(ref, other, 10_000, { startIndex: 200, endIndex: 2200, cycles: 10 }).lagS).toBeNaN();
	});
});
