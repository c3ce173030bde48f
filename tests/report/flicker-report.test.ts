/**
 * The report's flicker section on closed-form captures: the IEC 61000-4-15 reference modulation
 * (8.8 Hz, ΔV/V = 0.25 %, max Pinst = 1, Ed.2 Table 1, from memory), a rectangular Table 2 point
 * (7 changes/min at 1.459 % gives Pst = 1, from memory) and a voltage step whose dc follows by arithmetic.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { CSV_SUMMARY_COLUMNS, reportsToCsv } from '../../lib/report/csv-summary.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { flickerCapture, type Modulation } from '../helpers/flicker-signals.js';

function capture(fs: number, durationS: number, modulation: Modulation, rmsV = 230): Capture {
	return flickerCapture(fs, durationS, modulation, { rmsV });
}

describe('analyseCapture: flicker', () => {
	it('a 30 s record gives Pinst statistics (max ≈ 1 for the 8.8 Hz, 0.25 % reference), no Pst, and says why', () => {
		const r = analyseCapture(capture(3200, 30, { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 }));
		const f = r.flicker!.channels[0];
		expect(f.hasPst).toBe(false);
		expect(f.pst).toEqual([]);
		expect(Math.abs(f.pinst.max - 1)).toBeLessThan(0.05);
		expect(r.flicker!.notes.join(' ')).toMatch(/not a Pst/);
	});

	it('the CSV summary of a 30 s record: pinstMax ≈ 1 (8.8 Hz, 0.25 % reference), pstMax empty (no Pst under 10 minutes)', () => {
		const csv = reportsToCsv([
			reportToJson(analyseCapture(capture(3200, 30, { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 }))),
		]);
		const [, row] = csv.trim().split('\r\n');
		const cells = row.split(',');
		expect(cells[CSV_SUMMARY_COLUMNS.indexOf('pstMax')]).toBe('');
		expect(Math.abs(Number(cells[CSV_SUMMARY_COLUMNS.indexOf('pinstMax')]) - 1)).toBeLessThan(0.05);
	});

	it('a 10-minute record of 7 changes/min at 1.459 % gives one Pst = 1.00 ± 5 % (Ed.2 Table 2, from memory)', () => {
		const r = analyseCapture(capture(1600, 601, { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01459 }));
		const f = r.flicker!.channels[0];
		expect(f.hasPst).toBe(true);
		expect(f.pst).toHaveLength(1);
		expect(Math.abs(f.pst[0].pst - 1)).toBeLessThan(0.05);
	});

	it('a 230 V -> 220 V step gives one change with dc = 10/230 = 4.35 %, over the IEC 61000-3-3 dc limit of 3.3 % (from memory)', () => {
		const fs = 3200;
		const x = new Float64Array(fs * 6);
		for (let i = 0; i < x.length; i++)
			x[i] = (i < 3 * fs ? 230 : 220) * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * i) / fs);
		const c: Capture = {
			source: 'step.csv',
			sampleRateHz: fs,
			startS: 0,
			channels: [{ name: 'L1', unit: 'V', quantity: 'voltage', samples: x }],
			metadata: {},
			diagnostics: [],
		};
		const r = analyseCapture(c, { limits: 'en50160', nominalV: 230 });
		const f = r.flicker!.channels[0];
		expect(f.changes.count).toBe(1);
		expect(f.changes.dcMaxPercent).toBeCloseTo((100 * 10) / 230, 2);
		const eq = f.limits.find((l) => l.tableId === 'iec61000-3-3')!;
		expect(eq.checks.find((k) => k.figure === 'dc')!.pass).toBe(false);
		expect(f.limits.find((l) => l.tableId === 'en50160')!.pass).toBeNull(); // no Plt in 6 s
	});

	it('a record below 1600 S/s gets a note instead of flicker figures', () => {
		const r = analyseCapture(capture(1600, 2, { shape: 'none' }), {});
		expect(r.flicker!.channels).toHaveLength(1);
		const low: Capture = { ...capture(1600, 2, { shape: 'none' }), sampleRateHz: 1000 };
		expect(analyseCapture(low).flicker!.notes.join(' ')).toMatch(/1600 samples per second/);
	});
});
