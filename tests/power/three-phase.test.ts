import { describe, expect, it } from 'vitest';
import {
	ieee1459ThreePhaseFromComponents,
	phasorAbs,
	phasorFromPolarDeg,
	phasorSub,
	threePhasePowerFromHarmonics,
	type ComplexPhasor,
	type ThreePhaseInputPhase,
} from '../../lib/power/index.js';
import { setFromSineTones } from './harmonic-set.js';

const P = phasorFromPolarDeg;
type Three<T> = [T, T, T];

function fundamentalOnly(v: Three<ComplexPhasor>, i: Three<ComplexPhasor>, wiring: '4-wire' | '3-wire') {
	const ll = [phasorSub(v[0], v[1]), phasorSub(v[1], v[2]), phasorSub(v[2], v[0])].map(phasorAbs) as Three<number>;
	const inMag = phasorAbs({ re: i[0].re + i[1].re + i[2].re, im: i[0].im + i[1].im + i[2].im });
	const p = [0, 1, 2].map((k) => v[k].re * i[k].re + v[k].im * i[k].im) as Three<number>;
	return ieee1459ThreePhaseFromComponents({
		wiring,
		voltageRmsV: v.map(phasorAbs) as Three<number>,
		currentRmsA: i.map(phasorAbs) as Three<number>,
		lineVoltageRmsV: ll,
		neutralCurrentRmsA: inMag,
		v1: v,
		i1: i,
		activePowerW: p,
	});
}

describe('ieee1459ThreePhaseFromComponents: three-phase example of docs/methods.md §5.4 [COMPUTED by reference-vectors.py, not published]', () => {
	const v: Three<ComplexPhasor> = [P(230, 0), P(220, -118), P(235, 121)];
	const i: Three<ComplexPhasor> = [P(10, -30), P(12, -150), P(8, 90)];
	const r = fundamentalOnly(v, i, '4-wire');

	it('gives Ve 228.4083 V, Ie 10.3280 A, Se 7076.97 VA, PF 0.82552 (4-wire, ρ = ξ = 1)', () => {
		expect(r.effectiveVoltageV).toBeCloseTo(228.4083, 4);
		expect(r.effectiveCurrentA).toBeCloseTo(10.328, 4);
		expect(r.effectiveApparentPowerVA).toBeCloseTo(7076.97, 2);
		expect(r.effectivePowerFactor).toBeCloseTo(0.82552, 5);
	});

	it('gives P 5842.180 W, ΣQ1 3517.258 var, S_A 6820.000 VA, S_V 6819.250 VA', () => {
		expect(r.activePowerW).toBeCloseTo(5842.18, 3);
		expect(r.fundamentalReactivePowerVar).toBeCloseTo(3517.258, 3);
		expect(r.arithmeticApparentPowerVA).toBeCloseTo(6820, 3);
		expect(r.vectorApparentPowerVA).toBeCloseTo(6819.25, 3);
	});

	it('gives S1+ 6849.315 VA, P1+ 5871.907 W, Q1+ 3526.162 var, S_U1 1780.565 VA', () => {
		expect(r.positiveSequenceApparentPowerVA).toBeCloseTo(6849.315, 3);
		expect(r.positiveSequenceActivePowerW).toBeCloseTo(5871.907, 3);
		expect(r.positiveSequenceReactivePowerVar).toBeCloseTo(3526.162, 3);
		expect(r.fundamentalUnbalancePowerVA).toBeCloseTo(1780.565, 3);
	});

	it('fundamental only: Se1 = Se, no harmonic terms (invariant)', () => {
		expect(r.effectiveApparentPower1VA).toBeCloseTo(r.effectiveApparentPowerVA, 9);
		expect(r.effectiveNonFundamentalApparentPowerVA).toBeCloseTo(0, 3);
		expect(r.thdEffectiveCurrentPercent).toBeCloseTo(0, 6);
	});

	it('3-wire formula gives Ve = √(ΣV_LL²/9) = 228.3981 V', () => {
		expect(fundamentalOnly(v, i, '3-wire').effectiveVoltageV).toBeCloseTo(228.3981, 4);
	});
});

describe('ieee1459ThreePhaseFromComponents: balanced closed form', () => {
	// 230 V star, 10 A per phase lagging 36.87° (PF 0.8): P = 3·2300·0.8 = 5520 W, Q = 4140 var, Se = 6900 VA
	const th = (Math.atan2(3, 4) * 180) / Math.PI;
	const r = fundamentalOnly(
		[P(230, 0), P(230, -120), P(230, 120)],
		[P(10, -th), P(10, -120 - th), P(10, 120 - th)],
		'4-wire',
	);
	it('gives Ve = V, Ie = I, Se = S1+ = 6900 VA, PFe = PF1+ = 0.8, S_U1 = 0', () => {
		expect(r.effectiveVoltageV).toBeCloseTo(230, 9);
		expect(r.effectiveCurrentA).toBeCloseTo(10, 9);
		expect(r.effectiveApparentPowerVA).toBeCloseTo(6900, 9);
		expect(r.positiveSequenceApparentPowerVA).toBeCloseTo(6900, 9);
		expect(r.effectivePowerFactor).toBeCloseTo(0.8, 12);
		expect(r.positiveSequencePowerFactor).toBeCloseTo(0.8, 12);
		expect(r.positiveSequenceReactivePowerVar).toBeCloseTo(4140, 9);
		expect(r.fundamentalUnbalancePowerVA).toBeLessThan(1e-3);
	});
});

describe('threePhasePowerFromHarmonics', () => {
	it('with triplen current harmonics on a balanced 4-wire set: neutral carries 3·I3, Ie = √((3·(I1²+I3²) + 9·I3²)/3) (closed form)', () => {
		const i1 = 10;
		const i3 = 3;
		const phases = [0, -120, 120].map((phi) => ({
			voltage: setFromSineTones([{ order: 1, rms: 230, phaseDeg: phi }], { maxOrder: 3 }),
			// a balanced 3rd harmonic is in phase on all three lines (zero sequence): 3·phi ≡ 0
			current: setFromSineTones([
				{ order: 1, rms: i1, phaseDeg: phi - 20 },
				{ order: 3, rms: i3, phaseDeg: 3 * phi + 15 },
			]),
		})) as [ThreePhaseInputPhase, ThreePhaseInputPhase, ThreePhaseInputPhase];
		const r = threePhasePowerFromHarmonics('4-wire', phases);
		const ie = Math.sqrt((3 * (i1 * i1 + i3 * i3) + (3 * i3) ** 2) / 3);
		expect(r.effectiveCurrentA).toBeCloseTo(ie, 9);
		expect(r.effectiveCurrent1A).toBeCloseTo(10, 9);
		expect(r.effectiveVoltageV).toBeCloseTo(230, 9);
		expect(r.activePowerW).toBeCloseTo(3 * 2300 * Math.cos((20 * Math.PI) / 180), 6);
		expect(r.effectivePowerFactor).toBeCloseTo(r.activePowerW / (3 * 230 * ie), 12);
		expect(r.effectiveNonFundamentalApparentPowerVA ** 2).toBeCloseTo(
			r.effectiveCurrentDistortionPowerVar ** 2 +
				r.effectiveVoltageDistortionPowerVar ** 2 +
				r.effectiveHarmonicApparentPowerVA ** 2,
			3,
		);
	});

	it('throws RangeError when a set has no fundamental', () => {
		const s = { fundamentalHz: 50, startS: 0, cycles: 10, orders: [{ order: 0, rms: 0, phaseDeg: NaN }] };
		expect(() =>
			threePhasePowerFromHarmonics('3-wire', [
				{ voltage: s, current: s },
				{ voltage: s, current: s },
				{ voltage: s, current: s },
			]),
		).toThrow(RangeError);
	});
});

describe('ieee1459ThreePhaseFromComponents with phase labels in negative rotation', () => {
	it('takes the positive sequence in the measured rotation: swapping labels 2 and 3 of the §5.4 set keeps S1+ 6849.315 VA and S_U1 1780.565 VA (computed by docs/check-vectors.py)', () => {
		const v: Three<ComplexPhasor> = [P(230, 0), P(235, 121), P(220, -118)];
		const i: Three<ComplexPhasor> = [P(10, -30), P(8, 90), P(12, -150)];
		const r = fundamentalOnly(v, i, '4-wire');
		expect(r.sequenceOrder).toBe('phases-2-3-swapped');
		expect(r.positiveSequenceApparentPowerVA).toBeCloseTo(6849.315, 3);
		expect(r.positiveSequenceActivePowerW).toBeCloseTo(5871.907, 3);
		expect(r.fundamentalUnbalancePowerVA).toBeCloseTo(1780.565, 3);
		expect(r.effectiveApparentPowerVA).toBeCloseTo(7076.97, 2);
	});
});
