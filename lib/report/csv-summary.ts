/**
 * One summary row per channel per file, for spreadsheets. Every text cell goes through the shared
 * formula guard and RFC 4180 quoting of csv-cell.ts.
 */
import { csvCell, csvNumberCell } from './csv-cell.js';
import type { ReportJson } from './to-json.js';
import { maxOf } from '../signal/extremes.js';

/**
 * Column names of the CSV summary, in order (SI units; names follow the JSON contract). The average-
 * responding columns are the AC-coupled meter (see lib/report/meter.ts); `limitsBasis` names the harmonic
 * values the limits were judged on; dips/swells/interruptions count the voltage events each voltage
 * channel took part in (each event once); the worst-interval columns are per 10/12-cycle interval.
 */
export const CSV_SUMMARY_COLUMNS = [
	'file',
	'channel',
	'unit',
	'quantity',
	'frequencyHz',
	'cyclesAnalysed',
	'mean',
	'rms',
	'acRms',
	'rectifiedMean',
	'peak',
	'peakNegative',
	'peakToPeak',
	'crestFactor',
	'formFactor',
	'thdPercent',
	'kFactor',
	'averageRespondingReading',
	'averageRespondingErrorPercent',
	'fundamentalRms',
	'lagDegToReference',
	'limitsPass',
	// flicker of voltage channels (empty otherwise): highest Pst over complete 10-minute intervals, and the
	// highest instantaneous flicker Pinst (not a Pst; given for records shorter than 10 minutes too)
	'pstMax',
	'pinstMax',
	'limitsBasis',
	'dips',
	'swells',
	'interruptions',
	'worstIntervalMeterErrorPercent',
	'worstIntervalCrestFactor',
] as const;

/** A text cell made safe for spreadsheets and quoted per RFC 4180 when needed (see csv-cell.ts). */
export function csvTextCell(text: string): string {
	return csvCell(text);
}

export { csvNumberCell };

/** The header line of the CSV summary (no line end). */
export function csvSummaryHeader(): string {
	return CSV_SUMMARY_COLUMNS.join(',');
}

/** The rows (no line ends) of one report (its JSON form, see `reportToJson`): one per channel. */
export function csvSummaryRows(report: ReportJson): string[] {
	return report.channels.map((c) => rowOf(report, c));
}

/** A whole CSV document: header and every report's rows, CRLF line ends (RFC 4180). */
export function reportsToCsv(reports: ReportJson[]): string {
	const lines = [csvSummaryHeader()];
	for (const r of reports) lines.push(...csvSummaryRows(r));
	return lines.join('\r\n') + '\r\n';
}

/** Dips, swells and interruptions this channel took part in (empty cells for a channel that is no voltage, or without events analysis). */
function eventCounts(report: ReportJson, name: string, quantity: string): string[] {
	if (!report.events || quantity !== 'voltage') return ['', '', ''];
	const on = report.events.events.filter((e) => e.kind === 'interruption' || e.channels.includes(name));
	return (['dip', 'swell', 'interruption'] as const).map((k) => String(on.filter((e) => e.kind === k).length));
}

function rowOf(report: ReportJson, c: ReportJson['channels'][number]): string {
	const pair = report.pairs.find((p) => p.other === c.name);
	const limitRows = report.limits?.rows.filter((r) => r.channel === c.name) ?? [];
	const fl = report.flicker?.channels.find((f) => f.channel === c.name);
	const limitsPass =
		report.limits === undefined || limitRows.length === 0 ? '' : limitRows.every((r) => r.pass) ? 'pass' : 'fail';
	const cells = [
		csvTextCell(report.file),
		csvTextCell(c.name),
		csvTextCell(c.unit),
		csvTextCell(c.quantity),
		csvNumberCell(c.frequencyHz),
		csvNumberCell(report.cyclesAnalysed),
		csvNumberCell(c.mean),
		csvNumberCell(c.rms),
		csvNumberCell(c.acRms),
		csvNumberCell(c.rectifiedMean),
		csvNumberCell(c.peak),
		csvNumberCell(c.peakNegative),
		csvNumberCell(c.peakToPeak),
		csvNumberCell(c.crestFactor),
		csvNumberCell(c.formFactor),
		csvNumberCell(c.thdPercent),
		csvNumberCell(c.kFactor),
		csvNumberCell(c.averageResponding.reading),
		csvNumberCell(c.averageResponding.errorPercent),
		csvNumberCell(c.harmonics[1]?.rms),
		csvNumberCell(pair?.lagDeg),
		csvTextCell(limitsPass),
		csvNumberCell(fl && fl.pst.length > 0 ? maxOf(fl.pst.map((p) => p.pst ?? NaN)) : NaN),
		csvNumberCell(fl?.pinst.max),
		csvTextCell(report.limits ? report.limits.basis.kind : ''),
		...eventCounts(report, c.name, c.quantity),
		csvNumberCell(c.intervals?.meterErrorPercent.worst),
		csvNumberCell(c.intervals?.crestFactor.worst),
	];
	return cells.join(',');
}
