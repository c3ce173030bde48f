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
	for (let i = 0; i < m; i++)
		err = Math.max(err, Math.abs(out[i] - Math.cos(2 * Math.PI * nu * (start + (i * len) / m) + 0.3)));
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
			for (let nu = 0.002; nu <= passband; nu += passband / 12)
				worst = Math.max(worst, maxError(nu, 700.81, 2001.17, 2048, passband));
			expect(worst).toBeLessThan(2e-5);
		});
	}

	// Kaiser's window design rule (J. F. Kaiser, "Nonrecursive digital filter design using the I0-sinh window
	// function", Proc. IEEE Int. Symp. on Circuits and Systems, 1974; from memory): a lowpass with stopband
	// attenuation A dB and transition width Δf (cycles per sample) needs order N ≈ (A − 7.95) / (14.36·Δf),
	// i.e. N + 1 taps. For the interpolation kernel the transition runs from the passband edge ν_p to the
	// first image of it at 1 − ν_p, so Δf = 1 − 2ν_p; the kernel has 2W taps, so W = ⌈(N + 1) / 2⌉.
	// A = 110 dB is the kernel's design attenuation as syncResample documents it (an input here, not a result).
	const A_DB = 110;
	const kaiserHalfTaps = (passband: number) => Math.ceil(((A_DB - 7.95) / (14.36 * (1 - 2 * passband)) + 1) / 2);

	it("syncResampleHalfTaps follows Kaiser's length rule: 8 taps a side for ν_p = 0.255, 17 for 0.39, 5 for 0", () => {
		// by hand, ν_p = 0.255 (order 51 of 50 Hz at 10 kS/s): Δf = 0.49, N = 102.05 / (14.36 · 0.49) = 102.05 / 7.0364
		// = 14.50, so 15.50 → 16 taps, W = 8
		expect(kaiserHalfTaps(0.255)).toBe(8);
		expect(syncResampleHalfTaps(0.255)).toBe(8);
		// ν_p = 0.39: Δf = 0.22, N = 102.05 / 3.1592 = 32.30, so 33.30 → 34 taps, W = 17
		expect(kaiserHalfTaps(0.39)).toBe(17);
		expect(syncResampleHalfTaps(0.39)).toBe(17);
		// ν_p = 0 (widest transition, Δf = 1): N = 102.05 / 14.36 = 7.11, so 8.11 → 10 taps (an even count), W = 5
		expect(kaiserHalfTaps(0)).toBe(5);
		expect(syncResampleHalfTaps(0)).toBe(5);
	});

	it('syncResampleHalfTaps grows as the passband nears fs/2 and is held within its documented 4…32', () => {
		for (const nu of [0, 0.1, 0.2, 0.255, 0.3, 0.35, 0.39, 0.42])
			expect(syncResampleHalfTaps(nu)).toBe(Math.min(32, Math.max(4, kaiserHalfTaps(nu))));
		expect(syncResampleHalfTaps(0.1)).toBeLessThan(syncResampleHalfTaps(0.3));
		// ν_p = 0.49: Δf = 0.02, N = 102.05 / 0.2872 = 355: far over 32, so held at the cap
		expect(kaiserHalfTaps(0.49)).toBeGreaterThan(32);
		expect(syncResampleHalfTaps(0.49)).toBe(32);
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
		for (let i = 0; i < 2048; i++)
			err = Math.max(err, Math.abs(out[i] - Math.cos(2 * Math.PI * (10 / len) * ((i * len) / 2048) + 0.3)));
		expect(err).toBeLessThan(1e-4);
	});

	it('passes sample values through when the output grid falls on the input samples', () => {
		const x = cosine(300, 0.07, 1);
		const out = syncResample(x, 20, 256, new Float64Array(256));
		for (let i = 0; i < 256; i++) expect(out[i]).toBeCloseTo(x[20 + i], 12);
	});
});
