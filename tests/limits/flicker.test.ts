import { describe, expect, it } from 'vitest';
import {
	evaluateFlickerLimits,
	FLICKER_LIMIT_TABLES,
	levelNotExceeded,
	ONE_OFF_CAPTURE_NOTE,
} from '../../lib/limits/index.js';

describe('FLICKER_LIMIT_TABLES', () => {
	it('EN 50160: Plt ≤ 1 for 95 % of each week (EN 50160:2010, read in a secondary source)', () => {
		const row = FLICKER_LIMIT_TABLES.en50160.rows.find((r) => r.figure === 'Plt')!;
		expect(row.limit).toBe(1);
		expect(row.statistic).toBe('95 % of values');
		expect(row.source).toMatch(/EN 50160:2010/);
	});

	it('IEC 61000-2-2: compatibility levels Pst 1.0, Plt 0.8 (from memory, marked so)', () => {
		const t = FLICKER_LIMIT_TABLES['iec61000-2-2'];
		expect(t.rows.map((r) => [r.figure, r.limit, r.provenance])).toEqual([
			['Pst', 1, 'from memory'],
			['Plt', 0.8, 'from memory'],
		]);
	});

	it('IEC 61000-3-3: Pst 1.0, Plt 0.65, dc 3.3 %, dmax 4 %, Tmax 0.5 s (from memory), equipment context', () => {
		const t = FLICKER_LIMIT_TABLES['iec61000-3-3'];
		expect(t.context).toBe('equipment');
		expect(Object.fromEntries(t.rows.map((r) => [r.figure, r.limit]))).toEqual({
			Pst: 1,
			Plt: 0.65,
			dc: 3.3,
			dmax: 4,
			Tmax: 0.5,
		});
		for (const r of t.rows) expect(r.provenance).toBe('from memory');
	});
});

describe('levelNotExceeded', () => {
	it('95 % of 1..100 stay at or under 95 (nearest rank)', () => {
		expect(
			levelNotExceeded(
				Array.from({ length: 100 }, (_, i) => i + 1),
				0.95,
			),
		).toBe(95);
	});
	it('of one value is that value; of none is NaN', () => {
		expect(levelNotExceeded([0.7], 0.95)).toBe(0.7);
		expect(levelNotExceeded([], 0.95)).toBeNaN();
	});
});

describe('evaluateFlickerLimits', () => {
	it('EN 50160: a week with Plt 1.2 in 4 of 84 values (under 5 %) passes; in 5 of 84 fails', () => {
		const week = (over: number) => [...new Array(84 - over).fill(0.5), ...new Array(over).fill(1.2)];
		expect(evaluateFlickerLimits('en50160', { plt: week(4) }).pass).toBe(true);
		const e = evaluateFlickerLimits('en50160', { plt: week(5) });
		expect(e.pass).toBe(false);
		expect(e.checks[0].measured).toBe(1.2);
	});

	it('just under and just over the IEC 61000-3-3 dmax of 4 %', () => {
		expect(
			evaluateFlickerLimits('iec61000-3-3', { dmaxPercent: [3.99] }).checks.find((c) => c.figure === 'dmax')!.pass,
		).toBe(true);
		expect(
			evaluateFlickerLimits('iec61000-3-3', { dmaxPercent: [4.01] }).checks.find((c) => c.figure === 'dmax')!.pass,
		).toBe(false);
	});

	it('nothing measured gives pass null, and the one-off caution is always there', () => {
		const e = evaluateFlickerLimits('iec61000-2-2', {});
		expect(e.pass).toBeNull();
		expect(e.complianceNote).toBe(ONE_OFF_CAPTURE_NOTE);
	});

	it('rejects an unknown table id with RangeError', () => {
		expect(() => evaluateFlickerLimits('nope' as 'en50160', {})).toThrow(RangeError);
	});
});
