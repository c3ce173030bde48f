/**
 * Time lag between two channels by cross-correlation over whole cycles, with sub-sample resolution:
 * the shift a user reads between two traces on a scope screen.
 */
import { checkPowerWindow, powerWindowWeights, type PowerSampleWindow } from './sample-span.js';

/** Result of crossCorrelationLag. */
export interface ChannelTimeLag {
	/** Time by which `other` lags `ref`, s, in (−T/2, T/2]; positive when `other` is later. NaN when it cannot be found. */
	lagS: number;
	/** The same lag in samples (fractional). */
	lagSamples: number;
	/** The same lag as a fundamental angle, degrees in (−180, 180]: 360 · lagS / T. */
	lagDeg: number;
	/** Fundamental period T used, s (window length / cycles). */
	periodS: number;
	/** Whole cycles actually correlated (the window may be trimmed at the ends, see crossCorrelationLag). */
	cyclesUsed: number;
	/** Normalised correlation at the (interpolated) peak, −1..1: 1 when `other` is a scaled, shifted copy of `ref`. */
	correlationCoefficient: number;
}

/** Weighted means over the window, the weighted mean-removed reference, and each channel's weighted energy. */
function weightedMoments(
	ref: Float64Array,
	other: Float64Array,
	f0: number,
	weights: Float64Array,
): { meanX: number; meanY: number; wx: Float64Array; rxx: number; ryy: number } {
	const m = weights.length;
	let meanX = 0;
	let meanY = 0;
	for (let j = 0; j < m; j++) {
		meanX += weights[j] * ref[f0 + j];
		meanY += weights[j] * other[f0 + j];
	}
	// weighted, mean-removed reference once; then each lag is one dot product over typed arrays
	const wx = new Float64Array(m);
	let rxx = 0;
	let ryy = 0;
	for (let j = 0; j < m; j++) {
		const x = ref[f0 + j] - meanX;
		wx[j] = weights[j] * x;
		rxx += wx[j] * x;
		const y = other[f0 + j] - meanY;
		ryy += weights[j] * y * y;
	}
	return { meanX, meanY, wx, rxx, ryy };
}

/**
 * R(k) for integer lags |k| ≤ reach, each computed once. Beyond the record's ends `other` is continued
 * periodically from the window of `length` samples (whole cycles, so the continuation is the wave itself):
 * nothing is dropped when the record holds little more than the window.
 */
function correlator(
	other: Float64Array,
	f0: number,
	mo: { meanY: number; wx: Float64Array },
	length: number,
	reach: number,
): (k: number) => number {
	const { meanY, wx } = mo;
	const m = wx.length;
	const r = new Float64Array(2 * reach + 1).fill(NaN);
	const n = other.length;
	const at = (p: number): number => {
		const q = p < 0 ? p + length : p > n - 1 ? p - length : p;
		const i0 = Math.floor(q);
		const t = q - i0;
		return t === 0 ? other[i0] : other[i0] * (1 - t) + other[Math.min(n - 1, i0 + 1)] * t;
	};
	return (k: number): number => {
		if (Number.isNaN(r[k + reach])) {
			let acc = 0;
			const base = f0 + k;
			if (base >= 0 && base + m - 1 <= n - 1) for (let j = 0; j < m; j++) acc += wx[j] * (other[base + j] - meanY);
			else for (let j = 0; j < m; j++) acc += wx[j] * (at(base + j) - meanY);
			r[k + reach] = acc;
		}
		return r[k + reach];
	};
}

/** Coarse steps per period of the first search: P/64 samples is 5.6° of the fundamental (our choice). */
const COARSE_STEPS_PER_PERIOD = 64;

/**
 * The lag of the correlation peak in samples, wrapped to (−P/2, P/2], refined by the cosine fit, and the
 * fitted peak height. Coarse-to-fine: lags every P/64 samples, then every sample around the best; mains
 * correlations are smooth at that scale unless harmonics above about the 30th dominate.
 */
function refinedPeak(corr: (k: number) => number, half: number, periodSamples: number): { tau: number; peak: number } {
	const step = Math.max(1, Math.floor(periodSamples / COARSE_STEPS_PER_PERIOD));
	let kc = -half;
	for (let k = -half; k <= half; k += step) if (corr(k) > corr(kc)) kc = k;
	let k0 = kc;
	for (let k = Math.max(-half, kc - step); k <= Math.min(half, kc + step); k++) if (corr(k) > corr(k0)) k0 = k;
	const w = (2 * Math.PI) / periodSamples;
	const rm = corr(k0 - 1);
	const r0 = corr(k0);
	const rp = corr(k0 + 1);
	const delta = Math.atan((rp - rm) / (2 * r0 * Math.sin(w))) / w;
	const d = Number.isFinite(delta) && Math.abs(delta) <= 1 ? delta : 0;
	// peak height of the fitted cosine, so a scaled shifted copy scores 1 even between samples
	const peak = r0 / Math.cos(w * d);
	let tau = k0 + d;
	if (tau <= -periodSamples / 2) tau += periodSamples;
	else if (tau > periodSamples / 2) tau -= periodSamples;
	return { tau, peak };
}

/**
 * Time lag of `other` behind `ref` from their cross-correlation over a whole-cycle window.
 *
 * R(k) = (1/T_w) ∫_window (x(t) − x̄)·(y(t + k) − ȳ) dt, k integer samples in [−P/2, P/2]
 *
 * The peak k0 is refined by fitting R(k) = A·cos(ω(k − τ)) through k0 − 1, k0, k0 + 1 with ω = 2π/P
 * (P = period in samples): tan(ω(τ − k0)) = (R(k0+1) − R(k0−1)) / (2·R(k0)·sin ω). The fit is exact for
 * a sine, so on a pure sine the lag equals the phasor angle (to the trapezoid rule's O(1/fs²) error);
 * for distorted signals it is the lag of best overall match, which may differ from the fundamental angle.
 * Shifts that reach past the record's ends take `other` from the window one window length earlier or
 * later (periodic continuation of whole cycles, linearly interpolated between samples), so any stretch of
 * one whole period or more gives a lag and no cycle is dropped. At most `maxCycles` cycles (default 10,
 * about the 200 ms of an IEC 61000-4-7 window) are correlated from the start; above 2048 samples per
 * period both channels are first averaged in equal blocks (the same delay for both, so the lag between
 * them is unchanged) to keep the cost O(N).
 * Ref: cross-correlation time-delay estimation with cosine peak interpolation (common practice).
 * @param ref, other  equal-length sample arrays on the same time base
 * @param span  whole-cycle window of the fundamental, fractional sample indices (from findWholeCycles)
 * @returns the lag; fields NaN when fewer than one whole cycle remains or the data hold NaN or are constant
 * @throws RangeError for unequal lengths, a bad window or a bad sampleRateHz
 * @example crossCorrelationLag(u1, i1, 10_000, win).lagS // 0.0016667 for a current 30° behind at 50 Hz
 */
export function crossCorrelationLag(
	ref: Float64Array,
	other: Float64Array,
	sampleRateHz: number,
	span: PowerSampleWindow,
	opts: { maxCycles?: number } = {},
): ChannelTimeLag {
	if (ref.length !== other.length) throw new RangeError(`ref has ${ref.length} samples, other ${other.length}`);
	if (!(sampleRateHz > 0)) throw new RangeError(`sampleRateHz must be > 0, got ${sampleRateHz}`);
	checkPowerWindow(span, ref.length);
	const maxCycles = opts.maxCycles ?? 10;
	if (!(maxCycles >= 1)) throw new RangeError(`maxCycles must be >= 1, got ${maxCycles}`);
	const periodSamples = (span.endIndex - span.startIndex) / span.cycles;
	if (periodSamples > MAX_PERIOD_SAMPLES) return decimatedLag(ref, other, sampleRateHz, span, maxCycles);
	const periodS = periodSamples / sampleRateHz;
	const half = Math.ceil(periodSamples / 2);
	const reach = half + 1; // the refinement needs one lag beyond the search range
	const s = span.startIndex;
	let e = span.endIndex;
	let cycles = span.cycles;
	if (cycles > maxCycles) {
		e -= (cycles - maxCycles) * periodSamples;
		cycles = maxCycles;
	}
	const nan: ChannelTimeLag = {
		lagS: NaN,
		lagSamples: NaN,
		lagDeg: NaN,
		periodS,
		cyclesUsed: Math.max(cycles, 0),
		correlationCoefficient: NaN,
	};
	if (cycles < 1) return nan;

	const { firstIndex: f0, weights } = powerWindowWeights(s, e);
	const mo = weightedMoments(ref, other, f0, weights);
	const { meanX, meanY, rxx, ryy } = mo;
	const corr = correlator(other, f0, mo, e - s, reach);
	if (!(rxx > 1e-20 * meanX * meanX && ryy > 1e-20 * meanY * meanY && rxx > 0 && ryy > 0)) return nan;
	const { tau, peak } = refinedPeak(corr, half, periodSamples);
	if (!Number.isFinite(tau)) return nan;
	return {
		lagS: tau / sampleRateHz,
		lagSamples: tau,
		lagDeg: (360 * tau) / periodSamples,
		periodS,
		cyclesUsed: cycles,
		correlationCoefficient: Math.max(-1, Math.min(1, peak / Math.sqrt(rxx * ryy))),
	};
}

/** Periods longer than this many samples are correlated after block-averaging both channels (cost stays O(N)). */
const MAX_PERIOD_SAMPLES = 2048;

/** crossCorrelationLag on both channels block-averaged by M = ⌈P/1024⌉; the lag scaled back by M. */
function decimatedLag(
	ref: Float64Array,
	other: Float64Array,
	sampleRateHz: number,
	span: PowerSampleWindow,
	maxCycles: number,
): ChannelTimeLag {
	const periodSamples = (span.endIndex - span.startIndex) / span.cycles;
	const block = Math.ceil(periodSamples / 1024);
	const cycles = Math.min(span.cycles, maxCycles);
	const first = Math.max(0, Math.floor(span.startIndex / block) * block);
	const last = Math.min(ref.length, Math.ceil((span.startIndex + cycles * periodSamples) / block) * block);
	const count = Math.floor((last - first) / block);
	const mean = (x: Float64Array) => {
		const y = new Float64Array(count);
		for (let k = 0; k < count; k++) {
			let acc = 0;
			for (let j = first + k * block, end = j + block; j < end; j++) acc += x[j];
			y[k] = acc / block;
		}
		return y;
	};
	// block k stands for the samples [first + kM, first + (k+1)M): its centre is at (first + kM + (M−1)/2)
	const shift = (block - 1) / 2;
	const startIndex = Math.max(0, (span.startIndex - first - shift) / block);
	const periodBlocks = periodSamples / block;
	const fits = Math.min(cycles, Math.floor((count - 1 - startIndex) / periodBlocks + 1e-9));
	if (fits < 1)
		return {
			lagS: NaN,
			lagSamples: NaN,
			lagDeg: NaN,
			periodS: periodSamples / sampleRateHz,
			cyclesUsed: 0,
			correlationCoefficient: NaN,
		};
	const inner = crossCorrelationLag(
		mean(ref),
		mean(other),
		sampleRateHz / block,
		{ startIndex, endIndex: startIndex + fits * periodBlocks, cycles: fits },
		{ maxCycles },
	);
	return { ...inner, lagSamples: inner.lagSamples * block };
}
