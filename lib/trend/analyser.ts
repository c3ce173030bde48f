/**
 * The streaming trend analyser: one pass over a recording of any length in memory that does not grow
 * with it (besides the rows and events it keeps). Feed samples with `push`, in chunks of any size;
 * results do not depend on the chunk sizes.
 *
 * Per block of samples it copies each channel into a ring buffer (≥ 0.5 s) and tracks the zero crossings
 * of the voltage channels and of the timing reference (crossing-tracker.ts). The named parts:
 * - event pipeline (event-pipeline.ts): Urms(1/2) per voltage channel -> dips, swells, interruptions, RVC;
 * - window clock (window-clock.ts): 10/12-cycle windows of the reference's whole cycles (edges at
 *   interpolated zero crossings), restarted at each 10-min tick (on the clock when the start time is
 *   known, else counted from the recording start; the window holding the tick completes and overlaps);
 * - window meter (window-meter.ts): RMS, THD, harmonics and unbalance of each window;
 * - frequency aggregator (frequency-aggregator.ts): power frequency per 10 s;
 * - row emitter (row-emitter.ts): flags, 150/180-cycle and 10-min aggregates (row-group.ts), `onRow`.
 * Aggregates overlapping an event are flagged (docs/methods.md §3.5). One declared voltage serves every voltage
 * channel: give line-to-neutral channels of one system (a line-to-line channel would read as a swell).
 * Memory: rings (channels × 2^k ≥ 0.5 s + 4096 samples) plus the rows kept (`keep`) and the events.
 *
 * Ref: IEC 61000-4-30:2015, 4.4-4.7, 5.1, 5.4 (from memory); docs/methods.md §3.2-3.5.
 */
import type { Diagnostic } from '../capture.js';
import { CrossingTracker, type CrossingSink } from './crossing-tracker.js';
import { checkedThresholds, EventPipeline } from './event-pipeline.js';
import { FrequencyAggregator } from './frequency-aggregator.js';
import { trendLimitProblem, trendRingLength } from './limits.js';
import { RowEmitter } from './row-emitter.js';
import { flagFlicker, TrendFlickerTracker, type TrendFlicker } from './flicker-tracker.js';
import type { TrendChannelSpec, TrendEvent, TrendOptions, TrendResult } from './types.js';
import { recordingTicks, WindowClock } from './window-clock.js';
import { WINDOW_PAD, WindowMeter } from './window-meter.js';
import { TrendHelperLink } from './helper-link.js';
import type { PendingRow } from './row-emitter.js';

export { TREND_DEFAULT_THRESHOLDS } from './event-pipeline.js';

/** A streaming analyser made by `createTrendAnalyser`. */
export interface TrendAnalyser {
	/** Next samples: one array per channel, in the options' channel order, all the same length. */
	push(chunk: Float64Array[]): void;
	/** Ends the recording and returns everything found. The analyser cannot be used afterwards. */
	finish(): TrendResult;
	/** Samples per channel pushed so far. */
	readonly samplesPushed: number;
}

/** Samples per channel scanned between two rounds of window measuring and event detection. */
const BLOCK = 4096;

/**
 * Smallest ring when a helper thread shares the work (2^17 samples: 13 s at 10 kS/s), so it can fall
 * behind a little; not beyond HELPER_RING_BYTES for all channels (then the usual length).
 */
const HELPER_RING = 1 << 17;
const HELPER_RING_BYTES = 64 * 2 ** 20;

/**
 * A window must not start before the interpolation taps of the THD have samples: 8-point Lagrange reads
 * 3 samples before its point (window-thd.ts), kept clear with margin.
 */
const FIRST_WINDOW_SAMPLE = 8;

/**
 * How far event detection stays behind the newest sample, s: every voltage channel's Urms(1/2) values of
 * a moment must be in before any of them is fed (one cycle at 40 Hz is 25 ms; 0.1 s is ample), plus 2
 * samples for the crossing interpolation.
 */
const DETECTION_LAG_S = 0.1;

/** Seconds of the recording's start used to infer the declared voltage when none is given (the option's default). */
const INFERENCE_S = 1;

/** The options checked, with the derived channel lists. @throws RangeError for a bad option */
function checkedOptions(opts: TrendOptions) {
	const fs = opts.sampleRateHz;
	const channels: TrendChannelSpec[] = opts.channels.map((c) => ({ ...c }));
	const nCh = channels.length;
	// Before anything is sized from them: a rate of 1e-300 Hz would make the 10 s and 10 min intervals
	// zero samples long (their loops would never end), 1e5 channels would take gigabytes of ring buffers.
	const limit = trendLimitProblem(fs, nCh, BLOCK);
	if (limit) throw new RangeError(`expected ${limit.expected}, got ${limit.got}`);
	const thresholds = checkedThresholds(opts.thresholds);
	if (opts.nominalHz !== undefined && opts.nominalHz !== 50 && opts.nominalHz !== 60)
		throw new RangeError(`nominalHz must be 50 or 60, got ${opts.nominalHz}`);
	if (opts.declaredV !== undefined && !(opts.declaredV > 0))
		throw new RangeError(`declaredV must be above 0, got ${opts.declaredV}`);
	const voltage = channels.flatMap((c, i) => (c.quantity === 'voltage' ? [i] : []));
	const ref = opts.referenceChannel ?? voltage[0] ?? 0;
	if (!(ref >= 0 && ref < nCh && Number.isInteger(ref)))
		throw new RangeError(`referenceChannel ${ref} is not a channel index`);
	if (opts.clockStartS !== undefined && !Number.isFinite(opts.clockStartS))
		throw new RangeError(`clockStartS must be a finite number of seconds, got ${opts.clockStartS}`);
	/** Each channel's index among the voltage channels, −1 for the others. */
	const vIndex = new Int32Array(nCh).fill(-1);
	voltage.forEach((c, k) => (vIndex[c] = k));
	return { fs, channels, nCh, thresholds, voltage, vIndex, ref };
}

/**
 * Creates a streaming analyser of per-cycle trends and voltage events.
 *
 * @example
 * const a = createTrendAnalyser({ sampleRateHz: 10_000, channels: [{ name: 'L1', quantity: 'voltage', unit: 'V' }], declaredV: 230 });
 * a.push([samplesL1]); // any number of times
 * const r = a.finish(); // r.events: [{ kind: 'dip', startS: 0.19, durationS: 0.11, residualV: 115, ... }]
 */
export function createTrendAnalyser(opts: TrendOptions): TrendAnalyser {
	return new StreamingTrend(opts);
}

/** The analyser's parts wired together: blocks in, parts fed in order, the result at the end. */
class StreamingTrend implements TrendAnalyser {
	private readonly o: ReturnType<typeof checkedOptions>;
	private readonly diagnostics: Diagnostic[] = [];
	private readonly rings: Float64Array[];
	private readonly meter: WindowMeter;
	private readonly ticks: ReturnType<typeof recordingTicks>;
	private readonly clock: WindowClock;
	private readonly frequency: FrequencyAggregator;
	private readonly rows: RowEmitter;
	private readonly flicker: TrendFlickerTracker | null;
	private readonly events: EventPipeline;
	private readonly trackers: CrossingTracker[] = [];
	/** The helper thread's session, when one was given and free. */
	private readonly link: TrendHelperLink | undefined;
	private readonly wantFlicker: boolean;
	/** The views of one block handed to the flickermeters (reused). */
	private readonly flickerPart: Float64Array[] = [];
	/** Per pending row measured `later`: the helper's ticket. */
	private readonly tickets = new Map<PendingRow, number>();
	/** Samples the event detection stays behind the newest sample. */
	private readonly lag: number;
	private abs = 0;
	private finished = false;

	constructor(private readonly opts: TrendOptions) {
		const o = (this.o = checkedOptions(opts));
		const { fs, voltage, vIndex, ref } = o;
		const diagnostics = this.diagnostics;
		const ticks = (this.ticks = recordingTicks(fs, opts.clockStartS));
		// asked here (the helper needs to know); its note, if any, goes out in its place below
		const flickerNotes: Diagnostic[] = [];
		this.wantFlicker = opts.flicker !== false && TrendFlickerTracker.wanted(fs, voltage, flickerNotes);
		this.link = this.openLink(this.wantFlicker, ticks.tenMinutes.offset / fs);
		const rings = (this.rings = this.link?.rings ?? o.channels.map(() => new Float64Array(trendRingLength(fs, BLOCK))));
		this.meter = new WindowMeter({
			sampleRateHz: fs,
			rings,
			voltage,
			thd: opts.thd,
			thdMethod: opts.thdMethod,
			harmonics: opts.harmonics,
		});
		const clock = (this.clock = new WindowClock(fs, opts.nominalHz, ticks.tenMinutes, diagnostics));
		const frequency = (this.frequency = new FrequencyAggregator(fs, ticks.frequency));
		this.rows = new RowEmitter(o.nCh, opts.keep, opts.onRow, (s) => clock.tickOf(s), ticks.tenMinutes.offset === 0);
		diagnostics.push(...flickerNotes);
		this.flicker =
			this.wantFlicker && !this.link
				? new TrendFlickerTracker(
						fs,
						o.channels,
						voltage,
						diagnostics,
						opts.flickerPinst === true,
						ticks.tenMinutes.offset / fs,
					)
				: null;
		const events = (this.events = new EventPipeline({
			voltageCount: voltage.length,
			declaredV: opts.declaredV,
			thresholds: o.thresholds,
			rvc: opts.rvc,
			inferenceEnd: Math.round((opts.inferenceS ?? INFERENCE_S) * fs),
			diagnostics,
		}));
		this.lag = Math.ceil(DETECTION_LAG_S * fs) + 2;
		const onHalfCycle = opts.onHalfCycle;
		const sink: CrossingSink = {
			halfCycle(ch, start, _endT, rms) {
				events.halfCycle(vIndex[ch], start, rms);
				onHalfCycle?.(ch, start / fs, rms);
			},
			rising(ch, index, t, forced) {
				if (ch !== ref || t < FIRST_WINDOW_SAMPLE) return;
				// frequency first: cycles straddling a 10 s boundary are discarded
				frequency.rising(t, forced);
				clock.rising(index, t, forced);
			},
		};
		for (let c = 0; c < o.nCh; c++) {
			if (c === ref || vIndex[c] >= 0)
				this.trackers.push(new CrossingTracker(c, rings[c], fs, opts.nominalHz, sink, vIndex[c] >= 0));
		}
	}

	get samplesPushed(): number {
		return this.abs;
	}

	push(chunk: Float64Array[]): void {
		if (this.finished) throw new Error('push after finish');
		const nCh = this.o.nCh;
		if (chunk.length !== nCh) throw new RangeError(`push expects ${nCh} channel arrays, got ${chunk.length}`);
		const n = chunk[0].length;
		for (const x of chunk) if (x.length !== n) throw new RangeError('push expects channel arrays of equal length');
		const rings = this.rings;
		const ringLen = rings[0].length;
		for (let off = 0; off < n; off += BLOCK) {
			const m = Math.min(BLOCK, n - off);
			const pos = this.abs & (ringLen - 1);
			this.link?.beforeWrite(this.abs + m - ringLen);
			for (let c = 0; c < nCh; c++) {
				const first = Math.min(m, ringLen - pos);
				rings[c].set(chunk[c].subarray(off, off + first), pos);
				if (first < m) rings[c].set(chunk[c].subarray(off + first, off + m), 0);
			}
			for (const t of this.trackers) t.scan(chunk[t.channel], off, off + m, this.abs);
			this.abs += m;
			this.afterBlock(false);
			this.flickerBlock(chunk, off, m);
		}
	}

	/** The block just pushed (chunk[c][off, off + m)) to the flickermeters, here or on the helper. */
	private flickerBlock(chunk: Float64Array[], off: number, m: number): void {
		const { nominalHz } = this.clock;
		const { declaredV } = this.events;
		if (this.link && this.wantFlicker) this.link.flicker(this.abs - m, m, nominalHz, declaredV);
		if (!this.flicker) return;
		const part = this.flickerPart;
		for (let c = 0; c < chunk.length; c++) part[c] = chunk[c].subarray(off, off + m);
		this.flicker.push(part, nominalHz, declaredV);
	}

	/** Measures the windows whose samples (and the pad after them) are in, then detects and releases rows. */
	private afterBlock(final: boolean): void {
		const { clock, rows, events, frequency, abs } = this;
		const windows = clock.windows;
		while (windows.length > 0 && (final || windows[0].end + WINDOW_PAD <= abs)) {
			const w = windows.shift()!;
			const cycles = clock.cyclesPerWindow;
			const later = this.link !== undefined && this.meter.sharesWindows && this.link.takesWindow;
			const p: PendingRow = { start: w.start, end: w.end, row: this.meter.measure(w, cycles, abs, later) };
			if (later) this.tickets.set(p, this.link!.window(w.startT, w.endT, cycles));
			rows.pending.push(p);
		}
		const pos = final ? Infinity : abs - this.lag;
		if (!events.advance(pos, final, clock.nominalHz)) return;
		if (this.tickets.size > 0) this.completeRows(pos, final);
		rows.release(
			pos,
			frequency.pending,
			(s, e) => events.overlaps(s, e),
			this.tickets.size > 0 ? this.tickets : undefined,
		);
		// A window not yet measured can start up to a ring length back (an overlapping restart at a tick).
		const ringLen = this.rings[0].length;
		events.forgetBefore(
			Math.min(rows.oldestPending, frequency.pending[0]?.start ?? Infinity, frequency.openStart, abs - ringLen),
		);
	}

	/**
	 * Adds the helper's harmonic figures to the rows ready to go out (up to `pos`), in order, while they
	 * are done; waits for them at the end or when the helper holds its most windows.
	 */
	private completeRows(pos: number, final: boolean): void {
		const link = this.link!;
		for (const p of this.rows.pending) {
			if (p.end > pos) return;
			const ticket = this.tickets.get(p);
			if (ticket === undefined) continue;
			if (!final && !link.ready(ticket)) return;
			this.meter.complete(p.row, link.take(ticket));
			this.tickets.delete(p);
		}
	}

	/** A helper session for the flickermeters and harmonic windows, when a helper was given and is free. */
	private openLink(wantFlicker: boolean, intervalOffsetS: number): TrendHelperLink | undefined {
		const { opts, o } = this;
		const fs = o.fs;
		const fastThd = opts.thd !== false && (opts.thdMethod ?? 'lagrange') === 'lagrange';
		return TrendHelperLink.open(opts.helper, {
			ringLength: Math.max(trendRingLength(fs, BLOCK), o.nCh * HELPER_RING * 8 <= HELPER_RING_BYTES ? HELPER_RING : 0),
			channelCount: o.nCh,
			sampleRateHz: fs,
			thd: fastThd ? { harmonics: opts.harmonics === true } : null,
			flicker: wantFlicker
				? { channels: o.channels, voltage: o.voltage, keepPinst: opts.flickerPinst === true, intervalOffsetS }
				: null,
		});
	}

	/** Ends the helper's session: its notes, and its flicker result flagged by `events`. */
	private endLink(nominalHz: number, events: TrendEvent[]): TrendFlicker | undefined {
		const r = this.link!.end(nominalHz, this.events.declaredV);
		this.diagnostics.push(...r.diagnostics);
		if (r.flicker) flagFlicker(r.flicker, events);
		return r.flicker;
	}

	finish(): TrendResult {
		if (this.finished) throw new Error('finish called twice');
		this.finished = true;
		const { clock, o, opts, abs, events } = this;
		const nominalHz = clock.finishNominal();
		this.frequency.finish(abs);
		if (clock.cyclesOpen > 0)
			this.diagnostics.push({
				code: 'last-window-partial',
				severity: 'info',
				message: `The last ${clock.cyclesOpen} cycle(s) do not fill a ${clock.cyclesPerWindow}-cycle window and are left out of the aggregates.`,
			});
		this.afterBlock(true);
		this.rows.finish();
		this.diagnostics.push(...this.endNotes());
		const voltageNames = o.voltage.map((c) => o.channels[c].name);
		const found = events.events(abs, o.fs, voltageNames);
		const flickerResult = this.link
			? this.endLink(nominalHz, found)
			: this.flicker?.finish(nominalHz, found, events.declaredV);
		return {
			sampleRateHz: o.fs,
			nominalHz,
			declaredV: events.declaredV,
			declaredVSource: !events.detectEvents ? 'none' : opts.declaredV !== undefined ? 'given' : 'inferred',
			thresholds: o.thresholds,
			channels: o.channels,
			referenceChannel: o.channels[o.ref].name,
			durationS: abs / o.fs,
			clockStartS: opts.clockStartS,
			...this.rows.out,
			events: found,
			diagnostics: this.diagnostics,
			...(flickerResult ? { flicker: flickerResult } : {}),
		};
	}

	/** What the end of the recording says: lost crossings, bad samples, no crossing, clock, THD. */
	private endNotes(): Diagnostic[] {
		const { channels, ref } = this.o;
		const meter = this.meter;
		const notes: Diagnostic[] = [];
		for (const t of this.trackers) {
			if (t.forcedCount > 0) {
				notes.push({
					code: 'zero-crossings-lost',
					severity: 'info',
					message: `${channels[t.channel].name}: no zero crossing for ${t.forcedCount} half cycle(s) (interruption or very low signal); timing free-ran at the last measured period there.`,
				});
			}
		}
		if (meter.nonFiniteWindows > 0) {
			const first = meter.firstNonFinite;
			notes.push({
				code: 'non-finite-samples',
				severity: 'warning',
				message: `${meter.nonFiniteWindows} channel window(s) of 10/12 cycles hold missing or non-finite samples, or samples too large to square (beyond about 1e154), the first on ${channels[first.channel].name} at ${first.startS.toFixed(4)} s: their values are left empty, and no event can be detected from them.`,
			});
		}
		if (!this.clock.anyBoundary)
			notes.push({
				code: 'no-zero-crossings',
				severity: 'warning',
				message: `${channels[ref].name}: no zero crossing found; no aggregate could be formed.`,
			});
		notes.push(...clockNotes(this.opts.clockStartS !== undefined, this.abs >= this.ticks.tenMinutes.length));
		if (!meter.wantThd)
			notes.push({
				code: 'thd-not-computed',
				severity: 'info',
				message: 'THD was not computed for this run (no harmonic analysis attached).',
			});
		return notes;
	}
}

/** How the 10-minute intervals were placed: on the clock, or from the start once a tick was passed. */
function clockNotes(onClock: boolean, pastFirstTick: boolean): Diagnostic[] {
	if (onClock)
		return [
			{
				code: 'clock-aligned',
				severity: 'info',
				message:
					"10-min intervals and 10-s frequency values follow the clock from the recording's start time; the first and last may be partial.",
			},
		];
	if (pastFirstTick)
		return [
			{
				code: 'ten-minute-from-start',
				severity: 'info',
				message: '10-min intervals count from the start of the recording (no start time on the clock given).',
			},
		];
	return [];
}
