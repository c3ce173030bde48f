/**
 * The next-steps section as CSV for spreadsheets (long form): one row per figure of each step's result,
 * plus a row for its status, what it needs and what it concludes. Cells are made safe and quoted as the
 * CSV summary does (lib/report/csv-summary.ts).
 */
import { csvNumberCell, csvTextCell } from '../report/csv-summary.js';
import type { ReportJson } from '../report/to-json.js';

/** Columns of the next-steps CSV: `figure` is the JSON path inside the step's `result`. */
export const NEXT_STEPS_CSV_COLUMNS = ['file', 'step', 'status', 'figure', 'value', 'text'] as const;

function flatten(value: unknown, path: string, out: [string, unknown][]): void {
	if (Array.isArray(value)) value.forEach((v, k) => flatten(v, `${path}[${k}]`, out));
	else if (value !== null && typeof value === 'object')
		for (const [k, v] of Object.entries(value)) flatten(v, path ? `${path}.${k}` : k, out);
	else out.push([path, value]);
}

/** The rows (no line ends) of one report's next steps; none when the report has no such section. */
export function nextStepsCsvRows(report: ReportJson): string[] {
	const rows: string[] = [];
	for (const s of report.nextSteps?.steps ?? []) {
		const row = (figure: string, value: string, text: string) =>
			rows.push(
				[
					csvTextCell(report.file),
					csvTextCell(s.step),
					csvTextCell(s.status),
					csvTextCell(figure),
					value,
					csvTextCell(text),
				].join(','),
			);
		row('finding', '', s.finding);
		if (s.needs.length > 0) row('needs', '', s.needs.join('; '));
		const figures: [string, unknown][] = [];
		if (s.result) flatten(s.result, '', figures);
		for (const [path, v] of figures) {
			if (typeof v === 'number' || v === null) row(path, csvNumberCell(v as number | null), '');
			else row(path, '', String(v));
		}
		for (const c of s.conclusions) row('conclusion', '', c);
		for (const w of s.warnings) row('warning', '', w);
	}
	return rows;
}

/** A whole CSV document of the next steps of every report, CRLF line ends (RFC 4180). */
export function nextStepsCsv(reports: ReportJson[]): string {
	const lines = [NEXT_STEPS_CSV_COLUMNS.join(','), ...reports.flatMap(nextStepsCsvRows)];
	return lines.join('\r\n') + '\r\n';
}
