/**
 * The row emitter of the trend analyser: measured 10/12-cycle rows and 10-s frequency values wait until
 * the event pipeline has passed their end (so their flag is known), then go out in time order: each
 * 10/12-cycle row to `onRow` and the kept list, into the 150/180-cycle group (a row of 15 windows, cut
 * short at a 10-minute tick) and into the 10-minute group (cut at each tick; the first one is complete
 * only when the recording starts on a tick).
 *
 * Ref: IEC 61000-4-30:2015, 4.5.2-4.5.3 (aggregation), 4.7 (flagging) (from memory); docs/methods.md §3.2, §3.5.
 */
import type { PendingFrequency } from './frequency-aggregator.js';
import { RowGroup } from './row-group.js';
import type { TrendFrequencyRow, TrendOptions, TrendRow } from './types.js';

/** 10/12-cycle values in one 150/180-cycle value. Ref: IEC 61000-4-30:2015, 4.5.2 (from memory). */
export const WINDOWS_PER_150_CYCLES = 15;

/** A measured 10/12-cycle row waiting for its flag: samples [start, end). */
export interface PendingRow {
	start: number;
	end: number;
	row: TrendRow;
}

/** The rows a result keeps, by interval. */
export interface KeptRows {
	cycles10: TrendRow[];
	cycles150: TrendRow[];
	min10: TrendRow[];
	frequency: TrendFrequencyRow[];
}

export class RowEmitter {
	/** Measured rows waiting for their flag, oldest first. */
	readonly pending: PendingRow[] = [];
	readonly out: KeptRows = { cycles10: [], cycles150: [], min10: [], frequency: [] };
	private readonly g150: RowGroup;
	private readonly g10m: RowGroup;
	private readonly keep: { cycles10: boolean; cycles150: boolean; min10: boolean };
	private tickOfGroups = 0;
	/** Whether the 10-min group being filled began at a tick (the first one does only when the recording does). */
	private groupAligned: boolean;

	constructor(
		channelCount: number,
		keep: TrendOptions['keep'],
		private readonly onRow: TrendOptions['onRow'],
		/** The 10-minute tick interval of a sample (WindowClock.tickOf). */
		private readonly tickOf: (sample: number) => number,
		startsOnTick: boolean,
	) {
		this.keep = { cycles10: true, cycles150: true, min10: true, ...keep };
		this.g150 = new RowGroup('150/180-cycle', channelCount);
		this.g10m = new RowGroup('10-min', channelCount);
		this.groupAligned = startsOnTick;
	}

	/**
	 * Sends out, flagged by `overlaps`, the rows and frequency values ending at or before sample `pos`; the
	 * rows stop at the first one still in `waiting` (its harmonic figures not yet in).
	 */
	release(
		pos: number,
		frequency: PendingFrequency[],
		overlaps: (start: number, end: number) => boolean,
		waiting?: ReadonlyMap<PendingRow, unknown>,
	): void {
		const pending = this.pending;
		while (pending.length > 0 && pending[0].end <= pos && !waiting?.has(pending[0])) {
			const p = pending.shift()!;
			p.row.flagged = overlaps(p.start, p.end);
			this.emit10(p.start, p.row);
		}
		while (frequency.length > 0 && frequency[0].end <= pos) {
			const p = frequency.shift()!;
			p.row.flagged = overlaps(p.start, p.end);
			this.out.frequency.push(p.row);
		}
	}

	/** First sample of the oldest row still waiting, Infinity when none. */
	get oldestPending(): number {
		return this.pending[0]?.start ?? Infinity;
	}

	/** Ends the recording: the open groups go out, the 10-minute one as partial. */
	finish(): void {
		this.emitGroups(this.g150.size === WINDOWS_PER_150_CYCLES, false);
	}

	private emit10(start: number, row: TrendRow): void {
		const tick = this.tickOf(start);
		if (tick !== this.tickOfGroups) {
			this.emitGroups(this.g150.size === WINDOWS_PER_150_CYCLES, this.groupAligned);
			this.groupAligned = true;
			this.tickOfGroups = tick;
		}
		this.send(row, this.keep.cycles10, this.out.cycles10);
		this.g150.add(row);
		this.g10m.add(row);
		if (this.g150.size === WINDOWS_PER_150_CYCLES)
			this.send(this.g150.take(true)!, this.keep.cycles150, this.out.cycles150);
	}

	private emitGroups(complete150: boolean, complete10m: boolean): void {
		const a = this.g150.take(complete150);
		if (a) this.send(a, this.keep.cycles150, this.out.cycles150);
		const b = this.g10m.take(complete10m);
		if (b) this.send(b, this.keep.min10, this.out.min10);
	}

	private send(row: TrendRow, kept: boolean, list: TrendRow[]): void {
		this.onRow?.(row);
		if (kept) list.push(row);
	}
}
