import { describe, expect, it } from 'vitest';
import { fitSharedSine } from '../../lib/signal/sine-fit.js';

/** Deterministic pseudo-random numbers (mulberry32, common practice) so the phases are random but repeatable. */
function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** x[n] = dc + Σ A_h cos(h·2πf n/fs + φ_h): closed form. */
function tones(
	n: number,
	fs: number,
	f: number,
	dc: number,
	parts: { order: number; amplitude: number; phaseRad: number }[],
): Float64Array {
	const x = new Float64Array(n).fill(dc);
	for (const p of parts)
		for (let i = 0; i < n; i++) x[i] += p.amplitude * Math.cos((p.order * 2 * Math.PI * f * i) / fs + p.phaseRad);
	return x;
}

const wrap = (x: number) => Math.atan2(Math.sin(x), Math.cos(x));

describe('fitSharedSine', () => {
	const random = rng(20261203);
	for (const cycles of [0.5, 0.75, 1, 1.5, 2]) {
		it(`fitSharedSine(noise-free sine, ${cycles} cycles, random phase) recovers f, A, φ within 1e-6 relative (closed form)`, () => {
			const fs = 10_000;
			const f = 45 + 20 * random();
			const phase = Math.PI * (2 * random() - 1);
			const amplitude = 325;
			const n = Math.round((cycles * fs) / f);
			const x = tones(n, fs, f, 3, [{ order: 1, amplitude, phaseRad: phase }]);
			const fit = fitSharedSine([x], fs, { lowHz: 35, highHz: 78, maxOrder: 50 });
			expect(fit.ok).toBe(true);
			if (!fit.ok) return;
			expect(Math.abs(fit.frequencyHz - f) / f).toBeLessThan(1e-6);
			expect(Math.abs(fit.channels[0].amplitude[1] - amplitude) / amplitude).toBeLessThan(1e-6);
			expect(Math.abs(wrap(fit.channels[0].phaseRad[1] - phase))).toBeLessThan(1e-6 * Math.PI);
			expect(fit.channels[0].dc).toBeCloseTo(3, 4);
		});
	}
});

describe('fitSharedSine with harmonics, two channels and decimation', () => {
	it('fitSharedSine([u, i] noise-free, 1.0 cycle at 1 MS/s, 30 % 3rd in i) recovers every tone within 1e-6 relative (closed form)', () => {
		const fs = 1e6;
		const f = 50.2;
		const n = Math.round(fs / f);
		const u = tones(n, fs, f, 0, [{ order: 1, amplitude: 325.27, phaseRad: 0.3 }]);
		const i = tones(n, fs, f, 0.05, [
			{ order: 1, amplitude: 14.14, phaseRad: 0.3 - (25 * Math.PI) / 180 },
			{ order: 3, amplitude: 4.243, phaseRad: 1.1 },
		]);
		const fit = fitSharedSine([u, i], fs, { lowHz: 35, highHz: 78, maxOrder: 50 });
		expect(fit.ok).toBe(true);
		if (!fit.ok) return;
		expect(fit.decimation).toBeGreaterThan(1);
		expect(Math.abs(fit.frequencyHz - f) / f).toBeLessThan(1e-6);
		const [cu, ci] = fit.channels;
		expect(Math.abs(cu.amplitude[1] / 325.27 - 1)).toBeLessThan(1e-6);
		expect(Math.abs(ci.amplitude[1] / 14.14 - 1)).toBeLessThan(1e-6);
		expect(Math.abs(ci.amplitude[3] / 4.243 - 1)).toBeLessThan(1e-6);
		expect(Math.abs(wrap(cu.phaseRad[1] - ci.phaseRad[1]) - (25 * Math.PI) / 180)).toBeLessThan(1e-6);
		expect(Math.abs(wrap(ci.phaseRad[3] - 1.1))).toBeLessThan(1e-6);
		expect(ci.amplitude[5]).toBeLessThan(1e-6 * 14.14);
	});

	it('fitSharedSine(8-bit, 1 MS/s, one cycle, trigger mid-record) gives f within 0.02 % and the lag within 0.2° (Cramér–Rao bound, q²/12 noise)', () => {
		// Bound: Kay, Fundamentals of Statistical Signal Processing: Estimation Theory (1993), Example 3.14
		// (from memory): var(ω̂) ≥ 12 / (η·N(N²−1)) rad²/sample², η = A²/(2σ²) (channels sharing ω add their η);
		// phase at the record's centre var(φ̂) ≥ 2σ²/(A²N). Quantisation noise of step q: σ² = q²/12 (Widrow;
		// common practice). The scope: ±4 V full scale, 256 codes; 230 V through a x100 probe, 10 A through 100 mV/A.
		const fs = 1e6;
		const f = 50.2;
		const n = Math.round(fs / f);
		const q = 8 / 256;
		const quantise = (x: Float64Array) => x.map((v) => q * Math.round(v / q));
		const lagDeg = 25;
		// trigger on the voltage's rising zero crossing at the middle of the record (t = 0 at n/2)
		const phaseU = -Math.PI / 2 - (2 * Math.PI * f * (n / 2)) / fs;
		for (const [extra, label] of [
			[0, 'at the trigger'],
			[0.7, 'phase +0.7 rad'],
			[-1.9, 'phase −1.9 rad'],
		] as const) {
			const u = quantise(tones(n, fs, f, 0, [{ order: 1, amplitude: 3.2527, phaseRad: phaseU + extra }]));
			const i = quantise(
				tones(n, fs, f, 0, [
					{ order: 1, amplitude: 1.414, phaseRad: phaseU + extra - (lagDeg * Math.PI) / 180 },
					{ order: 3, amplitude: 0.4243, phaseRad: 3 * (phaseU + extra) + 0.4 },
				]),
			);
			const sigma2 = (q * q) / 12;
			const eta = (3.2527 ** 2 + 1.414 ** 2) / (2 * sigma2);
			const crbFreqRel = Math.sqrt(12 / (eta * n * (n * n - 1))) / ((2 * Math.PI * f) / fs);
			const crbLagDeg = (Math.sqrt((2 * sigma2) / (1.414 * 1.414 * n)) * 180) / Math.PI;
			// the targets sit well above the white-noise bound: rounding a slow crest is not white noise
			expect(0.02 / 100).toBeGreaterThan(5 * crbFreqRel);
			expect(0.2).toBeGreaterThan(10 * crbLagDeg);
			const floor = q / Math.sqrt(6); // peak of a tone holding the whole q²/12
			const fit = fitSharedSine([u, i], fs, { lowHz: 35, highHz: 78, maxOrder: 50, floors: [floor, floor] });
			expect(fit.ok, label).toBe(true);
			if (!fit.ok) return;
			expect(Math.abs(fit.frequencyHz - f) / f, label).toBeLessThan(0.02 / 100);
			const lag = (wrap(fit.channels[0].phaseRad[1] - fit.channels[1].phaseRad[1]) * 180) / Math.PI;
			expect(Math.abs(lag - lagDeg), label).toBeLessThan(0.2);
			// the stated uncertainty covers the error (3 σ)
			expect(Math.abs(fit.frequencyHz - f), label).toBeLessThan(3 * fit.frequencyStdHz);
		}
	});

	it('fitSharedSine never returns a frequency outside the range it searched', () => {
		const fs = 10_000;
		const x = tones(400, fs, 120, 0, [{ order: 1, amplitude: 1, phaseRad: 0 }]);
		const fit = fitSharedSine([x], fs, { lowHz: 35, highHz: 78, maxOrder: 5 });
		if (fit.ok) {
			expect(fit.frequencyHz).toBeGreaterThanOrEqual(35);
			expect(fit.frequencyHz).toBeLessThanOrEqual(78);
		} else expect(fit.message).toMatch(/35 and 78 Hz/);
	});
});
