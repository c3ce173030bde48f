import { describe, expect, it } from 'vitest';
import { syncResample } from '../../lib/index.js';

function cosine(n: number, cyclesPerSample: number, phaseRad: number): Float64Array {
	return new Float64Array(n).map((_, i) => Math.cos(2 * Math.PI * cyclesPerSample * i + phaseRad));
}

/** Largest |out[m] − cos(2πν·t_m + φ)| with t_m = start + m·L/M (the exact value of the sampled cosine). */
function maxError(nu: number, start: number, len: number, m: number, n = 6000): number {
	const x = cosine(n, nu, 0.3);
	const out = syncResample(x, start, len, new Float64Array(m));
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
