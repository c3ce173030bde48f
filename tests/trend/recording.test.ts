/**
 * createRecordingAnalyser: the parts of one recording through one trend analyser. Signals are closed-form
 * sines (signals.ts); expected times come from where the test cuts the samples.
 */
import { describe, expect, it } from 'vitest';
import { createRecordingAnalyser, RecordingMismatch } from '../../lib/trend/recording.js';
import type { TrendRow } from '../../lib/trend/types.js';
import { makeChannels } from './signals.js';

const FS = 3200;
const channels = [{ name: 'L1', quantity: 'voltage' as const, unit: 'V' }];
// 6 s of 230 V, 50 Hz; a dip to 115 V (50 %) from 2.0 s to 4.0 s
const [x] = makeChannels([{ rms: 230, phaseDeg: 0, steps: [{ fromS: 2, toS: 4, rms: 115 }] }], { f0Hz: 50 }, FS, 6);
const CLOCK = Date.UTC(2026, 4, 4, 8, 44, 21, 51) / 1000;
const part = (source: string, clockStartS?: number) => ({ source, sampleRateHz: FS, channels, clockStartS });
const opts = { declaredV: 230, nominalHz: 50 as const, thd: false, flicker: false };

describe('createRecordingAnalyser', () => {
	it('parts without start times follow one another: the rows equal those of one push of all the samples', () => {
		const whole = createRecordingAnalyser({ ...opts, placement: 'sequence' });
		whole.beginPart(part('all'));
		whole.push([x]);
		const a = whole.finish();
		const cut = createRecordingAnalyser({ ...opts, placement: 'sequence' });
		for (const [k, [from, to]] of [
			[0, 7001],
			[7001, 9600],
			[9600, x.length],
		].entries()) {
			cut.beginPart(part(`p${k}`));
			cut.push([x.subarray(from, to)]);
		}
		const b = cut.finish();
		expect(b.cycles10).toEqual(a.cycles10);
		expect(b.events).toEqual(a.events);
		expect(b.parts.map((p) => p.startS)).toEqual([0, 7001 / FS, 9600 / FS]);
	});

	it('a gap at 3 s (1 s long) ends the dip in progress there (ended false, 1 s long) and no row spans the gap', () => {
		const rows: TrendRow[] = [];
		const r = createRecordingAnalyser({ ...opts, placement: 'clock', onRow: (row) => rows.push(row) });
		r.beginPart(part('a', CLOCK));
		r.push([x.subarray(0, 3 * FS)]);
		r.beginPart(part('b', CLOCK + 4));
		r.push([x.subarray(4 * FS)]);
		const res = r.finish();
		expect(res.gaps).toEqual([{ startS: 3, durationS: expect.closeTo(1, 9), after: 'a', before: 'b' }]);
		const dip = res.events.find((e) => e.kind === 'dip')!;
		// stamped at the start of the Urms(1/2) window that began it: within one cycle of 2.0 s
		expect(Math.abs(dip.startS - 2)).toBeLessThanOrEqual(0.02);
		expect(dip.ended).toBe(false);
		expect(dip.startS + dip.durationS).toBeCloseTo(3, 9);
		expect(res.diagnostics.map((d) => d.code)).toContain('event-cut-by-gap');
		for (const row of [...res.cycles10, ...res.cycles150, ...res.min10, ...res.frequency])
			expect(row.startS + row.durationS <= 3 + 1e-9 || row.startS >= 4 - 1e-9).toBe(true);
		// rows streamed through onRow carry the recording's times too
		expect(rows.filter((w) => w.interval === '10/12-cycle').map((w) => w.startS)).toEqual(
			res.cycles10.map((w) => w.startS),
		);
		expect(res.durationS).toBeCloseTo(6, 9);
	});

	it('a part with another rate or other channels is a RecordingMismatch, and the recording goes on unchanged', () => {
		const r = createRecordingAnalyser({ ...opts, placement: 'sequence' });
		r.beginPart(part('a'));
		r.push([x.subarray(0, 2 * FS)]);
		expect(() => r.beginPart({ ...part('b'), sampleRateHz: 6400 })).toThrow(RecordingMismatch);
		expect(() => r.beginPart({ ...part('c'), channels: [{ name: 'L2', quantity: 'voltage', unit: 'V' }] })).toThrow(
			/channels/,
		);
		r.beginPart(part('d'));
		r.push([x.subarray(2 * FS)]);
		const res = r.finish();
		expect(res.parts.map((p) => p.source)).toEqual(['a', 'd']);
		expect(res.durationS).toBeCloseTo(6, 9);
	});
});
