/**
 * THD of one 10/12-cycle window straight from a channel's ring buffer, fast enough to run on every
 * window of every channel of a long recording (about 1/7 of the cost of lib/spectrum's harmonicWindow,
 * whose 24-tap sinc resampler is exact to 1e-6 but costs ~0.2 ms per window).
 *
 * Method (IEC 61000-4-7 synchronised window): the window from zero crossing startT to endT (c whole
 * cycles, fractional samples) is resampled onto M = 2048 points by 8-point Lagrange interpolation, so
 * DFT bin c·h is harmonic h exactly; then a radix-2 real FFT (fft.js); C_k = √2·|X_k|/M; harmonic
 * subgroups G_sg,h² = C²_{ch−1} + C²_{ch} + C²_{ch+1}; THDS = √(Σ_{h=2..50} G_sg,h²) / G_sg,1 · 100 %.
 * Orders at or above fs/2 are left out.
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

export class WindowThd {
	private readonly fft = new FFT(M);
	private readonly input = new Float64Array(M);
	private readonly spectrum = new Float64Array(2 * M);
	private raw = new Float64Array(M + 64);
	/** Per output point: the first tap's index into the copied window and its weights' row; same for every channel of a window. */
	private readonly tapAt = new Int32Array(M);
	private readonly tapPhase = new Int32Array(M);
	private placedStartT = NaN;
	private placedEndT = NaN;

	constructor(readonly cycles: number) {
		if (!Number.isInteger(cycles) || cycles < 1 || cycles * (MAX_ORDER + 1) + 1 > M / 2)
			throw new RangeError(`cycles must be an integer 1…20, got ${cycles}`);
	}

	/** Where each of the M points of the window startT..endT falls (computed once for all channels of a window). */
	private place(startT: number, endT: number): void {
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
	 * THDS in % of the window [startT, endT) (sample indices, fractional) of `ring` (power-of-two length,
	 * index & mask); needs samples from startT − 4 to endT + 5 in the ring. NaN when the fundamental is 0.
	 * When `harmonicsOut` (length ≥ 51) is given it receives each order's subgroup in % of the
	 * fundamental's subgroup (index = order; [1] = 100; NaN at or above fs/2 and for order 0).
	 * When `fundamentalOut` (length ≥ 2) is given it receives the fundamental's DFT bin (re, im; a phasor in
	 * the window's time frame, the same frame for every channel windowed on the same crossings).
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
		// Copy the window (with the taps' margin) out of the ring once, so the tap loop needs no masking.
		const first = Math.floor(startT) - 3;
		const count = Math.floor(endT) + 5 - first;
		if (this.raw.length < count) this.raw = new Float64Array(count);
		const w = this.raw;
		for (let j = 0; j < count; j++) w[j] = ring[(first + j) & mask];
		this.place(startT, endT);
		const tab = weightTable();
		const at = this.tapAt;
		const phase = this.tapPhase;
		const x = this.input;
		for (let m = 0; m < M; m++) {
			const i = at[m];
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
		const c = this.cycles;
		const f1 = (c * sampleRateHz) / (endT - startT);
		const power = (k: number) => s[2 * k] * s[2 * k] + s[2 * k + 1] * s[2 * k + 1];
		if (fundamentalOut) {
			fundamentalOut[0] = s[2 * c];
			fundamentalOut[1] = s[2 * c + 1];
		}
		const g1 = power(c - 1) + power(c) + power(c + 1);
		let gh = 0;
		if (harmonicsOut) {
			harmonicsOut.fill(NaN);
			harmonicsOut[1] = g1 > 0 ? 100 : NaN;
		}
		for (let h = 2; h <= MAX_ORDER && h * f1 < sampleRateHz / 2; h++) {
			const g = power(c * h - 1) + power(c * h) + power(c * h + 1);
			gh += g;
			if (harmonicsOut) harmonicsOut[h] = g1 > 0 ? 100 * Math.sqrt(g / g1) : NaN;
		}
		return g1 > 0 ? 100 * Math.sqrt(gh / g1) : NaN;
	}
}
