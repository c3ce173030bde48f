/**
 * Residual-voltage × duration tables of voltage events for the report, each event counted once, by the
 * one classification in lib/limits/en50160-events.ts:
 *
 * Dips and interruptions: EN 50160:2010 Table 5 (the classification IEC TR 61000-2-8 also uses), rows by
 * residual voltage u in % of the declared voltage (90 > u ≥ 80, 80 > u ≥ 70, 70 > u ≥ 40, 40 > u ≥ 5,
 * 5 > u), columns by duration t (10 ms ≤ t ≤ 200 ms, 200 ms < t ≤ 0.5 s, 0.5 s < t ≤ 1 s, 1 s < t ≤ 5 s,
 * 5 s < t ≤ 1 min; events under 10 ms, e.g. a half cycle at 60 Hz, in the first). Swells: EN 50160:2010
 * Table 6, rows u ≥ 120 and 120 > u > 110, columns 10 ms ≤ t ≤ 500 ms, 500 ms < t ≤ 5 s, 5 s < t ≤ 1 min.
 * Events outside every cell (over a minute, or a swell at 110 % or below) are counted in `outside`. Ref: EN 50160:2010, 4.3.1 / 4.3.2 (tables as recalled: from memory).
 */
import { en50160EventCell, type EventTableReading } from '../limits/en50160-events.js';
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
	/** Events in no cell: longer than the last column (over one minute), or a swell at 110 % or below. */
	outside: number;
}

/** Table 5 and 6 as the report reads them: interruptions in the last dip row, events under 10 ms in the first column. */
const READING: EventTableReading = { interruptionRow: true, shortInFirstColumn: true };

/** Labels, one per band of lib/limits' EN 50160 tables (rows % of the declared voltage). */
const DIP_ROWS = ['90 > u ≥ 80', '80 > u ≥ 70', '70 > u ≥ 40', '40 > u ≥ 5', '5 > u'];
const DIP_COLUMNS = ['10-200 ms', '0.2-0.5 s', '0.5-1 s', '1-5 s', '5-60 s'];
const SWELL_ROWS = ['u ≥ 120', '120 > u > 110'];
const SWELL_COLUMNS = ['10-500 ms', '0.5-5 s', '5-60 s'];

function table(
	events: ReportEvent[],
	kind: 'dip' | 'swell',
	source: string,
	rows: string[],
	columns: string[],
): ReportEventTable {
	const counts = rows.map(() => columns.map(() => 0));
	let outside = 0;
	for (const e of events) {
		const cell = en50160EventCell(e, READING);
		if (cell && cell.table === kind) counts[cell.row][cell.column]++;
		else outside++;
	}
	return { source, rows, columns, counts, outside };
}

/** The dip/interruption table and the swell table of a list of events (each event in one cell). */
export function classifyEvents(events: ReportEvent[]): { dipTable: ReportEventTable; swellTable: ReportEventTable } {
	return {
		dipTable: table(
			events.filter((e) => e.kind !== 'swell'),
			'dip',
			'EN 50160:2010, Table 5',
			DIP_ROWS,
			DIP_COLUMNS,
		),
		swellTable: table(
			events.filter((e) => e.kind === 'swell'),
			'swell',
			'EN 50160:2010, Table 6',
			SWELL_ROWS,
			SWELL_COLUMNS,
		),
	};
}

/** "residual 40-70 %, 0.2-0.5 s": the cell an event falls in, or null when outside the table. */
export function eventCell(e: ReportEvent, t: ReportEventTable): string | null {
	const cell = en50160EventCell(e, READING);
	return cell ? `${t.rows[cell.row]} %, ${t.columns[cell.column]}` : null;
}
