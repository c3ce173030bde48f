/**
 * Complex DFT engines on interleaved arrays ([re0, im0, re1, im1, ...]), the building blocks of
 * `dftPlan` (dft.ts): fft.js for powers of two, Bluestein's chirp-z for any other length, and a direct
 * sum for tiny lengths. Each engine owns its work buffers and precomputed tables, so a transform after
 * the first allocates nothing. Engines are not re-entrant (shared buffers); JavaScript is single-threaded.
 */
import FFT from 'fft.js';
import { MixedRadixEngine, smoothFactors } from './mixed-radix.js';

/** X[k] = Σ_{n<N} z[n]·e^{−j2πkn/N}, non-normalised; `src` and `dst` interleaved, length 2N, distinct. */
export interface ComplexEngine {
	readonly n: number;
	transform(src: Float64Array, dst: Float64Array): void;
}

const fftCache = new Map<number, FFT>();

/** One fft.js instance per power-of-two size: its twiddle and bit-reversal tables are built once. */
function fftOf(size: number): FFT {
	let f = fftCache.get(size);
	if (!f) {
		f = new FFT(size);
		fftCache.set(size, f);
	}
	return f;
}

export function isPowerOfTwo(n: number): boolean {
	return n >= 1 && (n & (n - 1)) === 0;
}

/** Powers of two ≥ 4: fft.js radix-4 as it is. */
class Pow2Engine implements ComplexEngine {
	private readonly fft: FFT;
	constructor(readonly n: number) {
		this.fft = fftOf(n);
	}
	transform(src: Float64Array, dst: Float64Array): void {
		this.fft.transform(dst, src);
	}
}

/** Direct O(N²) sum with a cos/sin table; for N < 8 only, where it is exact and cheapest. */
class DirectEngine implements ComplexEngine {
	private readonly cos: Float64Array;
	private readonly sin: Float64Array;
	constructor(readonly n: number) {
		this.cos = new Float64Array(n);
		this.sin = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			this.cos[i] = Math.cos((2 * Math.PI * i) / n);
			this.sin[i] = Math.sin((2 * Math.PI * i) / n);
		}
	}
	transform(src: Float64Array, dst: Float64Array): void {
		const n = this.n;
		for (let k = 0; k < n; k++) {
			let re = 0;
			let im = 0;
			for (let i = 0; i < n; i++) {
				const t = (k * i) % n; // exact integer index keeps the twiddle exact
				const xr = src[2 * i];
				const xi = src[2 * i + 1];
				re += xr * this.cos[t] + xi * this.sin[t];
				im += xi * this.cos[t] - xr * this.sin[t];
			}
			dst[2 * k] = re;
			dst[2 * k + 1] = im;
		}
	}
}

/**
 * Bluestein's chirp-z: with kn = (k² + n² − (k−n)²)/2 and w_m = e^{−jπm²/N},
 *   X[k] = w_k · Σ_n (z_n w_n) · conj(w_{k−n}),
 * a linear convolution done as a cyclic one of power-of-two length M ≥ 2N − 1 with fft.js.
 * The inverse FFT is a forward FFT of the conjugate, IFFT(Y) = conj(FFT(conj Y))/M, and 1/M is folded
 * into the cached transform of the chirp, so a call is two fft.js transforms and two O(M) loops.
 * The chirp angle uses (m² mod 2N), an exact integer, so it stays accurate for N up to ~10⁸.
 * Ref: L. I. Bluestein, "A linear filtering approach to the computation of the discrete Fourier
 * transform", IEEE Trans. Audio Electroacoust. 18(4), 1970, 451–455 (from memory).
 */
class BluesteinEngine implements ComplexEngine {
	private readonly m: number;
	private readonly fft: FFT;
	private readonly chirp: Float64Array; // interleaved w_k, k < N
	private readonly chirpHat: Float64Array; // FFT(b)/M, b[m] = conj(w_|m|) cyclic
	private readonly a: Float64Array;
	private readonly b: Float64Array;

	constructor(readonly n: number) {
		let m = 4;
		while (m < 2 * n - 1) m *= 2;
		this.m = m;
		this.fft = fftOf(m);
		this.chirp = new Float64Array(2 * n);
		const twoN = 2 * n;
		for (let k = 0; k < n; k++) {
			const ang = (Math.PI * ((k * k) % twoN)) / n;
			this.chirp[2 * k] = Math.cos(ang);
			this.chirp[2 * k + 1] = -Math.sin(ang);
		}
		this.a = new Float64Array(2 * m);
		this.b = new Float64Array(2 * m);
		const seq = this.a; // borrow as scratch for the chirp sequence
		for (let k = 0; k < n; k++) {
			seq[2 * k] = this.chirp[2 * k];
			seq[2 * k + 1] = -this.chirp[2 * k + 1];
			if (k > 0) {
				seq[2 * (m - k)] = this.chirp[2 * k];
				seq[2 * (m - k) + 1] = -this.chirp[2 * k + 1];
			}
		}
		this.chirpHat = new Float64Array(2 * m);
		this.fft.transform(this.chirpHat, seq);
		for (let i = 0; i < 2 * m; i++) this.chirpHat[i] /= m;
		seq.fill(0);
	}

	transform(src: Float64Array, dst: Float64Array): void {
		const n = this.n;
		const m = this.m;
		const a = this.a;
		const b = this.b;
		const w = this.chirp;
		const h = this.chirpHat;
		for (let k = 0; k < 2 * n; k += 2) {
			const xr = src[k];
			const xi = src[k + 1];
			a[k] = xr * w[k] - xi * w[k + 1];
			a[k + 1] = xr * w[k + 1] + xi * w[k];
		}
		a.fill(0, 2 * n, 2 * m); // the second pass below wrote the tail
		this.fft.transform(b, a);
		for (let i = 0; i < 2 * m; i += 2) {
			const br = b[i];
			const bi = b[i + 1];
			const hr = h[i];
			const hi = h[i + 1];
			a[i] = br * hr - bi * hi;
			a[i + 1] = -(br * hi + bi * hr);
		}
		this.fft.transform(b, a);
		for (let k = 0; k < 2 * n; k += 2) {
			const cr = b[k];
			const ci = -b[k + 1];
			dst[k] = cr * w[k] - ci * w[k + 1];
			dst[k + 1] = cr * w[k + 1] + ci * w[k];
		}
	}
}

/**
 * The cheapest exact engine for length n (n ≥ 1): a direct sum below 8, fft.js for powers of two, the
 * mixed-radix Stockham FFT when every prime factor is ≤ 13 (2000, 5000, 1560, 100 000 …), Bluestein
 * for anything else (primes, lengths with a large prime factor).
 */
export function complexEngine(n: number): ComplexEngine {
	if (n < 8) return new DirectEngine(n);
	if (isPowerOfTwo(n)) return new Pow2Engine(n);
	if (smoothFactors(n)) return new MixedRadixEngine(n);
	return new BluesteinEngine(n);
}
