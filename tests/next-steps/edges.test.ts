/**
 * Edges of the next-step calculations: NaN, zero, out-of-range and missing data give NaN, a RangeError or
 * a step that says it does not apply; never a number made up.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { bandLimitedRms, crestFactorAvailable } from '../../lib/next-steps/meter.js';
import { motorDeratingFactor, extraHeatingPercent } from '../../lib/next-steps/motor-unbalance.js';
import { neutralSizing } from '../../lib/next-steps/neutral-conductor.js';
import { reactivePowerToAdd, resonanceOrder, truePowerFactorAfter } from '../../lib/next-steps/pf-correction.js';
import { harmonicLossFactor, maxLoadCurrentPu } from '../../lib/next-steps/transformer.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { harmonicSamples } from '../helpers/synth.js';
import { captureOf } from '../helpers/capture.js';

describe('next-step formulas at their edges', () => {
	it('reactivePowerToAdd of a NaN or zero power factor, or a negative power, is NaN', () => {
		expect(reactivePowerToAdd(1e3, NaN, 0.95)).toBeNaN();
		expect(reactivePowerToAdd(1e3, 0, 0.95)).toBeNaN();
		expect(reactivePowerToAdd(-1e3, 0.8, 0.95)).toBeNaN();
	});

	it('resonanceOrder without a bank (0 kvar) or without a supply figure is NaN', () => {
		expect(resonanceOrder(10_000, 0)).toBeNaN();
		expect(resonanceOrder(0, 100)).toBeNaN();
	});

	it('truePowerFactorAfter with a PF above the DPF (not physical for a sinusoidal voltage) is NaN', () => {
		expect(truePowerFactorAfter(0.9, 0.8, 0.95)).toBeNaN();
	});

	it('harmonicLossFactor of an all-zero current is NaN; maxLoadCurrentPu of a NaN F_HL or negative eddy loss is NaN', () => {
		expect(harmonicLossFactor([0, 0, 0])).toBeNaN();
		expect(maxLoadCurrentPu(0.1, NaN)).toBeNaN();
		expect(maxLoadCurrentPu(-0.1, 2)).toBeNaN();
	});

	it('neutralSizing throws RangeError for a negative current or NaN content', () => {
		expect(() => neutralSizing(-1, 20)).toThrow(RangeError);
		expect(() => neutralSizing(10, NaN)).toThrow(RangeError);
	});

	it('motorDeratingFactor and extraHeatingPercent of NaN or a negative unbalance are NaN', () => {
		expect(motorDeratingFactor(NaN)).toBeNaN();
		expect(motorDeratingFactor(-1)).toBeNaN();
		expect(extraHeatingPercent(-1)).toBeNaN();
	});

	it('bandLimitedRms without a fundamental frequency, and crestFactorAvailable at a zero reading, are NaN', () => {
		expect(bandLimitedRms([0, 1], NaN, 1000)).toBeNaN();
		expect(crestFactorAvailable(3, 10, 0)).toBeNaN();
	});
});

describe('nextStepsSection on recordings that do not hold what a step starts from', () => {
	const opts = { frequencyHz: 50, sampleRateHz: 10_000, cycles: 20 };
	const cap = (channels: Capture['channels']): Capture => captureOf(channels, 10_000, 'x.csv');

	it('one voltage channel: power factor, transformer, neutral and motor steps say they do not apply, the meter step still works', () => {
		const r = analyseCapture(
			cap([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: harmonicSamples([{ order: 1, rms: 230 }], opts) }]),
			{ site: { targetPowerFactor: 0.95 } },
		);
		const status = Object.fromEntries(r.nextSteps!.steps.map((s) => [s.step, s.status]));
		expect(status).toEqual({
			'power-factor-correction': 'not-applicable',
			'transformer-loading': 'not-applicable',
			'neutral-conductor': 'not-applicable',
			'motor-unbalance': 'not-applicable',
			'meter-reading': 'needs-input',
		});
		for (const s of r.nextSteps!.steps) expect(s.finding.length).toBeGreaterThan(0);
	});

	it('a DC-only channel (no fundamental) gives no step a number: every step does not apply', () => {
		const r = analyseCapture(
			cap([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: new Float64Array(2000).fill(12) }]),
		);
		expect(r.nextSteps!.steps.every((s) => s.status === 'not-applicable' && s.result === null)).toBe(true);
	});
});
