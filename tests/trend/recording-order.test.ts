/**
 * Which files make one recording and in what order (lib/trend/recording-order.ts), on made-up file lists
 * whose answer follows from their start times and lengths alone.
 */
import { describe, expect, it } from 'vitest';
import { orderRecordingParts, planRecording, type RecordingPartInfo } from '../../lib/trend/index.js';

const V = [
	{ name: 'L1', quantity: 'voltage' as const, unit: 'V' },
	{ name: 'L2', quantity: 'voltage' as const, unit: 'V' },
];
const T0 = Date.parse('2026-05-04T08:00:00Z') / 1000;

/** Hourly files: start k hours after T0, one hour long (exact, as a COMTRADE sample count gives it). */
const hour = (k: number, extra: Partial<RecordingPartInfo> = {}): RecordingPartInfo => ({
	source: `h${k}.cfg`,
	clockStartS: T0 + 3600 * k,
	sampleRateHz: 6400,
	channels: V,
	durationS: 3600,
	durationExact: true,
	...extra,
});

describe('orderRecordingParts', () => {
	it('by start time when every file states one', () => {
		const o = orderRecordingParts([hour(2), hour(0), hour(1)]);
		expect(o.placement).toBe('clock');
		expect(o.ordered.map((p) => p.source)).toEqual(['h0.cfg', 'h1.cfg', 'h2.cfg']);
		expect(o.refused).toEqual([]);
	});

	it('by name, numbers in numeric order (h2 before h10), when none does, and says so', () => {
		const o = orderRecordingParts([{ source: 'h10.wav' }, { source: 'h2.wav' }, { source: 'h1.wav' }]);
		expect(o.placement).toBe('sequence');
		expect(o.ordered.map((p) => p.source)).toEqual(['h1.wav', 'h2.wav', 'h10.wav']);
		expect(o.notes[0].severity).toBe('assumption');
		expect(o.notes[0].message).toContain('order of their names');
		expect(o.notes[0].message).toContain('h1.wav, h2.wav and h10.wav');
	});

	it('a file without a start time beside files with one is refused, named, and not placed', () => {
		const o = orderRecordingParts([hour(1), { source: 'extra.wav' }, hour(0)]);
		expect(o.placement).toBe('clock');
		expect(o.ordered.map((p) => p.source)).toEqual(['h0.cfg', 'h1.cfg']);
		expect(o.refused.map((r) => r.part.source)).toEqual(['extra.wav']);
		expect(o.refused[0].expected).toContain('starts at 2026-05-04 08:00:00)');
	});
});

describe('planRecording', () => {
	it('hourly files that follow one another are one recording, in start-time order, and it says what it assumed', () => {
		const plan = planRecording([hour(1), hour(0), hour(2)]);
		expect(plan.one).toBe(true);
		if (plan.one) {
			expect(plan.ordered.map((p) => p.source)).toEqual(['h0.cfg', 'h1.cfg', 'h2.cfg']);
			expect(plan.summary).toContain('3 files');
		}
	});

	it('a missing hour (a gap as long as a file) still gives one recording; a missing day of hourly files does not', () => {
		expect(planRecording([hour(0), hour(2)]).one).toBe(true);
		const day = planRecording([hour(0), hour(25)]);
		expect(day.one).toBe(false);
		if (!day.one) expect(day.reason).toContain('gap longer than the files');
	});

	it('relay records of 1 s each, hours apart, are separate recordings', () => {
		const rec = (k: number) => hour(3 * k, { source: `fault${k}.cfg`, durationS: 1 });
		expect(planRecording([rec(0), rec(1), rec(2)]).one).toBe(false);
	});

	it('two boards recorded at the same time (same channel names) overlap: not one recording', () => {
		const plan = planRecording([hour(0, { source: 'board-a.csv' }), hour(0, { source: 'board-b.csv' })]);
		expect(plan.one).toBe(false);
		if (!plan.one) expect(plan.reason).toContain('overlap');
	});

	it('a length estimated from the file size (CSV) may be off by 5 %: a file starting 2 min "early" still follows', () => {
		const est = (k: number, d: number) => hour(k, { source: `h${k}.csv`, durationS: d, durationExact: false });
		expect(planRecording([est(0, 3720), est(1, 3600)]).one).toBe(true);
		expect(planRecording([est(0, 4000), est(1, 3600)]).one).toBe(false);
	});

	it('another sample rate, other channels, or a file without a start time: not one recording, with the reason', () => {
		const rate = planRecording([hour(0), hour(1, { sampleRateHz: 12800 })]);
		const chans = planRecording([hour(0), hour(1, { channels: V.slice(0, 1) })]);
		const unstated = planRecording([hour(0), { ...hour(1), clockStartS: undefined }]);
		expect([rate.one, chans.one, unstated.one]).toEqual([false, false, false]);
		if (!rate.one) expect(rate.reason).toContain('sample rate');
		if (!chans.one) expect(chans.reason).toContain('channels');
		if (!unstated.one) expect(unstated.reason).toContain('no start time');
	});
});
