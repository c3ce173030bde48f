/**
 * COMTRADE ASCII .dat reader: a byte scanner straight into Float64Arrays (no line strings, no field
 * objects), with 1-based line and column for every error. A record is
 * `n,timestamp,A1,…,AA,D1,…,DD`; a blank or 99999 analog value is missing (NaN).
 * Ref: IEEE C37.111-1999/2013, ASCII data file (from memory; docs/methods.md §8.2).
 */
import { ImportError } from '../import-error.js';
import type { ComtradeConfig } from './cfg.js';
import type { DatContent } from './dat.js';

const COMMA = 44,
	LF = 10,
	CR = 13,
	SPACE = 32,
	TAB = 9;
/** ASCII missing-value marker. Ref: docs/methods.md §8.2 (read in python-comtrade's test files). */
const MISSING_ASCII = 99999;

const isBlank = (b: number) => b === SPACE || b === TAB;
const isDigit = (b: number) => b >= 48 && b <= 57;

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

export function readAsciiDat(
	cfg: ComtradeConfig,
	bytes: Uint8Array,
	source: string,
	expected: number | undefined,
	lineOffset: number,
): DatContent {
	const nA = cfg.analog.length;
	const nD = cfg.digital.length;
	const width = 2 + nA + nD;
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
	const raw = Array.from({ length: nA }, () => new Float64Array(n));
	const digital = Array.from({ length: nD }, () => new Uint8Array(n));
	const stamps = new Float64Array(n);
	const missing = new Array<number>(nA).fill(0);
	const len = bytes.length;
	let p = 0;
	let lineStart = 0;
	let lineNo = 0;

	const lineText = () => {
		let e = lineStart;
		while (e < len && bytes[e] !== LF && bytes[e] !== CR) e++;
		return latin1(bytes, lineStart, e);
	};
	const fail = (column: number, text: string, expectedText: string): never => {
		throw new ImportError(source, lineNo + lineOffset, column, 'dat-syntax', text, expectedText);
	};
	const fieldName = (f: number) =>
		f === 0
			? 'a sample number'
			: f === 1
				? 'a time stamp (an integer) or a blank field'
				: f < 2 + nA
					? `a number for analog channel ${f - 1} (${cfg.analog[f - 2].name})`
					: `0 or 1 for digital channel ${f - 1 - nA} (${cfg.digital[f - 2 - nA].name})`;

	let previousNumber = 0;
	let breaks = 0;
	let firstBreak = 0;
	for (let r = 0; r < n; r++) {
		lineStart = p;
		lineNo = r + 1;
		for (let f = 0; f < width; f++) {
			while (p < len && isBlank(bytes[p])) p++;
			const start = p;
			// number: [sign] digits [. digits] [e [sign] digits]
			let neg = false;
			if (p < len && (bytes[p] === 43 || bytes[p] === 45)) neg = bytes[p++] === 45;
			let intValue = 0;
			let digits = 0;
			while (p < len && isDigit(bytes[p])) {
				intValue = intValue * 10 + (bytes[p++] - 48);
				digits++;
			}
			let simple = true;
			if (p < len && bytes[p] === 46) {
				simple = false;
				p++;
				while (p < len && isDigit(bytes[p])) {
					p++;
					digits++;
				}
			}
			if (digits > 0 && p < len && (bytes[p] === 101 || bytes[p] === 69)) {
				simple = false;
				p++;
				if (p < len && (bytes[p] === 43 || bytes[p] === 45)) p++;
				const e0 = p;
				while (p < len && isDigit(bytes[p])) p++;
				if (p === e0) digits = -1;
			}
			const end = p;
			while (p < len && isBlank(bytes[p])) p++;
			const b = p < len ? bytes[p] : LF;
			const atEnd = b === LF || b === CR;
			if (b !== COMMA && !atEnd) {
				let e = p;
				while (e < len && bytes[e] !== COMMA && bytes[e] !== LF && bytes[e] !== CR) e++;
				fail(start - lineStart + 1, latin1(bytes, start, e).trim(), fieldName(f));
			}
			const blank = end === start;
			if (!blank && digits <= 0) fail(start - lineStart + 1, latin1(bytes, start, end), fieldName(f));
			const value = blank
				? NaN
				: simple && digits <= 15
					? neg
						? -intValue
						: intValue
					: Number(latin1(bytes, start, end));
			if (f === 0) {
				if (blank) fail(start - lineStart + 1, '', fieldName(0));
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
					fail(start - lineStart + 1, latin1(bytes, start, end), fieldName(f));
				digital[f - 2 - nA][r] = intValue;
			}
			if (f < width - 1) {
				if (atEnd)
					fail(
						p - lineStart + 1,
						lineText(),
						`${width} fields (sample number, time stamp, ${nA} analog, ${nD} digital), found ${f + 1}`,
					);
				p++; // the comma
			}
		}
		// after the last field: an optional trailing comma, then the line end
		if (p < len && bytes[p] === COMMA) {
			let q = p + 1;
			while (q < len && isBlank(bytes[q])) q++;
			if (q < len && bytes[q] !== LF && bytes[q] !== CR)
				fail(
					p + 2 - lineStart,
					lineText(),
					`${width} fields (sample number, time stamp, ${nA} analog, ${nD} digital), found more`,
				);
			p = q;
		}
		if (p < len && bytes[p] === CR) p++;
		if (p < len && bytes[p] === LF) p++;
	}
	return {
		raw,
		missing,
		stamps,
		digital,
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
