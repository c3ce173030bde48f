/**
 * The flickermeter at input rates where the block squares decimate (D > 1, lib/flicker/block-squares.ts):
 * the IEC 61000-4-15 performance tables still hold, and a strongly distorted supply whose products fold
 * next to the flicker band's most sensitive frequency reads no flicker. Derivation and bound:
 * docs/flicker.md, "Block squares", and docs/flicker-alias-bound.py. Tolerance: class F1, 5 % (Ed.2, 6.2,
 * from memory).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	createFlickermeter,
	FLICKER_SETTLING_S,
	type FlickerLamp,
	type FlickerResult,
} from '../../lib/flicker/index.js';
import { forEachChunk, type Modulation } from '../helpers/flicker-signals.js';

const CLASS_F1 = 0.05;

function measure(
	sampleRateHz: number,
	nominalHz: 50 | 60,
	lamp: FlickerLamp,
	rmsV: number,
	durationS: number,
	modulation: Modulation,
): FlickerResult {
	const meter = createFlickermeter({ sampleRateHz, nominalHz, lamp });
	forEachChunk({ sampleRateHz, mainsHz: nominalHz, rmsV, durationS, modulation }, (c) => meter.push(c));
	return meter.finish();
}

describe('flickermeter with block squares: times stay whole (10 kS/s, D = 5, chain at 2000 S/s)', () => {
	const modulation: Modulation = { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01 };

	it('610 s give one interval [0, 600) s, duration 610 s, Pinst blocks of 1 s from the 5 s settling on', () => {
		const meter = createFlickermeter({ sampleRateHz: 10000, nominalHz: 50, keepPinstBlocks: true });
		forEachChunk({ sampleRateHz: 10000, mainsHz: 50, rmsV: 230, durationS: 610, modulation, chunk: 40_001 }, (c) =>
			meter.push(c),
		);
		const r = meter.finish();
		expect(r.pst).toHaveLength(1);
		expect(r.pst[0]).toMatchObject({ startS: 0, durationS: 600 });
		expect(r.durationS).toBe(610);
		const b = r.pinstBlocks!;
		expect(b.startS).toHaveLength(610 - FLICKER_SETTLING_S);
		b.startS.forEach((t, k) => expect(t).toBe(FLICKER_SETTLING_S + k));
	});

	it('a clock 100 s past a 10-minute tick at the first sample: the first whole interval starts at 500 s (IEC 61000-4-30 clock alignment, from memory)', () => {
		const meter = createFlickermeter({ sampleRateHz: 10000, nominalHz: 50, intervalOffsetS: 100 });
		forEachChunk({ sampleRateHz: 10000, mainsHz: 50, rmsV: 230, durationS: 1110, modulation }, (c) => meter.push(c));
		const r = meter.finish();
		expect(r.pst).toHaveLength(1);
		expect(r.pst[0]).toMatchObject({ startS: 500, durationS: 600 });
	});
});

describe('flickermeter with block squares: IEC 61000-4-15 Ed.2 Table 2 (rectangular, Pst = 1) within class F1', () => {
	// changes/min and ΔV/V % from Ed.2 Table 2 (from memory), as in performance.test.ts
	for (const [cpm, percent] of [
		[7, 1.459],
		[1620, 0.402],
	]) {
		it(`230 V lamp, 50 Hz at 10 kS/s (D = 5): ${cpm} changes/min at ${percent} % (Ed.2 Table 2, from memory)`, () => {
			const r = measure(10000, 50, '230V', 230, 600, {
				shape: 'rectangular',
				changesPerMinute: cpm,
				deltaVOverV: percent / 100,
			});
			expect(Math.abs(r.pst[0].pst - 1)).toBeLessThanOrEqual(CLASS_F1);
		});
	}
	for (const [cpm, percent] of [
		[39, 1.04],
		[1620, 0.548],
	]) {
		it(`120 V lamp, 60 Hz at 12 kS/s (D = 6): ${cpm} changes/min at ${percent} % (Ed.2 Table 2, from memory)`, () => {
			const r = measure(12000, 60, '120V', 120, 600, {
				shape: 'rectangular',
				changesPerMinute: cpm,
				deltaVOverV: percent / 100,
			});
			expect(Math.abs(r.pst[0].pst - 1)).toBeLessThanOrEqual(CLASS_F1);
		});
	}
});

describe('flickermeter with block squares: IEC 61000-4-15 Ed.2 Table 1 (sinusoidal, max Pinst = 1) within 5 %', () => {
	for (const [hz, percent, fs, nominal, lamp, rms] of [
		[0.5, 2.325, 10000, 50, '230V', 230],
		[8.8, 0.25, 10000, 50, '230V', 230],
		[13, 0.356, 10000, 50, '230V', 230],
		[8.8, 0.25, 1_000_000, 50, '230V', 230],
		[8.8, 0.321, 12000, 60, '120V', 120],
	] as const) {
		it(`${lamp} lamp, ${nominal} Hz at ${fs} S/s: ${hz} Hz at ${percent} % (Ed.2 Table 1, from memory)`, () => {
			const durationS = fs > 100_000 ? 8 : 25;
			const r = measure(fs, nominal, lamp, rms, durationS, {
				shape: 'sine',
				frequencyHz: hz,
				deltaVOverV: percent / 100,
			});
			expect(Math.abs(r.pinst.max - 1)).toBeLessThanOrEqual(0.05);
		});
	}
});

describe('flickermeter with block squares: any whole input rate', () => {
	it('property: from 3200 to 40 000 S/s (D from 2 to 25, chain from 1600 to 3200 S/s, prime rates included), 8.8 Hz at 0.25 % gives max Pinst 1.00 within 5 % (Ed.2 Table 1, from memory; fast-check)', () => {
		fc.assert(
			fc.property(fc.integer({ min: 3200, max: 40_000 }), (fs) => {
				const r = measure(fs, 50, '230V', 230, 20, { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 });
				expect(Math.abs(r.pinst.max - 1)).toBeLessThanOrEqual(0.05);
			}),
			{ numRuns: 6 },
		);
	});
});

/**
 * Odd harmonic voltages at the IEC 61000-2-2:2002 Table 1 compatibility levels for public LV networks, all
 * at once (from memory; THD 11.2 %, above the 8 % the table allows, so a worst case): % of the fundamental.
 * Even harmonics are left out: at these levels their products with the odd ones put a steady f0 line into
 * the squares that the standard's 35 Hz low-pass passes at 12 % whatever the sample rate (Pst ≈ 0.1 from
 * the chain itself; docs/flicker.md), which would hide what this test looks for.
 */
function compatibilityLevels(): Map<number, number> {
	const a = new Map<number, number>([
		[3, 5],
		[5, 6],
		[7, 5],
		[9, 1.5],
		[11, 3.5],
		[13, 3],
		[15, 0.4],
		[21, 0.3],
	]);
	for (let h = 17; h <= 49; h += 2) {
		if (a.has(h)) continue;
		if (h % 3 === 0) a.set(h, h <= 45 ? 0.2 : 0);
		else a.set(h, 2.27 * (17 / h) - 0.27);
	}
	return a;
}

/**
 * Pushes `durationS` of a distorted supply, fundamental f0 with the compatibility-level harmonics, its
 * RMS envelope modulated rectangularly (ΔV/V peak to peak, `cpm` changes per minute; 0 = none), and returns
 * the result. sin(hθ) by the recurrence sin((h+1)θ) = 2 cos θ sin hθ − sin((h−1)θ) (closed form).
 */
function distorted(f0: number, nominalHz: 50 | 60, lamp: FlickerLamp, cpm: number, deltaVOverV: number): FlickerResult {
	const fs = 12800,
		durationS = 600;
	const levels = compatibilityLevels();
	const amp = new Float64Array(50);
	for (const [h, p] of levels) amp[h] = p / 100;
	amp[1] = 1;
	const meter = createFlickermeter({ sampleRateHz: fs, nominalHz, lamp });
	const chunk = new Float64Array(65536);
	const total = fs * durationS;
	const peak = 230 * Math.SQRT2;
	for (let n0 = 0; n0 < total; n0 += chunk.length) {
		const m = Math.min(chunk.length, total - n0);
		for (let i = 0; i < m; i++) {
			const n = n0 + i;
			const theta = (2 * Math.PI * f0 * n) / fs;
			const c = Math.cos(theta);
			let prev = 0,
				s = Math.sin(theta),
				v = s;
			for (let h = 2; h <= 49; h++) {
				const next = 2 * c * s - prev;
				prev = s;
				s = next;
				v += amp[h] * s;
			}
			const high = cpm === 0 || Math.floor((n / fs) * (cpm / 60)) % 2 === 0;
			chunk[i] = peak * v * (1 + (deltaVOverV / 2) * (high ? 1 : -1));
		}
		meter.push(chunk.subarray(0, m));
	}
	return meter.finish();
}

describe('flickermeter with block squares: a distorted supply (12.8 kS/s, D = 8, chain at 1600 S/s)', () => {
	// f0 = 50.275 Hz puts 32·f0 = 1608.8 Hz, the fundamental's products with the 31st and 33rd harmonics,
	// 8.8 Hz from the chain rate: it folds onto the lamp filter's peak. docs/flicker-alias-bound.py bounds what
	// the triangle kernel lets through at Pinst 2.6e-7 (phases aligned); a plain block mean of 8 samples in its
	// place measured Pst 0.028 here (bound 0.069). Besides the fold, the standard's chain itself passes a little of the 2·f0 ripple: an
	// undistorted 50 Hz sine reads Pst ≈ 0.01 (0.004 at 60 Hz). The limits sit between the two.
	it('unmodulated, 50.275 Hz, 230 V lamp: Pst < 0.015 (no fluctuation: Pst = 0 ideally)', () => {
		expect(distorted(50.275, 50, '230V', 0, 0).pst[0].pst).toBeLessThan(0.015);
	});
	it('unmodulated, 60.275 Hz, 120 V lamp: Pst < 0.01 (no fluctuation: Pst = 0 ideally)', () => {
		expect(distorted(60.275, 60, '120V', 0, 0).pst[0].pst).toBeLessThan(0.01);
	});
	// The modulation scales the whole waveform, so the RMS envelope is modulated as in Table 2.
	it('7 changes/min at 1.459 %, 50.275 Hz, 230 V lamp: Pst = 1 within class F1 (Ed.2 Table 2, from memory)', () => {
		expect(Math.abs(distorted(50.275, 50, '230V', 7, 0.01459).pst[0].pst - 1)).toBeLessThanOrEqual(CLASS_F1);
	});
	it('7 changes/min at 1.694 %, 60.275 Hz, 120 V lamp: Pst = 1 within class F1 (Ed.2 Table 2, from memory)', () => {
		expect(Math.abs(distorted(60.275, 60, '120V', 7, 0.01694).pst[0].pst - 1)).toBeLessThanOrEqual(CLASS_F1);
	});
});
