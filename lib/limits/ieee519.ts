/**
 * IEEE 519 voltage (Table 1) and current (Tables 2–4) distortion limits at the PCC, as data.
 */
import type { Ieee519CurrentRow, Ieee519Table, Ieee519VoltageRow } from './types.js';

const T1 = 'IEEE 519-2014/2022, Table 1';
const T2 = 'IEEE 519-2014/2022, Table 2 (120 V–69 kV)';
const T3 = 'IEEE 519-2014, Table 3 (69–161 kV)';
const T4 = 'IEEE 519-2014, Table 4 (> 161 kV)';
// How each value was obtained (the standard is paywalled): Table 2's numbers were read in a power-quality
// textbook reprinting the 1992 table, with the 2014 band notation read in a secondary summary; Table 1's
// rows in secondary summaries; Tables 3 and 4 are from memory and need checking against the standard.
const READ = 'read in a secondary source' as const;
const MEMORY = 'from memory' as const;
const T1_NOTE = 'Table 1 rows read in published summaries of the 2014 revision, not in the standard itself';
const T2_NOTE =
	'Table 2 values read in a textbook reprint of the 1992 table (same numbers in 2014/2022); band notation from a summary of the 2014 revision';
const T34_NOTE = 'from memory of the 2014 standard; to be checked against a licensed copy';

const voltage: Ieee519VoltageRow[] = [
	{
		aboveV: 0,
		upToV: 1_000,
		individualPercent: 5.0,
		thdPercent: 8.0,
		source: `${T1}, V ≤ 1.0 kV (new in 2014)`,
		provenance: READ,
		provenanceNote: T1_NOTE,
	},
	{
		aboveV: 1_000,
		upToV: 69_000,
		individualPercent: 3.0,
		thdPercent: 5.0,
		source: `${T1}, 1 kV < V ≤ 69 kV`,
		provenance: READ,
		provenanceNote: T1_NOTE,
	},
	{
		aboveV: 69_000,
		upToV: 161_000,
		individualPercent: 1.5,
		thdPercent: 2.5,
		source: `${T1}, 69 kV < V ≤ 161 kV`,
		provenance: READ,
		provenanceNote: T1_NOTE,
	},
	{
		aboveV: 161_000,
		upToV: Infinity,
		individualPercent: 1.0,
		thdPercent: 1.5,
		source: `${T1}, V > 161 kV`,
		provenance: READ,
		provenanceNote: T1_NOTE,
	},
];

function cur(
	table: string,
	aboveV: number,
	upToV: number,
	from: number,
	below: number,
	bands: number[],
	tdd: number,
): Ieee519CurrentRow {
	const ratio =
		below === Infinity ? `I_SC/I_L ≥ ${from}` : from === 0 ? `I_SC/I_L < ${below}` : `${from} ≤ I_SC/I_L < ${below}`;
	const read = table === T2;
	return {
		table,
		aboveV,
		upToV,
		ratioFrom: from,
		ratioBelow: below,
		bandPercent: bands,
		tddPercent: tdd,
		source: `${table}, ${ratio}`,
		provenance: read ? READ : MEMORY,
		provenanceNote: read ? T2_NOTE : T34_NOTE,
	};
}

const current: Ieee519CurrentRow[] = [
	cur(T2, 0, 69_000, 0, 20, [4.0, 2.0, 1.5, 0.6, 0.3], 5.0),
	cur(T2, 0, 69_000, 20, 50, [7.0, 3.5, 2.5, 1.0, 0.5], 8.0),
	cur(T2, 0, 69_000, 50, 100, [10.0, 4.5, 4.0, 1.5, 0.7], 12.0),
	cur(T2, 0, 69_000, 100, 1000, [12.0, 5.5, 5.0, 2.0, 1.0], 15.0),
	cur(T2, 0, 69_000, 1000, Infinity, [15.0, 7.0, 6.0, 2.5, 1.4], 20.0),
	cur(T3, 69_000, 161_000, 0, 20, [2.0, 1.0, 0.75, 0.3, 0.15], 2.5),
	cur(T3, 69_000, 161_000, 20, 50, [3.5, 1.75, 1.25, 0.5, 0.25], 4.0),
	cur(T3, 69_000, 161_000, 50, 100, [5.0, 2.25, 2.0, 0.75, 0.35], 6.0),
	cur(T3, 69_000, 161_000, 100, 1000, [6.0, 2.75, 2.5, 1.0, 0.5], 7.5),
	cur(T3, 69_000, 161_000, 1000, Infinity, [7.5, 3.5, 3.0, 1.25, 0.7], 10.0),
	cur(T4, 161_000, Infinity, 0, 25, [1.0, 0.5, 0.38, 0.15, 0.1], 1.5),
	cur(T4, 161_000, Infinity, 25, 50, [2.0, 1.0, 0.75, 0.3, 0.15], 2.5),
	cur(T4, 161_000, Infinity, 50, Infinity, [3.0, 1.5, 1.15, 0.45, 0.22], 3.75),
];

/**
 * IEEE 519 harmonic limits at the point of common coupling: voltage by bus voltage (Table 1, each
 * order 2…50 and THD to 50, % of the fundamental) and current by I_SC/I_L (Tables 2–4, % of the
 * maximum demand current I_L, odd-order bands, TDD to 50), with the even-harmonic rule of the 2014 or
 * 2022 edition.
 * Ref: IEEE Std 519-2014 and 519-2022, Tables 1–4 and their notes (provenance per row: Tables 1–2 and
 * the even-harmonic rules read in secondary sources, Tables 3–4 from memory).
 */
export const IEEE519_TABLE: Ieee519Table = {
	kind: 'ieee519',
	id: 'ieee519',
	name: 'IEEE 519 harmonic limits at the PCC',
	source: 'IEEE Std 519-2014 / 519-2022, Tables 1–4',
	provenance: 'per row',
	provenanceNote:
		'Tables 1–2 and the 2014 and 2022 even-harmonic rules read in secondary sources; Tables 3–4 from memory',
	assessment:
		'voltage: weekly 95th percentile of 10-minute values ≤ Table 1, daily 99th percentile of 3-s values ≤ 1.5 × Table 1; current: weekly 99th percentile of 10-minute values ≤ 1.5 × Table 2 and 95th ≤ Table 2, daily 99th percentile of 3-s values ≤ 2 × Table 2 (from memory)',
	voltage,
	voltageMaxOrder: 50,
	currentBands: [
		{ fromOrder: 2, toOrder: 10 },
		{ fromOrder: 11, toOrder: 16 },
		{ fromOrder: 17, toOrder: 22 },
		{ fromOrder: 23, toOrder: 34 },
		{ fromOrder: 35, toOrder: 50 },
	],
	current,
	evenRules: [
		{
			edition: '2014',
			steps: [{ upToOrder: 50, factor: 0.25 }],
			text: 'even harmonics are limited to 25 % of the odd harmonic limits',
			provenance: READ,
			provenanceNote: 'note to Table 2 read in a textbook reprint of the 1992 table (kept in 2014)',
		},
		{
			edition: '2022',
			steps: [
				{ upToOrder: 6, factor: 0.5 },
				{ upToOrder: 50, factor: 1 },
			],
			text: 'even harmonics h ≤ 6 are limited to 50 % and h > 6 to 100 % of the odd limits',
			provenance: READ,
			provenanceNote: 'read in a published summary of the 2022 revision',
		},
	],
	currentMaxOrder: 50,
	notes: [
		'All power-generation equipment is limited to the I_SC/I_L < 20 row whatever its actual ratio.',
		'Current distortion that results in a DC offset (e.g. half-wave converters) is not allowed.',
		'I_L is the maximum demand load current (fundamental) at the PCC: the average of the 12 previous monthly maximum demands.',
		'Table 2 covers 120 V to 69 kV; Tables 3 and 4 cover higher bus voltages.',
	],
};
