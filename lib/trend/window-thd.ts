/**
 * THD of one 10/12-cycle window on every channel at once, straight from the channels' ring buffers, fast
 * enough to run on every window of a long recording (~25 µs per channel, about 1/8 of lib/spectrum's
 * harmonicWindow, whose 24-tap sinc resampler is exact to 1e-6 but costs ~0.2 ms per window).
 *
 * Method (IEC 61000-4-7 synchronised window): the window from zero crossing startT to endT (c whole
 * cycles, fractional samples) is resampled onto M = 2048 points by 8-point Lagrange interpolation, so
 * DFT bin c·h is harmonic h exactly; then a radix-2 FFT (fft.js); C_k = √2·|X_k|/M; harmonic
 * subgroups G_sg,h² = C²_{ch−1} + C²_{ch} + C²_{ch+1}; THDS = √(Σ_{h=2..50} G_sg,h²) / G_sg,1 · 100 %.
 * Orders at or above fs/2 are left out.
 *
 * Speed (the figures are those of each channel alone, to rounding): the points' places and weights are
 * worked out once per window and serve every channel, two pairs of channels at a time; each pair goes
 * through one complex FFT (x_a + i·x_b) and is split by conjugate symmetry, X_a[k] = (Z[k] + Z*[M−k]) / 2,
 * X_b[k] = (Z[k] − Z*[M−k]) / 2i (common practice: two real DFTs for the price of one complex DFT), only
 * at the bins the subgroups use. Only channels of finite, non-zero RMS within PAIR_MAX_RATIO of each
 * other are paired; any other channel gets its own real FFT. Samples are read from the ring in place
 * unless the window wraps round its end. A pair's figures equal each channel's alone to rounding (~1e-13
 * relative; tests/trend/window-thd.test.ts holds them to 1e-9).
 *
 * Accuracy of the interpolation (worst fractional position; computed from the 8-point Lagrange
 * frequency response): magnitude error < 0.003 % up to 0.1·fs, < 0.06 % up to 0.15·fs, < 0.5 % at
 * 0.2·fs, < 2.3 % at 0.25·fs (the 50th harmonic at 10 kS/s); IEC 61000-4-7 class I allows ±5 % of the
 * reading. Low orders, which dominate THD, are exact to ~1e-5 relative.
 *
 * Ref: IEC 61000-4-7:2002, 4.4.1 and 3.3 (subgroups), via docs/methods.md §2.1-2.2 (from memory); IEC
 * 61000-4-30:2015 class A uses subgroups up to the 50th order (docs/methods.md §2.2, from memory).
 */
import { MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import FFT from 'fft.js';

const M = 2048;
const TAPS = 8;
const PHASES = 1024;
/** Highest harmonic order analysed: lib/spectrum's MAX_HARMONIC_ORDER (IEC 61000-4-30 class A: 50). */
export const TREND_MAX_ORDER = MAX_HARMONIC_ORDER;
const MAX_ORDER = TREND_MAX_ORDER;
/**
 * Largest RMS ratio of two channels sharing one complex FFT. The split leaves rounding of ~1e-16·√(log₂M)
 * of the larger channel's spectrum in the smaller one's (common practice: floating-point FFT error
 * grows as ε·√log N), so ≤ 1e4 keeps it below ~1e-11 of the smaller channel's fundamental.
 */
export const PAIR_MAX_RATIO = 1e4;

let weights: Float64Array | undefined;

/** Lagrange weights for taps at offsets −3 … 4 around a point at fraction f of the way from 0 to 1. */
function weightTable(): Float64Array {
	if (weights) return weights;
	const w = new Float64Array((PHASES + 1) * TAPS);
	for (let p = 0; p <= PHASES; p++) {
		const f = p / PHASES;
		for (let j = 0; j < TAPS; j++) {
			const xj = j - 3;
			let v = 1;
			for (let m = 0; m < TAPS; m++) if (m !== j) v *= (f - (m - 3)) / (xj - (m - 3));
			w[p * TAPS + j] = v;
		}
	}
	weights = w;
	return w;
}

/** What `thdWindow` fills for channel c. */
export interface WindowThdOut {
	/** THDS in % at [c]; NaN when the fundamental is 0 (or a sample is not finite). */
	thd: Float64Array;
	/**
	 * When given, [c] (length ≥ 51) receives each order's subgroup in % of the fundamental's subgroup
	 * (index = order; [1] = 100; NaN at or above fs/2 and for order 0).
	 */
	harmonics?: Float64Array[];
	/**
	 * When given, [2c], [2c + 1] receive the fundamental's DFT bin (re, im): a phasor in the window's time
	 * frame, the same frame for every channel of the window.
	 */
	fundamentals?: Float64Array;
}

/** Whether two channels of RMS `a` and `b` may share one complex FFT (both finite, non-zero, within PAIR_MAX_RATIO). */
export function pairable(a: number, b: number): boolean {
	return a > 0 && b > 0 && a < Infinity && b < Infinity && a <= b * PAIR_MAX_RATIO && b <= a * PAIR_MAX_RATIO;
}

export class WindowThd {
	private readonly fft = new FFT(M);
	private readonly input = new Float64Array(M);
	private readonly packed = new Float64Array(2 * M);
	private readonly packed2 = new Float64Array(2 * M);
	/** Channels of the pairs of the window being measured: [a0, b0, a1, b1, …]. */
	private pairs: number[] = [0, 0, 0, 0];
	private readonly spectrum = new Float64Array(2 * M);
	/** Power |X_k|² of the bins in use (k ≤ c·51 + 1 ≤ M/2), for the channel(s) just transformed. */
	private readonly powerA = new Float64Array(M / 2 + 1);
	private readonly powerB = new Float64Array(M / 2 + 1);
	private readonly fund = new Float64Array(4);
	/** Copies of a window that wraps round the ring's end (with the taps' margin). */
	private rawA = new Float64Array(M + 64);
	private rawB = new Float64Array(M + 64);
	private rawC = new Float64Array(M + 64);
	private rawD = new Float64Array(M + 64);
	/** Per output point: the first tap's index from the window's first tap, and its weights' row; same for every channel of a window. */
	private readonly tapAt = new Int32Array(M);
	private readonly tapPhase = new Int32Array(M);
	private placedStartT = NaN;
	private placedEndT = NaN;
	/** Of the window placed: the first tap's sample index, taps' sample count, highest order below fs/2. */
	private first = 0;
	private count = 0;
	private hMax = 0;
	/** Index of the first tap in the array `source` returned last. */
	private runStart = 0;

	constructor(readonly cycles: number) {
		if (!Number.isInteger(cycles) || cycles < 1 || cycles * (MAX_ORDER + 1) + 1 > M / 2)
			throw new RangeError(`cycles must be an integer 1…20, got ${cycles}`);
	}

	/**
	 * THDS in % of every channel's window [startT, endT) (sample indices, fractional) of `rings`
	 * (power-of-two length, index & mask), into `out`; needs samples from startT − 4 to endT + 5 in the
	 * rings. `rms` (the channels' RMS over the window) decides which channels share an FFT (`pairable`).
	 */
	thdWindow(
		rings: readonly Float64Array[],
		mask: number,
		startT: number,
		endT: number,
		sampleRateHz: number,
		rms: ArrayLike<number>,
		out: WindowThdOut,
	): void {
		this.place(startT, endT, sampleRateHz);
		const pairs = this.pairs;
		let n = 0;
		let held = -1;
		for (let c = 0; c < rings.length; c++) {
			if (!pairable(rms[c], rms[c])) this.single(rings, mask, c, out);
			else if (held < 0) held = c;
			else if (pairable(rms[held], rms[c])) {
				if (n + 2 > pairs.length) this.pairs = pairs.concat(pairs);
				this.pairs[n++] = held;
				this.pairs[n++] = c;
				held = -1;
			} else {
				this.single(rings, mask, held, out);
				held = c;
			}
		}
		if (held >= 0) this.single(rings, mask, held, out);
		// Two pairs at a time share each point's weights; a last pair alone.
		let k = 0;
		for (; k + 4 <= n; k += 4) this.quad(rings, mask, k, out);
		if (k < n) this.pair(rings, mask, this.pairs[k], this.pairs[k + 1], out);
	}

	/**
	 * THDS in % of one channel's window, as `thdWindow` (always its own real FFT); NaN when the fundamental is 0.
	 * @example thdPercent(ringOfU1, mask, 1234.56, 3235.1, 10_000) // 6.16441 for the docs/methods.md §1.3 mix
	 */
	thdPercent(
		ring: Float64Array,
		mask: number,
		startT: number,
		endT: number,
		sampleRateHz: number,
		harmonicsOut?: Float64Array,
		fundamentalOut?: Float64Array,
	): number {
		const out: WindowThdOut = {
			thd: new Float64Array(1),
			harmonics: harmonicsOut && [harmonicsOut],
			fundamentals: fundamentalOut && new Float64Array(2),
		};
		this.place(startT, endT, sampleRateHz);
		this.single([ring], mask, 0, out);
		if (fundamentalOut) fundamentalOut.set(out.fundamentals!);
		return out.thd[0];
	}

	/** Where each of the M points of the window startT..endT falls (computed once for all channels of a window). */
	private place(startT: number, endT: number, sampleRateHz: number): void {
		const c = this.cycles;
		const f1 = (c * sampleRateHz) / (endT - startT);
		let h = 1;
		while (h < MAX_ORDER && (h + 1) * f1 < sampleRateHz / 2) h++;
		this.hMax = h;
		this.first = Math.floor(startT) - 3;
		this.count = Math.floor(endT) + 5 - this.first;
		if (this.rawA.length < this.count) {
			this.rawA = new Float64Array(this.count);
			this.rawB = new Float64Array(this.count);
			this.rawC = new Float64Array(this.count);
			this.rawD = new Float64Array(this.count);
		}
		if (startT === this.placedStartT && endT === this.placedEndT) return;
		const step = (endT - startT) / M;
		const t0 = startT - (Math.floor(startT) - 3) - 3;
		for (let m = 0; m < M; m++) {
			const t = t0 + m * step;
			const i = Math.floor(t);
			this.tapAt[m] = i;
			this.tapPhase[m] = Math.round((t - i) * PHASES) * TAPS;
		}
		this.placedStartT = startT;
		this.placedEndT = endT;
	}

	/**
	 * The window's taps of `ring` in one run: the ring itself unless they wrap round its end, else a copy
	 * in `raw`; the run's first tap is at `runStart`.
	 */
	private source(ring: Float64Array, mask: number, raw: Float64Array): Float64Array {
		const at = this.first & mask;
		const count = this.count;
		this.runStart = at;
		if (at + count <= ring.length) return ring;
		for (let j = 0; j < count; j++) raw[j] = ring[(this.first + j) & mask];
		this.runStart = 0;
		return raw;
	}

	/** Channel c alone: resampled, real FFT, subgroups. */
	private single(rings: readonly Float64Array[], mask: number, c: number, out: WindowThdOut): void {
		const w = this.source(rings[c], mask, this.rawA);
		const off = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const x = this.input;
		for (let m = 0; m < M; m++) {
			const i = at[m] + off;
			const p = phase[m];
			x[m] =
				tab[p] * w[i] +
				tab[p + 1] * w[i + 1] +
				tab[p + 2] * w[i + 2] +
				tab[p + 3] * w[i + 3] +
				tab[p + 4] * w[i + 4] +
				tab[p + 5] * w[i + 5] +
				tab[p + 6] * w[i + 6] +
				tab[p + 7] * w[i + 7];
		}
		this.fft.realTransform(this.spectrum, x);
		const s = this.spectrum;
		const pw = this.powerA;
		const cy = this.cycles;
		for (let h = 1; h <= this.hMax; h++) {
			for (let k = cy * h - 1; k <= cy * h + 1; k++) pw[k] = s[2 * k] * s[2 * k] + s[2 * k + 1] * s[2 * k + 1];
		}
		this.fund[0] = s[2 * cy];
		this.fund[1] = s[2 * cy + 1];
		this.subgroups(pw, 0, c, out);
	}

	/** Channels a and b in one complex FFT (x_a + i·x_b), split by conjugate symmetry. */
	private pair(rings: readonly Float64Array[], mask: number, a: number, b: number, out: WindowThdOut): void {
		const wa = this.source(rings[a], mask, this.rawA);
		const oa = this.runStart;
		const wb = this.source(rings[b], mask, this.rawB);
		const ob = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const z = this.packed;
		for (let m = 0; m < M; m++) {
			const p = phase[m];
			const t0 = tab[p];
			const t1 = tab[p + 1];
			const t2 = tab[p + 2];
			const t3 = tab[p + 3];
			const t4 = tab[p + 4];
			const t5 = tab[p + 5];
			const t6 = tab[p + 6];
			const t7 = tab[p + 7];
			const i = at[m] + oa;
			const j = at[m] + ob;
			z[2 * m] =
				t0 * wa[i] +
				t1 * wa[i + 1] +
				t2 * wa[i + 2] +
				t3 * wa[i + 3] +
				t4 * wa[i + 4] +
				t5 * wa[i + 5] +
				t6 * wa[i + 6] +
				t7 * wa[i + 7];
			z[2 * m + 1] =
				t0 * wb[j] +
				t1 * wb[j + 1] +
				t2 * wb[j + 2] +
				t3 * wb[j + 3] +
				t4 * wb[j + 4] +
				t5 * wb[j + 5] +
				t6 * wb[j + 6] +
				t7 * wb[j + 7];
		}
		this.finishPair(z, a, b, out);
	}

	/** The pairs at this.pairs[k … k + 3] together: each point's weights loaded once for four channels. */
	private quad(rings: readonly Float64Array[], mask: number, k: number, out: WindowThdOut): void {
		const a = this.pairs[k];
		const b = this.pairs[k + 1];
		const c = this.pairs[k + 2];
		const d = this.pairs[k + 3];
		const wa = this.source(rings[a], mask, this.rawA);
		const oa = this.runStart;
		const wb = this.source(rings[b], mask, this.rawB);
		const ob = this.runStart;
		const wc = this.source(rings[c], mask, this.rawC);
		const oc = this.runStart;
		const wd = this.source(rings[d], mask, this.rawD);
		const od = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const z = this.packed;
		const y = this.packed2;
		for (let m = 0; m < M; m++) {
			const p = phase[m];
			const t0 = tab[p];
			const t1 = tab[p + 1];
			const t2 = tab[p + 2];
			const t3 = tab[p + 3];
			const t4 = tab[p + 4];
			const t5 = tab[p + 5];
			const t6 = tab[p + 6];
			const t7 = tab[p + 7];
			let i = at[m] + oa;
			z[2 * m] =
				t0 * wa[i] +
				t1 * wa[i + 1] +
				t2 * wa[i + 2] +
				t3 * wa[i + 3] +
				t4 * wa[i + 4] +
				t5 * wa[i + 5] +
				t6 * wa[i + 6] +
				t7 * wa[i + 7];
			i = at[m] + ob;
			z[2 * m + 1] =
				t0 * wb[i] +
				t1 * wb[i + 1] +
				t2 * wb[i + 2] +
				t3 * wb[i + 3] +
				t4 * wb[i + 4] +
				t5 * wb[i + 5] +
				t6 * wb[i + 6] +
				t7 * wb[i + 7];
			i = at[m] + oc;
			y[2 * m] =
				t0 * wc[i] +
				t1 * wc[i + 1] +
				t2 * wc[i + 2] +
				t3 * wc[i + 3] +
				t4 * wc[i + 4] +
				t5 * wc[i + 5] +
				t6 * wc[i + 6] +
				t7 * wc[i + 7];
			i = at[m] + od;
			y[2 * m + 1] =
				t0 * wd[i] +
				t1 * wd[i + 1] +
				t2 * wd[i + 2] +
				t3 * wd[i + 3] +
				t4 * wd[i + 4] +
				t5 * wd[i + 5] +
				t6 * wd[i + 6] +
				t7 * wd[i + 7];
		}
		this.finishPair(z, a, b, out);
		this.finishPair(y, c, d, out);
	}

	/** FFT of the packed pair `z` (channels a + i·b), split, subgroups of both. */
	private finishPair(z: Float64Array, a: number, b: number, out: WindowThdOut): void {
		this.fft.transform(this.spectrum, z);
		this.split();
		this.subgroups(this.powerA, 0, a, out);
		this.subgroups(this.powerB, 2, b, out);
	}

	/** The two channels' bin powers (and fundamentals) from the packed spectrum Z: X_a = (Z_k + Z*_{M−k})/2, X_b = (Z_k − Z*_{M−k})/2i. */
	private split(): void {
		const s = this.spectrum;
		const pa = this.powerA;
		const pb = this.powerB;
		const cy = this.cycles;
		for (let h = 1; h <= this.hMax; h++) {
			for (let k = cy * h - 1; k <= cy * h + 1; k++) {
				const n = (M - k) & (M - 1);
				const zr = s[2 * k];
				const zi = s[2 * k + 1];
				const wr = s[2 * n];
				const wi = s[2 * n + 1];
				const ar = (zr + wr) / 2;
				const ai = (zi - wi) / 2;
				const br = (zi + wi) / 2;
				const bi = (wr - zr) / 2;
				pa[k] = ar * ar + ai * ai;
				pb[k] = br * br + bi * bi;
				if (k === cy) {
					this.fund[0] = ar;
					this.fund[1] = ai;
					this.fund[2] = br;
					this.fund[3] = bi;
				}
			}
		}
	}

	/** THDS (and the orders, the fundamental) of channel c from its bin powers `pw`; its fundamental at this.fund[f], [f + 1]. */
	private subgroups(pw: Float64Array, f: number, c: number, out: WindowThdOut): void {
		const cy = this.cycles;
		if (out.fundamentals) {
			out.fundamentals[2 * c] = this.fund[f];
			out.fundamentals[2 * c + 1] = this.fund[f + 1];
		}
		const g1 = pw[cy - 1] + pw[cy] + pw[cy + 1];
		const harmonicsOut = out.harmonics?.[c];
		let gh = 0;
		if (harmonicsOut) {
			harmonicsOut.fill(NaN);
			harmonicsOut[1] = g1 > 0 ? 100 : NaN;
		}
		for (let h = 2; h <= this.hMax; h++) {
			const g = pw[cy * h - 1] + pw[cy * h] + pw[cy * h + 1];
			gh += g;
			if (harmonicsOut) harmonicsOut[h] = g1 > 0 ? 100 * Math.sqrt(g / g1) : NaN;
		}
		out.thd[c] = g1 > 0 ? 100 * Math.sqrt(gh / g1) : NaN;
	}
}
