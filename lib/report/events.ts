/**
 * Voltage dips, swells and interruptions of a capture for the analysis report: lib/trend's detection
 * (IEC 61000-4-30 Urms(1/2) with the polyphase rules), each event listed once, with per-channel detail,
 * and counted once in the residual-voltage × duration tables of EN 50160 (events-table.ts).
 *
 * Counted once: lib/trend reports an interruption of every phase both as an interruption and as the dip
 * that contains it (each by its own rule). Here the dip that overlaps an interruption is folded into
 * that interruption: one event of kind 'interruption', keeping the dip's span as detail (`dipStartS`,
 * `dipDurationS`), so a residual-voltage table counts it once, in its below-5 % row.
 */
import type { Capture } from '../capture.js';
import { analyseTrend } from '../trend/analyse-capture.js';
import { blockMeans } from '../signal/block-mean.js';
import { HARMONIC_RATE_HZ } from './spectra.js';
import type { TrendEvent, TrendResult } from '../trend/types.js';
import { classifyEvents, type ReportEventTable } from './events-table.js';

export interface ReportEventChannel {
	channel: string;
	/** Lowest (dip, interruption) or highest (swell) Urms(1/2) of this channel during the event, V. */
	extremeV: number;
	percentOfDeclared: number;
	/** Whether this channel crossed the event's threshold. */
	crossed: boolean;
}

export interface ReportEvent {
	kind: 'dip' | 'swell' | 'interruption';
	startS: number;
	durationS: number;
	/** Residual voltage (dip, interruption) or maximum (swell): the extreme Urms(1/2) on any channel, V. */
	extremeV: number;
	percentOfDeclared: number;
	/** False when the record ended during the event (the duration is then a lower bound). */
	ended: boolean;
	/** Channels that crossed the threshold. */
	channels: string[];
	perChannel: ReportEventChannel[];
	/** Interruptions: the span of the dip folded into it (null for dips and swells, or when none overlapped). */
	dipStartS: number | null;
	dipDurationS: number | null;
}

export interface ReportEvents {
	/** Declared voltage Udin the thresholds are taken on, V. */
	declaredV: number;
	/** 'given' or 'inferred' (from the first second of the record). */
	declaredVSource: string;
	thresholdsPercent: { dip: number; swell: number; interruption: number; hysteresis: number };
	events: ReportEvent[];
	/** Dips and interruptions by residual voltage and duration; swells by maximum voltage and duration. */
	dipTable: ReportEventTable;
	swellTable: ReportEventTable;
}

type Series = { t: number[]; v: number[] };

function extremeOn(s: Series, fromS: number, toS: number, low: boolean): number {
	let x = NaN;
	for (let k = 0; k < s.t.length; k++) {
		if (s.t[k] < fromS || s.t[k] > toS) continue;
		if (Number.isNaN(x) || (low ? s.v[k] < x : s.v[k] > x)) x = s.v[k];
	}
	return x;
}

/** Folds each dip that overlaps an interruption into it (kept as `dip`); other events pass unchanged. */
export function foldInterruptions(events: TrendEvent[]): (TrendEvent & { dip?: TrendEvent })[] {
	const interruptions = events.filter((e) => e.kind === 'interruption');
	const overlaps = (a: TrendEvent, b: TrendEvent) =>
		a.startS <= b.startS + b.durationS && b.startS <= a.startS + a.durationS;
	const out: (TrendEvent & { dip?: TrendEvent })[] = [];
	for (const e of events) {
		if (e.kind === 'dip' && interruptions.some((i) => overlaps(i, e))) continue;
		if (e.kind === 'interruption') {
			const dip = events.find((d) => d.kind === 'dip' && overlaps(e, d));
			out.push(dip ? { ...e, dip } : { ...e });
		} else out.push({ ...e });
	}
	return out.sort((a, b) => a.startS - b.startS);
}

/** lib/trend's events with each all-phase interruption once (the dip containing it dropped), for lists and counts. */
export function eventsCountedOnce(events: TrendEvent[]): TrendEvent[] {
	return foldInterruptions(events).map(({ dip: _dip, ...e }) => e);
}

function toReportEvent(e: TrendEvent & { dip?: TrendEvent }, r: TrendResult, series: Map<string, Series>): ReportEvent {
	const low = e.kind !== 'swell';
	const extremeV = (low ? e.residualV : e.maximumV) ?? NaN;
	const endS = e.startS + e.durationS;
	const perChannel = r.channels
		.filter((c) => c.quantity === 'voltage' && series.has(c.name))
		.map((c) => {
			const x = extremeOn(series.get(c.name)!, e.startS, endS, low);
			return {
				channel: c.name,
				extremeV: x,
				percentOfDeclared: (100 * x) / r.declaredV,
				crossed: e.channels.includes(c.name),
			};
		});
	return {
		kind: e.kind as ReportEvent['kind'],
		startS: e.startS,
		durationS: e.durationS,
		extremeV,
		percentOfDeclared: e.percentOfDeclared,
		ended: e.ended,
		channels: e.channels,
		perChannel,
		dipStartS: e.dip ? e.dip.startS : null,
		dipDurationS: e.dip ? e.dip.durationS : null,
	};
}

/**
 * The capture the event detection reads: above HARMONIC_RATE_HZ (a scope's MS/s), every channel averaged
 * in blocks down to that rate, as the harmonic windows are (spectra.ts): Urms(1/2) needs the harmonics up
 * to order 50, which the averaging keeps within 1e-4, not every sample of a 10 MS/s record. The blocks'
 * times are kept (block j stands at sample jM + (M − 1)/2).
 */
function eventRateCapture(capture: Capture): { capture: Capture; note?: string } {
	const m = Math.floor(capture.sampleRateHz / HARMONIC_RATE_HZ);
	if (m < 2 || capture.gaps?.length) return { capture };
	const fs = capture.sampleRateHz / m;
	return {
		capture: {
			...capture,
			sampleRateHz: fs,
			startS: capture.startS + (m - 1) / 2 / capture.sampleRateHz,
			channels: capture.channels.map((c) => ({ ...c, samples: blockMeans(c.samples, m) })),
			// per-sample side data does not apply at the new rate; events read only the analog channels
			timeS: undefined,
			digital: undefined,
			gaps: undefined,
		},
		note: `Voltage events are looked for in the Urms(1/2) of the record averaged in blocks of ${m} samples (${(fs / 1000).toFixed(0)} kS/s).`,
	};
}

/**
 * Events of a capture's voltage channels; null without a voltage channel.
 * @param declaredV  declared supply voltage (line-to-neutral for phase channels); inferred when absent
 * @returns the events and their tables, and the trend analyser's notes (as sentences) for the assumptions
 */
export function captureEvents(
	capture: Capture,
	nominalHz: number | undefined,
	declaredV?: number,
): { events: ReportEvents | null; notes: string[] } {
	if (!capture.channels.some((c) => c.quantity === 'voltage')) return { events: null, notes: [] };
	const series = new Map<string, Series>();
	const names = capture.channels.map((c) => c.name);
	let r: TrendResult;
	const { capture: atRate, note } = eventRateCapture(capture);
	try {
		r = analyseTrend(atRate, {
			nominalHz: nominalHz === 50 || nominalHz === 60 ? nominalHz : undefined,
			declaredV,
			thd: false,
			// the report's flicker section has its own flickermeter; events need only the Urms(1/2) values
			flicker: false,
			keep: { cycles10: false, cycles150: false, min10: false },
			onHalfCycle: (ch, startS, v) => {
				let s = series.get(names[ch]);
				if (!s) series.set(names[ch], (s = { t: [], v: [] }));
				s.t.push(startS);
				s.v.push(v);
			},
		});
	} catch (e) {
		return {
			events: null,
			notes: [`Voltage events were not looked for: ${e instanceof Error ? e.message : String(e)}`],
		};
	}
	if (!Number.isFinite(r.declaredV)) return { events: null, notes: [] };
	const events = foldInterruptions(r.events.filter((e) => e.kind !== 'rvc')).map((e) => toReportEvent(e, r, series));
	const t = r.thresholds;
	const notes = r.diagnostics.filter((d) => d.code === 'declared-voltage-inferred').map((d) => d.message);
	if (note) notes.push(note);
	return {
		events: {
			declaredV: r.declaredV,
			declaredVSource: r.declaredVSource,
			thresholdsPercent: {
				dip: t.dipPercent,
				swell: t.swellPercent,
				interruption: t.interruptionPercent,
				hysteresis: t.hysteresisPercent,
			},
			events,
			...classifyEvents(events),
		},
		notes,
	};
}
