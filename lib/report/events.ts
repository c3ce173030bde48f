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
import { halfCycleCollector, refusedTrend, type CaptureTrend, type TrendViewRequest } from './trend-view.js';

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
 * The lib/trend options of the report's event step: Urms(1/2) and events only, or also what the trend view
 * draws (with its own flickermeter unless `viewFlicker` is false: the report's then serves the view).
 */
function trendOptions(
	nominalHz: number | undefined,
	declaredV: number | undefined,
	onHalfCycle: (ch: number, startS: number, v: number) => void,
	view: boolean,
	viewFlicker = true,
): Parameters<typeof analyseTrend>[1] {
	const nominal: 50 | 60 | undefined = nominalHz === 50 || nominalHz === 60 ? nominalHz : undefined;
	const common = { nominalHz: nominal, declaredV, onHalfCycle };
	// the view draws THD and frequency per 10/12 cycles and flicker with Pinst; the report's flicker section
	// has its own flickermeter, so the events alone need only the Urms(1/2) values
	if (view) return viewFlicker ? { ...common, flickerPinst: true } : { ...common, flicker: false };
	return { ...common, thd: false, flicker: false, keep: { cycles10: false, cycles150: false, min10: false } };
}

/** One lib/trend pass over the capture (with the view's extras when asked; without them if those are refused). */
function runTrend(
	capture: Capture,
	nominalHz: number | undefined,
	declaredV: number | undefined,
	view: TrendViewRequest | undefined,
	viewFlicker: boolean,
): { r: TrendResult | null; problem?: string; collector: ReturnType<typeof halfCycleCollector> } {
	let collector = halfCycleCollector(capture, view?.onFraction);
	if (view) {
		try {
			const options = trendOptions(nominalHz, declaredV, collector.onHalfCycle, true, viewFlicker);
			return { r: analyseTrend(capture, options), collector };
		} catch (e) {
			if (!capture.channels.some((c) => c.quantity === 'voltage')) throw e;
			// the events must not depend on the view: run again without its extras
			collector = halfCycleCollector(capture);
			const problem = e instanceof Error ? e.message : String(e);
			const r = analyseTrend(capture, trendOptions(nominalHz, declaredV, collector.onHalfCycle, false));
			return { r, problem, collector };
		}
	}
	return { r: analyseTrend(capture, trendOptions(nominalHz, declaredV, collector.onHalfCycle, false)), collector };
}

/** The report's Urms(1/2) series by channel name (channels sharing a name share one series). */
function seriesByName(capture: Capture, collector: ReturnType<typeof halfCycleCollector>): Map<string, Series> {
	const series = new Map<string, Series>();
	capture.channels.forEach((c, k) => {
		if (collector.values[k].length === 0) return;
		const s = series.get(c.name);
		if (!s) return void series.set(c.name, { t: collector.times[k], v: collector.values[k] });
		// a copy: the collector's arrays stay each channel's own (the trend view reads them)
		const t = s.t.slice();
		const v = s.v.slice();
		for (let j = 0; j < collector.values[k].length; j++) {
			t.push(collector.times[k][j]);
			v.push(collector.values[k][j]);
		}
		series.set(c.name, { t, v });
	});
	return series;
}

/** The trend view of one pass: lib/trend's result with each all-phase interruption once, and the Urms(1/2) series. */
function viewOf(
	r: TrendResult | null,
	problem: string | undefined,
	collector: ReturnType<typeof halfCycleCollector>,
): CaptureTrend {
	if (!r || problem !== undefined) return refusedTrend(problem ?? 'no trend');
	return { result: { ...r, events: eventsCountedOnce(r.events) }, halfCycle: collector.halfCycle() };
}

/**
 * The capture the event detection reads: above HARMONIC_RATE_HZ (a scope's MS/s), every channel averaged
 * in blocks down to that rate, as the harmonic windows are (spectra.ts): Urms(1/2) needs the harmonics up
 * to order 50, which the averaging keeps within 1e-4, not every sample of a 10 MS/s record. The blocks'
 * times are kept (block j stands at sample jM + (M − 1)/2).
 */
function eventRateCapture(capture: Capture): { capture: Capture; note?: string } {
	if (eventsReadEverySample(capture)) return { capture };
	const m = Math.floor(capture.sampleRateHz / HARMONIC_RATE_HZ);
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

/** Whether the event step reads every sample of the capture (else block averages: eventRateCapture). */
export function eventsReadEverySample(capture: Capture): boolean {
	return Math.floor(capture.sampleRateHz / HARMONIC_RATE_HZ) < 2 || (capture.gaps?.length ?? 0) > 0;
}

/**
 * Events of a capture's voltage channels; null without a voltage channel.
 * @param declaredV  declared supply voltage (line-to-neutral for phase channels); inferred when absent
 * @param view  also keep the trend view (`trend`) from the same lib/trend pass: Urms(1/2) series, THD and
 *   frequency rows, flicker with Pinst; null when the capture has no voltage or current channel
 * @param viewFlicker  false: the view's lib/trend pass runs no flickermeter (the caller adds the report's,
 *   trend-flicker.ts, flagged by `trendEvents`, lib/trend's events as it found them)
 * @returns the events and their tables, and the trend analyser's notes (as sentences) for the assumptions
 */
export function captureEvents(
	capture: Capture,
	nominalHz: number | undefined,
	declaredV?: number,
	view?: TrendViewRequest,
	viewFlicker = true,
): {
	events: ReportEvents | null;
	notes: string[];
	trend?: CaptureTrend | null;
	trendEvents?: TrendEvent[];
} {
	const hasVoltage = capture.channels.some((c) => c.quantity === 'voltage');
	const wantsView = view !== undefined && capture.channels.some((c) => c.quantity !== 'other');
	if (!hasVoltage && !wantsView) return { events: null, notes: [], ...(view ? { trend: null } : {}) };
	let run: ReturnType<typeof runTrend>;
	// above HARMONIC_RATE_HZ the pass reads block averages (eventRateCapture); the view then shows those
	const { capture: atRate, note } = eventRateCapture(capture);
	try {
		run = runTrend(atRate, nominalHz, declaredV, wantsView ? view : undefined, viewFlicker);
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		const notes = hasVoltage ? [`Voltage events were not looked for: ${message}`] : [];
		return { events: null, notes, ...(view ? { trend: refusedTrend(message) } : {}) };
	}
	const { r, problem, collector } = run;
	const trend = view ? { trend: viewOf(r, problem, collector), ...(r ? { trendEvents: r.events } : {}) } : {};
	if (!hasVoltage || !r || !Number.isFinite(r.declaredV)) return { events: null, notes: [], ...trend };
	const series = seriesByName(atRate, collector);
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
		...trend,
	};
}
