/**
 * One evaluator for every limit table: measured value, limit, margin and pass/fail per order and for
 * the total (THD or TDD).
 */
import { EN50160_TABLE } from './en50160.js';
import { IEC61000_2_2_TABLE } from './iec61000-2-2.js';
import { IEEE519_TABLE } from './ieee519.js';
import type {
	Ieee519Table,
	LimitCheck,
	LimitEvaluation,
	LimitInput,
	LimitRow,
	LimitTable,
	LimitTableId,
	TotalLimit,
} from './types.js';

/** Every table by id. */
export const LIMIT_TABLES: Record<LimitTableId, LimitTable> = {
	en50160: EN50160_TABLE,
	'iec61000-2-2': IEC61000_2_2_TABLE,
	ieee519: IEEE519_TABLE,
};

/** Why a single capture cannot show compliance; part of every evaluation. */
export const ONE_OFF_CAPTURE_NOTE =
	'A single capture is not a compliance measurement: these limits apply to statistics (percentiles of 10-minute and 3-second values) over a week or longer, measured with a Class A instrument. This comparison only shows how this capture sits against the limit values.';

/** The limit rows and total that apply to this input (IEEE 519 picks its row by bus voltage and I_SC/I_L). */
function resolve(
	table: LimitTable,
	input: LimitInput,
): { rows: LimitRow[]; total: TotalLimit; selection: string; quantity: 'voltage' | 'current'; basis: string } {
	if (table.kind === 'per-order') {
		return {
			rows: table.rows,
			total: table.total,
			selection: 'all orders of the table',
			quantity: 'voltage',
			basis: table.basis,
		};
	}
	return resolveIeee519(table, input);
}

function resolveIeee519(t: Ieee519Table, input: LimitInput) {
	const quantity = input.quantity ?? (input.percentOfIl ? 'current' : 'voltage');
	const v = input.busVoltageV;
	if (!(v !== undefined && v > 0 && Number.isFinite(v)))
		throw new RangeError('IEEE 519 needs busVoltageV, the nominal bus voltage at the PCC in V');
	if (quantity === 'voltage') {
		const row = t.voltage.find((r) => v > r.aboveV && v <= r.upToV)!;
		const rows: LimitRow[] = [];
		for (let h = 2; h <= t.voltageMaxOrder; h++)
			rows.push({
				order: h,
				limitPercent: row.individualPercent,
				source: `${row.source}, individual harmonic`,
				provenance: row.provenance,
				provenanceNote: row.provenanceNote,
			});
		return {
			rows,
			total: {
				name: 'THD' as const,
				limitPercent: row.thdPercent,
				maxOrder: t.voltageMaxOrder,
				source: `${row.source}, THD`,
				provenance: row.provenance,
				provenanceNote: row.provenanceNote,
			},
			selection: `Table 1 row for a ${v} V bus`,
			quantity,
			basis: '% of the fundamental voltage',
		};
	}
	const ratio = input.iscIlRatio;
	if (!(ratio !== undefined && ratio > 0 && Number.isFinite(ratio)))
		throw new RangeError('IEEE 519 current limits need iscIlRatio, I_SC/I_L at the PCC');
	const edition = input.edition ?? '2022';
	const row = t.current.find((r) => v > r.aboveV && v <= r.upToV && ratio >= r.ratioFrom && ratio < r.ratioBelow)!;
	const rule = t.evenRules.find((r) => r.edition === edition)!;
	const rows: LimitRow[] = [];
	for (let h = 2; h <= t.currentMaxOrder; h++) {
		const band = t.currentBands.findIndex((b) => h >= b.fromOrder && h <= b.toOrder);
		const odd = row.bandPercent[band];
		const b = t.currentBands[band];
		if (h % 2 === 1) {
			rows.push({
				order: h,
				limitPercent: odd,
				source: `${row.source}, ${b.fromOrder === 2 ? 3 : b.fromOrder} ≤ h ≤ ${b.toOrder}`,
				provenance: row.provenance,
				provenanceNote: row.provenanceNote,
			});
		} else {
			const factor = rule.steps.find((s) => h <= s.upToOrder)!.factor;
			rows.push({
				order: h,
				limitPercent: odd * factor,
				source: `${row.source}, even h: ${factor * 100} % of the odd limit ${odd} % (${edition} rule: ${rule.text})`,
				provenance:
					row.provenance === 'from memory' || rule.provenance === 'from memory'
						? 'from memory'
						: 'read in a secondary source',
				provenanceNote: `${row.provenanceNote}; even rule: ${rule.provenanceNote}`,
			});
		}
	}
	return {
		rows,
		total: {
			name: 'TDD' as const,
			limitPercent: row.tddPercent,
			maxOrder: t.currentMaxOrder,
			source: `${row.source}, TDD`,
			provenance: row.provenance,
			provenanceNote: row.provenanceNote,
		},
		selection: `${row.source}; ${v} V bus; ${edition} even-harmonic rule`,
		quantity,
		basis: '% of the maximum demand load current I_L',
	};
}

function check(
	label: string,
	order: number | null,
	measured: number | undefined,
	limit: number,
	row: Pick<LimitRow, 'source' | 'provenance' | 'provenanceNote'>,
): LimitCheck {
	const { source, provenance, provenanceNote } = row;
	const m = measured === undefined ? NaN : measured;
	const ok = Number.isFinite(m);
	return {
		label,
		order,
		measuredPercent: m,
		limitPercent: limit,
		marginPercent: ok ? limit - m : NaN,
		pass: ok ? m <= limit : null,
		source,
		provenance,
		provenanceNote,
	};
}

/**
 * Compares a capture's harmonics with a limit table: per order and for the total (THD for voltage,
 * TDD for IEEE 519 currents), measured %, limit %, margin (limit − measured, percentage points) and
 * pass (measured ≤ limit), each with the row's source. The total is computed from the per-order values
 * up to the table's order (40 or 50) when not given. Every evaluation carries `complianceNote`.
 *
 * @param table  a table id ('en50160', 'iec61000-2-2', 'ieee519') or a LimitTable
 * @param input  percentOfFundamental (+ thdPercent) for voltage; for IEEE 519 also busVoltageV, and for
 *   currents percentOfIl (+ tddPercent), iscIlRatio and edition
 * @throws RangeError for an unknown id or a missing IEEE 519 parameter
 * @example
 * evaluateLimits('en50160', { percentOfFundamental: window.percentOfFundamental }).checks[3]
 * // { label: 'h5', measuredPercent: 4.2, limitPercent: 6, marginPercent: 1.8, pass: true, … }
 */
export function evaluateLimits(table: LimitTableId | LimitTable, input: LimitInput): LimitEvaluation {
	const t = typeof table === 'string' ? LIMIT_TABLES[table] : table;
	if (!t)
		throw new RangeError(`unknown limit table '${String(table)}'; known: ${Object.keys(LIMIT_TABLES).join(', ')}`);
	const r = resolve(t, input);
	const values = r.quantity === 'current' ? input.percentOfIl : input.percentOfFundamental;
	const checks = r.rows.map((row) => check(`h${row.order}`, row.order, values?.[row.order], row.limitPercent, row));
	let measuredTotal = r.quantity === 'current' ? input.tddPercent : input.thdPercent;
	const notes = [...t.notes];
	if (measuredTotal === undefined && values && values.length > r.total.maxOrder) {
		let s = 0;
		for (let h = 2; h <= r.total.maxOrder; h++) s += values[h] * values[h];
		measuredTotal = Math.sqrt(s);
		notes.push(`${r.total.name} computed from the per-order values, orders 2…${r.total.maxOrder}.`);
	}
	const total = check(r.total.name, null, measuredTotal, r.total.limitPercent, r.total);
	const all = [...checks, total];
	const failedCount = all.filter((c) => c.pass === false).length;
	const measured = all.filter((c) => c.pass !== null).length;
	return {
		tableId: t.id,
		tableName: t.name,
		source: t.source,
		selection: r.selection,
		quantity: r.quantity,
		basis: r.basis,
		checks,
		total,
		pass: failedCount > 0 ? false : measured > 0 ? true : null,
		failedCount,
		notes,
		complianceNote: ONE_OFF_CAPTURE_NOTE,
	};
}
