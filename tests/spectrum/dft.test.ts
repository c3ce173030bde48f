import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { dftPlan, dftReal } from '../../lib/index.js';
import { gaussianNoise } from '../helpers/synth.js';

const require = createRequire(import.meta.url);
// ndarray-fft: an independent float64 FFT from the registry (radix-2 + its own Bluestein), test-only.
const ndarray = require('ndarray') as (data: Float64Array, shape: number[]) => unknown;
const ndfft = require('ndarray-fft') as (dir: 1 | -1, re: unknown, im: unknown) => void;

/** The definition, summed directly: X[k] = Σ x[n]·e^{−j2πkn/N}, with the angle's index reduced mod N. */
function naiveDft(re: Float64Array, im?: Float64Array): { re: Float64Array; im: Float64Array } {
	const n = re.length;
	const outRe = new Float64Array(n);
	const outIm = new Float64Array(n);
	for (let k = 0; k < n; k++) {
		let a = 0;
		let b = 0;
		for (let i = 0; i < n; i++) {
			const t = (2 * Math.PI * ((k * i) % n)) / n;
			const xr = re[i];
			const xi = im ? im[i] : 0;
			a += xr * Math.cos(t) + xi * Math.sin(t);
			b += xi * Math.cos(t) - xr * Math.sin(t);
		}
		outRe[k] = a;
		outIm[k] = b;
	}
	return { re: outRe, im: outIm };
}

/** max |X − Y| / max |Y| over all bins. */
function relError(
	aRe: ArrayLike<number>,
	aIm: ArrayLike<number>,
	bRe: ArrayLike<number>,
	bIm: ArrayLike<number>,
	bins: number,
): number {
	let err = 0;
	let scale = 0;
	for (let k = 0; k < bins; k++) {
		err = Math.max(err, Math.hypot(aRe[k] - bRe[k], aIm[k] - bIm[k]));
		scale = Math.max(scale, Math.hypot(bRe[k], bIm[k]));
	}
	return err / scale;
}

const primes = [2, 3, 5, 7, 11, 13, 17, 97, 331, 1009, 2003];
// smooth lengths exercise every mixed-radix butterfly (2, 3, 4, 5 and the generic 7, 11, 13); 2046 = 2·3·11·31 runs Bluestein
const composites = [4, 6, 8, 9, 12, 14, 30, 49, 64, 77, 100, 121, 169, 360, 1000, 1001, 1024, 1560, 2000, 2002, 2046];

describe('dftPlan', () => {
	for (const n of [1, ...primes, ...composites]) {
		it(`dftPlan(${n}).forward of random real input equals the direct O(N²) sum to 1e-12 relative`, () => {
			const x = gaussianNoise(n, 1, n);
			const re = new Float64Array(n);
			const im = new Float64Array(n);
			dftPlan(n).forward(x, re, im);
			const ref = naiveDft(x);
			expect(relError(re, im, ref.re, ref.im, n)).toBeLessThan(1e-12);
		});
	}

	for (const n of [5, 12, 97, 1000, 1009]) {
		it(`dftPlan(${n}).forwardComplex of random complex input equals the direct sum to 1e-12 relative`, () => {
			const xr = gaussianNoise(n, 1, 3 * n);
			const xi = gaussianNoise(n, 1, 3 * n + 1);
			const re = new Float64Array(n);
			const im = new Float64Array(n);
			dftPlan(n).forwardComplex(xr, xi, re, im);
			const ref = naiveDft(xr, xi);
			expect(relError(re, im, ref.re, ref.im, n)).toBeLessThan(1e-12);
		});
	}

	// Above ~3e4 points ndarray-fft's own error passes 1e-9 (measured: 7e-7 at 65536, 2e-5 at 100000 on
	// bins checked by the direct sum), so long lengths are checked against the direct sum bin by bin below.
	for (const n of [1009, 2000, 4096, 4999, 10007]) {
		it(`dftPlan(${n}).forward agrees with ndarray-fft (independent float64 FFT) to 1e-9 relative`, () => {
			const x = gaussianNoise(n, 1, 7 * n);
			const re = new Float64Array(n);
			const im = new Float64Array(n);
			dftPlan(n).forward(x, re, im);
			const rr = Float64Array.from(x);
			const ri = new Float64Array(n);
			// ndarray-fft's dir = +1 sums with e^{+j2πkn/N}; for real input that is the conjugate of ours
			ndfft(1, ndarray(rr, [n]), ndarray(ri, [n]));
			for (let k = 0; k < n; k++) ri[k] = -ri[k];
			expect(relError(re, im, rr, ri, n)).toBeLessThan(1e-9);
		});
	}

	for (const n of [65536, 100000, 131071]) {
		it(`dftPlan(${n}).forward equals the direct sum on sampled bins to 1e-11 relative`, () => {
			const x = gaussianNoise(n, 1, 11 * n);
			const re = new Float64Array(n);
			const im = new Float64Array(n);
			dftPlan(n).forward(x, re, im);
			let err = 0;
			let scale = 0;
			for (const k of [0, 1, 17, 333, 12345, Math.floor(n / 2) - 1, n - 5]) {
				let a = 0;
				let b = 0;
				for (let i = 0; i < n; i++) {
					const t = (2 * Math.PI * ((k * i) % n)) / n;
					a += x[i] * Math.cos(t);
					b -= x[i] * Math.sin(t);
				}
				err = Math.max(err, Math.hypot(re[k] - a, im[k] - b));
				scale = Math.max(scale, Math.hypot(a, b));
			}
			expect(err / scale).toBeLessThan(1e-11);
		});
	}

	it('forward fills only the bins its output arrays hold (half spectrum of an odd length)', () => {
		const n = 1009;
		const x = gaussianNoise(n, 1, 42);
		const re = new Float64Array(505);
		const im = new Float64Array(505);
		dftPlan(n).forward(x, re, im);
		const ref = naiveDft(x);
		expect(relError(re, im, ref.re, ref.im, 505)).toBeLessThan(1e-12);
	});

	it('a second call on the same plan gives the same result as the first (buffers reused, not stale)', () => {
		const n = 2000;
		const plan = dftPlan(n);
		const a = gaussianNoise(n, 1, 1);
		const b = gaussianNoise(n, 1, 2);
		const re1 = new Float64Array(n);
		const im1 = new Float64Array(n);
		plan.forward(a, re1, im1);
		const re2 = new Float64Array(n);
		const im2 = new Float64Array(n);
		plan.forward(b, re2, im2);
		plan.forward(a, re2, im2);
		expect(Array.from(re2)).toEqual(Array.from(re1));
		expect(Array.from(im2)).toEqual(Array.from(im1));
	});

	it('dftPlan(n) returns the cached plan for a length it has seen', () => {
		expect(dftPlan(2000)).toBe(dftPlan(2000));
	});

	it('forward of a DC input of N ones gives X[0] = N and zero elsewhere (definition)', () => {
		const n = 1560;
		const { re, im } = dftReal(new Float64Array(n).fill(1));
		expect(re[0]).toBeCloseTo(n, 9);
		let rest = 0;
		for (let k = 1; k < n; k++) rest = Math.max(rest, Math.hypot(re[k], im[k]));
		expect(rest).toBeLessThan(1e-9);
	});

	it('forward of a cosine on bin k gives N/2 at k and N−k (closed form)', () => {
		const n = 2001;
		const k = 37;
		const x = new Float64Array(n).map((_, i) => Math.cos((2 * Math.PI * k * i) / n));
		const { re, im } = dftReal(x);
		expect(re[k]).toBeCloseTo(n / 2, 8);
		expect(re[n - k]).toBeCloseTo(n / 2, 8);
		expect(Math.abs(im[k])).toBeLessThan(1e-8);
	});

	it('forward satisfies Parseval: Σ|X|² = N·Σx² (invariant)', () => {
		const n = 3001;
		const x = gaussianNoise(n, 2, 9);
		const { re, im } = dftReal(x);
		let time = 0;
		let freq = 0;
		for (let i = 0; i < n; i++) {
			time += x[i] * x[i];
			freq += re[i] * re[i] + im[i] * im[i];
		}
		expect(freq / (n * time)).toBeCloseTo(1, 12);
	});

	it('forward does not modify its input', () => {
		const x = gaussianNoise(1000, 1, 5);
		const copy = Float64Array.from(x);
		dftReal(x);
		expect(Array.from(x)).toEqual(Array.from(copy));
	});

	it('dftPlan rejects a non-integer, zero or negative length with RangeError', () => {
		expect(() => dftPlan(0)).toThrow(RangeError);
		expect(() => dftPlan(10.5)).toThrow(RangeError);
		expect(() => dftPlan(-4)).toThrow(RangeError);
	});

	it('forward rejects an input of the wrong length with RangeError', () => {
		expect(() => dftPlan(16).forward(new Float64Array(15), new Float64Array(16), new Float64Array(16))).toThrow(
			RangeError,
		);
	});

	it('dftReal of no samples returns empty arrays', () => {
		expect(dftReal(new Float64Array(0)).re.length).toBe(0);
	});

	it('forward propagates NaN rather than hiding it', () => {
		const x = new Float64Array(100).fill(1);
		x[3] = NaN;
		expect(dftReal(x).re[0]).toBeNaN();
	});
});
