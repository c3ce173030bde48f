import { describe, expect, it } from 'vitest';
import { assessSurvey } from '../../lib/survey/assess.js';
import { SurveyMergeError, surveyInputFromTrend, type TrendDocument } from '../../lib/survey/from-trend.js';

const CHANNELS = [
	{ name: 'L1', quantity: 'voltage', unit: 'V' },
	{ name: 'I1', quantity: 'current', unit: 'A' },
];

/** A `trend` document of `rows` ten-minute values starting at `firstS` (s from the file start), clock start `startTime`. */
function doc(
	source: string,
	startTime: string | null,
	durationS: number,
	rows: { startS: number; durationS: number; v: number; complete: boolean }[],
	events: TrendDocument['events'] = [],
): TrendDocument {
	return {
		source,
		startTime,
		declaredV: 230,
		nominalHz: 50,
		durationS,
		channels: CHANNELS,
		aggregates: rows.map((r) => ({
			interval: '10-min',
			startS: r.startS,
			durationS: r.durationS,
			complete: r.complete,
			flagged: false,
			rms: [r.v, 5],
			thdPercent: [2, 30],
		})),
		frequency: [{ startS: 0, durationS: 10, frequencyHz: 50, complete: true, flagged: false }],
		events,
	};
}

describe('surveyInputFromTrend', () => {
	it('inside one document (files read as one recording) the two parts of an interval on either side of a gap stay apart, and the gap is reported', () => {
		// 09:00:00-09:04:00 at 230 V, a 0.5 s gap, 09:04:00.5-09:10:00 at 240 V: two partial intervals, not one.
		const one: TrendDocument = {
			...doc('week/', '2026-05-04T09:00:00Z', 600, [
				{ startS: 0, durationS: 240, v: 230, complete: false },
				{ startS: 240.5, durationS: 359.5, v: 240, complete: false },
			]),
			gaps: [{ startS: 240, durationS: 0.5, after: 'week/a.cfg', before: 'week/b.cfg' }],
		};
		const { input, diagnostics } = surveyInputFromTrend([one]);
		expect(input.intervals.map((i) => [i.durationS, i.rmsV[0], i.complete])).toEqual([
			[240, 230, false],
			[359.5, 240, false],
		]);
		expect(diagnostics.map((d) => d.code)).toEqual(['survey-gap']);
		expect(diagnostics[0].message).toContain('0.5 s between week/a.cfg and week/b.cfg');
	});

	it('joins the two parts of a 10-minute interval cut by a file boundary: RMS of the parts weighted by duration', () => {
		// 08:00-09:05 then 09:05-10:00: the 09:00-09:10 interval is 300 s at 230 V + 300 s at 240 V.
		// Hand computation: sqrt((300 x 230^2 + 300 x 240^2) / 600) = sqrt(55250) = 235.0532 V.
		const a = doc('a.cfg', '2026-05-04T08:00:00Z', 3900, [
			...Array.from({ length: 6 }, (_, k) => ({ startS: 600 * k, durationS: 600, v: 230, complete: true })),
			{ startS: 3600, durationS: 300, v: 230, complete: false },
		]);
		const b = doc('b.cfg', '2026-05-04T09:05:00Z', 3300, [
			{ startS: 0, durationS: 300, v: 240, complete: false },
			...Array.from({ length: 5 }, (_, k) => ({ startS: 300 + 600 * k, durationS: 600, v: 231, complete: true })),
		]);
		const { input, diagnostics } = surveyInputFromTrend([b, a]); // given out of order: sorted by start time
		expect(diagnostics).toEqual([]);
		expect(input.clockAligned).toBe(true);
		expect(input.channels).toEqual(['L1']);
		expect(input.intervals).toHaveLength(12);
		const joined = input.intervals[6];
		expect(joined.startS).toBe(Date.parse('2026-05-04T09:00:00Z') / 1000);
		expect(joined.complete).toBe(true);
		expect(joined.rmsV[0]).toBeCloseTo(Math.sqrt(55250), 9);
		expect(input.spanEndS - input.spanStartS).toBe(7200);
	});

	it('an event cut by a file boundary is one event with the summed duration and the lower residual', () => {
		const a = doc(
			'a.cfg',
			'2026-05-04T08:00:00Z',
			600,
			[],
			[{ kind: 'dip', startS: 590, durationS: 10, percentOfDeclared: 60, channels: ['L1'], ended: false }],
		);
		const b = doc(
			'b.cfg',
			'2026-05-04T08:10:00Z',
			600,
			[],
			[{ kind: 'dip', startS: 0, durationS: 2.5, percentOfDeclared: 55, channels: ['L1'], ended: true }],
		);
		const { input } = surveyInputFromTrend([a, b]);
		expect(input.events).toHaveLength(1);
		expect(input.events[0]).toMatchObject({ kind: 'dip', durationS: 12.5, percentOfDeclared: 55 });
	});

	it('a gap between files is reported and left uncovered, so no interval spans it', () => {
		const a = doc('a.cfg', '2026-05-04T08:00:00Z', 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		const b = doc('b.cfg', '2026-05-04T09:00:00Z', 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		const { input, diagnostics } = surveyInputFromTrend([a, b]);
		expect(diagnostics.map((d) => d.code)).toEqual(['survey-gap']);
		expect(diagnostics[0].message).toContain('3000.0 s');
		const r = assessSurvey(input, 'en50160');
		const t0 = Date.parse('2026-05-04T08:00:00Z') / 1000;
		expect(r.coverage.gaps).toEqual([{ startS: t0 + 600, endS: t0 + 3600 }]);
		expect(r.coverage.measuredS).toBe(1200);
	});

	it('files without a start time are taken in the order given, and that assumption is reported', () => {
		const a = doc('a.csv', null, 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		const b = doc('b.csv', null, 600, [{ startS: 0, durationS: 600, v: 232, complete: true }]);
		const { input, diagnostics } = surveyInputFromTrend([a, b]);
		expect(input.clockAligned).toBe(false);
		expect(input.intervals.map((i) => i.startS)).toEqual([0, 600]);
		const notes = diagnostics.filter((d) => d.code === 'survey-no-start-time');
		expect(notes).toHaveLength(1);
		expect(notes[0].message).toContain('a.csv and b.csv');
		expect(notes[0].message).toContain('in the order of their names');
	});

	it('one document of a folder read as one recording without start times: the note names each of its files, never the folder', () => {
		const folder = {
			...doc('hx', null, 1800, [{ startS: 0, durationS: 600, v: 230, complete: true }]),
			parts: ['hx/h1.csv', 'hx/h2.csv', 'hx/h10.csv'].map((source, k) => ({ source, startS: 600 * k, samples: 6e5 })),
		};
		const { diagnostics } = surveyInputFromTrend([folder]);
		const notes = diagnostics.filter((d) => d.code === 'survey-no-start-time');
		expect(notes).toHaveLength(1);
		// h2 before h10: names with numbers in numeric order (common practice for numbered files)
		expect(notes[0].message).toContain('h1.csv, h2.csv and h10.csv (in hx)');
		expect(notes[0].message).not.toMatch(/^hx /);
		expect(notes[0].message).toContain('in the order of their names');
	});

	it('a week of hourly files without start times: the note names the first few, how many more, and the last', () => {
		const names = Array.from({ length: 168 }, (_, k) => `h${k + 1}.csv`);
		const week = {
			...doc('week', null, 168 * 3600, []),
			parts: names.map((source, k) => ({ source, startS: 3600 * k, samples: 36e5 })),
		};
		const [note] = surveyInputFromTrend([week]).diagnostics.filter((d) => d.code === 'survey-no-start-time');
		// 168 = 3 named + 164 counted + the last
		expect(note.message).toContain('h1.csv, h2.csv, h3.csv and 164 more, up to h168.csv');
	});

	it('one file without a start time beside files with one: that file is named as the one stating none, and the order given is said', () => {
		const a = doc('b.cfg', '2026-05-04T08:00:00Z', 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		const b = doc('a.csv', null, 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		const [note] = surveyInputFromTrend([a, b]).diagnostics.filter((d) => d.code === 'survey-no-start-time');
		expect(note.message).toMatch(/^a\.csv states no start time/);
		expect(note.message).toContain('All 2 files are');
		expect(note.message).toMatch(/: b\.cfg and a\.csv\.$/);
		expect(note.message).toContain('in the order they were given');
	});

	it('one file without a start time gets no placement note (the assessment says its intervals count from its first sample)', () => {
		const a = doc('a.csv', null, 600, [{ startS: 0, durationS: 600, v: 230, complete: true }]);
		expect(surveyInputFromTrend([a]).diagnostics.filter((d) => d.code === 'survey-no-start-time')).toEqual([]);
		expect(assessSurvey(surveyInputFromTrend([a]).input, 'en50160').notes.join(' ')).toContain('states no start time');
	});

	it('files with different voltage channels are refused, naming the file', () => {
		const a = doc('a.cfg', '2026-05-04T08:00:00Z', 600, []);
		const b = {
			...doc('b.cfg', '2026-05-04T08:10:00Z', 600, []),
			channels: [{ name: 'L2', quantity: 'voltage', unit: 'V' }],
		};
		expect(() => surveyInputFromTrend([a, b])).toThrow(SurveyMergeError);
		expect(() => surveyInputFromTrend([a, b])).toThrow(/L2/);
	});
});

describe('surveyInputFromTrend: Plt and file boundaries on a tick (several documents)', () => {
	/** An hour from `startTime`: six 10-min rows with Pst `pst(k)`; with `short`, the last row 0.2 s short at the file end. */
	const hour = (source: string, startTime: string, pst: (k: number) => number, short = true): TrendDocument => {
		const d = doc(
			source,
			startTime,
			3600,
			Array.from({ length: 6 }, (_, k) => ({
				startS: 600 * k,
				durationS: k === 5 && short ? 599.8 : 600,
				v: 230,
				complete: k < 5 || !short,
			})),
		);
		d.aggregates.forEach((a, k) => (a.pst = [pst(k), null]));
		return d;
	};

	it('the last row of an hourly file, short only by the window the boundary cut, counts; Plt is the cubic mean of the 12 merged Pst', () => {
		const a = hour('h08.cfg', '2026-05-04T08:00:00Z', () => 1);
		const b = hour('h09.cfg', '2026-05-04T09:00:00Z', (k) => 0.2 * (k + 1), false);
		const { input } = surveyInputFromTrend([b, a]);
		// 12 complete intervals: the 08:50 row of h08 continues without a gap into h09 at the 09:00 tick
		expect(input.intervals.filter((i) => i.complete)).toHaveLength(12);
		expect(input.plt).toHaveLength(1);
		// Plt = ∛(Σ Pst³ / 12) (IEC 61000-4-15:2010, 5.7.3; from memory), by hand:
		// 6 · 1 + 0.2³ + 0.4³ + 0.6³ + 0.8³ + 1.0³ + 1.2³ = 6 + 0.008 + 0.064 + 0.216 + 0.512 + 1 + 1.728 = 9.528
		expect(input.plt![0].plt[0]).toBeCloseTo(Math.cbrt(9.528 / 12), 12);
		expect(input.plt![0].startS).toBe(Date.parse('2026-05-04T08:00:00Z') / 1000);
	});

	it('with a gap after the first file its last row stays partial and no Plt is made (12 consecutive Pst are needed)', () => {
		const a = hour('h08.cfg', '2026-05-04T08:00:00Z', () => 1);
		const b = hour('h09.cfg', '2026-05-04T09:00:05Z', () => 1, false);
		const { input } = surveyInputFromTrend([a, b]);
		expect(input.intervals.filter((i) => i.complete).length).toBeLessThan(12);
		expect(input.plt ?? []).toEqual([]);
	});
});
