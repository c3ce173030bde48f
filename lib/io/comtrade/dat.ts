/**
 * COMTRADE data (.dat) reader: ASCII, BINARY (int16), BINARY32 (int32) and FLOAT32 records -> raw
 * per-channel columns (before a*x+b), time stamps and digital states. Missing values become NaN and are counted.
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
		? readAsciiDat(cfg, bytes, source, expected, offsets.line ?? 0)
		: readBinary(cfg, bytes, source, expected, offsets.byte ?? 0, reuse);
}

/**
 * Columns a streaming reader hands back to `readComtradeDat` to be filled again (BINARY types): the next
 * block's values go into them when they are long enough, so no fresh memory is touched per block. The
 * result's columns may then be longer than `records`.
 */
export type DatColumns = Pick<DatContent, 'raw' | 'digital' | 'stamps'>;

function allocate(
	nA: number,
	nD: number,
	n: number,
	reuse?: DatColumns,
): Pick<DatContent, 'raw' | 'digital' | 'stamps' | 'missing'> {
	const missing = new Array<number>(nA).fill(0);
	if (reuse && reuse.stamps.length >= n && reuse.raw.length === nA && reuse.digital.length === nD)
		return { raw: reuse.raw, digital: reuse.digital, stamps: reuse.stamps, missing };
	return {
		raw: Array.from({ length: nA }, () => new Float64Array(n)),
		digital: Array.from({ length: nD }, () => new Uint8Array(n)),
		stamps: new Float64Array(n),
		missing,
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
	reuse?: DatColumns,
): DatContent {
	const { nA, nD, valueBytes, recordBytes, available, n } = binaryLayout(cfg, bytes, source, expected, byteOffset);
	const out = allocate(nA, nD, n, reuse);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const { breaks, firstBreak } = readStamps(view, out.stamps, n, recordBytes);
	for (let c = 0; c < nA; c++)
		out.missing[c] = readColumn(view, out.raw[c], n, RECORD_HEADER_BYTES + c * valueBytes, recordBytes, cfg.fileType);
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
 * sample number does not run on by one. Its own function (as is readColumn) so that each hot loop is
 * optimised whole, not entered half-way with the code after it still unseen.
 */
function readStamps(
	view: DataView,
	stamps: Float64Array,
	n: number,
	recordBytes: number,
): { breaks: number; firstBreak: number } {
	let breaks = 0;
	let firstBreak = 0;
	for (let r = 0; r < n; r++) {
		const ts = view.getUint32(r * recordBytes + 4, true);
		stamps[r] = ts === 0xffffffff ? NaN : ts;
		if (r > 0 && view.getUint32(r * recordBytes, true) !== view.getUint32((r - 1) * recordBytes, true) + 1) {
			if (breaks++ === 0) firstBreak = r + 1;
		}
	}
	return { breaks, firstBreak };
}

/** One analog channel of `n` records from byte `p` on into `col` (NaN where marked missing); returns the missing count. */
function readColumn(
	view: DataView,
	col: Float64Array,
	n: number,
	p: number,
	recordBytes: number,
	type: ComtradeConfig['fileType'],
): number {
	let miss = 0;
	// One loop per type: keeps the inner loop free of branches on the file type.
	if (type === 'BINARY') {
		for (let r = 0; r < n; r++, p += recordBytes) {
			const v = view.getInt16(p, true);
			if (v === MISSING_INT16) {
				col[r] = NaN;
				miss++;
			} else col[r] = v;
		}
	} else if (type === 'BINARY32') {
		for (let r = 0; r < n; r++, p += recordBytes) {
			const v = view.getInt32(p, true);
			if (v === MISSING_INT32) {
				col[r] = NaN;
				miss++;
			} else col[r] = v;
		}
	} else {
		for (let r = 0; r < n; r++, p += recordBytes) {
			const v = view.getFloat32(p, true);
			if (Number.isFinite(v)) col[r] = v;
			else {
				col[r] = NaN;
				miss++;
			}
		}
	}
	return miss;
}

/** One digital channel's states (bit `bit` of the status word at byte `p` of each record) into `states`. */
function readDigital(view: DataView, states: Uint8Array, n: number, p: number, bit: number, recordBytes: number): void {
	for (let r = 0; r < n; r++, p += recordBytes) states[r] = (view.getUint16(p, true) >> bit) & 1;
}
