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
 * Speed (the figures are those of the plain method to rounding, ~1e-13 relative): the points' places
 * and weights are worked out once per window and serve every channel, four (or two) channels per pass
 * over the points; each channel's 2048 real points go through fft.js as 1024 complex points z_n = x_2n + i·x_2n+1
 * and X_k = E_k + W^k·O_k with E_k = (Z_k + Z*_{N−k}) / 2, O_k = (Z_k − Z*_{N−k}) / 2i, W = e^{−2πi/M}
 * (common practice: a real DFT of 2N points from a complex DFT of N), only at the bins the subgroups
 * use. Samples are read from the ring in place unless the window wraps round its end. Where WebAssembly
 * SIMD is available (browsers and Node alike), the resampling runs in resample-simd.ts instead (the
 * window's samples copied in, four channels per pass, ~4× the speed of the loops here; the same terms
 * summed in another order, so the points agree with these loops to ~1e-16 relative).
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
import { SimdResampler } from './resample-simd.js';

const M = 2048;
const TAPS = 8;
const PHASES = 1024;
/** Highest harmonic order analysed: lib/spectrum's MAX_HARMONIC_ORDER (IEC 61000-4-30 class A: 50). */
export const TREND_MAX_ORDER = MAX_HARMONIC_ORDER;
const MAX_ORDER = TREND_MAX_ORDER;
/** Complex points of the half-length transform that gives the M-point real DFT. */
const N = M / 2;
/** Channels resampled per pass over the points (each point's weights loaded once for all of them). */
const LANES = 4;

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

/** W^k = e^{−2πik/M} for k < N, as (cos, −sin) pairs: the twiddles joining the even and odd halves. */
const twiddles = (() => {
	const t = new Float64Array(2 * N);
	for (let k = 0; k < N; k++) {
		t[2 * k] = Math.cos((2 * Math.PI * k) / M);
		t[2 * k + 1] = -Math.sin((2 * Math.PI * k) / M);
	}
	return t;
})();

export class WindowThd {
	private readonly fft = new FFT(N);
	/** Resampled points of up to LANES channels of the window (in the SIMD resampler's memory when it runs). */
	private points = Array.from({ length: LANES }, () => new Float64Array(M));
	private readonly spectrum = new Float64Array(2 * N);
	/** Power |X_k|² of the bins in use (k ≤ c·51 + 1 ≤ M/2), of the channel just transformed; its fundamental bin. */
	private readonly power = new Float64Array(N + 1);
	private readonly fund = new Float64Array(2);
	/** Copies of windows that wrap round the ring's end (with the taps' margin), one per lane. */
	private raw = Array.from({ length: LANES }, () => new Float64Array(M + 64));
	/** Per output point: the first tap's index from the window's first tap, and its weights' row; same for every channel of a window. */
	private tapAt = new Int32Array(M);
	private tapPhase = new Int32Array(M);
	/** The resampling in WebAssembly SIMD (resample-simd.ts), where the platform has it; else the loops below. */
	private simd: SimdResampler | undefined;
	private placedStartT = NaN;
	private placedEndT = NaN;
	/** Of the window placed: the first tap's sample index, taps' sample count, highest order below fs/2. */
	private first = 0;
	private count = 0;
	private hMax = 0;
	/** Index of the first tap in the array `source` returned last. */
	private runStart = 0;

	/**
	 * @param cycles  fundamental cycles per window (10 at 50 Hz, 12 at 60 Hz)
	 * @param simd    resample in WebAssembly SIMD where available (false: the JavaScript loops, as where it is not)
	 */
	constructor(
		readonly cycles: number,
		simd = true,
	) {
		if (!Number.isInteger(cycles) || cycles < 1 || cycles * (MAX_ORDER + 1) + 1 > M / 2)
			throw new RangeError(`cycles must be an integer 1…20, got ${cycles}`);
		this.simd = simd ? SimdResampler.create(weightTable()) : undefined;
		if (this.simd) this.takeViews();
	}

	/**
	 * THDS in % of every channel's window [startT, endT) (sample indices, fractional) of `rings`
	 * (power-of-two length, index & mask), into `out`; needs samples from startT − 4 to endT + 5 in the
	 * rings. Each channel's figures are its own (no channel's samples reach another's).
	 */
	thdWindow(
		rings: readonly Float64Array[],
		mask: number,
		startT: number,
		endT: number,
		sampleRateHz: number,
		out: WindowThdOut,
	): void {
		this.place(startT, endT, sampleRateHz);
		for (let c = 0; c < rings.length; c += LANES) {
			const lanes = Math.min(LANES, rings.length - c);
			if (this.simd) this.resampleSimd(this.simd, rings, mask, c, lanes);
			else {
				if (lanes === LANES) this.resample4(rings, mask, c);
				else if (lanes >= 2) this.resample2(rings, mask, c);
				if (lanes === 1 || lanes === 3) this.resample1(rings[c + lanes - 1], mask, lanes - 1);
			}
			for (let j = 0; j < lanes; j++) {
				this.transform(this.points[j]);
				this.subgroups(c + j, out);
			}
		}
	}

	/**
	 * THDS in % of one channel's window, as `thdWindow`; NaN when the fundamental is 0.
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
			fundamentals: fundamentalOut,
		};
		this.thdWindow([ring], mask, startT, endT, sampleRateHz, out);
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
		if (this.simd) this.simdRoom(this.count);
		if (!this.simd && this.raw[0].length < this.count) this.raw = this.raw.map(() => new Float64Array(this.count));
		if (startT === this.placedStartT && endT === this.placedEndT) return;
		const step = (endT - startT) / M;
		const t0 = startT - (Math.floor(startT) - 3) - 3;
		const at = this.tapAt;
		const phase = this.tapPhase;
		for (let m = 0; m < M; m++) {
			const t = t0 + m * step;
			const i = Math.floor(t);
			at[m] = i;
			phase[m] = Math.round((t - i) * PHASES) * TAPS;
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

	/**
	 * Room for `count` samples in the SIMD resampler, taking its new views when it made a new memory; when
	 * it cannot have the memory, it is dropped and the JavaScript loops take over.
	 */
	private simdRoom(count: number): void {
		try {
			if (this.simd!.reserve(count)) this.takeViews();
		} catch {
			this.simd = undefined;
			this.takeViews();
		}
	}

	/**
	 * The arrays the points' places and the points live in: the SIMD resampler's views, or arrays of our
	 * own without it; the places are written again at the next window.
	 */
	private takeViews(): void {
		const simd = this.simd;
		this.tapAt = simd ? simd.tapAt : new Int32Array(M);
		this.tapPhase = simd ? simd.tapPhase : new Int32Array(M);
		this.points = simd ? simd.points : Array.from({ length: LANES }, () => new Float64Array(M));
		this.placedStartT = NaN;
	}

	/** Channels c … c + lanes − 1 resampled into points[0 …] by the SIMD module: each window's taps copied in first. */
	private resampleSimd(
		simd: SimdResampler,
		rings: readonly Float64Array[],
		mask: number,
		c: number,
		lanes: number,
	): void {
		const at = this.first & mask;
		const count = this.count;
		for (let j = 0; j < lanes; j++) {
			const ring = rings[c + j];
			const lane = simd.lane(j);
			const first = Math.min(count, ring.length - at);
			lane.set(ring.subarray(at, at + first));
			if (first < count) lane.set(ring.subarray(0, count - first), first);
		}
		simd.run(lanes);
	}

	/** One channel resampled into points[lane]. */
	private resample1(ring: Float64Array, mask: number, lane: number): void {
		const w = this.source(ring, mask, this.raw[lane]);
		const off = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const x = this.points[lane];
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
	}

	/** Channels c and c + 1 resampled into points[0] and points[1]: each point's weights loaded once for the two. */
	private resample2(rings: readonly Float64Array[], mask: number, c: number): void {
		const wa = this.source(rings[c], mask, this.raw[0]);
		const oa = this.runStart;
		const wb = this.source(rings[c + 1], mask, this.raw[1]);
		const ob = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const [xa, xb] = this.points;
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
			xa[m] =
				t0 * wa[i] +
				t1 * wa[i + 1] +
				t2 * wa[i + 2] +
				t3 * wa[i + 3] +
				t4 * wa[i + 4] +
				t5 * wa[i + 5] +
				t6 * wa[i + 6] +
				t7 * wa[i + 7];
			i = at[m] + ob;
			xb[m] =
				t0 * wb[i] +
				t1 * wb[i + 1] +
				t2 * wb[i + 2] +
				t3 * wb[i + 3] +
				t4 * wb[i + 4] +
				t5 * wb[i + 5] +
				t6 * wb[i + 6] +
				t7 * wb[i + 7];
		}
	}

	/** Channels c … c + 3 resampled into points[0 … 3]: each point's weights loaded once for the four. */
	private resample4(rings: readonly Float64Array[], mask: number, c: number): void {
		const wa = this.source(rings[c], mask, this.raw[0]);
		const oa = this.runStart;
		const wb = this.source(rings[c + 1], mask, this.raw[1]);
		const ob = this.runStart;
		const wc = this.source(rings[c + 2], mask, this.raw[2]);
		const oc = this.runStart;
		const wd = this.source(rings[c + 3], mask, this.raw[3]);
		const od = this.runStart;
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const [xa, xb, xc, xd] = this.points;
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
			xa[m] =
				t0 * wa[i] +
				t1 * wa[i + 1] +
				t2 * wa[i + 2] +
				t3 * wa[i + 3] +
				t4 * wa[i + 4] +
				t5 * wa[i + 5] +
				t6 * wa[i + 6] +
				t7 * wa[i + 7];
			i = at[m] + ob;
			xb[m] =
				t0 * wb[i] +
				t1 * wb[i + 1] +
				t2 * wb[i + 2] +
				t3 * wb[i + 3] +
				t4 * wb[i + 4] +
				t5 * wb[i + 5] +
				t6 * wb[i + 6] +
				t7 * wb[i + 7];
			i = at[m] + oc;
			xc[m] =
				t0 * wc[i] +
				t1 * wc[i + 1] +
				t2 * wc[i + 2] +
				t3 * wc[i + 3] +
				t4 * wc[i + 4] +
				t5 * wc[i + 5] +
				t6 * wc[i + 6] +
				t7 * wc[i + 7];
			i = at[m] + od;
			xd[m] =
				t0 * wd[i] +
				t1 * wd[i + 1] +
				t2 * wd[i + 2] +
				t3 * wd[i + 3] +
				t4 * wd[i + 4] +
				t5 * wd[i + 5] +
				t6 * wd[i + 6] +
				t7 * wd[i + 7];
		}
	}

	/**
	 * The real DFT of the M points `x` at the bins the subgroups use, into `power` (and the fundamental
	 * into `fund`): x read as N complex points, X_k = E_k + W^k·O_k (see the file header).
	 */
	private transform(x: Float64Array): void {
		this.fft.transform(this.spectrum, x);
		const s = this.spectrum;
		const pw = this.power;
		const cy = this.cycles;
		for (let h = 1; h <= this.hMax; h++) {
			for (let k = cy * h - 1; k <= cy * h + 1; k++) {
				const n = (N - k) & (N - 1);
				const zr = s[2 * k];
				const zi = s[2 * k + 1];
				const wr = s[2 * n];
				const wi = s[2 * n + 1];
				const er = (zr + wr) / 2;
				const ei = (zi - wi) / 2;
				const or = (zi + wi) / 2;
				const oi = (wr - zr) / 2;
				const cr = twiddles[2 * k];
				const ci = twiddles[2 * k + 1];
				const xr = er + cr * or - ci * oi;
				const xi = ei + cr * oi + ci * or;
				pw[k] = xr * xr + xi * xi;
				if (k === cy) {
					this.fund[0] = xr;
					this.fund[1] = xi;
				}
			}
		}
	}

	/** THDS (and the orders, the fundamental) of channel c from `power` and `fund`. */
	private subgroups(c: number, out: WindowThdOut): void {
		const pw = this.power;
		const cy = this.cycles;
		if (out.fundamentals) {
			out.fundamentals[2 * c] = this.fund[0];
			out.fundamentals[2 * c + 1] = this.fund[1];
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
