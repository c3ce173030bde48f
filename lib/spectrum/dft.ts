/**
 * Exact discrete Fourier transform of any length at O(N log N), planned once per length.
 */
import { complexEngine, type ComplexEngine } from './dft-engines.js';

/**
 * A DFT of one length N, with its tables and work buffers built on the first `dftPlan(N)` call and
 * reused by every transform after it (no allocation per call). Not re-entrant: finish one call before
 * the next on the same plan (JavaScript is single-threaded, so this only matters for callbacks).
 */
export interface DftPlan {
	readonly n: number;
	/**
	 * Real input: X[k] = Σ_{n=0}^{N−1} x[n]·e^{−j2πkn/N}, non-normalised (a 1 V DC input of N samples
	 * gives X[0] = N). Fills bins k = 0 … K−1 with K = min(outRe.length, outIm.length, N); ask for
	 * K = ⌊N/2⌋ + 1 to get the non-redundant half only.
	 * @param input  N real samples (a subarray view is fine); not modified
	 */
	forward(input: Float64Array, outRe: Float64Array, outIm: Float64Array): void;
	/** Complex input (re + j·im, each of length N): the same sum, all K bins as above. */
	forwardComplex(inRe: Float64Array, inIm: Float64Array, outRe: Float64Array, outIm: Float64Array): void;
}

/** Largest length accepted: the chirp's integer arithmetic and the memory stay sane below it. */
export const DFT_MAX_LENGTH = 1 << 26;

class Plan implements DftPlan {
	private full: ComplexEngine | undefined;
	private half: ComplexEngine | undefined;
	private readonly src: Float64Array;
	private readonly dst: Float64Array;
	private readonly twRe: Float64Array | undefined; // e^{−j2πk/N}, k ≤ N/2, for the even-length real path
	private readonly twIm: Float64Array | undefined;

	constructor(readonly n: number) {
		this.src = new Float64Array(2 * n);
		this.dst = new Float64Array(2 * n);
		if (n % 2 === 0 && n >= 4) {
			this.half = complexEngine(n / 2);
			this.twRe = new Float64Array(n / 2 + 1);
			this.twIm = new Float64Array(n / 2 + 1);
			for (let k = 0; k <= n / 2; k++) {
				this.twRe[k] = Math.cos((2 * Math.PI * k) / n);
				this.twIm[k] = -Math.sin((2 * Math.PI * k) / n);
			}
		}
	}

	private fullEngine(): ComplexEngine {
		return (this.full ??= complexEngine(this.n));
	}

	forward(input: Float64Array, outRe: Float64Array, outIm: Float64Array): void {
		const n = this.n;
		if (input.length !== n) throw new RangeError(`dft: input has ${input.length} samples, plan is for ${n}`);
		const bins = Math.min(outRe.length, outIm.length, n);
		if (!this.half) {
			const s = this.src;
			for (let i = 0; i < n; i++) {
				s[2 * i] = input[i];
				s[2 * i + 1] = 0;
			}
			this.fullEngine().transform(s, this.dst);
			copyOut(this.dst, outRe, outIm, bins);
			return;
		}
		// Even N: the N real samples are N/2 interleaved complex values z[m] = x[2m] + j·x[2m+1].
		// Z = DFT_{N/2}(z); then X[k] = E_k + e^{−j2πk/N}·O_k with E_k = (Z_k + Z*_{h−k})/2 and
		// O_k = (Z_k − Z*_{h−k})/(2j), h = N/2 (indices mod h). Ref: any DSP text, "two real FFTs for
		// the price of one" (from memory).
		const h = n / 2;
		const z = this.dst;
		this.half.transform(input, z);
		const twRe = this.twRe!;
		const twIm = this.twIm!;
		const last = Math.min(bins - 1, h);
		for (let k = 0; k <= last; k++) {
			const j = k === 0 || k === h ? 0 : h - k;
			const kk = k === h ? 0 : k;
			const zr = z[2 * kk];
			const zi = z[2 * kk + 1];
			const cr = z[2 * j];
			const ci = -z[2 * j + 1];
			const er = 0.5 * (zr + cr);
			const ei = 0.5 * (zi + ci);
			// (Z − conj)/(2j) = (dI − j·dR)/2 ... written out: d = Z − conj; O = (d.im − j·d.re)/2
			const or = 0.5 * (zi - ci);
			const oi = -0.5 * (zr - cr);
			outRe[k] = er + twRe[k] * or - twIm[k] * oi;
			outIm[k] = ei + twRe[k] * oi + twIm[k] * or;
		}
		for (let k = h + 1; k < bins; k++) {
			outRe[k] = outRe[n - k];
			outIm[k] = -outIm[n - k];
		}
	}

	forwardComplex(inRe: Float64Array, inIm: Float64Array, outRe: Float64Array, outIm: Float64Array): void {
		const n = this.n;
		if (inRe.length !== n || inIm.length !== n) {
			throw new RangeError(`dft: complex input lengths ${inRe.length}/${inIm.length}, plan is for ${n}`);
		}
		const s = this.src;
		for (let i = 0; i < n; i++) {
			s[2 * i] = inRe[i];
			s[2 * i + 1] = inIm[i];
		}
		this.fullEngine().transform(s, this.dst);
		copyOut(this.dst, outRe, outIm, Math.min(outRe.length, outIm.length, n));
	}
}

function copyOut(z: Float64Array, re: Float64Array, im: Float64Array, bins: number): void {
	for (let k = 0; k < bins; k++) {
		re[k] = z[2 * k];
		im[k] = z[2 * k + 1];
	}
}

const plans = new Map<number, DftPlan>();
const PLAN_CACHE_SIZE = 24;
/** Sum of cached lengths kept at most (a Bluestein plan of N ~ 1e6 holds ~100 MB of tables and buffers). */
const PLAN_CACHE_POINTS = 4_000_000;
let cachedPoints = 0;

/**
 * The DFT plan for length `n`: powers of two go to fft.js (radix-4); lengths whose prime factors are all
 * ≤ 13 (2000, 5000, 1560, 100 000 …) to a mixed-radix Stockham FFT (mixed-radix.ts); any other length
 * (primes, large prime factors) to Bluestein's chirp-z over fft.js, its chirp and the chirp's transform
 * computed once. Real input of even length runs as a complex transform of half the length. Plans are
 * cached: the 24 most recently used lengths, at most 4 million points in all.
 * Exact to rounding: relative error ~1e-13 against the direct sum for N up to 10⁶.
 *
 * @param n  transform length, integer 1 … 2²⁶
 * @throws RangeError for a non-integer or out-of-range length
 * @example
 * // 10 cycles of 50 Hz at 10 kS/s: N = 2000, bin k = 10·h is harmonic h, bin spacing 5 Hz
 * const plan = dftPlan(2000);
 * const re = new Float64Array(1001), im = new Float64Array(1001);
 * plan.forward(sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 10 }), re, im);
 * // |X[10]| = 325·2000/2 = 325000 (a sine: X[10] = −j·325000)
 */
export function dftPlan(n: number): DftPlan {
	if (!Number.isInteger(n) || n < 1 || n > DFT_MAX_LENGTH) {
		throw new RangeError(`dftPlan: length must be an integer 1…${DFT_MAX_LENGTH}, got ${n}`);
	}
	let p = plans.get(n);
	if (p) {
		// refresh its place so the most used lengths survive eviction
		plans.delete(n);
		plans.set(n, p);
		return p;
	}
	p = new Plan(n);
	plans.set(n, p);
	cachedPoints += n;
	// evict the least recently used plans, never the one just made
	while (plans.size > 1 && (plans.size > PLAN_CACHE_SIZE || cachedPoints > PLAN_CACHE_POINTS)) {
		const oldest = plans.keys().next().value as number;
		plans.delete(oldest);
		cachedPoints -= oldest;
	}
	return p;
}

/**
 * One-off DFT of real samples (allocates its output): { re, im } of length N.
 * For repeated transforms use `dftPlan(n).forward` with your own output arrays.
 * @example dftReal(new Float64Array([1, 1, 1, 1])) // re = [4, 0, 0, 0], im = [0, 0, 0, 0]
 */
export function dftReal(samples: Float64Array): { re: Float64Array; im: Float64Array } {
	const re = new Float64Array(samples.length);
	const im = new Float64Array(samples.length);
	if (samples.length > 0) dftPlan(samples.length).forward(samples, re, im);
	return { re, im };
}
