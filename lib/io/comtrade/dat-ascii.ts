/**
 * COMTRADE ASCII .dat reader: a byte scanner straight into Float64Arrays (no line strings, no field
 * objects), with 1-based line and column for every error. A record is
 * `n,timestamp,A1,…,AA,D1,…,DD`; a blank or 99999 analog value is missing (NaN).
 * Ref: IEEE C37.111-1999/2013, ASCII data file (from memory; docs/methods.md §8.2).
 */
import { ImportError } from '../import-error.js';
import type { ComtradeConfig } from './cfg.js';
import type { DatContent } from './dat.js';

/** ASCII byte codes the scanner compares against. */
const COMMA = 44,
	LF = 10,
	CR = 13,
	SPACE = 32,
	TAB = 9,
	PLUS = 43,
	MINUS = 45,
	DOT = 46,
	DIGIT_0 = 48,
	DIGIT_9 = 57,
	LOWER_E = 101,
	UPPER_E = 69;
/** Integers of up to 15 digits are exact in a double (2^53 ≈ 9.007e15), so they skip Number(). */
const MAX_EXACT_DIGITS = 15;
/** ASCII missing-value marker. Ref: docs/methods.md §8.2 (read in python-comtrade's test files). */
const MISSING_ASCII = 99999;

/** Columns made for a streaming reader hold this many times the first chunk's records. */
const REUSE_SLACK = 1.125;

const isBlank = (b: number) => b === SPACE || b === TAB;
const isDigit = (b: number) => b >= DIGIT_0 && b <= DIGIT_9;

/** Count records: lines up to the last one with anything but blanks on it. */
function countLines(bytes: Uint8Array): number {
	let lines = 0;
	let nonBlank = false;
	let lastNonBlankLine = 0;
	for (let i = 0; i < bytes.length; i++) {
		const b = bytes[i];
		if (b === LF || b === CR) {
			lines++;
			if (nonBlank) lastNonBlankLine = lines;
			nonBlank = false;
			if (b === CR && i + 1 < bytes.length && bytes[i + 1] === LF) i++;
		} else if (!isBlank(b)) nonBlank = true;
	}
	if (nonBlank) lastNonBlankLine = lines + 1;
	return lastNonBlankLine;
}

/** Where the scan reports from: the file name and the line offset of the section (CFF). */
interface ScanPlace {
	source: string;
	lineOffset: number;
}

/** The columns being filled. */
interface AsciiColumns {
	raw: Float64Array[];
	digital: Uint8Array[];
	stamps: Float64Array;
	missing: number[];
}

function syntaxError(at: ScanPlace, lineNo: number, column: number, text: string, expected: string): ImportError {
	return new ImportError(at.source, lineNo + at.lineOffset, column, 'dat-syntax', text, expected);
}

/** The text of the line that starts at `lineStart` (for errors). */
function lineTextAt(bytes: Uint8Array, lineStart: number): string {
	let e = lineStart;
	while (e < bytes.length && bytes[e] !== LF && bytes[e] !== CR) e++;
	return latin1(bytes, lineStart, e);
}

/** What field `f` of a record should hold, for errors. */
function fieldName(cfg: ComtradeConfig, f: number): string {
	const nA = cfg.analog.length;
	return f === 0
		? 'a sample number'
		: f === 1
			? 'a time stamp (an integer) or a blank field'
			: f < 2 + nA
				? `a number for analog channel ${f - 1} (${cfg.analog[f - 2].name})`
				: `0 or 1 for digital channel ${f - 1 - nA} (${cfg.digital[f - 2 - nA].name})`;
}

/** The expected field count, for errors. */
function fieldCountText(cfg: ComtradeConfig): string {
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	return `${2 + nA + nD} fields (sample number, time stamp, ${nA} analog, ${nD} digital)`;
}

/** After a record's last field at `p`: an optional trailing comma, then the line end. Returns the next line's start. */
function endOfRecord(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	p: number,
	lineStart: number,
	lineNo: number,
	at: ScanPlace,
): number {
	const len = bytes.length;
	if (p < len && bytes[p] === COMMA) {
		let q = p + 1;
		while (q < len && isBlank(bytes[q])) q++;
		if (q < len && bytes[q] !== LF && bytes[q] !== CR)
			throw syntaxError(
				at,
				lineNo,
				p + 2 - lineStart,
				lineTextAt(bytes, lineStart),
				`${fieldCountText(cfg)}, found more`,
			);
		p = q;
	}
	if (p < len && bytes[p] === CR) p++;
	if (p < len && bytes[p] === LF) p++;
	return p;
}

/**
 * Scan `n` records into the columns: the hot loop, kept in one function so its state stays in locals.
 * @returns the sample-number breaks and the 1-based record of the first
 */
function scanRecords(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	n: number,
	out: AsciiColumns,
	at: ScanPlace,
): { breaks: number; firstBreak: number } {
	const nA = cfg.analog.length;
	const width = 2 + nA + cfg.digital.length;
	const { raw, digital, stamps, missing } = out;
	const len = bytes.length;
	let p = 0;
	let previousNumber = 0;
	let breaks = 0;
	let firstBreak = 0;
	for (let r = 0; r < n; r++) {
		const lineStart = p;
		const lineNo = r + 1;
		for (let f = 0; f < width; f++) {
			while (p < len && isBlank(bytes[p])) p++;
			const start = p;
			// number: [sign] digits [. digits] [e [sign] digits]
			let neg = false;
			if (p < len && (bytes[p] === PLUS || bytes[p] === MINUS)) neg = bytes[p++] === MINUS;
			let intValue = 0;
			let digits = 0;
			while (p < len && isDigit(bytes[p])) {
				intValue = intValue * 10 + (bytes[p++] - DIGIT_0);
				digits++;
			}
			let simple = true;
			if (p < len && bytes[p] === DOT) {
				simple = false;
				const q = skipDigits(bytes, p + 1);
				digits += q - p - 1;
				p = q;
			}
			if (digits > 0 && p < len && (bytes[p] === LOWER_E || bytes[p] === UPPER_E)) {
				simple = false;
				p++;
				if (p < len && (bytes[p] === PLUS || bytes[p] === MINUS)) p++;
				const q = skipDigits(bytes, p);
				if (q === p) digits = -1;
				p = q;
			}
			const end = p;
			while (p < len && isBlank(bytes[p])) p++;
			const b = p < len ? bytes[p] : LF;
			const atEnd = b === LF || b === CR;
			const blank = end === start;
			const bad = (b !== COMMA && !atEnd) || (!blank && digits <= 0) || (f === 0 && blank);
			if (bad) throw fieldError(cfg, bytes, { start, end, p, lineStart, lineNo, f }, at);
			let value = NaN;
			if (!blank) value = simple && digits <= MAX_EXACT_DIGITS ? signed(neg, intValue) : numberAt(bytes, start, end);
			if (f === 0) {
				if (r > 0 && value !== previousNumber + 1 && breaks++ === 0) firstBreak = r + 1;
				previousNumber = value;
			} else if (f === 1) {
				stamps[r] = value;
			} else if (f < 2 + nA) {
				if (blank || value === MISSING_ASCII) {
					raw[f - 2][r] = NaN;
					missing[f - 2]++;
				} else raw[f - 2][r] = value;
			} else {
				if (blank || !simple || neg || digits !== 1 || intValue > 1)
					throw syntaxError(at, lineNo, start - lineStart + 1, latin1(bytes, start, end), fieldName(cfg, f));
				digital[f - 2 - nA][r] = intValue;
			}
			if (f < width - 1) {
				if (atEnd) throw tooFewFields(cfg, bytes, { p, lineStart, lineNo, f }, at);
				p++; // the comma
			}
		}
		p = endOfRecord(cfg, bytes, p, lineStart, lineNo, at);
	}
	return { breaks, firstBreak };
}

/** Past the digits from `p`. */
function skipDigits(bytes: Uint8Array, p: number): number {
	while (p < bytes.length && isDigit(bytes[p])) p++;
	return p;
}

const signed = (neg: boolean, v: number) => (neg ? -v : v);
const numberAt = (bytes: Uint8Array, start: number, end: number) => Number(latin1(bytes, start, end));

/** The error for a record that ends before its last field. */
function tooFewFields(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	t: { p: number; lineStart: number; lineNo: number; f: number },
	at: ScanPlace,
): ImportError {
	const text = lineTextAt(bytes, t.lineStart);
	return syntaxError(at, t.lineNo, t.p - t.lineStart + 1, text, `${fieldCountText(cfg)}, found ${t.f + 1}`);
}

/** The error for a field that is not a number or not followed by a comma or the line end, in the scan's order of checks. */
function fieldError(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	t: { start: number; end: number; p: number; lineStart: number; lineNo: number; f: number },
	at: ScanPlace,
): ImportError {
	const column = t.start - t.lineStart + 1;
	const b = t.p < bytes.length ? bytes[t.p] : LF;
	if (b !== COMMA && b !== LF && b !== CR) {
		let e = t.p;
		while (e < bytes.length && bytes[e] !== COMMA && bytes[e] !== LF && bytes[e] !== CR) e++;
		return syntaxError(at, t.lineNo, column, latin1(bytes, t.start, e).trim(), fieldName(cfg, t.f));
	}
	if (t.end !== t.start) return syntaxError(at, t.lineNo, column, latin1(bytes, t.start, t.end), fieldName(cfg, t.f));
	return syntaxError(at, t.lineNo, column, '', fieldName(cfg, 0));
}

/**
 * @param reuse  columns of an earlier call, filled again when long enough (a streaming reader's: no fresh
 *   memory per chunk); the result's columns may then be longer than its record count
 */
export function readAsciiDat(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	source: string,
	expected: number | undefined,
	lineOffset: number,
	reuse?: Pick<DatContent, 'raw' | 'digital' | 'stamps'>,
): DatContent {
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	const lineCount = countLines(bytes);
	if (expected !== undefined && lineCount < expected) {
		throw new ImportError(
			source,
			lineCount + 1 + lineOffset,
			0,
			'dat-too-short',
			'',
			`${expected} records as the .cfg says (rates ending at sample ${expected}); the file ends after ${lineCount}`,
		);
	}
	const n = expected ?? lineCount;
	const fits = reuse !== undefined && reuse.stamps.length >= n;
	// a streaming reader's chunks vary by a few lines: room for them, so the columns are made once
	const size = reuse ? Math.ceil(n * REUSE_SLACK) : n;
	const out: AsciiColumns = {
		raw: fits ? reuse.raw : Array.from({ length: nA }, () => new Float64Array(size)),
		digital: fits ? reuse.digital : Array.from({ length: nD }, () => new Uint8Array(size)),
		stamps: fits ? reuse.stamps : new Float64Array(size),
		missing: new Array<number>(nA).fill(0),
	};
	const { breaks, firstBreak } = scanRecords(cfg, bytes, n, out, { source, lineOffset });
	return {
		...out,
		records: n,
		extraRecords: lineCount - n,
		trailingBytes: 0,
		sampleNumberBreaks: breaks,
		firstBreakRecord: firstBreak,
	};
}

function latin1(bytes: Uint8Array, start: number, end: number): string {
	let s = '';
	for (let i = start; i < end && i < start + 200; i++) s += String.fromCharCode(bytes[i]);
	return s;
}
