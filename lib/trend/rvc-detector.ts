/**
 * Rapid voltage changes (RVC): a quick transition of the r.m.s. voltage between two steady states that
 * stays within the dip and swell thresholds. Fed with the same Urms(1/2) values, in the same order, as
 * the dip/swell detector.
 *
 * Method (IEC 61000-4-30:2015, 5.11, class A; read in public instrument makers' descriptions of it):
 * - a channel is in steady state when all of its preceding N = 100 (50 Hz) / 120 (60 Hz) Urms(1/2) values
 *   lie within the RVC threshold of their arithmetic mean;
 * - an RVC starts when a channel in steady state gives a value further than the threshold from the mean
 *   of its preceding N values (time stamp: that value's window start);
 * - while it lasts the mean keeps sliding; a channel is steady again when its last N values lie within
 *   threshold − hysteresis of their mean; the RVC ends when every channel is steady again, and its end is
 *   N half cycles before that moment (the start of the first of those N values), so the duration is the
 *   transition itself;
 * - ΔUmax = largest |Urms(1/2) − mean before the event| on any channel during the event; ΔUss = largest
 *   |first mean after − mean before| on any channel;
 * - an RVC during which a value crosses the dip or swell threshold is not an RVC (it is a dip or swell).
 */

/** A finished rapid voltage change, times in samples. */
export interface RawRvc {
	start: number;
	end: number;
	deltaUmaxV: number;
	deltaUssV: number;
	/** Channels (indices into the voltage list) that left steady state during the event. */
	channels: Set<number>;
}

interface ChannelState {
	values: Float64Array;
	starts: Float64Array;
	count: number;
	head: number;
	sum: number;
	steady: boolean;
	meanBefore: number;
}

export class RvcDetector {
	private readonly ch: ChannelState[];
	private active: { start: number; deltaUmaxV: number; channels: Set<number>; spoilt: boolean } | null = null;
	readonly events: RawRvc[] = [];

	constructor(
		channelCount: number,
		private readonly n: number,
		private readonly thresholdV: number,
		private readonly endThresholdV: number,
		private readonly dipV: number,
		private readonly swellV: number,
	) {
		this.ch = Array.from({ length: channelCount }, () => ({
			values: new Float64Array(n),
			starts: new Float64Array(n),
			count: 0,
			head: 0,
			sum: 0,
			steady: false,
			meanBefore: NaN,
		}));
	}

	/** Largest |v − mean| over the channel's last N values, or Infinity while it has fewer. */
	private spread(s: ChannelState): number {
		if (s.count < this.n) return Infinity;
		const mean = s.sum / this.n;
		let worst = 0;
		for (let k = 0; k < this.n; k++) worst = Math.max(worst, Math.abs(s.values[k] - mean));
		return worst;
	}

	update(c: number, start: number, rmsV: number): void {
		const s = this.ch[c];
		const n = this.n;
		const full = s.count >= n;
		const meanPrev = full ? s.sum / n : NaN;
		if (!this.active && full && s.steady && Math.abs(rmsV - meanPrev) > this.thresholdV) {
			this.active = { start, deltaUmaxV: 0, channels: new Set(), spoilt: false };
			for (const o of this.ch) o.meanBefore = o.count >= n ? o.sum / n : NaN;
		}
		const a = this.active;
		if (a && Number.isFinite(s.meanBefore)) {
			if (Math.abs(rmsV - s.meanBefore) > this.thresholdV) a.channels.add(c);
			a.deltaUmaxV = Math.max(a.deltaUmaxV, Math.abs(rmsV - s.meanBefore));
		}
		if (a) {
			if (rmsV < this.dipV || rmsV > this.swellV) a.spoilt = true;
		}
		// slide the channel's window
		if (full) s.sum -= s.values[s.head];
		s.values[s.head] = rmsV;
		s.starts[s.head] = start;
		s.sum += rmsV;
		s.head = (s.head + 1) % n;
		if (s.count < n) s.count++;
		s.steady = this.spread(s) <= (a ? this.endThresholdV : this.thresholdV);
		if (a && this.ch.every((o) => o.steady)) {
			let deltaUss = 0;
			let end = -Infinity;
			for (const o of this.ch) {
				if (Number.isFinite(o.meanBefore)) deltaUss = Math.max(deltaUss, Math.abs(o.sum / n - o.meanBefore));
				end = Math.max(end, o.starts[o.head]); // oldest of the last N values: the steady window's start
			}
			if (!a.spoilt)
				this.events.push({
					start: a.start,
					end: Math.max(end, a.start),
					deltaUmaxV: a.deltaUmaxV,
					deltaUssV: deltaUss,
					channels: a.channels,
				});
			this.active = null;
		}
	}
}
