import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { durationS, openCaptures, parseComtrade, sampleCount } from '../../lib/index.js';

// The real recording in ../shared/data (never copied into the repo). Facts checked here are the ones its
// PROVENANCE.md states; numbers are recomputed in this file from the raw .cfg/.dat text, by hand.
const DIR = '../shared/data/feeder-sag-1999/';
const present = existsSync(DIR + 'feeder-sag.cfg') && existsSync(DIR + 'feeder-sag.dat');
if (!present)
	console.warn(
		`SKIPPED: the real COMTRADE capture ${DIR} is absent (a clone without ../shared); feeder-sag tests do not run.`,
	);

describe.skipIf(!present)('parseComtrade on the real feeder-sag recording (PROVENANCE.md)', () => {
	const cfgText = present ? readFileSync(DIR + 'feeder-sag.cfg', 'utf8') : '';
	const datText = present ? readFileSync(DIR + 'feeder-sag.dat', 'utf8') : '';
	const capture = present ? parseComtrade(cfgText, new TextEncoder().encode(datText), 'feeder-sag.cfg') : undefined!;

	// Independent reading of the files: analog line k of the .cfg is line 3 + k; fields 6 and 7 are a and b.
	const cfgLines = cfgText.split(/\r?\n/);
	const ab = cfgLines
		.slice(2, 8)
		.map((l) => l.split(','))
		.map((f) => ({ name: f[1], unit: f[4], a: Number(f[5]), b: Number(f[6]), ps: f[12] }));
	const rows = datText
		.trim()
		.split(/\r?\n/)
		.map((l) => l.split(',').map(Number));

	it('has 6 analog channels Ia, Ib, Ic (A) and Va, Vb, Vc (V), as PROVENANCE.md says', () => {
		expect(capture.channels.map((c) => c.name)).toEqual(['Ia', 'Ib', 'Ic', 'Va', 'Vb', 'Vc']);
		expect(capture.channels.map((c) => c.unit)).toEqual(['A', 'A', 'A', 'V', 'V', 'V']);
		expect(capture.channels.map((c) => c.quantity)).toEqual([
			'current',
			'current',
			'current',
			'voltage',
			'voltage',
			'voltage',
		]);
		expect(capture.channels.map((c) => c.phase)).toEqual(['A', 'B', 'C', 'A', 'B', 'C']);
	});

	it('has a 60 Hz system, 7678.4833984375 samples/s and 3584 samples, as PROVENANCE.md says', () => {
		expect(capture.nominalFrequencyHz).toBe(60);
		expect(capture.sampleRateHz).toBe(7678.4833984375);
		expect(capture.timeS).toBeUndefined();
		for (const c of capture.channels) expect(c.samples.length).toBe(3584);
		expect(rows.length).toBe(3584);
	});

	it('starts before the trigger: first time stamp -41663 µs with equal first-data and trigger times', () => {
		// .cfg lines 12 and 13 are equal, and the first .dat stamp is -41663 (µs, timemult 1): t0 = -0.041663 s
		expect(cfgLines[11]).toBe(cfgLines[12]);
		expect(cfgLines[11]).toBe('11/07/2012,08:44:21.051022');
		expect(rows[0][1]).toBe(-41663);
		expect(capture.startS).toBeCloseTo(-0.041663, 12);
		expect(capture.startS).toBeLessThan(0);
		expect(capture.startTime).toBe('2012-07-11T08:44:21.051022');
	});

	it("spans (3584 − 1) / 7678.4833984375 Hz = 0.466629 s from first to last sample, as PROVENANCE.md's figures give", () => {
		// PROVENANCE.md: 3584 samples at 7678.4833984375 samples/s. First to last sample: 3583 intervals,
		// 3583 / 7678.4833984375 = 0.4666286… s (by hand: 7678.4833984375 × 0.4666 = 3582.78, remainder
		// 0.22 / 7678.48 = 0.0000286 s). The whole record (each sample standing for 1/fs) is 3584 / fs = 0.466759 s.
		const samples = 3584;
		const rateHz = 7678.4833984375;
		const spanS = (samples - 1) / rateHz;
		expect(spanS).toBeCloseTo(0.466629, 6);
		expect((sampleCount(capture) - 1) / capture.sampleRateHz).toBeCloseTo(spanS, 12);
		expect(durationS(capture)).toBeCloseTo(samples / rateHz, 12);
		// last sample time from the parsed capture: startS + span = -0.041663 + 0.466629 = 0.424966 s
		expect(capture.startS + (sampleCount(capture) - 1) / capture.sampleRateHz).toBeCloseTo(-0.041663 + spanS, 12);
	});

	it('has time stamps that agree with the rate, so the reader raises no warning', () => {
		// by hand: stamps run from -41663 to 424965 µs = 0.466628 s, within the 1 µs stamp resolution of the
		// 0.4666286 s that 3583 intervals at the declared rate take
		expect(rows[rows.length - 1][1] - rows[0][1]).toBe(466628);
		expect(
			Math.abs((rows[rows.length - 1][1] - rows[0][1]) * 1e-6 - (sampleCount(capture) - 1) / capture.sampleRateHz),
		).toBeLessThanOrEqual(1e-6);
		expect(rows.every((r, k) => r[0] === k + 1)).toBe(true);
		expect(capture.diagnostics.filter((d) => d.severity === 'warning')).toEqual([]);
	});

	it('reports primary values (PS = P in every channel line), with a diagnostic saying so', () => {
		expect(ab.every((x) => x.ps === 'P')).toBe(true);
		expect(capture.diagnostics.some((d) => d.code === 'comtrade-values' && d.message.includes('primary'))).toBe(true);
	});

	it('applies a·x+b: record 1 worked by hand from the .cfg constants', () => {
		// record 1: 1,-41663,67707,12085,65964,57756,4179,76689
		// Ia = 0.00618221921336894 × 67707 − 317.518127441406 = 101.0614 A (to 4 decimals, by hand)
		expect(capture.channels[0].samples[0]).toBeCloseTo(0.00618221921336894 * 67707 - 317.518127441406, 9);
		expect(capture.channels[0].samples[0]).toBeCloseTo(101.0614, 3);
		// Va = 0.231206244021046 × 57756 − 11241.396484375 = 2112.15 V
		expect(capture.channels[3].samples[0]).toBeCloseTo(0.231206244021046 * 57756 - 11241.396484375, 6);
		expect(capture.channels[3].samples[0]).toBeCloseTo(2112.15, 1);
	});

	it('matches a·x+b applied in the test to every raw value of every channel', () => {
		for (let c = 0; c < 6; c++) {
			const { a, b } = ab[c];
			const s = capture.channels[c].samples;
			let worst = 0;
			for (let k = 0; k < rows.length; k++) worst = Math.max(worst, Math.abs(s[k] - (a * rows[k][2 + c] + b)));
			expect(worst).toBeLessThan(1e-9 * 12000);
		}
	});

	it('gives a pre-dip phase-A voltage near the 7.2 kV line-to-neutral PROVENANCE.md states (RMS from the raw text)', () => {
		// RMS over the first two cycles at 60 Hz: round(2 × 7678.4833984375 / 60) = 256 samples, before the dip
		const n = Math.round((2 * 7678.4833984375) / 60);
		const { a, b } = ab[3];
		let sum = 0;
		for (let k = 0; k < n; k++) sum += (a * rows[k][5] + b) ** 2;
		const rmsByHand = Math.sqrt(sum / n);
		let sumCapture = 0;
		for (let k = 0; k < n; k++) sumCapture += capture.channels[3].samples[k] ** 2;
		expect(Math.sqrt(sumCapture / n)).toBeCloseTo(rmsByHand, 6);
		expect(rmsByHand).toBeGreaterThan(7200 * 0.9);
		expect(rmsByHand).toBeLessThan(7200 * 1.1);
	});

	it('opens through openCaptures with the .dat named in another case', () => {
		const { captures, errors } = openCaptures([
			{ name: 'feeder-sag.cfg', bytes: new TextEncoder().encode(cfgText) },
			{ name: 'FEEDER-SAG.DAT', bytes: new TextEncoder().encode(datText) },
		]);
		expect(errors).toEqual([]);
		expect(captures).toHaveLength(1);
		expect(captures[0].channels).toHaveLength(6);
	});
});
