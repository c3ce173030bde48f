/**
 * Flicker and voltage-change limits as data, each with its source, and their evaluator. Kept apart from
 * the per-order harmonic tables: these limit a few single figures (Pst, Plt, dc, dmax, Tmax).
 */
import { ONE_OFF_CAPTURE_NOTE } from './evaluate.js';
import type { LimitProvenance } from './types.js';
import { maxOf } from '../signal/extremes.js';

export type FlickerLimitTableId = 'en50160' | 'iec61000-2-2' | 'iec61000-3-3';
export type FlickerFigure = 'Pst' | 'Plt' | 'dc' | 'dmax' | 'Tmax';

export interface FlickerLimitRow {
	figure: FlickerFigure;
	/** Dimensionless for Pst/Plt, % of Un for dc/dmax, s for Tmax. */
	limit: number;
	/** Which statistic of the measured values is compared: the highest, or the level 95 % of them stay at or under. */
	statistic: 'highest' | '95 % of values';
	source: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

export interface FlickerLimitTable {
	id: FlickerLimitTableId;
	name: string;
	/** 'supply': voltage characteristics / compatibility levels; 'equipment': a type test of one appliance. */
	context: 'supply' | 'equipment';
	rows: FlickerLimitRow[];
	notes: string[];
}

const MEMORY = 'from memory' as const;

export const FLICKER_LIMIT_TABLES: Readonly<Record<FlickerLimitTableId, FlickerLimitTable>> = {
	en50160: {
		id: 'en50160',
		name: 'EN 50160 flicker severity (LV and MV supply)',
		context: 'supply',
		rows: [
			{
				figure: 'Plt',
				limit: 1,
				statistic: '95 % of values',
				source: 'EN 50160:2010, 4.2.7: Plt ≤ 1 for 95 % of the time of each week',
				provenance: 'read in a secondary source',
				provenanceNote: 'read in a published summary of the standard, not in the standard itself',
			},
		],
		notes: ['EN 50160 judges the 2-hour Plt values of a whole week.'],
	},
	'iec61000-2-2': {
		id: 'iec61000-2-2',
		name: 'IEC 61000-2-2 compatibility levels for flicker (public LV networks)',
		context: 'supply',
		rows: [
			{
				figure: 'Pst',
				limit: 1,
				statistic: '95 % of values',
				source: 'IEC 61000-2-2:2002, 4.1: compatibility level Pst = 1.0',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
			{
				figure: 'Plt',
				limit: 0.8,
				statistic: '95 % of values',
				source: 'IEC 61000-2-2:2002, 4.1: compatibility level Plt = 0.8',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
		],
		notes: [
			'Compatibility levels are planning figures for the network, exceeded with a small probability; they are not limits for one site.',
		],
	},
	'iec61000-3-3': {
		id: 'iec61000-3-3',
		name: 'IEC 61000-3-3 voltage changes and flicker from one appliance (≤ 16 A per phase)',
		context: 'equipment',
		rows: [
			{
				figure: 'Pst',
				limit: 1,
				statistic: 'highest',
				source: 'IEC 61000-3-3:2013, 5.2: Pst ≤ 1.0',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
			{
				figure: 'Plt',
				limit: 0.65,
				statistic: 'highest',
				source: 'IEC 61000-3-3:2013, 5.2: Plt ≤ 0.65',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
			{
				figure: 'dc',
				limit: 3.3,
				statistic: 'highest',
				source: 'IEC 61000-3-3:2013, 5.2: dc ≤ 3.3 %',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
			{
				figure: 'dmax',
				limit: 4,
				statistic: 'highest',
				source:
					'IEC 61000-3-3:2013, 5.2 a): dmax ≤ 4 % without further conditions (6 % or 7 % for some switching conditions)',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
			{
				figure: 'Tmax',
				limit: 0.5,
				statistic: 'highest',
				source: 'IEC 61000-3-3:2013, 5.2: d(t) beyond 3.3 % for at most 500 ms per change',
				provenance: MEMORY,
				provenanceNote: 'recollection of the standard; check against the text',
			},
		],
		notes: [
			"These are type-test limits for one appliance on the standard's reference impedance, not supply limits: a site recording compares with them only as a rough guide.",
		],
	},
};

/** Measured figures: every value of the record (the evaluator takes the statistic each row asks for). */
export interface FlickerMeasured {
	pst?: readonly number[];
	plt?: readonly number[];
	/** dc per voltage change, % of Un (NaN for unfinished changes is skipped). */
	dcPercent?: readonly number[];
	dmaxPercent?: readonly number[];
	tmaxS?: readonly number[];
}

export interface FlickerLimitCheck extends FlickerLimitRow {
	/** The statistic of the measured values; NaN when none. */
	measured: number;
	/** How many values the statistic came from. */
	count: number;
	/** measured ≤ limit; null when nothing was measured. */
	pass: boolean | null;
}

export interface FlickerLimitEvaluation {
	tableId: FlickerLimitTableId;
	tableName: string;
	context: 'supply' | 'equipment';
	checks: FlickerLimitCheck[];
	pass: boolean | null;
	notes: string[];
	complianceNote: string;
}

/** The level that `fraction` of the values stay at or under (nearest rank; common practice). NaN for none. */
export function levelNotExceeded(values: readonly number[], fraction: number): number {
	const v = values.filter(Number.isFinite).sort((a, b) => a - b);
	if (v.length === 0) return NaN;
	return v[Math.min(v.length - 1, Math.max(0, Math.ceil(fraction * v.length) - 1))];
}

const KEY: Record<FlickerFigure, keyof FlickerMeasured> = {
	Pst: 'pst',
	Plt: 'plt',
	dc: 'dcPercent',
	dmax: 'dmaxPercent',
	Tmax: 'tmaxS',
};

/**
 * Compares measured flicker figures with one table: per row, the highest value or the level 95 % of the
 * values stay at or under (nearest rank), against the limit. Every evaluation carries the one-off
 * capture caution.
 * @example evaluateFlickerLimits('en50160', { plt: [0.4, 0.6] }).checks[0] // { figure: 'Plt', measured: 0.6, limit: 1, pass: true, … }
 */
export function evaluateFlickerLimits(id: FlickerLimitTableId, measured: FlickerMeasured): FlickerLimitEvaluation {
	const t = FLICKER_LIMIT_TABLES[id];
	if (!t)
		throw new RangeError(
			`unknown flicker limit table '${String(id)}'; known: ${Object.keys(FLICKER_LIMIT_TABLES).join(', ')}`,
		);
	const checks = t.rows.map((row): FlickerLimitCheck => {
		const values = (measured[KEY[row.figure]] ?? []).filter(Number.isFinite);
		const m = row.statistic === 'highest' ? (values.length ? maxOf(values) : NaN) : levelNotExceeded(values, 0.95);
		return { ...row, measured: m, count: values.length, pass: Number.isFinite(m) ? m <= row.limit : null };
	});
	const judged = checks.filter((c) => c.pass !== null);
	return {
		tableId: t.id,
		tableName: t.name,
		context: t.context,
		checks,
		pass: judged.length === 0 ? null : judged.every((c) => c.pass),
		notes: t.notes,
		complianceNote: ONE_OFF_CAPTURE_NOTE,
	};
}
