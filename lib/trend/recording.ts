/**
 * One recording written as many files ("parts"): the parts are fed, in order, through ONE trend
 * analyser, so Urms(1/2), events in progress, the 10/12-cycle windows, the 150/180-cycle, 10-min and
 * 2-hour aggregation, flicker and the 10-s frequency values run on across a file boundary exactly as in
 * one file; the rows and events do not depend on where the files are cut.
 *
 * With `placement: 'clock'` each part is put at its stated start time (s since 1970):
 * - within CONTIGUOUS_TOLERANCE_S of where the samples before it end: it continues the recording;
 * - later: a gap. The analyser is finished there (windows, intervals and events in progress end at the
 *   gap as partial rows, `complete: false`, or events with `ended: false`) and a new one starts at the
 *   part's clock time, so no row, interval or event spans the gap; the gap is listed with its start and
 *   length (`gaps`) and as a warning;
 * - earlier: an overlap. Its first samples, those the recording already holds, are dropped (the earlier
 *   file's samples are kept) and the overlap is listed (`overlaps`) and warned about.
 * With `placement: 'sequence'` (files that state no start time) every part follows the one before.
 *
 * Every part must have the first part's sample rate and channels (name, quantity, unit, in order):
 * `beginPart` throws a RecordingMismatch otherwise, before anything of that part is used.
 * Times in the result are seconds from the first sample of the first part, gaps included.
 *
 * Ref: IEC 61000-4-30:2015, 4.4-4.7 (from memory): aggregation intervals are contiguous measurement time;
 * an interval with missing data is not a complete one.
 */
import type { Diagnostic } from '../capture.js';
import { createTrendAnalyser, type TrendAnalyser } from './analyser.js';
import { mergeSegments, type Segment } from './recording-merge.js';
import type { RecordingGap, RecordingOverlap, RecordingPart, RecordingResult } from './recording-types.js';
import type { TrendChannelSpec, TrendOptions } from './types.js';

/**
 * Two files are contiguous when the second starts this close to where the first one's samples end:
 * at least one sample period, and 1 ms, since loggers commonly stamp their files to the millisecond
 * (common practice). A larger difference is a gap or an overlap.
 */
export const CONTIGUOUS_TOLERANCE_S = 1e-3;

/** What a part (one file) says about itself before its first sample. */
export interface RecordingPartHeader {
	/** The file, as named in messages. */
	source: string;
	sampleRateHz: number;
	channels: TrendChannelSpec[];
	/** Clock time of the part's first sample, s since 1970, when the file states it. */
	clockStartS?: number;
	/** Nominal frequency the file states (used when the options give none). */
	nominalHz?: 50 | 60;
}

export interface RecordingOptions extends Omit<TrendOptions, 'sampleRateHz' | 'channels' | 'clockStartS'> {
	/** 'clock': parts placed at their stated start times; 'sequence': one after another, in the order begun. */
	placement: 'clock' | 'sequence';
	/** Clock time of the first sample when the first part states none (s since 1970). */
	clockStartS?: number;
}

/** A part whose sample rate or channels differ from the first part's. */
export class RecordingMismatch extends Error {
	override readonly name = 'RecordingMismatch';
	constructor(
		readonly what: 'sample-rate' | 'channels',
		readonly got: string,
		readonly expected: string,
	) {
		super(`expected ${expected}, got ${got}`);
	}
}

export interface RecordingAnalyser {
	/** The next part: checked against the first, placed; throws RecordingMismatch before anything changes. */
	beginPart(header: RecordingPartHeader): void;
	/** The part's next samples: one array per channel, all the same length. */
	push(chunk: Float64Array[]): void;
	/** Whether a part has been begun (a recording whose every file failed has none). */
	readonly started: boolean;
	/** Ends the recording; throws when no part was begun. */
	finish(): RecordingResult;
}

const channelText = (cs: readonly TrendChannelSpec[]) =>
	cs.map((c) => `${c.name} (${c.quantity}, ${c.unit})`).join(', ');

function checkPart(first: RecordingPartHeader, h: RecordingPartHeader): void {
	const rate = first.sampleRateHz;
	if (Math.abs(h.sampleRateHz - rate) > 1e-9 * rate)
		throw new RecordingMismatch(
			'sample-rate',
			`${h.sampleRateHz} Hz`,
			`the sample rate of ${first.source}, ${rate} Hz (one recording has one sample rate)`,
		);
	const same =
		h.channels.length === first.channels.length &&
		h.channels.every(
			(c, i) =>
				c.name === first.channels[i].name &&
				c.quantity === first.channels[i].quantity &&
				c.unit === first.channels[i].unit,
		);
	if (!same)
		throw new RecordingMismatch(
			'channels',
			`channels ${channelText(h.channels)}`,
			`the channels of ${first.source}: ${channelText(first.channels)} (one recording has one set of channels)`,
		);
}

type LiveSegment = Segment & { analyser: TrendAnalyser };

class Recording implements RecordingAnalyser {
	private readonly placement: 'clock' | 'sequence';
	private readonly givenClock: number | undefined;
	private readonly trendOpts: Omit<RecordingOptions, 'placement' | 'clockStartS'>;
	private first: RecordingPartHeader | undefined;
	private recClock: number | undefined;
	private readonly segments: Segment[] = [];
	private seg: LiveSegment | undefined;
	private dropLeft = 0;
	private part: RecordingPart | undefined;
	private overlap: RecordingOverlap | undefined;
	private readonly parts: RecordingPart[] = [];
	private readonly gaps: RecordingGap[] = [];
	private readonly overlaps: RecordingOverlap[] = [];
	private readonly notes: Diagnostic[] = [];

	constructor(opts: RecordingOptions) {
		const { placement, clockStartS, ...trendOpts } = opts;
		this.placement = placement;
		this.givenClock = clockStartS;
		this.trendOpts = trendOpts;
	}

	get started(): boolean {
		return this.first !== undefined;
	}

	/** A new analyser from `offsetS` (s from the recording's first sample), on the clock at `clockS`. */
	private startSegment(offsetS: number, clockS: number | undefined, h: RecordingPartHeader): void {
		const o = this.trendOpts;
		const before = this.segments[0]?.result;
		const knownV = before && before.declaredVSource !== 'none' ? before.declaredV : undefined;
		const onRow = o.onRow;
		const onHalf = o.onHalfCycle;
		const analyser = createTrendAnalyser({
			...o,
			sampleRateHz: h.sampleRateHz,
			channels: h.channels,
			clockStartS: clockS,
			declaredV: o.declaredV ?? knownV,
			nominalHz: o.nominalHz ?? (before?.nominalHz as 50 | 60 | undefined) ?? h.nominalHz,
			onRow: onRow && offsetS !== 0 ? (row) => onRow({ ...row, startS: row.startS + offsetS }) : onRow,
			onHalfCycle: onHalf && offsetS !== 0 ? (c, t, v) => onHalf(c, t + offsetS, v) : onHalf,
		});
		this.seg = { analyser, offsetS, samples: 0, result: undefined };
	}

	private closeSegment(): void {
		if (!this.seg) return;
		this.seg.result = this.seg.analyser.finish();
		this.segments.push(this.seg);
		this.seg = undefined;
	}

	/** Where the part goes relative to the samples before it: a gap (> 0), an overlap (< 0) or 0. */
	private placePart(h: RecordingPartHeader): number {
		if (this.placement !== 'clock' || this.recClock === undefined || h.clockStartS === undefined) {
			if (this.placement === 'clock')
				this.notes.push({
					code: 'recording-part-unplaced',
					severity: 'assumption',
					message: `${h.source} states no start time: it is taken to follow the file before it directly.`,
				});
			return 0;
		}
		const rate = this.first!.sampleRateHz;
		const expected = this.recClock + this.seg!.offsetS + this.seg!.samples / rate;
		const delta = h.clockStartS - expected;
		return Math.abs(delta) <= Math.max(CONTIGUOUS_TOLERANCE_S, 1 / rate) ? 0 : delta;
	}

	beginPart(h: RecordingPartHeader): void {
		if (!(h.sampleRateHz > 0) || !Number.isFinite(h.sampleRateHz))
			throw new RangeError(`sample rate must be a positive number, got ${h.sampleRateHz}`);
		if (this.first) checkPart(this.first, h);
		this.dropLeft = 0;
		this.overlap = undefined;
		if (!this.first) {
			this.first = h;
			this.recClock =
				this.placement === 'clock' ? (h.clockStartS ?? this.givenClock) : (this.givenClock ?? h.clockStartS);
			this.startSegment(0, this.recClock, h);
			this.part = { source: h.source, startS: 0, samples: 0 };
			this.parts.push(this.part);
			return;
		}
		const delta = this.placePart(h);
		const endS = this.seg!.offsetS + this.seg!.samples / h.sampleRateHz;
		this.part = { source: h.source, startS: endS + delta, samples: 0 };
		if (delta > 0) {
			this.gaps.push({
				startS: endS,
				durationS: delta,
				after: this.parts[this.parts.length - 1].source,
				before: h.source,
			});
			this.closeSegment();
			this.startSegment(endS + delta, h.clockStartS, h);
		} else if (delta < 0) {
			this.dropLeft = Math.round(-delta * h.sampleRateHz);
			this.overlap = { source: h.source, startS: endS + delta, durationS: -delta, droppedSamples: 0 };
			this.overlaps.push(this.overlap);
		}
		this.parts.push(this.part);
	}

	push(chunk: Float64Array[]): void {
		const seg = this.seg;
		if (!seg || !this.part) throw new Error('push before beginPart');
		const n = chunk[0]?.length ?? 0;
		this.part.samples += n;
		let from = 0;
		if (this.dropLeft > 0) {
			from = Math.min(n, this.dropLeft);
			this.dropLeft -= from;
			this.overlap!.droppedSamples += from;
		}
		if (from >= n) return;
		seg.analyser.push(from === 0 ? chunk : chunk.map((x) => x.subarray(from)));
		seg.samples += n - from;
	}

	finish(): RecordingResult {
		if (!this.first) throw new Error('no part of the recording was begun');
		this.closeSegment();
		return mergeSegments(this.segments, {
			parts: this.parts,
			gaps: this.gaps,
			overlaps: this.overlaps,
			notes: this.notes,
			clockStartS: this.recClock,
		});
	}
}

/**
 * Creates the analyser of a recording over many files.
 * @example
 * const r = createRecordingAnalyser({ placement: 'clock', declaredV: 230 });
 * r.beginPart({ source: 'h08.cfg', sampleRateHz: 6400, channels, clockStartS: 1777881600 }); r.push(samples08);
 * r.beginPart({ source: 'h09.cfg', sampleRateHz: 6400, channels, clockStartS: 1777885200 }); r.push(samples09);
 * const result = r.finish(); // one recording, 2 h; result.gaps: [] when h09 starts where h08 ends
 */
export function createRecordingAnalyser(opts: RecordingOptions): RecordingAnalyser {
	return new Recording(opts);
}
