/**
 * Phase relation and IEEE 1459 single-phase power of a voltage/current pair from samples, through the
 * report's route (analyseCapture: whole cycles of the reference, harmonic windows, cross-correlation).
 * Expected values: the phases and amplitudes the tests synthesise (closed form) and docs/methods.md §5.3.
 */
import { describe, expect, it } from 'vitest';
import { analyseCapture } from '../../lib/report/analyse.js';
import { captureOf, channelOf } from '../helpers/capture.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';

const wrapDeg = (d: number) => ((((d + 180) % 360) + 360) % 360) - 180;

describe('analyseCapture: phase relation of a pair (lib/signal whole cycles + lib/spectrum phasors + cross-correlation)', () => {
	it('on a pure 49.95 Hz sine the cross-correlation lag agrees with the phasor angle to 0.05° (and both with the true 32°)', () => {
		const fs = 10_000;
		const u = sineSamples({ amplitude: 325, frequencyHz: 49.95, sampleRateHz: fs, cycles: 10.6 });
		const i = sineSamples({ amplitude: 14, frequencyHz: 49.95, sampleRateHz: fs, cycles: 10.6, phaseDeg: -32 });
		const r = analyseCapture(captureOf([channelOf('U1', 'V', 'voltage', u), channelOf('I1', 'A', 'current', i)], fs));
		const pair = r.pairs.find((p) => p.ref === 'U1' && p.other === 'I1')!;
		// 0.05°: our tolerance (about 0.03 samples at 10 kS/s); 32° is the phase the test synthesised
		expect(Math.abs(pair.lagS * 360 * r.frequencyHz - pair.lagDeg)).toBeLessThan(0.05);
		expect(pair.lagDeg).toBeCloseTo(32, 3);
		expect(r.frequencyHz).toBeCloseTo(49.95, 4);
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
		const r = analyseCapture(captureOf([channelOf('U', 'V', 'voltage', u), channelOf('I', 'A', 'current', i)], fs), {
			maxOrder: 5,
		});
		const [hu, hi] = ['U', 'I'].map((n) => r.channels.find((c) => c.name === n)!.harmonics);
		const lag = (h: number) => wrapDeg(hu[h].phaseDeg - hi[h].phaseDeg);
		expect(lag(1)).toBeCloseTo(30, 3);
		expect(lag(3)).toBeCloseTo(-60, 3);
	});

	it('gives no relation and no power (a warning, not a throw) against a DC-only reference', () => {
		const r = analyseCapture(
			captureOf(
				[
					channelOf('U', 'V', 'voltage', new Float64Array(1000).fill(5)),
					channelOf('I', 'A', 'current', new Float64Array(1000)),
				],
				10_000,
			),
		);
		expect(r.cyclesAnalysed).toBe(0);
		expect(r.pairs).toEqual([]);
		expect(r.power).toEqual([]);
		expect(r.warnings.some((w) => w.includes('No periodic fundamental'))).toBe(true);
	});
});

describe('analyseCapture: IEEE 1459 single-phase power of a pair', () => {
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
		const r = analyseCapture(captureOf([channelOf('U', 'V', 'voltage', v), channelOf('I', 'A', 'current', i)], 12_800));
		const p = r.power[0];
		// docs/methods.md §5.3, computed vector from the shared reference script; the last three are closed form:
		// Q1 = 230·10·sin 30° = 1150 var, DPF = cos 30° = 0.866025, THD_I = √(3² + 2²)/10 = 36.0555 %
		expect(p.activeW).toBeCloseTo(2018.4719, 2);
		expect(p.reactiveVar).toBeCloseTo(1150, 2);
		expect(p.apparentVA).toBeCloseTo(2449.0864, 2);
		expect(p.powerFactor).toBeCloseTo(0.824173, 5);
		expect(p.displacementPowerFactor).toBeCloseTo(0.866025, 5);
		expect(p.ieee1459.thdCurrentPercent).toBeCloseTo(36.055513, 3);
		// θ1 = 30° (current lagging): the report names the displacement; it gives no load character for a
		// current this distorted (THD 36 %), where a fundamental-only model does not fit
		expect(p.relation).toBe('lags');
	});

	it('of a capacitive load on a sine voltage says capacitive (current leads 50°: Q1 = −V·I·sin 50°)', () => {
		const fs = 10_000;
		const v = sineSamples({ amplitude: 230 * Math.SQRT2, frequencyHz: 60, sampleRateHz: fs, cycles: 12.3 });
		const i = sineSamples({ amplitude: 5 * Math.SQRT2, frequencyHz: 60, sampleRateHz: fs, cycles: 12.3, phaseDeg: 50 });
		const r = analyseCapture(captureOf([channelOf('U', 'V', 'voltage', v), channelOf('I', 'A', 'current', i)], fs));
		expect(r.power[0].reactiveVar).toBeCloseTo(-1150 * Math.sin((50 * Math.PI) / 180), 2);
		expect(r.power[0].character).toBe('capacitive');
	});
});
