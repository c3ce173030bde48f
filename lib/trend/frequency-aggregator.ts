/**
 * Power frequency per 10 s: the whole measured cycles of the timing reference inside each interval
 * divided by their summed duration; a cycle straddling an interval boundary is discarded, as is one
 * timed by a free-running (lost) crossing. Intervals sit on the clock's 10-s ticks when the recording's
 * start time is known (the first is then partial), else they count from the first sample.
 *
 * Ref: IEC 61000-4-30:2015, 5.1.2 (from memory); docs/methods.md §3.3.
 */
import type { TrendFrequencyRow } from './types.js';
import type { TickGrid } from './window-clock.js';

/** A 10-s value waiting for its event flag: samples [start, end). */
export interface PendingFrequency {
	start: number;
	end: number;
	row: TrendFrequencyRow;
}

export class FrequencyAggregator {
	/** Closed values waiting for their flag, oldest first. */
	readonly pending: PendingFrequency[] = [];
	/** First sample of the interval being counted. */
	private start = 0;
	/** Next 10-s boundary (samples), and whether the value being counted began on one. */
	private next: number;
	private aligned: boolean;
	private count = 0;
	private durationT = 0;
	private lastT = NaN;

	constructor(
		private readonly sampleRateHz: number,
		private readonly ticks: TickGrid,
	) {
		this.next = ticks.length - ticks.offset;
		this.aligned = ticks.offset === 0;
	}

	/** First sample of the interval still being counted. */
	get openStart(): number {
		return this.start;
	}

	/** A rising crossing of the reference at time `t` (samples, interpolated); forced = free-run. */
	rising(t: number, forced: boolean): void {
		while (t >= this.next) this.nextInterval();
		if (!forced && !Number.isNaN(this.lastT)) {
			this.count++;
			this.durationT += t - this.lastT;
		}
		this.lastT = forced ? NaN : t;
	}

	/** Ends the recording after `samples` samples: closes the intervals up to there, the last one partial. */
	finish(samples: number): void {
		while (samples >= this.next) this.nextInterval();
		if (samples > this.start) this.close(samples, false);
	}

	private nextInterval(): void {
		this.close(this.next, this.aligned);
		this.aligned = true;
		this.next += this.ticks.length;
	}

	private close(end: number, complete: boolean): void {
		const fs = this.sampleRateHz;
		this.pending.push({
			start: this.start,
			end,
			row: {
				startS: this.start / fs,
				durationS: (end - this.start) / fs,
				frequencyHz: this.count > 0 ? (this.count * fs) / this.durationT : NaN,
				cycles: this.count,
				complete,
				flagged: false,
			},
		});
		this.start = end;
		this.count = 0;
		this.durationT = 0;
		this.lastT = NaN;
	}
}
