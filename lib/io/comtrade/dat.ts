/**
 * COMTRADE data (.dat) reader: ASCII, BINARY (int16), BINARY32 (int32) and FLOAT32 records -> raw
 * per-channel columns (before a*x+b), time stamps and digital states. Missing values become NaN and are counted.
 * Ref: IEEE C37.111-1999/2013, data file (from memory; record layouts as in REFERENCE.md §8.2).
 */
import { ImportError } from '../import-error.js';
import type { ComtradeConfig } from './cfg.js';
import { splitFields, strictNumber } from './text.js';

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
	/** Trailing bytes that do not make a whole record (binary only). */
	trailingBytes: number;
}

/** Missing-value markers. Ref: REFERENCE.md §8.2 (99999 ASCII, 0x8000 BINARY read; BINARY32 0x80000000 from memory). */
export const COMTRADE_MISSING_ASCII = 99999;
const MISSING_INT16 = -0x8000;
const MISSING_INT32 = -0x80000000;

/**
 * Read the data records. `expected` is the record count the .cfg gives (undefined: read all there are).
 * `lineOffset`/`byteOffset` shift reported positions (CFF sections).
 * @throws ImportError 'dat-too-short' (fewer records than the .cfg says), 'dat-syntax' (ASCII field that is
 *   not a number, wrong field count)
 */
export function readComtradeDat(cfg: ComtradeConfig, bytes: Uint8Array, source: string, expected: number | undefined, offsets: { line?: number; byte?: number } = {}): DatContent {
	return cfg.fileType === 'ASCII' ? readAscii(cfg, bytes, source, expected, offsets.line ?? 0) : readBinary(cfg, bytes, source, expected, offsets.byte ?? 0);
}

function allocate(nA: number, nD: number, n: number): Pick<DatContent, 'raw' | 'digital' | 'stamps' | 'missing'> {
	return {
		raw: Array.from({ length: nA }, () => new Float64Array(n)),
		digital: Array.from({ length: nD }, () => new Uint8Array(n)),
		stamps: new Float64Array(n),
		missing: new Array<number>(nA).fill(0),
	};
}

function readAscii(cfg: ComtradeConfig, bytes: Uint8Array, source: string, expected: number | undefined, lineOffset: number): DatContent {
	const text = new TextDecoder('latin1').decode(bytes);
	const lines = text.split(/\r\n|\n|\r/);
	while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	const width = 2 + nA + nD;
	if (expected !== undefined && lines.length < expected) {
		throw new ImportError(source, lines.length + 1 + lineOffset, 0, 'dat-too-short', '', `${expected} records as the .cfg says (rates ending at sample ${expected}); the file ends after ${lines.length}`);
	}
	const n = expected ?? lines.length;
	const out = allocate(nA, nD, n);
	for (let r = 0; r < n; r++) {
		const line = lines[r];
		const lineNo = r + 1 + lineOffset;
		const f = splitFields(line);
		if (f.length === width + 1 && f[width].text === '') f.pop(); // a trailing comma
		if (f.length !== width) {
			const col = f.length < width ? line.length + 1 : f[width].column;
			throw new ImportError(source, lineNo, col, 'dat-syntax', line, `${width} fields (sample number, time stamp, ${nA} analog, ${nD} digital), found ${f.length}`);
		}
		if (!Number.isFinite(strictNumber(f[0].text))) throw new ImportError(source, lineNo, f[0].column, 'dat-syntax', f[0].text, 'a sample number');
		const ts = f[1].text === '' ? NaN : strictNumber(f[1].text);
		if (f[1].text !== '' && !Number.isFinite(ts)) throw new ImportError(source, lineNo, f[1].column, 'dat-syntax', f[1].text, 'a time stamp (an integer) or a blank field');
		out.stamps[r] = ts;
		for (let c = 0; c < nA; c++) {
			const t = f[2 + c].text;
			const v = t === '' ? NaN : strictNumber(t);
			if (t !== '' && !Number.isFinite(v)) throw new ImportError(source, lineNo, f[2 + c].column, 'dat-syntax', t, `a number for analog channel ${c + 1} (${cfg.analog[c].name})`);
			if (t === '' || v === COMTRADE_MISSING_ASCII) {
				out.raw[c][r] = NaN;
				out.missing[c]++;
			} else out.raw[c][r] = v;
		}
		for (let c = 0; c < nD; c++) {
			const t = f[2 + nA + c].text;
			if (t !== '0' && t !== '1') throw new ImportError(source, lineNo, f[2 + nA + c].column, 'dat-syntax', t, `0 or 1 for digital channel ${c + 1} (${cfg.digital[c].name})`);
			out.digital[c][r] = t === '1' ? 1 : 0;
		}
	}
	return { ...out, records: n, extraRecords: lines.length - n, trailingBytes: 0 };
}

function readBinary(cfg: ComtradeConfig, bytes: Uint8Array, source: string, expected: number | undefined, byteOffset: number): DatContent {
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	const valueBytes = cfg.fileType === 'BINARY' ? 2 : 4;
	const words = Math.ceil(nD / 16);
	const recordBytes = 8 + nA * valueBytes + 2 * words;
	const available = Math.floor(bytes.length / recordBytes);
	if (expected !== undefined && available < expected) {
		throw new ImportError(source, 0, byteOffset + bytes.length + 1, 'dat-too-short', '', `${expected} records of ${recordBytes} bytes (${expected * recordBytes} bytes) as the .cfg says; the data has ${bytes.length} bytes`);
	}
	const n = expected ?? available;
	const out = allocate(nA, nD, n);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const type = cfg.fileType;
	for (let r = 0; r < n; r++) {
		let p = r * recordBytes + 4; // skip the sample number
		const ts = view.getUint32(p, true);
		out.stamps[r] = ts === 0xffffffff ? NaN : ts;
		p += 4;
		for (let c = 0; c < nA; c++, p += valueBytes) {
			let v: number;
			if (type === 'BINARY') {
				v = view.getInt16(p, true);
				if (v === MISSING_INT16) v = NaN;
			} else if (type === 'BINARY32') {
				v = view.getInt32(p, true);
				if (v === MISSING_INT32) v = NaN;
			} else {
				v = view.getFloat32(p, true);
				if (!Number.isFinite(v)) v = NaN;
			}
			if (Number.isNaN(v)) out.missing[c]++;
			out.raw[c][r] = v;
		}
		for (let c = 0; c < nD; c++) {
			const word = view.getUint16(p + 2 * (c >> 4), true);
			out.digital[c][r] = (word >> (c & 15)) & 1;
		}
	}
	return { ...out, records: n, extraRecords: available - n, trailingBytes: bytes.length - available * recordBytes };
}
