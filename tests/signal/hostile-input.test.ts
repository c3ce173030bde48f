/**
 * Finite but enormous samples, NaN periods and records of more cycles than a call can take arguments:
 * each must give a typed failure or a plain result, never an endless loop or a stack overflow.
 */
import { describe, expect, it } from 'vitest';
import { findWholeCycles, maxOf, minOf } from '../../lib/signal/index.js';
import { worstCycle } from '../../lib/report/extras.js';
import { smoothFactors } from '../../lib/spectrum/mixed-radix.js';
import { sineSamples } from '../helpers/synth.js';

describe('findWholeCycles on samples whose squares overflow', () => {
	it('alternating +-1e308 is a bad-parameter failure naming the sample, not an endless loop', () => {
		// (1e308)^2 exceeds the largest binary64 value, about 1.797e308 (IEEE 754-2019, 3.6 table 3.5,
		// from memory), so every sum of squares over these samples is Infinity.
		const x = new Float64Array(10_000).map((_, k) => (k % 2 === 0 ? 1e308 : -1e308));
		const r = findWholeCycles(x, 10_000);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.code).toBe('bad-parameter');
		expect(r.message).toMatch(/Sample at index \d+ is/);
		expect(r.message).toMatch(/too large/);
	});

	it('a sine of peak 1e200 (square 1e400) fails the same way; a sine of peak 1e150 is measured', () => {
		const huge = sineSamples({ amplitude: 1e200, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		const r = findWholeCycles(huge, 10_000);
		expect(r.ok === false && r.code === 'bad-parameter').toBe(true);
		// 1e150 squared is 1e300, inside binary64: 10 cycles of 50 Hz at 10 kS/s give 50 Hz (closed form)
		const big = sineSamples({ amplitude: 1e150, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10.5 });
		const ok = findWholeCycles(big, 10_000);
		expect(ok.ok).toBe(true);
		if (ok.ok) expect(ok.frequencyHz).toBeCloseTo(50, 6);
	});
});

describe('minOf / maxOf over data longer than a call takes arguments', () => {
	it('find the extremes of 10^6 values where Math.min(...values) throws RangeError', () => {
		const n = 1_000_000;
		// closed form: the values k - 400000 for k = 0..n-1 run from -400000 to 599999
		const v = new Float64Array(n).map((_, k) => k - 400_000);
		expect(() => Math.min(...v)).toThrow(RangeError); // V8 limit on arguments (common practice)
		expect(minOf(v)).toBe(-400_000);
		expect(maxOf(v)).toBe(599_999);
	});

	it('follow Math.min / Math.max on NaN and on no values', () => {
		expect(minOf([1, NaN, 0])).toBeNaN();
		expect(maxOf([NaN, 1])).toBeNaN();
		expect(minOf([])).toBe(Infinity);
		expect(maxOf([])).toBe(-Infinity);
	});
});

describe('worstCycle on a record of more than 125,000 cycles', () => {
	it('gives the lowest cycle RMS of 130,000 cycles (A/sqrt 2, closed form) without overflowing the stack', () => {
		// 50 Hz at 400 S/s, phase 0: 8 samples per cycle, rising crossings exactly at k·8 (closed form)
		const cycles = 130_000;
		const fs = 400;
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: fs, cycles });
		const crossings = new Float64Array(cycles + 1).map((_, k) => 8 * k);
		const w = worstCycle(x, { startIndex: 0, endIndex: 8 * cycles, cycles, frequencyHz: 50, crossings }, fs);
		expect(w.lowestRms).toBeCloseTo(325 / Math.SQRT2, 6);
	});
});

describe('smoothFactors on lengths with no factorisation', () => {
	it('0, NaN and fractions give undefined (0 % 4 === 0 once looped forever)', () => {
		expect(smoothFactors(0)).toBeUndefined();
		expect(smoothFactors(NaN)).toBeUndefined();
		expect(smoothFactors(2.5)).toBeUndefined();
		expect(smoothFactors(4 * 9 * 5)).toEqual([4, 3, 3, 5]); // 180 = 4·3·3·5
	});
});
