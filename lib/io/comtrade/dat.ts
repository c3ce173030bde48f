/**
 * COMTRADE data (.dat) reader: ASCII, BINARY (int16), BINARY32 (int32) and FLOAT32 records -> raw
 * per-channel columns (before a*x+b), time stamps and digital states. Missing values become NaN and are counted.
 * The binary column decoders (decodeColumn: a·x + b fused, missing marks found from the column minimum) and
 * the sample-number check are shared with the streaming reader (dat-stream.ts).
 * Ref: IEEE C37.111-1999/2013, data file (from memory; record layouts as in docs/methods.md §8.2).
 */
import { ImportError } from '../import-error.js';
import type { ComtradeConfig } from './cfg.js';
import { readAsciiDat } from './dat-ascii.js';

export interface DatContent {
	/** Raw analog values per channel, NaN where the record marks the value missing. */
	raw: Float64Array[];
	/** Missing values per analog channel. */
	missing: number[];
	/** Time stamp field per record (in the file's units, before timemult); NaN where blank or missing. */
	stamps: Float64Array;
	digital: Uint8Array[];
	/** Records read. */
	records: number;
	/** Records found past the count the .cfg gives (ignored). */
	extraRecords: number;
	/** Records whose sample number is not the previous one + 1, and the 1-based record of the first such. */
	sampleNumberBreaks: number;
	firstBreakRecord: number;
	/** Trailing bytes that do not make a whole record (binary only). */
	trailingBytes: number;
}

/** Missing-value markers. Ref: docs/methods.md §8.2 (0x8000 BINARY read; BINARY32 0x80000000 from memory). */
const MISSING_INT16 = -0x8000;
const MISSING_INT32 = -0x80000000;

/**
 * Read the data records. `expected` is the record count the .cfg gives (undefined: read all there are).
 * `lineOffset`/`byteOffset` shift reported positions (CFF sections).
 * @throws ImportError 'dat-too-short' (fewer records than the .cfg says), 'dat-syntax' (ASCII field that is
 *   not a number, wrong field count)
 */
export function readComtradeDat(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	source: string,
	expected: number | undefined,
	offsets: { line?: number; byte?: number } = {},
	reuse?: DatColumns,
): DatContent {
	return cfg.fileType === 'ASCII'
		? readAsciiDat(cfg, bytes, source, expected, offsets.line ?? 0, reuse)
		: readBinary(cfg, bytes, source, expected, offsets.byte ?? 0);
}

/**
 * Columns a streaming reader hands back to be filled again (ASCII): the next chunk's values go into them
 * when they are long enough, so no fresh memory is touched per chunk; the result's columns may then be
 * longer than `records`.
 */
export type DatColumns = Pick<DatContent, 'raw' | 'digital' | 'stamps'>;

function allocate(nA: number, nD: number, n: number): Pick<DatContent, 'raw' | 'digital' | 'stamps' | 'missing'> {
	return {
		raw: Array.from({ length: nA }, () => new Float64Array(n)),
		digital: Array.from({ length: nD }, () => new Uint8Array(n)),
		stamps: new Float64Array(n),
		missing: new Array<number>(nA).fill(0),
	};
}

/** A binary record: 4-byte sample number, 4-byte time stamp, the analog values, then 16 digital states per 2-byte word. */
const RECORD_HEADER_BYTES = 8;
const DIGITAL_WORD_BYTES = 2;
const DIGITALS_PER_WORD = 16;

/** Record layout of a binary .dat and the records to read; throws when the data is shorter than the .cfg says. */
function binaryLayout(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	source: string,
	expected: number | undefined,
	byteOffset: number,
): { nA: number; nD: number; valueBytes: number; recordBytes: number; available: number; n: number } {
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	const valueBytes = cfg.fileType === 'BINARY' ? 2 : 4;
	const words = Math.ceil(nD / DIGITALS_PER_WORD);
	const recordBytes = RECORD_HEADER_BYTES + nA * valueBytes + DIGITAL_WORD_BYTES * words;
	const available = Math.floor(bytes.length / recordBytes);
	if (expected !== undefined && available < expected) {
		throw new ImportError(
			source,
			0,
			byteOffset + bytes.length + 1,
			'dat-too-short',
			'',
			`${expected} records of ${recordBytes} bytes (${expected * recordBytes} bytes) as the .cfg says; the data has ${bytes.length} bytes`,
		);
	}
	return { nA, nD, valueBytes, recordBytes, available, n: expected ?? available };
}

function readBinary(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	source: string,
	expected: number | undefined,
	byteOffset: number,
): DatContent {
	const { nA, nD, valueBytes, recordBytes, available, n } = binaryLayout(cfg, bytes, source, expected, byteOffset);
	const out = allocate(nA, nD, n);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const { breaks, firstBreak } = readStamps(view, out.stamps, n, recordBytes);
	for (let c = 0; c < nA; c++)
		out.missing[c] = decodeColumn(
			view,
			{ col: out.raw[c], row: 0, n, at: RECORD_HEADER_BYTES + c * valueBytes, recordBytes },
			cfg.fileType,
			RAW_SCALE,
		);
	const statusAt = RECORD_HEADER_BYTES + nA * valueBytes;
	for (let c = 0; c < nD; c++)
		readDigital(
			view,
			out.digital[c],
			n,
			statusAt + DIGITAL_WORD_BYTES * Math.floor(c / DIGITALS_PER_WORD),
			c % DIGITALS_PER_WORD,
			recordBytes,
		);
	return {
		...out,
		records: n,
		extraRecords: available - n,
		trailingBytes: bytes.length - available * recordBytes,
		sampleNumberBreaks: breaks,
		firstBreakRecord: firstBreak,
	};
}

/**
 * Time stamps of `n` records into `stamps` (NaN for the 0xFFFFFFFF 'missing' mark) and the records whose
 * sample number does not run on by one. Its own function (as is each column decoder) so that each hot loop
 * is optimised whole, not entered half-way with the code after it still unseen.
 */
function readStamps(
	view: DataView,
	stamps: Float64Array,
	n: number,
	recordBytes: number,
): { breaks: number; firstBreak: number } {
	let breaks = 0;
	let firstBreak = 0;
	let prev = n > 0 ? view.getUint32(0, true) : 0;
	for (let r = 0, p = 0; r < n; r++, p += recordBytes) {
		const ts = view.getUint32(p + 4, true);
		stamps[r] = ts === 0xffffffff ? NaN : ts;
		const sample = view.getUint32(p, true);
		if (r > 0 && sample !== prev + 1 && breaks++ === 0) firstBreak = r + 1;
		prev = sample;
	}
	return { breaks, firstBreak };
}

/**
 * Records among `n` from byte 0 of `view` whose sample number is not the one before + 1 (uint32, no
 * wrap-around: 0 after 0xFFFFFFFF is a break), `prev` being the sample number before the first (-1: none,
 * the first record is not checked). Returns the count, the 0-based record of the first, and the last number.
 */
export function sampleNumberBreaks(
	view: DataView,
	n: number,
	recordBytes: number,
	prev: number,
): { breaks: number; first: number; last: number } {
	if (n === 0) return { breaks: 0, first: -1, last: prev };
	const from = prev < 0 ? 1 : 0;
	const { breaks, first } = int32Breaks(view, n, recordBytes, from, from === 1 ? view.getInt32(0, true) : prev | 0);
	return { breaks, first, last: view.getUint32((n - 1) * recordBytes, true) };
}

/**
 * The loop of sampleNumberBreaks in int32 arithmetic (V8 keeps it in registers; uint32 values above 2^31
 * would be doubles): (s − prev) | 0 is 1 exactly when s = prev + 1 modulo 2^32, so the one wrap-around
 * case, s = 0, is a break of its own.
 */
function int32Breaks(
	view: DataView,
	n: number,
	recordBytes: number,
	from: number,
	prev: number,
): { breaks: number; first: number } {
	let breaks = 0;
	let first = -1;
	for (let r = from, p = from * recordBytes; r < n; r++, p += recordBytes) {
		const s = view.getInt32(p, true);
		if ((((s - prev) | 0) !== 1 || s === 0) && breaks++ === 0) first = r;
		prev = s;
	}
	return { breaks, first };
}

/** Where a column decoder writes: `n` records' values from byte `at` of the first into col[row…row + n). */
export interface ColumnSpan {
	col: Float64Array;
	row: number;
	n: number;
	at: number;
	recordBytes: number;
}

/** The scaling a·x + b that keeps every raw value bit for bit (x + (−0) is x, even for x = −0). */
export const RAW_SCALE = { a: 1, b: -0 } as const;

/**
 * One analog channel of a binary .dat, scaled: col[row + r] = a·x + b for the value x of record r, NaN
 * where x is the 'missing' mark; returns the count of those. a = 1, b = −0 (RAW_SCALE) stores x itself.
 */
export function decodeColumn(
	view: DataView,
	span: ColumnSpan,
	type: ComtradeConfig['fileType'],
	scale: { a: number; b: number },
): number {
	const { col, row, n, at, recordBytes } = span;
	// One loop per type and its own function: the inner loop has no branch on the type.
	if (type === 'BINARY') {
		if (decodeInt16(view, col, row, n, at, recordBytes, scale.a, scale.b) !== MISSING_INT16) return 0;
		return markMissing(view, span, 2);
	}
	if (type === 'BINARY32') {
		if (decodeInt32(view, col, row, n, at, recordBytes, scale.a, scale.b) !== MISSING_INT32) return 0;
		return markMissing(view, span, 4);
	}
	return decodeFloat32(view, col, row, n, at, recordBytes, scale.a, scale.b);
}

/*
 * The integer 'missing' marks are the smallest values of their types (int16 −32768, int32 −2^31), so the
 * loops below keep the running minimum instead of testing every value (a branch in the loop costs about as
 * much as the rest of it, measured): a column whose minimum is the mark is read again by markMissing.
 */

function decodeInt16(
	view: DataView,
	col: Float64Array,
	row: number,
	n: number,
	p: number,
	rb: number,
	a: number,
	b: number,
): number {
	let lo = 0;
	for (let r = row, end = row + n; r < end; r++, p += rb) {
		const v = view.getInt16(p, true);
		col[r] = a * v + b;
		lo = v < lo ? v : lo;
	}
	return lo;
}

function decodeInt32(
	view: DataView,
	col: Float64Array,
	row: number,
	n: number,
	p: number,
	rb: number,
	a: number,
	b: number,
): number {
	let lo = 0;
	for (let r = row, end = row + n; r < end; r++, p += rb) {
		const v = view.getInt32(p, true);
		col[r] = a * v + b;
		lo = v < lo ? v : lo;
	}
	return lo;
}

/** FLOAT32: NaN and ±Infinity are missing (no finite value marks it); returns their count. */
function decodeFloat32(
	view: DataView,
	col: Float64Array,
	row: number,
	n: number,
	p: number,
	rb: number,
	a: number,
	b: number,
): number {
	let miss = 0;
	for (let r = row, end = row + n; r < end; r++, p += rb) {
		const v = view.getFloat32(p, true);
		if (Number.isFinite(v)) col[r] = a * v + b;
		else {
			col[r] = NaN;
			miss++;
		}
	}
	return miss;
}

/** NaN where the span's int16 (`bytes` 2) or int32 (4) value is the 'missing' mark; returns their count. */
function markMissing(view: DataView, span: ColumnSpan, bytes: 2 | 4): number {
	let miss = 0;
	for (let r = 0, p = span.at; r < span.n; r++, p += span.recordBytes) {
		const v = bytes === 2 ? view.getInt16(p, true) : view.getInt32(p, true);
		if (v === (bytes === 2 ? MISSING_INT16 : MISSING_INT32)) {
			span.col[span.row + r] = NaN;
			miss++;
		}
	}
	return miss;
}

/** One digital channel's states (bit `bit` of the status word at byte `p` of each record) into `states`. */
function readDigital(view: DataView, states: Uint8Array, n: number, p: number, bit: number, recordBytes: number): void {
	for (let r = 0; r < n; r++, p += recordBytes) states[r] = (view.getUint16(p, true) >> bit) & 1;
}
