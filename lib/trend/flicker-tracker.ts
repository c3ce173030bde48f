/**
 * Flicker beside the trend: IEC 61000-4-15 flickermeters (lib/flicker) for the voltage channels, run as one
 * group (createFlickermeterGroup: the figures of a meter per channel, in less time), fed the same chunks
 * as the analyser, giving Pst per 10 minutes and Plt per 2 hours, each flagged when a dip, swell or
 * interruption overlaps it (IEC 61000-4-30 flagging, from memory).
 */
import type { Diagnostic } from '../capture.js';
import {
	createFlickermeterGroup,
	FLICKER_MIN_SAMPLE_RATE_HZ,
	type FlickermeterGroup,
	type FlickerResult,
} from '../flicker/index.js';
import {
	createHalfPeriodRms,
	createVoltageChangeTracker,
	type HalfPeriodRms,
	type VoltageChangeTracker,
} from '../flicker/index.js';
import type { TrendChannelSpec, TrendEvent } from './types.js';
import { maxOf } from '../signal/extremes.js';

/** One Pst or Plt row: a value per voltage channel (order of `TrendFlicker.channels`). */
export interface TrendFlickerRow {
	startS: number;
	durationS: number;
	values: number[];
	/** True when a dip, swell or interruption overlaps the interval. */
	flagged: boolean;
}

export interface TrendFlicker {
	/** The voltage channels measured, by name. */
	channels: string[];
	lamp: '230V' | '120V';
	/** Complete 10-minute intervals, on the clock's ticks when the start time is known, else from the first sample. */
	pst: TrendFlickerRow[];
	/** Complete 2-hour periods (12 consecutive Pst). */
	plt: TrendFlickerRow[];
	/** Highest Pinst per channel over the record (after the 5 s settling); NaN for an empty one. */
	pinstMax: number[];
	/** With the `flickerPinst` option: highest Pinst per second, per channel (`max[k][i]` for second `startS[i]`). */
	pinst?: { startS: number[]; max: number[][] };
	/**
	 * IEC 61000-3-3 voltage changes per channel, relative to the declared voltage: count, the largest dc
	 * and dmax (%), the longest time beyond 3.3 % (s); NaN figures when there were none. Absent when the
	 * declared voltage is unknown.
	 */
	changes?: { count: number; dcMaxPercent: number; dmaxPercent: number; tmaxS: number }[];
}

/** Half-period values kept while the declared voltage is still being inferred, s (beyond: changes are not evaluated). */
const DECLARED_WAIT_S = 10;

/** Longest stretch buffered while the nominal frequency is still being inferred, s. */
const INFERENCE_BUFFER_S = 2;

export class TrendFlickerTracker {
	private meters: FlickermeterGroup | null = null;
	private pending: Float64Array[][] = [];
	private pendingSamples = 0;
	private halves: HalfPeriodRms[] = [];
	private changeTrackers: VoltageChangeTracker[] | null = null;
	private uhpWaiting: { t: number; v: number }[][] | null = null;
	private declaredV = NaN;
	private changesAbandoned = false;

	constructor(
		private readonly sampleRateHz: number,
		private readonly channels: TrendChannelSpec[],
		private readonly voltage: number[],
		private readonly diagnostics: Diagnostic[],
		private readonly keepPinst = false,
		/** Seconds past a 10-minute clock tick at the first sample, when the recording's start time is known. */
		private readonly intervalOffsetS = 0,
	) {}

	/** True when this recording can be measured at all (a voltage channel and ≥ 1600 S/s); says why not otherwise. */
	static wanted(sampleRateHz: number, voltage: number[], diagnostics: Diagnostic[]): boolean {
		if (voltage.length === 0) return false;
		if (sampleRateHz < FLICKER_MIN_SAMPLE_RATE_HZ) {
			diagnostics.push({
				code: 'flicker-not-measured',
				severity: 'info',
				message: `Flicker not measured: it needs at least ${FLICKER_MIN_SAMPLE_RATE_HZ} samples per second (this recording has ${sampleRateHz}).`,
			});
			return false;
		}
		return true;
	}

	/**
	 * The chunk the analyser was given; `nominalHz` once known (chunks wait, copied, until then) and the
	 * declared voltage once known (half-period values wait until then, at most 10 s).
	 */
	push(chunk: Float64Array[], nominalHz: number | undefined, declaredV = NaN): void {
		this.declaredV = declaredV;
		let from = 0;
		if (!this.meters) {
			// At most INFERENCE_BUFFER_S wait, cut at that sample: the same however the samples are chunked.
			const room = Math.ceil(INFERENCE_BUFFER_S * this.sampleRateHz) - this.pendingSamples;
			const n = chunk[this.voltage[0]].length;
			if (nominalHz === undefined && room > 0) {
				from = Math.min(room, n);
				this.pending.push(this.voltage.map((c) => chunk[c].slice(0, from)));
				this.pendingSamples += from;
				if (from === n && from < room) return;
			}
			this.start(nominalHz === 60 ? 60 : 50);
		}
		this.feed(this.voltage.map((c) => (from === 0 ? chunk[c] : chunk[c].subarray(from))));
	}

	/** One chunk of the voltage channels (in `voltage` order): to the flickermeters and the half-period RMS. */
	private feed(x: Float64Array[]): void {
		this.meters!.push(x);
		for (let k = 0; k < x.length; k++) this.halves[k].push(x[k]);
	}

	private start(nominalHz: 50 | 60): void {
		this.meters = createFlickermeterGroup(this.voltage.length, {
			sampleRateHz: this.sampleRateHz,
			nominalHz,
			keepPinstBlocks: this.keepPinst,
			intervalOffsetS: this.intervalOffsetS,
		});
		this.uhpWaiting = this.voltage.map(() => []);
		this.halves = this.voltage.map((_, k) =>
			createHalfPeriodRms(this.sampleRateHz, nominalHz, (t, v) => this.halfPeriod(k, t, v, nominalHz)),
		);
		for (const p of this.pending) this.feed(p);
		this.pending = [];
	}

	/** One half-period RMS value: to the change tracker once the declared voltage is known. */
	private halfPeriod(k: number, t: number, v: number, nominalHz: 50 | 60): void {
		if (this.changesAbandoned) return;
		if (!this.startChanges(nominalHz)) {
			this.uhpWaiting![k].push({ t, v });
			if (this.uhpWaiting![k].length > 2 * nominalHz * DECLARED_WAIT_S) {
				this.changesAbandoned = true;
				this.uhpWaiting = null;
			}
			return;
		}
		this.changeTrackers![k].push(t, v);
	}

	/** Creates the change trackers once the declared voltage is known, replaying the values that waited. */
	private startChanges(nominalHz: 50 | 60): boolean {
		if (this.changeTrackers) return true;
		if (this.changesAbandoned || !(this.declaredV > 0)) return false;
		const un = this.declaredV;
		const trackers = this.voltage.map(() => createVoltageChangeTracker(un, nominalHz));
		this.uhpWaiting?.forEach((list, j) => list.forEach((p) => trackers[j].push(p.t, p.v)));
		this.uhpWaiting = null;
		this.changeTrackers = trackers;
		return true;
	}

	private changeSummary(): TrendFlicker['changes'] {
		if (!this.changeTrackers) return undefined;
		const worst = (v: number[]) => (v.filter(Number.isFinite).length ? maxOf(v.filter(Number.isFinite)) : NaN);
		return this.changeTrackers.map((tr) => {
			const list = tr.finish();
			return {
				count: list.length,
				dcMaxPercent: worst(list.map((c) => c.dcPercent)),
				dmaxPercent: worst(list.map((c) => c.dmaxPercent)),
				tmaxS: worst(list.map((c) => c.tmaxS)),
			};
		});
	}

	/** Ends the record; `events` give the flags. */
	finish(nominalHz: number, events: readonly TrendEvent[], declaredV = NaN): TrendFlicker {
		this.declaredV = declaredV;
		if (!this.meters) this.start(nominalHz === 60 ? 60 : 50);
		this.startChanges(nominalHz === 60 ? 60 : 50);
		const results = this.meters!.finish();
		const rows = (
			pick: (r: FlickerResult) => { startS: number; durationS: number; value: number }[],
		): TrendFlickerRow[] =>
			pick(results[0]).map((first, k) => ({
				startS: first.startS,
				durationS: first.durationS,
				values: results.map((r) => pick(r)[k].value),
				flagged: false,
			}));
		if (results.some((r) => r.nonFiniteSamples > 0)) {
			this.diagnostics.push({
				code: 'flicker-non-finite',
				severity: 'warning',
				message:
					'Flicker: missing or non-finite samples were bridged by repeating the previous value; the Pst around them is doubtful.',
			});
		}
		const out: TrendFlicker = {
			channels: this.voltage.map((c) => this.channels[c].name),
			lamp: results[0].lamp,
			pst: rows((r) => r.pst.map((p) => ({ startS: p.startS, durationS: p.durationS, value: p.pst }))),
			plt: rows((r) => r.plt.map((p) => ({ startS: p.startS, durationS: p.durationS, value: p.plt }))),
			pinstMax: results.map((r) => r.pinst.max),
			...(this.changeTrackers ? { changes: this.changeSummary() } : {}),
			...(this.keepPinst
				? { pinst: { startS: results[0].pinstBlocks?.startS ?? [], max: results.map((r) => r.pinstBlocks?.max ?? []) } }
				: {}),
		};
		flagFlicker(out, events);
		return out;
	}
}

/** Flags each Pst and Plt row of `f` that a dip, swell or interruption of `events` overlaps. */
export function flagFlicker(f: TrendFlicker, events: readonly TrendEvent[]): void {
	const flagging = events.filter((e) => e.kind !== 'rvc');
	for (const r of [...f.pst, ...f.plt])
		r.flagged = flagging.some((e) => e.startS < r.startS + r.durationS && e.startS + e.durationS > r.startS);
}
