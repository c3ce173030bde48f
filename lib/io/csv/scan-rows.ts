/**
 * The data-body scanner: bytes straight into one growable Float64Array per column, no strings, no row
 * objects. Numbers are read from the bytes (decimal.ts: bit-identical to parseFloat).
 *
 * Lines first go through scanPlainRows, the fast path for the common shape (unquoted numbers, the
 * delimiter right after each, the line break after the last); a line of any other shape (blanks, quotes,
 * NaN words, a clock column, a trailing delimiter, a space delimiter, a bad cell) is read again from its
 * start by the general path, which also words every error.
 *
 * Contract: every range handed to scan() consists of whole lines, each ending with the line-break byte.
 */
import { ImportError } from '../import-error.js';
import { ClockCounter } from './clock-time.js';
import { decimalValue, fastDecimal, isFastDecimal, NO_DIGITS, readDecimal, slowDecimal } from './decimal.js';

// Byte values of the ASCII characters the scanner looks at (ANSI X3.4-1986 code chart; UTF-8 and
// Windows-1252 keep them as single bytes, RFC 3629 section 3). Module-local on purpose: V8 folds a module's
// own constants into the hot loop but loads imported bindings on every use (measured: 1.6x slower).
const TAB = 0x09;
const LF = 0x0a;
const CR = 0x0d;
const SPACE = 0x20;
const QUOTE = 0x22;
const PLUS = 0x2b;
const MINUS = 0x2d;
const DIGIT_0 = 0x30;
const DIGIT_9 = 0x39;
const LOWER_A = 0x61;
const LOWER_E = 0x65;
const LOWER_N = 0x6e;
const LOWER_Z = 0x7a;
/** OR-ing this bit into an ASCII capital gives its small letter ('E' | 0x20 = 'e'). */
const ASCII_CASE_BIT = 0x20;

/** EXPONENT_CAP of decimal.ts, written out module-local (folded into the loop, as above). */
const EXPONENT_LIMIT = 100_000;

/** Rows allocated at least, whatever the estimate. */
const MIN_CAPACITY_ROWS = 16;
/** Growth when the estimate falls short: 1.5x plus a fixed step (amortised O(1) per row, less overshoot than 2x). */
const GROWTH_FACTOR = 1.5;
const GROWTH_STEP_ROWS = 1024;
/** A word longer than this is no NaN/Infinity spelling ('infinity' has 8 letters). */
const MAX_NON_FINITE_WORD = 8;
/** Characters of a clock cell (a date, a time and a zone) read at most. */
const MAX_CLOCK_CELL = 64;

export interface ScanLayout {
	delimiter: string;
	decimalMark: '.' | ',';
	lineBreak: string;
	columnCount: number;
	/** 1-based line of the first data row; earlier lines are skipped. */
	bodyLine: number;
	/** 0-based time column, or -1: its values must not decrease. */
	timeColumn: number;
	/** 0-based column holding time-of-day stamps, or -1 (absent = -1). */
	clockColumn?: number;
	/** 2 when the stamp is a date field then a time field. */
	clockFields?: 1 | 2;
	/** Initial rows to allocate. */
	capacityRows: number;
}

type FailCode = 'bad-number' | 'short-row' | 'long-row' | 'time-not-increasing';

export class RowScanner {
	columns: Float64Array[];
	rows = 0;
	/** 1-based number of the next line to read. */
	lineNo = 1;
	blankLines = 0;
	firstBlankLine = 0;
	nonFinite = 0;
	firstNonFiniteLine = 0;
	repeatedTimes = 0;
	firstRepeatLine = 0;
	/** After scan() threw: byte offset of the refused line's start in the buffer it was given (rows and lineNo then stand at that line). */
	failedLineStart = -1;
	private prevTime = -Infinity;
	private readonly clock = new ClockCounter();
	private readonly delim: number;
	private readonly eol: number;
	private readonly decQuoted: number;
	private readonly decBare: number;
	/** The delimiter is a run of blanks. */
	private readonly space: boolean;
	/** Lines may take the fast path (no clock column, no space delimiter). */
	private readonly plain: boolean;
	private readonly clockColumn: number;
	private readonly decoder: InstanceType<typeof TextDecoder>;

	constructor(
		private readonly layout: ScanLayout,
		private readonly source: string,
		encoding = 'utf-8',
	) {
		this.delim = layout.delimiter.charCodeAt(0);
		this.eol = layout.lineBreak === '\r' ? CR : LF;
		this.decQuoted = layout.decimalMark.charCodeAt(0);
		this.decBare = this.decQuoted === this.delim ? -1 : this.decQuoted;
		this.space = this.delim === SPACE;
		this.clockColumn = layout.clockColumn ?? -1;
		this.plain = !this.space && this.clockColumn < 0 && layout.columnCount > 0;
		const cap = Math.max(MIN_CAPACITY_ROWS, Math.ceil(layout.capacityRows));
		this.columns = Array.from({ length: layout.columnCount }, () => new Float64Array(cap));
		this.decoder = new TextDecoder(encoding);
	}

	/** Reads whole lines buf[start, end); buf[end - 1] is the line-break byte. */
	scan(buf: Uint8Array, start: number, end: number): void {
		const bodyLine = this.layout.bodyLine;
		let p = start;
		let lineStart = p;
		try {
			while (p < end) {
				lineStart = p;
				if (this.lineNo < bodyLine) {
					const lineEnd = buf.indexOf(this.eol, p);
					p = lineEnd < 0 || lineEnd >= end ? end : lineEnd + 1;
					this.lineNo++;
					continue;
				}
				if (this.rows === this.columns[0].length) this.grow();
				if (this.plain) {
					p = this.scanPlainRows(buf, p, end);
					if (p >= end || this.rows === this.columns[0].length) continue;
					lineStart = p;
				}
				p = this.scanLine(buf, p, end);
			}
		} catch (e) {
			// where the refused line starts, so a caller may read it again (gap-cells.ts)
			this.failedLineStart = lineStart;
			throw e;
		}
	}

	/**
	 * The fast path: reads plain rows from p (K unquoted numbers, each followed directly by the delimiter, the
	 * last by the line break or CR LF, times rising or repeated) until a line of any other shape, the end of
	 * the range or of the columns' capacity; returns the offset of the first line not read.
	 *
	 * The number grammar and arithmetic are readDecimal's (decimal.ts), written out here because V8 does not
	 * inline a reader of this size into the loop and the call costs more than the reading; the property test
	 * in tests/io/csv-number.test.ts holds both to parseFloat.
	 */
	private scanPlainRows(buf: Uint8Array, p: number, end: number): number {
		const { delim, eol, columns: cols } = this;
		const dec = this.decBare;
		const K = cols.length;
		const cap = cols[0].length;
		const tc = this.layout.timeColumn;
		let n = this.rows;
		let prevTime = this.prevTime;
		rows: while (p < end && n < cap) {
			const lineStart = p;
			let b = buf[p];
			for (let c = 0; c < K; c++) {
				const neg = b === MINUS;
				if (neg || b === PLUS) b = buf[++p];
				const numStart = p;
				let m = 0;
				while (b >= DIGIT_0 && b <= DIGIT_9) {
					m = m * 10 + (b - DIGIT_0);
					b = buf[++p];
				}
				let digits = p - numStart;
				let e10 = 0;
				if (b === dec) {
					const fracStart = ++p;
					b = buf[p];
					while (b >= DIGIT_0 && b <= DIGIT_9) {
						m = m * 10 + (b - DIGIT_0);
						b = buf[++p];
					}
					digits += p - fracStart;
					e10 = fracStart - p;
				}
				if (digits === 0) {
					p = lineStart;
					break rows;
				}
				if ((b | ASCII_CASE_BIT) === LOWER_E) {
					b = buf[++p];
					const eneg = b === MINUS;
					if (eneg || b === PLUS) b = buf[++p];
					if (!(b >= DIGIT_0 && b <= DIGIT_9)) {
						p = lineStart;
						break rows;
					}
					let e = 0;
					while (b >= DIGIT_0 && b <= DIGIT_9) {
						if (e < EXPONENT_LIMIT) e = e * 10 + (b - DIGIT_0);
						b = buf[++p];
					}
					e10 += eneg ? -e : e;
				}
				const v = isFastDecimal(m, e10) ? fastDecimal(m, e10) : slowDecimal(buf, numStart, p, dec);
				cols[c][n] = neg ? -v : v;
				if (c < K - 1) {
					if (b !== delim) {
						p = lineStart;
						break rows;
					}
					b = buf[++p];
				}
			}
			if (b === CR && eol !== CR) b = buf[++p];
			if (b !== eol || (tc >= 0 && !(cols[tc][n] > prevTime))) {
				p = lineStart;
				break;
			}
			if (tc >= 0) prevTime = cols[tc][n];
			p++;
			n++;
		}
		this.lineNo += n - this.rows;
		this.rows = n;
		this.prevTime = prevTime;
		return p;
	}

	/** The general path: one line at p (blank, or a row of any shape); returns the offset after it. */
	private scanLine(buf: Uint8Array, p: number, end: number): number {
		const lineStart = p;
		const line = this.lineNo;
		const blankEnd = this.blankLineEnd(buf, p);
		if (blankEnd >= 0) {
			if (this.blankLines++ === 0) this.firstBlankLine = line;
			this.lineNo++;
			return blankEnd;
		}
		const n = this.rows;
		p = this.readRow(buf, p, end, n, line);
		const tc = this.layout.timeColumn;
		if (tc >= 0) {
			const t = this.columns[tc][n];
			if (t > this.prevTime) this.prevTime = t;
			else this.timeNotRising(buf, lineStart, line, t);
		}
		this.rows++;
		this.lineNo++;
		return p + 1;
	}

	/** Columns trimmed to the rows read (views, no copy). */
	result(): Float64Array[] {
		return this.columns.map((c) => c.subarray(0, this.rows));
	}

	/**
	 * For a blank line, or one of delimiters and blanks only (';;;' rows that spreadsheets leave at the end):
	 * the offset after its line break; else -1.
	 */
	private blankLineEnd(buf: Uint8Array, p: number): number {
		const { eol, delim } = this;
		while (buf[p] === SPACE || buf[p] === TAB) p++;
		const b = buf[p];
		if (b !== delim && b !== eol && b !== CR) return -1;
		while (buf[p] === delim || buf[p] === SPACE || buf[p] === TAB) p++;
		if (eol !== CR && buf[p] === CR && buf[p + 1] === eol) p++;
		return buf[p] === eol ? p + 1 : -1;
	}

	/** The general path: reads the line at p into row n; returns the offset of its line break. */
	private readRow(buf: Uint8Array, p: number, end: number, n: number, line: number): number {
		const lineStart = p;
		const K = this.layout.columnCount;
		p = this.skipBlanks(buf, p, true);
		for (let c = 0; c < K; c++) {
			// p is at the first non-blank byte of field c
			const quoted = buf[p] === QUOTE;
			if (quoted) {
				p++;
				while (buf[p] === SPACE) p++;
			}
			const fieldStart = p;
			if (c === this.clockColumn) {
				p = this.readClockCell(buf, p, end, lineStart, line, n, c);
				if (this.layout.clockFields === 2 && c + 1 < K) c++;
			} else p = this.readNumberCell(buf, p, lineStart, line, n, c, quoted);
			p = this.afterCell(buf, p, lineStart, fieldStart, line, c, quoted);
		}
		return p;
	}

	/** Blanks (spaces, and tabs unless tab is the delimiter) from p; `lineStart` skips tabs always. */
	private skipBlanks(buf: Uint8Array, p: number, lineStart = false): number {
		const tabIsBlank = lineStart || this.delim !== TAB;
		while (buf[p] === SPACE || (tabIsBlank && buf[p] === TAB)) p++;
		return p;
	}

	/** A number, or a NaN/Infinity word, into cols[c][n]; returns the offset after it. */
	private readNumberCell(
		buf: Uint8Array,
		p: number,
		lineStart: number,
		line: number,
		n: number,
		c: number,
		quoted: boolean,
	): number {
		const fieldStart = p;
		const next = readDecimal(buf, p, quoted ? this.decQuoted : this.decBare);
		if (next >= 0) {
			this.columns[c][n] = decimalValue[0];
			return next;
		}
		if (next !== NO_DIGITS)
			this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number (digits after the exponent mark)');
		const neg = buf[p] === MINUS;
		if (neg || buf[p] === PLUS) p++;
		const v = nonFiniteWord(buf, p, neg);
		if (Number.isNaN(v) && !isNanWord(buf, p)) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
		if (this.nonFinite++ === 0) this.firstNonFiniteLine = line;
		this.columns[c][n] = v;
		return p + (Number.isNaN(v) ? 3 : wordLength(buf, p));
	}

	/** A time-of-day cell (and with a date field before it, both fields) into cols[c][n] (and [c + 1][n]). */
	private readClockCell(
		buf: Uint8Array,
		p: number,
		end: number,
		lineStart: number,
		line: number,
		n: number,
		c: number,
	): number {
		const { delim, eol } = this;
		const inCell = (e: number) => e < end && buf[e] !== delim && buf[e] !== eol && buf[e] !== CR && buf[e] !== QUOTE;
		let e = p;
		while (inCell(e)) e++;
		const twoFields = this.layout.clockFields === 2 && c + 1 < this.layout.columnCount;
		if (twoFields) {
			// a date field, the delimiter (a run of blanks when that is the delimiter), then the time field
			if (e < end && buf[e] === delim) e++;
			while (this.space && (buf[e] === SPACE || buf[e] === TAB)) e++;
			if (buf[e] === QUOTE) e++;
			while (inCell(e)) e++;
		}
		const text = String.fromCharCode(...buf.subarray(p, Math.min(e, p + MAX_CLOCK_CELL)))
			.split(this.layout.delimiter)
			.join(' ')
			.replace(/"/g, '');
		const v = this.clock.secondsOf(text);
		if (Number.isNaN(v))
			this.fail(buf, lineStart, p, line, 'bad-number', 'a time of day such as 12:00:00.000, like the rows above');
		this.columns[c][n] = v;
		if (twoFields) this.columns[c + 1][n] = v;
		return e;
	}

	/**
	 * After cell c: blanks, the closing quote, then the delimiter (returns the next field's first non-blank
	 * byte) or, after the last cell, the line break (returns its offset); refuses anything else.
	 */
	private afterCell(
		buf: Uint8Array,
		p: number,
		lineStart: number,
		fieldStart: number,
		line: number,
		c: number,
		quoted: boolean,
	): number {
		const { delim, eol, space } = this;
		const K = this.layout.columnCount;
		// common case first: the delimiter right after an unquoted number
		if (buf[p] === delim && !space && !quoted && c < K - 1) return this.skipBlanks(buf, p + 1);
		const cellEnd = p;
		p = this.skipBlanks(buf, p);
		if (quoted) {
			if (buf[p] !== QUOTE) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number inside the quotes');
			p = this.skipBlanks(buf, p + 1);
		}
		if (buf[p] === CR && buf[p + 1] === eol) p++;
		const unquotedEmpty = p === cellEnd && !quoted;
		if (c < K - 1) {
			if (buf[p] === eol) this.fail(buf, lineStart, p, line, 'short-row', `${K} fields, found ${c + 1}`);
			if (space) {
				if (unquotedEmpty) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
				return p;
			}
			if (buf[p] !== delim) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
			return this.skipBlanks(buf, p + 1);
		}
		if (buf[p] === eol) return p;
		if (space) {
			if (unquotedEmpty) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
			this.fail(buf, lineStart, p, line, 'long-row', `${K} fields`);
		}
		if (buf[p] !== delim) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
		return this.trailingDelimiters(buf, p, lineStart, line);
	}

	/** Empty fields at the end of the row are accepted (delimiters, blanks, "" before the line end). */
	private trailingDelimiters(buf: Uint8Array, p: number, lineStart: number, line: number): number {
		const { delim, eol } = this;
		let b = buf[p];
		while (b === delim) {
			b = buf[++p];
			while (b === SPACE || b === TAB || (b === QUOTE && buf[p + 1] === QUOTE && ++p)) b = buf[++p];
			if (b === CR && buf[p + 1] === eol) b = buf[++p];
			if (b !== delim && b !== eol) this.fail(buf, lineStart, p, line, 'long-row', `${this.layout.columnCount} fields`);
		}
		return p;
	}

	private grow(): void {
		const cap = Math.ceil(this.columns[0].length * GROWTH_FACTOR) + GROWTH_STEP_ROWS;
		this.columns = this.columns.map((old) => {
			const next = new Float64Array(cap);
			next.set(old.subarray(0, this.rows));
			return next;
		});
	}

	private timeNotRising(buf: Uint8Array, lineStart: number, line: number, t: number): void {
		const at = fieldOffset(buf, lineStart, this.layout.timeColumn, this.delim, this.eol);
		if (Number.isNaN(t))
			this.fail(buf, lineStart, at, line, 'bad-number', 'a time value (NaN cannot order the samples)');
		if (t === this.prevTime) {
			if (this.repeatedTimes++ === 0) this.firstRepeatLine = line;
			return;
		}
		this.fail(buf, lineStart, at, line, 'time-not-increasing', `a time after ${this.prevTime} (the previous row)`);
	}

	/** Throws the ImportError for the cell (or line end) at byte `at` of the line starting at `lineStart`. */
	fail(buf: Uint8Array, lineStart: number, at: number, line: number, code: FailCode, expected: string): never {
		let lineEnd = lineStart;
		while (lineEnd < buf.length && buf[lineEnd] !== this.eol) lineEnd++;
		if (lineEnd > lineStart && buf[lineEnd - 1] === CR) lineEnd--;
		let cellEnd = at;
		while (cellEnd < lineEnd && buf[cellEnd] !== this.delim) cellEnd++;
		at = Math.min(at, lineEnd);
		const column = this.decoder.decode(buf.subarray(lineStart, at)).length + 1;
		const text =
			code === 'short-row'
				? this.decoder.decode(buf.subarray(lineStart, lineEnd))
				: this.decoder.decode(buf.subarray(at, Math.max(cellEnd, at))).trim();
		throw new ImportError(this.source, line, column, code, text, expected);
	}
}

/** ±Infinity for the words inf / infinity (any case), else NaN (the caller tells a NaN word from a bad cell). */
function nonFiniteWord(buf: Uint8Array, at: number, neg: boolean): number {
	const len = wordLength(buf, at);
	if (len > MAX_NON_FINITE_WORD) return NaN;
	const word = String.fromCharCode(...buf.subarray(at, at + len)).toLowerCase();
	if (word === 'inf' || word === 'infinity') return neg ? -Infinity : Infinity;
	return NaN;
}

/** The word at `at` is NaN in any case. */
function isNanWord(buf: Uint8Array, at: number): boolean {
	const lower = (k: number) => buf[at + k] | ASCII_CASE_BIT;
	return wordLength(buf, at) === 3 && lower(0) === LOWER_N && lower(1) === LOWER_A && lower(2) === LOWER_N;
}

/** Letters (a-z, A-Z) from `at`. */
function wordLength(buf: Uint8Array, at: number): number {
	let p = at;
	while (p < buf.length && (buf[p] | ASCII_CASE_BIT) >= LOWER_A && (buf[p] | ASCII_CASE_BIT) <= LOWER_Z) p++;
	return p - at;
}

/** Byte offset of field `k` in the line starting at `lineStart` (for error positions only). */
function fieldOffset(buf: Uint8Array, lineStart: number, k: number, delim: number, eol: number): number {
	let p = lineStart;
	const space = delim === SPACE;
	while (space && (buf[p] === SPACE || buf[p] === TAB)) p++;
	for (let f = 0; f < k; f++) {
		while (buf[p] !== eol && (space ? buf[p] !== SPACE && buf[p] !== TAB : buf[p] !== delim)) p++;
		if (buf[p] === eol) return p;
		p++;
		while (buf[p] === SPACE || buf[p] === TAB) p++;
	}
	while (!space && buf[p] === SPACE) p++;
	return p;
}
