import { coarseFrequencyHz } from './coarse-frequency.js';
import { cyclesText, fmt } from './format.js';
import { trackCrossings, type Track } from './track-crossings.js';

/**
 * Whole fundamental cycles of a record: the rising zero crossings of its fundamental, as fractional
 * sample indices (index 0 = first sample; 12.25 lies a quarter of the way from sample 12 to 13).
 */
export interface CycleWindow {
	/** First used rising crossing, fractional sample index. */
	startIndex: number;
	/** Last used rising crossing, fractional sample index: at most N − 1, or N with `toRecordEnd` (the record covers [0, N), see findWholeCycles). */
	endIndex: number;
	/** Whole cycles between startIndex and endIndex (crossings.length − 1). */
	cycles: number;
	/** cycles / ((endIndex − startIndex) / fs), Hz: the IEC 61000-4-30 "whole cycles / their duration" reading. */
	frequencyHz: number;
	/** Every used rising crossing, ascending, fractional sample indices (cycles + 1 of them). */
	crossings: Float64Array;
	/**
	 * How many crossings were carried on at the last measured period because the fundamental vanished there
	 * (an interruption); 0 or absent when every crossing was measured.
	 */
	bridgedCrossings?: number;
}

/** Why no whole cycles (or frequency) could be given: typed, with a sentence for the user. */
export type SignalFailure = {
	ok: false;
	code: 'too-short' | 'no-fundamental' | 'dc-only' | 'bad-parameter';
	message: string;
};

/** Smallest ratio of fundamental RMS to everything else (harmonics + noise) accepted as "a fundamental". */
const MIN_FUNDAMENTAL_RATIO = 0.1;
/** Largest spread (coefficient of variation) of cycle lengths accepted as periodic. */
const MAX_PERIOD_SPREAD = 0.1;

/**
 * Finds the whole cycles of the fundamental in a record, from interpolated rising zero crossings.
 *
 * Method: a coarse frequency from the spectrum peak (or `opts.frequencyHz`), then a tracker steps one
 * period at a time and places each crossing from a least-squares fit of the fundamental over the two
 * periods around it (see `fundamental-fit.ts`): DC offset, harmonics and most noise do not move the
 * crossings, and slow frequency drift is followed (each step uses the period of the last 4 cycles). The
 * frequency is then re-estimated from the crossings (whole cycles / their duration) and the search repeated
 * until the two agree to 1e-12 (secant steps, at most 8 passes; 2–4 in practice).
 *
 * Which crossings lie inside the record: each sample stands for the interval [n/fs, (n + 1)/fs), so a
 * record of N samples covers N/fs seconds, sample indices [0, N). With `opts.toRecordEnd` a crossing in
 * [0, N] is used: one up to a sample interval after the last sample (index N, not N − 1) still ends a cycle
 * inside the record, so a record of exactly 10 cycles that starts at a rising crossing (2000 samples of
 * 50 Hz at 10 kS/s, a scope at 20 ms/div × 10 div) gives 10 whole cycles, endIndex = 2000. Without it
 * (the default for now: lib/power's window functions still require endIndex ≤ N − 1) crossings stop at
 * N − 1 and that record gives 9. Figures over a window ending past N − 1 take the value
 * at N one period earlier (periodic continuation over less than one sample interval; see
 * `window-integral.ts`), and a harmonic window ending there uses samples [start, start + M) only. A crossing
 * before index 0 (e.g. −0.3, extrapolated) is not used: it lies before the first sample's interval, so
 * the record does not hold that cycle whole, and such a record holds one whole cycle fewer.
 *
 * Where the fundamental vanishes for a while (an interruption: its fitted amplitude under 5 % of the
 * strongest seen), the crossings are carried on at the last measured period and counted in
 * `bridgedCrossings`, so a record with an interruption still has whole cycles.
 *
 * Accepted as a fundamental when its RMS is at least 0.1 × the RMS of the rest (harmonics + noise: a
 * neutral current whose 3rd harmonic is 5 × its fundamental still passes) and the cycle lengths vary by
 * at most 10 %; white noise fails both. A NaN or infinite sample is a 'bad-parameter' failure naming its
 * index (never skipped silently).
 *
 * Ref: IEC 61000-4-30:2015, 5.1 power frequency: integral cycles over their duration, harmonics attenuated
 * first to avoid multiple zero crossings (from memory); IEEE Std 1057-2017 sine fit (from memory).
 *
 * @param samples  signal, any unit; not modified
 * @param sampleRateHz  samples per second
 * @param opts.frequencyHz  known or previously estimated frequency: skips the spectral search (the
 *   crossings still set the reported frequency)
 * @param opts.nominalHz  nominal system frequency (50, 60, 400…): the search covers 0.7…1.3 × nominal
 * @param opts.maxCycles  use at most this many whole cycles from the start of the record (tracking stops
 *   there, so it is also the cheap way to look at the start of a long record)
 * @param opts.toRecordEnd  let the last cycle end anywhere up to index N (the end of the last sample's
 *   interval) instead of N − 1; the window can then be given to waveformFigures, perCycleFigures and
 *   harmonicWindow / harmonicAnalysis (which all accept endIndex ≤ N), but not yet to lib/power
 * @returns the window, or a failure: 'bad-parameter' (rate, options, or a NaN/infinite sample),
 *   'dc-only' (no variation), 'too-short' (under 2 whole cycles), 'no-fundamental' (noise, no periodicity)
 * @example findWholeCycles(sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 9.37 }), 10_000)
 *   // { ok: true, startIndex: 0, endIndex: 1800, cycles: 9, frequencyHz: 50, … } (up to rounding)
 */
export function findWholeCycles(
	samples: Float64Array,
	sampleRateHz: number,
	opts: FindCyclesOptions = {},
): ({ ok: true } & CycleWindow) | SignalFailure {
	const bad = checkParameters(sampleRateHz, opts);
	if (bad) return fail('bad-parameter', bad);
	const n = samples.length;
	if (n < 8)
		return fail('too-short', `The record has ${n} sample${n === 1 ? '' : 's'}; at least two whole cycles are needed.`);
	const unusable = recordFailure(samples);
	if (unusable) return unusable;

	if (opts.frequencyHz === undefined && opts.nominalHz !== undefined && (n * 1.3 * opts.nominalHz) / sampleRateHz < 1.8)
		return tooShortBlind(n, sampleRateHz);
	const block = Math.floor(sampleRateHz / CROSSING_RATE_HZ);
	if (block >= 2 && n >= 16 * block) return onBlockMeans(samples, sampleRateHz, opts, block);
	const frequencyHz = opts.frequencyHz ?? coarseFrequencyHz(samples, sampleRateHz, { nominalHz: opts.nominalHz });
	if (!Number.isFinite(frequencyHz) || frequencyHz <= 0) {
		// a record under two cycles of the lowest mains frequency searched (0.7 × 50 Hz): its peak lies below the search
		if (opts.frequencyHz === undefined && n / sampleRateHz < 2 / (0.7 * (opts.nominalHz ?? 50)))
			return tooShortBlind(n, sampleRateHz);
		return fail('no-fundamental', 'No periodic fundamental stands out in the spectrum of this record.');
	}
	const recordCycles = (n * frequencyHz) / sampleRateHz;
	// without a nominal frequency the search starts at 1.8 cycles per record: below it nothing was measured
	const blind = opts.frequencyHz === undefined && opts.nominalHz === undefined;
	if (recordCycles < 1.8) return blind ? tooShortBlind(n, sampleRateHz) : tooShort(recordCycles, frequencyHz);
	const settled = settleCrossings(samples, sampleRateHz, frequencyHz, opts);
	if ('tooFew' in settled)
		return blind && recordCycles < 2.2
			? tooShortBlind(n, sampleRateHz)
			: tooShort(recordCycles, settled.frequencyHz, settled.tooFew - 1);
	return acceptTrack(settled.track, settled.frequencyHz, sampleRateHz, opts.maxCycles);
}

/** Options of findWholeCycles (see there). */
export interface FindCyclesOptions {
	frequencyHz?: number;
	nominalHz?: number;
	maxCycles?: number;
	toRecordEnd?: boolean;
}

/** A NaN/infinite sample, sums beyond the largest double, or a constant record; undefined when usable. */
function recordFailure(samples: Float64Array): SignalFailure | undefined {
	const n = samples.length;
	let mean = 0;
	for (let i = 0; i < n; i++) {
		if (!Number.isFinite(samples[i])) {
			return fail(
				'bad-parameter',
				`Sample at index ${i} is ${samples[i]}: remove or repair non-numeric samples before analysis.`,
			);
		}
		mean += samples[i];
	}
	mean /= n;
	let acSquares = 0;
	for (let i = 0; i < n; i++) acSquares += (samples[i] - mean) ** 2;
	if (!Number.isFinite(acSquares) || !Number.isFinite(mean)) return overflowFailure(samples, mean);
	const acRms = Math.sqrt(acSquares / n);
	if (!(acRms > 1e-9 * Math.abs(mean))) {
		return fail('dc-only', `The record is constant (${fmt(mean)}): no alternating signal, so no cycles or frequency.`);
	}
	return undefined;
}

/**
 * The crossings depend slightly on the fit frequency (windows near the record's ends are off-centre),
 * so f_crossings(f_fit) = f is solved by the secant method: ~3 passes to 1e-12 instead of ~12 by plain
 * iteration. `tooFew` (the crossings found) when a pass finds under three.
 */
function settleCrossings(
	samples: Float64Array,
	sampleRateHz: number,
	startHz: number,
	opts: FindCyclesOptions,
): { track: Track; frequencyHz: number } | { tooFew: number; frequencyHz: number } {
	let frequencyHz = startHz;
	let track: Track | undefined;
	let previous: { fitHz: number; gapHz: number } | undefined;
	for (let pass = 0; pass < 8; pass++) {
		track = trackCrossings(samples, sampleRateHz / frequencyHz, opts.maxCycles, opts.toRecordEnd === true);
		if (track.irregular) break;
		if (track.crossings.length < 3) return { tooFew: track.crossings.length, frequencyHz };
		const c = track.crossings;
		const measuredHz = ((c.length - 1) * sampleRateHz) / (c[c.length - 1] - c[0]);
		const gapHz = measuredHz - frequencyHz;
		if (Math.abs(gapHz) <= 1e-12 * frequencyHz) break;
		let nextHz = measuredHz;
		if (previous && gapHz !== previous.gapHz) {
			const secantHz = frequencyHz - (gapHz * (frequencyHz - previous.fitHz)) / (gapHz - previous.gapHz);
			if (Math.abs(secantHz - measuredHz) < 0.01 * measuredHz) nextHz = secantHz;
		}
		previous = { fitHz: frequencyHz, gapHz };
		frequencyHz = nextHz;
	}
	return { track: track as Track, frequencyHz };
}

/** The window of a settled track, or why it is not a steady fundamental (spread of periods, weak fundamental). */
function acceptTrack(
	t: Track,
	frequencyHz: number,
	sampleRateHz: number,
	maxCycles: number | undefined,
): ({ ok: true } & CycleWindow) | SignalFailure {
	if (t.irregular || !(t.periodSpread <= MAX_PERIOD_SPREAD)) {
		const spread = t.irregular
			? 'successive zero crossings jump by more than half a cycle'
			: `cycle lengths vary by ${fmt(100 * t.periodSpread)} % (at most ${100 * MAX_PERIOD_SPREAD} % accepted)`;
		return fail(
			'no-fundamental',
			`No steady fundamental near ${fmt(frequencyHz)} Hz: ${spread}. The record looks like noise or a non-periodic signal.`,
		);
	}
	if (!(t.fundamentalRatio >= MIN_FUNDAMENTAL_RATIO)) {
		return fail(
			'no-fundamental',
			`No clear fundamental: near ${fmt(frequencyHz)} Hz it is only ${fmt(t.fundamentalRatio)} × the rest of the signal ` +
				`(at least ${MIN_FUNDAMENTAL_RATIO} accepted). The record looks like noise or a non-periodic signal.`,
		);
	}
	let crossings = Float64Array.from(t.crossings);
	if (maxCycles !== undefined && crossings.length - 1 > maxCycles) crossings = crossings.slice(0, maxCycles + 1);
	const cycles = crossings.length - 1;
	const startIndex = crossings[0];
	const endIndex = crossings[cycles];
	return {
		ok: true,
		startIndex,
		endIndex,
		cycles,
		frequencyHz: (cycles * sampleRateHz) / (endIndex - startIndex),
		crossings,
		bridgedCrossings: t.bridged.filter((c) => c <= endIndex).length,
	};
}

function checkParameters(
	sampleRateHz: number,
	opts: { frequencyHz?: number; nominalHz?: number; maxCycles?: number },
): string | undefined {
	if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0))
		return `Sample rate must be a positive number of Hz, got ${sampleRateHz}.`;
	if (opts.frequencyHz !== undefined && !(opts.frequencyHz > 0 && opts.frequencyHz < sampleRateHz / 2)) {
		return `Frequency must lie between 0 and half the sample rate (${fmt(sampleRateHz / 2)} Hz), got ${opts.frequencyHz}.`;
	}
	if (opts.nominalHz !== undefined && !(opts.nominalHz > 0 && opts.nominalHz < sampleRateHz / 2)) {
		return `Nominal frequency must lie between 0 and half the sample rate (${fmt(sampleRateHz / 2)} Hz), got ${opts.nominalHz}.`;
	}
	if (opts.maxCycles !== undefined && !(Number.isInteger(opts.maxCycles) && opts.maxCycles >= 1)) {
		return `maxCycles must be a whole number ≥ 1, got ${opts.maxCycles}.`;
	}
	return undefined;
}

function tooShort(recordCycles: number, frequencyHz: number, wholeCycles?: number): SignalFailure {
	const found =
		wholeCycles === undefined ? '' : `, of which ${Math.max(0, wholeCycles)} whole between rising zero crossings`;
	return fail(
		'too-short',
		`The record holds about ${cyclesText(fmt(recordCycles))} of ${fmt(frequencyHz)} Hz${found}; at least two whole cycles are needed.`,
	);
}

/**
 * The failure for finite samples whose sum or sum of squares exceeds the largest double (about 1.8e308):
 * names the first sample at which the running sum of squares overflows.
 */
function overflowFailure(samples: Float64Array, mean: number): SignalFailure {
	let s = 0;
	let at = 0;
	const centre = Number.isFinite(mean) ? mean : 0;
	for (; at < samples.length; at++) {
		s += (samples[at] - centre) ** 2;
		if (!Number.isFinite(s)) break;
	}
	at = Math.min(at, samples.length - 1);
	return fail(
		'bad-parameter',
		`Sample at index ${at} is ${fmt(samples[at])}: the samples are too large to sum their squares (beyond about 1e154 in magnitude, or their sum beyond 1.8e308). Check the scaling or unit of the file.`,
	);
}

/**
 * Above this rate the crossings are found on means of blocks of M samples (51.2 kS/s: 1024 samples per
 * 50 Hz period, ample for the fitted crossings; cost O(N) instead of several passes over every sample).
 */
const CROSSING_RATE_HZ = 51_200;

/** findWholeCycles on block means (block j stands at jM + (M − 1)/2), crossings mapped back to sample indices. */
function onBlockMeans(
	samples: Float64Array,
	sampleRateHz: number,
	opts: FindCyclesOptions,
	m: number,
): ({ ok: true } & CycleWindow) | SignalFailure {
	const n = samples.length;
	const count = Math.floor(n / m);
	const y = new Float64Array(count);
	for (let j = 0; j < count; j++) {
		let acc = 0;
		for (let k = j * m, end = k + m; k < end; k++) acc += samples[k];
		y[j] = acc / m;
	}
	const r = findWholeCycles(y, sampleRateHz / m, opts);
	// a duration quoted from the block means would drop the last partial block: quote the record's own
	if (!r.ok)
		return r.code === 'too-short' && r.message.startsWith('The record lasts') ? tooShortBlind(n, sampleRateHz) : r;
	const last = opts.toRecordEnd ? n : n - 1;
	const mapped = Array.from(r.crossings, (c) => c * m + (m - 1) / 2).filter((c) => c >= 0 && c <= last);
	if (mapped.length < 3) return tooShort((n * r.frequencyHz) / sampleRateHz, r.frequencyHz, mapped.length - 1);
	const crossings = Float64Array.from(mapped);
	const cycles = crossings.length - 1;
	return {
		ok: true,
		startIndex: crossings[0],
		endIndex: crossings[cycles],
		cycles,
		frequencyHz: (cycles * sampleRateHz) / (crossings[cycles] - crossings[0]),
		crossings,
		bridgedCrossings: r.bridgedCrossings,
	};
}

function tooShortBlind(n: number, sampleRateHz: number): SignalFailure {
	return fail(
		'too-short',
		`The record lasts ${fmt((1000 * n) / sampleRateHz)} ms: under two cycles of any frequency below ${fmt((2 * sampleRateHz) / n)} Hz (mains included); at least two whole cycles are needed.`,
	);
}

function fail(code: SignalFailure['code'], message: string): SignalFailure {
	return { ok: false, code, message };
}
