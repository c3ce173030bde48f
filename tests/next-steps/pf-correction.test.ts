/**
 * Power-factor correction: reactive power to add, resonance with the supply, detuned tuning orders, the
 * true PF left after correction. Expected values are hand computations written out here.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	detunedTuningOrder,
	powerFactorCorrection,
	reactivePowerToAdd,
	resonanceOrder,
	transformerShortCircuitKva,
	truePowerFactorAfter,
} from '../../lib/next-steps/pf-correction.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

describe('reactivePowerToAdd', () => {
	it('reactivePowerToAdd(100 kW, 0.75, 0.95) = 55.32 kvar (power triangle by hand: tan(acos 0.75) = 0.661438/0.75 = 0.881917, tan(acos 0.95) = 0.312250/0.95 = 0.328684; the 0.553 kvar/kW of the usual correction tables, common practice, from memory)', () => {
		expect(reactivePowerToAdd(100e3, 0.75, 0.95)).toBeCloseTo(100e3 * (0.881917 - 0.328684), -1);
		expect(reactivePowerToAdd(100e3, 0.75, 0.95) / 100e3).toBeCloseTo(0.553, 3);
	});

	it('reactivePowerToAdd(P, 0.8, 1) = P · tan(acos 0.8) = 0.75 P (3-4-5 triangle)', () => {
		expect(reactivePowerToAdd(40e3, 0.8, 1)).toBeCloseTo(30e3, 6);
	});

	it('reactivePowerToAdd is 0 whenever the displacement PF is at or above the target (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.1, max: 1, noNaN: true }),
				fc.double({ min: 0.1, max: 1, noNaN: true }),
				fc.double({ min: 0, max: 1e7, noNaN: true }),
				(a, b, p) => {
					const [target, dpf] = a <= b ? [a, b] : [b, a];
					expect(reactivePowerToAdd(p, dpf, target)).toBe(0);
				},
			),
		);
	});

	it('reactivePowerToAdd grows as the measured displacement PF falls below the target (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.2, max: 0.9, noNaN: true }),
				fc.double({ min: 0.01, max: 0.09, noNaN: true }),
				(dpf, step) => {
					expect(reactivePowerToAdd(1e5, dpf, 0.95)).toBeGreaterThan(
						reactivePowerToAdd(1e5, Math.min(0.949, dpf + step), 0.95),
					);
				},
			),
		);
	});

	it('reactivePowerToAdd throws RangeError for a target above 1 or at 0', () => {
		expect(() => reactivePowerToAdd(1e3, 0.8, 1.2)).toThrow(RangeError);
		expect(() => reactivePowerToAdd(1e3, 0.8, 0)).toThrow(RangeError);
	});
});

describe('resonance with the supply', () => {
	it('transformerShortCircuitKva(1000 kVA, 6 %) = 16 667 kVA and a 350 kvar bank resonates at h = √(16 667/350) = 6.90 (hand computation; Ssc = S_T/z_T, h = √(Ssc/Qc), IEEE 1531 / IEEE 519 guidance, from memory)', () => {
		expect(transformerShortCircuitKva(1000, 6)).toBeCloseTo(16666.67, 1);
		expect(resonanceOrder(16666.67, 350)).toBeCloseTo(6.9007, 3);
	});

	it('resonanceOrder moves as √(1/Qc): k times the bank gives the order over √k (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 100, max: 1e6, noNaN: true }),
				fc.double({ min: 1, max: 1e4, noNaN: true }),
				fc.double({ min: 0.01, max: 100, noNaN: true }),
				(ssc, q, k) => {
					expect(resonanceOrder(ssc, k * q) * Math.sqrt(k)).toBeCloseTo(resonanceOrder(ssc, q), 6);
				},
			),
		);
	});

	it('detunedTuningOrder: 5.67 % -> 4.20, 7 % -> 3.78, 14 % -> 2.67 (h = 1/√p; the usual tuning of detuned banks, common practice)', () => {
		expect(detunedTuningOrder(5.67)).toBeCloseTo(4.2, 2);
		expect(detunedTuningOrder(7)).toBeCloseTo(3.78, 2);
		expect(detunedTuningOrder(14)).toBeCloseTo(2.67, 2);
	});
});

describe('truePowerFactorAfter', () => {
	it('truePowerFactorAfter(PF 0.7, DPF 0.8, target 0.95) = 0.7940 (by hand: DF 0.875, I_H/I1 = √(1/0.875² − 1) = 0.553283, I1 falls to 0.8/0.95 = 0.842105, PF = 0.8/√(0.842105² + 0.553283²) = 0.793963)', () => {
		expect(truePowerFactorAfter(0.7, 0.8, 0.95)).toBeCloseTo(0.793963, 5);
	});

	it('truePowerFactorAfter of a sinusoidal current (PF = DPF) reaches the target exactly, and without correction stays at PF (closed form)', () => {
		expect(truePowerFactorAfter(0.8, 0.8, 0.95)).toBeCloseTo(0.95, 10);
		expect(truePowerFactorAfter(0.7, 0.96, 0.95)).toBeCloseTo(0.7, 10);
	});
});

describe('powerFactorCorrection step', () => {
	const phase = (label: string, p1: number, dpf: number, pf: number) => ({
		label,
		activeW: p1,
		fundamentalActiveW: p1,
		displacementPowerFactor: dpf,
		powerFactor: pf,
		character: 'inductive' as const,
	});
	const fifth = [{ channel: 'I1', percentByOrder: [0, 100, 0, 0, 0, 20, 0, 10] }];

	it('powerFactorCorrection without a target asks for it: status needs-input, no numbers, and carries its inputs and the caution', () => {
		const s = powerFactorCorrection([phase('U1 × I1', 100e3, 0.75, 0.74)], fifth, {});
		expect(s.status).toBe('needs-input');
		expect(s.result).toBeNull();
		expect(s.needs.join(' ')).toMatch(/target power factor/);
		expect(s.inputs.map((i) => i.name)).toContain('target displacement power factor');
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
	});

	it('powerFactorCorrection warns when the resonance falls near the 5th present in the current: three phases of 100 kW at 0.75 -> 0.95 need 3 × 55.32 = 165.97 kvar; Ssc 4150 kVA gives h = √(4150/165.97) = 5.00', () => {
		const phases = [1, 2, 3].map((k) => phase(`U${k} × I${k}`, 100e3, 0.75, 0.74));
		const s = powerFactorCorrection(phases, fifth, { targetPowerFactor: 0.95, supplyShortCircuitKva: 4150 });
		expect(s.status).toBe('result');
		const r = s.result!;
		expect(r.totalReactiveToAddVar).toBeCloseTo(3 * 55323.3, -1);
		expect(r.resonanceOrder).toBeCloseTo(Math.sqrt(4150 / 165.97), 2);
		expect(r.resonanceNearOrders).toEqual([5]);
		expect(s.warnings.join(' ')).toMatch(/near order 5/);
		expect(r.detuned.find((d) => d.reactorPercent === 7)!.belowLowestOrderPresent).toBe(true);
	});

	it('powerFactorCorrection without the supply figures gives the kvar and asks for the short-circuit power (status partial)', () => {
		const s = powerFactorCorrection([phase('U1 × I1', 100e3, 0.75, 0.74)], fifth, { targetPowerFactor: 0.95 });
		expect(s.status).toBe('partial');
		expect(s.result!.perPhase[0].reactiveToAddVar).toBeCloseTo(55323.3, -1);
		expect(Number.isNaN(s.result!.resonanceOrder)).toBe(true);
		expect(s.needs.join(' ')).toMatch(/short-circuit power.*transformer kVA and impedance/);
	});

	it('powerFactorCorrection says capacitors will not fix a low true PF whose displacement PF already meets the target', () => {
		const s = powerFactorCorrection([phase('U1 × I1', 2e3, 0.99, 0.7)], fifth, { targetPowerFactor: 0.95 });
		expect(s.result!.lowPowerFactorIsHarmonic).toBe(true);
		expect(s.result!.totalReactiveToAddVar).toBe(0);
		expect(s.conclusions.join(' ')).toMatch(/capacitors will not fix it/);
	});

	it('powerFactorCorrection of a leading load below the target adds no capacitors and says capacitance must come off instead', () => {
		const lead = { ...phase('U1 × I1', 5e3, 0.8, 0.8), character: 'capacitive' as const };
		const s = powerFactorCorrection([lead], fifth, { targetPowerFactor: 0.95 });
		expect(s.result!.totalReactiveToAddVar).toBe(0);
		expect(s.conclusions[0]).toMatch(/leading: capacitors cannot raise it/);
		expect(s.needs).toEqual([]);
	});

	it('powerFactorCorrection with a transformer-limited supply states the assumption Ssc = S_T / z_T', () => {
		const s = powerFactorCorrection([phase('U1 × I1', 100e3, 0.75, 0.74)], fifth, {
			targetPowerFactor: 0.95,
			transformerKva: 1000,
			transformerImpedancePercent: 6,
		});
		expect(s.result!.shortCircuitFrom).toBe('transformer');
		expect(s.result!.shortCircuitKva).toBeCloseTo(16666.67, 1);
		expect(s.assumptions.join(' ')).toMatch(/transformer kVA ÷ per-unit impedance/);
		// one phase recorded: Ssc is three-phase, so the bank is taken as 3 × 55.32 kvar: h = √(16 666.7 / 165.97) = 10.02
		expect(s.result!.bankForResonanceVar).toBeCloseTo(3 * 55323.3, -1);
		expect(s.result!.resonanceOrder).toBeCloseTo(Math.sqrt(16666.67 / 165.97), 2);
	});
});
