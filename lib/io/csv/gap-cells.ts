/**
 * The CSV reader's "unreadable cells as gaps" option: a data cell that is not a number (an "OVL" an
 * instrument wrote on overload, a stray text, an empty cell) becomes NaN instead of refusing the file, and
 * is listed with its line and column. The time column is never gap-filled: a row without a time cannot be
 * placed. Works beside the fast row scanner: the scanner refuses the line, the line is read again here with
 * its unreadable cells replaced by NaN, and scanning goes on after it.
 */
import type { Diagnostic } from '../../capture.js';
import { isImportError } from '../import-error.js';
import type { RowScanner } from './scan-rows.js';

/** One cell read as a gap. */
export interface CsvGapCell {
	/** 1-based line and column (characters) of the cell in the file. */
	line: number;
	column: number;
	/** 0-based column of the table; 0-based row of the data (= sample index). */
	tableColumn: number;
	row: number;
	/** The cell as written (at most 40 characters). */
	text: string;
}

/** Cells listed one by one; beyond this only counted (a file full of text is not a recording). */
export const GAP_CELLS_LISTED = 1000;

const NON_FINITE = /^(nan|[+-]?inf(inity)?)$/i;

/**
 * True when `cell` reads as a number with the given decimal mark (or a NaN/Infinity word the scanner accepts).
 * Ref: the row scanner's number grammar (scan-rows.ts)
 * @example readsAsNumber('3,25', ',') // true; readsAsNumber('OVL', '.') // false
 */
export function readsAsNumber(cell: string, decimalMark: '.' | ','): boolean {
	const t = cell.trim().replace(/^"\s*(.*?)\s*"$/, '$1');
	const d = decimalMark === ',' ? ',' : '\\.';
	return new RegExp(`^[+-]?(\\d+(${d}\\d*)?|${d}\\d+)([eE][+-]?\\d+)?$`).test(t) || NON_FINITE.test(t);
}

export interface GapContext {
	delimiter: string;
	decimalMark: '.' | ',';
	eol: number;
	/** Table columns that hold time (never gap-filled). */
	timeColumns: number[];
	gaps: CsvGapCell[];
	/** Every gap cell, listed or not. */
	count: number;
}

/** Splits a line into cells with the 1-based character column each starts at. */
function cellsOf(line: string, delimiter: string): { text: string; column: number }[] {
	const out: { text: string; column: number }[] = [];
	if (delimiter === ' ') {
		const re = /[^ \t]+/g;
		for (let m = re.exec(line); m; m = re.exec(line)) out.push({ text: m[0], column: m.index + 1 });
		return out;
	}
	let at = 0;
	for (const text of line.split(delimiter)) {
		out.push({ text, column: at + 1 + (text.length - text.trimStart().length) });
		at += text.length + 1;
	}
	return out;
}

/**
 * Scans buf[start, end) (whole lines) with `scanner`, reading unreadable data cells as NaN gaps.
 * Ref: common practice (a recorder's overload mark loses one sample, not the file)
 * @throws the scanner's ImportError for anything that is not a bad data cell (time, short row, ...)
 */
export function scanWithGaps(scanner: RowScanner, buf: Uint8Array, start: number, end: number, ctx: GapContext): void {
	let p = start;
	while (p < end) {
		try {
			scanner.scan(buf, p, end);
			return;
		} catch (e) {
			if (!isImportError(e) || e.code !== 'bad-number' || scanner.failedLineStart < 0) throw e;
			const lineStart = scanner.failedLineStart;
			let lineEnd = lineStart;
			while (lineEnd < end && buf[lineEnd] !== ctx.eol) lineEnd++;
			const raw = new TextDecoder().decode(buf.subarray(lineStart, lineEnd));
			const cr = raw.endsWith('\r');
			const cells = cellsOf(cr ? raw.slice(0, -1) : raw, ctx.delimiter);
			const bad = cells
				.map((c, k) => (!ctx.timeColumns.includes(k) && !readsAsNumber(c.text, ctx.decimalMark) ? k : -1))
				.filter((k) => k >= 0);
			if (
				bad.length === 0 ||
				cells.some((c, k) => ctx.timeColumns.includes(k) && !readsAsNumber(c.text, ctx.decimalMark))
			)
				throw e;
			const patched =
				cells.map((c, k) => (bad.includes(k) ? 'NaN' : c.text)).join(ctx.delimiter) +
				(cr ? '\r' : '') +
				String.fromCharCode(ctx.eol);
			const before = { nonFinite: scanner.nonFinite, first: scanner.firstNonFiniteLine };
			const row = scanner.rows;
			scanner.failedLineStart = -1;
			scanner.scan(new TextEncoder().encode(patched), 0, patched.length);
			// the NaNs written here are gaps, not NaN cells of the file
			scanner.nonFinite -= bad.length;
			if (scanner.nonFinite === before.nonFinite) scanner.firstNonFiniteLine = before.first;
			for (const k of bad) {
				if (ctx.count++ < GAP_CELLS_LISTED)
					ctx.gaps.push({
						line: e.line,
						column: cells[k].column,
						tableColumn: k,
						row,
						text: cells[k].text.trim().slice(0, 40),
					});
			}
			p = lineEnd + 1;
		}
	}
}

/** The diagnostic listing the gap cells (the first few by line and column). */
export function gapDiagnostic(ctx: GapContext, nameOf: (tableColumn: number) => string): Diagnostic {
	const first = ctx.gaps
		.slice(0, 5)
		.map((g) => `line ${g.line}, column ${g.column} ("${g.text}", ${nameOf(g.tableColumn)})`);
	const more = ctx.count > first.length ? ` and ${ctx.count - first.length} more` : '';
	return {
		code: 'unreadable-cells-as-gaps',
		severity: 'warning',
		line: ctx.gaps[0]?.line,
		column: ctx.gaps[0]?.column,
		message: `${ctx.count} unreadable cell${ctx.count === 1 ? ' was' : 's were'} read as gaps (as asked): ${first.join('; ')}${more}.`,
	};
}
