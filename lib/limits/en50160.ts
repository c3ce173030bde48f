/**
 * EN 50160:2010, low-voltage supply: individual harmonic voltages up to order 25 and THD, as data.
 */
import type { LimitRow, OrderLimitTable } from './types.js';

const TABLE = 'EN 50160:2010, Table 1 (LV)';
// The standard is paywalled: the values were read in a secondary source that reprints Table 1 and
// clause 4.2.8, not in the standard itself.
const READ = 'read in a secondary source' as const;
const NOTE = 'Table 1 values read in a published reprint, not in the standard itself';

const values: [number, number][] = [
	[2, 2.0],
	[3, 5.0],
	[4, 1.0],
	[5, 6.0],
	[6, 0.5],
	[7, 5.0],
	[8, 0.5],
	[9, 1.5],
	[10, 0.5],
	[11, 3.5],
	[12, 0.5],
	[13, 3.0],
	[14, 0.5],
	[15, 0.5],
	[16, 0.5],
	[17, 2.0],
	[18, 0.5],
	[19, 1.5],
	[20, 0.5],
	[21, 0.5],
	[22, 0.5],
	[23, 1.5],
	[24, 0.5],
	[25, 1.5],
];

function rowSource(h: number): string {
	const group =
		h % 2 === 0
			? h >= 6
				? 'even orders 6…24'
				: 'even orders'
			: h % 3 === 0
				? 'odd multiples of 3'
				: 'odd orders not multiples of 3';
	return `${TABLE}, ${group}, h = ${h}`;
}

const rows: LimitRow[] = values.map(([order, limitPercent]) => ({
	order,
	limitPercent,
	source: rowSource(order),
	provenance: READ,
	provenanceNote: NOTE,
}));

/**
 * EN 50160 voltage characteristics of public LV supply: harmonic voltages in % of the fundamental,
 * 10-minute mean RMS values to be met for 95 % of each week; THD (orders 2…40) ≤ 8 %.
 * Ref: EN 50160:2010, 4.2.8 and Table 1 (read in a secondary source that reprints them).
 */
export const EN50160_TABLE: OrderLimitTable = {
	kind: 'per-order',
	id: 'en50160',
	name: 'EN 50160 supply voltage harmonics (LV)',
	source: TABLE,
	provenance: READ,
	provenanceNote: NOTE,
	quantity: 'voltage',
	basis: '% of the fundamental voltage',
	assessment: '10-minute mean RMS of each harmonic, ≤ limit for 95 % of the 10-minute intervals of each week',
	rows,
	total: {
		name: 'THD',
		limitPercent: 8,
		maxOrder: 40,
		source: 'EN 50160:2010, 4.2.8: THD including orders up to 40 ≤ 8 %',
		provenance: READ,
		provenanceNote: 'clause 4.2.8 read in a published summary, not in the standard itself',
	},
	notes: [
		'No values are given above order 25: those harmonics are usually small but unpredictable because of resonances.',
		'The MV table is the same; the 3rd-harmonic value can be much lower depending on network design.',
	],
};
