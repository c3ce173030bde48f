/**
 * The browser worker's one pass (src/ui/worker-core.ts through lib/report's analyseCaptureParts): the trend
 * view it shows comes from the report's own lib/trend pass, and must equal what lib/trend's analyseTrend gives
 * on its own; the report must not change because the view was asked for.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture, analyseCaptureParts, eventsCountedOnce, reportToJson } from '../../lib/report/index.js';
import { analyseTrend } from '../../lib/trend/index.js';
import type { FromWorker } from '../../src/ui/protocol.js';
import { handleMessage } from '../../src/ui/worker-core.js';
import { captureOf } from '../helpers/capture.js';
import { sineSamples } from '../helpers/synth.js';

const FS = 10_000;
const HZ = 50;
const SAMPLES_PER_CYCLE = FS / HZ; // 200
const UN_V = 230;
/** Share of the nominal amplitude left during the dip (a scenario of our own: a motor start at Tallowmere Joinery). */
const DIP_FACTOR = 0.4;
const DIP_FIRST_CYCLE = 50;
const DIP_CYCLES = 10;

/** 3 s of a 230 V, 50 Hz sine whose amplitude is 40 % for 10 whole cycles from 1 s; a current beside it. */
function dipCapture(): Capture {
	const cycles = 150;
	const u = sineSamples({ amplitude: UN_V * Math.SQRT2, frequencyHz: HZ, sampleRateHz: FS, cycles });
	for (let i = DIP_FIRST_CYCLE * SAMPLES_PER_CYCLE; i < (DIP_FIRST_CYCLE + DIP_CYCLES) * SAMPLES_PER_CYCLE; i++)
		u[i] *= DIP_FACTOR;
	const i1 = sineSamples({ amplitude: 20, frequencyHz: HZ, sampleRateHz: FS, cycles, phaseDeg: -30 });
	return captureOf(
		[
			{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u },
			{ name: 'I1', unit: 'A', quantity: 'current', samples: i1 },
		],
		FS,
		'motor-start.csv',
	);
}

/** lib/trend run on its own the way a trend view needs it (Pinst kept, every Urms(1/2) value collected). */
function trendAlone(c: Capture) {
	const t: number[] = [];
	const v: number[] = [];
	const result = analyseTrend(c, {
		nominalHz: HZ,
		flickerPinst: true,
		onHalfCycle: (ch, startS, rmsV) => {
			if (ch !== 0) throw new Error('only U1 is a voltage channel');
			t.push(startS);
			v.push(rmsV);
		},
	});
	return { result: { ...result, events: eventsCountedOnce(result.events) }, t, v };
}

/** The trend view the worker posts for a capture ('seed' then 'analyse', as the page does). */
function workerTrend(c: Capture) {
	const messages: FromWorker[] = [];
	handleMessage({ type: 'seed', captureKey: 'one-pass', capture: c }, () => {});
	handleMessage({ type: 'analyse', jobId: 1, captureKey: 'one-pass', analysis: {} }, (m) => messages.push(m));
	handleMessage({ type: 'forget', captureKey: 'one-pass' }, () => {});
	const done = messages.at(-1);
	if (done?.type !== 'analysed') throw new Error(`worker ended with ${done?.type}`);
	return { trend: done.extras.trend, report: done.report, extras: done.extras };
}

describe('worker trend view from the one analysis pass', () => {
	const c = dipCapture();
	const { trend, report, extras } = workerTrend(c);
	const alone = trendAlone(c);

	it("equals lib/trend's analyseTrend result on the same capture (events, rows, flicker, thresholds)", () => {
		expect(trend?.result).toEqual(alone.result);
		expect(trend?.problem).toBeUndefined();
	});

	it('carries every Urms(1/2) value lib/trend reports, for U1 only (onHalfCycle covers voltage channels)', () => {
		expect(trend?.halfCycle.channels).toEqual(['U1']);
		expect(Array.from(trend!.halfCycle.timeS)).toEqual(alone.t);
		expect(Array.from(trend!.halfCycle.rms[0])).toEqual(alone.v);
	});

	it('shows one dip whose residual voltage is the closed-form 0.4 × 230 V = 92 V, lasting the 10 dipped cycles', () => {
		const dips = trend!.result!.events.filter((e) => e.kind === 'dip');
		expect(dips).toHaveLength(1);
		// a one-cycle RMS wholly inside the dip is DIP_FACTOR × Un (RMS of a sine scales with its amplitude)
		expect(dips[0].residualV).toBeCloseTo(DIP_FACTOR * UN_V, 6);
		// IEC 61000-4-30 Urms(1/2) windows are one cycle refreshed every half cycle: the measured span can
		// differ from the dipped span by up to one cycle (from memory)
		expect(Math.abs(dips[0].durationS - DIP_CYCLES / HZ)).toBeLessThanOrEqual(1 / HZ + 1e-9);
		expect(Math.abs(dips[0].startS - DIP_FIRST_CYCLE / HZ)).toBeLessThanOrEqual(1 / HZ + 1e-9);
		expect(report.events?.events.map((e) => e.kind)).toEqual(['dip']);
		expect(report.events?.events[0].extremeV).toBeCloseTo(DIP_FACTOR * UN_V, 6);
	});

	it('draws the cycle boundaries at the rising zero crossings of a sine starting at 0 (every 200 samples)', () => {
		expect(extras.cycleBoundariesS.length).toBe(report.cyclesAnalysed + 1);
		const first = extras.cycleBoundariesS[0];
		for (const tS of extras.cycleBoundariesS) {
			const cycles = (tS - first) * HZ;
			expect(Math.abs(cycles - Math.round(cycles))).toBeLessThan(1e-6);
		}
		expect(Math.abs(first * HZ - Math.round(first * HZ))).toBeLessThan(1e-6);
	});
});

describe('analyseCaptureParts: asking for the trend view leaves the report as it was', () => {
	it('gives the same JSON report with and without the trend view, for a dip capture', () => {
		const c = dipCapture();
		const plain = reportToJson(analyseCapture(c));
		const parts = analyseCaptureParts(c, {}, { trend: {} });
		expect(reportToJson(parts.report)).toEqual(plain);
	});

	it('gives a trend view but no events for a capture of currents only (the report has none to find)', () => {
		const c = dipCapture();
		const currentOnly = { ...c, channels: [c.channels[1]] };
		const parts = analyseCaptureParts(currentOnly, {}, { trend: {} });
		expect(parts.report.events).toBeNull();
		expect(reportToJson(parts.report)).toEqual(reportToJson(analyseCapture(currentOnly)));
		expect(parts.trend?.result?.events).toEqual(
			analyseTrend(currentOnly, { nominalHz: HZ, flickerPinst: true }).events,
		);
		expect(parts.trend?.halfCycle.channels).toEqual([]);
	});

	it('gives no trend view when no channel is a voltage or current', () => {
		const c = dipCapture();
		const other = { ...c, channels: [{ ...c.channels[0], quantity: 'other' as const, name: 'X', unit: '' }] };
		expect(analyseCaptureParts(other, {}, { trend: {} }).trend).toBeNull();
	});
});
