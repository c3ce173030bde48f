/**
 * One synchronised harmonic window (IEC 61000-4-7): whole fundamental cycles, a rectangular window, a
 * DFT whose bin k = cycles·h falls exactly on harmonic h.
 */
import { wrapAngleDeg } from '../phasor/phasor.js';
import { dftPlan } from './dft.js';
import { iecHarmonicGroups } from './groups.js';
import { syncResample } from './sync-resample.js';
import { thdFigures } from './thd.js';
import type { HarmonicPhasor, HarmonicWindow } from './types.js';

export interface HarmonicWindowOptions {
	/** Measured fundamental frequency the window is synchronised to, Hz. */
	fundamentalHz: number;
	/** Window start as a (fractional) sample index; default 0. */
	startIndex?: number;
	/** Whole fundamental cycles in the window; default `defaultWindowCycles(fundamentalHz)`. */
	cycles?: number;
	/** Highest order reported; default MAX_HARMONIC_ORDER (50). */
	maxOrder?: number;
}

/**
 * Highest harmonic order analysed and reported by default: 50 (IEC 61000-4-7 and IEC 61000-4-30 measure
 * to order 50; IEEE 519 limits go to 50; from memory). The one constant every area uses.
 */
export const MAX_HARMONIC_ORDER = 50;

/**
 * The 10-or-12-cycle choice of IEC 61000-4-7 for a system frequency: 12 cycles from 55 Hz to 70 Hz
 * (60 Hz systems), else 10 (50 Hz systems, and when the frequency is not known). Both are ~200 ms.
 * Ref: IEC 61000-4-7:2002, 4.4.1 (10/12 cycles; from memory); the 55 Hz split is ours.
 * @example basicWindowCycles(60) // 12
 */
export function basicWindowCycles(systemHz: number | undefined): 10 | 12 {
	return systemHz !== undefined && systemHz >= 55 && systemHz <= 70 ? 12 : 10;
}

/**
 * Window length in cycles giving ~200 ms as IEC 61000-4-7 asks: 10 below 55 Hz (50 Hz systems, whose
 * measured frequency stays within 42.5–57.5 Hz), 12 from 55 Hz to 70 Hz (60 Hz systems), and
 * round(0.2 s · f1) (at least 1) outside 40–70 Hz (e.g. 80 cycles at 400 Hz).
 * Ref: IEC 61000-4-7:2002, 4.4.1 (10/12 cycles), READ via docs/methods.md §2.1; the 55 Hz split is ours.
 * @example defaultWindowCycles(49.95) // 10
 */
export function defaultWindowCycles(fundamentalHz: number): number {
	if (!(fundamentalHz > 0) || !Number.isFinite(fundamentalHz)) {
		throw new RangeError(`fundamentalHz must be a positive number, got ${fundamentalHz}`);
	}
	if (fundamentalHz >= 40 && fundamentalHz <= 70) return basicWindowCycles(fundamentalHz);
	return Math.max(1, Math.round(0.2 * fundamentalHz));
}

/** Below this fraction of the window RMS a component's phase is rounding noise and reported as NaN. */
const PHASE_FLOOR = 1e-9;
/** Window lengths within this many samples of an integer are taken as exact (no resampling). */
const WHOLE_SAMPLES_TOLERANCE = 1e-6;

interface Work {
	resampled: Float64Array;
	re: Float64Array;
	im: Float64Array;
}
const workByLength = new Map<number, Work>();

function work(m: number): Work {
	let w = workByLength.get(m);
	if (!w) {
		w = { resampled: new Float64Array(m), re: new Float64Array((m >> 1) + 1), im: new Float64Array((m >> 1) + 1) };
		workByLength.set(m, w);
		if (workByLength.size > 8) workByLength.delete(workByLength.keys().next().value as number);
	}
	return w;
}

/**
 * Harmonic analysis of one window of exactly `cycles` cycles of the measured fundamental, starting at
 * the fractional sample `startIndex` (length L = cycles·fs/f1 samples).
 *
 * Synchronisation: when L is a whole number of samples (within 1e-6) the DFT runs on those L samples
 * directly (any length, dft.ts), rotated by the shift theorem X_k·e^{−j2πk·d/L} if the start was moved by
 * d < 1 sample to the sample grid. Otherwise the window is resampled (Kaiser-windowed sinc, sync-resample.ts)
 * onto M points, M the smallest power of two ≥ max(L, 2·(c·(maxOrder+1)+1)): M points spanning exactly
 * c cycles, so bin c·h is harmonic h with no leakage. Resampling error: < 1e-5 relative for components
 * below 0.35·fs (tested: a 5 % 5th harmonic reads 5.0000 % ± 0.0001 % at 7.8, 10 and 25.6 kS/s).
 *
 * Per bin: C_0 = |X_0|/M, C_k = √2·|X_k|/M. Per order h (bin k = c·h): rms = C_k and absolute phase
 * arg X_k, so the component is √2·rms·cos(2πh·f1·(t − t0) + φ_h), t0 = the window start (cosine reference;
 * a sine starting at its rising zero crossing reads −90°). phaseRelDeg[h] = φ_h − h·φ_1 is the phase with
 * the time origin moved to the fundamental's positive peak (where the fundamental's cosine phase is 0):
 * 0° = the harmonic peaks with the fundamental's peak, 180° = it opposes it. Orders at or above the
 * capture's Nyquist frequency (fs/2) are NaN.
 *
 * Record end: each sample stands for the interval [n/fs, (n + 1)/fs), so N samples cover indices [0, N)
 * and the window may end anywhere up to N (e.g. a capture of exactly 10 cycles, from findWholeCycles with
 * toRecordEnd). The direct path then uses samples [start, start + M) only; in the resampled path the
 * sinc taps past the last sample take the signal one window (whole cycles) earlier, see sync-resample.ts.
 *
 * @param samples  the capture's samples (V or A); not modified; NaN samples give NaN results
 * @param sampleRateHz  the capture's sample rate, Hz
 * @throws RangeError for bad parameters or a window that does not fit in `samples`
 * @example
 * // 230 V with a 5 % 5th harmonic, 10 kS/s, f1 = 49.97 Hz (resampled to 2048 points)
 * const w = harmonicWindow(x, 10_000, { fundamentalHz: 49.97 });
 * w.set.orders[1].rms // 230.000; w.percentOfFundamental[5] // 5.0000; w.thd.thdF40Percent // 5.0000
 */
export function harmonicWindow(
	samples: Float64Array,
	sampleRateHz: number,
	opts: HarmonicWindowOptions,
): HarmonicWindow {
	const core = harmonicWindowCore(samples, sampleRateHz, opts);
	const { orders } = core.set;
	const orderRms = new Float64Array(orders.length);
	for (let h = 0; h < orders.length; h++) orderRms[h] = orders[h].rms;
	const groups = iecHarmonicGroups(core.binRms, core.set.cycles, orders.length - 1);
	return {
		...core,
		phaseRelDeg: relativePhases(orders),
		percentOfFundamental: percentOf(orderRms),
		groups,
		thd: thdFigures(orderRms, groups.harmonicGroupRms, groups.harmonicSubgroupRms),
	};
}

/**
 * The part of a harmonic window that aggregation needs: orders (RMS, absolute phase), bin RMS, window
 * RMS and where the window lies, without the per-window groups, THD, relative phases and percentages
 * (harmonicWindow adds those). Same figures as harmonicWindow, same checks and errors.
 */
export type HarmonicWindowCore = Omit<HarmonicWindow, 'phaseRelDeg' | 'percentOfFundamental' | 'groups' | 'thd'>;

/** The checked parameters of one window. */
interface WindowPlan {
	f1: number;
	fs: number;
	c: number;
	maxOrder: number;
	start: number;
	/** Window length in samples, c·fs/f1 (fractional). */
	len: number;
	nBins: number;
}

function planWindow(samples: Float64Array, fs: number, opts: HarmonicWindowOptions): WindowPlan {
	const f1 = opts.fundamentalHz;
	if (!(fs > 0) || !Number.isFinite(fs)) throw new RangeError(`sampleRateHz must be a positive number, got ${fs}`);
	if (!(f1 > 0) || !(f1 < fs / 2)) throw new RangeError(`fundamentalHz must be in (0, ${fs / 2}) Hz, got ${f1}`);
	const c = opts.cycles ?? defaultWindowCycles(f1);
	const maxOrder = opts.maxOrder ?? MAX_HARMONIC_ORDER;
	const start = opts.startIndex ?? 0;
	if (!Number.isInteger(c) || c < 1) throw new RangeError(`cycles must be an integer ≥ 1, got ${c}`);
	if (!Number.isInteger(maxOrder) || maxOrder < 1 || maxOrder > 1000) {
		throw new RangeError(`maxOrder must be an integer 1…1000, got ${maxOrder}`);
	}
	const len = (c * fs) / f1;
	if (!(start >= 0) || start + len > samples.length + 1e-9) {
		throw new RangeError(
			`a window of ${c} cycles at ${f1} Hz needs ${len.toFixed(3)} samples from index ${start}; the capture has ${samples.length}`,
		);
	}
	return { f1, fs, c, maxOrder, start, len, nBins: c * (maxOrder + 1) + 1 };
}

/** The window's DFT in the shared work buffers: direct on whole samples, else after resampling. */
interface WindowTransform {
	m: number;
	input: Float64Array;
	/** Samples the DFT's start lies after the requested start (direct path only). */
	shift: number;
	whole: boolean;
	w: Work;
}

function transformWindow(samples: Float64Array, p: WindowPlan): WindowTransform {
	const nearest = Math.round(p.len);
	const whole = Math.abs(p.len - nearest) <= WHOLE_SAMPLES_TOLERANCE && nearest >= 2;
	let m: number;
	let input: Float64Array;
	let shift = 0;
	let w: Work;
	if (whole) {
		m = nearest;
		let s0 = Math.round(p.start);
		if (s0 + m > samples.length) s0 = samples.length - m;
		shift = s0 - p.start;
		input = samples.subarray(s0, s0 + m);
		w = work(m);
	} else {
		m = 4;
		while (m < p.len || m < 2 * p.nBins) m *= 2;
		w = work(m);
		// keep every reported bin, up to order maxOrder + 1, inside the interpolator's passband
		input = syncResample(samples, p.start, p.len, w.resampled, Math.min(0.49, ((p.maxOrder + 1) * p.f1) / p.fs));
	}
	dftPlan(m).forward(input, w.re, w.im);
	return { m, input, shift, whole, w };
}

/** C_0 = |X_0|/M, C_k = √2·|X_k|/M; NaN at or above fs/2. */
function binRmsOf(p: WindowPlan, t: WindowTransform): Float64Array {
	const { re, im } = t.w;
	const binHz = p.f1 / p.c;
	const binRms = new Float64Array(p.nBins);
	for (let k = 0; k < p.nBins; k++) {
		const valid = k * binHz < p.fs / 2 && k <= t.m >> 1;
		binRms[k] = valid ? ((k === 0 ? 1 : Math.SQRT2) * Math.sqrt(re[k] * re[k] + im[k] * im[k])) / t.m : NaN;
	}
	return binRms;
}

/** Each order's RMS and absolute phase (the direct path's start shift undone by the shift theorem). */
function orderPhasors(
	p: WindowPlan,
	t: WindowTransform,
	binRms: Float64Array,
	windowRms: number,
): { orders: HarmonicPhasor[]; highestValidOrder: number } {
	const orders: HarmonicPhasor[] = new Array(p.maxOrder + 1);
	const floor = PHASE_FLOOR * windowRms;
	let highestValidOrder = 0;
	for (let h = 0; h <= p.maxOrder; h++) {
		const k = p.c * h;
		const rms = binRms[k];
		let re = t.w.re[k];
		let im = t.w.im[k];
		if (t.shift !== 0 && h > 0) {
			const a = (-2 * Math.PI * k * t.shift) / t.m;
			const cr = Math.cos(a);
			const ci = Math.sin(a);
			const r2 = re * cr - im * ci;
			im = re * ci + im * cr;
			re = r2;
		}
		let phaseDeg: number;
		if (!(rms > floor)) phaseDeg = NaN;
		else if (h === 0) phaseDeg = re >= 0 ? 0 : 180;
		else phaseDeg = wrapAngleDeg((Math.atan2(im, re) * 180) / Math.PI);
		if (!Number.isNaN(rms)) highestValidOrder = h;
		orders[h] = { order: h, rms, phaseDeg };
	}
	return { orders, highestValidOrder };
}

/** harmonicWindow without the per-window groups, THD, relative phases and percentages (see HarmonicWindowCore). */
export function harmonicWindowCore(
	samples: Float64Array,
	sampleRateHz: number,
	opts: HarmonicWindowOptions,
): HarmonicWindowCore {
	const p = planWindow(samples, sampleRateHz, opts);
	const t = transformWindow(samples, p);
	let sumSquares = 0;
	for (let i = 0; i < t.m; i++) sumSquares += t.input[i] * t.input[i];
	const windowRms = Math.sqrt(sumSquares / t.m);
	const binRms = binRmsOf(p, t);
	const { orders, highestValidOrder } = orderPhasors(p, t, binRms, windowRms);
	return {
		set: { fundamentalHz: p.f1, startS: p.start / p.fs, cycles: p.c, orders },
		binRms,
		binHz: p.f1 / p.c,
		windowRms,
		startIndex: p.start,
		endIndex: p.start + p.len,
		dftLength: t.m,
		resampled: !t.whole,
		highestValidOrder,
	};
}

/** φ_h − h·φ_1 wrapped to (−180, 180]; NaN where either phase is NaN. */
export function relativePhases(orders: HarmonicPhasor[]): Float64Array {
	const out = new Float64Array(orders.length);
	const p1 = orders[1]?.phaseDeg ?? NaN;
	for (let h = 0; h < orders.length; h++) {
		out[h] = h === 0 ? orders[0].phaseDeg : wrapAngleDeg(orders[h].phaseDeg - h * p1);
	}
	return out;
}

/** 100·rms_h/rms_1 per order; NaN when the fundamental is 0 or NaN. */
export function percentOf(orderRms: Float64Array): Float64Array {
	const out = new Float64Array(orderRms.length);
	const r1 = orderRms[1];
	for (let h = 0; h < orderRms.length; h++) out[h] = r1 > 0 ? (100 * orderRms[h]) / r1 : NaN;
	return out;
}
