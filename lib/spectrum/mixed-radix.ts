/**
 * Mixed-radix FFT (radices 4, 2, 3, 5 and a generic odd radix up to 13) for lengths whose prime factors
 * are all ≤ 13: Stockham's self-sorting decimation in frequency, so no bit reversal and the output comes
 * out in natural order. Interleaved complex arrays; tables and buffers built once per length.
 * Ref: C. Van Loan, "Computational Frameworks for the Fast Fourier Transform", SIAM 1992, §1.7
 * (Stockham autosort) (from memory).
 */
import type { ComplexEngine } from './dft-engines.js';

const MAX_RADIX = 13;

/** Factors of n in the order the stages use them (4s first, then 2, 3, 5, 7, 11, 13), or undefined if a prime factor exceeds 13. */
export function smoothFactors(n: number): number[] | undefined {
	const f: number[] = [];
	// 0, a fraction, NaN or a length beyond 2^53 has no factorisation (0 % 4 === 0 would loop forever)
	if (!(Number.isSafeInteger(n) && n >= 1)) return undefined;
	let r = n;
	while (r % 4 === 0) {
		f.push(4);
		r /= 4;
	}
	for (const p of [2, 3, 5, 7, 11, 13]) {
		while (r % p === 0) {
			f.push(p);
			r /= p;
		}
	}
	return r === 1 ? f : undefined;
}

interface Stage {
	radix: number;
	/** Butterflies per block (current length / radix). */
	m: number;
	/** Stride: product of the radices of earlier stages. */
	s: number;
	/** Twiddles ω_L^{p·u}, L = current length, for p < m, u = 1 … radix−1, interleaved. */
	tw: Float64Array;
}

export class MixedRadixEngine implements ComplexEngine {
	private readonly stages: Stage[] = [];
	private readonly bufA: Float64Array;
	private readonly bufB: Float64Array;
	/** ω_P^k for the generic radix butterflies, per radix. */
	private readonly roots = new Map<number, Float64Array>();

	constructor(readonly n: number) {
		const factors = smoothFactors(n);
		if (!factors || n < 2)
			throw new RangeError(`mixed-radix FFT needs n ≥ 2 with prime factors ≤ ${MAX_RADIX}, got ${n}`);
		let len = n;
		let s = 1;
		for (const p of factors) {
			const m = len / p;
			const tw = new Float64Array(2 * m * (p - 1));
			for (let j = 0; j < m; j++) {
				for (let u = 1; u < p; u++) {
					// reduce j·u mod len exactly before taking the angle
					const a = (-2 * Math.PI * ((j * u) % len)) / len;
					tw[2 * (j * (p - 1) + u - 1)] = Math.cos(a);
					tw[2 * (j * (p - 1) + u - 1) + 1] = Math.sin(a);
				}
			}
			this.stages.push({ radix: p, m, s, tw });
			if (p > 5 && !this.roots.has(p)) {
				const r = new Float64Array(2 * p);
				for (let k = 0; k < p; k++) {
					r[2 * k] = Math.cos((-2 * Math.PI * k) / p);
					r[2 * k + 1] = Math.sin((-2 * Math.PI * k) / p);
				}
				this.roots.set(p, r);
			}
			len = m;
			s *= p;
		}
		this.bufA = new Float64Array(2 * n);
		this.bufB = new Float64Array(2 * n);
	}

	transform(src: Float64Array, dst: Float64Array): void {
		const last = this.stages.length - 1;
		for (let i = 0; i <= last; i++) {
			const x = i === 0 ? src : i % 2 === 1 ? this.bufA : this.bufB;
			const y = i === last ? dst : i % 2 === 0 ? this.bufA : this.bufB;
			const st = this.stages[i];
			switch (st.radix) {
				case 4:
					radix4(st, x, y);
					break;
				case 2:
					radix2(st, x, y);
					break;
				case 3:
					radix3(st, x, y);
					break;
				case 5:
					radix5(st, x, y);
					break;
				default:
					radixGeneric(st, x, y, this.roots.get(st.radix)!);
			}
		}
	}
}

// Each stage: for block p < m and lane q < s, inputs a_r = x[q + s·(p + r·m)], outputs
// y[q + s·(P·p + u)] = (Σ_r a_r·ω_P^{r·u}) · ω_L^{p·u}. Indices below are in complex units (×2 for re).

function radix2(st: Stage, x: Float64Array, y: Float64Array): void {
	const { m, s, tw } = st;
	for (let p = 0; p < m; p++) {
		const wr = tw[2 * p];
		const wi = tw[2 * p + 1];
		for (let q = 0; q < s; q++) {
			const i0 = 2 * (q + s * p);
			const i1 = i0 + 2 * s * m;
			const o0 = 2 * (q + s * 2 * p);
			const o1 = o0 + 2 * s;
			const ar = x[i0],
				ai = x[i0 + 1],
				br = x[i1],
				bi = x[i1 + 1];
			y[o0] = ar + br;
			y[o0 + 1] = ai + bi;
			const dr = ar - br,
				di = ai - bi;
			y[o1] = dr * wr - di * wi;
			y[o1 + 1] = dr * wi + di * wr;
		}
	}
}

function radix4(st: Stage, x: Float64Array, y: Float64Array): void {
	const { m, s, tw } = st;
	const sm2 = 2 * s * m;
	for (let p = 0; p < m; p++) {
		const t = 6 * p;
		const w1r = tw[t],
			w1i = tw[t + 1],
			w2r = tw[t + 2],
			w2i = tw[t + 3],
			w3r = tw[t + 4],
			w3i = tw[t + 5];
		for (let q = 0; q < s; q++) {
			const i0 = 2 * (q + s * p);
			const i1 = i0 + sm2,
				i2 = i1 + sm2,
				i3 = i2 + sm2;
			const a0r = x[i0],
				a0i = x[i0 + 1],
				a1r = x[i1],
				a1i = x[i1 + 1];
			const a2r = x[i2],
				a2i = x[i2 + 1],
				a3r = x[i3],
				a3i = x[i3 + 1];
			const t0r = a0r + a2r,
				t0i = a0i + a2i,
				t1r = a0r - a2r,
				t1i = a0i - a2i;
			const t2r = a1r + a3r,
				t2i = a1i + a3i;
			const t3r = a1i - a3i,
				t3i = a3r - a1r; // (a1 − a3)·(−j)
			const o0 = 2 * (q + s * 4 * p);
			const o1 = o0 + 2 * s,
				o2 = o1 + 2 * s,
				o3 = o2 + 2 * s;
			y[o0] = t0r + t2r;
			y[o0 + 1] = t0i + t2i;
			let r = t1r + t3r,
				i = t1i + t3i;
			y[o1] = r * w1r - i * w1i;
			y[o1 + 1] = r * w1i + i * w1r;
			r = t0r - t2r;
			i = t0i - t2i;
			y[o2] = r * w2r - i * w2i;
			y[o2 + 1] = r * w2i + i * w2r;
			r = t1r - t3r;
			i = t1i - t3i;
			y[o3] = r * w3r - i * w3i;
			y[o3 + 1] = r * w3i + i * w3r;
		}
	}
}

const SIN60 = Math.sqrt(3) / 2;

function radix3(st: Stage, x: Float64Array, y: Float64Array): void {
	const { m, s, tw } = st;
	const sm2 = 2 * s * m;
	for (let p = 0; p < m; p++) {
		const t = 4 * p;
		const w1r = tw[t],
			w1i = tw[t + 1],
			w2r = tw[t + 2],
			w2i = tw[t + 3];
		for (let q = 0; q < s; q++) {
			const i0 = 2 * (q + s * p);
			const i1 = i0 + sm2,
				i2 = i1 + sm2;
			const a0r = x[i0],
				a0i = x[i0 + 1];
			const sr = x[i1] + x[i2],
				si = x[i1 + 1] + x[i2 + 1];
			const dr = x[i1] - x[i2],
				di = x[i1 + 1] - x[i2 + 1];
			const mr = a0r - 0.5 * sr,
				mi = a0i - 0.5 * si;
			const jr = SIN60 * di,
				ji = -SIN60 * dr; // (−j·√3/2)(a1 − a2)
			const o0 = 2 * (q + s * 3 * p);
			const o1 = o0 + 2 * s,
				o2 = o1 + 2 * s;
			y[o0] = a0r + sr;
			y[o0 + 1] = a0i + si;
			let r = mr + jr,
				i = mi + ji;
			y[o1] = r * w1r - i * w1i;
			y[o1 + 1] = r * w1i + i * w1r;
			r = mr - jr;
			i = mi - ji;
			y[o2] = r * w2r - i * w2i;
			y[o2 + 1] = r * w2i + i * w2r;
		}
	}
}

const C1 = Math.cos((2 * Math.PI) / 5);
const C2 = Math.cos((4 * Math.PI) / 5);
const S1 = Math.sin((2 * Math.PI) / 5);
const S2 = Math.sin((4 * Math.PI) / 5);

function radix5(st: Stage, x: Float64Array, y: Float64Array): void {
	const { m, s, tw } = st;
	const sm2 = 2 * s * m;
	for (let p = 0; p < m; p++) {
		const t = 8 * p;
		const w1r = tw[t],
			w1i = tw[t + 1],
			w2r = tw[t + 2],
			w2i = tw[t + 3];
		const w3r = tw[t + 4],
			w3i = tw[t + 5],
			w4r = tw[t + 6],
			w4i = tw[t + 7];
		for (let q = 0; q < s; q++) {
			const i0 = 2 * (q + s * p);
			const i1 = i0 + sm2,
				i2 = i1 + sm2,
				i3 = i2 + sm2,
				i4 = i3 + sm2;
			const a0r = x[i0],
				a0i = x[i0 + 1];
			const b1r = x[i1] + x[i4],
				b1i = x[i1 + 1] + x[i4 + 1];
			const b2r = x[i2] + x[i3],
				b2i = x[i2 + 1] + x[i3 + 1];
			const d1r = x[i1] - x[i4],
				d1i = x[i1 + 1] - x[i4 + 1];
			const d2r = x[i2] - x[i3],
				d2i = x[i2 + 1] - x[i3 + 1];
			const r1r = a0r + C1 * b1r + C2 * b2r,
				r1i = a0i + C1 * b1i + C2 * b2i;
			const r2r = a0r + C2 * b1r + C1 * b2r,
				r2i = a0i + C2 * b1i + C1 * b2i;
			const e1r = S1 * d1r + S2 * d2r,
				e1i = S1 * d1i + S2 * d2i;
			const e2r = S2 * d1r - S1 * d2r,
				e2i = S2 * d1i - S1 * d2i;
			const o0 = 2 * (q + s * 5 * p);
			const o1 = o0 + 2 * s,
				o2 = o1 + 2 * s,
				o3 = o2 + 2 * s,
				o4 = o3 + 2 * s;
			y[o0] = a0r + b1r + b2r;
			y[o0 + 1] = a0i + b1i + b2i;
			// y1 = r1 − j·e1, y4 = r1 + j·e1, y2 = r2 − j·e2, y3 = r2 + j·e2
			let r = r1r + e1i,
				i = r1i - e1r;
			y[o1] = r * w1r - i * w1i;
			y[o1 + 1] = r * w1i + i * w1r;
			r = r2r + e2i;
			i = r2i - e2r;
			y[o2] = r * w2r - i * w2i;
			y[o2 + 1] = r * w2i + i * w2r;
			r = r2r - e2i;
			i = r2i + e2r;
			y[o3] = r * w3r - i * w3i;
			y[o3 + 1] = r * w3i + i * w3r;
			r = r1r - e1i;
			i = r1i + e1r;
			y[o4] = r * w4r - i * w4i;
			y[o4 + 1] = r * w4i + i * w4r;
		}
	}
}

function radixGeneric(st: Stage, x: Float64Array, y: Float64Array, roots: Float64Array): void {
	const { radix: P, m, s, tw } = st;
	for (let p = 0; p < m; p++) {
		for (let q = 0; q < s; q++) {
			const o0 = 2 * (q + s * P * p);
			for (let u = 0; u < P; u++) {
				let sr = 0;
				let si = 0;
				for (let r = 0; r < P; r++) {
					const k = (r * u) % P;
					const i = 2 * (q + s * (p + r * m));
					sr += x[i] * roots[2 * k] - x[i + 1] * roots[2 * k + 1];
					si += x[i] * roots[2 * k + 1] + x[i + 1] * roots[2 * k];
				}
				const o = o0 + 2 * s * u;
				if (u === 0) {
					y[o] = sr;
					y[o + 1] = si;
				} else {
					const t = 2 * (p * (P - 1) + u - 1);
					y[o] = sr * tw[t] - si * tw[t + 1];
					y[o + 1] = sr * tw[t + 1] + si * tw[t];
				}
			}
		}
	}
}
