/**
 * One flickermeter pass serves both the report's flicker section and the trend view's flicker
 * (analyseCaptureParts with the view asked for, as the browser worker asks): the meters created are one
 * per voltage channel, and what both show equals a flickermeter run alone on the same samples, the
 * IEC 61000-4-15 test points (from memory) and lib/trend's own flicker beside the trend (analyseTrend).
 */
import { describe, expect, it, vi } from 'vitest';
import * as flicker from '../../lib/flicker/index.js';
import { analyseCapture, analyseCaptureParts, eventsCountedOnce, reportToJson } from '../../lib/report/index.js';
import { analyseTrend } from '../../lib/trend/index.js';
import type { Capture } from '../../lib/capture.js';
import { captureOf } from '../helpers/capture.js';
import { flickerCapture } from '../helpers/flicker-signals.js';
import { sineSamples } from '../helpers/synth.js';

vi.mock('../../lib/flicker/index.js', async (importOriginal) => {
	const original = await importOriginal<typeof import('../../lib/flicker/index.js')>();
	return { ...original, createFlickermeter: vi.fn(original.createFlickermeter) };
});
const created = vi.mocked(flicker.createFlickermeter);

/** Pst of the rectangular test point: 7 changes/min at ΔV/V = 1.459 % (IEC 61000-4-15:2010 Table 2, from memory). */
const TABLE2 = { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01459 } as const;
/** Highest Pinst of the sinusoidal reference: 8.8 Hz at ΔV/V = 0.25 % gives Pinst = 1 (Table 1, from memory). */
const TABLE1 = { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 } as const;
/** The IEC 61000-4-15 accuracy band of those test points, ±5 % (from memory). */
const TOLERANCE = 0.05;

/** The flickermeter alone on every sample of the capture's one voltage channel, in one push. */
function meterAlone(c: Capture) {
	const m = flicker.createFlickermeter({ sampleRateHz: c.sampleRateHz, nominalHz: 50, keepPinstBlocks: true });
	m.push(c.channels[0].samples);
	return m.finish();
}

/** lib/trend alone as the trend view runs it (Pinst per second kept), its events counted once. */
function trendAlone(c: Capture, nominalHz: 50 | 60 = 50) {
	const r = analyseTrend(c, { nominalHz, flickerPinst: true });
	return { ...r, events: eventsCountedOnce(r.events) };
}

describe('analyseCaptureParts with the trend view: one flickermeter pass for the report and the view', () => {
	it('10 min of the Table 2 point with a dip in the settling time: one meter, Pst = 1 ± 5 %, the same Pst in both, the row flagged', () => {
		const fs = 1600;
		const c = flickerCapture(fs, 601, TABLE2);
		// a 100 ms dip to 40 % at 2 s: inside the flickermeter's 5 s settling time (not classified), but an
		// event lib/trend flags the 10-minute interval for (IEC 61000-4-30 flagging, from memory)
		const x = c.channels[0].samples;
		for (let i = 2 * fs; i < 2.1 * fs; i++) x[i] *= 0.4;
		created.mockClear();
		const parts = analyseCaptureParts(c, {}, { trend: {} });
		expect(created).toHaveBeenCalledTimes(1);

		const pst = parts.report.flicker!.channels[0].pst;
		expect(pst).toHaveLength(1);
		expect(Math.abs(pst[0].pst - 1)).toBeLessThan(TOLERANCE);
		const alone = meterAlone(c);
		expect(pst[0].pst).toBe(alone.pst[0].pst);
		const view = parts.trend!.result!.flicker!;
		expect(view.pst.map((row) => row.values[0])).toEqual([alone.pst[0].pst]);
		expect(view.pst[0].flagged).toBe(true);
		expect(view.pinst?.max[0]).toEqual(alone.pinstBlocks!.max);
		expect(view.pinstMax).toEqual([alone.pinst.max]);
		// figure for figure what lib/trend's own flickermeter beside the trend gives
		expect(parts.trend!.result).toEqual(trendAlone(c));
	});

	it("12 s of the Table 1 reference: one meter, highest Pinst = 1 ± 5 % in both, changes relative to each one's voltage", () => {
		const c = flickerCapture(3200, 12, TABLE1);
		created.mockClear();
		// the report's changes relative to the given 240 V, the view's to lib/trend's declared 230 V
		const parts = analyseCaptureParts(c, { nominalV: 240 }, { trend: {} });
		expect(created).toHaveBeenCalledTimes(1);
		const f = parts.report.flicker!.channels[0];
		expect(f.nominalV).toBe(240);
		expect(Math.abs(f.pinst.max - 1)).toBeLessThan(TOLERANCE);
		const alone = meterAlone(c);
		expect(f.pinst).toEqual(alone.pinst);
		const view = parts.trend!.result!;
		expect(view.declaredV).toBe(230);
		expect(view.flicker!.pinstMax).toEqual([alone.pinst.max]);
		expect(view).toEqual(trendAlone(c));
		// and the report is the one analyseCapture gives without the view
		expect(reportToJson(parts.report)).toEqual(reportToJson(analyseCapture(c, { nominalV: 240 })));
	});

	it('three 120 V, 60 Hz phases with a missing sample: one meter each, the view as lib/trend gives it (its warning last)', () => {
		const fs = 3840;
		const cycles = 60 * 8;
		const phase = (deg: number) =>
			sineSamples({ amplitude: 120 * Math.SQRT2, frequencyHz: 60, sampleRateHz: fs, cycles, phaseDeg: deg });
		const u = [phase(0), phase(-120), phase(120)];
		u[1][3 * fs] = NaN;
		const c = captureOf(
			u.map((samples, k) => ({ name: `L${k + 1}`, unit: 'V', quantity: 'voltage' as const, samples })),
			fs,
			'sixty-hertz.csv',
		);
		created.mockClear();
		const view = analyseCaptureParts(c, {}, { trend: {} }).trend!.result!;
		expect(created).toHaveBeenCalledTimes(3);
		// 60 Hz takes the 120 V lamp model (IEC 61000-4-15, from memory); an unmodulated sine has a constant
		// envelope, so no flicker (closed form) in the phases without the gap
		expect(view.flicker!.lamp).toBe('120V');
		expect(view.flicker!.pinstMax[0]).toBeLessThan(0.01);
		expect(view.flicker!.pinstMax[2]).toBeLessThan(0.01);
		expect(view.flicker!.channels).toEqual(['L1', 'L2', 'L3']);
		expect(view.diagnostics.at(-1)?.code).toBe('flicker-non-finite');
		expect(view).toEqual(trendAlone(c, 60));
	});

	it('without the view the report still runs one meter per voltage channel', () => {
		created.mockClear();
		analyseCapture(flickerCapture(3200, 6, TABLE1));
		expect(created).toHaveBeenCalledTimes(1);
	});
});
