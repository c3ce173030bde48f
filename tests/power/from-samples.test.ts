import { describe, expect, it } from 'vitest';
import { channelRelationFromSamples, singlePhasePowerFromSamples } from '../../lib/power/index.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';

describe('channelRelationFromSamples (lib/signal whole cycles + lib/spectrum phasors + cross-correlation)', () => {
	it('on a pure 49.95 Hz sine the cross-correlation lag agrees with the phasor angle to 0.05° (and both with the true 32°)', () => {
		const fs = 10_000;
		const u = sineSamples({ amplitude: 325, frequencyHz: 49.95, sampleRateHz: fs, cycles: 10.6 });
		const i = sineSamples({ amplitude: 14, frequencyHz: 49.95, sampleRateHz: fs, cycles: 10.6, phaseDeg: -32 });
		const r = channelRelationFromSamples(u, i, fs, 'U1', 'I1');
		if (!r.ok) throw new Error(r.message);
		// 0.05°: our tolerance (about 0.03 samples at 10 kS/s); 32° is the phase the test synthesised
		expect(Math.abs(r.timeLag.lagDeg - r.fundamentalLagDeg)).toBeLessThan(0.05);
		expect(r.fundamentalLagDeg).toBeCloseTo(32, 3);
		expect(r.sentence).toBe('I1 lags U1 by 32.0 deg');
		expect(r.window.frequencyHz).toBeCloseTo(49.95, 4);
	});

	it('gives per-order lags of a distorted pair (3rd harmonic of the current leads its voltage by 60°)', () => {
		const fs = 12_800;
		const o = { frequencyHz: 50, sampleRateHz: fs, cycles: 10.5 };
		const u = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 3, rms: 6.9 },
			],
			o,
		);
		const i = harmonicSamples(
			[
				{ order: 1, rms: 10, phaseDeg: -30 },
				{ order: 3, rms: 3, phaseDeg: 60 },
			],
			o,
		);
		const r = channelRelationFromSamples(u, i, fs, 'U', 'I', { maxOrder: 5 });
		if (!r.ok) throw new Error(r.message);
		expect(r.harmonicLags[0].lagDeg).toBeCloseTo(30, 3);
		expect(r.harmonicLags[2].lagDeg).toBeCloseTo(-60, 3);
	});

	it('returns a typed failure (not a throw) for a DC-only reference', () => {
		const r = channelRelationFromSamples(new Float64Array(1000).fill(5), new Float64Array(1000), 10_000, 'U', 'I');
		expect(r.ok).toBe(false);
	});
});

describe('singlePhasePowerFromSamples', () => {
	it('reproduces docs/methods.md §5.3 (computed by docs/check-vectors.py) from samples found by lib/signal (10.5 cycles recorded)', () => {
		const o = { frequencyHz: 50, sampleRateHz: 12_800, cycles: 10.5 };
		const v = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 3, rms: 6.9 },
				{ order: 5, rms: 11.5 },
			],
			o,
		);
		const i = harmonicSamples(
			[
				{ order: 1, rms: 10, phaseDeg: -30 },
				{ order: 3, rms: 3, phaseDeg: 60 },
				{ order: 5, rms: 2, phaseDeg: -45 },
			],
			o,
		);
		const r = singlePhasePowerFromSamples(v, i, 12_800);
		if (!r.ok) throw new Error(r.message);
		// docs/methods.md §5.3, computed vector from the shared reference script; the last three are closed form:
		// Q1 = 230·10·sin 30° = 1150 var, DPF = cos 30° = 0.866025, THD_I = √(3² + 2²)/10 = 36.0555 %
		expect(r.power.activePowerW).toBeCloseTo(2018.4719, 2);
		expect(r.power.fundamentalReactivePowerVar).toBeCloseTo(1150, 2);
		expect(r.power.apparentPowerVA).toBeCloseTo(2449.0864, 2);
		expect(r.power.powerFactor).toBeCloseTo(0.824173, 5);
		expect(r.power.displacementPowerFactor).toBeCloseTo(0.866025, 5);
		expect(r.power.thdCurrentPercent).toBeCloseTo(36.055513, 3);
		expect(r.loadCharacter.character).toBe('inductive');
	});

	it('of a capacitive load on a sine voltage says capacitive (current leads 50°: Q1 = −V·I·sin 50°)', () => {
		const fs = 10_000;
		const v = sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: 60, sampleRateHz: fs, cycles: 12.3 });
		const i = sineSamples({ amplitude: 5 * Math.SQRT2, frequencyHz: 60, sampleRateHz: fs, cycles: 12.3, phaseDeg: 50 });
		const r = singlePhasePowerFromSamples(v, i, fs);
		if (!r.ok) throw new Error(r.message);
		expect(r.power.fundamentalReactivePowerVar).toBeCloseTo(-1150 * Math.sin((50 * Math.PI) / 180), 2);
		expect(r.loadCharacter.character).toBe('capacitive');
	});
});
