import { describe, expect, it } from 'vitest';
import { assessSurvey, findGaps } from '../../lib/survey/assess.js';
import type { SurveyInput, SurveyInterval } from '../../lib/survey/types.js';

const TEN_MIN = 600;
const WEEK = 1008; // 7 days x 144 ten-minute intervals

function interval(k: number, rmsV: number, extra: Partial<SurveyInterval> = {}): SurveyInterval {
	return {
		startS: k * TEN_MIN,
		durationS: TEN_MIN,
		complete: true,
		flagged: false,
		rmsV: [rmsV],
		thdPercent: [3],
		...extra,
	};
}

function week(volts: (k: number) => number, extra: (k: number) => Partial<SurveyInterval> = () => ({})): SurveyInput {
	const intervals = Array.from({ length: WEEK }, (_, k) => interval(k, volts(k), extra(k)));
	const frequency = Array.from({ length: WEEK * 60 }, (_, k) => ({ startS: k * 10, frequencyHz: 50, flagged: false }));
	return {
		channels: ['L1'],
		declaredV: 230,
		nominalHz: 50,
		spanStartS: 0,
		spanEndS: WEEK * TEN_MIN,
		clockAligned: true,
		intervals,
		frequency,
		events: [],
	};
}

const line = (r: ReturnType<typeof assessSurvey>, id: string) => r.lines.find((l) => l.id === id)!;

describe('assessSurvey, EN 50160:2010 4.2.2 supply voltage variations', () => {
	it('40 of 1008 ten-minute means at 255 V: 96.03 % within 230 V ± 10 % meets the 95 % rule, fails the 100 % rule', () => {
		// Hand computation: (1008 - 40) / 1008 = 96.0317 %; 255 V > 253 V = 1.1 x 230 V.
		const r = assessSurvey(
			week((k) => (k < 40 ? 255 : 230)),
			'en50160',
		);
		expect(line(r, 'supply-voltage-95').value).toBeCloseTo((100 * 968) / 1008, 10);
		expect(line(r, 'supply-voltage-95').verdict).toBe('meets');
		expect(line(r, 'supply-voltage-100').verdict).toBe('does not meet');
		expect(r.meets).toBe(false);
	});

	it('63 of 1008 means (every 16th) at 200 V: 93.75 % within ± 10 % does not meet 95 %, but all are inside +10 / -15 % (195.5 V)', () => {
		// Hand computation: 945 / 1008 = 93.75 %; 200 V >= 0.85 x 230 V = 195.5 V.
		const r = assessSurvey(
			week((k) => (k % 16 === 0 ? 200 : 230)),
			'en50160',
		);
		expect(line(r, 'supply-voltage-95').value).toBeCloseTo((100 * 945) / 1008, 10);
		expect(line(r, 'supply-voltage-95').verdict).toBe('does not meet');
		expect(line(r, 'supply-voltage-100').verdict).toBe('meets');
	});

	it('flagged and partial intervals are left out of the statistic and counted (IEC 61000-4-30:2015, 4.7)', () => {
		const r = assessSurvey(
			week(
				(k) => (k < 30 ? 120 : 230),
				(k) => (k < 20 ? { flagged: true } : k < 30 ? { complete: false } : {}),
			),
			'en50160',
		);
		const l = line(r, 'supply-voltage-100');
		expect(l.used).toBe(WEEK - 30);
		expect(l.excludedFlagged).toBe(20);
		expect(l.excludedPartial).toBe(10);
		expect(l.verdict).toBe('meets');
	});
});

describe('assessSurvey, percentile rules', () => {
	it('THD 95th percentile over a week: 51 of 1008 values at 9 % puts the 95th percentile at 9 % > 8 % (EN 50160:2010, 4.2.5)', () => {
		// Nearest rank ceil(0.95 x 1008) = 958: the 958th smallest of 957 values of 3 % and 51 of 9 % is 9 %.
		const r = assessSurvey(
			week(
				() => 230,
				(k) => ({ thdPercent: [k < 51 ? 9 : 3] }),
			),
			'en50160',
		);
		expect(line(r, 'thd').value).toBe(9);
		expect(line(r, 'thd').verdict).toBe('does not meet');
		const r2 = assessSurvey(
			week(
				() => 230,
				(k) => ({ thdPercent: [k < 50 ? 9 : 3] }),
			),
			'en50160',
		);
		expect(line(r2, 'thd').value).toBe(3); // 958 > 50 values of 9 %: the 958th smallest is 3 %
		expect(line(r2, 'thd').verdict).toBe('meets');
	});

	it('the 5th harmonic is judged against EN 50160 Table 1 (6 %) and IEC 61000-2-2 Table 1 (6 %), per order', () => {
		const h = (v5: number) => Array.from({ length: 51 }, (_, o) => (o === 5 ? v5 : o === 1 ? 100 : 0.1));
		const r = assessSurvey(
			week(
				() => 230,
				(k) => ({ harmonicsPercent: [h(k < 100 ? 6.5 : 2)] }),
			),
			'en50160',
		);
		const h5 = r.lines.find((l) => l.id === 'harmonic-5')!;
		expect(h5.limit).toBe(6);
		expect(h5.value).toBe(6.5);
		expect(h5.verdict).toBe('does not meet');
		expect(h5.source).toContain('EN 50160');
		const r2 = assessSurvey(
			week(
				() => 230,
				(k) => ({ harmonicsPercent: [h(k < 100 ? 6.5 : 2)] }),
			),
			'iec61000-2-2',
		);
		expect(r2.lines.find((l) => l.id === 'harmonic-5')!.source).toContain('IEC 61000-2-2');
	});

	it('unbalance and Plt not recorded are "not measured", never a pass', () => {
		const r = assessSurvey(
			week(() => 230),
			'en50160',
		);
		expect(line(r, 'unbalance').verdict).toBe('not measured');
		expect(line(r, 'flicker-plt').verdict).toBe('not measured');
	});

	it('Plt 0.9 passes EN 50160 (Plt <= 1) and fails the IEC 61000-2-2 level (0.8, from memory)', () => {
		const input = {
			...week(() => 230),
			plt: Array.from({ length: 84 }, (_, k) => ({ startS: k * 7200, plt: [0.9], flagged: false })),
		};
		expect(line(assessSurvey(input, 'en50160'), 'flicker-plt').verdict).toBe('meets');
		expect(line(assessSurvey(input, 'iec61000-2-2'), 'flicker-plt').verdict).toBe('does not meet');
	});
});

describe('assessSurvey, frequency EN 50160:2010 4.2.1', () => {
	it('0.4 % of 10-s values at 50.6 Hz fails the 99.5 % band of 50 Hz ± 1 % only when above 0.5 %', () => {
		const input = week(() => 230);
		const n = input.frequency.length; // 60480
		const off = Math.ceil(0.004 * n); // 242 values outside 49.5-50.5 Hz
		input.frequency.forEach((f, k) => (f.frequencyHz = k < off ? 50.6 : 50));
		const r = assessSurvey(input, 'en50160');
		expect(line(r, 'frequency-99.5').verdict).toBe('meets');
		expect(line(r, 'frequency-100').verdict).toBe('meets'); // 50.6 Hz is inside 47-52 Hz
		input.frequency.forEach((f, k) => (f.frequencyHz = k < Math.ceil(0.006 * n) ? 50.6 : 50));
		expect(line(assessSurvey(input, 'en50160'), 'frequency-99.5').verdict).toBe('does not meet');
	});
});

describe('assessSurvey, events and coverage', () => {
	it('each event lands in one cell of the EN 50160 Table 5 / Table 6 classification; interruptions are counted apart', () => {
		const input = week(() => 230);
		input.events = [
			{ kind: 'dip', startS: 10, durationS: 0.15, percentOfDeclared: 75, channels: ['L1'] }, // 80 > u >= 70, 10-200 ms
			{ kind: 'dip', startS: 20, durationS: 0.2, percentOfDeclared: 80, channels: ['L1'] }, // 90 > u >= 80, 10-200 ms (edge inclusive)
			{ kind: 'dip', startS: 30, durationS: 2, percentOfDeclared: 30, channels: ['L1'] }, // 40 > u >= 5, 1-5 s
			{ kind: 'dip', startS: 40, durationS: 0.005, percentOfDeclared: 50, channels: ['L1'] }, // shorter than 10 ms: outside
			{ kind: 'swell', startS: 50, durationS: 1, percentOfDeclared: 115, channels: ['L1'] }, // 120 > u > 110, 0.5-5 s
			{ kind: 'interruption', startS: 60, durationS: 90, percentOfDeclared: 0, channels: ['L1'] },
			{ kind: 'interruption', startS: 600, durationS: 400, percentOfDeclared: 0, channels: ['L1'] },
		];
		const r = assessSurvey(input, 'en50160');
		expect(r.dips.counts[1][0]).toBe(1);
		expect(r.dips.counts[0][0]).toBe(1);
		expect(r.dips.counts[3][3]).toBe(1);
		expect(r.dips.outside).toBe(1);
		expect(r.dips.counts.flat().reduce((a, b) => a + b, 0)).toBe(3);
		expect(r.swells.counts[1][1]).toBe(1);
		expect(r.interruptions).toMatchObject({ short: 1, long: 1 });
	});

	it('findGaps finds an hour with no interval, and the week note says a shorter recording only indicates', () => {
		const input = week(() => 230);
		input.intervals = input.intervals.filter((i) => i.startS < 3600 || i.startS >= 7200);
		expect(findGaps(input)).toEqual([{ startS: 3600, endS: 7200 }]);
		const short = { ...input, spanEndS: 86_400, intervals: input.intervals.slice(0, 100) };
		expect(assessSurvey(short, 'en50160').weekNote).toContain('only');
		expect(
			assessSurvey(
				week(() => 230),
				'en50160',
			).weekNote,
		).not.toContain('only');
	});
});
