/**
 * The one classification of voltage dips, interruptions and swells by residual (or highest) voltage and
 * duration, each event in at most one cell, used by the analysis report and the survey.
 *
 * EN 50160:2010 Table 5 (dips and short interruptions): rows by residual voltage u, % of the declared
 * voltage: 90 > u ≥ 80, 80 > u ≥ 70, 70 > u ≥ 40, 40 > u ≥ 5, and 5 > u (the interruption row);
 * columns by duration t: 10 ms ≤ t ≤ 200 ms, 200 ms < t ≤ 500 ms, 500 ms < t ≤ 1 s, 1 s < t ≤ 5 s,
 * 5 s < t ≤ 1 min. EN 50160:2010 Table 6 (swells): rows u ≥ 120 and 120 > u > 110; columns
 * 10 ms ≤ t ≤ 500 ms, 500 ms < t ≤ 5 s, 5 s < t ≤ 1 min. Residual voltage and duration as measured by
 * IEC 61000-4-30 (Urms(1/2), 5.4) and the classification as in IEC TR 61000-2-8.
 * Ref: EN 50160:2010, 4.3.1, 4.3.2, 5.3.1, Tables 5 and 6; IEC 61000-4-30:2015, 5.4 (tables and clauses
 * as recalled: from memory).
 */

/** Residual-voltage band edges of Table 5, % of the declared voltage; below the last one: the interruption row. */
export const DIP_RESIDUAL_EDGES_PERCENT = [90, 80, 70, 40, 5] as const;
/** Duration band edges of Table 5, ms: 10-200, 200-500, 500-1000, 1000-5000, 5000-60000 (upper edge inclusive). */
export const DIP_DURATION_EDGES_MS = [10, 200, 500, 1000, 5000, 60_000] as const;
/** Level band edges of Table 6, %: u ≥ 120, then 120 > u > 110. */
export const SWELL_LEVEL_EDGES_PERCENT = [120, 110] as const;
/** Duration band edges of Table 6, ms: 10-500, 500-5000, 5000-60000. */
export const SWELL_DURATION_EDGES_MS = [10, 500, 5000, 60_000] as const;
/** Interruptions up to 3 minutes are short, longer ones long (EN 50160:2010, 3.x definitions; from memory). */
export const SHORT_INTERRUPTION_MAX_S = 180;

/** How the caller reads the table's edges. */
export interface EventTableReading {
	/**
	 * Count dips with u < 5 % (interruptions) in Table 5's last row (the report); without it they are left
	 * to the interruption counts (the survey) and fall outside the dip table.
	 */
	interruptionRow?: boolean;
	/**
	 * Count events shorter than 10 ms in the first column (the report: one half cycle at 60 Hz is 8.3 ms);
	 * without it they fall outside the table, as the table's first edge says (the survey).
	 */
	shortInFirstColumn?: boolean;
}

/** Table 5 row of residual voltage u (%): 0 for 90 > u ≥ 80 … 3 for 40 > u ≥ 5, 4 for u < 5 (interruption); −1 for u ≥ 90. */
export function dipRow(percentOfDeclared: number): number {
	const r = DIP_RESIDUAL_EDGES_PERCENT;
	const u = percentOfDeclared;
	if (!(u < r[0])) return -1;
	for (let k = 1; k < r.length; k++) if (u >= r[k]) return k - 1;
	return r.length - 1;
}

/** Table 6 row of the highest voltage u (%): 0 for u ≥ 120, 1 for 120 > u > 110, −1 otherwise. */
export function swellRow(percentOfDeclared: number): number {
	const [high, low] = SWELL_LEVEL_EDGES_PERCENT;
	const u = percentOfDeclared;
	return u >= high ? 0 : u > low ? 1 : -1;
}

/** Column of a duration between duration edges (ms, upper edge inclusive); −1 past the last edge or before the first. */
export function durationColumn(durationS: number, edgesMs: readonly number[], shortInFirstColumn = false): number {
	const ms = durationS * 1000;
	if (ms < edgesMs[0] && !shortInFirstColumn) return -1;
	for (let c = 1; c < edgesMs.length; c++) if (ms <= edgesMs[c]) return c - 1;
	return -1;
}

/** The event a table is filled from. */
export interface ClassifiedEvent {
	kind: 'dip' | 'swell' | 'interruption';
	/** Residual voltage (dip, interruption) or highest voltage (swell), % of the declared voltage. */
	percentOfDeclared: number;
	durationS: number;
}

/**
 * The table (5 for dips and interruptions, 6 for swells) and cell of one event, or null when it falls
 * outside every cell (or is an interruption and `reading.interruptionRow` is off).
 * @example en50160EventCell({ kind: 'dip', percentOfDeclared: 55, durationS: 0.12 }) // { table: 'dip', row: 2, column: 0 }
 */
export function en50160EventCell(
	e: ClassifiedEvent,
	reading: EventTableReading = {},
): { table: 'dip' | 'swell'; row: number; column: number } | null {
	const swell = e.kind === 'swell';
	if (e.kind === 'interruption' && !reading.interruptionRow) return null;
	let row = swell ? swellRow(e.percentOfDeclared) : dipRow(e.percentOfDeclared);
	if (!swell && row === DIP_RESIDUAL_EDGES_PERCENT.length - 1 && !reading.interruptionRow) row = -1;
	const edges = swell ? SWELL_DURATION_EDGES_MS : DIP_DURATION_EDGES_MS;
	const column = durationColumn(e.durationS, edges, reading.shortInFirstColumn);
	return row < 0 || column < 0 ? null : { table: swell ? 'swell' : 'dip', row, column };
}
