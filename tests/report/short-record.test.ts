/**
 * The short-record path of analyseCapture (records under two whole cycles): every expected value is a
 * closed-form figure of the signals built here, never a value the code produced.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import type { Capture, Channel, Quantity } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { fitSharedSine } from '../../lib/signal/sine-fit.js';
import { harmonicSamples, type Tone } from '../helpers/synth.js';

const schema = JSON.parse(
	readFileSync(join(import.meta.dirname, '..', '..', 'lib', 'report', 'report.schema.json'), 'utf8'),
);
const validate = new Ajv2020({ allErrors: true, strict: false }).compile(schema);

const channel = (name: string, unit: string, quantity: Quantity, samples: Float64Array): Channel => ({
	name,
	unit,
	quantity,
	samples,
});
const capture = (channels: Channel[], sampleRateHz: number): Capture => ({
	source: 'scope.csv',
	sampleRateHz,
	startS: -0.01,
	channels,
	metadata: {},
	diagnostics: [],
});
/** 8-bit scope: ±4 V in 256 codes at the input, then × ratio to V or A. */
const scope = (x: Float64Array, ratio: number) => x.map((v) => (8 / 256) * Math.round(v / ratio / (8 / 256)) * ratio);

const F = 50.2;
const LAG = 25;
/** 230 V with a x100 probe; 10 A fundamental lagging 25° plus a 3 A 3rd through a 100 mV/A clamp (× 10 A/V). */
function scopeCapture(cycles: number, fs: number, quantise = true): Capture {
	const n = Math.round((cycles * fs) / F);
	const u: Tone[] = [{ order: 1, rms: 230, phaseDeg: 0 }];
	const i: Tone[] = [
		{ order: 1, rms: 10, phaseDeg: -LAG },
		{ order: 3, rms: 3, phaseDeg: -3 * LAG - 30 },
	];
	const uu = harmonicSamples(u, { frequencyHz: F, sampleRateHz: fs, samples: n });
	const ii = harmonicSamples(i, { frequencyHz: F, sampleRateHz: fs, samples: n });
	return capture(
		[
			channel('U', 'V', 'voltage', quantise ? scope(uu, 100) : uu),
			channel('I', 'A', 'current', quantise ? scope(ii, 10) : ii),
		],
		fs,
	);
}

describe('analyseCapture on a one-cycle 8-bit scope capture at 1 MS/s', () => {
	const report = analyseCapture(scopeCapture(1.004, 1e6));
	const [u, i] = report.channels;

	it('gives the frequency within 0.02 % and marks it as fitted with an uncertainty', () => {
		expect(report.shortRecord).not.toBeNull();
		expect(report.shortRecord!.note).toBe('from a fit of a short record');
		expect(Math.abs(report.frequencyHz / F - 1)).toBeLessThan(2e-4);
		expect(report.shortRecord!.frequencyUncertaintyHz).toBeGreaterThan(0);
		expect(report.warnings.join(' ')).toMatch(/1\.004 cycles at the fitted 50\.2/);
	});

	it('gives fundamentals (230 V, 10 A), THD_I 30 % and lag 25° / 25/(360·50.2) s within the 8-bit resolution', () => {
		// one code is 3.125 V and 0.3125 A: the fundamentals to well under a code
		expect(u.fit!.fundamentalRms).toBeCloseTo(230, 0);
		expect(Math.abs(i.fit!.fundamentalRms - 10)).toBeLessThan(0.02);
		expect(Math.abs(i.thdPercent - 30)).toBeLessThan(0.3);
		expect(Math.abs(report.pairs[0].lagDeg - LAG)).toBeLessThan(0.2);
		expect(Math.abs(report.pairs[0].lagS - LAG / 360 / F)).toBeLessThan(0.2 / 360 / F);
		expect(report.pairs[0].fit!.lagDegUncertainty).toBeGreaterThan(0);
	});

	it('gives IEEE 1459 power: P = V1·I1·cos 25° (the 3rd meets no voltage 3rd), DPF cos 25°, current lagging', () => {
		const p = report.power[0];
		expect(Math.abs(p.activeW / (230 * 10 * Math.cos((LAG * Math.PI) / 180)) - 1)).toBeLessThan(0.005);
		expect(p.displacementPowerFactor).toBeCloseTo(Math.cos((LAG * Math.PI) / 180), 3);
		// the current carries a large 3rd (no sine), so the words stop at "lags" (load character only where a fundamental-only model fits)
		expect(p.relation).toBe('lags');
		expect(p.fit!.note).toBe('from a fit of a short record');
	});

	it('raises no clipping (the crests sit far from the ±4 V rails) and validates against report.schema.json', () => {
		expect([...u.warnings, ...i.warnings].join(' ')).not.toMatch(/clipping/i);
		expect(validate(reportToJson(report)), JSON.stringify(validate.errors)).toBe(true);
	});
});

describe('analyseCapture short-record rules', () => {
	it('withholds rectified mean, form factor and meter error under one whole period; RMS from the fit is √(230² + 0) (0.75 cycle, closed form)', () => {
		const r = analyseCapture(scopeCapture(0.75, 10_000, false));
		const u = r.channels[0];
		expect(r.shortRecord).not.toBeNull();
		expect(u.rectifiedMean).toBeNaN();
		expect(u.formFactor).toBeNaN();
		expect(u.averageResponding.errorPercent).toBeNaN();
		expect(u.rms).toBeCloseTo(230, 3);
		expect(reportToJson(r).channels[0].formFactor).toBeNull();
	});

	it("says '1 cycle', not '1 cycles', for a record of exactly one cycle (English grammar)", () => {
		// unquantised 230 V / 50.2 Hz, exactly one period at 100 kS/s: the fit holds 1.000 cycles
		const r = analyseCapture(scopeCapture(1, 100_000, false));
		expect(r.shortRecord).not.toBeNull();
		expect(r.warnings.join(' ')).toMatch(/holds 1 cycle at the fitted 50\.2/);
	});

	it('marks a harmonic under the rounding floor q/√12 as below resolution', () => {
		// 8-bit voltage channel (q = 3.125 V, floor 0.90 V RMS) with a 0.5 V RMS 5th: under the floor
		const fs = 1e6;
		const n = Math.round(fs / F);
		const uu = scope(
			harmonicSamples(
				[
					{ order: 1, rms: 230 },
					{ order: 5, rms: 0.5 },
				],
				{ frequencyHz: F, sampleRateHz: fs, samples: n },
			),
			100,
		);
		const r = analyseCapture(capture([channel('U', 'V', 'voltage', uu)], fs));
		const h5 = r.channels[0].harmonics[5];
		expect(r.channels[0].resolution!.harmonicFloorRms).toBeCloseTo(3.125 / Math.sqrt(12), 9);
		expect(h5.belowResolution).toBe(true);
		// the fundamental stands far above the floor and is not marked
		expect(r.channels[0].harmonics[1].belowResolution).toBeUndefined();
	});

	it('reportToJson gives a below-resolution harmonic no number as if measured: null figures, the floor q/√12 as upper bound', () => {
		// same 8-bit channel: q = 0.03125 V × 100 = 3.125 V after the x100 probe, floor q/√12 (uniform rounding, common practice)
		const fs = 1e6;
		const n = Math.round(fs / F);
		const uu = scope(
			harmonicSamples(
				[
					{ order: 1, rms: 230 },
					{ order: 5, rms: 0.5 },
				],
				{ frequencyHz: F, sampleRateHz: fs, samples: n },
			),
			100,
		);
		const json = reportToJson(analyseCapture(capture([channel('U', 'V', 'voltage', uu)], fs)));
		expect(validate(json)).toBe(true);
		const h5 = json.channels[0].harmonics[5];
		expect(h5.belowResolution).toBe(true);
		expect(h5.rms).toBeNull();
		expect(h5.percentOfFundamental).toBeNull();
		expect(h5.phaseDeg).toBeNull();
		expect(h5.rmsUpperBound).toBeCloseTo(3.125 / Math.sqrt(12), 9);
		// as % of the 230 V fundamental: 0.902/230 = 0.392 %
		expect(h5.percentOfFundamentalUpperBound).toBeCloseTo((100 * 3.125) / Math.sqrt(12) / 230, 2);
		// a measured order keeps its figure and carries no bound
		const h1 = json.channels[0].harmonics[1];
		expect(h1.rms).toBeCloseTo(230, 0);
		expect(h1.rmsUpperBound).toBeUndefined();
	});
});

describe('limits on a short record', () => {
	it('applyLimits names the fitted harmonics as the basis, not the 10/12-cycle subgroups the record cannot have', () => {
		// EN 50160 judges on IEC 61000-4-30 class A subgroups of 10/12-cycle windows (from memory): a one-cycle
		// record has none, so the report must not claim them
		const r = analyseCapture(scopeCapture(1.004, 1e6), { limits: 'en50160' });
		expect(r.limits?.basis.kind).toBe('short-record-fit');
		expect(r.limits?.basis.text).not.toMatch(/subgroups of 10\/12-cycle windows/);
		expect(validate(reportToJson(r))).toBe(true);
		const distortion = r.findings.find((f) => f.topic === 'distortion' && f.channel === 'U');
		expect(distortion?.text).toMatch(/fitted over a short record/);
	});
});

describe('fitted and whole-cycle paths agree where both apply', () => {
	for (const cycles of [2, 2.5, 3]) {
		it(`fitSharedSine over ${cycles} cycles agrees with analyseCapture's whole-cycle figures within 0.1 % (f, V1, I1, THD_I, lag)`, () => {
			const fs = 10_000;
			const cap = scopeCapture(cycles + 0.02, fs, false);
			const whole = analyseCapture(cap);
			expect(whole.shortRecord).toBeNull();
			expect(whole.cyclesAnalysed).toBeGreaterThanOrEqual(2);
			const fit = fitSharedSine(
				cap.channels.map((c) => c.samples),
				fs,
				{ lowHz: 35, highHz: 78, maxOrder: 50 },
			);
			expect(fit.ok).toBe(true);
			if (!fit.ok) return;
			const rel = (a: number, b: number) => Math.abs(a / b - 1);
			expect(rel(fit.frequencyHz, whole.frequencyHz)).toBeLessThan(1e-3);
			expect(rel(fit.channels[0].amplitude[1] / Math.SQRT2, whole.channels[0].harmonics[1].rms)).toBeLessThan(1e-3);
			expect(rel(fit.channels[1].amplitude[1] / Math.SQRT2, whole.channels[1].harmonics[1].rms)).toBeLessThan(1e-3);
			expect(
				rel(100 * (fit.channels[1].amplitude[3] / fit.channels[1].amplitude[1]), whole.channels[1].thdPercent),
			).toBeLessThan(1e-3);
			const lagFit = ((fit.channels[0].phaseRad[1] - fit.channels[1].phaseRad[1]) * 180) / Math.PI;
			expect(rel(lagFit, whole.pairs[0].lagDeg)).toBeLessThan(1e-3);
		});
	}
});
