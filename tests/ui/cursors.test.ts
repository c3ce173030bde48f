/**
 * Two-cursor readings on closed-form signals: a 50 Hz sine sampled at 10 kS/s. The phase difference is
 * 360° · f · Δt wrapped to (−180°, 180°] (a quarter period = 90°, half = 180°).
 */
import { describe, expect, it } from 'vitest';
import { cursorReading, wrapDeg } from '../../src/ui/charts/cursors.js';

const FS = 10_000;
const u = Float64Array.from({ length: 2000 }, (_, k) => 325.27 * Math.sin((2 * Math.PI * 50 * k) / FS));

describe('cursorReading', () => {
	it('cursors 5 ms apart on a 50 Hz sine: Δt 5 ms, phase 90°, values 325.27 sin(2π·50·t)', () => {
		const r = cursorReading([u], { startS: 0, sampleRateHz: FS }, 10, 60, 50);
		expect(r.deltaS).toBeCloseTo(0.005, 12);
		expect(r.phaseDeg).toBeCloseTo(90, 9);
		expect(r.values[0].a).toBeCloseTo(325.27 * Math.sin(2 * Math.PI * 50 * 0.001), 9);
		expect(r.values[0].delta).toBeCloseTo(
			325.27 * (Math.sin(2 * Math.PI * 50 * 0.006) - Math.sin(2 * Math.PI * 50 * 0.001)),
			9,
		);
	});
	it('a time base starting before zero (the analysed stretch later in the file) shifts both times, not the difference', () => {
		const r = cursorReading([u], { startS: -0.5, sampleRateHz: FS }, 0, 100, 50);
		expect(r.aS).toBeCloseTo(-0.5, 12);
		expect(r.deltaS).toBeCloseTo(0.01, 12);
		expect(Math.abs(r.phaseDeg)).toBeCloseTo(180, 9);
	});
	it('no frequency: the phase is NaN', () => {
		expect(cursorReading([u], { startS: 0, sampleRateHz: FS }, 0, 1, NaN).phaseDeg).toBeNaN();
	});
});

describe('wrapDeg', () => {
	it('wraps to (−180, 180]: 270 → −90, −180 → 180, 540 → 180, 30 → 30', () => {
		expect(wrapDeg(270)).toBe(-90);
		expect(wrapDeg(-180)).toBe(180);
		expect(wrapDeg(540)).toBe(180);
		expect(wrapDeg(30)).toBe(30);
	});
});
