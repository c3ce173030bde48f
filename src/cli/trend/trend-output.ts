/** Text forms of trend results: CSV lines of aggregate rows, the JSON document, one-line event text. */
import { csvCell } from '../../../lib/report/index.js';
import type { TrendChannelSpec, TrendEvent, TrendResult, TrendRow } from '../../../lib/trend/types.js';
import type { TrendFlicker } from '../../../lib/trend/flicker-tracker.js';
import type { RecordingResult } from '../../../lib/trend/recording-types.js';
import { maxOf } from '../../../lib/signal/index.js';
import { trendDocumentOf } from '../../../lib/survey/index.js';

/** CSV cell: the shared formula guard and RFC 4180 quoting (lib/report/csv-cell.ts). */
const cell = (text: string): string => csvCell(text);

function n(x: number, digits: number): string {
	return Number.isFinite(x) ? x.toFixed(digits) : '';
}

/** Header line: interval, times, frequency, flags, then `<name> rms (<unit>)` and `<name> THD (%)` per channel. */
export function csvHeader(channels: TrendChannelSpec[], withFile: boolean, harmonics = false): string {
	const cols = [
		...(withFile ? ['file'] : []),
		'interval',
		'start_s',
		'duration_s',
		'cycles',
		'frequency_hz',
		'complete',
		'flagged',
		...channels.flatMap((c) => [`${c.name} rms${c.unit ? ` (${c.unit})` : ''}`, `${c.name} THD (%)`]),
		...(harmonics ? channels.flatMap((c) => Array.from({ length: 49 }, (_, k) => `${c.name} H${k + 2} (%)`)) : []),
	];
	return `${cols.map(cell).join(',')}\n`;
}

export function csvRow(row: TrendRow, file?: string): string {
	const cols = [
		...(file !== undefined ? [cell(file)] : []),
		row.interval,
		n(row.startS, 4),
		n(row.durationS, 4),
		String(row.cycles),
		n(row.frequencyHz, 4),
		row.complete ? '1' : '0',
		row.flagged ? '1' : '0',
		...row.rms.flatMap((v, i) => [n(v, 3), n(row.thdPercent[i], 3)]),
		...(row.harmonicsPercent ? row.harmonicsPercent.flatMap((h) => h.slice(2).map((v) => n(v, 3))) : []),
	];
	return `${cols.join(',')}\n`;
}

/** One line for stderr: 'dip on L2 at 0.5057 s for 0.0600 s, residual 161.0 V (70.0 % of 230 V)'; 'rvc' is a rapid voltage change. */
export function eventLine(e: TrendEvent, declaredV: number): string {
	const what =
		e.kind === 'rvc'
			? `largest change ${e.deltaUmaxV!.toFixed(1)} V, step between steady states ${e.deltaUssV!.toFixed(1)} V`
			: e.kind === 'swell'
				? `maximum ${e.maximumV!.toFixed(1)} V`
				: `residual ${e.residualV!.toFixed(1)} V`;
	const open = e.ended ? '' : ' (still going at the end of the recording)';
	return `${e.kind} on ${e.channels.join(', ')} at ${e.startS.toFixed(4)} s for ${e.durationS.toFixed(4)} s${open}, ${what} (${e.percentOfDeclared.toFixed(1)} % of ${declaredV} V)`;
}

/**
 * The JSON document of one file:
 * { source, declaredV, declaredVSource, nominalHz, sampleRateHz, durationS, startTime (ISO 8601, UTC or the
 *   recorder's clock as written; null when the file states none), clockStartS, referenceChannel, thresholds,
 *   channels: [{name, quantity, unit}], aggregates: [TrendRow...] (10/12-cycle, then 150/180-cycle,
 *   then 10-min; rms/thdPercent in channel order; a complete 10-min row also pst, per channel, null where
 *   not a voltage), frequency: [10 s rows], events: [{ kind, channels,
 *   startS, durationS, residualV | maximumV, percentOfDeclared, ended }], diagnostics }; for a recording
 *   read through read-recording.ts also parts: [{ source, startS, samples }], gaps: [{ startS, durationS,
 *   after, before }], overlaps: [{ source, startS, durationS, droppedSamples }].
 * Times in s from the first sample (of the first file). NaN becomes null.
 */
export function trendJson(source: string, r: TrendResult | RecordingResult): unknown {
	// each complete 10-min row with its Pst per channel (null where not a voltage), as the survey's merge reads it
	const min10 = trendDocumentOf(source, r).aggregates;
	return {
		source,
		declaredV: r.declaredV,
		declaredVSource: r.declaredVSource,
		nominalHz: r.nominalHz,
		sampleRateHz: r.sampleRateHz,
		durationS: r.durationS,
		startTime: r.clockStartS === undefined ? null : new Date(r.clockStartS * 1000).toISOString(),
		clockStartS: r.clockStartS ?? null,
		referenceChannel: r.referenceChannel,
		thresholds: r.thresholds,
		channels: r.channels,
		aggregates: [
			...r.cycles10,
			...r.cycles150,
			...r.min10.map((row, k) => (min10[k].pst ? { ...row, pst: min10[k].pst } : row)),
		],
		frequency: r.frequency,
		events: r.events,
		flicker: r.flicker ?? null,
		diagnostics: r.diagnostics,
		...('parts' in r ? { parts: r.parts, gaps: r.gaps, overlaps: r.overlaps } : {}),
	};
}

/** Flicker CSV header: interval ('Pst 10-min' or 'Plt 2-h'), times, flag, then `<name> flicker` per voltage channel. */
export function flickerCsvHeader(f: TrendFlicker, withFile: boolean): string {
	const cols = [
		...(withFile ? ['file'] : []),
		'interval',
		'start_s',
		'duration_s',
		'flagged',
		...f.channels.map((c) => `${c} flicker`),
	];
	return `${cols.map(cell).join(',')}\n`;
}

/** Flicker CSV rows: every Pst, then every Plt. */
export function flickerCsvRows(f: TrendFlicker, file?: string): string[] {
	const rows = [...f.pst.map((r) => ['Pst 10-min', r] as const), ...f.plt.map((r) => ['Plt 2-h', r] as const)];
	return rows.map(
		([kind, r]) =>
			`${[...(file !== undefined ? [cell(file)] : []), kind, n(r.startS, 3), n(r.durationS, 3), r.flagged ? '1' : '0', ...r.values.map((v) => n(v, 3))].join(',')}\n`,
	);
}

/** One stderr line per file in CSV mode: the highest Pst per channel (or why there is none). */
export function flickerLine(f: TrendFlicker): string {
	if (f.pst.length === 0) {
		const pinst = f.channels.flatMap((c, k) => (Number.isFinite(f.pinstMax[k]) ? [`${c} ${n(f.pinstMax[k], 2)}`] : []));
		const why =
			pinst.length > 0
				? `highest instantaneous flicker ${pinst.join(', ')}; not a Pst`
				: 'the recording is too short for the flickermeter to settle';
		return `flicker: no complete 10-minute interval, so no Pst (${why})${changesText(f)}`;
	}
	const worst = f.channels.map((c, k) => `${c} ${n(maxOf(f.pst.map((r) => r.values[k])), 2)}`);
	const plt =
		f.plt.length > 0
			? `; highest Plt ${f.channels.map((c, k) => `${c} ${n(maxOf(f.plt.map((r) => r.values[k])), 2)}`).join(', ')}`
			: '';
	return `flicker (${f.lamp} lamp): highest Pst over ${f.pst.length} interval(s) ${worst.join(', ')}${plt}; --interval flicker lists them${changesText(f)}`;
}

/** '; voltage changes (IEC 61000-3-3): L1 2, largest dc 3.48 %, dmax 4.10 %, 0.00 s beyond 3.3 %' (empty when none). */
function changesText(f: TrendFlicker): string {
	const parts = (f.changes ?? []).flatMap((c, k) =>
		c.count > 0
			? [
					`${f.channels[k]} ${c.count}, largest dc ${n(c.dcMaxPercent, 2)} %, dmax ${n(c.dmaxPercent, 2)} %, ${n(c.tmaxS, 2)} s beyond 3.3 %`,
				]
			: [],
	);
	return parts.length > 0 ? `; voltage changes (IEC 61000-3-3): ${parts.join('; ')}` : '';
}
