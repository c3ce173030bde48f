import { describe, expect, it } from 'vitest';
import {
	describePhaseLag,
	fundamentalLagDeg,
	harmonicLagsDeg,
	loadCharacterFromAngle,
	phaseLagDeg,
	RESISTIVE_BAND_DEG,
	wrapAngleDeg,
} from '../../lib/power/index.js';
import { setFromSineTones } from './harmonic-set.js';

describe('phaseLagDeg', () => {
	it('phaseLagDeg(ref, other) is positive when other lags (current at −32° behind voltage at 0°)', () => {
		expect(phaseLagDeg(0, -32)).toBe(32);
		expect(phaseLagDeg(-32, 0)).toBe(-32);
	});

	it('phaseLagDeg wraps into (−180, 180]: 170° − (−170°) is −20°, and exactly 180° stays +180°', () => {
		expect(phaseLagDeg(170, -170)).toBeCloseTo(-20, 12);
		expect(phaseLagDeg(90, -90)).toBe(180);
		expect(phaseLagDeg(-90, 90)).toBe(180);
	});

	it('phaseLagDeg returns NaN when a phase is NaN (zero component)', () => {
		expect(phaseLagDeg(NaN, 3)).toBeNaN();
	});

	it('wrapAngleDeg maps −180 to 180 and 540 to 180 (range is (−180, 180])', () => {
		expect(wrapAngleDeg(-180)).toBe(180);
		expect(wrapAngleDeg(540)).toBe(180);
		expect(wrapAngleDeg(-190)).toBe(170);
	});
});

describe('fundamentalLagDeg and harmonicLagsDeg', () => {
	const u = setFromSineTones(
		[
			{ order: 1, rms: 230 },
			{ order: 3, rms: 5, phaseDeg: 10 },
		],
		{ maxOrder: 5 },
	);
	const i = setFromSineTones(
		[
			{ order: 1, rms: 10, phaseDeg: -32 },
			{ order: 3, rms: 3, phaseDeg: 70 },
			{ order: 5, rms: 1 },
		],
		{ maxOrder: 5 },
	);

	it('fundamentalLagDeg(u, i) is the lag of the fundamental current (32°, closed form)', () => {
		expect(fundamentalLagDeg(u, i)).toBeCloseTo(32, 12);
	});

	it('harmonicLagsDeg gives each order in its own degrees, NaN where one side has no component', () => {
		const lags = harmonicLagsDeg(u, i);
		expect(lags.map((l) => l.order)).toEqual([1, 2, 3, 4, 5]);
		expect(lags[2].lagDeg).toBeCloseTo(10 - 70, 12);
		expect(lags[1].lagDeg).toBeNaN();
		expect(lags[4].lagDeg).toBeNaN();
	});

	it('throws RangeError for sets from different windows', () => {
		expect(() => fundamentalLagDeg(u, { ...i, startS: 0.02 })).toThrow(RangeError);
	});
});

describe('describePhaseLag', () => {
	it('says "I1 lags U1 by 32.0 deg" for +32°', () => {
		expect(describePhaseLag('U1', 'I1', 32)).toBe('I1 lags U1 by 32.0 deg');
	});
	it('says "leads" for a negative lag', () => {
		expect(describePhaseLag('U1', 'I1', -12.34)).toBe('I1 leads U1 by 12.3 deg');
	});
	it('says "is in phase with" within the tolerance (default 1°) and not outside it', () => {
		expect(describePhaseLag('U1', 'I1', 0.9)).toBe('I1 is in phase with U1');
		expect(describePhaseLag('U1', 'I1', -1.2)).toBe('I1 leads U1 by 1.2 deg');
		expect(describePhaseLag('U1', 'I1', 2.5, 3)).toBe('I1 is in phase with U1');
	});
	it('says "is in antiphase with" near 180° (a reversed clamp)', () => {
		expect(describePhaseLag('U1', 'I1', -179.5)).toBe('I1 is in antiphase with U1');
	});
	it('says the angle is undefined for NaN', () => {
		expect(describePhaseLag('U1', 'I1', NaN)).toMatch(/undefined/);
	});
});

describe('loadCharacterFromAngle', () => {
	it(`calls |θ1| ≤ ${RESISTIVE_BAND_DEG}° resistive, just outside inductive or capacitive`, () => {
		expect(loadCharacterFromAngle(RESISTIVE_BAND_DEG).character).toBe('resistive');
		expect(loadCharacterFromAngle(RESISTIVE_BAND_DEG + 0.01).character).toBe('inductive');
		expect(loadCharacterFromAngle(-RESISTIVE_BAND_DEG - 0.01).character).toBe('capacitive');
	});
	it('states angle, displacement PF and band in its sentence (36.87° → PF 0.800)', () => {
		const s = loadCharacterFromAngle(36.87).sentence;
		expect(s).toContain('inductive');
		expect(s).toContain('36.9 deg');
		expect(s).toContain('0.800');
		expect(s).toContain('±3.0 deg');
	});
	it('flags reverse flow beyond 90° and keeps the reactive sense (θ1 = 150°: Q1 > 0, inductive, P1 < 0)', () => {
		const r = loadCharacterFromAngle(150);
		expect(r.reverseFlow).toBe(true);
		expect(r.character).toBe('inductive');
		expect(loadCharacterFromAngle(179).character).toBe('resistive');
	});
	it('is undetermined for NaN and rejects a bad band', () => {
		expect(loadCharacterFromAngle(NaN).character).toBe('undetermined');
		expect(() => loadCharacterFromAngle(10, -1)).toThrow(RangeError);
	});
});
