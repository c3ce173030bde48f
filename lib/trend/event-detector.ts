/**
 * Dip, swell and interruption detection on Urms(1/2) values of the voltage channels, fed in time order
 * (by window start, then channel). Times are in samples from the recording start (interpolated zero
 * crossing times); an event is stamped with the start
 * of the Urms(1/2) window that began it and ends at the start of the window that ended it, so a 100 ms
 * dip starting on a zero crossing measures 110 ms (docs/methods.md §3.4 worked example, within ±1 cycle).
 *
 * Polyphase rules (docs/methods.md §3.4):
 * - dip: starts when any channel is below the dip threshold; ends when every channel is at or above
 *   threshold + hysteresis;
 * - swell: starts when any channel is above the swell threshold; ends when every channel is at or
 *   below threshold − hysteresis;
 * - interruption: starts only when every channel is below the interruption threshold; ends when any
 *   channel is at or above threshold + hysteresis (from memory).
 * Residual = lowest Urms(1/2) on any channel during a dip or interruption; maximum = highest during a
 * swell. An interruption is also a dip (residual below the dip threshold), so it is reported as both,
 * each by its own rule.
 *
 * Ref: IEC 61000-4-30:2015, 5.4.2-5.4.4 (from memory; rules as in docs/methods.md §3.4).
 */
import type { TrendEventKind } from './types.js';

/** An event in sample indices; `end` is NaN while it lasts. */
export interface RawTrendEvent {
	kind: TrendEventKind;
	start: number;
	end: number;
	/** Residual (dip, interruption) or maximum (swell), V. */
	extremeV: number;
	/** Indices (into the detector's voltage list) of the channels that crossed the threshold. */
	channels: Set<number>;
}

export interface EventLevelsV {
	dipV: number;
	dipEndV: number;
	swellV: number;
	swellEndV: number;
	interruptionV: number;
	interruptionEndV: number;
}

export class EventDetector {
	private readonly latest: Float64Array;
	private dip: RawTrendEvent | null = null;
	private swell: RawTrendEvent | null = null;
	private interruption: RawTrendEvent | null = null;
	/** Every event seen, in start order (ended or not). */
	readonly events: RawTrendEvent[] = [];

	constructor(
		channelCount: number,
		private readonly levels: EventLevelsV,
	) {
		this.latest = new Float64Array(channelCount).fill(NaN);
	}

	/** A new Urms(1/2) value of voltage channel `ch` over a window starting at sample `start`. */
	update(ch: number, start: number, rmsV: number): void {
		const L = this.levels;
		const latest = this.latest;
		latest[ch] = rmsV;
		const n = latest.length;

		// dip
		if (this.dip) {
			const d = this.dip;
			if (rmsV < d.extremeV) d.extremeV = rmsV;
			if (rmsV < L.dipV) d.channels.add(ch);
			let all = true;
			for (let c = 0; c < n; c++) if (latest[c] < L.dipEndV) all = false;
			if (all) {
				d.end = start;
				this.dip = null;
			}
		} else if (rmsV < L.dipV) {
			this.dip = { kind: 'dip', start, end: NaN, extremeV: rmsV, channels: new Set([ch]) };
			this.events.push(this.dip);
		}

		// swell
		if (this.swell) {
			const s = this.swell;
			if (rmsV > s.extremeV) s.extremeV = rmsV;
			if (rmsV > L.swellV) s.channels.add(ch);
			let all = true;
			for (let c = 0; c < n; c++) if (latest[c] > L.swellEndV) all = false;
			if (all) {
				s.end = start;
				this.swell = null;
			}
		} else if (rmsV > L.swellV) {
			this.swell = { kind: 'swell', start, end: NaN, extremeV: rmsV, channels: new Set([ch]) };
			this.events.push(this.swell);
		}

		// interruption
		if (this.interruption) {
			const it = this.interruption;
			if (rmsV < it.extremeV) it.extremeV = rmsV;
			let any = false;
			for (let c = 0; c < n; c++) if (latest[c] >= L.interruptionEndV) any = true;
			if (any) {
				it.end = start;
				this.interruption = null;
			}
		} else {
			let all = true;
			let lowest = Infinity;
			for (let c = 0; c < n; c++) {
				if (!(latest[c] < L.interruptionV)) all = false;
				if (latest[c] < lowest) lowest = latest[c];
			}
			if (all) {
				const channels = new Set<number>();
				for (let c = 0; c < n; c++) channels.add(c);
				this.interruption = { kind: 'interruption', start, end: NaN, extremeV: lowest, channels };
				this.events.push(this.interruption);
			}
		}
	}

	/** True while any event is in progress. */
	get active(): boolean {
		return this.dip !== null || this.swell !== null || this.interruption !== null;
	}
}
