import { describe, expect, it } from 'vitest';
import {
	activePowerFromSamplesW,
	ieee1459FromComponents,
	loadCharacterFromAngle,
	powerWindowRms,
	powerPerOrder,
	powerWindowWeights,
	singlePhasePowerFromHarmonics,
	windowMean,
} from '../../lib/power/index.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';
import { setFromSineTones } from './harmonic-set.js';

const DEG = Math.PI / 180;

describe('singlePhasePowerFromHarmonics: closed-form linear loads (230 V, 50 Hz)', () => {
	const u = setFromSineTones([{ order: 1, rms: 230 }]);

	it('a pure resistance (10 A in phase) gives P = S = 2300 W, Q1 = 0, PF = DPF = 1', () => {
		const r = singlePhasePowerFromHarmonics(u, setFromSineTones([{ order: 1, rms: 10 }]));
		expect(r.activePowerW).toBeCloseTo(2300, 9);
		expect(r.apparentPowerVA).toBeCloseTo(2300, 9);
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(0, 9);
		expect(r.powerFactor).toBeCloseTo(1, 12);
		expect(r.displacementPowerFactor).toBeCloseTo(1, 12);
		expect(r.nonActivePowerVar).toBeCloseTo(0, 6);
		expect(loadCharacterFromAngle(r.theta1Deg).character).toBe('resistive');
	});

	it('a pure inductance (current lags 90°) gives P = 0, Q1 = +S, PF 0, inductive', () => {
		const r = singlePhasePowerFromHarmonics(u, setFromSineTones([{ order: 1, rms: 10, phaseDeg: -90 }]));
		expect(r.activePowerW).toBeCloseTo(0, 9);
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(2300, 9);
		expect(r.powerFactor).toBeCloseTo(0, 12);
		expect(r.theta1Deg).toBeCloseTo(90, 12);
		expect(loadCharacterFromAngle(r.theta1Deg).character).toBe('inductive');
	});

	it('a pure capacitance (current leads 90°) gives P = 0, Q1 = −S, capacitive', () => {
		const r = singlePhasePowerFromHarmonics(u, setFromSineTones([{ order: 1, rms: 10, phaseDeg: 90 }]));
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(-2300, 9);
		expect(r.theta1Deg).toBeCloseTo(-90, 12);
		expect(loadCharacterFromAngle(r.theta1Deg).character).toBe('capacitive');
	});

	it('an R-L load Z = 18.4 + j13.8 Ω (|Z| = 23 Ω, 3-4-5 triangle) draws 10 A at PF 0.8 lagging: P 1840 W, Q1 1380 var', () => {
		// closed form: I = 230/23 = 10 A, θ = atan(13.8/18.4) = atan(3/4), cos θ = 0.8
		const r = singlePhasePowerFromHarmonics(
			u,
			setFromSineTones([{ order: 1, rms: 10, phaseDeg: -Math.atan2(13.8, 18.4) / DEG }]),
		);
		expect(r.activePowerW).toBeCloseTo(1840, 9);
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(1380, 9);
		expect(r.powerFactor).toBeCloseTo(0.8, 12);
		expect(r.displacementPowerFactor).toBeCloseTo(0.8, 12);
		expect(r.thdCurrentPercent).toBeCloseTo(0, 9);
	});
});

describe('singlePhasePowerFromHarmonics: distorted current on a sine voltage', () => {
	it('PF = DPF · I1/I exactly, and PF < DPF (I1 = 10 A lag 30°, I3 = 4 A, I5 = 2 A)', () => {
		const u = setFromSineTones([{ order: 1, rms: 230 }], { maxOrder: 5 });
		const i = setFromSineTones([
			{ order: 1, rms: 10, phaseDeg: -30 },
			{ order: 3, rms: 4, phaseDeg: 17 },
			{ order: 5, rms: 2, phaseDeg: -141 },
		]);
		const r = singlePhasePowerFromHarmonics(u, i);
		const iRms = Math.sqrt(100 + 16 + 4);
		// closed form: only the fundamental carries P on a sine voltage: P = V·I1·cos θ1
		expect(r.activePowerW).toBeCloseTo(230 * 10 * Math.cos(30 * DEG), 9);
		expect(r.displacementPowerFactor).toBeCloseTo(Math.cos(30 * DEG), 12);
		expect(r.powerFactor).toBeCloseTo(Math.cos(30 * DEG) * (10 / iRms), 12);
		expect(r.powerFactor).toBeLessThan(r.displacementPowerFactor);
		expect(r.thdCurrentPercent).toBeCloseTo((100 * Math.sqrt(20)) / 10, 9);
		expect(r.voltageDistortionPowerVar).toBeCloseTo(0, 9);
		expect(r.harmonicActivePowerW).toBeCloseTo(0, 9);
	});
});

describe('ieee1459FromComponents: a hand-derived example (own closed form)', () => {
	// Hand example: v = 100 V fundamental + 10 V 3rd; i = 5 A lagging 60° + 1 A 3rd in phase with the 3rd voltage.
	// V = √10100, I = √26, P1 = 100·5·cos 60° = 250 W, P_H = 10·1 = 10 W, P = 260 W, Q1 = 500·sin 60° = 250√3 var,
	// S = √(10100·26) = √262600, S1 = 500, S_N = √(262600 − 250000) = √12600, D_I = 100·1 = 100, D_V = 10·5 = 50,
	// S_H = 10·1 = 10, D_H = √(10² − 10²) = 0, N = √(262600 − 260²) = √195000, THD_V = 10 %, THD_I = 20 %,
	// S_N/S1 = √(0.2² + 0.1² + 0.02²) = √0.0504.
	const r = ieee1459FromComponents({
		voltageRmsV: Math.sqrt(10100),
		currentRmsA: Math.sqrt(26),
		v1RmsV: 100,
		i1RmsA: 5,
		theta1Deg: 60,
		activePowerW: 260,
	});

	it('gives each quantity its closed-form value', () => {
		expect(r.fundamentalActivePowerW).toBeCloseTo(250, 9);
		expect(r.harmonicActivePowerW).toBeCloseTo(10, 9);
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(250 * Math.sqrt(3), 9);
		expect(r.apparentPowerVA).toBeCloseTo(Math.sqrt(262600), 9);
		expect(r.fundamentalApparentPowerVA).toBeCloseTo(500, 9);
		expect(r.nonFundamentalApparentPowerVA).toBeCloseTo(Math.sqrt(12600), 9);
		expect(r.currentDistortionPowerVar).toBeCloseTo(100, 9);
		expect(r.voltageDistortionPowerVar).toBeCloseTo(50, 9);
		expect(r.harmonicApparentPowerVA).toBeCloseTo(10, 9);
		expect(r.harmonicDistortionPowerVar).toBeCloseTo(0, 5);
		expect(r.nonActivePowerVar).toBeCloseTo(Math.sqrt(195000), 9);
		expect(r.powerFactor).toBeCloseTo(260 / Math.sqrt(262600), 12);
		expect(r.displacementPowerFactor).toBeCloseTo(0.5, 12);
		expect(r.thdVoltagePercent).toBeCloseTo(10, 9);
		expect(r.thdCurrentPercent).toBeCloseTo(20, 9);
		expect(r.harmonicPollutionRatio).toBeCloseTo(Math.sqrt(0.0504), 12);
	});

	it('satisfies S_N² = D_I² + D_V² + S_H² (IEEE 1459 decomposition, invariant)', () => {
		expect(r.nonFundamentalApparentPowerVA ** 2).toBeCloseTo(
			r.currentDistortionPowerVar ** 2 + r.voltageDistortionPowerVar ** 2 + r.harmonicApparentPowerVA ** 2,
			6,
		);
	});
});

describe('single-phase worked example of docs/methods.md §5.3 [COMPUTED by reference-vectors.py, not a published example]', () => {
	// v: V1 = 230, V3 = 6.9, V5 = 11.5 V at 0°; i: I1 = 10 A lag 30°, I3 = 3 A with θ3 = −60°, I5 = 2 A lag 45° (sine reference)
	const vTones = [
		{ order: 1, rms: 230 },
		{ order: 3, rms: 6.9 },
		{ order: 5, rms: 11.5 },
	];
	const iTones = [
		{ order: 1, rms: 10, phaseDeg: -30 },
		{ order: 3, rms: 3, phaseDeg: 60 },
		{ order: 5, rms: 2, phaseDeg: -45 },
	];
	const expected = {
		voltageRmsV: 230.390668,
		currentRmsA: 10.630146,
		activePowerW: 2018.471885,
		fundamentalActivePowerW: 1991.858429,
		harmonicActivePowerW: 26.613456,
		fundamentalReactivePowerVar: 1150,
		apparentPowerVA: 2449.086397,
		fundamentalApparentPowerVA: 2300,
		nonFundamentalApparentPowerVA: 841.441727,
		currentDistortionPowerVar: 829.276793,
		voltageDistortionPowerVar: 134.111894,
		harmonicApparentPowerVA: 48.354731,
		harmonicDistortionPowerVar: 40.372069,
		nonActivePowerVar: 1387.009528,
		thdVoltagePercent: 5.830952,
		thdCurrentPercent: 36.055513,
		powerFactor: 0.824173,
		displacementPowerFactor: 0.866025,
		harmonicPollutionRatio: 0.365844,
	};

	it('from harmonic sets reproduces every printed value to 1e-6 (relative)', () => {
		const r = singlePhasePowerFromHarmonics(setFromSineTones(vTones), setFromSineTones(iTones));
		for (const [k, v] of Object.entries(expected))
			expect(r[k as keyof typeof r] as number, k).toBeCloseTo(v, Math.max(0, 5 - Math.ceil(Math.log10(Math.abs(v)))));
	});

	it('with P, V and I from samples (fs 12.8 kHz, 10 cycles) reproduces P = 2018.4719 W and PF = 0.824173', () => {
		const opts = { frequencyHz: 50, sampleRateHz: 12_800, samples: 2561 };
		const v = harmonicSamples(vTones, opts);
		const i = harmonicSamples(iTones, opts);
		const window = { startIndex: 0, endIndex: 2560, cycles: 10 };
		const p = activePowerFromSamplesW(v, i, window);
		expect(p).toBeCloseTo(2018.471885, 5);
		const r = singlePhasePowerFromHarmonics(setFromSineTones(vTones), setFromSineTones(iTones), {
			activePowerW: p,
			voltageRmsV: powerWindowRms(v, window),
			currentRmsA: powerWindowRms(i, window),
		});
		expect(r.powerFactor).toBeCloseTo(0.824173, 6);
		expect(r.nonActivePowerVar).toBeCloseTo(1387.009528, 4);
	});
});

describe('activePowerFromSamplesW', () => {
	it('over a fractional whole-cycle window (49.95 Hz, fs 10 kHz) equals V·I·cos θ to 1e-6 relative', () => {
		const f = 49.95;
		const fs = 10_000;
		const v = sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: f, sampleRateHz: fs, samples: 2500 });
		const i = sineSamples({
			amplitude: 10 * Math.SQRT2,
			frequencyHz: f,
			sampleRateHz: fs,
			samples: 2500,
			phaseDeg: -40,
		});
		// rising zero crossings of v are at n = k·fs/f (closed form); the window is 10 of them
		const p = activePowerFromSamplesW(v, i, { startIndex: fs / f, endIndex: (11 * fs) / f, cycles: 10 });
		expect(p / (2300 * Math.cos(40 * DEG))).toBeCloseTo(1, 6);
	});

	it('throws RangeError for a window outside the samples or unequal lengths', () => {
		const x = new Float64Array(100);
		expect(() => activePowerFromSamplesW(x, x, { startIndex: 0, endIndex: 100.5, cycles: 1 })).toThrow(RangeError);
		expect(() => activePowerFromSamplesW(x, new Float64Array(99), { startIndex: 0, endIndex: 50, cycles: 1 })).toThrow(
			RangeError,
		);
	});

	it('returns NaN when a sample in the window is NaN', () => {
		const x = new Float64Array(100).fill(1);
		x[10] = NaN;
		expect(activePowerFromSamplesW(x, x, { startIndex: 0, endIndex: 50, cycles: 1 })).toBeNaN();
	});
});

describe('ieee1459FromComponents edge cases', () => {
	it('no current at all gives P1 = Q1 = 0 and NaN ratios (PF, DPF, THD_I)', () => {
		const r = ieee1459FromComponents({
			voltageRmsV: 230,
			currentRmsA: 0,
			v1RmsV: 230,
			i1RmsA: 0,
			theta1Deg: NaN,
			activePowerW: 0,
		});
		expect(r.fundamentalActivePowerW).toBe(0);
		expect(r.fundamentalReactivePowerVar).toBe(0);
		expect(r.powerFactor).toBeNaN();
		expect(r.displacementPowerFactor).toBeNaN();
		expect(r.thdCurrentPercent).toBeNaN();
	});

	it('P ≤ S for any example (invariant)', () => {
		const r = singlePhasePowerFromHarmonics(
			setFromSineTones([
				{ order: 1, rms: 230 },
				{ order: 7, rms: 9 },
			]),
			setFromSineTones([
				{ order: 1, rms: 3, phaseDeg: -70 },
				{ order: 7, rms: 2, phaseDeg: 5 },
			]),
		);
		expect(Math.abs(r.activePowerW)).toBeLessThanOrEqual(r.apparentPowerVA);
	});
});

describe('windowMean and powerWindowWeights (trapezoid rule with fractional ends)', () => {
	const cases: [number, number][] = [
		[0, 10],
		[0.3, 7.8],
		[2.25, 2.75],
		[1.5, 9],
		[3, 3.4],
	];
	it.each(cases)(
		'the mean of f(n) = n over [%d, %d] is the midpoint (exact for a linear integrand, closed form)',
		(s, e) => {
			expect(windowMean((n) => n, s, e)).toBeCloseTo((s + e) / 2, 12);
			const { firstIndex, weights } = powerWindowWeights(s, e);
			let m = 0;
			let sum = 0;
			weights.forEach((w, j) => ((m += w * (firstIndex + j)), (sum += w)));
			expect(sum).toBeCloseTo(1, 14);
			expect(m).toBeCloseTo((s + e) / 2, 12);
		},
	);
});

describe('powerPerOrder', () => {
	it('splits docs/methods.md §5.3 into P3 = 6.9·3·cos 60° = 10.35 W and P5 = 11.5·2·cos 45° W, summing to P_H = 26.6135 W (computed by docs/check-vectors.py)', () => {
		const u = setFromSineTones([
			{ order: 1, rms: 230 },
			{ order: 3, rms: 6.9 },
			{ order: 5, rms: 11.5 },
		]);
		const i = setFromSineTones([
			{ order: 1, rms: 10, phaseDeg: -30 },
			{ order: 3, rms: 3, phaseDeg: 60 },
			{ order: 5, rms: 2, phaseDeg: -45 },
		]);
		const per = powerPerOrder(u, i);
		expect(per[1].reactiveVar).toBeCloseTo(1150, 9);
		expect(per[3].activeW).toBeCloseTo(10.35, 9);
		expect(per[3].reactiveVar).toBeCloseTo(-20.7 * Math.sin(60 * DEG), 9);
		expect(per[3].thetaDeg).toBeCloseTo(-60, 9);
		expect(per[5].activeW).toBeCloseTo(23 * Math.cos(45 * DEG), 9);
		expect(per[3].activeW + per[5].activeW).toBeCloseTo(26.613456, 5);
		expect(per[2].thetaDeg).toBeNaN();
	});
});
