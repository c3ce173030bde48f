/**
 * Transformer loading under harmonic current: F_HL, I_max of IEEE C57.110, the K-rated class and the
 * BS 7821 factor K through the step. Expected values are hand computations or a published K-factor example.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	harmonicLossFactor,
	kRatedClass,
	maxLoadCurrentPu,
	transformerLoading,
} from '../../lib/next-steps/transformer.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

// A published K-factor worked example (public web page; spectrum I_h/I_1): 5th 0.20, 7th 0.14, 11th 0.091,
// 13th 0.077, 17th 0.058, 19th 0.056, 23rd 0.043, 25th 0.040; the page gives K = 8.3476.
const spectrum = new Array<number>(26).fill(0);
Object.assign(spectrum, { 1: 1, 5: 0.2, 7: 0.14, 11: 0.091, 13: 0.077, 17: 0.058, 19: 0.056, 23: 0.043, 25: 0.04 });

describe('harmonicLossFactor and maxLoadCurrentPu', () => {
	it('harmonicLossFactor of the published example spectrum = 8.3476 (F_HL = Σ (I_h/I_1)² h² / Σ (I_h/I_1)², IEEE C57.110-2008 5.2, from memory)', () => {
		expect(harmonicLossFactor(spectrum)).toBeCloseTo(8.3476, 3);
	});

	it('maxLoadCurrentPu(P_EC-R 0.08, F_HL 4) = √(1.08 / 1.32) = 0.9045 (IEEE C57.110-2008 5.2.3 formula, from memory; hand computation)', () => {
		expect(maxLoadCurrentPu(0.08, 4)).toBeCloseTo(Math.sqrt(1.08 / 1.32), 10);
		expect(maxLoadCurrentPu(0.08, 4)).toBeCloseTo(0.9045, 4);
	});

	it('maxLoadCurrentPu is 1 for a sinusoidal current (F_HL = 1) and for a winding without eddy loss (closed form)', () => {
		expect(maxLoadCurrentPu(0.15, 1)).toBeCloseTo(1, 12);
		expect(maxLoadCurrentPu(0, 12)).toBeCloseTo(1, 12);
	});

	it('maxLoadCurrentPu falls as F_HL rises (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.001, max: 1, noNaN: true }),
				fc.double({ min: 1, max: 50, noNaN: true }),
				fc.double({ min: 0.01, max: 20, noNaN: true }),
				(pec, fhl, more) => {
					expect(maxLoadCurrentPu(pec, fhl + more)).toBeLessThan(maxLoadCurrentPu(pec, fhl));
				},
			),
		);
	});

	it('kRatedClass picks the class at or above K among K-4, 9, 13, 20, 30, 40, 50 (UL 1561 classes, common practice)', () => {
		expect(kRatedClass(8.3476)).toBe(9);
		expect(kRatedClass(13)).toBe(13);
		expect(kRatedClass(13.2)).toBe(20);
		expect(kRatedClass(1)).toBe(1);
		expect(Number.isNaN(kRatedClass(51))).toBe(true);
	});
});

describe('transformerLoading step', () => {
	it('transformerLoading of the example spectrum with e/(1+e) = 0.091 gives factor K 1.14672 (BS 7821-4 form with n from 2, q 1.7, recomputed from the published page) and I_max √(1.10011/(1 + 8.3476 · 0.10011)) = 0.7748', () => {
		const e = 0.091 / 0.909;
		const s = transformerLoading([{ channel: 'I1', rmsByOrder: spectrum }], 25, {
			transformerEddyLossPu: e,
			transformerKva: 400,
		});
		expect(s.status).toBe('result');
		expect(s.result!.factorK).toBeCloseTo(1.14672, 4);
		expect(s.result!.kRatedClass).toBe(9);
		expect(s.result!.maxLoadCurrentPu).toBeCloseTo(Math.sqrt((1 + e) / (1 + 8.347626 * e)), 4);
		expect(s.result!.maxLoadKva).toBeCloseTo(400 * Math.sqrt((1 + e) / (1 + 8.347626 * e)), 1);
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
	});

	it('transformerLoading without the eddy-loss figure gives F_HL and the K class but no I_max: status partial, needs named, input null', () => {
		const s = transformerLoading([{ channel: 'I1', rmsByOrder: spectrum }], 25, {});
		expect(s.status).toBe('partial');
		expect(Number.isNaN(s.result!.maxLoadCurrentPu)).toBe(true);
		expect(s.needs.join(' ')).toMatch(/eddy-current loss/);
		expect(s.needs.join(' ')).toMatch(/transformer kVA/);
		expect(s.inputs.find((i) => i.name.includes('P_EC-R'))!.value).toBeNull();
	});

	it('transformerLoading sets the recorded current against the rated current: 100 kVA at 230 V per phase is 100 000/(3 · 230) = 144.9 A; 140 A is 96.6 %, above the 77.5 % I_max of this spectrum (warned)', () => {
		const e = 0.091 / 0.909;
		const s = transformerLoading([{ channel: 'I1', rmsByOrder: spectrum, rmsA: 140, phaseVoltageV: 230 }], 25, {
			transformerEddyLossPu: e,
			transformerKva: 100,
		});
		expect(s.result!.ratedCurrentA).toBeCloseTo(100_000 / 690, 6);
		expect(s.result!.loadPu).toBeCloseTo((140 * 690) / 100_000, 6);
		expect(s.warnings.join(' ')).toMatch(/above the 77 % a standard transformer carries/);
		expect(s.assumptions.join(' ')).toMatch(/full load/);
	});

	it('transformerLoading picks the channel with the highest K-factor', () => {
		const sine = [0, 10];
		const s = transformerLoading(
			[
				{ channel: 'I1', rmsByOrder: sine },
				{ channel: 'I2', rmsByOrder: spectrum },
			],
			25,
			{},
		);
		expect(s.result!.channel).toBe('I2');
	});
});
