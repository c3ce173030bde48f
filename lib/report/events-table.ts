/**
 * Residual-voltage × duration classification of voltage events, each event counted once.
 *
 * Dips and interruptions: EN 50160:2010 Table 5 (the classification IEC TR 61000-2-8 also uses), rows by
 * residual voltage u in % of the declared voltage (90 > u ≥ 80, 80 > u ≥ 70, 70 > u ≥ 40, 40 > u ≥ 5,
 * 5 > u), columns by duration t (10 ms ≤ t ≤ 200 ms, 200 ms < t ≤ 0.5 s, 0.5 s < t ≤ 1 s, 1 s < t ≤ 5 s,
 * 5 s < t ≤ 1 min). Swells: EN 50160:2010 Table 6, rows u ≥ 120 and 120 > u > 110, columns
 * 10 ms ≤ t ≤ 500 ms, 500 ms < t ≤ 5 s, 5 s < t ≤ 1 min. Events outside every cell (over a minute) are
 * counted in `outside`. Ref: EN 50160:2010, 4.3.1 / 4.3.2 (tables as recalled: from memory).
 */
import type { ReportEvent } from './events.js';

export interface ReportEventTable {
	/** Standard and table. */
	source: string;
	/** Row labels, in % of the declared voltage. */
	rows: string[];
	/** Column labels (durations). */
	columns: string[];
	/** counts[row][column]. */
	counts: number[][];
	/** Events longer than the last column (over one minute). */
	outside: number;
}

interface Band {
	label: string;
	test: (x: number) => boolean;
}

const DIP_ROWS: Band[] = [
	{ label: '90 > u ≥ 80', test: (u) => u < 90 && u >= 80 },
	{ label: '80 > u ≥ 70', test: (u) => u < 80 && u >= 70 },
	{ label: '70 > u ≥ 40', test: (u) => u < 70 && u >= 40 },
	{ label: '40 > u ≥ 5', test: (u) => u < 40 && u >= 5 },
	{ label: '5 > u', test: (u) => u < 5 },
];
const DIP_COLUMNS: Band[] = [
	{ label: '10-200 ms', test: (t) => t <= 0.2 },
	{ label: '0.2-0.5 s', test: (t) => t > 0.2 && t <= 0.5 },
	{ label: '0.5-1 s', test: (t) => t > 0.5 && t <= 1 },
	{ label: '1-5 s', test: (t) => t > 1 && t <= 5 },
	{ label: '5-60 s', test: (t) => t > 5 && t <= 60 },
];
const SWELL_ROWS: Band[] = [
	{ label: 'u ≥ 120', test: (u) => u >= 120 },
	{ label: '120 > u > 110', test: (u) => u < 120 },
];
const SWELL_COLUMNS: Band[] = [
	{ label: '10-500 ms', test: (t) => t <= 0.5 },
	{ label: '0.5-5 s', test: (t) => t > 0.5 && t <= 5 },
	{ label: '5-60 s', test: (t) => t > 5 && t <= 60 },
];

function table(events: ReportEvent[], source: string, rows: Band[], columns: Band[]): ReportEventTable {
	const counts = rows.map(() => columns.map(() => 0));
	let outside = 0;
	for (const e of events) {
		const r = rows.findIndex((b) => b.test(e.percentOfDeclared));
		const c = columns.findIndex((b) => b.test(e.durationS));
		if (r < 0 || c < 0) outside++;
		else counts[r][c]++;
	}
	return { source, rows: rows.map((b) => b.label), columns: columns.map((b) => b.label), counts, outside };
}

/** The dip/interruption table and the swell table of a list of events (each event in one cell). */
export function classifyEvents(events: ReportEvent[]): { dipTable: ReportEventTable; swellTable: ReportEventTable } {
	return {
		dipTable: table(
			events.filter((e) => e.kind !== 'swell'),
			'EN 50160:2010, Table 5',
			DIP_ROWS,
			DIP_COLUMNS,
		),
		swellTable: table(
			events.filter((e) => e.kind === 'swell'),
			'EN 50160:2010, Table 6',
			SWELL_ROWS,
			SWELL_COLUMNS,
		),
	};
}

/** "residual 40-70 %, 0.2-0.5 s": the cell an event falls in, or null when outside the table. */
export function eventCell(e: ReportEvent, t: ReportEventTable): string | null {
	const rows = e.kind === 'swell' ? SWELL_ROWS : DIP_ROWS;
	const columns = e.kind === 'swell' ? SWELL_COLUMNS : DIP_COLUMNS;
	const r = rows.findIndex((b) => b.test(e.percentOfDeclared));
	const c = columns.findIndex((b) => b.test(e.durationS));
	return r < 0 || c < 0 ? null : `${t.rows[r]} %, ${t.columns[c]}`;
}
