/**
 * Three-phase figures of a short record (under two whole cycles) from the shared-frequency fit, against
 * the closed form of the construction. The phases are built from chosen symmetrical components
 * (Fortescue: V_j = V0 + a^(−j)·V1 + a^j·V2, a = 1∠120°, j = 0, 1, 2; IEC 60050 / any power-systems
 * text, common practice), with the negative sequence dominant: the labels run against the rotation.
 * Expected: |V1| = 4.6 V, |V2| = 230 V, |V0| = 2.3 V, VUF = 4.6/230 = 2 % in the measured rotation,
 * rotation 'negative'. Currents: a balanced 10 A set in the same rotation with a 2 A 3rd in every phase,
 * whose 3rds add in the neutral (3 × 2 A = 6 A) while the fundamentals cancel.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { reportToJson } from '../../lib/report/to-json.js';
import type { Capture, Channel, ChannelPhase, Quantity } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { gaussianNoise } from '../helpers/synth.js';

const schema = JSON.parse(
	readFileSync(join(import.meta.dirname, '..', '..', 'lib', 'report', 'report.schema.json'), 'utf8'),
);
const validate = new Ajv2020({ allErrors: true, strict: false }).compile(schema);

const F = 50.2;
const FS = 10_000;
type Polar = { mag: number; deg: number };
const rad = (d: number) => (d * Math.PI) / 180;

/** Phase j of a set given by its sequence components (RMS phasors). */
function phaseOf(j: number, v0: Polar, v1: Polar, v2: Polar): Polar {
	const re =
		v0.mag * Math.cos(rad(v0.deg)) +
		v1.mag * Math.cos(rad(v1.deg - 120 * j)) +
		v2.mag * Math.cos(rad(v2.deg + 120 * j));
	const im =
		v0.mag * Math.sin(rad(v0.deg)) +
		v1.mag * Math.sin(rad(v1.deg - 120 * j)) +
		v2.mag * Math.sin(rad(v2.deg + 120 * j));
	return { mag: Math.hypot(re, im), deg: (Math.atan2(im, re) * 180) / Math.PI };
}

/** x(t) = Σ √2·mag·sin(h·ωt + deg) over the given orders. */
function wave(n: number, tones: { h: number; p: Polar }[], noise?: Float64Array): Float64Array {
	const out = new Float64Array(n);
	for (let k = 0; k < n; k++) {
		const wt = (2 * Math.PI * F * k) / FS;
		let x = noise ? noise[k] : 0;
		for (const { h, p } of tones) x += Math.SQRT2 * p.mag * Math.sin(h * wt + rad(p.deg));
		out[k] = x;
	}
	return out;
}

const V0 = { mag: 2.3, deg: 40 };
const V1 = { mag: 4.6, deg: 10 };
const V2 = { mag: 230, deg: 0 };

function capture(cycles: number, noiseV = 0): Capture {
	const n = Math.round((cycles * FS) / F);
	const phases: ChannelPhase[] = ['L1', 'L2', 'L3'];
	const ch = (name: string, unit: string, quantity: Quantity, phase: ChannelPhase, samples: Float64Array): Channel => ({
		name,
		unit,
		quantity,
		phase,
		samples,
	});
	const volts = phases.map((ph, j) =>
		ch(
			`U${ph}`,
			'V',
			'voltage',
			ph,
			wave(n, [{ h: 1, p: phaseOf(j, V0, V1, V2) }], noiseV > 0 ? gaussianNoise(n, noiseV, 7 + j) : undefined),
		),
	);
	// currents: 10 A lagging 30° in the voltages' (negative) rotation, and a 2 A 3rd in phase in every line
	const amps = phases.map((ph, j) =>
		ch(
			`I${ph}`,
			'A',
			'current',
			ph,
			wave(n, [
				{ h: 1, p: { mag: 10, deg: -30 + 120 * j } },
				{ h: 3, p: { mag: 2, deg: -90 } },
			]),
		),
	);
	return {
		source: 'three-phase-scope.csv',
		sampleRateHz: FS,
		startS: 0,
		channels: [...volts, ...amps],
		metadata: {},
		diagnostics: [],
	};
}

describe('analyseCapture: three-phase figures of a short record from the fit', () => {
	for (const cycles of [0.75, 1, 1.5]) {
		it(`over ${cycles} cycles gives |V1| 4.6, |V2| 230, |V0| 2.3 V, VUF 2 %, rotation negative and a 6 A neutral (closed form)`, () => {
			const r = analyseCapture(capture(cycles));
			expect(r.shortRecord).not.toBeNull();
			const u = r.threePhaseSets.find((s) => s.quantity === 'voltage')!;
			expect(u).toBeDefined();
			expect(u.rotation).toBe('negative');
			// noise-free: the fit is exact to ~1e-6 relative
			expect(u.sequence.positive).toBeCloseTo(4.6, 3);
			expect(u.sequence.negative).toBeCloseTo(230, 2);
			expect(u.sequence.zero).toBeCloseTo(2.3, 3);
			expect(u.unbalancePercent).toBeCloseTo(2, 4);
			expect(u.fit?.note).toBe('from a fit of a short record');
			expect(u.fit!.sequenceUncertainty).toBeGreaterThanOrEqual(0);
			const i = r.threePhaseSets.find((s) => s.quantity === 'current')!;
			expect(i.rotation).toBe('negative');
			expect(i.sequence.zero).toBeCloseTo(0, 3);
			// balanced currents: unbalance 0 with an uncertainty as small as the fit's (taken against the dominant sequence)
			expect(i.unbalancePercent).toBeCloseTo(0, 3);
			expect(i.fit!.unbalanceUncertaintyPercent).toBeLessThan(0.01);
			expect(r.neutral?.source).toBe('computed');
			expect(r.neutral!.neutralRmsA).toBeCloseTo(6, 3);
			expect(r.neutral!.fundamentalRmsA).toBeCloseTo(0, 3);
			expect(r.neutral!.triplenRmsA).toBeCloseTo(6, 3);
			// IEEE 1459 total active power: Σ_j |V_j|·|I_j|·cos(angle V_j − angle I_j) of the fundamentals (the
			// voltages hold no 3rd, so the current's 3rd carries no power; closed form)
			let p = 0;
			for (let j = 0; j < 3; j++) {
				const v = phaseOf(j, V0, V1, V2);
				p += v.mag * 10 * Math.cos(rad(v.deg - (-30 + 120 * j)));
			}
			expect(r.threePhasePower?.note).toBe('from a fit of a short record');
			expect(r.threePhasePower!.figures.activePowerW / p).toBeCloseTo(1, 5);
			expect(validate(reportToJson(r)), JSON.stringify(validate.errors)).toBe(true);
		});
	}

	it('with 1 V RMS noise on each voltage over one cycle, the errors stay within 4 of the stated standard deviations', () => {
		const r = analyseCapture(capture(1, 1));
		const u = r.threePhaseSets.find((s) => s.quantity === 'voltage')!;
		const sd = u.fit!.sequenceUncertainty;
		// the white-noise bound for one amplitude over N samples is √(2σ²/N) (Kay 1993, Example 3.14, from
		// memory); per component (1/3)·√(Σ …) of the three phases: of the order of 0.01 V here
		expect(sd).toBeGreaterThan(0.001);
		expect(sd).toBeLessThan(0.1);
		expect(Math.abs(u.sequence.positive - 4.6)).toBeLessThan(4 * sd);
		expect(Math.abs(u.sequence.negative - 230)).toBeLessThan(4 * sd);
		expect(Math.abs(u.sequence.zero - 2.3)).toBeLessThan(4 * sd);
		expect(Math.abs(u.unbalancePercent - 2)).toBeLessThan(4 * u.fit!.unbalanceUncertaintyPercent);
	});
});
