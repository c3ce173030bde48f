/**
 * A record that holds exactly k cycles is analysed as k whole cycles: each sample stands for the interval
 * [n/fs, (n+1)/fs), so N samples cover N/fs seconds (common practice for sampled records). A scope at
 * 20 ms/div x 10 div exports exactly this: 200 ms, the IEC 61000-4-7 10-cycle window at 50 Hz.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { harmonicSamples } from '../helpers/synth.js';
import { captureOf } from '../helpers/capture.js';

function oneChannel(samples: Float64Array, sampleRateHz: number): Capture {
	return captureOf([{ name: 'U1', unit: 'V', quantity: 'voltage', samples }], sampleRateHz, 'ten-cycles.csv');
}

describe('analyseCapture on a record of exactly 10 cycles', () => {
	// 230 V rms fundamental + 11.5 V rms 5th (5 % of the fundamental), starting at a rising zero crossing.
	const tones = [
		{ order: 1, rms: 230 },
		{ order: 5, rms: 11.5 },
	];

	it('analyseCapture(10 cycles at 10 kS/s) uses all 10 cycles; RMS = √(230² + 11.5²) (closed form), THD = 5 % (11.5/230)', () => {
		const x = harmonicSamples(tones, { frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 });
		expect(x.length).toBe(2000);
		const r = analyseCapture(oneChannel(x, 10_000));
		expect(r.cyclesAnalysed).toBe(10);
		expect(r.channels[0].rms).toBeCloseTo(Math.hypot(230, 11.5), 6);
		expect(r.channels[0].thdPercent).toBeCloseTo(5, 4);
	});

	it('analyseCapture(10 cycles at 7.68 kS/s, 153.6 samples a cycle) uses all 10 cycles with the same figures (closed form)', () => {
		const x = harmonicSamples(tones, { frequencyHz: 50, sampleRateHz: 7_680, cycles: 10 });
		expect(x.length).toBe(1536);
		const r = analyseCapture(oneChannel(x, 7_680));
		expect(r.cyclesAnalysed).toBe(10);
		expect(r.channels[0].rms).toBeCloseTo(Math.hypot(230, 11.5), 3);
		expect(r.channels[0].thdPercent).toBeCloseTo(5, 2);
	});
});
