/**
 * Consecutive gapless harmonic windows over a capture, and their aggregate (IEC 61000-4-30 style).
 */
import { wrapAngleDeg } from '../phasor/phasor.js';
import {
	defaultWindowCycles,
	harmonicWindow,
	percentOf,
	relativePhases,
	type HarmonicWindowCore,
} from './harmonics.js';
import { iecHarmonicGroups } from './groups.js';
import { thdFigures } from './thd.js';
import type { HarmonicPhasor, HarmonicWindow } from './types.js';
import { minOf } from '../signal/extremes.js';

/** The aggregate of several windows: the same fields as one window, plus how many were aggregated. */
export interface HarmonicAggregate extends HarmonicWindow {
	windowCount: number;
}

export interface HarmonicAnalysisOptions {
	/** Measured fundamental frequency, Hz (one value for the whole span). */
	fundamentalHz: number;
	/** First window's start, fractional sample index; default 0. */
	startIndex?: number;
	/** End of the span to cover, fractional sample index (exclusive); default samples.length. */
	endIndex?: number;
	/** Cycles per window; default `defaultWindowCycles(fundamentalHz)`. */
	cycles?: number;
	/** Highest order; default 50. */
	maxOrder?: number;
}

export interface HarmonicAnalysis {
	/** Consecutive windows of whole cycles, gapless and non-overlapping; a shorter tail is left out. */
	windows: HarmonicWindow[];
	/** Aggregate of `windows`; null when not one whole window fits between start and end. */
	aggregate: HarmonicAggregate | null;
}

/**
 * Harmonic windows of `cycles` cycles, back to back from `startIndex` while a whole window fits before
 * `endIndex`, each analysed by `harmonicWindow`, and their aggregate:
 * - every magnitude (order RMS, bin RMS, groups, window RMS) is the square root of the mean of the
 *   squares over the windows (IEC 61000-4-30 aggregation, docs/methods.md §3.2); percentages and THD are
 *   recomputed from those aggregated magnitudes, not averaged;
 * - phases are the angle of the vector sum of the windows' phasors (rms·e^{jφ}): windows lie whole
 *   cycles apart, so their absolute phases share the first window's time origin (startS of the aggregate).
 * Ref: IEC 61000-4-30:2015, 5.8 (harmonics over 10/12-cycle intervals, aggregation) (from memory).
 *
 * @throws RangeError for bad parameters (as harmonicWindow)
 * @example
 * // 1 s of 50 Hz at 10 kS/s: five 10-cycle windows
 * harmonicAnalysis(x, 10_000, { fundamentalHz: 50 }).windows.length // 5
 */
export function harmonicAnalysis(
	samples: Float64Array,
	sampleRateHz: number,
	opts: HarmonicAnalysisOptions,
): HarmonicAnalysis {
	const f1 = opts.fundamentalHz;
	const cycles = opts.cycles ?? defaultWindowCycles(f1);
	const start = opts.startIndex ?? 0;
	const end = Math.min(opts.endIndex ?? samples.length, samples.length);
	if (!(sampleRateHz > 0) || !(f1 > 0)) throw new RangeError('sampleRateHz and fundamentalHz must be positive');
	if (!(start >= 0) || !(end >= start)) throw new RangeError(`bad span ${start}…${end}`);
	const len = (cycles * sampleRateHz) / f1;
	const windows: HarmonicWindow[] = [];
	for (let i = 0; start + (i + 1) * len <= end + 1e-9; i++) {
		windows.push(
			harmonicWindow(samples, sampleRateHz, {
				fundamentalHz: f1,
				cycles,
				maxOrder: opts.maxOrder,
				startIndex: start + i * len,
			}),
		);
	}
	return { windows, aggregate: windows.length ? aggregateHarmonicWindows(windows) : null };
}

/**
 * Aggregate of windows analysed with the same cycles and maxOrder (see harmonicAnalysis for the rules).
 * Takes full windows (harmonicWindow) or their cores (harmonicWindowCore): only the orders, bins and
 * window RMS enter the aggregate; its groups and THD come from the aggregated bins.
 * @throws RangeError when the list is empty or the windows differ in cycles or order count
 */
export function aggregateHarmonicWindows(windows: HarmonicWindowCore[]): HarmonicAggregate {
	if (windows.length === 0) throw new RangeError('no windows to aggregate');
	const first = windows[0];
	const c = first.set.cycles;
	const nOrders = first.set.orders.length;
	const nBins = first.binRms.length;
	for (const w of windows) {
		if (w.set.cycles !== c || w.set.orders.length !== nOrders)
			throw new RangeError('windows differ in cycles or orders');
	}
	const n = windows.length;
	const orderRms = new Float64Array(nOrders);
	const binRms = new Float64Array(nBins);
	for (const w of windows) {
		const orders = w.set.orders;
		for (let h = 0; h < nOrders; h++) orderRms[h] += orders[h].rms * orders[h].rms;
		const b = w.binRms;
		for (let k = 0; k < nBins; k++) binRms[k] += b[k] * b[k];
	}
	for (let h = 0; h < nOrders; h++) orderRms[h] = Math.sqrt(orderRms[h] / n);
	for (let k = 0; k < nBins; k++) binRms[k] = Math.sqrt(binRms[k] / n);
	const orders: HarmonicPhasor[] = [];
	for (let h = 0; h < nOrders; h++) {
		let re = 0;
		let im = 0;
		for (const w of windows) {
			const o = w.set.orders[h];
			if (Number.isNaN(o.phaseDeg)) continue;
			re += o.rms * Math.cos((o.phaseDeg * Math.PI) / 180);
			im += o.rms * Math.sin((o.phaseDeg * Math.PI) / 180);
		}
		const phaseDeg =
			re === 0 && im === 0 ? NaN : h === 0 ? (re >= 0 ? 0 : 180) : wrapAngleDeg((Math.atan2(im, re) * 180) / Math.PI);
		orders.push({ order: h, rms: orderRms[h], phaseDeg });
	}
	const maxOrder = nOrders - 1;
	const groups = iecHarmonicGroups(binRms, c, maxOrder);
	let sumSq = 0;
	for (const w of windows) sumSq += w.windowRms * w.windowRms;
	return {
		set: { fundamentalHz: first.set.fundamentalHz, startS: first.set.startS, cycles: c, orders },
		phaseRelDeg: relativePhases(orders),
		percentOfFundamental: percentOf(orderRms),
		binRms,
		binHz: first.binHz,
		groups,
		thd: thdFigures(orderRms, groups.harmonicGroupRms, groups.harmonicSubgroupRms),
		windowRms: Math.sqrt(sumSq / n),
		startIndex: first.startIndex,
		endIndex: windows[n - 1].endIndex,
		dftLength: first.dftLength,
		resampled: windows.some((w) => w.resampled),
		highestValidOrder: minOf(windows.map((w) => w.highestValidOrder)),
		windowCount: n,
	};
}
