import fc from 'fast-check';
/**
 * IEC 61000-3-3 voltage change parameters on half-cycle RMS sequences whose dc, dmax and Tmax follow by
 * arithmetic (definitions: IEC 61000-4-15:2010, 3.1 and IEC 61000-3-3:2013, 3; from memory).
 */
import { describe, expect, it } from 'vitest';
import { createHalfPeriodRms, createVoltageChangeTracker, type VoltageChange } from '../../lib/flicker/index.js';
import { sineSamples } from '../helpers/synth.js';

const HALF_S = 0.01; // 50 Hz

/** Feeds `levels` as runs of half-cycle values: [volts, half cycles]. */
function track(levels: [number, number][], un = 230): VoltageChange[] {
	const t = createVoltageChangeTracker(un, 50);
	let k = 0;
	for (const [v, count] of levels) for (let i = 0; i < count; i++, k++) t.push(k * HALF_S, v);
	return t.finish();
}

describe('createVoltageChangeTracker', () => {
	it('a step 230 V -> 222 V between two 2 s steady states gives dc = dmax = 8/230 and Tmax = 0 (3.48 % is a change, not time beyond 3.3 % during it)', () => {
		const c = track([
			[230, 200],
			[222, 200],
		]);
		expect(c).toHaveLength(1);
		expect(c[0].dcPercent).toBeCloseTo((100 * 8) / 230, 9);
		expect(c[0].ussBeforeV).toBe(230);
		expect(c[0].ussAfterV).toBe(222);
		expect(c[0].startS).toBeCloseTo(2, 9);
		expect(c[0].ended).toBe(true);
	});

	it('a motor start: 230 V, 300 ms at 210 V, then steady 228 V gives dmax = 20/230, dc = 2/230, Tmax = 0.30 s', () => {
		const c = track([
			[230, 150],
			[210, 30],
			[228, 150],
		]);
		expect(c).toHaveLength(1);
		expect(c[0].dmaxPercent).toBeCloseTo((100 * 20) / 230, 9);
		expect(c[0].dcPercent).toBeCloseTo((100 * 2) / 230, 9);
		expect(c[0].tmaxS).toBeCloseTo(0.3, 9);
		expect(c[0].durationS).toBeCloseTo(0.3, 9);
	});

	it('a dip of 3 % (inside 3.3 %) gives Tmax = 0', () => {
		const c = track([
			[230, 150],
			[230 * 0.97, 40],
			[230, 150],
		]);
		expect(c[0].tmaxS).toBe(0);
		expect(c[0].dmaxPercent).toBeCloseTo(3, 9);
		expect(c[0].dcPercent).toBeCloseTo(0, 9);
	});

	it('fluctuation within the ±0.2 % band is steady: no change reported', () => {
		const t = createVoltageChangeTracker(230, 50);
		for (let k = 0; k < 1000; k++) t.push(k * HALF_S, 230 + 0.4 * Math.sin(k / 7));
		expect(t.finish()).toEqual([]);
	});

	it('a record ending during a change reports it unfinished with dc NaN', () => {
		const c = track([
			[230, 150],
			[200, 20],
		]);
		expect(c).toHaveLength(1);
		expect(c[0].ended).toBe(false);
		expect(c[0].dcPercent).toBeNaN();
		expect(c[0].dmaxPercent).toBeCloseTo((100 * 30) / 230, 9);
	});

	it('two changes in a row each take the steady state before them as reference', () => {
		const c = track([
			[230, 150],
			[225, 150],
			[220, 150],
		]);
		expect(c).toHaveLength(2);
		expect(c[0].dcPercent).toBeCloseTo((100 * 5) / 230, 9);
		expect(c[1].ussBeforeV).toBe(225);
		expect(c[1].dcPercent).toBeCloseTo((100 * 5) / 230, 9);
	});

	it('rejects a non-positive nominal voltage', () => {
		expect(() => createVoltageChangeTracker(0, 50)).toThrow(RangeError);
	});
});

describe('createHalfPeriodRms', () => {
	it('a 230 V RMS, 50 Hz sine gives 230 V per half period (sin² over a half period averages 1/2), 100 values per second', () => {
		const values: number[] = [];
		const h = createHalfPeriodRms(6400, 50, (_t, v) => values.push(v));
		const x = sineSamples({
			amplitude: 230 * Math.SQRT2,
			frequencyHz: 50,
			sampleRateHz: 6400,
			cycles: 50,
			phaseDeg: 10,
		});
		h.push(x.subarray(0, 1000));
		h.push(x.subarray(1000));
		expect(values.length).toBeGreaterThanOrEqual(98);
		for (const v of values) expect(Math.abs(v / 230 - 1)).toBeLessThan(5e-4);
	});

	it('samples landing exactly on the zero crossings (phase 0, 64 per half period) do not shift the value (within 0.05 %)', () => {
		const values: number[] = [];
		const h = createHalfPeriodRms(6400, 50, (_t, v) => values.push(v));
		h.push(sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: 50, sampleRateHz: 6400, cycles: 20 }));
		expect(values.length).toBeGreaterThanOrEqual(38);
		for (const v of values) expect(Math.abs(v / 230 - 1)).toBeLessThan(5e-4);
	});

	it('a channel that stops crossing zero (a steady 5 V after 3 cycles) keeps giving values: 5 V every 1.5 nominal half periods (RMS of a constant; the timeout of the module note)', () => {
		const values: { t: number; v: number }[] = [];
		const h = createHalfPeriodRms(6400, 50, (t, v) => values.push({ t, v }));
		const x = new Float64Array(6400 * 3);
		x.set(sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 6400, cycles: 3, phaseDeg: 10 }));
		x.fill(5, 384);
		h.push(x);
		const late = values.filter((p) => p.t > 0.1);
		// 1.5 half periods of 64 samples: a value every 96 samples, 2.9 s / 15 ms ≈ 193 of them
		expect(late.length).toBeGreaterThan(180);
		for (const p of late) expect(p.v).toBeCloseTo(5, 9);
		expect(late[1].t - late[0].t).toBeCloseTo(96 / 6400, 9);
	});

	it('property: any chunking gives the identical values, with noise and non-finite samples (fast-check)', () => {
		const x = new Float64Array(20000);
		for (let i = 0; i < x.length; i++) x[i] = 325 * Math.sin((2 * Math.PI * 50.3 * i) / 6400) + 30 * Math.sin(i * 2.1);
		x[777] = NaN;
		x[5000] = Infinity;
		x.fill(0, 9000, 9400);
		const run = (sizes: number[]) => {
			const out: number[] = [];
			const h = createHalfPeriodRms(6400, 50, (t, v) => out.push(t, v));
			for (let i = 0, k = 0; i < x.length; k++) {
				const stop = Math.min(x.length, i + sizes[k % sizes.length]);
				h.push(x.subarray(i, stop));
				i = stop;
			}
			return out;
		};
		const whole = run([x.length]);
		expect(whole.length).toBeGreaterThan(2 * 300);
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 1, max: 3000 }), { minLength: 1, maxLength: 6 }), (sizes) => {
				expect(run(sizes)).toEqual(whole);
			}),
			{ numRuns: 30 },
		);
	});
});
