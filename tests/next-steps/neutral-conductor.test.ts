/**
 * Neutral conductor: the IEC 60364-5-52 Annex E reduction factors and its worked example (from memory:
 * a 39 A three-phase load in a four-core cable with 20 %, 40 % and 50 % third harmonic).
 */
import { describe, expect, it } from 'vitest';
import { neutralConductor, neutralSizing } from '../../lib/next-steps/neutral-conductor.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';

describe('neutralSizing (IEC 60364-5-52:2009 Annex E, Table E.52.1 and its example; from memory)', () => {
	it('neutralSizing(39 A, 20 %) sizes on the phase current with factor 0.86: 39/0.86 = 45.3 A', () => {
		const s = neutralSizing(39, 20);
		expect(s.basis).toBe('phase');
		expect(s.factor).toBe(0.86);
		expect(s.designCurrentA).toBeCloseTo(45.35, 2);
	});

	it('neutralSizing(39 A, 40 %) sizes on the neutral current 39 × 0.4 × 3 = 46.8 A with factor 0.86: 54.4 A', () => {
		const s = neutralSizing(39, 40);
		expect(s.basis).toBe('neutral');
		expect(s.annexNeutralA).toBeCloseTo(46.8, 10);
		expect(s.designCurrentA).toBeCloseTo(54.42, 2);
	});

	it('neutralSizing(39 A, 50 %) sizes on the neutral current 39 × 0.5 × 3 = 58.5 A with factor 1', () => {
		const s = neutralSizing(39, 50);
		expect(s.basis).toBe('neutral');
		expect(s.factor).toBe(1);
		expect(s.designCurrentA).toBeCloseTo(58.5, 10);
	});

	it('neutralSizing below 15 % third harmonic needs no reduction: the phase current itself', () => {
		const s = neutralSizing(39, 10);
		expect(s.basis).toBe('phase');
		expect(s.designCurrentA).toBe(39);
	});

	it('neutralSizing band edges: 15 % -> factor 1, 33 % -> phase 0.86, 45 % -> neutral 0.86 (Table E.52.1 bands 0-15, 15-33, 33-45, > 45)', () => {
		expect(neutralSizing(10, 15).factor).toBe(1);
		expect(neutralSizing(10, 33).basis).toBe('phase');
		expect(neutralSizing(10, 45)).toMatchObject({ basis: 'neutral', factor: 0.86 });
		expect(neutralSizing(10, 45.1)).toMatchObject({ basis: 'neutral', factor: 1 });
	});
});

describe('neutralConductor step', () => {
	const phases = ['I1', 'I2', 'I3'].map((channel) => ({ channel, rmsA: 39, thirdPercent: 40 }));

	it('neutralConductor with a recorded neutral above the Annex estimate sizes on the recorded one too: 60 A / 0.86 = 69.8 A, and warns that the neutral carries more than a phase', () => {
		const s = neutralConductor(phases, { rmsA: 60, measured: true });
		expect(s.result!.designCurrentA).toBeCloseTo(54.42, 2);
		expect(s.result!.designCurrentRecordedA).toBeCloseTo(60 / 0.86, 6);
		expect(s.warnings.join(' ')).toMatch(/more than the largest phase/);
		expect(s.conclusions[0]).toMatch(/neutral current/);
	});

	it('neutralConductor carries its inputs (phase currents, third harmonic, neutral) and the caution', () => {
		const s = neutralConductor(phases, { rmsA: 40, measured: false });
		expect(s.inputs.map((i) => i.name)).toEqual(
			expect.arrayContaining(['I1 RMS current', 'I1 third harmonic', 'neutral RMS current']),
		);
		expect(s.inputs.every((i) => i.from === 'recording')).toBe(true);
		expect(s.caution).toBe(NEXT_STEP_CAUTION);
	});
});
