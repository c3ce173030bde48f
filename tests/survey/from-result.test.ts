import { describe, expect, it } from 'vitest';
import { createTrendAnalyser, TREND_DEFAULT_THRESHOLDS } from '../../lib/trend/index.js';
import type { TrendResult, TrendRow } from '../../lib/trend/types.js';
import { assessSurvey, surveyInputFromTrend, trendDocumentOf } from '../../lib/survey/index.js';
import {
	SURVEY_DIP,
	SURVEY_FILES,
	SURVEY_RATE_HZ,
	SURVEY_RMS_V,
	SURVEY_START_ISO,
	SURVEY_UNBALANCE_PERCENT,
	surveyFileSamples,
	surveyFileStart,
} from '../helpers/survey-recording.js';

const CHANNELS = ['L1', 'L2', 'L3'].map((name) => ({ name, quantity: 'voltage' as const, unit: 'V' }));

/** Each file through its own trend analyser (as the browser does), then the document the merge reads. */
function documents() {
	return Array.from({ length: SURVEY_FILES }, (_, k) => {
		const a = createTrendAnalyser({
			sampleRateHz: SURVEY_RATE_HZ,
			channels: CHANNELS,
			declaredV: 230,
			nominalHz: 50,
			clockStartS: Date.parse(surveyFileStart(k)) / 1000,
			harmonics: true,
			keep: { cycles10: false, cycles150: false },
		});
		a.push(surveyFileSamples(k));
		return trendDocumentOf(`part-${k + 1}.csv`, a.finish());
	});
}

describe('trendDocumentOf', () => {
	const docs = documents();

	it('keeps what the merge reads: clock start, 10-minute rows only, no rapid voltage changes', () => {
		expect(docs[1].clockStartS).toBe(Date.parse(SURVEY_START_ISO) / 1000 + 240);
		expect(docs.every((d) => d.aggregates.every((r) => r.interval === '10-min'))).toBe(true);
		expect(docs[0].channels.map((c) => c.name)).toEqual(['L1', 'L2', 'L3']);
	});

	it('three 4-minute files merge to one complete 08:00-08:10 interval at the closed-form RMS and unbalance', () => {
		const { input } = surveyInputFromTrend([docs[2], docs[0], docs[1]]); // any order: placed by clock
		const complete = input.intervals.filter((i) => i.complete);
		expect(complete).toHaveLength(1);
		// the first window starts at the first zero crossing, within one cycle of the tick
		expect(Math.abs(complete[0].startS - Date.parse(SURVEY_START_ISO) / 1000)).toBeLessThan(0.021);
		// RMS of a sine = peak/√2 (closed form); the file edges lose a few cycles, so 0.05 % tolerance
		complete[0].rmsV.forEach((v, c) => expect(Math.abs(v / SURVEY_RMS_V[c] - 1)).toBeLessThan(5e-4));
		// one phase 10 V low at balanced angles: |U2|/|U1| = 10/680 (symmetrical components, closed form)
		expect(complete[0].unbalancePercent!).toBeCloseTo(SURVEY_UNBALANCE_PERCENT, 2);
	});

	it('the 300 ms dip of L1 to 60 % lands in the 70-40 % x 200-500 ms cell of EN 50160:2010 Table 5, counted once', () => {
		const r = assessSurvey(surveyInputFromTrend(docs).input, 'en50160');
		expect(r.dips.counts[2][1]).toBe(1);
		expect(r.dips.counts.flat().reduce((a, b) => a + b, 0)).toBe(1);
		const dip = surveyInputFromTrend(docs).input.events.find((e) => e.kind === 'dip')!;
		// one-cycle Urms(1/2) windows: depth within 1 % of Udin, duration within one cycle (IEC 61000-4-30 class A, from memory)
		expect(Math.abs(dip.percentOfDeclared - 100 * SURVEY_DIP.factor)).toBeLessThan(1);
		expect(Math.abs(dip.durationS - SURVEY_DIP.durationS)).toBeLessThanOrEqual(0.021);
	});
});

describe('trendDocumentOf with flicker', () => {
	/** A hand-made result: L1, I1, L2; two 10-minute rows (the second partial) and flicker on L1 and L2. */
	function result(): TrendResult {
		const row = (startS: number, durationS: number, complete: boolean): TrendRow => ({
			interval: '10-min',
			startS,
			durationS,
			cycles: 0,
			frequencyHz: 50,
			complete,
			flagged: false,
			rms: [230, 10, 231],
			thdPercent: [2, NaN, 3],
		});
		return {
			sampleRateHz: 6400,
			nominalHz: 50,
			declaredV: 230,
			declaredVSource: 'given',
			thresholds: TREND_DEFAULT_THRESHOLDS,
			channels: [
				{ name: 'L1', quantity: 'voltage', unit: 'V' },
				{ name: 'I1', quantity: 'current', unit: 'A' },
				{ name: 'L2', quantity: 'voltage', unit: 'V' },
			],
			referenceChannel: 'L1',
			durationS: 900,
			cycles10: [],
			cycles150: [],
			min10: [row(0, 600, true), row(600, 300, false)],
			frequency: [],
			events: [
				{ kind: 'rvc', channels: ['L1'], startS: 5, durationS: 0.2, percentOfDeclared: 4, ended: true },
				{ kind: 'dip', channels: ['L2'], startS: 700, durationS: 0.1, percentOfDeclared: 70, ended: true },
			],
			diagnostics: [],
			flicker: {
				channels: ['L1', 'L2'],
				lamp: '230V',
				pst: [{ startS: 0, durationS: 600, values: [0.4, 0.6], flagged: false }],
				plt: [{ startS: 0, durationS: 7200, values: [0.5, NaN], flagged: true }],
				pinstMax: [1, 1],
			},
		};
	}

	it('puts each Pst on its complete 10-minute row and each Plt in channel order, null for the current and for NaN', () => {
		const d = trendDocumentOf('board.cfg', result());
		expect(d.aggregates[0].pst).toEqual([0.4, null, 0.6]);
		expect(d.aggregates[1].pst).toBeUndefined();
		expect(d.aggregates[0].thdPercent).toEqual([2, null, 3]);
		expect(d.plt).toEqual([{ startS: 0, plt: [0.5, null, null], flagged: true }]);
		expect(d.events.map((e) => e.kind)).toEqual(['dip']);
		expect(d.startTime).toBeNull();
	});

	it('the merge reads them back per voltage channel: Pst on the interval, Plt for the flicker rule (EN 50160:2010, 4.2.3.2)', () => {
		const { input } = surveyInputFromTrend([trendDocumentOf('board.cfg', result())]);
		expect(input.channels).toEqual(['L1', 'L2']);
		expect(input.intervals[0].pst).toEqual([0.4, 0.6]);
		expect(input.plt?.[0].plt[0]).toBe(0.5);
		const plt = assessSurvey(input, 'en50160').lines.filter((l) => l.id === 'flicker-plt');
		// the one Plt is flagged by the dip: left out and counted, so the rule is not measured
		expect(plt.map((l) => [l.verdict, l.excludedFlagged])).toEqual([
			['not measured', 1],
			['not measured', 1],
		]);
	});
});
