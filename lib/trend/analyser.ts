/**
 * The streaming trend analyser: one pass over a recording of any length in memory that does not grow
 * with it (besides the rows and events it keeps). Feed samples with `push`, in chunks of any size;
 * results do not depend on the chunk sizes.
 *
 * Per sample it keeps a ring buffer per channel (≥ 0.5 s) and tracks zero crossings of the voltage
 * channels and of the timing reference (crossing-tracker.ts). From these it produces:
 * - Urms(1/2) per voltage channel -> dips, swells, interruptions (event-detector.ts);
 * - 10/12-cycle windows of the reference's whole cycles (edges at interpolated zero crossings) -> RMS,
 *   THD (window-thd.ts) and optionally each harmonic order of every channel, gapless; 150/180-cycle and
 *   10-min aggregates (row-group.ts). Without a wall clock the
 *   10-min ticks count from the recording start; at each tick the 10/12-cycle series restarts at the
 *   first cycle after the tick (the window holding the tick completes and overlaps), and the 150/180-cycle
 *   group is cut there;
 * - power frequency per 10 s: whole measured cycles inside the interval / their duration.
 * Aggregates overlapping an event are flagged (docs/methods.md §3.5). One declared voltage serves every voltage
 * channel: give line-to-neutral channels of one system (a line-to-line channel would read as a swell).
 * Memory: rings (channels × 2^k ≥ 0.5 s + 4096 samples) plus the rows kept (`keep`) and the events.
 *
 * Ref: IEC 61000-4-30:2015, 4.4-4.7, 5.1, 5.4 (from memory); docs/methods.md §3.2-3.5.
 */
import { basicWindowCycles, MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import type { Diagnostic } from '../capture.js';
import { harmonicWindow } from '../spectrum/harmonics.js';
import { CrossingTracker, type CrossingSink } from './crossing-tracker.js';
import { declaredVoltageFromRms } from './declared-voltage.js';
import { EventDetector } from './event-detector.js';
import { trendLimitProblem, trendRingLength } from './limits.js';
import { FREQUENCY_INTERVAL_S as FREQ_S, TEN_MIN_S, secondsPastTick } from './clock.js';
import { RowGroup } from './row-group.js';
import { windowUnbalancePercent } from './window-unbalance.js';
import { RvcDetector } from './rvc-detector.js';
import { TREND_MAX_ORDER, WindowThd } from './window-thd.js';
import type { TrendEvent, TrendFrequencyRow, TrendOptions, TrendResult, TrendRow, TrendThresholds } from './types.js';
import { TrendFlickerTracker } from './flicker-tracker.js';

/** A streaming analyser made by `createTrendAnalyser`. */
export interface TrendAnalyser {
	/** Next samples: one array per channel, in the options' channel order, all the same length. */
	push(chunk: Float64Array[]): void;
	/** Ends the recording and returns everything found. The analyser cannot be used afterwards. */
	finish(): TrendResult;
	/** Samples per channel pushed so far. */
	readonly samplesPushed: number;
}

/** Default thresholds, % of Udin. Ref: docs/methods.md §3.4 typical settings. */
export const TREND_DEFAULT_THRESHOLDS: Readonly<TrendThresholds> = {
	dipPercent: 90,
	swellPercent: 110,
	interruptionPercent: 5,
	hysteresisPercent: 2,
};

const BLOCK = 4096;
const LOG = 64;

interface HalfRecord {
	start: number;
	ch: number;
	rms: number;
}

interface PendingRow {
	start: number;
	end: number;
	row: TrendRow;
}

interface PendingFreq {
	start: number;
	end: number;
	row: TrendFrequencyRow;
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
	const fs = opts.sampleRateHz;
	const channels = opts.channels.map((c) => ({ ...c }));
	const nCh = channels.length;
	// Before anything is sized from them: a rate of 1e-300 Hz would make the 10 s and 10 min intervals
	// zero samples long (their loops would never end), 1e5 channels would take gigabytes of ring buffers.
	const limit = trendLimitProblem(fs, nCh, BLOCK);
	if (limit) throw new RangeError(`expected ${limit.expected}, got ${limit.got}`);
	const th: TrendThresholds = { ...TREND_DEFAULT_THRESHOLDS, ...opts.thresholds };
	for (const [k, v] of Object.entries(th))
		if (!(v >= 0) || !Number.isFinite(v)) throw new RangeError(`threshold ${k} must be a number >= 0, got ${v}`);
	if (!(th.interruptionPercent < th.dipPercent && th.dipPercent < 100 && th.swellPercent > 100)) {
		throw new RangeError('thresholds must satisfy interruption < dip < 100 < swell (% of declared voltage)');
	}
	if (opts.nominalHz !== undefined && opts.nominalHz !== 50 && opts.nominalHz !== 60)
		throw new RangeError(`nominalHz must be 50 or 60, got ${opts.nominalHz}`);
	if (opts.declaredV !== undefined && !(opts.declaredV > 0))
		throw new RangeError(`declaredV must be above 0, got ${opts.declaredV}`);
	const voltage = channels.flatMap((c, i) => (c.quantity === 'voltage' ? [i] : []));
	const ref = opts.referenceChannel ?? voltage[0] ?? 0;
	if (!(ref >= 0 && ref < nCh && Number.isInteger(ref)))
		throw new RangeError(`referenceChannel ${ref} is not a channel index`);
	const keep = { cycles10: true, cycles150: true, min10: true, ...opts.keep };
	const diagnostics: Diagnostic[] = [];

	const ringLen = trendRingLength(fs, BLOCK);
	const mask = ringLen - 1;
	const rings = channels.map(() => new Float64Array(ringLen));
	const wantThd = opts.thd ?? true;
	const thdMethod = opts.thdMethod ?? 'lagrange';
	if (thdMethod !== 'lagrange' && thdMethod !== 'sinc')
		throw new RangeError(`thdMethod must be 'lagrange' or 'sinc', got ${thdMethod}`);
	const scratch = wantThd && thdMethod === 'sinc' ? new Float64Array(ringLen) : undefined;
	const wantHarmonics = wantThd && thdMethod === 'lagrange' && opts.harmonics === true;
	const harmScratch = wantHarmonics ? new Float64Array(TREND_MAX_ORDER + 1) : undefined;
	// Unbalance per window from the fundamentals of exactly three voltage channels (IEC 61000-4-30:2015,
	// 5.7.2; from memory): u2 = |U2| / |U1| in the channels' order, the smaller over the larger sequence.
	const wantUnbalance = wantThd && thdMethod === 'lagrange' && voltage.length === 3;
	const phasors = wantUnbalance ? new Float64Array(6) : undefined;
	let fastThd: WindowThd | undefined;
	let fastThdCycles = 0;
	let nonFiniteWindows = 0;
	let firstNonFinite = { channel: 0, startS: 0 };
	/** Samples beyond each end of a window kept for the DFT's resampling kernel. */
	const PAD = 16;
	const windowsToClose: { start: number; end: number; startT: number; endT: number }[] = [];
	const holdback = Math.ceil(0.1 * fs) + 2;
	const tickLen = Math.round(TEN_MIN_S * fs);
	const freqLen = Math.round(FREQ_S * fs);
	// Clock alignment (IEC 61000-4-30:2015, 4.5.3 and 5.1.2; from memory): with the clock time of the first
	// sample, 10-min intervals and 10-s frequency values start at the clock's ticks. Sample positions stay
	// relative to the first sample; `tickOffset` is how far past a 10-min tick sample 0 lies.
	const clockStartS = opts.clockStartS;
	if (clockStartS !== undefined && !Number.isFinite(clockStartS))
		throw new RangeError(`clockStartS must be a finite number of seconds, got ${clockStartS}`);
	const tickOffset = clockStartS === undefined ? 0 : Math.round(secondsPastTick(clockStartS, TEN_MIN_S) * fs) % tickLen;
	const freqOffset = clockStartS === undefined ? 0 : Math.round(secondsPastTick(clockStartS, FREQ_S) * fs) % freqLen;

	let nominalHz: number | undefined = opts.nominalHz;
	const flicker =
		opts.flicker !== false && TrendFlickerTracker.wanted(fs, voltage, diagnostics)
			? new TrendFlickerTracker(fs, channels, voltage, diagnostics, opts.flickerPinst === true, tickOffset / fs)
			: null;
	let declaredV = opts.declaredV ?? NaN;
	let detector: EventDetector | undefined;
	let rvc: RvcDetector | undefined;
	if (opts.rvc) {
		const t = opts.rvc.thresholdPercent;
		const hy = opts.rvc.hysteresisPercent ?? t / 2;
		if (!(t > 0 && hy >= 0 && hy < t))
			throw new RangeError(
				`rvc needs thresholdPercent > 0 and 0 <= hysteresisPercent < thresholdPercent, got ${t} and ${hy}`,
			);
	}
	let detectEvents = voltage.length > 0;
	const inferenceEnd = Math.round((opts.inferenceS ?? 1) * fs);
	let abs = 0;
	let finished = false;

	// --- Urms(1/2) records, merged across channels in (window start, channel) order before detection
	let records: HalfRecord[] = [];
	const vIndex = new Int32Array(nCh).fill(-1);
	voltage.forEach((c, k) => (vIndex[c] = k));

	// --- timing reference: log of rising boundaries
	const logIdx = new Float64Array(LOG);
	const logT = new Float64Array(LOG);
	let seq = -1;
	let ws = 0;
	let nextTick = tickLen - tickOffset;
	const nomTimes: number[] = [];
	let cyclesPerWindow = basicWindowCycles(nominalHz);

	// --- frequency per 10 s
	let fStart = 0;
	/** Next 10-s boundary (samples), and whether the value being counted began on one. */
	let fNext = freqLen - freqOffset;
	let fAligned = freqOffset === 0;
	/** Whether the 10-min group being filled began at a tick (the first one does only when the recording does). */
	let groupAligned = tickOffset === 0;
	let fCount = 0;
	let fDur = 0;
	let fLastT = NaN;

	const pendingRows: PendingRow[] = [];
	const pendingFreq: PendingFreq[] = [];
	const out = {
		cycles10: [] as TrendRow[],
		cycles150: [] as TrendRow[],
		min10: [] as TrendRow[],
		frequency: [] as TrendFrequencyRow[],
	};
	const g150 = new RowGroup('150/180-cycle', nCh);
	const g10m = new RowGroup('10-min', nCh);
	let tickOfGroups = 0;
	let firstRelevantEvent = 0;

	/** Window of whole cycles: samples [start, end), crossing times startT..endT (samples, interpolated). */
	function closeWindow(start: number, end: number, startT: number, endT: number): void {
		const lengthT = endT - startT;
		const rms: number[] = new Array(nCh);
		const thd: number[] = new Array(nCh);
		const harm: number[][] | undefined = wantHarmonics ? [] : undefined;
		for (let c = 0; c < nCh; c++) {
			const ring = rings[c];
			// Sample j stands for [j − ½, j + ½); the two edge samples count by the part inside the window,
			// so the window is exactly startT..endT on every channel, not only on the reference (whose edge
			// samples are near zero anyway).
			const ja = Math.round(startT);
			const jb = Math.round(endT);
			const va = ring[ja & mask];
			const vb = ring[jb & mask];
			let s = (ja + 0.5 - startT) * va * va + (endT - jb + 0.5) * vb * vb;
			for (let j = ja + 1; j < jb; j++) {
				const v = ring[j & mask];
				s += v * v;
			}
			rms[c] = Math.sqrt(s / lengthT);
			if (!Number.isFinite(rms[c]) && nonFiniteWindows++ === 0) firstNonFinite = { channel: c, startS: startT / fs };
			if (thdMethod === 'sinc' && scratch) {
				const s0 = Math.max(0, abs - ringLen + 1, Math.floor(startT) - PAD);
				const e0 = Math.min(abs, Math.ceil(endT) + PAD);
				const w = scratch.subarray(0, e0 - s0);
				for (let j = s0; j < e0; j++) w[j - s0] = ring[j & mask];
				const f1 = (cyclesPerWindow * fs) / lengthT;
				thd[c] =
					f1 < fs / 2
						? harmonicWindow(w, fs, {
								fundamentalHz: f1,
								startIndex: startT - s0,
								cycles: cyclesPerWindow,
								maxOrder: MAX_HARMONIC_ORDER,
							}).thd.thdS50Percent
						: NaN;
			} else if (wantThd) {
				if (!fastThd || fastThdCycles !== cyclesPerWindow) {
					fastThd = new WindowThd(cyclesPerWindow);
					fastThdCycles = cyclesPerWindow;
				}
				const k = phasors ? voltage.indexOf(c) : -1;
				thd[c] = fastThd.thdPercent(
					ring,
					mask,
					startT,
					endT,
					fs,
					harmScratch,
					k >= 0 ? phasors!.subarray(2 * k, 2 * k + 2) : undefined,
				);
				if (harm) harm.push(Array.from(harmScratch!));
			} else thd[c] = NaN;
		}
		pendingRows.push({
			start,
			end,
			row: {
				interval: '10/12-cycle',
				startS: startT / fs,
				durationS: lengthT / fs,
				cycles: cyclesPerWindow,
				frequencyHz: (cyclesPerWindow * fs) / lengthT,
				complete: true,
				flagged: false,
				rms,
				thdPercent: thd,
			},
		});
		if (harm) pendingRows[pendingRows.length - 1].row.harmonicsPercent = harm;
		if (phasors) pendingRows[pendingRows.length - 1].row.unbalancePercent = windowUnbalancePercent(phasors);
	}

	function closeFrequency(end: number, complete: boolean): void {
		pendingFreq.push({
			start: fStart,
			end,
			row: {
				startS: fStart / fs,
				durationS: (end - fStart) / fs,
				frequencyHz: fCount > 0 ? (fCount * fs) / fDur : NaN,
				cycles: fCount,
				complete,
				flagged: false,
			},
		});
		fStart = end;
		fCount = 0;
		fDur = 0;
		fLastT = NaN;
	}

	function nextFrequency(): void {
		closeFrequency(fNext, fAligned);
		fAligned = true;
		fNext += freqLen;
	}

	function onRising(index: number, t: number, forced: boolean): void {
		// A window must not start before the interpolation taps of the THD have samples (t ≥ 8).
		if (t < 8) return;
		// frequency: cycles straddling a 10 s boundary are discarded
		while (t >= fNext) nextFrequency();
		if (!forced && !Number.isNaN(fLastT)) {
			fCount++;
			fDur += t - fLastT;
		}
		fLastT = forced ? NaN : t;

		seq++;
		logIdx[seq % LOG] = index;
		logT[seq % LOG] = t;
		if (nominalHz === undefined) {
			if (forced) nomTimes.length = 0;
			else nomTimes.push(t);
			if (nomTimes.length < 5) return;
			const f = (4 * fs) / (nomTimes[4] - nomTimes[0]);
			nominalHz = Math.abs(f - 50) <= Math.abs(f - 60) ? 50 : 60;
			cyclesPerWindow = basicWindowCycles(nominalHz);
			diagnostics.push({
				code: 'nominal-frequency-inferred',
				severity: 'assumption',
				message: `Nominal frequency taken as ${nominalHz} Hz from the first cycles (${f.toFixed(2)} Hz measured); 10/12-cycle windows use ${cyclesPerWindow} cycles.`,
			});
			ws = Math.max(0, seq - LOG + 1);
		}
		if (seq - ws < cyclesPerWindow) return;
		const start = logIdx[ws % LOG];
		// Closed after the block, once the samples just past its end (for the DFT) are in every ring.
		windowsToClose.push({ start, end: index, startT: logT[ws % LOG], endT: t });
		ws = seq;
		while (nextTick <= start) nextTick += tickLen;
		if (start < nextTick && nextTick <= index) {
			// 10-min tick inside this window: restart the series at the first cycle at or after the tick
			let k = seq;
			while (k - 1 > seq - LOG && k - 1 >= 0 && logIdx[(k - 1) % LOG] >= nextTick) k--;
			ws = k;
			nextTick += tickLen;
		}
	}

	const sink: CrossingSink = {
		halfCycle(ch, start, _endT, rms) {
			records.push({ start, ch: vIndex[ch], rms });
			opts.onHalfCycle?.(ch, start / fs, rms);
		},
		rising(ch, index, t, forced) {
			if (ch === ref) onRising(index, t, forced);
		},
	};
	const trackers: CrossingTracker[] = [];
	for (let c = 0; c < nCh; c++) {
		if (c === ref || vIndex[c] >= 0)
			trackers.push(new CrossingTracker(c, rings[c], fs, nominalHz, sink, vIndex[c] >= 0));
	}

	function makeDetector(): void {
		if (voltage.length === 0) {
			diagnostics.push({
				code: 'no-voltage-channel',
				severity: 'info',
				message: 'No voltage channel: no dip, swell or interruption detection, aggregates only.',
			});
			detector = new EventDetector(0, {
				dipV: 0,
				dipEndV: 0,
				swellV: 0,
				swellEndV: 0,
				interruptionV: 0,
				interruptionEndV: 0,
			});
			return;
		}
		if (Number.isNaN(declaredV)) {
			const early = records.filter((r) => r.start < inferenceEnd).map((r) => r.rms);
			const d = declaredVoltageFromRms(early);
			declaredV = d.declaredV;
			diagnostics.push(d.diagnostic);
		}
		if (Number.isNaN(declaredV)) {
			detectEvents = false;
			diagnostics.push({
				code: 'events-not-detected',
				severity: 'warning',
				message:
					'No declared voltage: dips, swells and interruptions were not looked for. Give the declared voltage to detect them.',
			});
			detector = new EventDetector(0, {
				dipV: 0,
				dipEndV: 0,
				swellV: 0,
				swellEndV: 0,
				interruptionV: 0,
				interruptionEndV: 0,
			});
			return;
		}
		const u = declaredV / 100;
		if (opts.rvc) {
			const t = opts.rvc.thresholdPercent;
			const hy = opts.rvc.hysteresisPercent ?? t / 2;
			rvc = new RvcDetector(
				voltage.length,
				(nominalHz ?? 50) === 60 ? 120 : 100,
				t * u,
				(t - hy) * u,
				th.dipPercent * u,
				th.swellPercent * u,
			);
		}
		detector = new EventDetector(voltage.length, {
			dipV: th.dipPercent * u,
			dipEndV: (th.dipPercent + th.hysteresisPercent) * u,
			swellV: th.swellPercent * u,
			swellEndV: (th.swellPercent - th.hysteresisPercent) * u,
			interruptionV: th.interruptionPercent * u,
			interruptionEndV: (th.interruptionPercent + th.hysteresisPercent) * u,
		});
	}

	function overlapsEvent(start: number, end: number): boolean {
		if (!detector) return false;
		const ev = detector.events;
		for (let k = firstRelevantEvent; k < ev.length; k++) {
			const e = ev[k];
			if (e.start < end && (Number.isNaN(e.end) || e.end > start)) return true;
		}
		return false;
	}

	function emitGroupRows(complete150: boolean, complete10m: boolean): void {
		const a = g150.take(complete150);
		if (a) {
			opts.onRow?.(a);
			if (keep.cycles150) out.cycles150.push(a);
		}
		const b = g10m.take(complete10m);
		if (b) {
			opts.onRow?.(b);
			if (keep.min10) out.min10.push(b);
		}
	}

	/** Moves rows and frequency values whose end the event detector has passed to the output. */
	function finalize(pos: number): void {
		while (pendingRows.length > 0 && pendingRows[0].end <= pos) {
			const p = pendingRows.shift()!;
			p.row.flagged = overlapsEvent(p.start, p.end);
			const tick = Math.floor((p.start + tickOffset) / tickLen);
			if (tick !== tickOfGroups) {
				emitGroupRows(g150.size === 15, groupAligned);
				groupAligned = true;
				tickOfGroups = tick;
			}
			opts.onRow?.(p.row);
			if (keep.cycles10) out.cycles10.push(p.row);
			g150.add(p.row);
			g10m.add(p.row);
			if (g150.size === 15) {
				const a = g150.take(true)!;
				opts.onRow?.(a);
				if (keep.cycles150) out.cycles150.push(a);
			}
		}
		while (pendingFreq.length > 0 && pendingFreq[0].end <= pos) {
			const p = pendingFreq.shift()!;
			p.row.flagged = overlapsEvent(p.start, p.end);
			out.frequency.push(p.row);
		}
		// Events that ended before everything still pending can no longer flag anything.
		if (detector) {
			// A window not yet closed can start up to a ring length back (an overlapping restart at a tick).
			const oldest = Math.min(
				pendingRows[0]?.start ?? Infinity,
				pendingFreq[0]?.start ?? Infinity,
				fStart,
				abs - ringLen,
			);
			const ev = detector.events;
			while (
				firstRelevantEvent < ev.length &&
				!Number.isNaN(ev[firstRelevantEvent].end) &&
				ev[firstRelevantEvent].end <= oldest
			)
				firstRelevantEvent++;
		}
	}

	function afterBlock(final: boolean): void {
		while (windowsToClose.length > 0 && (final || windowsToClose[0].end + PAD <= abs)) {
			const w = windowsToClose.shift()!;
			closeWindow(w.start, w.end, w.startT, w.endT);
		}
		const pos = final ? Infinity : abs - holdback;
		if (!detector) {
			if (!final && pos < inferenceEnd && Number.isNaN(declaredV) === true) return;
			makeDetector();
		}
		records.sort((a, b) => a.start - b.start || a.ch - b.ch);
		let k = 0;
		const d = detector!;
		while (k < records.length && records[k].start <= pos) {
			const r = records[k++];
			if (detectEvents) {
				d.update(r.ch, r.start, r.rms);
				rvc?.update(r.ch, r.start, r.rms);
			}
		}
		records = k === records.length ? [] : records.slice(k);
		finalize(pos);
	}

	return {
		get samplesPushed() {
			return abs;
		},
		push(chunk: Float64Array[]): void {
			if (finished) throw new Error('push after finish');
			if (chunk.length !== nCh) throw new RangeError(`push expects ${nCh} channel arrays, got ${chunk.length}`);
			const n = chunk[0].length;
			for (const x of chunk) if (x.length !== n) throw new RangeError('push expects channel arrays of equal length');
			for (let off = 0; off < n; off += BLOCK) {
				const m = Math.min(BLOCK, n - off);
				const pos = abs & mask;
				for (let c = 0; c < nCh; c++) {
					const ring = rings[c];
					const first = Math.min(m, ringLen - pos);
					ring.set(chunk[c].subarray(off, off + first), pos);
					if (first < m) ring.set(chunk[c].subarray(off + first, off + m), 0);
				}
				for (const t of trackers) t.scan(chunk[t.channel], off, off + m, abs);
				abs += m;
				afterBlock(false);
			}
			flicker?.push(chunk, nominalHz, declaredV);
		},
		finish(): TrendResult {
			if (finished) throw new Error('finish called twice');
			finished = true;
			if (nominalHz === undefined) {
				nominalHz = 50;
				diagnostics.push({
					code: 'nominal-frequency-unknown',
					severity: 'warning',
					message: 'Too few zero crossings to tell 50 from 60 Hz; 50 Hz assumed.',
				});
			}
			while (abs >= fNext) nextFrequency();
			if (abs > fStart) closeFrequency(abs, false);
			if (seq >= ws && seq - ws > 0)
				diagnostics.push({
					code: 'last-window-partial',
					severity: 'info',
					message: `The last ${seq - ws} cycle(s) do not fill a ${cyclesPerWindow}-cycle window and are left out of the aggregates.`,
				});
			afterBlock(true);
			emitGroupRows(g150.size === 15, false);
			for (const t of trackers) {
				if (t.forcedCount > 0) {
					diagnostics.push({
						code: 'zero-crossings-lost',
						severity: 'info',
						message: `${channels[t.channel].name}: no zero crossing for ${t.forcedCount} half cycle(s) (interruption or very low signal); timing free-ran at the last measured period there.`,
					});
				}
			}
			if (nonFiniteWindows > 0) {
				diagnostics.push({
					code: 'non-finite-samples',
					severity: 'warning',
					message: `${nonFiniteWindows} channel window(s) of 10/12 cycles hold missing or non-finite samples, or samples too large to square (beyond about 1e154), the first on ${channels[firstNonFinite.channel].name} at ${firstNonFinite.startS.toFixed(4)} s: their values are left empty, and no event can be detected from them.`,
				});
			}
			if (seq < 0)
				diagnostics.push({
					code: 'no-zero-crossings',
					severity: 'warning',
					message: `${channels[ref].name}: no zero crossing found; no aggregate could be formed.`,
				});
			if (clockStartS !== undefined)
				diagnostics.push({
					code: 'clock-aligned',
					severity: 'info',
					message:
						"10-min intervals and 10-s frequency values follow the clock from the recording's start time; the first and last may be partial.",
				});
			else if (abs >= tickLen)
				diagnostics.push({
					code: 'ten-minute-from-start',
					severity: 'info',
					message: '10-min intervals count from the start of the recording (no start time on the clock given).',
				});
			if (!wantThd)
				diagnostics.push({
					code: 'thd-not-computed',
					severity: 'info',
					message: 'THD was not computed for this run (no harmonic analysis attached).',
				});
			const events: TrendEvent[] = (detector?.events ?? []).map((e) => {
				const ended = !Number.isNaN(e.end);
				const end = ended ? e.end : abs;
				const ev: TrendEvent = {
					kind: e.kind,
					channels: [...e.channels].sort((a, b) => a - b).map((k) => channels[voltage[k]].name),
					startS: e.start / fs,
					durationS: (end - e.start) / fs,
					percentOfDeclared: (100 * e.extremeV) / declaredV,
					ended,
				};
				if (e.kind === 'swell') ev.maximumV = e.extremeV;
				else ev.residualV = e.extremeV;
				return ev;
			});
			for (const e of rvc?.events ?? []) {
				events.push({
					kind: 'rvc',
					channels: [...e.channels].sort((a, b) => a - b).map((k) => channels[voltage[k]].name),
					startS: e.start / fs,
					durationS: (e.end - e.start) / fs,
					deltaUmaxV: e.deltaUmaxV,
					deltaUssV: e.deltaUssV,
					percentOfDeclared: (100 * e.deltaUmaxV) / declaredV,
					ended: true,
				});
			}
			events.sort((a, b) => a.startS - b.startS);
			const flickerResult = flicker?.finish(nominalHz, events, declaredV);
			return {
				sampleRateHz: fs,
				nominalHz,
				declaredV,
				declaredVSource: !detectEvents ? 'none' : opts.declaredV !== undefined ? 'given' : 'inferred',
				thresholds: th,
				channels,
				referenceChannel: channels[ref].name,
				durationS: abs / fs,
				clockStartS,
				cycles10: out.cycles10,
				cycles150: out.cycles150,
				min10: out.min10,
				frequency: out.frequency,
				events,
				diagnostics,
				...(flickerResult ? { flicker: flickerResult } : {}),
			};
		},
	};
}
