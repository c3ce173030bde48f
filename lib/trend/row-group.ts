/**
 * Aggregation of 10/12-cycle values into longer intervals: the square root of the mean of the squared
 * values (each 10/12-cycle window counts once, whatever its sample count). A flagged window flags the
 * group.
 *
 * Ref: IEC 61000-4-30:2015, 4.5.2-4.5.3 (from memory); docs/methods.md §3.2 (150/180-cycle = √(mean of 15
 * squared 10/12-cycle values); 10-min = RMS of the 10/12-cycle values in the interval) and §3.5 (flags).
 */
import type { TrendInterval, TrendRow } from './types.js';

export class RowGroup {
	private readonly sumSqRms: Float64Array;
	private readonly sumSqThd: Float64Array;
	private sumSqHarm: Float64Array[] | undefined;
	private sumSqUnbalance = 0;
	private unbalanceCount = 0;
	private count = 0;
	private cycles = 0;
	private windowsS = 0;
	private flagged = false;
	private startS = NaN;
	private endS = NaN;

	constructor(
		readonly interval: TrendInterval,
		private readonly channelCount: number,
	) {
		this.sumSqRms = new Float64Array(channelCount);
		this.sumSqThd = new Float64Array(channelCount);
	}

	/** Number of 10/12-cycle rows in the group. */
	get size(): number {
		return this.count;
	}

	add(row: TrendRow): void {
		if (this.count === 0) this.startS = row.startS;
		this.endS = row.startS + row.durationS;
		for (let c = 0; c < this.channelCount; c++) {
			this.sumSqRms[c] += row.rms[c] * row.rms[c];
			this.sumSqThd[c] += row.thdPercent[c] * row.thdPercent[c];
		}
		if (row.harmonicsPercent) {
			this.sumSqHarm ??= row.harmonicsPercent.map((h) => new Float64Array(h.length));
			for (let c = 0; c < this.channelCount; c++) {
				const src = row.harmonicsPercent[c];
				const dst = this.sumSqHarm[c];
				for (let k = 0; k < src.length; k++) dst[k] += src[k] * src[k];
			}
		}
		if (row.unbalancePercent !== undefined && Number.isFinite(row.unbalancePercent)) {
			this.sumSqUnbalance += row.unbalancePercent * row.unbalancePercent;
			this.unbalanceCount++;
		}
		this.cycles += row.cycles;
		this.windowsS += row.durationS;
		this.count++;
		if (row.flagged) this.flagged = true;
	}

	/** The group's row, then the group is emptied. Undefined when empty. */
	take(complete: boolean): TrendRow | undefined {
		if (this.count === 0) return undefined;
		const n = this.count;
		const row: TrendRow = {
			interval: this.interval,
			startS: this.startS,
			durationS: this.endS - this.startS,
			cycles: this.cycles,
			frequencyHz: this.cycles / this.windowsS,
			complete,
			flagged: this.flagged,
			rms: Array.from(this.sumSqRms, (s) => Math.sqrt(s / n)),
			thdPercent: Array.from(this.sumSqThd, (s) => Math.sqrt(s / n)),
		};
		if (this.unbalanceCount > 0) row.unbalancePercent = Math.sqrt(this.sumSqUnbalance / this.unbalanceCount);
		this.sumSqUnbalance = 0;
		this.unbalanceCount = 0;
		if (this.sumSqHarm) {
			row.harmonicsPercent = this.sumSqHarm.map((h) => Array.from(h, (v) => Math.sqrt(v / n)));
			for (const h of this.sumSqHarm) h.fill(0);
		}
		this.sumSqRms.fill(0);
		this.sumSqThd.fill(0);
		this.count = 0;
		this.cycles = 0;
		this.windowsS = 0;
		this.flagged = false;
		return row;
	}
}
