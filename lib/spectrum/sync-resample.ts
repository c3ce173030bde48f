/**
 * Band-limited resampling of one window of a capture onto a uniform grid of M points, so that a window
 * spanning a whole number of fundamental cycles but a fractional number of input samples becomes an
 * exact M-point period for the DFT (the software form of IEC 61000-4-7's synchronised sampling).
 */

/** Stopband attenuation the kernel is designed for, dB (images of in-band content stay ≤ 1e-5 of it). */
const ATTENUATION_DB = 110;
/** Kaiser shape for that attenuation: β = 0.1102·(A − 8.7) (Kaiser's design rule, from memory). */
const KAISER_BETA = 0.1102 * (ATTENUATION_DB - 8.7);
/** Kernel table resolution: points per input-sample interval (linear interpolation between them). */
const TABLE_PHASES = 1024;
/** log2(TABLE_PHASES). */
const TABLE_SHIFT = 10;
const MIN_HALF_TAPS = 4;
const MAX_HALF_TAPS = 32;

/**
 * Half-width W (taps per side) that keeps a passband up to `passbandRatio`·fs within the design
 * attenuation: the transition runs from ν_p to 1 − ν_p (where the images of in-band content fall), and
 * Kaiser's length rule 2W − 1 = (A − 7.95)/(2.285·2π·(1 − 2ν_p)) gives W (4 … 32).
 * E.g. 8 taps per side for bins to order 51 of 50 Hz at 10 kS/s (ν_p = 0.255), 5 at 25.6 kS/s,
 * 17 for 60 Hz at 7.8 kS/s (ν_p = 0.39).
 * @param passbandRatio  highest frequency to keep ÷ sample rate, 0 … 0.49
 */
export function syncResampleHalfTaps(passbandRatio: number): number {
	const dnu = 1 - 2 * Math.min(Math.max(passbandRatio, 0), 0.49);
	const taps = (ATTENUATION_DB - 7.95) / (2.285 * 2 * Math.PI * dnu) + 1;
	return Math.min(MAX_HALF_TAPS, Math.max(MIN_HALF_TAPS, Math.ceil(taps / 2)));
}

/** Modified Bessel function of the first kind, order 0, by its power series (converges for all x). */
function besselI0(x: number): number {
	let sum = 1;
	let term = 1;
	const q = (x * x) / 4;
	for (let k = 1; k < 200; k++) {
		term *= q / (k * k);
		sum += term;
		if (term < sum * 1e-17) break;
	}
	return sum;
}

/**
 * Per half-width W, the kernel table: row q (fraction q/P, q = 0 … P) holds the 2W tap weights in sample
 * order as float32 at index q·2W + j, and `sums[q]` the exact (float64) sum of that row's stored values.
 */
interface Kernel {
	rows: Float32Array;
	sums: Float64Array;
}
const kernels = new Map<number, Kernel>();

/**
 * Kaiser-windowed sinc of half-width W on |d| ∈ [0, W], sampled at 1/TABLE_PHASES:
 * h(d) = sinc(d) · I0(β·√(1 − (d/W)²)) / I0(β).
 * Stored as float32 (relative rounding ≤ 6e-8 per weight, far below the kernel's 1e-5 design error) so
 * the whole table (65 KB for W = 8) stays in cache beside the DFT's own tables; a lookup interpolates
 * linearly between two adjacent rows.
 * Ref: J. F. Kaiser, "Nonrecursive digital filter design using the I0-sinh window function",
 * Proc. IEEE ISCAS 1974 (from memory); windowed-sinc interpolation is textbook (e.g. Oppenheim & Schafer).
 */
function kernel(w: number): Kernel {
	const cached = kernels.get(w);
	if (cached) return cached;
	const size = w * TABLE_PHASES + 2;
	const t = new Float64Array(size);
	const i0b = besselI0(KAISER_BETA);
	for (let q = 0; q < size; q++) {
		const d = q / TABLE_PHASES;
		if (d >= w) break;
		const sinc = d === 0 ? 1 : Math.sin(Math.PI * d) / (Math.PI * d);
		const r = d / w;
		t[q] = (sinc * besselI0(KAISER_BETA * Math.sqrt(1 - r * r))) / i0b;
	}
	// Row q (fraction f = q/P) holds the 2W weights in sample order, i0 − W + 1 … i0 + W: left taps at
	// distance f + (W − 1 − j), right taps at distance (1 − f) + (j − W). Each row is normalised to sum 1
	// before rounding to float32; the float32 rounding then leaves a sum of 1 ± 1e-7, which syncResample
	// divides out with `sums`, so every interpolated weight set sums to 1 and DC passes exactly.
	const w2 = 2 * w;
	const rows = new Float32Array(w2 * (TABLE_PHASES + 1));
	const sums = new Float64Array(TABLE_PHASES + 1);
	const r = new Float64Array(w2);
	for (let q = 0; q <= TABLE_PHASES; q++) {
		let sum = 0;
		for (let j = 0; j < w2; j++) {
			r[j] = j < w ? t[q + (w - 1 - j) * TABLE_PHASES] : t[TABLE_PHASES - q + (j - w) * TABLE_PHASES];
			sum += r[j];
		}
		let stored = 0;
		for (let j = 0; j < w2; j++) {
			rows[q * w2 + j] = r[j] / sum;
			stored += rows[q * w2 + j];
		}
		sums[q] = stored;
	}
	const k = { rows, sums };
	kernels.set(w, k);
	return k;
}

/**
 * out[m] = x(start + m·L/M), m = 0 … M−1, with x(t) the band-limited interpolation of `samples`:
 * a Kaiser-windowed sinc designed for 110 dB, its half-width chosen from `passbandRatio` by
 * syncResampleHalfTaps, tabulated at 1024 phases per sample (float32, linear between phases) with every
 * interpolated weight set normalised to sum 1 (so DC passes exactly). Where the kernel reaches past the ends
 * of the capture, the missing sample is taken one window length away (x(t ± L), linear between its
 * neighbours): the window holds whole cycles, so this is the signal's own continuation.
 *
 * Accuracy (tests/spectrum/sync-resample.test.ts, a cosine through this function, point by point): error
 * < 2e-5 of the amplitude (measured ≤ 1.4e-5) for components up to passbandRatio·fs. Content above it is attenuated, and its
 * images fall above passbandRatio·fs in the M-point DFT, never on the bins below it.
 *
 * @param samples  the capture's samples; not modified
 * @param start    window start, fractional sample index, ≥ 0
 * @param lengthSamples  window length L in input samples (fractional), start + L ≤ samples.length
 * @param out      M output points (its length sets M); hot path: pass a reused buffer
 * @param passbandRatio  highest frequency that must be kept ÷ input sample rate (< 0.5); default 0.4
 * @returns `out`
 */
export function syncResample(
	samples: Float64Array,
	start: number,
	lengthSamples: number,
	out: Float64Array,
	passbandRatio = 0.4,
): Float64Array {
	const n = samples.length;
	const m = out.length;
	// int32 throughout the index arithmetic (`| 0`: positions are ≥ 0, so truncation is floor), which lets
	// the JIT keep every table and sample index in an integer register
	const w = syncResampleHalfTaps(passbandRatio) | 0;
	const { rows: tab, sums } = kernel(w);
	const w2 = (2 * w) | 0;
	const step = lengthSamples / m;
	// positions counted in table steps from the whole sample below each run's first point: the integer
	// part is (i0 − s0)·P + q, P a power of two, so one truncation gives sample and phase. A run spans
	// < 2^20 input samples, so int32 holds its positions (one run unless the window exceeds 2^20 samples).
	const posStep = step * TABLE_PHASES;
	const run = Math.max(1, Math.floor(2 ** 20 / step));
	let s0 = 0;
	let pos0 = 0;
	for (let i = 0, runEnd = 0; i < m; i++) {
		if (i === runEnd) {
			const tr = start + i * step;
			s0 = Math.floor(tr);
			pos0 = (tr - s0) * TABLE_PHASES - i * posStep;
			runEnd = Math.min(m, i + run);
		}
		const pos = pos0 + i * posStep;
		const qi = pos | 0;
		const i0 = s0 + (qi >> TABLE_SHIFT);
		const q = qi & (TABLE_PHASES - 1);
		const wa = pos - qi;
		const base = (i0 - w + 1) | 0;
		// Σ_j x_j·((1 − wa)·a_j + wa·b_j) = A + wa·(B − A), rows a = q and b = q + 1, each sum taken once
		let a = 0;
		let b = 0;
		let p = (w2 * q) | 0;
		if (base >= 0 && i0 + w < n) {
			// two chains per row: the add latency, not the loads, bounds a single-sum loop
			let a1 = 0;
			let b1 = 0;
			for (let j = base, end = (base + w2) | 0; j < end; j = (j + 2) | 0, p = (p + 2) | 0) {
				const x0 = samples[j];
				const x1 = samples[j + 1];
				a += tab[p] * x0;
				b += tab[p + w2] * x0;
				a1 += tab[p + 1] * x1;
				b1 += tab[p + 1 + w2] * x1;
			}
			a += a1;
			b += b1;
		} else {
			for (let j = 0; j < w2; j++, p++) {
				const x = sampleOrWrap(samples, base + j, lengthSamples);
				a += tab[p] * x;
				b += tab[p + w2] * x;
			}
		}
		const sa = sums[q];
		out[i] = (a + wa * (b - a)) / (sa + wa * (sums[q + 1] - sa));
	}
	return out;
}

/** samples[j] inside the capture; outside it, the sample one window length L away (linear). */
function sampleOrWrap(samples: Float64Array, j: number, lengthSamples: number): number {
	const n = samples.length;
	if (j >= 0 && j < n) return samples[j];
	let t = j < 0 ? j + lengthSamples : j - lengthSamples;
	if (t < 0) t = 0;
	if (t > n - 1) t = n - 1;
	const k = Math.floor(t);
	if (k >= n - 1) return samples[n - 1];
	const a = t - k;
	return samples[k] + a * (samples[k + 1] - samples[k]);
}
