import { describe, expect, it } from 'vitest';
import { createTrendAnalyser } from '../../lib/trend/index.js';
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
