import { describe, expect, it } from 'vitest';
import { dipRow, durationColumn, en50160EventCell, swellRow } from '../../lib/limits/index.js';
import { DIP_DURATION_EDGES_MS, SWELL_DURATION_EDGES_MS } from '../../lib/limits/index.js';

// Band edges: EN 50160:2010 Table 5 (dips: residual voltage 90/80/70/40/5 %, durations 10 ms, 200 ms,
// 500 ms, 1 s, 5 s, 1 min, upper edges inclusive) and Table 6 (swells: u ≥ 120, 120 > u > 110; 10 ms,
// 500 ms, 5 s, 1 min), as recalled (from memory).
describe('dipRow (EN 50160:2010 Table 5 residual-voltage rows, from memory)', () => {
	it('puts each edge in the band it closes from below: 80 → 90 > u ≥ 80, 40 → 70 > u ≥ 40, 5 → 40 > u ≥ 5', () => {
		expect(dipRow(80)).toBe(0);
		expect(dipRow(79.99)).toBe(1);
		expect(dipRow(70)).toBe(1);
		expect(dipRow(40)).toBe(2);
		expect(dipRow(5)).toBe(3);
	});
	it('gives the interruption row below 5 % and no row at 90 % or above (not a dip) or for NaN', () => {
		expect(dipRow(4.9)).toBe(4);
		expect(dipRow(0)).toBe(4);
		expect(dipRow(90)).toBe(-1);
		expect(dipRow(Number.NaN)).toBe(-1);
	});
});

describe('swellRow (EN 50160:2010 Table 6 rows, from memory)', () => {
	it('u ≥ 120 is row 0, 120 > u > 110 row 1, 110 itself in no row', () => {
		expect(swellRow(120)).toBe(0);
		expect(swellRow(119.9)).toBe(1);
		expect(swellRow(110.01)).toBe(1);
		expect(swellRow(110)).toBe(-1);
	});
});

describe('durationColumn (upper edges inclusive, EN 50160:2010 Tables 5 and 6, from memory)', () => {
	it('200 ms is the first dip column, 201 ms the second; 1 min the last; past 1 min none', () => {
		expect(durationColumn(0.2, DIP_DURATION_EDGES_MS)).toBe(0);
		expect(durationColumn(0.201, DIP_DURATION_EDGES_MS)).toBe(1);
		expect(durationColumn(60, DIP_DURATION_EDGES_MS)).toBe(4);
		expect(durationColumn(60.01, DIP_DURATION_EDGES_MS)).toBe(-1);
		expect(durationColumn(0.5, SWELL_DURATION_EDGES_MS)).toBe(0);
		expect(durationColumn(5, SWELL_DURATION_EDGES_MS)).toBe(1);
	});
	it('under the 10 ms first edge: outside, unless the reader counts it in the first column (a 60 Hz half cycle, 8.3 ms)', () => {
		expect(durationColumn(1 / 120, DIP_DURATION_EDGES_MS)).toBe(-1);
		expect(durationColumn(1 / 120, DIP_DURATION_EDGES_MS, true)).toBe(0);
	});
});

describe('en50160EventCell', () => {
	it('a dip to 55 % for 120 ms is in row 70 > u ≥ 40, column 10-200 ms of Table 5', () => {
		expect(en50160EventCell({ kind: 'dip', percentOfDeclared: 55, durationS: 0.12 })).toEqual({
			table: 'dip',
			row: 2,
			column: 0,
		});
	});
	it('an interruption (u < 5 %) is in the last Table 5 row only when the reader keeps that row', () => {
		const e = { kind: 'interruption' as const, percentOfDeclared: 1, durationS: 2 };
		expect(en50160EventCell(e)).toBeNull();
		expect(en50160EventCell(e, { interruptionRow: true })).toEqual({ table: 'dip', row: 4, column: 3 });
		expect(en50160EventCell({ ...e, kind: 'dip' })).toBeNull();
	});
	it('a swell to 125 % for 3 s is in row u ≥ 120, column 0.5-5 s of Table 6', () => {
		expect(en50160EventCell({ kind: 'swell', percentOfDeclared: 125, durationS: 3 })).toEqual({
			table: 'swell',
			row: 0,
			column: 1,
		});
	});
});
