import { describe, expect, it } from 'vitest';
import {
	buildMinMaxBlocks,
	decimateMinMax,
	indexAtOrAfter,
	makeDecimationBuffers,
	timeAt,
} from '../../src/ui/charts/decimate.js';
import { sineSamples } from '../helpers/synth.js';

const base = (fs: number) => ({ startS: 0, sampleRateHz: fs });

describe('decimateMinMax', () => {
	it('decimateMinMax(samples) of whole sine cycles per column gives ±amplitude in every column (closed form: a sine spans ±A over a period)', () => {
		// 50 Hz at 10 kS/s: 200 samples per cycle, a sample lands on each crest (index 50 + 200k)
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 100 });
		const out = makeDecimationBuffers(1, 100);
		const r = decimateMinMax([x], base(10_000), 0, x.length, 100, out); // one cycle per column
		expect(r.full).toBe(false);
		expect(r.count).toBe(200);
		for (let c = 0; c < 100; c++) {
			const pair = [out.ys[0][2 * c], out.ys[0][2 * c + 1]];
			expect(Math.max(...pair)).toBeCloseTo(325, 9);
			expect(Math.min(...pair)).toBeCloseTo(-325, 9);
			// the positive crest (quarter period) comes before the negative one (three quarters) in each cycle
			expect(pair[0]).toBeGreaterThan(pair[1]);
		}
	});

	it('decimateMinMax keeps every sample inside the drawn envelope (invariant: column min ≤ sample ≤ column max)', () => {
		let seed = 12345;
		const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * 2 - 1;
		const x = Float64Array.from({ length: 100_003 }, rand);
		const cols = 777;
		const out = makeDecimationBuffers(1, cols);
		decimateMinMax([x], base(1), 0, x.length, cols, out);
		for (let c = 0; c < cols; c++) {
			const s = Math.floor((c * x.length) / cols);
			const e = Math.floor(((c + 1) * x.length) / cols);
			let lo = Infinity;
			let hi = -Infinity;
			for (let i = s; i < e; i++) {
				lo = Math.min(lo, x[i]);
				hi = Math.max(hi, x[i]);
			}
			expect(Math.min(out.ys[0][2 * c], out.ys[0][2 * c + 1])).toBe(lo);
			expect(Math.max(out.ys[0][2 * c], out.ys[0][2 * c + 1])).toBe(hi);
		}
	});

	it('decimateMinMax keeps a one-sample spike visible at any width (the point of min/max over plain subsampling)', () => {
		const x = new Float64Array(1_000_000);
		x[654_321] = 5000; // a 5 kV transient in one sample
		const out = makeDecimationBuffers(1, 300);
		decimateMinMax([x], base(1e6), 0, x.length, 300, out);
		expect(Math.max(...out.ys[0].subarray(0, 600))).toBe(5000);
	});

	it('decimateMinMax copies samples one for one when there are no more than two per column (full detail)', () => {
		const x = Float64Array.from({ length: 50 }, (_, i) => i * i);
		const out = makeDecimationBuffers(1, 40);
		const r = decimateMinMax([x], base(1000), 10, 60, 40, out);
		expect(r).toEqual({ count: 40, full: true });
		expect(Array.from(out.ys[0].subarray(0, 40))).toEqual(Array.from(x.subarray(10, 50)));
		expect(out.x[0]).toBe(10 / 1000);
	});

	it('decimateMinMax gives x in non-decreasing order (uPlot needs sorted x)', () => {
		const x = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 48_000, cycles: 37.3 });
		const out = makeDecimationBuffers(2, 613);
		const r = decimateMinMax([x, x], base(48_000), 5, x.length - 7, 613, out);
		for (let i = 1; i < r.count; i++) expect(out.x[i]).toBeGreaterThanOrEqual(out.x[i - 1]);
	});

	it('decimateMinMax of an empty range writes nothing; of an all-NaN column writes NaN (a gap, not a zero)', () => {
		const out = makeDecimationBuffers(1, 10);
		expect(decimateMinMax([new Float64Array(0)], base(1), 0, 0, 10, out).count).toBe(0);
		const x = new Float64Array(100).fill(NaN);
		x[95] = 1;
		decimateMinMax([x], base(1), 0, 100, 10, out);
		expect(out.ys[0][0]).toBeNaN();
		expect(out.ys[0][18]).toBe(1);
	});

	it('decimateMinMax rejects zero columns with a RangeError', () => {
		expect(() => decimateMinMax([new Float64Array(10)], base(1), 0, 10, 0, makeDecimationBuffers(1, 4))).toThrow(
			RangeError,
		);
	});
});

describe('timeAt / indexAtOrAfter', () => {
	it('timeAt(uniform base, i) equals startS + i/fs and indexAtOrAfter inverts it', () => {
		const b = { startS: -0.02, sampleRateHz: 4000 };
		expect(timeAt(b, 80)).toBeCloseTo(0, 12);
		expect(indexAtOrAfter(b, 1000, 0)).toBe(80);
		expect(indexAtOrAfter(b, 1000, 1e9)).toBe(1000);
		expect(indexAtOrAfter(b, 1000, -1e9)).toBe(0);
	});

	it('indexAtOrAfter(explicit times) finds the first stamp at or after t by binary search', () => {
		const b = { startS: 0, sampleRateHz: 1, timeS: new Float64Array([0, 0.5, 0.7, 2, 3]) };
		expect(indexAtOrAfter(b, 5, 0.6)).toBe(2);
		expect(indexAtOrAfter(b, 5, 2)).toBe(3);
	});
});

describe('buildMinMaxBlocks + decimateMinMax', () => {
	it('decimateMinMax with block tables gives the same column minima and maxima as reading every sample (invariant)', () => {
		let seed = 7;
		const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * 2 - 1;
		const x = Float64Array.from({ length: 300_017 }, rand);
		x[123_456] = NaN;
		const blocks = [buildMinMaxBlocks(x, 64)];
		for (const [i0, i1, cols] of [
			[0, x.length, 500],
			[1234, 250_000, 333],
			[99_999, 100_000 + 64 * 9, 2],
		] as const) {
			const a = makeDecimationBuffers(1, cols);
			const b = makeDecimationBuffers(1, cols);
			const ra = decimateMinMax([x], base(1), i0, i1, cols, a);
			const rb = decimateMinMax([x], base(1), i0, i1, cols, b, blocks);
			expect(rb.count).toBe(ra.count);
			for (let c = 0; c < ra.count; c += 2) {
				expect(Math.min(b.ys[0][c], b.ys[0][c + 1])).toBe(Math.min(a.ys[0][c], a.ys[0][c + 1]));
				expect(Math.max(b.ys[0][c], b.ys[0][c + 1])).toBe(Math.max(a.ys[0][c], a.ys[0][c + 1]));
			}
		}
	});

	it('buildMinMaxBlocks of a sine with 64-sample blocks holds the extremes of each block', () => {
		const x = sineSamples({ amplitude: 1, frequencyHz: 50, sampleRateHz: 6400, cycles: 3 }); // 128 samples per cycle
		const b = buildMinMaxBlocks(x, 64);
		expect(b.mins.length).toBe(6);
		// first half-cycle (samples 0..63) rises to the crest: max sin(2π·32/128) = 1, min sin(0) = 0
		expect(b.maxs[0]).toBeCloseTo(1, 12);
		expect(b.mins[0]).toBeCloseTo(0, 12);
		expect(b.minFirst[0]).toBe(1);
		expect(() => buildMinMaxBlocks(x, 1)).toThrow(RangeError);
	});
});
