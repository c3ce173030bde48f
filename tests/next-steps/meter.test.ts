/**
 * Will a meter read the waveform right: band-limited true RMS and crest factor at the range used.
 * Expected values from closed forms (Fourier series of a square wave) and hand computations.
 */
import { describe, expect, it } from 'vitest';
import { bandLimitedRms, crestFactorAvailable, meterReading, type MeterChannelFigures } from '../../lib/next-steps/meter.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

// Square wave of amplitude A: odd order h has RMS (4A/π)/(h√2); its true RMS is A (Fourier series, closed form).
const A = 100;
const square = Array.from({ length: 50 }, (_, h) => (h % 2 === 1 ? (4 * A) / (Math.PI * h * Math.SQRT2) : 0));

function channel(over: Partial<MeterChannelFigures> = {}): MeterChannelFigures {
	return { channel: 'I1', unit: 'A', quantity: 'current', acRms: A, crestFactor: 1, fundamentalHz: 50, rmsByOrder: square, averageReading: 111.07, averageErrorPercent: 11.07, ...over };
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

describe('meterReading step', () => {
	it('meterReading of a square wave on a 350 Hz meter reads 2.55 % low and says so', () => {
		const s = meterReading([channel()], { meterBandwidthHz: 350, meterCrestFactor: 3 });
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
		expect(meterReading([spiky], { meterCrestFactor: 3, meterRangeA: 200 }).result!.channels[0]).toMatchObject({ crestFactorWithin: true });
		const tight = meterReading([spiky], { meterCrestFactor: 3, meterRangeA: 120 }).result!.channels[0];
		expect(tight.crestFactorAvailable).toBeCloseTo(3.6, 10);
		expect(tight.crestFactorWithin).toBe(false);
	});

	it('meterReading without meter figures asks for them: needs-input, no result, the caution', () => {
		const s = meterReading([channel()], {});
		expect(s.status).toBe('needs-input');
		expect(s.result).toBeNull();
		expect(s.needs).toEqual(["the meter's bandwidth (Hz)", "the meter's rated crest factor"]);
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
	});
});
