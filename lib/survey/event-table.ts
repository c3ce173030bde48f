/**
 * Dips and swells counted once each in a residual-voltage (maximum-voltage) x duration table, and
 * interruptions by duration, in the classification of EN 50160:2010 (Tables 5 and 6; from memory,
 * docs/methods.md §4.1), which follows IEC TR 61000-2-8 and UNIPEDE practice.
 */
import type { SurveyEvent, SurveyEventTable } from './types.js';

/** Duration band edges of the dip table, ms: 10-200, 200-500, 500-1000, 1000-5000, 5000-60000 (upper edge inclusive). */
export const DIP_DURATION_EDGES_MS = [10, 200, 500, 1000, 5000, 60_000] as const;
/** Residual-voltage bands of the dip table, % of the declared voltage: 90 > u ≥ 80, ..., 40 > u ≥ 5. */
export const DIP_RESIDUAL_EDGES_PERCENT = [90, 80, 70, 40, 5] as const;
/** Duration band edges of the swell table, ms: 10-500, 500-5000, 5000-60000. */
export const SWELL_DURATION_EDGES_MS = [10, 500, 5000, 60_000] as const;
/** Interruptions up to 3 minutes are short, longer ones long (EN 50160:2010, 3.x definitions; from memory). */
export const SHORT_INTERRUPTION_MAX_S = 180;

function durationColumn(durationS: number, edgesMs: readonly number[]): number {
	const ms = durationS * 1000;
	if (ms < edgesMs[0]) return -1;
	for (let c = 1; c < edgesMs.length; c++) if (ms <= edgesMs[c]) return c - 1;
	return -1;
}

function durationLabels(edgesMs: readonly number[]): string[] {
	const fmt = (ms: number) => (ms < 1000 ? `${ms} ms` : `${ms / 1000} s`);
	return edgesMs.slice(1).map((hi, i) => `${i === 0 ? '' : '> '}${fmt(edgesMs[i])} to ${fmt(hi)}`);
}

/** Dip table: rows by residual voltage (% of Udin), columns by duration; interruptions are not dips here. */
export function dipTable(events: readonly SurveyEvent[]): SurveyEventTable {
	const r = DIP_RESIDUAL_EDGES_PERCENT;
	const rows = r.slice(1).map((lo, i) => `${r[i]} % > u ≥ ${lo} %`);
	const columns = durationLabels(DIP_DURATION_EDGES_MS);
	const counts = rows.map(() => columns.map(() => 0));
	let outside = 0;
	for (const e of events) {
		if (e.kind !== 'dip') continue;
		const col = durationColumn(e.durationS, DIP_DURATION_EDGES_MS);
		const row = r.slice(1).findIndex((lo, i) => e.percentOfDeclared < r[i] && e.percentOfDeclared >= lo);
		if (row < 0 || col < 0) outside++;
		else counts[row][col]++;
	}
	return { kind: 'dip', rows, columns, counts, outside, source: 'EN 50160:2010, Table 5 (classification of dips)' };
}

/** Swell table: rows u ≥ 120 % and 120 % > u > 110 %, columns by duration. */
export function swellTable(events: readonly SurveyEvent[]): SurveyEventTable {
	const rows = ['u ≥ 120 %', '120 % > u > 110 %'];
	const columns = durationLabels(SWELL_DURATION_EDGES_MS);
	const counts = rows.map(() => columns.map(() => 0));
	let outside = 0;
	for (const e of events) {
		if (e.kind !== 'swell') continue;
		const col = durationColumn(e.durationS, SWELL_DURATION_EDGES_MS);
		const u = e.percentOfDeclared;
		const row = u >= 120 ? 0 : u > 110 ? 1 : -1;
		if (row < 0 || col < 0) outside++;
		else counts[row][col]++;
	}
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
