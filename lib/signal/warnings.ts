import type { ChannelRange, Diagnostic } from '../capture.js';
import { cyclesText, fmt } from './format.js';
import { runShowsSlopeBreak } from './clip-check.js';
import { rangeClippingMessage } from './clip-range.js';
import { windowIntegral } from './window-integral.js';

/** IEC 61000-4-30 power-frequency measurement ranges, Hz (docs/methods.md §3.3; from memory). */
export const MAINS_FREQUENCY_RANGES_HZ = {
	50: { lowHz: 42.5, highHz: 57.5 },
	60: { lowHz: 51, highHz: 69 },
} as const;

/** Records shorter than this many cycles get a 'few-cycles' warning (IEC 61000-4-30 10-cycle basic interval). */
export const MIN_RECOMMENDED_CYCLES = 10;

/** DC offsets above this fraction of the AC RMS get a 'dc-offset' warning (common practice: a few %). */
export const DC_OFFSET_WARNING_RATIO = 0.05;

/**
 * The warnings a careful engineer raises about a record before trusting its figures. Each is a
 * `Diagnostic` with severity 'warning', a kebab-case code and a sentence with the numbers in it:
 *
 * - 'non-finite-samples': NaN or ±Infinity present (the other data checks are then skipped);
 * - 'few-cycles': the record holds fewer than 10 cycles of `frequencyHz` (IEC 61000-4-30 basic interval);
 * - 'sample-rate-low-for-harmonics': fs ≤ 2·maxOrder·f1 (Nyquist), naming the highest measurable order
 *   ⌈fs / (2 f1)⌉ − 1;
 * - 'sample-rate-low-for-accuracy': the sampled peak of a sine may read low by up to 1 − cos(π f1/fs),
 *   more than `peakAccuracyPercent` (the rate needed is given);
 * - 'clipping': runs of equal samples at the record's highest or lowest value, longer than a sine of that
 *   amplitude would show at this quantisation step and rate, and met by the wave at a slope break (the
 *   flanks, continued smoothly, would pass the run's level: `clip-check.ts`), so the slow crest of an
 *   8-bit record at a high rate is not taken for a clip (a square wave or a stepped inverter output can
 *   trigger it too: judge from the plot); when `info.range` (the range the file states) is given, only
 *   flat runs at its limits are clipping, quoted with their count, samples and place (`clip-range.ts`);
 * - 'dc-offset': |mean| above 5 % of the AC RMS (over whole periods from the first sample when the
 *   frequency is known, else the whole record);
 * - 'frequency-out-of-range': f1 outside 42.5–57.5 Hz (50 Hz systems) or 51–69 Hz (60 Hz systems), the
 *   IEC 61000-4-30 measurement ranges; without `nominalHz`, outside both.
 *
 * Ref: IEC 61000-4-30:2015 5.1 (frequency range) and 4.4 (10/12-cycle interval) (from memory);
 * Nyquist–Shannon sampling theorem; clipping and DC-offset thresholds are common practice.
 *
 * @param samples  the record, any unit (messages quote values in that unit)
 * @param sampleRateHz  samples per second; must be positive (RangeError otherwise)
 * @param info.frequencyHz  measured fundamental, Hz (without it the sample-rate checks use `nominalHz` and
 *   the cycle-count and range checks are skipped)
 * @param info.cycles  whole cycles analysed, quoted in the 'few-cycles' message
 * @param info.maxOrder  highest harmonic order the user asked for
 * @param info.nominalHz  nominal system frequency (50 or 60 select the range; others skip the range check)
 * @param info.peakAccuracyPercent  accuracy wanted on peak values, %
 * @param info.range  the range the file states for the channel (clipping is then judged at its limits only)
 * @param info.startS  time of the first sample, s (places the first clipped run; default 0)
 * @returns warnings, possibly none
 * @example signalWarnings(sine 230 V 50 Hz at 1 kS/s for 0.1 s, 1000, { frequencyHz: 50, maxOrder: 40 })
 *   // [{ code: 'few-cycles', … }, { code: 'sample-rate-low-for-harmonics', message: '… highest order measurable is 9.' }]
 */
export function signalWarnings(samples: Float64Array, sampleRateHz: number, info: WarningInfo): Diagnostic[] {
	if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz)))
		throw new RangeError(`sampleRateHz must be positive, got ${sampleRateHz}`);
	const out: Diagnostic[] = [];
	const warn: Warn = (code, message) => out.push({ code, message, severity: 'warning' });
	const n = samples.length;
	const f =
		info.frequencyHz !== undefined && info.frequencyHz > 0 && Number.isFinite(info.frequencyHz)
			? info.frequencyHz
			: undefined;
	const allFinite = nonFiniteWarning(samples, warn);
	if (f !== undefined && n > 0) fewCyclesWarning(n, sampleRateHz, f, info.cycles, warn);
	// The rate checks need only a fundamental to scale by: the nominal one will do when none was measured.
	const f1 = f ?? (info.nominalHz !== undefined && info.nominalHz > 0 ? info.nominalHz : undefined);
	if (f1 !== undefined) sampleRateWarnings(sampleRateHz, f1, info, warn);
	if (allFinite && n > 0) {
		const clip = info.range
			? rangeClippingMessage(samples, info.range, sampleRateHz, info.startS ?? 0)
			: clippingWarning(samples, f === undefined ? undefined : sampleRateHz / f);
		if (clip) warn('clipping', clip);
		const dc = dcOffsetWarning(samples, f === undefined ? undefined : sampleRateHz / f);
		if (dc) warn('dc-offset', dc);
	}
	if (f !== undefined) frequencyRangeWarning(f, info.nominalHz, warn);
	return out;
}

/** What signalWarnings knows of the record besides its samples (see its parameters). */
export interface WarningInfo {
	frequencyHz?: number;
	cycles?: number;
	maxOrder?: number;
	nominalHz?: number;
	peakAccuracyPercent?: number;
	/** The range the file states for the channel, and the record's start time for the clipping sentence. */
	range?: ChannelRange;
	startS?: number;
}

/** The name the scope-capture work gave this shape; the same interface. */
export type SignalWarningInfo = WarningInfo;

type Warn = (code: string, message: string) => void;

/** 'non-finite-samples'; returns true when every sample is finite. */
function nonFiniteWarning(samples: Float64Array, warn: Warn): boolean {
	let bad = -1;
	let badCount = 0;
	for (let i = 0; i < samples.length; i++) {
		if (!Number.isFinite(samples[i])) {
			if (bad < 0) bad = i;
			badCount++;
		}
	}
	if (bad >= 0) {
		warn(
			'non-finite-samples',
			`${badCount} sample(s) are not numbers (first at index ${bad}, value ${samples[bad]}); figures that include them are NaN.`,
		);
	}
	return bad < 0;
}

/** Slack on the cycle count, so a record of exactly 10 cycles (up to rounding) is not warned about. */
const CYCLE_COUNT_SLACK = 1e-3;

/** 'few-cycles': fewer than MIN_RECOMMENDED_CYCLES cycles of f in the record. */
function fewCyclesWarning(n: number, sampleRateHz: number, f: number, cycles: number | undefined, warn: Warn): void {
	const recordCycles = (n * f) / sampleRateHz;
	if (recordCycles < MIN_RECOMMENDED_CYCLES - CYCLE_COUNT_SLACK) {
		const analysed = cycles !== undefined ? `, ${cycles} whole cycle(s) analysed` : '';
		warn(
			'few-cycles',
			`The record holds only ${cyclesText(fmt(recordCycles))} (${fmt((1000 * n) / sampleRateHz)} ms at ${fmt(f)} Hz${analysed}); ` +
				`IEC 61000-4-30 basic values use 10 cycles at 50 Hz or 12 at 60 Hz, so these figures may vary more between captures.`,
		);
	}
}

/** 'sample-rate-low-for-harmonics' (Nyquist) and 'sample-rate-low-for-accuracy' (sampled peak of a sine). */
function sampleRateWarnings(sampleRateHz: number, f1: number, info: WarningInfo, warn: Warn): void {
	if (info.maxOrder !== undefined && info.maxOrder >= 1 && sampleRateHz <= 2 * info.maxOrder * f1) {
		const highest = Math.ceil(sampleRateHz / (2 * f1)) - 1;
		warn(
			'sample-rate-low-for-harmonics',
			`Sample rate ${fmt(sampleRateHz)} Hz is too low for harmonics up to order ${info.maxOrder} of ${fmt(f1)} Hz: ` +
				`it must exceed ${fmt(2 * info.maxOrder * f1)} Hz (Nyquist); the highest order measurable is ${highest}.`,
		);
	}
	if (info.peakAccuracyPercent !== undefined && info.peakAccuracyPercent > 0) {
		const f = f1;
		const worstPercent = 100 * (1 - Math.cos((Math.PI * f) / sampleRateHz));
		if (worstPercent > info.peakAccuracyPercent) {
			const neededHz = (Math.PI * f) / Math.acos(1 - info.peakAccuracyPercent / 100);
			warn(
				'sample-rate-low-for-accuracy',
				`At ${fmt(sampleRateHz)} Hz (${fmt(sampleRateHz / f)} samples per cycle) a sampled peak can read up to ${fmt(worstPercent)} % low, ` +
					`more than the ${fmt(info.peakAccuracyPercent)} % asked; that needs at least ${fmt(neededHz)} Hz.`,
			);
		}
	}
}

/** 'frequency-out-of-range': f outside the IEC 61000-4-30 range of the nominal frequency (of both without one). */
function frequencyRangeWarning(f: number, nominalHz: number | undefined, warn: Warn): void {
	const range =
		nominalHz === 50
			? [MAINS_FREQUENCY_RANGES_HZ[50]]
			: nominalHz === 60
				? [MAINS_FREQUENCY_RANGES_HZ[60]]
				: nominalHz === undefined
					? [MAINS_FREQUENCY_RANGES_HZ[50], MAINS_FREQUENCY_RANGES_HZ[60]]
					: [];
	if (range.length > 0 && !range.some((r) => f >= r.lowHz && f <= r.highHz)) {
		const which = range.map((r) => `${r.lowHz}–${r.highHz} Hz`).join(' or ');
		warn(
			'frequency-out-of-range',
			`Frequency ${fmt(f)} Hz is outside the mains measurement range ${which} (IEC 61000-4-30): check the sample rate ` +
				`stated in the file, or this is not a ${nominalHz ?? '50/60'} Hz mains signal.`,
		);
	}
}

function clippingWarning(samples: Float64Array, periodSamples: number | undefined): string | undefined {
	const n = samples.length;
	let max = -Infinity;
	let min = Infinity;
	let step = Infinity; // quantisation step: smallest non-zero change between neighbours
	for (let i = 0; i < n; i++) {
		const x = samples[i];
		if (x > max) max = x;
		if (x < min) min = x;
		if (i > 0) {
			const d = Math.abs(x - samples[i - 1]);
			if (d > 0 && d < step) step = d;
		}
	}
	if (!(max > min)) return undefined;
	// A sine of this amplitude stays within one step of its crest for 2·acos(1 − q/a) rad.
	const amplitude = (max - min) / 2;
	const crestRad = 2 * Math.acos(Math.max(-1, 1 - Math.min(step, 2 * amplitude) / amplitude));
	const natural = periodSamples === undefined ? 1 : Math.floor((crestRad / (2 * Math.PI)) * periodSamples) + 1;
	const minRun = Math.max(3, 2 * natural + 1);
	let runs = 0;
	let longest = 0;
	let shortest = Infinity;
	const judge = (first: number, run: number, side: 1 | -1, level: number) => {
		// a slow crest sits on its top code for long: only a run the wave meets at a slope break is a clip
		if (run >= minRun && runShowsSlopeBreak(samples, first, first + run - 1, side, level, step)) {
			runs++;
			longest = Math.max(longest, run);
			shortest = Math.min(shortest, run);
		}
	};
	// Runs at the top and at the bottom in one pass (NaN matches no sample). A signal resting at exactly
	// zero (a rectifier or a switched load that is off) is not clipped.
	const top = max !== 0 ? max : NaN;
	const bottom = min !== 0 ? min : NaN;
	let runTop = 0;
	let runBottom = 0;
	for (let i = 0; i < n; i++) {
		const x = samples[i];
		if (x === top) runTop++;
		else if (runTop > 0) {
			judge(i - runTop, runTop, 1, top);
			runTop = 0;
		}
		if (x === bottom) runBottom++;
		else if (runBottom > 0) {
			judge(i - runBottom, runBottom, -1, bottom);
			runBottom = 0;
		}
	}
	if (runTop > 0) judge(n - runTop, runTop, 1, top);
	if (runBottom > 0) judge(n - runBottom, runBottom, -1, bottom);
	if (runs === 0) return undefined;
	return (
		`Possible clipping: ${runs} flat run(s) of ${shortest === longest ? longest : `${shortest} to ${longest}`} equal samples at the extreme values ${fmt(max)} / ${fmt(min)}; ` +
		`an overdriven input or a range set too low cuts the peaks, so peak, RMS and harmonics read wrong. Check the recorder's range.`
	);
}

function dcOffsetWarning(samples: Float64Array, periodSamples: number | undefined): string | undefined {
	const n = samples.length;
	// Over whole periods when the frequency is known: a partial cycle alone would fake an offset of up to
	// peak/(π·cycles).
	// The record covers N sample intervals, so whole periods may run to index N (see window-integral.ts).
	const wholePeriods = periodSamples === undefined ? 0 : Math.floor(n / periodSamples + 1e-9);
	let mean: number;
	let acRms: number;
	if (periodSamples !== undefined && wholePeriods >= 1) {
		const end = Math.min(n, wholePeriods * periodSamples);
		mean = windowIntegral(samples, 0, end, (x) => x, periodSamples, { kind: 'x' }) / end;
		acRms = Math.sqrt(
			windowIntegral(samples, 0, end, (x) => (x - mean) * (x - mean), periodSamples, { kind: 'square', about: mean }) /
				end,
		);
	} else {
		mean = 0;
		for (let i = 0; i < n; i++) mean += samples[i];
		mean /= n;
		let acSquares = 0;
		for (let i = 0; i < n; i++) acSquares += (samples[i] - mean) ** 2;
		acRms = Math.sqrt(acSquares / n);
	}
	if (!(acRms > 0) || Math.abs(mean) <= DC_OFFSET_WARNING_RATIO * acRms) return undefined;
	return (
		`DC offset of ${fmt(mean)} is ${fmt((100 * Math.abs(mean)) / acRms)} % of the AC RMS (${fmt(acRms)}): check the probe or clamp zero ` +
		`and the coupling; true RMS includes it, AC RMS does not.`
	);
}
