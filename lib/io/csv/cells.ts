/**
 * Cell splitting for the head of a file (preamble, header, preview rows) and the numeric test used by
 * layout detection. Quoted fields go through papaparse, which handles `""` escapes and delimiters inside
 * quotes; the data body never comes here (see scan-rows.ts).
 */
import Papa from 'papaparse';

/** Splits one line into cells. A space delimiter means runs of spaces or tabs; outer blanks are ignored. */
export function splitCells(line: string, delimiter: string): string[] {
	if (delimiter === ' ') {
		const t = line.trim();
		return t === '' ? [] : t.split(/[ \t]+/).map(unquote);
	}
	if (!line.includes('"')) return line.split(delimiter);
	const r = Papa.parse<string[]>(line, { delimiter, quoteChar: '"', header: false, skipEmptyLines: false });
	return r.data[0] ?? [];
}

function unquote(cell: string): string {
	return cell.length >= 2 && cell.startsWith('"') && cell.endsWith('"') ? cell.slice(1, -1).replace(/""/g, '"') : cell;
}

/** Cells without the empty ones at the end (a delimiter at line end), and how many were dropped. */
export function trimTrailingEmpty(cells: string[]): { cells: string[]; dropped: number } {
	let k = cells.length;
	while (k > 0 && cells[k - 1].trim() === '') k--;
	return { cells: k === cells.length ? cells : cells.slice(0, k), dropped: cells.length - k };
}

const NUMBER_POINT = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const NUMBER_COMMA = /^[-+]?(?:\d+,?\d*|,\d+)(?:[eE][-+]?\d+)?$/;
const NON_FINITE = /^[-+]?(nan|inf|infinity)$/i;

/** True when the cell is a number written with `decimalMark` (or NaN / Infinity), as the scanner reads it. */
export function isNumberCell(cell: string, decimalMark: '.' | ','): boolean {
	const t = cell.trim();
	return (decimalMark === '.' ? NUMBER_POINT : NUMBER_COMMA).test(t) || NON_FINITE.test(t);
}

/** The cell as a number with the given decimal mark, NaN when it is not one. */
export function cellValue(cell: string, decimalMark: '.' | ','): number {
	const t = cell.trim();
	if (!isNumberCell(t, decimalMark)) return NaN;
	return parseFloat(decimalMark === ',' ? t.replace(',', '.') : t);
}
