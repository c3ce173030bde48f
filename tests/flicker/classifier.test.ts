import { describe, expect, it } from 'vitest';
import {
	PINST_CLASSES,
	pinstClass,
	pinstLevelExceeded,
	pltFromPst,
	pltIntervals,
	pstFromHistogram,
	type PstInterval,
} from '../../lib/flicker/index.js';

function histogram(values: number[]): Uint32Array {
	const h = new Uint32Array(PINST_CLASSES);
	for (const v of values) h[pinstClass(v)]++;
	return h;
}

describe('pinstLevelExceeded', () => {
	it('of 100 000 values evenly spread over (0, 10] returns 10·(1 − p/100) within one class (0.8 %)', () => {
		const n = 100_000;
		const values = Array.from({ length: n }, (_, i) => (10 * (i + 1)) / n);
		const h = histogram(values);
		for (const p of [0.1, 1, 3, 10, 50, 80]) {
			const expected = 10 * (1 - p / 100);
			expect(Math.abs(pinstLevelExceeded(h, n, p) / expected - 1)).toBeLessThan(0.008);
		}
	});

	it('of a constant returns that constant within its class for every percentile', () => {
		const h = histogram(new Array(1000).fill(2.5));
		for (const p of [0.1, 50, 80]) expect(Math.abs(pinstLevelExceeded(h, 1000, p) / 2.5 - 1)).toBeLessThan(0.008);
	});

	it('returns NaN when nothing was counted', () => {
		expect(pinstLevelExceeded(new Uint32Array(PINST_CLASSES), 0, 50)).toBeNaN();
	});

	it('classes are monotonic in the value and at most 1/128 of an octave wide (float32 top 16 bits)', () => {
		let prev = -1;
		for (let x = 1e-6; x < 1e6; x *= 1.003) {
			const c = pinstClass(x);
			expect(c).toBeGreaterThanOrEqual(prev);
			prev = c;
		}
		expect(pinstClass(1)).toBe(pinstClass(1 + 1 / 256));
		expect(pinstClass(1)).not.toBe(pinstClass(1 + 1 / 128 + 1e-9));
	});
});

describe('pstFromHistogram', () => {
	// Within one class: levels are interpolated inside a class 0.78 % wide, so a constant reads up to
	// 0.78 % high and its Pst up to 0.39 % high.
	it('a constant Pinst of 1 gives Pst = √(0.0314 + 0.0525 + 0.0657 + 0.28 + 0.08) within one class (IEC 61000-4-15:2010, 5.7.2, from memory)', () => {
		const r = pstFromHistogram(histogram(new Array(60_000).fill(1)), 60_000);
		const expected = Math.sqrt(0.0314 + 0.0525 + 0.0657 + 0.28 + 0.08);
		expect(r.pst / expected).toBeGreaterThanOrEqual(1);
		expect(r.pst / expected).toBeLessThan(1.004);
		expect(Math.abs(r.p50s - 1)).toBeLessThan(0.008);
	});

	it('a Pinst of 4 for 0.1 % of the time and 0 otherwise weighs only P0.1 (0.0314 · 4 → Pst ≈ 0.354)', () => {
		// 0.2 % of the time at 4: P0.1 = 4 exactly, P0.7 and beyond are 0
		const values = [...new Array(200).fill(4), ...new Array(99_800).fill(0)];
		const r = pstFromHistogram(histogram(values), values.length);
		expect(r.p01).toBeCloseTo(4, 1);
		expect(r.p1s).toBeLessThan(1e-30); // the class of 0 reaches up to the smallest float32 normal
		expect(r.pst).toBeCloseTo(Math.sqrt(0.0314 * 4), 2);
	});

	it('scales Pst by √k when every Pinst is multiplied by k (the formula is linear in the levels)', () => {
		const base = Array.from({ length: 50_000 }, (_, i) => 0.2 + Math.sin(i * 0.01) ** 2);
		const a = pstFromHistogram(histogram(base), base.length).pst;
		const b = pstFromHistogram(histogram(base.map((v) => v * 16)), base.length).pst;
		expect(b / a).toBeCloseTo(4, 2);
	});
});

describe('pltFromPst', () => {
	it('equals the common value for 12 equal Pst values', () => {
		expect(pltFromPst(new Array(12).fill(0.8))).toBeCloseTo(0.8, 12);
	});

	it('is the cube root of the mean cube: one Pst of 2 among eleven zeros gives ∛(8/12)', () => {
		expect(pltFromPst([2, ...new Array(11).fill(0)])).toBeCloseTo(Math.cbrt(8 / 12), 12);
	});

	it('returns NaN for no values', () => {
		expect(pltFromPst([])).toBeNaN();
	});
});

describe('pltIntervals', () => {
	const pst = (k: number, value: number): PstInterval => ({
		startS: 600 * k,
		durationS: 600,
		pst: value,
		p01: 0,
		p1s: 0,
		p3s: 0,
		p10s: 0,
		p50s: 0,
	});

	it('makes one Plt per 12 consecutive Pst from the first and drops an incomplete group', () => {
		const values = Array.from({ length: 30 }, (_, k) => pst(k, k < 12 ? 1 : 0.5));
		const plt = pltIntervals(values);
		expect(plt).toHaveLength(2);
		expect(plt[0]).toEqual({ startS: 0, durationS: 7200, plt: 1 });
		expect(plt[1].startS).toBe(7200);
		expect(plt[1].plt).toBeCloseTo(0.5, 12);
	});
});
