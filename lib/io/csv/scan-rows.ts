/**
 * The data-body scanner: bytes straight into one growable Float64Array per column, no strings, no row
 * objects. Numbers are read in the scanner (decimal point or comma) and come out bit-identical to
 * parseFloat: a decimal significand below 2^53 (exact) scaled by an exact power of ten
 * (10^0..10^22 are exact in binary64) takes one correctly rounded multiply or divide (Clinger's fast
 * path, W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990); anything else goes to
 * parseFloat on the same characters.
 *
 * Contract: every range handed to scan() consists of whole lines, each ending with the line-break byte.
 */
import { ImportError } from '../import-error.js';
import { ClockCounter } from './clock-time.js';

const POW10 = new Float64Array(23).map((_, i) => Number(`1e${i}`));
// m * 10 + d is exact while the result stays below 2^53, and m only grows: a final m <= 2^53 - 1 was
// accumulated without rounding.
const MAX_EXACT = Number.MAX_SAFE_INTEGER;

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
	private readonly decoder: InstanceType<typeof TextDecoder>;

	constructor(
		private readonly layout: ScanLayout,
		private readonly source: string,
		encoding = 'utf-8',
	) {
		this.delim = layout.delimiter.charCodeAt(0);
		this.eol = layout.lineBreak === '\r' ? 13 : 10;
		this.decQuoted = layout.decimalMark.charCodeAt(0);
		this.decBare = this.decQuoted === this.delim ? -1 : this.decQuoted;
		const cap = Math.max(16, Math.ceil(layout.capacityRows));
		this.columns = Array.from({ length: layout.columnCount }, () => new Float64Array(cap));
		this.decoder = new TextDecoder(encoding);
	}

	/** Reads whole lines buf[start, end); buf[end - 1] is the line-break byte. */
	scan(buf: Uint8Array, start: number, end: number): void {
		const delim = this.delim;
		const eol = this.eol;
		const space = delim === 32;
		const K = this.layout.columnCount;
		const tc = this.layout.timeColumn;
		const decQ = this.decQuoted;
		const decB = this.decBare;
		const clockCol = this.layout.clockColumn ?? -1;
		const bodyLine = this.layout.bodyLine;
		let cols = this.columns;
		let cap = cols.length > 0 ? cols[0].length : 0;
		let n = this.rows;
		let line = this.lineNo;
		let p = start;
		let lineStart = p;
		try {
			while (p < end) {
				lineStart = p;
				let b = buf[p];
				if (line < bodyLine) {
					while (b !== eol) b = buf[++p];
					p++;
					line++;
					continue;
				}
				while (b === 32 || b === 9) b = buf[++p];
				if (b === delim || b === eol || b === 13) {
					// a blank line, or one of delimiters only (';;;' rows that spreadsheets leave at the end)
					let q = p;
					while (buf[q] === delim || buf[q] === 32 || buf[q] === 9) q++;
					if (eol !== 13 && buf[q] === 13 && buf[q + 1] === eol) q++;
					if (buf[q] !== eol) q = -1;
					if (q >= 0) {
						if (this.blankLines++ === 0) this.firstBlankLine = line;
						p = q + 1;
						line++;
						b = buf[p];
						continue;
					}
				}
				if (n === cap) {
					this.rows = n;
					this.grow();
					cols = this.columns;
					cap = cols[0].length;
				}
				for (let c = 0; c < K; c++) {
					// p is at the first non-blank byte of field c
					let quoted = false;
					if (b === 34) {
						quoted = true;
						b = buf[++p];
						while (b === 32) b = buf[++p];
					}
					const fieldStart = p;
					let v: number;
					if (c === clockCol) {
						let e = p;
						while (e < end && buf[e] !== delim && buf[e] !== eol && buf[e] !== 13 && buf[e] !== 34) e++;
						if (this.layout.clockFields === 2 && c + 1 < K) {
							// a date field, the delimiter (a run of blanks when that is the delimiter), then the time field
							if (e < end && buf[e] === delim) e++;
							while (space && (buf[e] === 32 || buf[e] === 9)) e++;
							if (buf[e] === 34) e++;
							while (e < end && buf[e] !== delim && buf[e] !== eol && buf[e] !== 13 && buf[e] !== 34) e++;
						}
						const text = String.fromCharCode(...buf.subarray(p, Math.min(e, p + 64)))
							.split(this.layout.delimiter)
							.join(' ')
							.replace(/"/g, '');
						v = this.clock.secondsOf(text);
						if (Number.isNaN(v))
							this.fail(
								buf,
								lineStart,
								fieldStart,
								line,
								'bad-number',
								'a time of day such as 12:00:00.000, like the rows above',
							);
						if (this.layout.clockFields === 2 && c + 1 < K) cols[c++][n] = v;
						p = e;
						b = buf[p];
					} else {
						let neg = false;
						if (b === 45) {
							neg = true;
							b = buf[++p];
						} else if (b === 43) b = buf[++p];
						const numStart = p;
						const dec = quoted ? decQ : decB;
						let m = 0;
						while (b >= 48 && b <= 57) {
							m = m * 10 + (b - 48);
							b = buf[++p];
						}
						let digits = p - numStart;
						let frac = 0;
						if (b === dec) {
							const fracStart = ++p;
							b = buf[p];
							while (b >= 48 && b <= 57) {
								m = m * 10 + (b - 48);
								b = buf[++p];
							}
							frac = p - fracStart;
							digits += frac;
						}
						if (digits === 0) {
							v = this.nonFiniteToken(buf, numStart, neg);
							if (Number.isNaN(v) && !isNanToken(buf, numStart))
								this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
							p = numStart + (Number.isNaN(v) ? 3 : tokenLength(buf, numStart));
							b = buf[p];
							if (this.nonFinite++ === 0) this.firstNonFiniteLine = line;
						} else {
							let e = 0;
							if (b === 101 || b === 69) {
								b = buf[++p];
								let eneg = false;
								if (b === 45) {
									eneg = true;
									b = buf[++p];
								} else if (b === 43) b = buf[++p];
								if (!(b >= 48 && b <= 57))
									this.fail(
										buf,
										lineStart,
										fieldStart,
										line,
										'bad-number',
										'a number (digits after the exponent mark)',
									);
								while (b >= 48 && b <= 57) {
									if (e < 100000) e = e * 10 + (b - 48);
									b = buf[++p];
								}
								if (eneg) e = -e;
							}
							const e10 = e - frac;
							if (m <= MAX_EXACT && e10 >= -22 && e10 <= 22) v = e10 < 0 ? m / POW10[-e10] : m * POW10[e10];
							else v = slowNumber(buf, numStart, p, dec);
							if (neg) v = -v;
						}
					}
					cols[c][n] = v;
					// common case first: the delimiter right after an unquoted number
					if (b === delim && !space && !quoted && c < K - 1) {
						b = buf[++p];
						while (b === 32 || (b === 9 && delim !== 9)) b = buf[++p];
						continue;
					}
					// after the number: blanks, closing quote, then the delimiter or the line end
					const numEnd = p;
					while (b === 32 || (b === 9 && delim !== 9)) b = buf[++p];
					if (quoted) {
						if (b !== 34) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number inside the quotes');
						b = buf[++p];
						while (b === 32 || (b === 9 && delim !== 9)) b = buf[++p];
					}
					if (b === 13 && buf[p + 1] === eol) b = buf[++p];
					if (c < K - 1) {
						if (b === eol) this.fail(buf, lineStart, p, line, 'short-row', `${K} fields, found ${c + 1}`);
						if (space) {
							if (p === numEnd && !quoted) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
						} else {
							if (b !== delim) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
							b = buf[++p];
							while (b === 32 || (b === 9 && delim !== 9)) b = buf[++p];
						}
					} else if (b !== eol) {
						if (space) {
							if (p === numEnd && !quoted) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
							this.fail(buf, lineStart, p, line, 'long-row', `${K} fields`);
						}
						if (b !== delim) this.fail(buf, lineStart, fieldStart, line, 'bad-number', 'a number');
						// empty fields at the end of the row are accepted (a delimiter at line end)
						while (b === delim) {
							b = buf[++p];
							while (b === 32 || b === 9 || (b === 34 && buf[p + 1] === 34 && ++p)) b = buf[++p];
							if (b === 13 && buf[p + 1] === eol) b = buf[++p];
							if (b !== delim && b !== eol) this.fail(buf, lineStart, p, line, 'long-row', `${K} fields`);
						}
					}
				}
				if (tc >= 0) {
					const t = cols[tc][n];
					if (t > this.prevTime) this.prevTime = t;
					else this.timeNotRising(buf, lineStart, line, t);
				}
				p++; // the line break
				n++;
				line++;
				b = buf[p];
			}
		} catch (e) {
			// where the refused line starts, so a caller may read it again (gap-cells.ts)
			this.rows = n;
			this.lineNo = line;
			this.failedLineStart = lineStart;
			throw e;
		}
		this.rows = n;
		this.lineNo = line;
	}

	/** Columns trimmed to the rows read (views, no copy). */
	result(): Float64Array[] {
		return this.columns.map((c) => c.subarray(0, this.rows));
	}

	private grow(): void {
		const cap = Math.ceil(this.columns[0].length * 1.5) + 1024;
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

	private nonFiniteToken(buf: Uint8Array, at: number, neg: boolean): number {
		const len = tokenLength(buf, at);
		if (len > 8) return NaN;
		const word = String.fromCharCode(...buf.subarray(at, at + len)).toLowerCase();
		if (word === 'inf' || word === 'infinity') return neg ? -Infinity : Infinity;
		return NaN;
	}

	/** Throws the ImportError for the cell (or line end) at byte `at` of the line starting at `lineStart`. */
	fail(
		buf: Uint8Array,
		lineStart: number,
		at: number,
		line: number,
		code: 'bad-number' | 'short-row' | 'long-row' | 'time-not-increasing',
		expected: string,
	): never {
		let lineEnd = lineStart;
		while (lineEnd < buf.length && buf[lineEnd] !== this.eol) lineEnd++;
		if (lineEnd > lineStart && buf[lineEnd - 1] === 13) lineEnd--;
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

function isNanToken(buf: Uint8Array, at: number): boolean {
	return (
		tokenLength(buf, at) === 3 && (buf[at] | 32) === 110 && (buf[at + 1] | 32) === 97 && (buf[at + 2] | 32) === 110
	);
}

function tokenLength(buf: Uint8Array, at: number): number {
	let p = at;
	while (p < buf.length && (buf[p] | 32) >= 97 && (buf[p] | 32) <= 122) p++;
	return p - at;
}

/** parseFloat on the number's characters (the decimal comma, if any, read as a point). */
function slowNumber(buf: Uint8Array, from: number, to: number, dec: number): number {
	let s = '';
	for (let i = from; i < to; i++) s += buf[i] === dec ? '.' : String.fromCharCode(buf[i]);
	return parseFloat(s);
}

/** Byte offset of field `k` in the line starting at `lineStart` (for error positions only). */
function fieldOffset(buf: Uint8Array, lineStart: number, k: number, delim: number, eol: number): number {
	let p = lineStart;
	const space = delim === 32;
	while (space && (buf[p] === 32 || buf[p] === 9)) p++;
	for (let f = 0; f < k; f++) {
		while (buf[p] !== eol && (space ? buf[p] !== 32 && buf[p] !== 9 : buf[p] !== delim)) p++;
		if (buf[p] === eol) return p;
		p++;
		while (buf[p] === 32 || buf[p] === 9) p++;
	}
	while (!space && buf[p] === 32) p++;
	return p;
}
