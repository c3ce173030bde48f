/**
 * Streaming zero-crossing tracker of one channel: finds the half-cycle boundaries of the fundamental,
 * sample by sample, and from them the Urms(1/2) values (one-cycle RMS refreshed every half cycle).
 *
 * Crossing rule: a sign change becomes a boundary once the signal has gone past a hysteresis band of
 * 10 % of the previous half-cycle's peak (at least 2 % of a slowly decaying long-term peak), and no
 * sooner than half a period after the previous boundary; harmonics and noise near zero therefore do not
 * add boundaries. When no crossing comes for 1.5 half periods (interruption, deep dip), the tracker
 * free-runs at the last measured period, so Urms(1/2) keeps being produced on a dead channel.
 *
 * Ref: IEC 61000-4-30:2015, 3.35 and 5.4.1: Urms(1/2) is measured over 1 cycle, commencing at a
 * fundamental zero crossing, refreshed each half-cycle, independently on each channel (from memory;
 * docs/methods.md §3.2).
 */

/**
 * `s` plus the squares of x[from … to − 1], added in order. One function for both runs of a ring (so the
 * run after a wrap, rarely taken, shares the optimised code of the first).
 */
export function addSquares(x: Float64Array, from: number, to: number, s: number): number {
	for (let j = from; j < to; j++) s += x[j] * x[j];
	return s;
}

/** Receives what the tracker finds. Indices are absolute sample indices from the recording start. */
export interface CrossingSink {
	/**
	 * A Urms(1/2) value over one cycle from crossing time `startT` to `endT` (samples, interpolated;
	 * the samples summed are those from index ceil-ish(startT) up to the newest boundary).
	 */
	halfCycle(channel: number, startT: number, endT: number, rms: number): void;
	/** A rising boundary at `index`; `timeSamples` interpolated between samples; forced = free-run. */
	rising(channel: number, index: number, timeSamples: number, forced: boolean): void;
}

const MIN_HZ = 40;
const MAX_HZ = 72;

export class CrossingTracker {
	private polarity = 0;
	private prev = 0;
	private last = -1;
	private prevBoundaryT = NaN;
	private lastT = NaN;
	private prevSumSq = 0;
	private prevN = 0;
	private cand = -1;
	private candT = 0;
	private halfPeak = 0;
	private h = 0;
	private peakRef = 0;
	private halfPeriod: number;
	private readonly minHalf: number;
	private readonly maxHalf: number;
	/** Time (samples, interpolated) of the last real rising / falling crossing; NaN after a free-run. */
	private lastRiseT = NaN;
	private lastFallT = NaN;
	/** Number of free-run boundaries inserted so far. */
	forcedCount = 0;

	constructor(
		readonly channel: number,
		/** The channel's ring buffer (power-of-two length), written by the caller before `scan`. */
		private readonly ring: Float64Array,
		sampleRateHz: number,
		nominalHz: number | undefined,
		private readonly sink: CrossingSink,
		/** Whether Urms(1/2) values are wanted (voltage channels) or only rising boundaries. */
		private readonly wantHalfCycles: boolean,
	) {
		this.minHalf = sampleRateHz / (2 * MAX_HZ);
		this.maxHalf = sampleRateHz / (2 * MIN_HZ);
		this.halfPeriod = sampleRateHz / (2 * (nominalHz ?? 55));
	}

	/** Half period now assumed, samples. */
	get halfPeriodSamples(): number {
		return this.halfPeriod;
	}

	/** Scan xs[from..to) whose first sample has absolute index abs0. */
	scan(xs: Float64Array, from: number, to: number, abs0: number): void {
		// Hot loop: tracker fields live in locals and are written back around the (rare) commits.
		let prev = this.prev;
		let polarity = this.polarity;
		let peak = this.halfPeak;
		let cand = this.cand;
		let candT = this.candT;
		let h = this.h;
		let earliest = this.last >= 0 ? this.last + 0.5 * this.halfPeriod : -Infinity;
		let deadline = this.last >= 0 ? this.last + 1.5 * this.halfPeriod : Infinity;
		const off = abs0 - from;
		for (let k = from; k < to; k++) {
			// Fast run: samples on the side of the current polarity, up to the free-run deadline, only raise the peak.
			const runEnd = Math.min(to, Math.floor(deadline - off) + 1);
			const k0 = k;
			if (polarity > 0) {
				for (; k < runEnd; k++) {
					const v = xs[k];
					if (!(v >= 0)) break;
					if (v > peak) peak = v;
				}
			} else if (polarity < 0) {
				for (; k < runEnd; k++) {
					const v = -xs[k];
					if (!(v > 0)) break;
					if (v > peak) peak = v;
				}
			}
			if (k > k0) prev = xs[k - 1];
			if (k >= to) break;
			const x = xs[k];
			const i = k + off;
			const ax = x < 0 ? -x : x;
			if (ax > peak) peak = ax;
			// A sign change against the polarity: a candidate boundary, committed once past the hysteresis band.
			if (polarity > 0 ? x < 0 : polarity < 0 && x >= 0) {
				if (polarity > 0 ? prev >= 0 : prev < 0) {
					cand = i;
					candT = i - 1 + prev / (prev - x);
				}
				if (ax > h && cand >= 0) {
					if (cand >= earliest) {
						this.halfPeak = peak;
						this.commit(cand, candT, polarity < 0, false);
						peak = 0;
						polarity = -polarity;
						h = this.h;
						earliest = this.last + 0.5 * this.halfPeriod;
						deadline = this.last + 1.5 * this.halfPeriod;
					}
					cand = -1;
				}
			} else if (polarity === 0 && x !== 0) {
				polarity = x > 0 ? 1 : -1;
			}
			if (i > deadline) {
				// Lost the crossings: free-run one half period after the last boundary (still in the ring).
				const b = this.last + Math.round(this.halfPeriod);
				this.halfPeak = peak;
				this.forcedCount++;
				this.commit(b, b, polarity < 0, true);
				peak = 0;
				polarity = polarity < 0 ? 1 : -1;
				cand = -1;
				h = this.h;
				earliest = this.last + 0.5 * this.halfPeriod;
				deadline = this.last + 1.5 * this.halfPeriod;
			}
			prev = x;
		}
		this.prev = prev;
		this.polarity = polarity;
		this.halfPeak = peak;
		this.cand = cand;
		this.candT = candT;
	}

	private commit(b: number, t: number, rising: boolean, forced: boolean): void {
		const last = this.last;
		if (last >= 0 && this.wantHalfCycles) {
			const ring = this.ring;
			// Samples last … b − 1 in order, in one or two runs of the ring (no masking per sample).
			const a = last & (ring.length - 1);
			const first = Math.min(b - last, ring.length - a);
			const s = addSquares(ring, 0, b - last - first, addSquares(ring, a, a + first, 0));
			// Divide by the interpolated duration, not the sample count: samples next to a crossing hold
			// almost no energy, so this keeps a one-cycle window exact when fs/f is not a whole number.
			const n = t - this.lastT;
			if (this.prevN > 0)
				this.sink.halfCycle(this.channel, this.prevBoundaryT, t, Math.sqrt((s + this.prevSumSq) / (n + this.prevN)));
			this.prevSumSq = s;
			this.prevN = n;
		}
		this.prevBoundaryT = this.lastT;
		// The period comes from same-direction crossings, so a DC offset (unequal halves) does not bias it.
		if (forced) {
			this.lastRiseT = NaN;
			this.lastFallT = NaN;
		} else {
			const same = rising ? this.lastRiseT : this.lastFallT;
			const half = (t - same) / 2;
			if (half >= this.minHalf && half <= this.maxHalf) this.halfPeriod = half;
			if (rising) this.lastRiseT = t;
			else this.lastFallT = t;
		}
		this.last = b;
		this.lastT = t;
		const p = this.halfPeak;
		this.peakRef = Math.max(this.peakRef * 0.999, p);
		this.h = Math.max(0.1 * p, 0.02 * this.peakRef);
		if (rising) this.sink.rising(this.channel, b, t, forced);
	}
}
