/**
 * PowerWindowSums: each channel's window RMS and each pair's mean product worked out once, with the values
 * of lib/power's functions, checked against closed forms of whole sine cycles.
 */
import { describe, expect, it } from 'vitest';
import { PowerWindowSums } from '../../lib/report/window-sums.js';
import { sineSamples } from '../helpers/synth.js';

const FS = 10_000;
const CYCLES = 10;
/** 10 whole 50 Hz cycles at 10 kS/s: samples 0 to 2000. */
const WINDOW = { startIndex: 0, endIndex: 2000, cycles: CYCLES };

describe('PowerWindowSums', () => {
	const v = sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: 50, sampleRateHz: FS, cycles: CYCLES });
	const i = sineSamples({
		amplitude: 10 * Math.SQRT2,
		frequencyHz: 50,
		sampleRateHz: FS,
		cycles: CYCLES,
		phaseDeg: -30,
	});

	it('gives the RMS of whole sine cycles, amplitude/√2 (closed form), for each array apart', () => {
		const sums = new PowerWindowSums(WINDOW);
		expect(sums.rms(v)).toBeCloseTo(230, 9);
		expect(sums.rms(i)).toBeCloseTo(10, 9);
		expect(sums.rms(v)).toBeCloseTo(230, 9);
	});

	it('gives P = V·I·cos 30° = 1991.86 W for 230 V, 10 A lagging 30° (IEEE 1459 closed form), per ordered pair', () => {
		const sums = new PowerWindowSums(WINDOW);
		const p = 230 * 10 * Math.cos(Math.PI / 6);
		expect(sums.activePowerW(v, i)).toBeCloseTo(p, 6);
		expect(sums.activePowerW(v, v)).toBeCloseTo(230 * 230, 6);
		expect(sums.activePowerW(v, i)).toBeCloseTo(p, 6);
	});
});
