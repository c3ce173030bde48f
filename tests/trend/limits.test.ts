/** Bounds of the streaming trend analyser: refused before any sample is read, never a loop without end. */
import { describe, expect, it } from 'vitest';
import { createTrendAnalyser, TREND_MAX_CHANNELS, trendLimitProblem } from '../../lib/trend/index.js';
import { sineSamples } from '../helpers/synth.js';

const ch = (k: number) => ({ name: `U${k}`, quantity: 'voltage' as const, unit: 'V' });

describe('createTrendAnalyser bounds', () => {
	it('refuses a sample rate of 1e-300 Hz (its 10 s interval would be 0 samples long) with a RangeError naming the range', () => {
		expect(() => createTrendAnalyser({ sampleRateHz: 1e-300, channels: [ch(1)] })).toThrow(/sample rate from 288 Hz/);
		// a mean rate from time stamps that jump by 1e6 s: 10,000 samples over 1e6 s
		expect(() => createTrendAnalyser({ sampleRateHz: 9999 / 1e6, channels: [ch(1)] })).toThrow(RangeError);
		expect(() => createTrendAnalyser({ sampleRateHz: NaN, channels: [ch(1)] })).toThrow(RangeError);
		expect(() => createTrendAnalyser({ sampleRateHz: 1e12, channels: [ch(1)] })).toThrow(RangeError);
	});

	it('refuses 100,000 channels before allocating their ring buffers', () => {
		const channels = Array.from({ length: 100_000 }, (_, k) => ch(k));
		expect(() => createTrendAnalyser({ sampleRateHz: 10_000, channels })).toThrow(/channels/);
		expect(trendLimitProblem(10_000, TREND_MAX_CHANNELS + 1)?.what).toBe('channels');
		// 1024 channels at 1 MS/s would need 1024 × 2^20 samples × 8 bytes = 8 GiB of rings
		expect(trendLimitProblem(1e6, 1024)?.what).toBe('channels');
	});

	it('takes 400 channels at 10 kS/s and measures a 230 V sine on each (RMS = peak/sqrt 2, closed form)', () => {
		const fs = 10_000;
		const channels = Array.from({ length: 400 }, (_, k) => ch(k));
		const a = createTrendAnalyser({ sampleRateHz: fs, channels, nominalHz: 50, declaredV: 230, thd: false });
		const x = sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: 50, sampleRateHz: fs, cycles: 30 });
		a.push(channels.map(() => x));
		const r = a.finish();
		expect(r.cycles10.length).toBeGreaterThan(0);
		for (const v of r.cycles10[0].rms) expect(v).toBeCloseTo(230, 1);
	});

	it('a window of samples too large to square is reported with its channel and time', () => {
		const fs = 10_000;
		const a = createTrendAnalyser({ sampleRateHz: fs, channels: [ch(1)], nominalHz: 50, declaredV: 230, thd: false });
		a.push([new Float64Array(20_000).map((_, k) => (k % 2 === 0 ? 1e308 : -1e308))]);
		const r = a.finish();
		const d = r.diagnostics.find((x) => x.code === 'non-finite-samples');
		expect(d?.message).toMatch(/too large to square.*U1 at/);
	});
});
