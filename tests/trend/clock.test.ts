import { describe, expect, it } from 'vitest';
import { clockTimeOf, secondsPastTick } from '../../lib/trend/clock.js';
import { createTrendAnalyser } from '../../lib/trend/analyser.js';

describe('clockTimeOf', () => {
	it('clockTimeOf reads ISO 8601 with Z, with an offset, and without a zone (taken as written)', () => {
		// 2026-05-04T08:44:21Z = 1777884261 s since 1970 (Date.UTC, an independent computation).
		expect(clockTimeOf('2026-05-04T08:44:21.051Z')!.unixS).toBeCloseTo(Date.UTC(2026, 4, 4, 8, 44, 21, 51) / 1000, 6);
		expect(clockTimeOf('2026-05-04T10:44:21.051+02:00')!.unixS).toBeCloseTo(
			Date.UTC(2026, 4, 4, 8, 44, 21, 51) / 1000,
			6,
		);
		expect(clockTimeOf('2026-05-04T08:44:21.051')).toMatchObject({ zone: 'as written' });
		expect(clockTimeOf('2026-05-04T08:44:21.051')!.unixS).toBeCloseTo(Date.UTC(2026, 4, 4, 8, 44, 21, 51) / 1000, 6);
		expect(clockTimeOf('2026-13-04T08:44:21')).toBeUndefined();
		expect(clockTimeOf('yesterday')).toBeUndefined();
	});

	it('secondsPastTick puts 08:44:21.051 338.949 s before the 08:50:00 tick (hand computation)', () => {
		const t = clockTimeOf('2026-05-04T08:44:21.051Z')!.unixS;
		expect(600 - secondsPastTick(t, 600)).toBeCloseTo(338.949, 6);
		expect(10 - secondsPastTick(t, 10)).toBeCloseTo(8.949, 6);
	});
});

describe('createTrendAnalyser with clockStartS', () => {
	it('a recording starting at 08:44:21.051 gives its first full 10-min interval at 08:50:00 (IEC 61000-4-30:2015, 4.5.3)', () => {
		const fs = 3200;
		const start = clockTimeOf('2026-05-04T08:44:21.051Z')!.unixS;
		const a = createTrendAnalyser({
			sampleRateHz: fs,
			channels: [{ name: 'L1', quantity: 'voltage', unit: 'V' }],
			declaredV: 230,
			nominalHz: 50,
			thd: false,
			clockStartS: start,
			keep: { cycles10: false, cycles150: false },
		});
		const total = Math.round(1260 * fs); // 21 minutes: to 09:05:21.051
		const block = new Float64Array(65536);
		for (let off = 0; off < total; off += block.length) {
			const n = Math.min(block.length, total - off);
			for (let i = 0; i < n; i++) block[i] = 230 * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * (off + i)) / fs);
			a.push([block.subarray(0, n)]);
		}
		const r = a.finish();
		expect(r.min10.map((x) => x.complete)).toEqual([false, true, false]);
		// The first full interval starts at the first whole cycle at or after the tick: within one cycle (20 ms).
		const full = r.min10[1];
		expect(full.startS).toBeGreaterThanOrEqual(338.949 - 1 / fs);
		expect(full.startS).toBeLessThan(338.949 + 0.02);
		expect(full.durationS).toBeCloseTo(600, 1);
		expect(full.rms[0]).toBeCloseTo(230, 3);
		// 10-s values: the first is partial, up to the 08:44:30 tick, 8.949 s after the start.
		expect(r.frequency[0].complete).toBe(false);
		expect(r.frequency[1].startS).toBeCloseTo(8.949, 3);
		expect(r.frequency[1].complete).toBe(true);
		expect(r.clockStartS).toBe(start);
		// Pst (IEC 61000-4-15) on the same ticks: one complete interval, 08:50-09:00; the partial ones give none.
		expect(r.flicker?.pst).toHaveLength(1);
		expect(r.flicker!.pst[0].startS).toBeCloseTo(338.949, 3);
		expect(r.flicker!.pst[0].values[0]).toBeLessThan(0.05); // an unmodulated sine: no flicker
	});
});
