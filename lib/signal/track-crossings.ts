import { fitFundamental, type FundamentalFit } from './fundamental-fit.js';

/** Fits weaker than this fraction of the strongest are bridged (IEC 61000-4-30 interruptions are typically
 * below 5 or 10 % of the declared voltage; from memory). */
const BRIDGE_BELOW = 0.05;

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
 * @returns crossings (fractional sample indices in [0, N − 1]) with the pooled fundamental-to-rest ratio,
 *   the spread of cycle lengths, whether tracking broke off, and how many crossings were bridged
 * @example trackCrossings(sine 50 Hz at 10 kS/s, 10 cycles from phase 0, 200).crossings // [0, 200, …, 1800]
 */
export function trackCrossings(samples: Float64Array, periodSamples: number, maxCycles?: number): Track {
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
	const bridged: number[] = [];
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
				bridged.push(guess);
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
	const bridgedInside = bridged.filter((c) => c >= 0 && c <= last);
	return {
		crossings: all,
		fundamentalRatio: Math.sqrt(fundamentalSquares / Math.max(residualSquares, 1e-300)),
		// mostly bridged = mostly no fundamental
		irregular: irregular || bridgedInside.length > all.length / 2,
		bridged: bridgedInside,
		periodSpread: spread,
	};
}
