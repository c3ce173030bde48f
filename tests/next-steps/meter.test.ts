/**
 * Will a meter read the waveform right: band-limited true RMS and crest factor at the range used.
 * Expected values from closed forms (Fourier series of a square wave) and hand computations.
 */
import { describe, expect, it } from 'vitest';
import {
	averageRespondingRms,
	bandLimitedRms,
	crestFactorAvailable,
	meterReading,
	type MeterChannelFigures,
} from '../../lib/next-steps/meter.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

// Square wave of amplitude A: odd order h has RMS (4A/π)/(h√2); its true RMS is A (Fourier series, closed form).
const A = 100;
const square = Array.from({ length: 50 }, (_, h) => (h % 2 === 1 ? (4 * A) / (Math.PI * h * Math.SQRT2) : 0));
// sin(hθ) = cos(hθ − 90°): every odd order at −90° (cosine reference); NaN where the order is 0, as the report gives it
const squarePhase = square.map((x) => (x > 0 ? -90 : NaN));

function channel(over: Partial<MeterChannelFigures> = {}): MeterChannelFigures {
	return {
		channel: 'I1',
		unit: 'A',
		quantity: 'current',
		acRms: A,
		crestFactor: 1,
		fundamentalHz: 50,
		rmsByOrder: square,
		phaseDegByOrder: squarePhase,
		averageReading: 111.07,
		averageErrorPercent: 11.07,
		...over,
	};
}

describe('bandLimitedRms', () => {
	it('bandLimitedRms of 230 V + 4.6 V 3rd + 11.5 V 5th + 6.9 V 7th: 200 Hz passes h1 and h3 only, √(230² + 4.6²) = 230.046 V; 400 Hz passes all, 230.43659 V (RMS of a sum of harmonics; the 230.43659 V check value)', () => {
		const x = [0, 230, 0, 4.6, 0, 11.5, 0, 6.9];
		expect(bandLimitedRms(x, 50, 200)).toBeCloseTo(Math.hypot(230, 4.6), 9);
		expect(bandLimitedRms(x, 50, 400)).toBeCloseTo(230.43659, 4);
	});

	it('bandLimitedRms of a square wave through 350 Hz at 50 Hz (orders 1-7) = A·√(8/π² · (1 + 1/9 + 1/25 + 1/49)) = 0.97447 A: 2.55 % low (Fourier series)', () => {
		const expected = A * Math.sqrt((8 / Math.PI ** 2) * (1 + 1 / 9 + 1 / 25 + 1 / 49));
		expect(bandLimitedRms(square, 50, 350)).toBeCloseTo(expected, 9);
		expect(expected / A).toBeCloseTo(0.97447, 5);
	});

	it('crestFactorAvailable(3, 600 V range, 230 V reading) = 3 · 600/230 = 7.83 (meter crest-factor rating at full scale, common practice)', () => {
		expect(crestFactorAvailable(3, 600, 230)).toBeCloseTo(7.826, 3);
	});
});

describe('averageRespondingRms', () => {
	it('averageRespondingRms of 230 V + 46 V 3rd in phase (sin θ + 0.2 sin 3θ) = 230 + 46/3 = 245.33 V: mean |x| over a half cycle is (2/π)(a1 + a3/3) (closed form), times π/(2√2)', () => {
		expect(averageRespondingRms([0, 230, 0, 46], [0, -90, NaN, -90], 50, 1e6)).toBeCloseTo(230 + 46 / 3, 3);
	});

	it('averageRespondingRms of a pure sine reads its RMS (sine calibration), and a 100 Hz bandwidth drops the 150 Hz 3rd', () => {
		expect(averageRespondingRms([0, 230], [0, 17], 50, 1e6)).toBeCloseTo(230, 4);
		expect(averageRespondingRms([0, 230, 0, 46], [0, -90, NaN, -90], 50, 100)).toBeCloseTo(230, 4);
	});

	it("averageRespondingRms of a square wave's partial sum to order 49 = (π/(2√2)) · (8/π²) Σ_{odd h ≤ 49} 1/h² · A (mean of the partial sum over the half cycle where it is positive, ∫ sin hθ = 2/h; closed form)", () => {
		let s = 0;
		for (let h = 1; h <= 49; h += 2) s += 1 / (h * h);
		expect(averageRespondingRms(square, squarePhase, 50, 1e6) / A).toBeCloseTo(
			(Math.PI / (2 * Math.SQRT2)) * (8 / Math.PI ** 2) * s,
			5,
		);
	});
});

describe('meterReading step', () => {
	it('meterReading with an average-responding meter reports its in-band reading: 245.33 V for 230 V + 46 V 3rd in phase, 4.4 % high against √(230² + 46²) = 234.55 V', () => {
		const v = {
			channel: 'U1',
			unit: 'V',
			quantity: 'voltage' as const,
			acRms: Math.hypot(230, 46),
			crestFactor: 1.3,
			fundamentalHz: 50,
			rmsByOrder: [0, 230, 0, 46],
			phaseDegByOrder: [0, -90, NaN, -90],
			averageReading: 245.33,
			averageErrorPercent: 4.6,
		};
		const s = meterReading([v], { meterBandwidthHz: 1000, meterCrestFactor: 3, meterResponse: 'average' });
		expect(s.status).toBe('result');
		const r = s.result!.channels[0];
		expect(r.inBandReading).toBeCloseTo(230 + 46 / 3, 2);
		expect(r.bandErrorPercent).toBeCloseTo(100 * ((230 + 46 / 3) / Math.hypot(230, 46) - 1), 2);
		expect(s.conclusions[0]).toMatch(/average-responding 1000 Hz meter reads about 245\.33 V, 4\.6 % high/);
	});

	it('meterReading without the meter response gives both readings and asks which it is (partial)', () => {
		const s = meterReading([channel()], { meterBandwidthHz: 350, meterCrestFactor: 3 });
		expect(s.status).toBe('partial');
		expect(s.needs.join(' ')).toMatch(/true-RMS or average-responding/);
		expect(
			s.conclusions.filter((c) => c.startsWith('I1: a true-RMS') || c.startsWith('I1: an average-responding')),
		).toHaveLength(2);
	});

	it('meterReading of a square wave on a 350 Hz meter reads 2.55 % low and says so', () => {
		const s = meterReading([channel()], { meterBandwidthHz: 350, meterCrestFactor: 3, meterResponse: 'true-rms' });
		expect(s.status).toBe('result');
		const r = s.result!.channels[0];
		expect(r.bandErrorPercent).toBeCloseTo(100 * (0.974472 - 1), 2);
		expect(s.conclusions.join(' ')).toMatch(/2\.6 % low/);
		expect(r.crestFactorWithin).toBe(true);
	});

	it('meterReading: crest factor 4 above a rated 3 asks for the range; on a range of 2× the reading (CF 6 available) it is within, on 1.2× (3.6) it is not', () => {
		const spiky = channel({ crestFactor: 4 });
		const unknown = meterReading([spiky], { meterCrestFactor: 3 });
		expect(unknown.result!.channels[0].crestFactorWithin).toBeNull();
		expect(unknown.needs.join(' ')).toMatch(/current range used/);
		expect(meterReading([spiky], { meterCrestFactor: 3, meterRangeA: 200 }).result!.channels[0]).toMatchObject({
			crestFactorWithin: true,
		});
		const tight = meterReading([spiky], { meterCrestFactor: 3, meterRangeA: 120 }).result!.channels[0];
		expect(tight.crestFactorAvailable).toBeCloseTo(3.6, 10);
		expect(tight.crestFactorWithin).toBe(false);
	});

	it('meterReading without meter figures asks for them: needs-input, no result, the caution', () => {
		const s = meterReading([channel()], {});
		expect(s.status).toBe('needs-input');
		expect(s.result).toBeNull();
		expect(s.needs).toEqual(["the meter's bandwidth (Hz)", "the meter's rated crest factor"]);
		expect(s.inputs.find((i) => i.name === 'how the meter responds')!.value).toBeNull();
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
	});
});
