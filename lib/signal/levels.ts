import type { ChannelRange, Diagnostic } from '../capture.js';
import { findWholeCycles, type CycleWindow } from './cycles.js';
import { signalWarnings } from './warnings.js';
import {
	extremaIn,
	innerSumRange,
	squaresAndAbsAbout,
	sumAndSquares,
	windowIntegral,
	type GivenInnerSum,
} from './window-integral.js';

/**
 * Scale factor of a sine-calibrated average-responding meter: K = π / (2√2) ≈ 1.110720735, the form
 * factor of a sine. The meter shows K × rectified mean.
 * Ref: docs/methods.md §1.1 (instrument makers' notes, read); common practice.
 */
export const AVERAGE_RESPONDING_FACTOR = Math.PI / (2 * Math.SQRT2);

/**
 * What a sine-calibrated average-responding meter shows: K × rectified mean, K = π / (2√2).
 *
 * @param rectifiedMean  mean of |x − mean| (what an AC-coupled rectifier averages), same unit as samples
 * @returns the reading, same unit; NaN for NaN input
 * @example averageRespondingReading(2 * 325 / Math.PI) // 229.81 (a 325 V peak sine: reads its true RMS)
 */
export function averageRespondingReading(rectifiedMean: number): number {
	return AVERAGE_RESPONDING_FACTOR * rectifiedMean;
}

/** Time-domain figures of one channel over whole cycles (or the whole record). Same unit as samples unless stated. */
export interface WaveformFigures {
	/** Arithmetic mean (the DC component). */
	mean: number;
	/** True RMS, AC + DC: √(mean of x²). */
	rms: number;
	/** RMS of x − mean: √(rms² − mean²). What an AC-coupled true-RMS meter shows. */
	acRms: number;
	/** Mean of |x − mean|: what an AC-coupled rectifier averages (equals mean |x| when there is no DC). */
	rectifiedMean: number;
	/** Highest sample value (max x). */
	peak: number;
	/** Lowest sample value (min x; negative for an AC signal). */
	peakNegative: number;
	/** peak − peakNegative. */
	peakToPeak: number;
	/** max(|peak|, |peakNegative|) / rms, ratio (rms = true RMS). √2 for a sine. */
	crestFactor: number;
	/** rms / rectifiedMean, ratio (rms = true RMS, as docs/methods.md §1.1 defines it). π/(2√2) ≈ 1.1107 for a sine. */
	formFactor: number;
	/**
	 * Sine-calibrated average-responding meter: reading = K × rectifiedMean (same unit);
	 * errorPercent = 100 × (reading / rms − 1), against the true RMS (AC + DC);
	 * errorPercentAc = 100 × (reading / acRms − 1), against the AC RMS (what an AC-coupled true-RMS meter shows).
	 * The two agree when the mean is zero (mains signals); with DC, compare like with like using errorPercentAc.
	 */
	averageResponding: { reading: number; errorPercent: number; errorPercentAc: number };
	/** What the figures cover. */
	span: 'whole-cycles' | 'whole-record';
	/** Window start, fractional sample index (0 for the whole record). */
	startIndex: number;
	/** Window end, fractional sample index, at most N (N − 1 for the whole record). */
	endIndex: number;
	/** Whole cycles covered; for the whole record N·f/fs when the frequency is known, else NaN. */
	cycles: number;
	/** Fallback notices plus `signalWarnings` for the record (few cycles, clipping, DC offset, frequency range…). */
	warnings: Diagnostic[];
}

/**
 * Mean, true RMS, AC RMS, rectified mean, peaks, crest and form factor and the average-responding
 * meter reading of a record, over whole fundamental cycles by default.
 *
 *   mean = (1/T)∫x dt,  rms = √((1/T)∫x² dt),  acRms = √((1/T)∫(x − mean)² dt),
 *   rectifiedMean = (1/T)∫|x − mean| dt,  crestFactor = max(|peak|, |peakNegative|)/rms,
 *   formFactor = rms/rectifiedMean,  reading = π/(2√2) · rectifiedMean
 *
 * 'whole-cycles' (default): T runs from the first to the last rising zero crossing of the fundamental
 * (`findWholeCycles`, or `opts.window`), integrated by the trapezoid rule with the integrand interpolated
 * at the fractional crossing positions (see `window-integral.ts`: equal to the plain sample mean when a
 * cycle holds a whole number of samples), so a record of 9.37 cycles gives the figures of its whole
 * cycles; peaks come from the samples inside the window. Each sample stands for the interval
 * [n/fs, (n + 1)/fs), so a record of N samples covers N/fs seconds and a window may end at index N (one
 * sample interval after the last sample): a record of exactly 10 cycles gives 10 whole cycles, and the
 * value the trapezoid needs at N is taken one period earlier (exact for a stationary periodic signal; the
 * own search here uses findWholeCycles with toRecordEnd). When no fundamental is found, the whole record
 * is used and a 'whole-record-fallback' warning says why. 'whole-record': plain sample means over all N
 * samples.
 *
 * Which RMS: `formFactor` and `averageResponding.errorPercent` use the true RMS (AC + DC), as docs/methods.md §1.1
 * states, while `rectifiedMean` is taken about the DC (what an AC-coupled rectifier averages). With no DC
 * (mains voltage and most currents) that is the textbook form factor and meter error. With DC the two
 * mix coupling modes, so `averageResponding.errorPercentAc` (against `acRms`) is given too: it is the
 * like-for-like error of an AC-coupled average-responding meter against an AC-coupled true-RMS meter.
 * Example: a half-wave rectified sine gives formFactor 1.425 (not the DC-coupled table value π/2),
 * errorPercent −22.05 % and errorPercentAc +1.07 % (docs/methods.md §1.2 AC-coupled row).
 *
 * Ratios with a zero denominator are NaN: crestFactor when rms = 0; formFactor when rectifiedMean = 0
 * (a constant); errorPercentAc when acRms = 0. Empty record: every figure NaN, warning 'no-samples'.
 * NaN or ±Infinity in the samples: every figure NaN (never a silent skip), warning 'non-finite-samples'.
 * Whole cycles bridged across an interruption (see `findWholeCycles`) add a 'fundamental-bridged' warning.
 *
 * Ref: definitions docs/methods.md §1.1 (true RMS, rectified average, form and crest factor; read);
 * docs/methods.md §1.1 (rectified mean about the DC, error against true RMS); IEC 61000-4-30 whole-cycle windows (from memory).
 *
 * @param samples  signal (V, A, …); not modified
 * @param sampleRateHz  samples per second (RangeError if not positive)
 * @param opts.span  'whole-cycles' (default) or 'whole-record'
 * @param opts.window  whole cycles already found (e.g. on the voltage channel, reused for the current)
 * @param opts.frequencyHz  known frequency for the cycle search
 * @param opts.nominalHz  nominal frequency for the cycle search and range warning
 * @param opts.maxOrder  highest harmonic order wanted, for the sample-rate warning
 * @param opts.peakAccuracyPercent  accuracy wanted on peaks, %, for the sample-rate warning
 * @example waveformFigures(sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 9.37 }), 10_000)
 *   // { rms: 229.81, rectifiedMean: 206.90, formFactor: 1.1107, crestFactor: 1.4142, averageResponding: { errorPercent: 0 }, cycles: 9, … }
 */
export function waveformFigures(
	samples: Float64Array,
	sampleRateHz: number,
	opts: WaveformOptions = {},
): WaveformFigures {
	if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz)))
		throw new RangeError(`sampleRateHz must be positive, got ${sampleRateHz}`);
	const n = samples.length;
	const warnings: Diagnostic[] = [];
	if (n === 0) {
		warnings.push({ code: 'no-samples', message: 'The channel has no samples: no figures.', severity: 'warning' });
		return nanFigures('whole-record', 0, -1, NaN, warnings);
	}
	const { cycleWindow, frequencyHz } = figuresWindow(samples, sampleRateHz, opts, warnings);
	warnings.push(
		...signalWarnings(samples, sampleRateHz, {
			frequencyHz,
			cycles: cycleWindow?.cycles,
			nominalHz: opts.nominalHz,
			maxOrder: opts.maxOrder,
			peakAccuracyPercent: opts.peakAccuracyPercent,
			range: opts.range,
			startS: opts.startS,
		}),
	);
	const span = cycleWindow ? 'whole-cycles' : 'whole-record';
	const startIndex = cycleWindow ? cycleWindow.startIndex : 0;
	const endIndex = cycleWindow ? cycleWindow.endIndex : n - 1;
	const cycles = cycleWindow ? cycleWindow.cycles : frequencyHz !== undefined ? (n * frequencyHz) / sampleRateHz : NaN;
	if (hasNonFinite(samples)) return nanFigures(span, startIndex, endIndex, cycles, warnings);
	return { ...levelsOver(samples, cycleWindow), span, startIndex, endIndex, cycles, warnings };
}

/** Options of waveformFigures. */
export interface WaveformOptions {
	span?: 'whole-cycles' | 'whole-record';
	window?: CycleWindow;
	frequencyHz?: number;
	nominalHz?: number;
	maxOrder?: number;
	peakAccuracyPercent?: number;
	/** The range the file states and the first sample's time, for the clipping warning (see `signalWarnings`). */
	range?: ChannelRange;
	startS?: number;
}

/**
 * The whole cycles the figures cover (given, found here, or none for the whole record) and the frequency
 * known; pushes the fallback and bridging warnings.
 * @throws RangeError for a given window outside the record
 */
function figuresWindow(
	samples: Float64Array,
	sampleRateHz: number,
	opts: WaveformOptions,
	warnings: Diagnostic[],
): { cycleWindow: CycleWindow | undefined; frequencyHz: number | undefined } {
	const n = samples.length;
	let frequencyHz = opts.window?.frequencyHz ?? opts.frequencyHz;
	let cycleWindow = opts.window;
	if (opts.span !== 'whole-record' && cycleWindow === undefined) {
		const found = findWholeCycles(samples, sampleRateHz, {
			frequencyHz: opts.frequencyHz,
			nominalHz: opts.nominalHz,
			toRecordEnd: true,
		});
		if (found.ok) {
			cycleWindow = found;
			frequencyHz = found.frequencyHz;
		} else if (found.code !== 'bad-parameter' || !hasNonFinite(samples)) {
			warnings.push({
				code: 'whole-record-fallback',
				message: `Figures cover the whole record (${n} samples), not whole cycles: ${found.message} A partial cycle biases mean, RMS and rectified mean.`,
				severity: 'warning',
			});
		}
	}
	// The record covers N sample intervals, [0, N): a window may end at N (see window-integral.ts).
	if (
		cycleWindow !== undefined &&
		!(cycleWindow.startIndex >= 0 && cycleWindow.endIndex <= n && cycleWindow.endIndex > cycleWindow.startIndex)
	) {
		throw new RangeError(
			`window ${cycleWindow.startIndex}…${cycleWindow.endIndex} does not lie inside the record's 0…${n}`,
		);
	}
	if (cycleWindow?.bridgedCrossings) {
		warnings.push({
			code: 'fundamental-bridged',
			message:
				`The fundamental vanished for about ${cycleWindow.bridgedCrossings} cycle(s) (under 5 % of its largest amplitude, ` +
				`e.g. an interruption); cycle boundaries there were carried on at the last measured period.`,
			severity: 'warning',
		});
	}
	return { cycleWindow, frequencyHz };
}

/** The level figures over the window (or the whole record): means, RMS, peaks, ratios and the meter reading. */
function levelsOver(
	samples: Float64Array,
	cycleWindow: CycleWindow | undefined,
): Omit<WaveformFigures, 'span' | 'startIndex' | 'endIndex' | 'cycles' | 'warnings'> {
	const n = samples.length;
	const startIndex = cycleWindow ? cycleWindow.startIndex : 0;
	const endIndex = cycleWindow ? cycleWindow.endIndex : n - 1;
	// Whole record: each sample weighs 1/N. Whole cycles: trapezoid over the fractional window; a window
	// ending past the last sample (at most at N) takes the value there one period earlier.
	const periodSamples =
		cycleWindow && cycleWindow.cycles >= 1 ? (endIndex - startIndex) / cycleWindow.cycles : endIndex - startIndex;
	const average = cycleWindow
		? (g: (x: number) => number, inner: GivenInnerSum) =>
				windowIntegral(samples, startIndex, endIndex, g, periodSamples, inner) / (endIndex - startIndex)
		: (g: (x: number) => number, inner: GivenInnerSum) => windowIntegral(samples, 0, n, g, n, inner) / n;
	// two passes over the samples instead of four: the inner sums of x and x², then of (x − mean)² and |x − mean|
	const { from, to } = cycleWindow ? innerSumRange(startIndex, endIndex) : innerSumRange(0, n);
	const plain = sumAndSquares(samples, from, to);
	const mean = average((x) => x, { kind: 'given', sum: plain.sum });
	const rms = Math.sqrt(average((x) => x * x, { kind: 'given', sum: plain.squares }));
	const about = squaresAndAbsAbout(samples, from, to, mean);
	const acRms = Math.sqrt(average((x) => (x - mean) * (x - mean), { kind: 'given', sum: about.squares }));
	const rectifiedMean = average((x) => Math.abs(x - mean), { kind: 'given', sum: about.abs });
	const { max: peak, min: peakNegative } = extremaIn(samples, startIndex, endIndex);
	const reading = averageRespondingReading(rectifiedMean);
	return {
		mean,
		rms,
		acRms,
		rectifiedMean,
		peak,
		peakNegative,
		peakToPeak: peak - peakNegative,
		crestFactor: ratio(Math.max(Math.abs(peak), Math.abs(peakNegative)), rms),
		formFactor: ratio(rms, rectifiedMean),
		averageResponding: {
			reading,
			errorPercent: 100 * (ratio(reading, rms) - 1),
			errorPercentAc: 100 * (ratio(reading, acRms) - 1),
		},
	};
}

/** a / b, or NaN when b is 0 (a ratio to nothing is undefined, not infinite). */
function ratio(a: number, b: number): number {
	return b === 0 ? NaN : a / b;
}

function hasNonFinite(samples: Float64Array): boolean {
	for (let i = 0; i < samples.length; i++) if (!Number.isFinite(samples[i])) return true;
	return false;
}

function nanFigures(
	span: WaveformFigures['span'],
	startIndex: number,
	endIndex: number,
	cycles: number,
	warnings: Diagnostic[],
): WaveformFigures {
	return {
		mean: NaN,
		rms: NaN,
		acRms: NaN,
		rectifiedMean: NaN,
		peak: NaN,
		peakNegative: NaN,
		peakToPeak: NaN,
		crestFactor: NaN,
		formFactor: NaN,
		averageResponding: { reading: NaN, errorPercent: NaN, errorPercentAc: NaN },
		span,
		startIndex,
		endIndex,
		cycles,
		warnings,
	};
}
