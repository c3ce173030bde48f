import { coarseFrequencyHz } from './coarse-frequency.js';
import { fitFundamental, type FundamentalFit } from './fundamental-fit.js';
import { fmt } from './format.js';

/**
 * Whole fundamental cycles of a record: the rising zero crossings of its fundamental, as fractional
 * sample indices (index 0 = first sample; 12.25 lies a quarter of the way from sample 12 to 13).
 */
export interface CycleWindow {
	/** First used rising crossing, fractional sample index. */
	startIndex: number;
	/** Last used rising crossing, fractional sample index. */
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
/** Fits weaker than this fraction of the strongest are bridged (IEC 61000-4-30 interruptions are typically
 * below 5 or 10 % of the declared voltage; from memory). */
const BRIDGE_BELOW = 0.05;
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
 * until the two agree to 1e-12 (secant steps, at most 8 passes; 2–4 in practice). Crossings outside
 * [0, N − 1] are not used, so a record of exactly 10 cycles gives 9 whole cycles crossing to crossing.
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
 * @returns the window, or a failure: 'bad-parameter' (rate, options, or a NaN/infinite sample),
 *   'dc-only' (no variation), 'too-short' (under 2 whole cycles), 'no-fundamental' (noise, no periodicity)
 * @example findWholeCycles(sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: 10_000, cycles: 9.37 }), 10_000)
 *   // { ok: true, startIndex: 0, endIndex: 1800, cycles: 9, frequencyHz: 50, … } (up to rounding)
 */
export function findWholeCycles(
	samples: Float64Array,
	sampleRateHz: number,
	opts: { frequencyHz?: number; nominalHz?: number; maxCycles?: number } = {},
): ({ ok: true } & CycleWindow) | SignalFailure {
	const bad = checkParameters(sampleRateHz, opts);
	if (bad) return fail('bad-parameter', bad);
	const n = samples.length;
	if (n < 8) return fail('too-short', `The record has ${n} sample${n === 1 ? '' : 's'}; at least two whole cycles are needed.`);
	let mean = 0;
	for (let i = 0; i < n; i++) {
		if (!Number.isFinite(samples[i])) {
			return fail('bad-parameter', `Sample at index ${i} is ${samples[i]}: remove or repair non-numeric samples before analysis.`);
		}
		mean += samples[i];
	}
	mean /= n;
	let acSquares = 0;
	for (let i = 0; i < n; i++) acSquares += (samples[i] - mean) ** 2;
	const acRms = Math.sqrt(acSquares / n);
	if (!(acRms > 1e-9 * Math.abs(mean))) {
		return fail('dc-only', `The record is constant (${fmt(mean)}): no alternating signal, so no cycles or frequency.`);
	}

	let frequencyHz = opts.frequencyHz ?? coarseFrequencyHz(samples, sampleRateHz, { nominalHz: opts.nominalHz });
	if (!Number.isFinite(frequencyHz) || frequencyHz <= 0) {
		return fail('no-fundamental', 'No periodic fundamental stands out in the spectrum of this record.');
	}
	const recordCycles = (n * frequencyHz) / sampleRateHz;
	if (recordCycles < 1.8) return tooShort(recordCycles, frequencyHz);

	// The crossings depend slightly on the fit frequency (windows near the record's ends are off-centre),
	// so f_crossings(f_fit) = f is solved by the secant method: ~3 passes to 1e-12 instead of ~12 by plain
	// iteration.
	let track: Track | undefined;
	let previous: { fitHz: number; gapHz: number } | undefined;
	for (let pass = 0; pass < 8; pass++) {
		track = trackCrossings(samples, sampleRateHz / frequencyHz, opts.maxCycles);
		if (track.irregular) break;
		if (track.crossings.length < 3) return tooShort(recordCycles, frequencyHz, track.crossings.length - 1);
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
	const t = track as Track;
	if (t.irregular || !(t.periodSpread <= MAX_PERIOD_SPREAD)) {
		const spread = t.irregular ? 'successive zero crossings jump by more than half a cycle' : `cycle lengths vary by ${fmt(100 * t.periodSpread)} % (at most ${100 * MAX_PERIOD_SPREAD} % accepted)`;
		return fail('no-fundamental', `No steady fundamental near ${fmt(frequencyHz)} Hz: ${spread}. The record looks like noise or a non-periodic signal.`);
	}
	if (!(t.fundamentalRatio >= MIN_FUNDAMENTAL_RATIO)) {
		return fail(
			'no-fundamental',
			`No clear fundamental: near ${fmt(frequencyHz)} Hz it is only ${fmt(t.fundamentalRatio)} × the rest of the signal ` +
				`(at least ${MIN_FUNDAMENTAL_RATIO} accepted). The record looks like noise or a non-periodic signal.`,
		);
	}
	let crossings = Float64Array.from(t.crossings);
	if (opts.maxCycles !== undefined && crossings.length - 1 > opts.maxCycles) crossings = crossings.slice(0, opts.maxCycles + 1);
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
		bridgedCrossings: t.bridged,
	};
}

interface Track {
	crossings: number[];
	/** A step between crossings fell outside 0.5…1.5 periods: not a periodic signal at this frequency. */
	irregular: boolean;
	/** Crossings carried on at the last period where the fundamental vanished. */
	bridged: number;
	/** Pooled fundamental RMS / residual RMS over all fits. */
	fundamentalRatio: number;
	/** Coefficient of variation of the crossing-to-crossing intervals. */
	periodSpread: number;
}

/**
 * Rising crossings of the fundamental of period `periodSamples`, tracked from an anchor one period in,
 * forwards to the end (or `maxCycles` + 1 crossings) and backwards to the start.
 */
function trackCrossings(samples: Float64Array, periodSamples: number, maxCycles?: number): Track {
	const n = samples.length;
	const last = n - 1;
	let fundamentalSquares = 0;
	let residualSquares = 0;
	let previousAmplitude = NaN;
	let previousQuality = NaN;
	/** What the fit leaves relative to what it explains: near 0 for a clean sine, jumps at a step. */
	const quality = (g: FundamentalFit) => g.residualRms / Math.max(g.amplitude, 1e-300);
	/** Centred fit; `strongest` is compared with its amplitude (bridging) before any one-sided refit. */
	const fit = (expected: number, period: number, centredAmplitude?: { value: number }) => {
		let f = fitFundamental(samples, expected, period);
		if (centredAmplitude) centredAmplitude.value = f.amplitude;
		// A sudden change of amplitude (dip, swell, interruption edge) inside the window biases the phase of a
		// centred fit; the fit from the side the step is not on, one period off-centre, is then cleaner.
		if (Math.abs(f.amplitude / previousAmplitude - 1) > 0.02 || quality(f) > 1.5 * previousQuality + 1e-9) {
			for (const side of [-period, period]) {
				const g = fitFundamental(samples, expected, period, expected + side);
				if (quality(g) < 0.5 * quality(f)) f = g; // only a clearly cleaner fit: off-centre ones extrapolate
			}
		}
		fundamentalSquares += (f.amplitude * f.amplitude) / 2;
		residualSquares += f.residualRms * f.residualRms;
		return f;
	};
	// Anchor near the start (one period in), refit once so the anchor's own window is centred on it.
	const first = fit(Math.min(periodSamples, last / 2), periodSamples);
	const anchorFit = fit(first.crossingIndex, periodSamples);
	const anchor = anchorFit.crossingIndex;
	previousAmplitude = anchorFit.amplitude;
	previousQuality = quality(anchorFit);
	let strongest = anchorFit.amplitude;
	let bridged = 0;
	const forward: number[] = [];
	const backward: number[] = [];
	let irregular = false;
	// Each step fits with the local period (mean of the last few cycles), so a drifting frequency is followed
	// and the off-centre windows at the record's ends extrapolate the phase at the right rate. Four cycles
	// average out noise on single intervals while lagging a 0.1 Hz/s ramp by under 1e-4 of a period.
	const recent = 4;
	for (const direction of [1, -1]) {
		const out = direction > 0 ? forward : backward;
		// Backwards, start from the first cycles measured forwards: the anchor sits one period in.
		const seen = direction < 0 ? [anchor, ...forward.slice(0, recent)] : [anchor];
		let period = seen.length > 1 ? (seen[seen.length - 1] - seen[0]) / (seen.length - 1) : periodSamples;
		let prev = anchor;
		previousAmplitude = anchorFit.amplitude;
		previousQuality = quality(anchorFit);
	previousQuality = quality(anchorFit);
		for (;;) {
			const guess = prev + direction * period;
			if (guess > last + period / 2 || guess < -period / 2) break;
			const centred = { value: 0 };
			const f = fit(guess, period, centred);
			strongest = Math.max(strongest, centred.value);
			const step = direction * (f.crossingIndex - prev);
			const regular = step > periodSamples / 2 && step < 1.5 * periodSamples;
			// Where the fundamental vanishes (an interruption: under 5 % of the strongest fit, or a wild step
			// under half of it) its phase means nothing: carry the crossings on at the last period.
			if (centred.value < BRIDGE_BELOW * strongest || (!regular && f.amplitude < 0.5 * strongest)) {
				out.push(guess);
				bridged++;
				prev = guess;
				continue;
			}
			if (!regular) {
				irregular = true;
				break;
			}
			const c = f.crossingIndex;
			previousAmplitude = f.amplitude;
			previousQuality = quality(f);
			out.push(c);
			const k = Math.min(out.length, recent);
			period = direction * (c - (out.length > k ? out[out.length - 1 - k] : anchor)) / k;
			prev = c;
			if (direction > 0 && maxCycles !== undefined && out.length > maxCycles) break;
		}
	}
	// A crossing within 1e-9 samples of either end is taken as on it, so rounding in the fit (or scaling the
	// record) cannot add or drop a cycle.
	const snap = (c: number) => (Math.abs(c) <= 1e-9 ? 0 : Math.abs(c - last) <= 1e-9 ? last : c);
	const all = [...backward.reverse(), anchor, ...forward].map(snap).filter((c) => c >= 0 && c <= last);
	let sum = 0;
	let sumSquares = 0;
	for (let i = 1; i < all.length; i++) {
		const d = all[i] - all[i - 1];
		sum += d;
		sumSquares += d * d;
	}
	const k = all.length - 1;
	const meanPeriod = sum / k;
	const spread = k > 0 ? Math.sqrt(Math.max(0, sumSquares / k - meanPeriod * meanPeriod)) / meanPeriod : NaN;
	return {
		crossings: all,
		fundamentalRatio: Math.sqrt(fundamentalSquares / Math.max(residualSquares, 1e-300)),
		// mostly bridged = mostly no fundamental
		irregular: irregular || bridged > all.length / 2,
		bridged,
		periodSpread: spread,
	};
}

function checkParameters(
	sampleRateHz: number,
	opts: { frequencyHz?: number; nominalHz?: number; maxCycles?: number },
): string | undefined {
	if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) return `Sample rate must be a positive number of Hz, got ${sampleRateHz}.`;
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
		`The record holds about ${fmt(recordCycles)} cycles of ${fmt(frequencyHz)} Hz${found}; at least two whole cycles are needed.`,
	);
}

function fail(code: SignalFailure['code'], message: string): SignalFailure {
	return { ok: false, code, message };
}
