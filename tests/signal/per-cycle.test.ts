import { describe, expect, it } from 'vitest';
import { findWholeCycles, perCycleFigures, type CycleWindow } from '../../lib/signal/index.js';
import { sineSamples } from '../helpers/synth.js';

// A 230 V (325 V peak) 50 Hz sine at 10 kS/s starting at phase 0: its cycle k spans samples 200k … 200(k+1)
// (crossings checked in cycles.test.ts). The window is found on this clean waveform (think: the voltage
// channel) and applied to a copy with one cycle changed (the current during an inrush), so the expected
// RMS of each cycle is the closed form A/√2 of its own amplitude.
const FS = 10_000;
const PEAK = 325;

function windowOf(x: Float64Array): CycleWindow {
	const w = findWholeCycles(x, FS);
	if (!w.ok) throw new Error(w.message);
	return w;
}

function scaleCycle(x: Float64Array, k: number, factor: number): void {
	for (let i = 200 * k; i < 200 * (k + 1); i++) x[i] *= factor;
}

describe('perCycleFigures', () => {
	it('perCycleFigures(sine with cycle 3 at 150 %) gives A/√2 for every cycle but 1.5·A/√2 for cycle 3, and names it worst', () => {
		const x = sineSamples({ amplitude: PEAK, frequencyHz: 50, sampleRateHz: FS, cycles: 10.5 });
		const w = windowOf(x);
		scaleCycle(x, 3, 1.5);
		const p = perCycleFigures(x, w);
		expect(p.rms.length).toBe(w.cycles);
		expect(Array.from(p.startIndex)).toEqual(Array.from(w.crossings.slice(0, w.cycles)));
		for (let k = 0; k < w.cycles; k++) {
			const a = k === 3 ? 1.5 * PEAK : PEAK;
			expect(p.rms[k]).toBeCloseTo(a / Math.SQRT2, 6);
			expect(p.peak[k]).toBeCloseTo(a, 9);
			expect(p.peakNegative[k]).toBeCloseTo(-a, 9);
		}
		expect(p.worstRmsCycle).toBe(3);
		expect(p.worstPeakCycle).toBe(3);
	});

	it('perCycleFigures tells the highest-RMS cycle from the highest-peak cycle (a one-sample spike vs a swollen cycle)', () => {
		const x = sineSamples({ amplitude: PEAK, frequencyHz: 50, sampleRateHz: FS, cycles: 10.5 });
		const w = windowOf(x);
		x[200 * 2 + 120] = -2 * PEAK; // spike in cycle 2: raises its mean square by at most (4A² − 0)/200 = A²/50
		scaleCycle(x, 6, 1.2); // swell in cycle 6: mean square 1.44·A²/2 = 0.72·A² > 0.5·A² + A²/50
		const p = perCycleFigures(x, w);
		expect(p.worstPeakCycle).toBe(2);
		expect(p.peakNegative[2]).toBe(-2 * PEAK);
		expect(p.worstRmsCycle).toBe(6);
		expect(p.rms[6]).toBeCloseTo((1.2 * PEAK) / Math.SQRT2, 6);
	});

	it('perCycleFigures makes a cycle holding a NaN sample NaN and never names it worst', () => {
		const x = sineSamples({ amplitude: PEAK, frequencyHz: 50, sampleRateHz: FS, cycles: 10.5 });
		const w = windowOf(x);
		x[200 * 4 + 50] = NaN;
		const p = perCycleFigures(x, w);
		expect(p.rms[4]).toBeNaN();
		expect(p.peak[4]).toBeNaN();
		expect(p.worstRmsCycle).not.toBe(4);
		expect(p.worstRmsCycle).toBeGreaterThanOrEqual(0);
	});

	it('perCycleFigures(window with no cycles) returns empty arrays and −1 for the worst cycles', () => {
		const empty: CycleWindow = {
			startIndex: 0,
			endIndex: 0,
			cycles: 0,
			frequencyHz: NaN,
			crossings: new Float64Array([0]),
		};
		const p = perCycleFigures(new Float64Array(10), empty);
		expect(p.rms.length).toBe(0);
		expect([p.worstRmsCycle, p.worstPeakCycle]).toEqual([-1, -1]);
	});

	it('perCycleFigures throws RangeError for a window that does not fit the record (wrong channel length)', () => {
		const x = sineSamples({ amplitude: PEAK, frequencyHz: 50, sampleRateHz: FS, cycles: 10.5 });
		const w = windowOf(x);
		expect(() => perCycleFigures(x.subarray(0, 500), w)).toThrow(RangeError);
	});

	it('perCycleFigures RMS of a sine at a fractional-cycle rate (7.8 kS/s, 156 samples/cycle) stays within 1e-4 of A/√2', () => {
		const x = sineSamples({ amplitude: PEAK, frequencyHz: 50, sampleRateHz: 7_800, cycles: 10.7, phaseDeg: 33 });
		const w = findWholeCycles(x, 7_800);
		if (!w.ok) throw new Error(w.message);
		const p = perCycleFigures(x, w);
		// one cycle, fractional ends: the trapezoid chord at each end errs by O(1/P²) of one sample's share
		for (const r of p.rms) expect(Math.abs(r / (PEAK / Math.SQRT2) - 1)).toBeLessThan(1e-4);
	});
});
