import { describe, expect, it } from 'vitest';
import { finiteRange, percentileNearestRank, shareWithinPercent } from '../../lib/survey/statistics.js';

describe('percentileNearestRank', () => {
	// The nearest-rank worked example {15, 20, 35, 40, 50} (textbook definition, from memory): the 30th and
	// 40th percentiles are 20, the 50th is 35, the 100th is 50.
	it('percentileNearestRank(values, p) follows the textbook nearest-rank example', () => {
		const v = [50, 15, 40, 20, 35];
		expect(percentileNearestRank(v, 30)).toBe(20);
		expect(percentileNearestRank(v, 40)).toBe(20);
		expect(percentileNearestRank(v, 50)).toBe(35);
		expect(percentileNearestRank(v, 100)).toBe(50);
	});

	it('percentileNearestRank of 1..20 at 95 % is 19: rank ceil(0.95 * 20) = 19 (hand computation)', () => {
		expect(
			percentileNearestRank(
				Array.from({ length: 20 }, (_, i) => i + 1),
				95,
			),
		).toBe(19);
	});

	it('percentileNearestRank skips NaN and gives NaN when nothing is finite', () => {
		expect(percentileNearestRank([NaN, 3, NaN, 1], 100)).toBe(3);
		expect(percentileNearestRank([NaN], 95)).toBeNaN();
		expect(() => percentileNearestRank([1], 0)).toThrow(RangeError);
	});
});

describe('shareWithinPercent and finiteRange', () => {
	it('shareWithinPercent counts both band edges as inside (hand computation: 3 of 4)', () => {
		expect(shareWithinPercent([207, 253, 230, 253.1], 207, 253)).toBe(75);
		expect(shareWithinPercent([NaN], 0, 1)).toBeNaN();
	});

	it('finiteRange of a long array does not spread it into arguments (1e6 values)', () => {
		const a = new Float64Array(1_000_000).map((_, i) => i % 1000);
		a[5] = -3;
		expect(finiteRange(a)).toEqual({ min: -3, max: 999 });
	});
});
