import { describe, expect, it } from 'vitest';
import { threePhaseFromSamples } from '../../lib/polyphase/index.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';

type T3 = [Float64Array, Float64Array, Float64Array];
const fs = 10_000;
const o = { frequencyHz: 50, sampleRateHz: fs, cycles: 10.4 };
const sine = (rms: number, deg: number) =>
	sineSamples({ amplitude: rms * Math.SQRT2, frequencyHz: 50, sampleRateHz: fs, cycles: 10.4, phaseDeg: deg });

describe('threePhaseFromSamples', () => {
	// docs/methods.md §5.4 set (computed by docs/check-vectors.py): phasor angles; the common sine/cosine reference does not change relations
	const voltages: T3 = [sine(230, 0), sine(220, -118), sine(235, 121)];
	const currents: T3 = [sine(10, -30), sine(12, -150), sine(8, 90)];

	it('of the docs/methods.md §5.4 set (computed vector from the shared reference script) gives VUF 2.7699 %, Ve 228.4083 V, Ie 10.3280 A, Se 7076.97 VA, PF 0.82552, positive rotation', () => {
		const r = threePhaseFromSamples({ voltages, currents, wiring: '4-wire' }, fs);
		if (!r.ok) throw new Error(r.message);
		expect(r.voltageUnbalance.vufPercent).toBeCloseTo(2.7699, 3);
		expect(r.rotation.rotation).toBe('positive');
		expect(r.power!.effectiveVoltageV).toBeCloseTo(228.4083, 2);
		expect(r.power!.effectiveCurrentA).toBeCloseTo(10.328, 3);
		expect(r.power!.effectiveApparentPowerVA).toBeCloseTo(7076.97, 0);
		expect(r.power!.effectivePowerFactor).toBeCloseTo(0.82552, 4);
		expect(r.power!.positiveSequenceApparentPowerVA).toBeCloseTo(6849.315, 0);
		expect(r.neutral!.neutralRmsA).toBeCloseTo(3.4641, 3);
		expect(r.neutral!.source).toBe('computed');
		expect(r.lineVoltageRmsV[0]).toBeCloseTo(385.7597, 2);
		expect(r.diagnostics.some((d) => d.code === 'wiring-assumed')).toBe(false);
	});

	it('swapping phases 2 and 3 gives negative rotation', () => {
		const r = threePhaseFromSamples({ voltages: [voltages[0], voltages[2], voltages[1]] }, fs);
		if (!r.ok) throw new Error(r.message);
		expect(r.rotation.rotation).toBe('negative');
		expect(r.diagnostics.some((d) => d.code === 'wiring-assumed')).toBe(true);
	});

	it('computes a neutral of 3·I3 with 100 % triplen content for balanced loads drawing 3rd harmonic (closed form)', () => {
		const v: T3 = [sine(230, 0), sine(230, -120), sine(230, 120)];
		const i = [0, -120, 120].map((phi) =>
			harmonicSamples(
				[
					{ order: 1, rms: 10, phaseDeg: phi - 10 },
					{ order: 3, rms: 4, phaseDeg: 3 * phi },
				],
				o,
			),
		) as T3;
		const r = threePhaseFromSamples({ voltages: v, currents: i, wiring: '4-wire' }, fs);
		if (!r.ok) throw new Error(r.message);
		expect(r.neutral!.neutralRmsA).toBeCloseTo(12, 3);
		expect(r.neutral!.triplenPercentOfNeutral).toBeCloseTo(100, 2);
		expect(r.neutral!.percentOfMaxPhase).toBeCloseTo((100 * 12) / Math.sqrt(116), 2);
		expect(r.voltageUnbalance.vufPercent).toBeLessThan(1e-3);
		expect(r.sqrt3.consistent).toBe(true);
	});

	it('accepts a measured neutral equal to ±(sum of line currents) and warns when it is 60° off', () => {
		// the §5.4 currents sum to 3.4641 A at −120° (sine reference, hand sum of the three phasors)
		for (const [deg, warn] of [
			[-120, false],
			[60, false],
			[180, true],
		] as const) {
			const r = threePhaseFromSamples({ voltages, currents, neutralCurrent: sine(3.4641, deg), wiring: '4-wire' }, fs);
			if (!r.ok) throw new Error(r.message);
			expect(r.neutral!.source).toBe('measured');
			expect(
				r.diagnostics.some((d) => d.code === 'neutral-mismatch'),
				`neutral at ${deg} deg`,
			).toBe(warn);
		}
	});

	it('returns a typed failure when the phase-1 voltage has no cycles', () => {
		const z = new Float64Array(2000);
		expect(threePhaseFromSamples({ voltages: [z, z, z] }, fs).ok).toBe(false);
	});
});
