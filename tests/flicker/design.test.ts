import { describe, expect, it } from 'vitest';
import {
	bilinear,
	biquadGain,
	butterworthLowPass,
	designFlickermeter,
	FLICKER_WEIGHTING,
	weightingSections,
	type FlickerLamp,
} from '../../lib/flicker/index.js';

/** |F(jω)| of the weighting filter straight from its s-domain formula (IEC 61000-4-15:2010, 5.4, from memory). */
function analogueWeighting(lamp: FlickerLamp, hz: number): number {
	const c = FLICKER_WEIGHTING[lamp];
	const t = 2 * Math.PI;
	const w = t * hz,
		w1 = t * c.f1Hz,
		w2 = t * c.f2Hz,
		w3 = t * c.f3Hz,
		w4 = t * c.f4Hz,
		l = t * c.lambdaHz;
	// K ω1 jω / (ω1² − ω² + j2λω) · (1 + jω/ω2) / ((1 + jω/ω3)(1 + jω/ω4))
	const bp = (c.k * w1 * w) / Math.hypot(w1 * w1 - w * w, 2 * l * w);
	return (bp * Math.hypot(1, w / w2)) / (Math.hypot(1, w / w3) * Math.hypot(1, w / w4));
}

describe('bilinear', () => {
	it('bilinear(first-order low-pass at 10 Hz, pre-warped) has gain 1/√2 at 10 Hz and 1 at DC (closed form)', () => {
		const w = 2 * Math.PI * 10;
		const q = bilinear([0, 0, w], [0, 1, w], 1000, 10);
		expect(q.b2).toBe(0);
		expect(q.a2).toBe(0);
		expect(biquadGain(q, 10, 1000)).toBeCloseTo(Math.SQRT1_2, 12);
		expect(biquadGain(q, 0, 1000)).toBeCloseTo(1, 12);
	});

	it('bilinear without pre-warping maps analogue ω to digital 2·atan(ω/(2 fs)) (frequency warping, closed form)', () => {
		const fs = 1000,
			w = 2 * Math.PI * 100;
		const q = bilinear([0, 0, w], [0, 1, w], fs);
		const digitalHz = (Math.atan(w / (2 * fs)) * fs) / Math.PI;
		expect(biquadGain(q, digitalHz, fs)).toBeCloseTo(Math.SQRT1_2, 12);
	});
});

describe('butterworthLowPass', () => {
	it('6th order at 35 Hz: −3 dB at 35 Hz, |H| = 1/√(1 + 2^12) at 70 Hz (Butterworth magnitude, closed form up to warping)', () => {
		const fs = 6400;
		const qs = butterworthLowPass(6, 35, fs);
		const gain = (f: number) => qs.reduce((g, q) => g * biquadGain(q, f, fs), 1);
		expect(gain(35)).toBeCloseTo(Math.SQRT1_2, 10);
		expect(gain(0)).toBeCloseTo(1, 12);
		// the bilinear transform warps 70 Hz slightly at 6400 S/s: 0.1 % on the ratio is enough to see the order
		expect(gain(70) * Math.sqrt(1 + 2 ** 12)).toBeCloseTo(1, 2);
	});

	it('rejects odd orders with a RangeError', () => {
		expect(() => butterworthLowPass(5, 35, 6400)).toThrow(RangeError);
	});
});

describe('weightingSections', () => {
	for (const lamp of ['230V', '120V'] as const) {
		it(`${lamp} lamp: the digital weighting filter equals the analogue formula within 0.2 % from 0.5 to 25 Hz at 1600 S/s (bilinear warping away from 8.8 Hz)`, () => {
			const [a, b] = weightingSections(lamp, 1600);
			for (const hz of [0.5, 1, 2, 5, 8.8, 12, 18, 25]) {
				const g = biquadGain(a, hz, 1600) * biquadGain(b, hz, 1600);
				expect(Math.abs(g / analogueWeighting(lamp, hz) - 1)).toBeLessThan(0.002);
			}
		});
	}

	it('230 V lamp: the weighting peaks near 8.8 Hz at unit gain (K normalises the peak; from memory)', () => {
		let best = 0,
			bestHz = 0;
		for (let hz = 5; hz <= 12; hz += 0.05) {
			const g = analogueWeighting('230V', hz);
			if (g > best) {
				best = g;
				bestHz = hz;
			}
		}
		expect(best).toBeCloseTo(1, 2);
		expect(Math.abs(bestHz - 8.8)).toBeLessThan(0.5);
	});
});

describe('designFlickermeter', () => {
	it('rejects a sample rate below 1600 S/s and a nominal frequency other than 50/60 Hz with RangeError', () => {
		expect(() => designFlickermeter({ sampleRateHz: 1000, nominalHz: 50 })).toThrow(RangeError);
		expect(() => designFlickermeter({ sampleRateHz: NaN, nominalHz: 50 })).toThrow(RangeError);
		expect(() => designFlickermeter({ sampleRateHz: 6400, nominalHz: 55 as 50 })).toThrow(RangeError);
	});

	it('picks the 230 V lamp for 50 Hz and the 120 V lamp for 60 Hz unless told', () => {
		expect(designFlickermeter({ sampleRateHz: 6400, nominalHz: 50 }).lamp).toBe('230V');
		expect(designFlickermeter({ sampleRateHz: 6400, nominalHz: 60 }).lamp).toBe('120V');
		expect(designFlickermeter({ sampleRateHz: 6400, nominalHz: 60, lamp: '230V' }).lamp).toBe('230V');
	});

	it('the Pinst scale is the closed form 2 / ((g·0.0025)² (1 + h)) of the band and smoothing gains at 8.8 Hz (analogue filters, 0.5 %)', () => {
		const d = designFlickermeter({ sampleRateHz: 6400, nominalHz: 50 });
		const w = 2 * Math.PI * 8.8;
		const hp = w / Math.hypot(w, 2 * Math.PI * 0.05);
		const lp = 1 / Math.sqrt(1 + (8.8 / 35) ** 12);
		const g = hp * lp * analogueWeighting('230V', 8.8);
		const h = 1 / Math.hypot(1, 2 * w * 0.3);
		expect(d.scale / (2 / ((g * 0.0025) ** 2 * (1 + h)))).toBeCloseTo(1, 2);
	});
});
