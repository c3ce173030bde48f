/**
 * IEC 61000-2-2 compatibility levels for individual harmonic voltages in public LV networks, as data.
 */
import type { LimitRow, OrderLimitTable } from './types.js';

const TABLE = 'IEC 61000-2-2:2002+A1:2017+A2:2018, Table 1';
// No readable copy of Table 1 was found: the values and formulas are from memory of the standard and
// must be checked against a licensed copy before they are relied on.
const MEMORY = 'from memory' as const;
const NOTE = 'from memory of the standard; to be checked against a licensed copy';

/**
 * Compatibility level of order h (2…50), % of the fundamental, from Table 1's values and formulas:
 * odd non-triplen 17 ≤ h ≤ 49: 2.27·(17/h) − 0.27; triplen 21 < h ≤ 45: 0.2; even 10 ≤ h ≤ 50: 0.25·(10/h) + 0.25.
 */
function level(h: number): { value: number; how: string } | undefined {
	const fixed: Record<number, number> = {
		2: 2,
		3: 5,
		4: 1,
		5: 6,
		6: 0.5,
		7: 5,
		8: 0.5,
		9: 1.5,
		11: 3.5,
		13: 3,
		15: 0.4,
		21: 0.3,
	};
	if (fixed[h] !== undefined) return { value: fixed[h], how: 'tabulated value' };
	if (h % 2 === 0 && h >= 10 && h <= 50)
		return { value: 0.25 * (10 / h) + 0.25, how: 'even 10 ≤ h ≤ 50: 0.25·(10/h) + 0.25' };
	if (h % 3 === 0 && h % 2 === 1 && h > 21 && h <= 45) return { value: 0.2, how: 'triplen 21 < h ≤ 45: 0.2' };
	if (h % 2 === 1 && h % 3 !== 0 && h >= 17 && h <= 49)
		return { value: 2.27 * (17 / h) - 0.27, how: 'odd non-triplen 17 ≤ h ≤ 49: 2.27·(17/h) − 0.27' };
	return undefined;
}

const rows: LimitRow[] = [];
for (let h = 2; h <= 50; h++) {
	const l = level(h);
	if (l)
		rows.push({
			order: h,
			limitPercent: l.value,
			source: `${TABLE}, h = ${h}, ${l.how}`,
			provenance: MEMORY,
			provenanceNote: NOTE,
		});
}

/**
 * IEC 61000-2-2 compatibility levels (the disturbance level equipment is designed to tolerate, not a
 * supply guarantee); individual orders in % of the fundamental; THD 8 %.
 * Ref: IEC 61000-2-2:2002 Table 1 and A1/A2 (from memory).
 */
export const IEC61000_2_2_TABLE: OrderLimitTable = {
	kind: 'per-order',
	id: 'iec61000-2-2',
	name: 'IEC 61000-2-2 compatibility levels, public LV networks',
	source: TABLE,
	provenance: MEMORY,
	provenanceNote: NOTE,
	quantity: 'voltage',
	basis: '% of the fundamental voltage',
	assessment: 'compatibility levels: not to be exceeded for 95 % of the time (statistical, long-term; from memory)',
	rows,
	total: {
		name: 'THD',
		limitPercent: 8,
		maxOrder: 40,
		source: 'IEC 61000-2-2:2002+A1:2017, THD compatibility level 8 % (orders to 40 in Ed.2; A1:2017 extends to 50)',
		provenance: MEMORY,
		provenanceNote: NOTE,
	},
	notes: [
		'Orders 15 and 21 differ from EN 50160 (0.4 % and 0.3 % here, 0.5 % there); 19, 23 and 25 follow the formula (1.76, 1.41, 1.27 %).',
		'Triplen orders above 45 and odd orders above 49 have no level in the table.',
	],
};
