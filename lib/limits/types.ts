/**
 * Harmonic limit tables as plain data. Every table and every row carries its source (standard, edition,
 * clause or table: printable) and, separately, how we obtained the value: `provenance` says whether it
 * was read in a secondary source (the standards are paywalled) or is from memory of the standard and
 * still to be checked against a licensed copy; `provenanceNote` says a little more, in our own words.
 */

/** How a limit value was obtained. */
export type LimitProvenance = 'read in a secondary source' | 'from memory';

/** Provenance of a whole table: one kind for every row, or 'per row' when rows differ. */
export type LimitTableProvenance = LimitProvenance | 'per row';

/** Ids the CLI and UI use to pick a table. */
export type LimitTableId = 'en50160' | 'iec61000-2-2' | 'ieee519';

/** One order's limit in percent of the reference (fundamental voltage, or I_L for IEEE 519 currents). */
export interface LimitRow {
	order: number;
	limitPercent: number;
	/** Printable source: standard, edition, clause/table and which entry (formula, band, rule). */
	source: string;
	provenance: LimitProvenance;
	/** A short note on how the value was obtained (secondary text, recollection, rule applied). */
	provenanceNote: string;
}

/** A limit on a total (THD of voltage, or TDD of current). */
export interface TotalLimit {
	name: 'THD' | 'TDD';
	limitPercent: number;
	/** Highest harmonic order included in the total. */
	maxOrder: number;
	source: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

/** A table with one fixed limit per order (EN 50160, IEC 61000-2-2). */
export interface OrderLimitTable {
	kind: 'per-order';
	id: LimitTableId;
	name: string;
	source: string;
	provenance: LimitTableProvenance;
	provenanceNote: string;
	quantity: 'voltage';
	/** What the percentages are relative to. */
	basis: string;
	/** How the standard evaluates the values (interval, percentile, period). */
	assessment: string;
	rows: LimitRow[];
	total: TotalLimit;
	notes: string[];
}

/** IEEE 519 Table 1: voltage limits by bus voltage at the PCC (above `aboveV`, up to and including `upToV`). */
export interface Ieee519VoltageRow {
	aboveV: number;
	upToV: number;
	individualPercent: number;
	thdPercent: number;
	source: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

/** IEEE 519 Tables 2–4: odd-harmonic current limits (% of I_L) by I_SC/I_L, for a bus voltage range. */
export interface Ieee519CurrentRow {
	table: string;
	/** Bus voltage range this table applies to: above `aboveV`, up to and including `upToV`. */
	aboveV: number;
	upToV: number;
	/** I_SC/I_L range: from `ratioFrom` (inclusive) to `ratioBelow` (exclusive). */
	ratioFrom: number;
	ratioBelow: number;
	/** Limit per order band, same order as Ieee519Table.currentBands. */
	bandPercent: number[];
	tddPercent: number;
	source: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

/** How even-harmonic current limits follow from the odd limits in one edition. */
export interface Ieee519EvenRule {
	edition: '2014' | '2022';
	/** For even order h: factor of the odd limit of h's band, taken from the first step with h ≤ upToOrder. */
	steps: { upToOrder: number; factor: number }[];
	text: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

export interface Ieee519Table {
	kind: 'ieee519';
	id: 'ieee519';
	name: string;
	source: string;
	provenance: LimitTableProvenance;
	provenanceNote: string;
	assessment: string;
	voltage: Ieee519VoltageRow[];
	voltageMaxOrder: number;
	/** Order bands of Tables 2–4, inclusive. Order 2 uses the first band's limit (even rule applied). */
	currentBands: { fromOrder: number; toOrder: number }[];
	current: Ieee519CurrentRow[];
	evenRules: Ieee519EvenRule[];
	currentMaxOrder: number;
	notes: string[];
}

export type LimitTable = OrderLimitTable | Ieee519Table;

/** What a capture measured, for `evaluateLimits`. Arrays are indexed by harmonic order. */
export interface LimitInput {
	/** Voltage (or EN 50160 / IEC 61000-2-2 quantity) per order, % of the fundamental. */
	percentOfFundamental?: ArrayLike<number>;
	/** THD, % of the fundamental; computed from percentOfFundamental up to the table's order when omitted. */
	thdPercent?: number;
	/** IEEE 519: which limits to apply; default 'current' when percentOfIl is given, else 'voltage'. */
	quantity?: 'voltage' | 'current';
	/** IEEE 519 currents per order, % of I_L (maximum demand current). */
	percentOfIl?: ArrayLike<number>;
	/** IEEE 519 TDD, % of I_L; computed from percentOfIl up to order 50 when omitted. */
	tddPercent?: number;
	/** IEEE 519: nominal bus voltage at the PCC (line-to-line), V. */
	busVoltageV?: number;
	/** IEEE 519 currents: I_SC / I_L at the PCC. */
	iscIlRatio?: number;
	/** IEEE 519 edition for the even-harmonic rule; default '2022'. */
	edition?: '2014' | '2022';
}

/** One comparison of a measured value with its limit. */
export interface LimitCheck {
	/** 'h5', 'THD', 'TDD'. */
	label: string;
	/** Harmonic order; null for a total. */
	order: number | null;
	measuredPercent: number;
	limitPercent: number;
	/** limit − measured, percentage points: negative = over the limit. */
	marginPercent: number;
	/** measured ≤ limit; null when the value was not measured (missing or NaN). */
	pass: boolean | null;
	/** Printable: standard, edition, table and entry. */
	source: string;
	provenance: LimitProvenance;
	provenanceNote: string;
}

export interface LimitEvaluation {
	tableId: LimitTableId;
	tableName: string;
	source: string;
	/** Which part of the table applied (bus voltage row, I_SC/I_L row, edition), in words. */
	selection: string;
	quantity: 'voltage' | 'current';
	basis: string;
	checks: LimitCheck[];
	total: LimitCheck;
	/** false if any check failed; true if all measured checks passed; null if nothing was measured. */
	pass: boolean | null;
	failedCount: number;
	notes: string[];
	/** Always present: a one-off capture is not a compliance measurement. */
	complianceNote: string;
}
