import { fitFundamental, type FundamentalFit } from './fundamental-fit.js';

/** Fits weaker than this fraction of the strongest are bridged (IEC 61000-4-30 interruptions are typically
 * below 5 or 10 % of the declared voltage; from memory). */
const BRIDGE_BELOW = 0.05;

/** Crossings this close to the record's start or end (in sample intervals) are taken as on it. */
const SNAP_SAMPLES = 1e-6;

/** Result of one tracking pass. Internal to lib/signal. */
export interface Track {
	crossings: number[];
	/** A step between crossings fell outside 0.5…1.5 periods: not a periodic signal at this frequency. */
	irregular: boolean;
	/** Crossings (among `crossings`) carried on at the last period where the fundamental vanished. */
	bridged: number[];
	/** Pooled fundamental RMS / residual RMS over all fits. */
	fundamentalRatio: number;
	/** Coefficient of variation of the crossing-to-crossing intervals. */
	periodSpread: number;
}

/**
 * Rising crossings of the fundamental of period `periodSamples`, tracked from an anchor one period in,
 * forwards to the end (or `maxCycles` + 1 crossings) and backwards to the start, each placed by
 * `fitFundamental`. Internal to lib/signal (`findWholeCycles` runs it until its frequency settles).
 *
 * Ref: IEC 61000-4-30:2015 5.1 (zero crossings of the fundamental, from memory); interruption threshold
 * of a few % of declared voltage, IEC 61000-4-30 5.5 (from memory).
 *
 * @param samples  signal, any unit; not modified
 * @param periodSamples  expected period in samples (fs / f)
 * @param maxCycles  stop after this many whole cycles forwards
 * @param toRecordEnd  keep crossings up to N (the end of the record's last sample interval); default: up to N − 1
 * @returns crossings (fractional sample indices in [0, N − 1], or [0, N] with `toRecordEnd`, N = samples.length:
 *   the record spans N sample intervals, so a crossing at N, one interval after the last sample, still closes
 *   a cycle inside it) with the pooled fundamental-to-rest ratio,
 *   the spread of cycle lengths, whether tracking broke off, and how many crossings were bridged
 * @example trackCrossings(sine 50 Hz at 10 kS/s, 10 cycles from phase 0, 200, undefined, true).crossings // [0, 200, …, 2000]
 */
export function trackCrossings(
	samples: Float64Array,
	periodSamples: number,
	maxCycles?: number,
	toRecordEnd = false,
): Track {
	const n = samples.length;
	const last = n - 1;
	const fitter = new CrossingFitter(samples);
	// Anchor near the start (one period in), refit once so the anchor's own window is centred on it.
	const first = fitter.fit(Math.min(periodSamples, last / 2), periodSamples);
	const anchorFit = fitter.fit(first.crossingIndex, periodSamples);
	const anchor = anchorFit.crossingIndex;
	if (!(Number.isFinite(anchor) && periodSamples > 0 && Number.isFinite(periodSamples))) {
		return { crossings: [], fundamentalRatio: NaN, irregular: true, bridged: [], periodSpread: NaN };
	}
	const state: TrackState = { strongest: anchorFit.amplitude, bridged: [], irregular: false };
	const forward = trackDirection(fitter, anchorFit, 1, [anchor], periodSamples, maxCycles, state);
	// Backwards, start from the first cycles measured forwards: the anchor sits one period in.
	const backward = trackDirection(
		fitter,
		anchorFit,
		-1,
		[anchor, ...forward.slice(0, RECENT_CYCLES)],
		periodSamples,
		undefined,
		state,
	);
	return finishTrack(backward, anchor, forward, toRecordEnd ? n : last, fitter, state);
}

/**
 * Each step fits with the local period (mean of the last few cycles), so a drifting frequency is followed
 * and the off-centre windows at the record's ends extrapolate the phase at the right rate. Four cycles
 * average out noise on single intervals while lagging a 0.1 Hz/s ramp by under 1e-4 of a period.
 */
const RECENT_CYCLES = 4;

/** What the two directions of one tracking pass share. */
interface TrackState {
	strongest: number;
	bridged: number[];
	irregular: boolean;
}

/** fitFundamental with the step check against the last good fit and the pooled fundamental/residual sums. */
class CrossingFitter {
	fundamentalSquares = 0;
	residualSquares = 0;
	previousAmplitude = NaN;
	previousQuality = NaN;
	constructor(readonly samples: Float64Array) {}

	/** Centred fit; `centredAmplitude` receives its amplitude (bridging) before any one-sided refit. */
	fit(expected: number, period: number, centredAmplitude?: { value: number }): FundamentalFit {
		let f = fitFundamental(this.samples, expected, period);
		if (centredAmplitude) centredAmplitude.value = f.amplitude;
		// A sudden change of amplitude (dip, swell, interruption edge) inside the window biases the phase of a
		// centred fit; the fit from the side the step is not on, one period off-centre, is then cleaner.
		if (Math.abs(f.amplitude / this.previousAmplitude - 1) > 0.02 || quality(f) > 1.5 * this.previousQuality + 1e-9) {
			for (const side of [-period, period]) {
				const g = fitFundamental(this.samples, expected, period, expected + side);
				if (quality(g) < 0.5 * quality(f)) f = g; // only a clearly cleaner fit: off-centre ones extrapolate
			}
		}
		this.fundamentalSquares += (f.amplitude * f.amplitude) / 2;
		this.residualSquares += f.residualRms * f.residualRms;
		return f;
	}

	/** The last good fit the next step is compared with. */
	accept(f: FundamentalFit): void {
		this.previousAmplitude = f.amplitude;
		this.previousQuality = quality(f);
	}
}

/** What the fit leaves relative to what it explains: near 0 for a clean sine, jumps at a step. */
function quality(g: FundamentalFit): number {
	return g.residualRms / Math.max(g.amplitude, 1e-300);
}

/** Crossings one period at a time from the anchor in one direction, to the record's end or `maxCycles`. */
function trackDirection(
	fitter: CrossingFitter,
	anchorFit: FundamentalFit,
	direction: 1 | -1,
	seen: number[],
	periodSamples: number,
	maxCycles: number | undefined,
	state: TrackState,
): number[] {
	const last = fitter.samples.length - 1;
	const anchor = anchorFit.crossingIndex;
	const out: number[] = [];
	let period = seen.length > 1 ? (seen[seen.length - 1] - seen[0]) / (seen.length - 1) : periodSamples;
	let prev = anchor;
	fitter.accept(anchorFit);
	// Each step moves at least half a period (a smaller one is irregular and stops), so no direction takes
	// more than 2n / periodSamples + 2 steps; the bound also stops the loop if a NaN ever slips through.
	const maxSteps = Math.ceil((2 * (last + 1)) / periodSamples) + 2;
	for (let steps = 0; ; steps++) {
		const guess = prev + direction * period;
		if (!Number.isFinite(guess) || steps > maxSteps) {
			state.irregular = true;
			break;
		}
		if (guess > last + period / 2 || guess < -period / 2) break;
		const centred = { value: 0 };
		const f = fitter.fit(guess, period, centred);
		state.strongest = Math.max(state.strongest, centred.value);
		const step = direction * (f.crossingIndex - prev);
		const regular = step > periodSamples / 2 && step < 1.5 * periodSamples;
		// Where the fundamental vanishes (an interruption: under 5 % of the strongest fit, or a wild step
		// under half of it) its phase means nothing: carry the crossings on at the last period.
		if (centred.value < BRIDGE_BELOW * state.strongest || (!regular && f.amplitude < 0.5 * state.strongest)) {
			out.push(guess);
			state.bridged.push(guess);
			prev = guess;
			continue;
		}
		if (!regular) {
			state.irregular = true;
			break;
		}
		const c = f.crossingIndex;
		fitter.accept(f);
		out.push(c);
		const k = Math.min(out.length, RECENT_CYCLES);
		period = (direction * (c - (out.length > k ? out[out.length - 1 - k] : anchor))) / k;
		prev = c;
		if (direction > 0 && maxCycles !== undefined && out.length > maxCycles) break;
	}
	return out;
}

/** The crossings inside the record (ends snapped), the spread of their intervals and the pooled ratio. */
function finishTrack(
	backward: number[],
	anchor: number,
	forward: number[],
	end: number,
	fitter: CrossingFitter,
	state: TrackState,
): Track {
	// The record covers [0, N) in sample intervals (sample n stands for [n, n + 1)), so a crossing may lie
	// anywhere in [0, N]: one at N closes the last whole cycle of a record of exactly k cycles (kept when
	// `toRecordEnd`; otherwise crossings stop at N − 1, the last sample). A crossing within 1e-6 sample
	// intervals of either end is taken as on it, so rounding in the fit cannot add or drop a cycle: the
	// off-centre fits at the ends place a crossing that lies exactly on 0 or N within a few 1e-9 samples
	// (measured: −4e-9 at 153.6 samples per period), and moving an end by 1e-6 of a sample changes any
	// figure by under 1e-6 of one sample's share. A crossing further out (e.g. −0.3, extrapolated before
	// the first sample's interval) is not used.
	const snap = (c: number) => (Math.abs(c) <= SNAP_SAMPLES ? 0 : Math.abs(c - end) <= SNAP_SAMPLES ? end : c);
	const all = [...backward.reverse(), anchor, ...forward].map(snap).filter((c) => c >= 0 && c <= end);
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
	const bridgedInside = state.bridged.filter((c) => c >= 0 && c <= end);
	return {
		crossings: all,
		fundamentalRatio: Math.sqrt(fitter.fundamentalSquares / Math.max(fitter.residualSquares, 1e-300)),
		// mostly bridged = mostly no fundamental
		irregular: state.irregular || bridgedInside.length > all.length / 2,
		bridged: bridgedInside,
		periodSpread: spread,
	};
}
