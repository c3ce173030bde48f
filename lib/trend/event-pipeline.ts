/**
 * The event pipeline of the trend analyser: Urms(1/2) values of every voltage channel arrive from the
 * crossing trackers as each half cycle ends, are queued per channel (typed arrays, reused) and merged
 * across channels in (window start, channel) order into the dip/swell/interruption detector
 * (event-detector.ts) and, when asked, the rapid voltage change detector (rvc-detector.ts). Detection waits for the declared voltage: given, or inferred from
 * the first second of values (declared-voltage.ts). It also answers whether a stretch overlaps an event,
 * for the flags of the aggregates.
 *
 * Ref: IEC 61000-4-30:2015, 5.4.1-5.4.4 (dips, swells, interruptions), 5.11 (RVC), 4.7 (flagging)
 * (from memory); docs/methods.md §3.4-3.5.
 */
import type { Diagnostic } from '../capture.js';
import { declaredVoltageFromRms } from './declared-voltage.js';
import { EventDetector, type EventLevelsV } from './event-detector.js';
import { RvcDetector } from './rvc-detector.js';
import type { TrendEvent, TrendOptions, TrendThresholds } from './types.js';

/** Default thresholds, % of Udin. Ref: docs/methods.md §3.4 typical settings (IEC 61000-4-30:2015, 5.4.2-5.4.4). */
export const TREND_DEFAULT_THRESHOLDS: Readonly<TrendThresholds> = {
	dipPercent: 90,
	swellPercent: 110,
	interruptionPercent: 5,
	hysteresisPercent: 2,
};

/**
 * Urms(1/2) values in the RVC steady-state window: 100 at 50 Hz, 120 at 60 Hz (one second).
 * Ref: IEC 61000-4-30:2015, 5.11 (from memory).
 */
function rvcWindowValues(nominalHz: number): number {
	return nominalHz === 60 ? 120 : 100;
}

/** Levels that never start an event: the detector runs but finds nothing (no voltage, no declared voltage). */
const NO_LEVELS: EventLevelsV = { dipV: 0, dipEndV: 0, swellV: 0, swellEndV: 0, interruptionV: 0, interruptionEndV: 0 };

/** The thresholds with defaults filled in. @throws RangeError for a negative or disordered set */
export function checkedThresholds(given: Partial<TrendThresholds> | undefined): TrendThresholds {
	const th: TrendThresholds = { ...TREND_DEFAULT_THRESHOLDS, ...given };
	for (const [k, v] of Object.entries(th))
		if (!(v >= 0) || !Number.isFinite(v)) throw new RangeError(`threshold ${k} must be a number >= 0, got ${v}`);
	if (!(th.interruptionPercent < th.dipPercent && th.dipPercent < 100 && th.swellPercent > 100)) {
		throw new RangeError('thresholds must satisfy interruption < dip < 100 < swell (% of declared voltage)');
	}
	return th;
}

/** RVC threshold and hysteresis, % of Udin. @throws RangeError unless 0 ≤ hysteresis < threshold */
function checkedRvc(rvc: TrendOptions['rvc']): { thresholdPercent: number; hysteresisPercent: number } | undefined {
	if (!rvc) return undefined;
	const t = rvc.thresholdPercent;
	const hy = rvc.hysteresisPercent ?? t / 2;
	if (!(t > 0 && hy >= 0 && hy < t))
		throw new RangeError(
			`rvc needs thresholdPercent > 0 and 0 <= hysteresisPercent < thresholdPercent, got ${t} and ${hy}`,
		);
	return { thresholdPercent: t, hysteresisPercent: hy };
}

/**
 * One voltage channel's Urms(1/2) values waiting to be fed, in arrival order (which is start order: a
 * channel's windows start at its successive crossings), as (start, rms) in reused typed arrays.
 */
class HalfQueue {
	start = new Float64Array(256);
	rms = new Float64Array(256);
	head = 0;
	tail = 0;

	push(start: number, rms: number): void {
		if (this.tail === this.start.length) this.makeRoom();
		this.start[this.tail] = start;
		this.rms[this.tail++] = rms;
	}

	/** Moves the waiting values to the front, or doubles the arrays when they are more than half full. */
	private makeRoom(): void {
		const n = this.tail - this.head;
		if (n > this.start.length / 2) {
			const start = new Float64Array(2 * this.start.length);
			const rms = new Float64Array(2 * this.start.length);
			start.set(this.start.subarray(this.head, this.tail));
			rms.set(this.rms.subarray(this.head, this.tail));
			this.start = start;
			this.rms = rms;
		} else {
			this.start.copyWithin(0, this.head, this.tail);
			this.rms.copyWithin(0, this.head, this.tail);
		}
		this.head = 0;
		this.tail = n;
	}
}

export interface EventPipelineOptions {
	/** Number of voltage channels (the detectors' channel indices run over them). */
	voltageCount: number;
	declaredV: number | undefined;
	thresholds: TrendThresholds;
	rvc: TrendOptions['rvc'];
	/** Values starting before this sample are used to infer the declared voltage. */
	inferenceEnd: number;
	diagnostics: Diagnostic[];
}

export class EventPipeline {
	/** Udin, V: given, inferred once detection starts, or NaN. */
	declaredV: number;
	/** False when there is no voltage channel or no declared voltage could be found. */
	detectEvents: boolean;
	/** Per voltage channel, the values not yet fed. */
	private readonly queues: HalfQueue[];
	private detector: EventDetector | undefined;
	private rvc: RvcDetector | undefined;
	private readonly rvcSettings: { thresholdPercent: number; hysteresisPercent: number } | undefined;
	/** Events before this index ended before anything still waiting for a flag. */
	private firstRelevant = 0;

	constructor(private readonly o: EventPipelineOptions) {
		this.declaredV = o.declaredV ?? NaN;
		this.detectEvents = o.voltageCount > 0;
		this.rvcSettings = checkedRvc(o.rvc);
		this.queues = Array.from({ length: o.voltageCount }, () => new HalfQueue());
	}

	/**
	 * A Urms(1/2) value of voltage channel `ch` (index among the voltage channels) over a window from
	 * `start`. A value without a finite start (a crossing interpolated between infinite samples) has no
	 * place in time and is dropped.
	 */
	halfCycle(ch: number, start: number, rms: number): void {
		if (Number.isFinite(start)) this.queues[ch].push(start, rms);
	}

	/**
	 * Feeds the values whose window starts at or before `pos` to the detectors, in time order. False while
	 * detection has not started (the declared voltage is still being inferred and `pos` is short of the
	 * inference end); nothing is fed then.
	 */
	advance(pos: number, final: boolean, nominalHz: number | undefined): boolean {
		if (!this.detector) {
			if (!final && pos < this.o.inferenceEnd && Number.isNaN(this.declaredV)) return false;
			this.detector = this.makeDetector(nominalHz ?? 50);
		}
		// Merge the channels' queues in (start, channel) order.
		const d = this.detector;
		const queues = this.queues;
		for (;;) {
			let ch = -1;
			let start = pos;
			for (let c = 0; c < queues.length; c++) {
				const q = queues[c];
				if (q.head < q.tail && (q.start[q.head] < start || (ch < 0 && q.start[q.head] === start))) {
					ch = c;
					start = q.start[q.head];
				}
			}
			if (ch < 0) return true;
			const rms = queues[ch].rms[queues[ch].head++];
			if (this.detectEvents) {
				d.update(ch, start, rms);
				this.rvc?.update(ch, start, rms);
			}
		}
	}

	/** Whether samples [start, end) overlap a dip, swell or interruption found so far. */
	overlaps(start: number, end: number): boolean {
		if (!this.detector) return false;
		const ev = this.detector.events;
		for (let k = this.firstRelevant; k < ev.length; k++) {
			const e = ev[k];
			if (e.start < end && (Number.isNaN(e.end) || e.end > start)) return true;
		}
		return false;
	}

	/** Events that ended at or before sample `oldest` can flag nothing still pending: skip them from now on. */
	forgetBefore(oldest: number): void {
		if (!this.detector) return;
		const ev = this.detector.events;
		while (
			this.firstRelevant < ev.length &&
			!Number.isNaN(ev[this.firstRelevant].end) &&
			ev[this.firstRelevant].end <= oldest
		)
			this.firstRelevant++;
	}

	private makeDetector(nominalHz: number): EventDetector {
		const diagnostics = this.o.diagnostics;
		if (this.o.voltageCount === 0) {
			diagnostics.push({
				code: 'no-voltage-channel',
				severity: 'info',
				message: 'No voltage channel: no dip, swell or interruption detection, aggregates only.',
			});
			return new EventDetector(0, NO_LEVELS);
		}
		if (Number.isNaN(this.declaredV)) {
			const early: number[] = [];
			for (const q of this.queues)
				for (let k = q.head; k < q.tail; k++) if (q.start[k] < this.o.inferenceEnd) early.push(q.rms[k]);
			const d = declaredVoltageFromRms(early);
			this.declaredV = d.declaredV;
			diagnostics.push(d.diagnostic);
		}
		if (Number.isNaN(this.declaredV)) {
			this.detectEvents = false;
			diagnostics.push({
				code: 'events-not-detected',
				severity: 'warning',
				message:
					'No declared voltage: dips, swells and interruptions were not looked for. Give the declared voltage to detect them.',
			});
			return new EventDetector(0, NO_LEVELS);
		}
		const u = this.declaredV / 100;
		const th = this.o.thresholds;
		const rvc = this.rvcSettings;
		if (rvc) {
			const t = rvc.thresholdPercent;
			const n = rvcWindowValues(nominalHz);
			this.rvc = new RvcDetector(
				this.o.voltageCount,
				n,
				t * u,
				(t - rvc.hysteresisPercent) * u,
				th.dipPercent * u,
				th.swellPercent * u,
			);
		}
		return new EventDetector(this.o.voltageCount, {
			dipV: th.dipPercent * u,
			dipEndV: (th.dipPercent + th.hysteresisPercent) * u,
			swellV: th.swellPercent * u,
			swellEndV: (th.swellPercent - th.hysteresisPercent) * u,
			interruptionV: th.interruptionPercent * u,
			interruptionEndV: (th.interruptionPercent + th.hysteresisPercent) * u,
		});
	}

	/**
	 * Every event found, in start order, in seconds: `samples` is the recording's length (an event still
	 * going on ends there, `ended: false`); `names` are the voltage channels' names.
	 */
	events(samples: number, sampleRateHz: number, names: readonly string[]): TrendEvent[] {
		const fs = sampleRateHz;
		const declaredV = this.declaredV;
		const named = (set: Set<number>) => [...set].sort((a, b) => a - b).map((k) => names[k]);
		const events: TrendEvent[] = (this.detector?.events ?? []).map((e) => {
			const ended = !Number.isNaN(e.end);
			const end = ended ? e.end : samples;
			const ev: TrendEvent = {
				kind: e.kind,
				channels: named(e.channels),
				startS: e.start / fs,
				durationS: (end - e.start) / fs,
				percentOfDeclared: (100 * e.extremeV) / declaredV,
				ended,
			};
			if (e.kind === 'swell') ev.maximumV = e.extremeV;
			else ev.residualV = e.extremeV;
			return ev;
		});
		for (const e of this.rvc?.events ?? []) {
			events.push({
				kind: 'rvc',
				channels: named(e.channels),
				startS: e.start / fs,
				durationS: (e.end - e.start) / fs,
				deltaUmaxV: e.deltaUmaxV,
				deltaUssV: e.deltaUssV,
				percentOfDeclared: (100 * e.deltaUmaxV) / declaredV,
				ended: true,
			});
		}
		return events.sort((a, b) => a.startS - b.startS);
	}
}
