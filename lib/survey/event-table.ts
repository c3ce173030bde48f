/**
 * Dips and swells counted once each in a residual-voltage (maximum-voltage) x duration table, and
 * interruptions by duration, in the classification of EN 50160:2010 (Tables 5 and 6; from memory,
 * docs/methods.md §4.1), which follows IEC TR 61000-2-8: the one classification in
 * lib/limits/en50160-events.ts, read with the table's 10 ms first edge and without the interruption row.
 */
import {
	DIP_DURATION_EDGES_MS,
	DIP_RESIDUAL_EDGES_PERCENT,
	en50160EventCell,
	SHORT_INTERRUPTION_MAX_S,
	SWELL_DURATION_EDGES_MS,
	SWELL_LEVEL_EDGES_PERCENT,
	type EventTableReading,
} from '../limits/en50160-events.js';
import type { SurveyEvent, SurveyEventTable } from './types.js';

// The band edges live with the one classification in lib/limits; re-exported for the survey's callers.
export { DIP_DURATION_EDGES_MS, DIP_RESIDUAL_EDGES_PERCENT, SHORT_INTERRUPTION_MAX_S, SWELL_DURATION_EDGES_MS };

/** Table 5 and 6 as the survey reads them: interruptions counted on their own, the 10 ms first edge kept. */
const READING: EventTableReading = { interruptionRow: false, shortInFirstColumn: false };

function durationLabels(edgesMs: readonly number[]): string[] {
	const fmt = (ms: number) => (ms < 1000 ? `${ms} ms` : `${ms / 1000} s`);
	return edgesMs.slice(1).map((hi, i) => `${i === 0 ? '' : '> '}${fmt(edgesMs[i])} to ${fmt(hi)}`);
}

function countCells(
	events: readonly SurveyEvent[],
	kind: 'dip' | 'swell',
	rows: string[],
	columns: string[],
): { counts: number[][]; outside: number } {
	const counts = rows.map(() => columns.map(() => 0));
	let outside = 0;
	for (const e of events) {
		if (e.kind !== kind) continue;
		const cell = en50160EventCell(e, READING);
		if (cell) counts[cell.row][cell.column]++;
		else outside++;
	}
	return { counts, outside };
}

/** Dip table: rows by residual voltage (% of Udin), columns by duration; interruptions are not dips here. */
export function dipTable(events: readonly SurveyEvent[]): SurveyEventTable {
	const r = DIP_RESIDUAL_EDGES_PERCENT;
	const rows = r.slice(1).map((lo, i) => `${r[i]} % > u ≥ ${lo} %`);
	const columns = durationLabels(DIP_DURATION_EDGES_MS);
	const { counts, outside } = countCells(events, 'dip', rows, columns);
	return { kind: 'dip', rows, columns, counts, outside, source: 'EN 50160:2010, Table 5 (classification of dips)' };
}

/** Swell table: rows u ≥ 120 % and 120 % > u > 110 %, columns by duration. */
export function swellTable(events: readonly SurveyEvent[]): SurveyEventTable {
	const [high, low] = SWELL_LEVEL_EDGES_PERCENT;
	const rows = [`u ≥ ${high} %`, `${high} % > u > ${low} %`];
	const columns = durationLabels(SWELL_DURATION_EDGES_MS);
	const { counts, outside } = countCells(events, 'swell', rows, columns);
	return { kind: 'swell', rows, columns, counts, outside, source: 'EN 50160:2010, Table 6 (classification of swells)' };
}

/** Interruptions counted short (≤ 3 min) and long. */
export function interruptionCounts(events: readonly SurveyEvent[]): { short: number; long: number; source: string } {
	let short = 0;
	let long = 0;
	for (const e of events) {
		if (e.kind !== 'interruption') continue;
		if (e.durationS <= SHORT_INTERRUPTION_MAX_S) short++;
		else long++;
	}
	return { short, long, source: 'EN 50160:2010, 4.3.2 and 4.3.3 (short and long interruptions)' };
}
