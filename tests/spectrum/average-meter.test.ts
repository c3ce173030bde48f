import { describe, expect, it } from 'vitest';
import { averageMeterExplanation, harmonicWindow, type HarmonicSet } from '../../lib/index.js';
import { harmonicSamples, shapeSamples, sineSamples } from '../helpers/synth.js';

const FS = 50 * 4096;

function setOfShape(shape: 'square' | 'triangle' | 'half-wave', maxOrder: number): HarmonicSet {
	const x = shapeSamples(shape, { amplitude: 1, frequencyHz: 50, sampleRateHz: FS, cycles: 10 });
	return harmonicWindow(x, FS, { fundamentalHz: 50, maxOrder }).set;
}

describe('averageMeterExplanation', () => {
	it('triangle: the meter reads 3.81 % low (docs/methods.md §1.2: closed form from memory, checked by the shared reference script), led by a peaked 3rd harmonic', () => {
		const e = averageMeterExplanation(setOfShape('triangle', 50), 'V');
		expect(e.readingErrorPercent).toBeCloseTo(-3.81, 2);
		expect(e.formFactor).toBeCloseTo(2 / Math.sqrt(3), 4);
		expect(e.reasons[0].order).toBe(3);
		expect(e.reasons[0].shape).toBe('peaked');
		expect(e.reasons[0].errorAlonePercent).toBeLessThan(0);
		expect(e.summary).toMatch(/3\.8 % low/);
	});

	it('half-wave rectified sine: 29.29 % low, form factor π/2 (docs/methods.md §1.2: closed form from memory, checked by the shared reference script); DC and 2nd named', () => {
		const e = averageMeterExplanation(setOfShape('half-wave', 200));
		expect(e.readingErrorPercent).toBeCloseTo(-29.29, 1);
		expect(e.formFactor).toBeCloseTo(Math.PI / 2, 3);
		expect(e.crestFactor).toBeCloseTo(2, 3);
		const orders = e.reasons.map((r) => r.order);
		expect(orders).toContain(0);
		expect(orders).toContain(2);
		expect(e.reasons.find((r) => r.order === 2)?.shape).toBe('asymmetric');
	});

	it('square wave to order 1000: +11.07 % (docs/methods.md §1.2: closed form from memory, checked by the shared reference script) within the truncation of the series; a flattening 3rd leads', () => {
		const e = averageMeterExplanation(setOfShape('square', 1000));
		expect(Math.abs(e.readingErrorPercent - 11.07)).toBeLessThan(0.05);
		expect(e.reasons[0].order).toBe(3);
		expect(e.reasons[0].shape).toBe('flattened');
		expect(e.reasons[0].errorAlonePercent).toBeGreaterThan(0);
	});

	it('fundamental + a·3rd at the crest: error (1 − a/3)/√(1 + a²) − 1 (closed form, a = 0.2: −8.48 %)', () => {
		// sine reference: the 3rd at −180° sine phase → cosine phases −90° and −270°: relative 0° (peaks on the crest)
		const x = harmonicSamples(
			[
				{ order: 1, rms: 10 },
				{ order: 3, rms: 2, phaseDeg: 180 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 },
		);
		const e = averageMeterExplanation(harmonicWindow(x, 10_000, { fundamentalHz: 50 }).set, 'A');
		const a = 0.2;
		expect(e.readingErrorPercent).toBeCloseTo(100 * ((1 - a / 3) / Math.sqrt(1 + a * a) - 1), 3);
		expect(e.reasons).toHaveLength(1);
		expect(e.reasons[0].shape).toBe('peaked');
		expect(e.reasons[0].phaseRelDeg).toBeCloseTo(0, 6);
		expect(e.reasons[0].percentOfFundamental).toBeCloseTo(20, 9);
		expect(e.summary).toMatch(/ A /);
	});

	it('fundamental + a·3rd opposing the crest: error (1 + a/3)/√(1 + a²) − 1 (closed form, +4.59 % at a = 0.2)', () => {
		const x = harmonicSamples(
			[
				{ order: 1, rms: 10 },
				{ order: 3, rms: 2, phaseDeg: 0 },
			],
			{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 },
		);
		const e = averageMeterExplanation(harmonicWindow(x, 10_000, { fundamentalHz: 50 }).set);
		expect(e.readingErrorPercent).toBeCloseTo(100 * ((1 + 0.2 / 3) / Math.sqrt(1.04) - 1), 3);
		expect(e.reasons[0].shape).toBe('flattened');
	});

	it('a pure sine reads within 1 % with no reasons given', () => {
		const set = harmonicWindow(
			sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 }),
			10_000,
			{ fundamentalHz: 50 },
		).set;
		const e = averageMeterExplanation(set, 'V');
		expect(Math.abs(e.readingErrorPercent)).toBeLessThan(1e-3);
		expect(e.reasons).toEqual([]);
		expect(e.summary).toMatch(/within 1 %/);
	});

	it('without a fundamental gives NaN figures and says why', () => {
		const e = averageMeterExplanation({
			fundamentalHz: 50,
			startS: 0,
			cycles: 10,
			orders: [
				{ order: 0, rms: 1, phaseDeg: 0 },
				{ order: 1, rms: 0, phaseDeg: NaN },
			],
		});
		expect(e.readingErrorPercent).toBeNaN();
		expect(e.summary).toMatch(/No fundamental/);
	});
});
