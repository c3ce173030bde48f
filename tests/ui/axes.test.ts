/**
 * Trend-axis helpers: percentile (Hyndman & Fan type 7, numpy.percentile's default: the numpy docs'
 * example percentile([[10, 7, 4], [3, 2, 1]], 50) = 3.5), a robust range that one spike or flagged interval
 * cannot stretch, round ticks, and label lanes that never overlap.
 */
import { describe, expect, it } from 'vitest';
import { labelLanes, niceTicks, percentile, robustRange } from '../../src/ui/charts/axes.js';

describe('percentile', () => {
	it('percentile([10, 7, 4, 3, 2, 1], 50) is 3.5 and the 0th/100th are the extremes (numpy.percentile docs example)', () => {
		expect(percentile([10, 7, 4, 3, 2, 1], 50)).toBe(3.5);
		expect(percentile([10, 7, 4, 3, 2, 1], 0)).toBe(1);
		expect(percentile([10, 7, 4, 3, 2, 1], 100)).toBe(10);
	});
	it('interpolates linearly between closest ranks: 25th of 1..5 is 2, of [1, 2, 3, 4] is 1.75 (type 7, closed form)', () => {
		expect(percentile([5, 4, 3, 2, 1], 25)).toBe(2);
		expect(percentile([1, 2, 3, 4], 25)).toBeCloseTo(1.75, 12);
	});
	it('ignores NaN and is NaN with no number', () => {
		expect(percentile([NaN, 2, NaN], 50)).toBe(2);
		expect(percentile([NaN], 50)).toBeNaN();
	});
});

describe('robustRange', () => {
	const thd = Array.from({ length: 200 }, (_, i) => 3 + 0.5 * Math.sin(i / 7));
	it('a THD trend of 2.5-3.5 % with one flagged interval at 1501 % and one at -29 % keeps its axis within 2-4 %', () => {
		const values = [...thd, 1501, -29];
		const flagged = [...thd.map(() => false), true, true];
		const r = robustRange(values, flagged);
		expect(r.min).toBeGreaterThan(2);
		expect(r.max).toBeLessThan(4);
		expect(r.min).toBeLessThan(2.6);
		expect(r.max).toBeGreaterThan(3.4);
	});
	it('one unflagged spike among 200 values does not stretch the axis (1st to 99th percentile)', () => {
		const r = robustRange([...thd, 1501]);
		expect(r.max).toBeLessThan(4);
	});
});

describe('niceTicks', () => {
	it('0..10 in about 5 steps: 0, 2, 4, 6, 8, 10', () => expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]));
	it('0..0.6 s: steps of 0.1 within the range', () => {
		const t = niceTicks(0, 0.6, 6);
		expect(t.length).toBe(7);
		t.forEach((v, i) => expect(v).toBeCloseTo(i / 10, 12));
	});
});

describe('labelLanes', () => {
	it('"interruption" and "dip U" starting at the same place go to different lanes; a distant label shares lane 0', () => {
		const lanes = labelLanes([100, 100, 400], [70, 40, 40]);
		expect(lanes[0]).not.toBe(lanes[1]);
		expect(lanes[2]).toBe(0);
	});
	it('no two labels in one lane overlap (random placements)', () => {
		const x = Array.from({ length: 60 }, (_, i) => (i * 37) % 500);
		const w = x.map((_, i) => 20 + ((i * 13) % 50));
		const lanes = labelLanes(x, w, 4);
		for (let i = 0; i < x.length; i++)
			for (let j = i + 1; j < x.length; j++)
				if (lanes[i] === lanes[j]) expect(x[i] + w[i] + 4 <= x[j] || x[j] + w[j] + 4 <= x[i], `${i} ${j}`).toBe(true);
	});
});
