/**
 * Motors on an unbalanced supply: NEMA MG 1 derating curve points and the heating rule of thumb.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { extraHeatingPercent, motorDeratingFactor, motorUnbalance } from '../../lib/next-steps/motor-unbalance.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

describe('motorDeratingFactor (NEMA MG 1, 14.35 derating curve)', () => {
	it('motorDeratingFactor at 2 % = 0.95 and at 4 % = 0.82 (curve points; from memory and a public table of the curve agree)', () => {
		expect(motorDeratingFactor(2)).toBeCloseTo(0.95, 10);
		expect(motorDeratingFactor(4)).toBeCloseTo(0.82, 10);
	});

	it('motorDeratingFactor is 1 up to 1 % (no derating; from memory)', () => {
		expect(motorDeratingFactor(0)).toBe(1);
		expect(motorDeratingFactor(1)).toBe(1);
	});

	it('motorDeratingFactor(1.96 %) ≈ 0.95 for the 460/467/450 V example (LVUR 1.96 %; a public unbalance calculator page gives "a derating factor near 0.95")', () => {
		expect(motorDeratingFactor(1.96)).toBeCloseTo(0.95, 2);
	});

	it('motorDeratingFactor(2.25 %) = (0.95 + 0.93)/2 = 0.94 (linear between the 2 % and 2.5 % points)', () => {
		expect(motorDeratingFactor(2.25)).toBeCloseTo(0.94, 10);
	});

	it('motorDeratingFactor never rises with unbalance over 0-5 % (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 5, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), (a, b) => {
				const [lo, hi] = a <= b ? [a, b] : [b, a];
				expect(motorDeratingFactor(hi)).toBeLessThanOrEqual(motorDeratingFactor(lo) + 1e-12);
			}),
		);
	});

	it('motorDeratingFactor above 5 % is NaN and the step says NEMA MG 1 recommends not operating', () => {
		expect(Number.isNaN(motorDeratingFactor(5.5))).toBe(true);
		const s = motorUnbalance(['U1', 'U2', 'U3'], 5.5);
		expect(s.result!.operationNotRecommended).toBe(true);
		expect(s.conclusions[0]).toMatch(/recommends not running/);
	});

	it('extraHeatingPercent(3.5 %) = 2 × 3.5² = 24.5 % (NEMA MG 1 14.35.1 rule of thumb, from memory)', () => {
		expect(extraHeatingPercent(3.5)).toBeCloseTo(24.5, 10);
	});
});

describe('motorUnbalance step', () => {
	it('motorUnbalance flags unbalance above 1 % and carries its input and the caution', () => {
		const s = motorUnbalance(['U1', 'U2', 'U3'], 1.5);
		expect(s.result!.aboveDeratingThreshold).toBe(true);
		expect(s.result!.deratingFactor).toBeCloseTo(0.97, 10);
		expect(s.warnings).toHaveLength(1);
		expect(s.inputs[0]).toMatchObject({ value: 1.5, unit: '%', from: 'recording' });
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
		expect(motorUnbalance(['U1', 'U2', 'U3'], 0.8).warnings).toHaveLength(0);
	});
});
