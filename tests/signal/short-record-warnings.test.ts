import { describe, expect, it } from 'vitest';
import { coarseFrequencyHz } from '../../lib/signal/coarse-frequency.js';
import { findWholeCycles } from '../../lib/signal/cycles.js';

const oneCycle = Float64Array.from({ length: 19_920 }, (_, i) => 325 * Math.sin((2 * Math.PI * 50.2 * i) / 1e6));

describe('short records: warnings quote only what was measured', () => {
	it('coarseFrequencyHz(1.0 cycle) returns no frequency rather than one below the range it searched (1.8 cycles per record)', () => {
		const lowest = (1.8 * 1e6) / oneCycle.length;
		const f = coarseFrequencyHz(oneCycle, 1e6);
		if (!Number.isNaN(f)) expect(f).toBeGreaterThanOrEqual(lowest * (1 - 1e-9));
		expect(coarseFrequencyHz(oneCycle, 1e6, { nominalHz: 50 })).toBeNaN();
	});

	it('findWholeCycles(1.0 cycle of 50.2 Hz, no nominal) says the record is under two cycles of anything below 100 Hz, quoting no made-up frequency', () => {
		const r = findWholeCycles(oneCycle, 1e6);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.code).toBe('too-short');
		// 19 920 samples at 1 MS/s = 19.92 ms; two cycles fit only above 2 / 19.92 ms = 100.4 Hz (closed form)
		expect(r.message).toContain('19.92 ms');
		expect(r.message).toContain('100.4 Hz');
		expect(r.message).not.toMatch(/cycles of \d/);
	});

	it('findWholeCycles(1.0 cycle, nominal 50 Hz) says too short by the duration, not with a frequency it did not search', () => {
		const r = findWholeCycles(oneCycle, 1e6, { nominalHz: 50 });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.code).toBe('too-short');
		expect(r.message).toContain('19.92 ms');
	});
});
