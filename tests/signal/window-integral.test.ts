import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { windowIntegral } from '../../lib/signal/window-integral.js';
import { shapeSamples } from '../helpers/synth.js';

// Identity checked: for a record with a whole number P of samples per period, the trapezoid rule over any
// window [s, s + kP] (s fractional) equals the plain sum of g over kP consecutive samples, because the two
// partial end pieces add up to one whole interior trapezoid (composite trapezoid rule on a periodic
// integrand). The expected value is that plain sum, computed here directly.

describe('windowIntegral', () => {
	it('windowIntegral over k whole periods from a fractional start equals the plain sum of kP samples (square wave, jumps included)', () => {
		const p = 200;
		const x = shapeSamples('square', { amplitude: 3, frequencyHz: 50, sampleRateHz: 10_000, cycles: 12 });
		fc.assert(
			fc.property(fc.double({ min: 0, max: 400, noNaN: true }), fc.integer({ min: 1, max: 9 }), (s, k) => {
				const g = (v: number) => v * v + v; // any g: one with both even and odd parts
				let plain = 0;
				const i0 = Math.floor(s);
				for (let j = 0; j < k * p; j++) plain += g(x[i0 + 1 + j]);
				expect(windowIntegral(x, s, s + k * p, g)).toBeCloseTo(plain, 8);
			}),
			{ numRuns: 100 },
		);
	});

	it('windowIntegral of a straight line is exact (trapezoid rule integrates linear functions exactly)', () => {
		const x = Float64Array.from({ length: 50 }, (_, i) => 2 + 0.5 * i);
		// ∫ from 3.25 to 41.6 of (2 + t/2) dt = 2·Δ + (41.6² − 3.25²)/4
		const expected = 2 * (41.6 - 3.25) + (41.6 ** 2 - 3.25 ** 2) / 4;
		expect(windowIntegral(x, 3.25, 41.6, (v) => v)).toBeCloseTo(expected, 10);
		// within one sample interval
		expect(windowIntegral(x, 7.2, 7.7, (v) => v)).toBeCloseTo(2 * 0.5 + (7.7 ** 2 - 7.2 ** 2) / 4, 12);
	});

	it('windowIntegral reaching the last sample (endIndex = N − 1) reads no sample past the end', () => {
		const x = new Float64Array([1, 2, 3, 4]);
		expect(windowIntegral(x, 0, 3, (v) => v)).toBeCloseTo((1 + 4) / 2 + 2 + 3, 14);
	});
});
