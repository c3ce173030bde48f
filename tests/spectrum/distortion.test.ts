import { describe, expect, it } from 'vitest';
import {
	factorK,
	percentOfIl,
	tddPercent,
	thdFPercent,
	thdRPercent,
	ulKFactor,
	type HarmonicSet,
} from '../../lib/index.js';

// docs/methods.md §6 worked example (READ, public worked-example page): I_h/I_1 by order
const WORKED = (() => {
	const r = new Float64Array(26);
	const pairs: [number, number][] = [
		[1, 1],
		[5, 0.2],
		[7, 0.14],
		[11, 0.091],
		[13, 0.077],
		[17, 0.058],
		[19, 0.056],
		[23, 0.043],
		[25, 0.04],
	];
	for (const [h, v] of pairs) r[h] = v;
	return r;
})();

function setOf(rms: number[]): HarmonicSet {
	return { fundamentalHz: 50, startS: 0, cycles: 10, orders: rms.map((v, h) => ({ order: h, rms: v, phaseDeg: 0 })) };
}

describe('ulKFactor', () => {
	it('ulKFactor of the docs/methods.md §6 spectrum is 8.3476 (published worked example, read in a secondary source; the shared reference script agrees)', () => {
		expect(ulKFactor(WORKED)).toBeCloseTo(8.3476, 4);
	});
	it('ulKFactor of a pure fundamental is 1 (definition)', () => {
		expect(ulKFactor([0, 5, 0, 0])).toBe(1);
	});
	it('ulKFactor of I1 = 1, I3 = 1 is (1 + 9)/2 = 5 (closed form); DC does not count', () => {
		expect(ulKFactor(setOf([7, 1, 0, 1]))).toBeCloseTo(5, 12);
	});
	it('ulKFactor with no current is NaN', () => {
		expect(ulKFactor([0, 0, 0])).toBeNaN();
	});
});

describe('factorK', () => {
	it('factorK of the §6 spectrum with q = 1.7, e/(1+e) = 0.091 is 1.14672 (sum from n = 2, docs/methods.md §6, computed vector from the shared reference script)', () => {
		const e = 0.091 / (1 - 0.091);
		expect(factorK(WORKED, e, 1.7)).toBeCloseTo(1.14672, 5);
	});
	it('factorK of a pure sine is 1 whatever e (the sum starts at n = 2)', () => {
		expect(factorK([0, 10], 0.5, 1.7)).toBe(1);
	});
	it('factorK of I1 = 1, I3 = 1, e = 1, q = 2 is √(1 + ½·½·9) (closed form)', () => {
		expect(factorK([0, 1, 0, 1], 1, 2)).toBeCloseTo(Math.sqrt(1 + 0.5 * 0.5 * 9), 12);
	});
	it('factorK throws RangeError for negative e or q ≤ 0, and is NaN without a fundamental', () => {
		expect(() => factorK([0, 1], -0.1)).toThrow(RangeError);
		expect(() => factorK([0, 1], 0.1, 0)).toThrow(RangeError);
		expect(factorK([1, 0, 1], 0.1)).toBeNaN();
	});
});

describe('tddPercent and percentOfIl', () => {
	it('tddPercent of 12 A 5th and 9 A 7th on a 100 A demand is 15 % (√(12² + 9²) = 15, closed form)', () => {
		const r = new Array(51).fill(0);
		r[1] = 80;
		r[5] = 12;
		r[7] = 9;
		expect(tddPercent(setOf(r), 100)).toBeCloseTo(15, 12);
	});
	it('tddPercent is NaN when orders up to 50 are missing, and RangeError for I_L ≤ 0', () => {
		expect(tddPercent([0, 1, 0.1], 10)).toBeNaN();
		expect(() => tddPercent(new Array(51).fill(0), 0)).toThrow(RangeError);
	});
	it('percentOfIl gives 100·I_h/I_L per order', () => {
		expect(Array.from(percentOfIl([0, 80, 0, 12], 200))).toEqual([0, 40, 0, 6]);
	});
});

describe('thdFPercent and thdRPercent', () => {
	it('thdFPercent of the docs/methods.md §1.3 spectrum is 6.16441 % (computed vector from the shared reference script)', () => {
		const r = new Array(41).fill(0);
		r[1] = 230;
		r[3] = 4.6;
		r[5] = 11.5;
		r[7] = 6.9;
		expect(thdFPercent(setOf(r))).toBeCloseTo(6.16441, 5);
	});
	it('thdRPercent of a 3rd equal to the fundamental is 100/√2 % while thdF is 100 % (definitions)', () => {
		const r = new Array(51).fill(0);
		r[1] = 1;
		r[3] = 1;
		expect(thdFPercent(r, 50)).toBeCloseTo(100, 12);
		expect(thdRPercent(r, 50)).toBeCloseTo(100 / Math.SQRT2, 12);
	});
	it('THD counts orders 2…H only: a 41st harmonic is in THD50, not THD40', () => {
		const r = new Array(51).fill(0);
		r[1] = 100;
		r[41] = 3;
		expect(thdFPercent(r, 40)).toBe(0);
		expect(thdFPercent(r, 50)).toBeCloseTo(3, 12);
	});
	it('THD is NaN without a fundamental or with too few orders', () => {
		expect(thdFPercent([0, 0, 1], 2)).toBeNaN();
		expect(thdFPercent([0, 1, 1], 40)).toBeNaN();
	});
});
