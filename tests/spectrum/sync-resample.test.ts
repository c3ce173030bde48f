import { describe, expect, it } from 'vitest';
import { syncResample, syncResampleHalfTaps } from '../../lib/index.js';

function cosine(n: number, cyclesPerSample: number, phaseRad: number): Float64Array {
	return new Float64Array(n).map((_, i) => Math.cos(2 * Math.PI * cyclesPerSample * i + phaseRad));
}

/** Largest |out[m] − cos(2πν·t_m + φ)| with t_m = start + m·L/M (the exact value of the sampled cosine). */
function maxError(nu: number, start: number, len: number, m: number, passbandRatio?: number, n = 6000): number {
	const x = cosine(n, nu, 0.3);
	const out = syncResample(x, start, len, new Float64Array(m), passbandRatio);
	let err = 0;
	for (let i = 0; i < m; i++) err = Math.max(err, Math.abs(out[i] - Math.cos(2 * Math.PI * nu * (start + (i * len) / m) + 0.3)));
	return err;
}

describe('syncResample', () => {
	for (const nu of [0.005, 0.05, 0.15, 0.25, 0.32, 0.35]) {
		it(`reproduces a cosine of ${nu}·fs between samples to 1e-5 of its amplitude (band-limited interpolation)`, () => {
			expect(maxError(nu, 1000.37, 2222.71, 4096)).toBeLessThan(1e-5);
		});
	}

	for (const passband of [0.1, 0.255, 0.303, 0.39]) {
		it(`with passbandRatio ${passband} (${syncResampleHalfTaps(passband)} taps a side) reproduces cosines up to ${passband}·fs to 2e-5`, () => {
			let worst = 0;
			for (let nu = 0.002; nu <= passband; nu += passband / 12) worst = Math.max(worst, maxError(nu, 700.81, 2001.17, 2048, passband));
			expect(worst).toBeLessThan(2e-5);
		});
	}

	it('syncResampleHalfTaps grows as the passband nears fs/2 and stays within 4…32', () => {
		expect(syncResampleHalfTaps(0.255)).toBe(8);
		expect(syncResampleHalfTaps(0.1)).toBeLessThan(syncResampleHalfTaps(0.3));
		// Kaiser's rule for 110 dB with the widest transition (0 … 1): 2W − 1 ≥ 102.05/(2.285·2π)
		expect(syncResampleHalfTaps(0)).toBe(Math.ceil(((110 - 7.95) / (2.285 * 2 * Math.PI) + 1) / 2));
		expect(syncResampleHalfTaps(0.5)).toBeLessThanOrEqual(32);
	});

	it('keeps a constant exactly (weights renormalised to sum 1)', () => {
		const out = syncResample(new Float64Array(500).fill(3.25), 10.5, 400.3, new Float64Array(512));
		for (const v of out) expect(v).toBeCloseTo(3.25, 13);
	});

	it('at the capture edges continues the signal one window length away (whole-cycle window: accurate to 1e-4)', () => {
		// 10 cycles of a 0.005·fs cosine fill the capture exactly: L = 2000 samples, start 0
		const len = 2000;
		const x = cosine(len, 10 / len, 0.3);
		const out = syncResample(x, 0, len, new Float64Array(2048));
		let err = 0;
		for (let i = 0; i < 2048; i++) err = Math.max(err, Math.abs(out[i] - Math.cos(2 * Math.PI * (10 / len) * ((i * len) / 2048) + 0.3)));
		expect(err).toBeLessThan(1e-4);
	});

	it('passes sample values through when the output grid falls on the input samples', () => {
		const x = cosine(300, 0.07, 1);
		const out = syncResample(x, 20, 256, new Float64Array(256));
		for (let i = 0; i < 256; i++) expect(out[i]).toBeCloseTo(x[20 + i], 12);
	});
});
