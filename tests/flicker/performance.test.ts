/**
 * The flickermeter against the performance tables of IEC 61000-4-15:2010 (Ed.2). The standard is
 * paywalled: every table value below is FROM MEMORY of Ed.2 (the 230 V rectangular column was also
 * reproduced within 3 % by an independent numpy implementation of the same filter constants, kept outside
 * this repository). Tolerance: class F1, Pst = 1.00 ± 5 % (Ed.2, 6.2, from memory).
 */
import { describe, expect, it } from 'vitest';
import { createFlickermeter, type FlickerResult, type FlickerLamp } from '../../lib/flicker/index.js';
import { forEachChunk, type FlickerSignalSpec, type Modulation } from '../helpers/flicker-signals.js';

const CLASS_F1 = 0.05;

function measure(
	spec: Omit<FlickerSignalSpec, 'mainsHz'> & { mainsHz?: FlickerSignalSpec['mainsHz'] },
	nominalHz: 50 | 60,
	lamp: FlickerLamp,
): FlickerResult {
	const meter = createFlickermeter({ sampleRateHz: spec.sampleRateHz, nominalHz, lamp });
	forEachChunk({ mainsHz: nominalHz, ...spec }, (c) => meter.push(c));
	return meter.finish();
}

function pst10min(
	sampleRateHz: number,
	nominalHz: 50 | 60,
	lamp: FlickerLamp,
	modulation: Modulation,
	rmsV: number,
): number {
	const r = measure({ sampleRateHz, rmsV, durationS: 600, modulation }, nominalHz, lamp);
	expect(r.pst).toHaveLength(1);
	return r.pst[0].pst;
}

// IEC 61000-4-15:2010 (Ed.2), Table 2 (rectangular voltage fluctuations, Pst = 1), changes per minute :
// ΔV/V in %, from memory.
const RECT_230V_50HZ: [number, number][] = [
	[1, 2.724],
	[2, 2.211],
	[7, 1.459],
	[39, 0.906],
	[110, 0.725],
	[1620, 0.402],
];
const RECT_120V_60HZ: [number, number][] = [
	[1, 3.181],
	[2, 2.564],
	[7, 1.694],
	[39, 1.04],
	[110, 0.844],
	[1620, 0.548],
];

describe('flickermeter: rectangular modulation of IEC 61000-4-15 Ed.2 Table 2 gives Pst = 1.00 within class F1 (5 %)', () => {
	for (const [cpm, percent] of RECT_230V_50HZ) {
		it(`230 V lamp, 50 Hz, 1600 S/s: ${cpm} changes/min at ΔV/V = ${percent} % (Ed.2 Table 2, from memory)`, () => {
			const pst = pst10min(
				1600,
				50,
				'230V',
				{ shape: 'rectangular', changesPerMinute: cpm, deltaVOverV: percent / 100 },
				230,
			);
			expect(Math.abs(pst - 1)).toBeLessThanOrEqual(CLASS_F1);
		});
	}
	for (const [cpm, percent] of RECT_120V_60HZ) {
		it(`120 V lamp, 60 Hz, 1920 S/s: ${cpm} changes/min at ΔV/V = ${percent} % (Ed.2 Table 2, from memory)`, () => {
			const pst = pst10min(
				1920,
				60,
				'120V',
				{ shape: 'rectangular', changesPerMinute: cpm, deltaVOverV: percent / 100 },
				120,
			);
			expect(Math.abs(pst - 1)).toBeLessThanOrEqual(CLASS_F1);
		});
	}
	it('230 V lamp, 50 Hz at 6400 S/s: 110 changes/min at 0.725 % (Ed.2 Table 2, from memory)', () => {
		const pst = pst10min(6400, 50, '230V', { shape: 'rectangular', changesPerMinute: 110, deltaVOverV: 0.00725 }, 230);
		expect(Math.abs(pst - 1)).toBeLessThanOrEqual(CLASS_F1);
	});
	it('120 V lamp, 60 Hz at 7680 S/s: 39 changes/min at 1.040 % (Ed.2 Table 2, from memory)', () => {
		const pst = pst10min(7680, 60, '120V', { shape: 'rectangular', changesPerMinute: 39, deltaVOverV: 0.0104 }, 120);
		expect(Math.abs(pst - 1)).toBeLessThanOrEqual(CLASS_F1);
	});
});

// IEC 61000-4-15:2010 (Ed.2), Table 1 (sinusoidal voltage fluctuations giving a maximum Pinst of 1.00),
// modulation Hz : ΔV/V in %, from memory. Only the points recalled with confidence are used: the 230 V
// column up to 13 Hz and a few points of the 120 V column (the recollection of the rest disagrees with
// the published filter constants by more than the tolerance, see docs/flicker.md).
const SINE_230V: [number, number][] = [
	[0.5, 2.325],
	[1, 1.397],
	[1.5, 1.067],
	[2, 0.879],
	[3, 0.645],
	[4, 0.497],
	[5, 0.396],
	[6, 0.325],
	[7, 0.28],
	[8, 0.256],
	[8.8, 0.25],
	[9.5, 0.254],
	[10, 0.261],
	[11, 0.283],
	[12, 0.314],
	[13, 0.356],
];
const SINE_120V: [number, number][] = [
	[0.5, 2.457],
	[1, 1.465],
	[1.5, 1.122],
	[2, 0.929],
	[8.8, 0.321],
];

describe('flickermeter: sinusoidal modulation of IEC 61000-4-15 Ed.2 Table 1 gives a maximum Pinst of 1.00 (5 %)', () => {
	for (const [hz, percent] of SINE_230V) {
		it(`230 V lamp, 50 Hz: ${hz} Hz at ΔV/V = ${percent} % (Ed.2 Table 1, from memory)`, () => {
			const r = measure(
				{
					sampleRateHz: 1600,
					rmsV: 230,
					durationS: 25,
					modulation: { shape: 'sine', frequencyHz: hz, deltaVOverV: percent / 100 },
				},
				50,
				'230V',
			);
			expect(Math.abs(r.pinst.max - 1)).toBeLessThanOrEqual(0.05);
		});
	}
	for (const [hz, percent] of SINE_120V) {
		it(`120 V lamp, 60 Hz: ${hz} Hz at ΔV/V = ${percent} % (Ed.2 Table 1, from memory)`, () => {
			const r = measure(
				{
					sampleRateHz: 1920,
					rmsV: 120,
					durationS: 25,
					modulation: { shape: 'sine', frequencyHz: hz, deltaVOverV: percent / 100 },
				},
				60,
				'120V',
			);
			expect(Math.abs(r.pinst.max - 1)).toBeLessThanOrEqual(0.05);
		});
	}
});

describe('flickermeter: scaling and immunity', () => {
	it('Pst is proportional to the modulation depth (Pinst ∝ (ΔV/V)², Pst ∝ √Pinst: closed form)', () => {
		const m = (d: number): Modulation => ({ shape: 'rectangular', changesPerMinute: 39, deltaVOverV: d });
		const a = pst10min(1600, 50, '230V', m(0.005), 230);
		const b = pst10min(1600, 50, '230V', m(0.01), 230);
		expect(b / a).toBeCloseTo(2, 2);
	});

	// Exact to first order in ΔV/V: squaring the modulated sine also makes (ΔV/V)²/4 terms, hence 9 ± 0.05.
	it('Pinst max is proportional to the square of the modulation depth (closed form, first order in ΔV/V)', () => {
		const run = (d: number) =>
			measure(
				{ sampleRateHz: 1600, rmsV: 230, durationS: 20, modulation: { shape: 'sine', frequencyHz: 5, deltaVOverV: d } },
				50,
				'230V',
			).pinst.max;
		expect(run(0.006) / run(0.002)).toBeCloseTo(9, 1);
	});

	it('Pst does not depend on the voltage level: 230 V and 2.3 kV with the same relative modulation (normalising adaptor)', () => {
		const m: Modulation = { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01459 };
		expect(pst10min(1600, 50, '230V', m, 2300)).toBeCloseTo(pst10min(1600, 50, '230V', m, 230), 6);
	});

	it('an unmodulated 230 V, 50 Hz sine gives Pst < 0.05 (no fluctuation: Pst = 0 ideally)', () => {
		expect(pst10min(6400, 50, '230V', { shape: 'none' }, 230)).toBeLessThan(0.05);
	});

	it('an unmodulated 120 V, 60 Hz sine gives Pst < 0.05', () => {
		expect(pst10min(1920, 60, '120V', { shape: 'none' }, 120)).toBeLessThan(0.05);
	});

	it('steady harmonics without modulation (5 % h3, 6 % h5, 5 % h7, 3.5 % h11) give Pst < 0.05 (their beats fall on multiples of 2·f0)', () => {
		const r = measure(
			{
				sampleRateHz: 6400,
				rmsV: 230,
				durationS: 600,
				modulation: { shape: 'none' },
				harmonics: [
					{ order: 3, percent: 5 },
					{ order: 5, percent: 6 },
					{ order: 7, percent: 5 },
					{ order: 11, percent: 3.5 },
				],
			},
			50,
			'230V',
		);
		expect(r.pst[0].pst).toBeLessThan(0.05);
	});

	it('frequency steps without modulation (50 -> 51 -> 49 -> 50.5 Hz, phase-continuous) give Pst < 0.05', () => {
		const hz = (t: number) => (t < 150 ? 50 : t < 300 ? 51 : t < 450 ? 49 : 50.5);
		const r = measure(
			{ sampleRateHz: 3200, rmsV: 230, durationS: 600, modulation: { shape: 'none' }, mainsHz: hz },
			50,
			'230V',
		);
		expect(r.pst[0].pst).toBeLessThan(0.05);
	});

	it('a 60 Hz record measured with the 230 V lamp still meets the 230 V table (lamp and mains frequency are independent)', () => {
		const pst = pst10min(1920, 60, '230V', { shape: 'rectangular', changesPerMinute: 110, deltaVOverV: 0.00725 }, 230);
		expect(Math.abs(pst - 1)).toBeLessThanOrEqual(CLASS_F1);
	});
});
