import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createFlickermeter, FLICKER_SETTLING_S, type FlickerResult } from '../../lib/flicker/index.js';
import { forEachChunk, type FlickerSignalSpec } from '../helpers/flicker-signals.js';

const SPEC: FlickerSignalSpec = {
	sampleRateHz: 1600,
	mainsHz: 50,
	rmsV: 230,
	durationS: 610,
	modulation: { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01 },
};

function run(chunk: FlickerSignalSpec['chunk']): FlickerResult {
	const meter = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50, keepPinstBlocks: true });
	forEachChunk({ ...SPEC, chunk }, (c) => meter.push(c));
	return meter.finish();
}

describe('createFlickermeter streaming', () => {
	const whole = run(1 << 22); // one chunk: the whole 610 s record

	it('property: any chunking gives the identical Pst, Pinst statistics and Pinst blocks (fast-check)', () => {
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 1, max: 40_000 }), { minLength: 1, maxLength: 8 }), (sizes) => {
				let k = 0;
				const r = run(() => sizes[k++ % sizes.length]);
				expect(r.pst).toEqual(whole.pst);
				expect(r.pinst).toEqual(whole.pinst);
				expect(r.pinstBlocks).toEqual(whole.pinstBlocks);
			}),
			{ numRuns: 3 },
		);
	});

	it('gives one complete 10-minute interval for 610 s and reports the duration', () => {
		expect(whole.pst).toHaveLength(1);
		expect(whole.pst[0]).toMatchObject({ startS: 0, durationS: 600 });
		expect(whole.durationS).toBeCloseTo(610, 9);
		expect(whole.plt).toEqual([]);
	});

	it('Pinst blocks are 1 s long and start after the settling time', () => {
		const b = whole.pinstBlocks!;
		expect(b.startS[0]).toBe(FLICKER_SETTLING_S);
		expect(b.startS[1] - b.startS[0]).toBe(1);
		expect(b.startS).toHaveLength(610 - FLICKER_SETTLING_S);
	});

	it('a record shorter than 10 minutes gives no Pst but Pinst statistics', () => {
		const m = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50 });
		forEachChunk({ ...SPEC, durationS: 60 }, (c) => m.push(c));
		const r = m.finish();
		expect(r.pst).toEqual([]);
		expect(r.pinst.max).toBeGreaterThan(r.pinst.p50);
		expect(r.pinst.durationS).toBeCloseTo(60, 9);
	});

	it('an empty record gives NaN statistics, no Pst and no error', () => {
		const r = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50 }).finish();
		expect(r.pst).toEqual([]);
		expect(r.pinst.max).toBeNaN();
		expect(r.durationS).toBe(0);
	});

	it('NaN samples are counted and do not poison the filters (Pinst stays finite)', () => {
		const m = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50 });
		let first = true;
		forEachChunk({ ...SPEC, durationS: 30, modulation: { shape: 'none' } }, (c) => {
			if (first) {
				c[5000] = NaN;
				c[5001] = Infinity;
				first = false;
			}
			m.push(c);
		});
		const r = m.finish();
		expect(r.nonFiniteSamples).toBe(2);
		expect(Number.isFinite(r.pinst.max)).toBe(true);
	});

	it('a record that starts dead (zeros) then carries 230 V keeps Pinst finite', () => {
		const m = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50 });
		m.push(new Float64Array(1600));
		forEachChunk({ ...SPEC, durationS: 20, modulation: { shape: 'none' } }, (c) => m.push(c));
		expect(Number.isFinite(m.finish().pinst.max)).toBe(true);
	});

	it('push after finish throws', () => {
		const m = createFlickermeter({ sampleRateHz: 1600, nominalHz: 50 });
		m.finish();
		expect(() => m.push(new Float64Array(10))).toThrow();
	});
});
