/**
 * Flicker beside the trend: Pst per 10 minutes per voltage channel with IEC 61000-4-30 flags (an interval
 * that a dip overlaps is flagged; from memory). Expected Pst: IEC 61000-4-15 Ed.2 Table 2, 7 changes/min
 * at ΔV/V = 1.459 % gives Pst = 1.00, class F1 ± 5 % (from memory).
 */
import { describe, expect, it } from 'vitest';
import { createTrendAnalyser } from '../../lib/trend/index.js';
import { forEachChunk } from '../helpers/flicker-signals.js';

const FS = 1600;
const V1 = [{ name: 'L1', quantity: 'voltage' as const, unit: 'V' }];

describe('createTrendAnalyser: flicker', () => {
	it('20 minutes of 7 changes/min at 1.459 %: two Pst of 1.00 ± 5 %, the second flagged by a 100 ms dip to 70 % at 900 s', () => {
		const a = createTrendAnalyser({ sampleRateHz: FS, channels: V1, declaredV: 230, nominalHz: 50, thd: false });
		let n = 0;
		forEachChunk(
			{
				sampleRateHz: FS,
				mainsHz: 50,
				rmsV: 230,
				durationS: 1201,
				modulation: { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01459 },
				chunk: 50_000,
			},
			(c) => {
				for (let i = 0; i < c.length; i++) {
					const t = (n + i) / FS;
					if (t >= 900 && t < 900.1) c[i] *= 0.7;
				}
				n += c.length;
				a.push([c]);
			},
		);
		const r = a.finish();
		expect(r.events.some((e) => e.kind === 'dip')).toBe(true);
		const f = r.flicker!;
		expect(f.channels).toEqual(['L1']);
		expect(f.pst).toHaveLength(2);
		expect(Math.abs(f.pst[0].values[0] - 1)).toBeLessThan(0.05);
		expect(f.pst[0].flagged).toBe(false);
		expect(f.pst[1].flagged).toBe(true);
		expect(f.pst[1].startS).toBe(600);
		expect(f.plt).toEqual([]);
	});

	it('nominal frequency inferred from the first cycles: flicker still measured (chunks wait until it is known)', () => {
		const a = createTrendAnalyser({ sampleRateHz: FS, channels: V1, declaredV: 230, thd: false });
		forEachChunk(
			{
				sampleRateHz: FS,
				mainsHz: 50,
				rmsV: 230,
				durationS: 30,
				modulation: { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 },
				chunk: 1000,
			},
			(c) => a.push([c]),
		);
		const f = a.finish().flicker!;
		// the 8.8 Hz, 0.25 % reference gives a maximum Pinst of 1.00 (Ed.2 Table 1, from memory)
		expect(Math.abs(f.pinstMax[0] - 1)).toBeLessThan(0.05);
	});

	it('below 1600 S/s flicker is not measured and a diagnostic says why', () => {
		const a = createTrendAnalyser({ sampleRateHz: 1000, channels: V1, declaredV: 230, nominalHz: 50, thd: false });
		a.push([new Float64Array(1000).map((_, i) => 325 * Math.sin((2 * Math.PI * 50 * i) / 1000))]);
		const r = a.finish();
		expect(r.flicker).toBeUndefined();
		expect(r.diagnostics.some((d) => d.code === 'flicker-not-measured')).toBe(true);
	});

	it('flicker: false leaves it out', () => {
		const a = createTrendAnalyser({
			sampleRateHz: FS,
			channels: V1,
			declaredV: 230,
			nominalHz: 50,
			thd: false,
			flicker: false,
		});
		a.push([new Float64Array(FS)]);
		expect(a.finish().flicker).toBeUndefined();
	});
});

describe('createTrendAnalyser: voltage changes (IEC 61000-3-3)', () => {
	it('a 230 V -> 222 V step at 3 s: one change with dc = 8/230 = 3.48 % of the declared voltage (arithmetic)', () => {
		const a = createTrendAnalyser({ sampleRateHz: FS, channels: V1, declaredV: 230, nominalHz: 50, thd: false });
		const x = new Float64Array(FS * 6).map(
			(_, i) => (i < 3 * FS ? 230 : 222) * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * i) / FS),
		);
		for (let off = 0; off < x.length; off += 777) a.push([x.subarray(off, Math.min(x.length, off + 777))]);
		const ch = a.finish().flicker!.changes!;
		expect(ch[0].count).toBe(1);
		expect(ch[0].dcMaxPercent).toBeCloseTo((100 * 8) / 230, 2);
	});

	it('with the declared voltage inferred from the first second, the change is still found', () => {
		const a = createTrendAnalyser({ sampleRateHz: FS, channels: V1, nominalHz: 50, thd: false });
		const x = new Float64Array(FS * 6).map(
			(_, i) => (i < 3 * FS ? 230 : 222) * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * i) / FS),
		);
		for (let off = 0; off < x.length; off += 500) a.push([x.subarray(off, Math.min(x.length, off + 500))]);
		const r = a.finish();
		expect(r.declaredV).toBe(230);
		expect(r.flicker!.changes![0].count).toBe(1);
	});
});
