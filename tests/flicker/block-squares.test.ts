/**
 * The block squares (lib/flicker/block-squares.ts): the full-rate stage that squares the input and hands the
 * chain one filtered mean square per D samples. Checked against the closed form of its kernel, a triangle of
 * 2D taps: H(f) = (sin(π f D/fs) / (D sin(π f/fs)))² · cos(π f/fs) (two D-sample boxcars, the Dirichlet
 * kernel, and a 2-tap mean; closed form), and against the decimation rule of docs/flicker.md.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BlockSquares, blockSquaresGain, flickerDecimation } from '../../lib/flicker/index.js';

/** The closed form of the kernel, written here independently of the code. */
function dirichletSquared(f: number, d: number, fs: number): number {
	const x = (Math.PI * f) / fs;
	const box = Math.abs(Math.sin(x)) < 1e-15 ? 1 : Math.sin(d * x) / (d * Math.sin(x));
	return box * box * Math.cos(x);
}

/** Runs `x` through a fresh BlockSquares in chunks of the given sizes (cycled); returns every output. */
function decimate(x: Float64Array, d: number, sizes: number[] = [x.length], startMeanSquare = 1): Float64Array {
	const b = new BlockSquares(d, startMeanSquare);
	const out = new Float64Array(Math.ceil(x.length / d) + 1);
	const scratch = new Float64Array(x.length + 2);
	let k = 0;
	for (let i = 0, s = 0; i < x.length; s++) {
		const stop = Math.min(x.length, i + Math.max(1, sizes[s % sizes.length]));
		const m = b.run(x, i, stop, scratch);
		out.set(scratch.subarray(0, m), k);
		k += m;
		i = stop;
	}
	return out.subarray(0, k);
}

/** Amplitude of the tone at `hz` in y (sampled at `rateHz`) by correlation over an integer number of periods. */
function toneAmplitude(y: Float64Array, hz: number, rateHz: number): number {
	let c = 0,
		s = 0;
	for (let k = 0; k < y.length; k++) {
		c += y[k] * Math.cos((2 * Math.PI * hz * k) / rateHz);
		s += y[k] * Math.sin((2 * Math.PI * hz * k) / rateHz);
	}
	return (2 * Math.hypot(c, s)) / y.length;
}

describe('BlockSquares', () => {
	it('passes a constant square unchanged: the kernel weights sum to 1 (closed form)', () => {
		for (const d of [1, 2, 6, 8]) {
			const y = decimate(new Float64Array(96).fill(-3), d, [96], 9);
			expect(y.length).toBe(96 / d);
			for (const v of y) expect(v).toBeCloseTo(9, 12);
		}
	});

	// x = √(1 + a cos 2π f t) puts one tone of amplitude a at f into x²; after the kernel and the decimation the
	// chain sees it at f folded to [0, fs/(2D)] with amplitude a·|H(f)|.
	const fs = 12800,
		d = 8,
		rate = fs / d;
	for (const [f, folded] of [
		[8.8, 8.8],
		[100, 100],
		[1600 + 8.8, 8.8],
		[3200 - 20, 20],
		[4800 + 35, 35],
	]) {
		it(`a tone in the squares at ${f} Hz (fs ${fs}, D ${d}) reaches the chain at ${folded} Hz scaled by |H(${f})| (Dirichlet kernel, closed form)`, () => {
			const a = 0.2;
			const n = 8002 * d;
			const x = new Float64Array(n);
			for (let i = 0; i < n; i++) x[i] = Math.sqrt(1 + a * Math.cos((2 * Math.PI * f * i) / fs));
			const y = decimate(x, d).subarray(2); // the first two values still hold the start state
			expect(y.length).toBe(8000);
			// the time origin moved by 2D samples: the amplitude does not depend on it
			const expected = a * Math.abs(dirichletSquared(f, d, fs));
			expect(toneAmplitude(y, folded, rate)).toBeCloseTo(expected, 9);
			expect(Math.abs(blockSquaresGain(f, d, fs))).toBeCloseTo(Math.abs(dirichletSquared(f, d, fs)), 12);
		});
	}

	// sin(π D (k fs/D + δ)/fs) = ±sin(π D δ/fs), so to first order in δ:
	// |H| ≈ (π δ/F)² cos(π k/D) / (D sin(π k/D))², about (δ/(k F))² for k ≪ D (F = fs/D).
	it('near a multiple k·fs/D the kernel has a double zero: |H(k F + δ)| ≈ (π δ/F)² cos(πk/D) / (D sin(πk/D))² (closed form, first order in δ)', () => {
		for (const k of [1, 2, 3])
			for (const delta of [2, 8.8, 35]) {
				const h = Math.abs(blockSquaresGain(k * rate + delta, d, fs));
				const firstOrder =
					((Math.PI * delta) / rate) ** 2 * (Math.cos((Math.PI * k) / d) / (d * Math.sin((Math.PI * k) / d)) ** 2);
				expect(h / firstOrder).toBeGreaterThan(0.9);
				expect(h / firstOrder).toBeLessThan(1.1);
			}
		expect(Math.abs(blockSquaresGain(rate + 8.8, d, fs))).toBeLessThan((8.8 / rate) ** 2);
	});

	it('property: any chunking gives the identical output (fast-check)', () => {
		const x = new Float64Array(5000);
		for (let i = 0; i < x.length; i++) x[i] = 325 * Math.sin(i * 0.049) + 7 * Math.sin(i * 1.3);
		for (const dd of [1, 3, 8]) {
			const whole = decimate(x, dd);
			fc.assert(
				fc.property(fc.array(fc.integer({ min: 1, max: 900 }), { minLength: 1, maxLength: 6 }), (sizes) => {
					expect(decimate(x, dd, sizes)).toEqual(whole);
				}),
				{ numRuns: 20 },
			);
		}
	});

	it('a NaN or infinite sample is counted and repeats the previous finite square', () => {
		const x = new Float64Array(16).fill(2);
		x[5] = NaN;
		x[11] = -Infinity;
		const b = new BlockSquares(4, 4);
		const out = new Float64Array(8);
		expect(b.run(x, 0, 16, out)).toBe(4);
		expect(b.nonFinite).toBe(2);
		for (let k = 0; k < 4; k++) expect(out[k]).toBeCloseTo(4, 12);
	});
});

describe('flickerDecimation', () => {
	it('keeps the chain at ≥ 1600 S/s on a whole rate: 1 below 3200 S/s, 4 at 6400, 5 at 10 kS/s, 8 at 12.8 kS/s, 25 at 44.1 kS/s, 625 at 1 MS/s', () => {
		expect(flickerDecimation(1600)).toBe(1);
		expect(flickerDecimation(3199)).toBe(1);
		expect(flickerDecimation(3200)).toBe(2);
		expect(flickerDecimation(6400)).toBe(4);
		expect(flickerDecimation(10000)).toBe(5);
		expect(flickerDecimation(12800)).toBe(8);
		expect(flickerDecimation(44100)).toBe(25);
		expect(flickerDecimation(1e6)).toBe(625);
	});

	it('property: the chain rate is ≥ 1600 S/s and below 3200 S/s from 3200 S/s on; D divides the rate, or else the samples of 10 minutes (intervals end on a chain value)', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1600, max: 900_000 }), (fsHz) => {
				const dd = flickerDecimation(fsHz);
				expect(Number.isInteger(dd) && dd >= 1).toBe(true);
				expect(fsHz / dd).toBeGreaterThanOrEqual(1600);
				if (fsHz >= 3200) expect(fsHz / dd).toBeLessThan(3200);
				expect(fsHz % dd === 0 || (600 * fsHz) % dd === 0).toBe(true);
			}),
			{ numRuns: 300 },
		);
	});

	it('a prime rate (10 007 S/s) has no divisor to use: D = 6 divides its 10 minutes (6 004 200 samples = 6 × 1 000 700)', () => {
		expect(flickerDecimation(10007)).toBe(6);
	});

	it('a rate that is not a whole number: D divides the samples of 10 minutes (6400.5 S/s: 600 × 6400.5 = 3 840 300 = 4 × 960 075)', () => {
		const dd = flickerDecimation(6400.5);
		expect(6400.5 / dd).toBeGreaterThanOrEqual(1600);
		expect(3_840_300 % dd).toBe(0);
		expect(dd).toBe(4); // 3 840 300 = 4 × 960 075, and 6400.5 / 4 ≥ 1600
	});
});
