/**
 * Layout detection on the head of a CSV file: line break, delimiter and decimal mark (scored together,
 * so `0,707;-3,25` reads as semicolon + decimal comma), the first data row, header and units row,
 * preamble, trailing empty columns, and the time column. Every finding becomes a Diagnostic; every
 * finding can be overridden through CsvOptions.
 */
import type { Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { isNumberCell, splitCells, trimTrailingEmpty } from './cells.js';
import { isClockCell, isDataRow, isDateCell } from './clock-time.js';
import { readPreamble } from './preamble.js';
import { chooseTimeColumn } from './time-column.js';
import type { CsvColumnLayout, CsvLayout, CsvOptions } from './types.js';
import { looksLikeUnitsRow, splitNameUnit } from './units.js';

type Delimiter = CsvLayout['delimiter'];
type Mark = CsvLayout['decimalMark'];

const CANDIDATES: [Delimiter, Mark][] = [
	[',', '.'],
	[';', '.'],
	[';', ','],
	['\t', '.'],
	['\t', ','],
	[' ', '.'],
	[' ', ','],
	[',', ','],
];
const NAMES: Record<Delimiter, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', ' ': 'spaces' };
/** Lines of the head examined (enough for any preamble and a good sample of rows; bounds the work on a long head). */
const MAX_LINES = 2000;
/** Data rows kept in the layout's preview (for the time column and clock-stamp guesses downstream). */
const PREVIEW_KEPT_ROWS = 20;

/**
 * Detects the layout of a CSV file from its head (the first few tens of kB, as text).
 *
 * @param head       start of the file as text (a UTF-8 BOM is recognised and skipped)
 * @param options    user overrides; each replaces the matching detection
 * @param wholeFile  true when `head` is the whole file (its last line is then complete)
 * @returns the layout, with a Diagnostic for everything detected or assumed
 * @throws ImportError 'empty-file' for no text, 'no-data' when no row of numbers is found,
 *         'bad-option' when an override points outside the file, 'no-time-base' when neither a time
 *         column nor a sample rate is available, 'bad-number' at the first data cell that a delimiter or
 *         decimal mark set in the options cannot read (when the file reads as numbers without it)
 * @example detectCsvLayout('Time (ms);U1 (V)\r\n0,0;0,707\r\n0,1;-3,25\r\n').decimalMark // ','
 */
export function detectCsvLayout(
	head: string,
	options: CsvOptions = {},
	wholeFile = false,
	source = '<input>',
): CsvLayout {
	checkOptions(options, source);
	const diagnostics: Diagnostic[] = [];
	const bom = head.charCodeAt(0) === 0xfeff;
	const text = bom ? head.slice(1) : head;
	if (text.trim() === '')
		throw new ImportError(source, 1, 0, 'empty-file', '', 'rows of numbers (the file holds no text)');
	const { lines, lineBreak } = headLines(text, wholeFile);
	if (bom) diagnostics.push(info('utf8-bom', 'The file starts with a UTF-8 byte order mark; it was skipped.'));
	if (lineBreak !== '\n')
		diagnostics.push(
			info('line-break', `Lines end with ${lineBreak === '\r\n' ? 'CR LF (Windows)' : 'CR alone (old Mac)'}.`),
		);
	const { d: delimiter, mark: decimalMark, k: columnCount } = chooseReading(lines, options, source, diagnostics);
	const split = (line: string) => splitCells(line, delimiter);
	const rows = findRows(lines, { delimiter, decimalMark, columnCount }, options, source, diagnostics);
	const { headerIdx, unitsIdx, bodyIdx } = rows;
	const preambleEnd = headerIdx ?? bodyIdx;
	const facts = readPreamble(lines.slice(0, preambleEnd), 1, split, delimiter, decimalMark);
	diagnostics.push(...facts.diagnostics);
	if (Object.keys(facts.metadata).length > 0)
		diagnostics.push(
			info(
				'preamble',
				`Lines 1-${preambleEnd} are a preamble of ${Object.keys(facts.metadata).length} entries, kept as metadata.`,
				1,
			),
		);
	const body = bodyHead(lines, rows, split, diagnostics);
	const columns = columnsOf(lines, rows, columnCount, split, diagnostics);
	const layout: CsvLayout = {
		delimiter,
		decimalMark,
		lineBreak,
		bom,
		quoted: body.quoted,
		headerLine: headerIdx === null ? null : headerIdx + 1,
		unitsLine: unitsIdx === null ? null : unitsIdx + 1,
		bodyLine: bodyIdx + 1,
		columnCount,
		trailingEmptyColumns: body.trailingEmptyColumns,
		columns,
		timeColumn: null,
		timeUnit: null,
		timeResolution: null,
		clockFields: 1,
		metadata: facts.metadata,
		statedSampleRateHz: options.sampleRateHz ?? facts.sampleRateHz,
		startTime: facts.startTime,
		nominalFrequencyHz: facts.nominalFrequencyHz,
		preambleChannels: facts.channels,
		preambleAll: facts.all,
		decimation: facts.decimation,
		preview: body.preview.slice(0, PREVIEW_KEPT_ROWS),
		bytesPerRow: bytesPerRow(lines, bodyIdx, lineBreak.length),
		diagnostics,
	};
	// guesses from the rows that read cleanly; a broken row is the scanner's to report
	const clean = body.preview.filter(
		(r) => r.length === columnCount && isDataRow(r, (c) => isNumberCell(c, decimalMark)),
	);
	chooseTimeColumn(layout, clean, options, facts.timeUnit, source);
	return layout;
}

/** The head's line break (the most common of CR LF, LF, CR alone) and its complete lines (at most MAX_LINES). */
function headLines(text: string, wholeFile: boolean): { lines: string[]; lineBreak: CsvLayout['lineBreak'] } {
	const crlf = count(text, '\r\n');
	const lf = count(text, '\n') - crlf;
	const cr = count(text, '\r') - crlf;
	const lineBreak: CsvLayout['lineBreak'] =
		cr > 0 && lf === 0 && crlf === 0 ? '\r' : crlf > 0 && crlf >= lf ? '\r\n' : '\n';
	const eol = lineBreak === '\r' ? '\r' : '\n';
	const lines = text.split(eol, MAX_LINES + 1);
	const complete = wholeFile && lines.length <= MAX_LINES;
	if (lines.length > MAX_LINES || (!complete && !text.endsWith(eol) && lines.length > 1)) lines.pop();
	if (lines.length > 0 && lines[lines.length - 1] === '' && text.endsWith(eol)) lines.pop();
	return { lines: lines.map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l)), lineBreak };
}

type Reading = ReturnType<typeof readAs>;

/**
 * Delimiter and decimal mark, scored together on the rows that are all numbers: most rows of numbers; then
 * a header with as many names as the data has columns; then the wider reading; then the delimiter the text
 * lines above use. Says what it chose (and a comma reading that could go either way).
 */
function chooseReading(lines: string[], options: CsvOptions, source: string, diagnostics: Diagnostic[]): Reading {
	const readings: Reading[] = [];
	let best: Reading | null = null;
	for (const [d, mark] of CANDIDATES) {
		if (options.delimiter !== undefined && options.delimiter !== d) continue;
		if (options.decimalMark !== undefined && options.decimalMark !== mark) continue;
		const r = readAs(lines, d, mark);
		if (r.rows === 0) continue;
		readings.push(r);
		if (!best || r.rows > best.rows || (r.rows === best.rows && better(r, best))) best = r;
	}
	if (!best) {
		// a decimal mark or delimiter that was set but does not fit: name the first cell it cannot read
		if (options.decimalMark !== undefined || options.delimiter !== undefined) forcedMismatch(lines, options, source);
		const lastIdx = lastNonBlank(lines);
		throw new ImportError(
			source,
			lastIdx + 1,
			0,
			'no-data',
			lines[lastIdx] ?? '',
			'rows of numbers separated by commas, semicolons, tabs or spaces',
		);
	}
	const rival = commaRival(readings, best);
	if (rival) diagnostics.push(commaAmbiguity(best, rival));
	const { d: delimiter, mark: decimalMark, k: columnCount } = best;
	diagnostics.push(
		info(
			'delimiter',
			columnCount === 1 && !options.delimiter
				? 'The rows hold one column (no column separator).'
				: `Columns are separated by ${NAMES[delimiter]}${options.delimiter ? ' (as set)' : ''}.`,
		),
	);
	const sawComma = decimalMark === ',' && lines.some((l) => /\d,\d/.test(l));
	diagnostics.push(
		info(
			decimalMark === ',' ? 'decimal-comma' : 'decimal-point',
			decimalMark === ','
				? `Numbers use a decimal comma (0,5 = one half)${sawComma ? '' : ' as set'}.`
				: 'Numbers use a decimal point.',
		),
	);
	return best;
}

/** Commas as column separators and as decimal commas can both fit (`20,412`): the other reading, if so. */
function commaRival(readings: Reading[], best: Reading): Reading | undefined {
	return readings.find(
		(r) =>
			r !== best &&
			r.rows === best.rows &&
			r.k !== best.k &&
			(r.d === ',') !== (best.d === ',') &&
			(r.mark === ',' || best.mark === ','),
	);
}

/** The assumption between two comma readings that fit alike, and why the chosen one won. */
function commaAmbiguity(best: Reading, rival: Reading): Diagnostic {
	const commaMark = best.mark === ',' && best.d !== ',';
	const cols = (k: number) => `${k} column${k === 1 ? '' : 's'}`;
	const why =
		best.header === best.k && rival.header !== rival.k
			? `because the header has ${cols(best.k)}`
			: `because nothing above the numbers tells the two readings apart (${cols(best.k)} taken rather than ${cols(rival.k)})`;
	return {
		code: 'comma-ambiguous',
		severity: 'assumption',
		message: commaMark
			? `Decimal comma assumed ${why}; override with the delimiter and decimal mark settings.`
			: `Commas taken as column separators ${why}, not as decimal commas; override with the delimiter and decimal mark settings.`,
	};
}

interface ChosenReading {
	delimiter: Delimiter;
	decimalMark: Mark;
	columnCount: number;
}

/** 0-based line indices of the header, the units row (null when absent) and the first data row. */
interface TableRows {
	headerIdx: number | null;
	unitsIdx: number | null;
	bodyIdx: number;
}

/** Header, units row and the first data row, as set in the options or found. */
function findRows(
	lines: string[],
	reading: ChosenReading,
	options: CsvOptions,
	source: string,
	diagnostics: Diagnostic[],
): TableRows {
	const rows =
		typeof options.headerRow === 'number'
			? rowsUnderSetHeader(lines, reading, options.headerRow, options, source)
			: rowsFound(lines, reading, options);
	if (rows.bodyIdx < 0)
		throw new ImportError(source, lines.length, 0, 'no-data', '', 'rows of numbers below the header');
	if (rows.headerIdx === null && options.headerRow === undefined) {
		const d = headerLikePreamble(lines, rows.bodyIdx, reading);
		if (d) diagnostics.push(d);
	}
	return rows;
}

/** True when line i is a row of `columnCount` numbers (a clock stamp first allowed). */
function isNumericLine(lines: string[], i: number, { delimiter, decimalMark, columnCount }: ChosenReading): boolean {
	const { cells } = trimTrailingEmpty(splitCells(lines[i], delimiter));
	return cells.length === columnCount && isDataRow(cells, (c) => isNumberCell(c, decimalMark));
}

/** The rows when the header line is set (1-based `headerRow`): data from the first numeric line under it. */
function rowsUnderSetHeader(
	lines: string[],
	reading: ChosenReading,
	headerRow: number,
	options: CsvOptions,
	source: string,
): TableRows {
	if (!Number.isInteger(headerRow) || headerRow < 1 || headerRow > lines.length)
		throw new ImportError(source, 0, 0, 'bad-option', String(headerRow), `a header line between 1 and ${lines.length}`);
	const headerIdx = headerRow - 1;
	let unitsIdx: number | null = options.unitsRow === true ? headerIdx + 1 : null;
	const from = (unitsIdx ?? headerIdx) + 1;
	const bodyIdx = firstIndex(lines.length, from, (i) => isNumericLine(lines, i, reading));
	if (
		options.unitsRow === undefined &&
		bodyIdx === headerIdx + 2 &&
		looksLikeUnitsRow(splitCells(lines[headerIdx + 1], reading.delimiter))
	)
		unitsIdx = headerIdx + 1;
	return { headerIdx, unitsIdx, bodyIdx };
}

/** The rows found: the first numeric line followed by another (or a blank), the data-shaped lines above it, then the header and units rows. */
function rowsFound(lines: string[], reading: ChosenReading, options: CsvOptions): TableRows {
	const numericRow = (i: number) => isNumericLine(lines, i, reading);
	let bodyIdx = firstIndex(
		lines.length,
		0,
		(i) => numericRow(i) && (i + 1 >= lines.length || numericRow(i + 1) || lines[i + 1].trim() === ''),
	);
	if (bodyIdx < 0) bodyIdx = firstIndex(lines.length, 0, numericRow);
	bodyIdx = withBrokenRowsAbove(lines, bodyIdx, reading);
	if (options.headerRow === 'none') return { headerIdx: null, unitsIdx: null, bodyIdx };
	return { ...headerAbove(lines, bodyIdx, reading, options), bodyIdx };
}

/**
 * Rows just above the data that are shaped like data (a number first, or right under a header) but hold a
 * bad cell belong to the data, so the scanner reports them instead of the preamble swallowing them.
 */
function withBrokenRowsAbove(lines: string[], bodyIdx: number, reading: ChosenReading): number {
	const { delimiter, decimalMark, columnCount } = reading;
	const split = (line: string) => splitCells(line, delimiter);
	for (
		let above = previousNonBlank(lines, bodyIdx);
		above >= 0 && bodyIdx > 0;
		above = previousNonBlank(lines, bodyIdx)
	) {
		const cells = trimTrailingEmpty(split(lines[above])).cells;
		if (cells.length === 0 || isTextRow(cells, columnCount, decimalMark)) break;
		const numberFirst = isNumberCell(cells[0], decimalMark) || isClockCell(cells[0]) || isDateCell(cells[0]);
		const underHeader =
			previousNonBlank(lines, above) >= 0 &&
			isTextRow(split(lines[previousNonBlank(lines, above)]), columnCount, decimalMark) &&
			cells.length === columnCount;
		if (!(numberFirst && cells.length >= columnCount - 1) && !underHeader) break;
		bodyIdx = above;
	}
	return bodyIdx;
}

/** The text row right above the data as the header, and the one above that as the header when the first looks like units. */
function headerAbove(
	lines: string[],
	bodyIdx: number,
	{ delimiter, decimalMark, columnCount }: ChosenReading,
	options: CsvOptions,
): Omit<TableRows, 'bodyIdx'> {
	const split = (line: string) => splitCells(line, delimiter);
	const above = previousNonBlank(lines, bodyIdx);
	if (above < 0 || !isTextRow(split(lines[above]), columnCount, decimalMark))
		return { headerIdx: null, unitsIdx: null };
	const above2 = previousNonBlank(lines, above);
	const unitsLike = looksLikeUnitsRow(split(lines[above]));
	if (
		options.unitsRow !== false &&
		above2 >= 0 &&
		(options.unitsRow === true || unitsLike) &&
		isTextRow(split(lines[above2]), columnCount, decimalMark)
	)
		return { headerIdx: above2, unitsIdx: above };
	return { headerIdx: above, unitsIdx: null };
}

/**
 * A line of names right above the numbers that does not match their column count is kept as a preamble
 * line, but said: the names may belong to the data under another delimiter.
 */
function headerLikePreamble(
	lines: string[],
	bodyIdx: number,
	{ delimiter, decimalMark, columnCount }: ChosenReading,
): Diagnostic | null {
	const above = previousNonBlank(lines, bodyIdx);
	const cells = above >= 0 ? trimTrailingEmpty(splitCells(lines[above], delimiter)).cells : [];
	if (
		cells.length > 1 &&
		cells.length !== columnCount &&
		!/[:=]/.test(lines[above]) &&
		cells.every((c) => c.trim() !== '' && !isNumberCell(c, decimalMark) && /[A-Za-z]/.test(c))
	)
		return {
			code: 'header-like-preamble',
			severity: 'warning',
			line: above + 1,
			message: `Line ${above + 1} looks like a header of ${cells.length} names, but the data rows have ${columnCount} column(s); it was kept as a preamble line. Give the header line, the delimiter or the decimal mark if this is wrong.`,
		};
	return null;
}

/** The data rows of the head: quoting, trailing empty columns and the trimmed cells (a preview). */
function bodyHead(
	lines: string[],
	{ headerIdx, bodyIdx }: TableRows,
	split: (line: string) => string[],
	diagnostics: Diagnostic[],
): { quoted: boolean; trailingEmptyColumns: number; preview: string[][] } {
	let trailingEmptyColumns = 0;
	let quoted = false;
	const preview: string[][] = [];
	for (let i = bodyIdx; i < lines.length; i++) {
		if (lines[i].includes('"')) quoted = true;
		const t = trimTrailingEmpty(split(lines[i]));
		trailingEmptyColumns = Math.max(trailingEmptyColumns, t.dropped);
		if (preview.length < MAX_LINES && t.cells.length > 0) preview.push(t.cells.map((c) => c.trim()));
	}
	if (headerIdx !== null && lines[headerIdx].includes('"')) quoted = true;
	if (quoted) diagnostics.push(info('quoted-fields', 'Some fields are in double quotes; the quotes were removed.'));
	if (trailingEmptyColumns > 0)
		diagnostics.push(
			info(
				'trailing-empty-columns',
				`Data rows end with ${trailingEmptyColumns} empty column(s) (a delimiter at line end); ignored.`,
			),
		);
	return { quoted, trailingEmptyColumns, preview };
}

/** Column names and units from the header (and units row); says where they came from. */
function columnsOf(
	lines: string[],
	{ headerIdx, unitsIdx, bodyIdx }: TableRows,
	columnCount: number,
	split: (line: string) => string[],
	diagnostics: Diagnostic[],
): CsvColumnLayout[] {
	// a header may be written as a comment: '# t, U1, U2'
	const headerCells = headerIdx === null ? [] : split(lines[headerIdx].replace(/^\s*(#+|\/\/|%)\s*/, ''));
	const unitCells = unitsIdx === null ? [] : split(lines[unitsIdx]);
	const columns: CsvColumnLayout[] = [];
	for (let c = 0; c < columnCount; c++) {
		const header = (headerCells[c] ?? '').trim();
		const nu = header === '' ? { name: `col${c + 1}`, unitText: '' } : splitNameUnit(header);
		const unitText = (unitCells[c] ?? '').trim().replace(/^[([{]\s*|\s*[)\]}]$/g, '') || nu.unitText;
		columns.push({ index: c, header, name: nu.name, unitText, role: 'channel' });
	}
	if (headerIdx === null) {
		diagnostics.push({
			code: 'no-header',
			severity: 'assumption',
			line: bodyIdx + 1,
			message: `No header line: columns are named col1..col${columnCount}.`,
		});
		return columns;
	}
	diagnostics.push(
		info(
			'header',
			`Line ${headerIdx + 1} holds the channel names${unitsIdx !== null ? `, line ${unitsIdx + 1} their units` : ''}.`,
			headerIdx + 1,
		),
	);
	const extra = trimTrailingEmpty(headerCells).cells.length - columnCount;
	if (extra > 0)
		diagnostics.push({
			code: 'header-longer',
			severity: 'warning',
			line: headerIdx + 1,
			message: `The header names ${extra} more column(s) than the data rows hold; those names were ignored.`,
		});
	return columns;
}

/** How the head reads with delimiter `d` and decimal mark `mark`: the usual width of all-number rows. */
function readAs(
	lines: string[],
	d: Delimiter,
	mark: Mark,
): { d: Delimiter; mark: Mark; k: number; rows: number; hits: number; header: number | null } {
	const widths = new Map<number, number>();
	const firstOf = new Map<number, number>();
	lines.forEach((line, i) => {
		const { cells } = trimTrailingEmpty(splitCells(line, d));
		if (cells.length > 0 && isDataRow(cells, (c) => isNumberCell(c, mark))) {
			widths.set(cells.length, (widths.get(cells.length) ?? 0) + 1);
			if (!firstOf.has(cells.length)) firstOf.set(cells.length, i);
		}
	});
	// the most common width of all-number rows; on a tie the one seen first (the top of the table)
	let k = 0;
	let rows = 0;
	for (const [w, r] of widths) if (r > rows) [k, rows] = [w, r];
	const hits = d === ' ' ? 0 : lines.slice(0, 50).filter((l) => l.includes(d) && /[A-Za-z]/.test(l)).length;
	// the text line right above the first such row, if any: how many names it holds under this reading
	let header: number | null = null;
	const above = rows > 0 ? previousNonBlank(lines, firstOf.get(k)!) : -1;
	if (above >= 0) {
		const cells = trimTrailingEmpty(splitCells(lines[above].replace(/^\s*(#+|\/\/|%)\s*/, ''), d)).cells;
		// a names line with commas in it is no evidence for a reading that does not split at commas
		const commaInNames = d !== ',' && /[A-Za-z0-9)\]]\s*,\s*[A-Za-z([]/.test(lines[above]);
		if (
			!commaInNames &&
			cells.length > 0 &&
			cells.every((c) => c.trim() === '' || (!isNumberCell(c, mark) && !isClockCell(c) && !isDateCell(c)))
		)
			header = cells.length;
	}
	return { d, mark, k, rows, hits, header };
}

/** Tie-break between two readings with as many rows of numbers. */
function better(
	r: { k: number; hits: number; header: number | null },
	best: { k: number; hits: number; header: number | null },
): boolean {
	const fits = r.header === r.k;
	const bestFits = best.header === best.k;
	if (fits !== bestFits) return fits;
	return r.k > best.k || (r.k === best.k && r.hits > best.hits);
}

/**
 * With a delimiter or decimal mark set that fits no row, reads the head without the setting; if that finds
 * rows of numbers, throws 'bad-number' at the first cell of the first such row that the setting cannot read.
 */
function forcedMismatch(lines: string[], options: CsvOptions, source: string): void {
	let free: ReturnType<typeof readAs> | null = null;
	for (const [d, mark] of CANDIDATES) {
		if (options.delimiter !== undefined && options.decimalMark !== undefined) {
			// both set: keep whichever of the two fits on its own
			if (options.delimiter !== d && options.decimalMark !== mark) continue;
		}
		const r = readAs(lines, d, mark);
		if (r.rows > 0 && (!free || r.rows > free.rows || (r.rows === free.rows && better(r, free)))) free = r;
	}
	if (!free) return;
	const mark = options.decimalMark ?? free.mark;
	const d = options.delimiter ?? free.d;
	for (let i = 0; i < lines.length; i++) {
		const { cells } = trimTrailingEmpty(splitCells(lines[i], free.d));
		if (cells.length !== free.k || !isDataRow(cells, (c) => isNumberCell(c, free!.mark))) continue;
		const own = splitCells(lines[i], d);
		let at = 0;
		for (const cell of own) {
			if (!isNumberCell(cell, mark) && !isClockCell(cell) && !isDateCell(cell)) {
				const lead = cell.length - cell.trimStart().length;
				const column = (lines[i].includes('"') ? lines[i].indexOf(cell.trim(), at) : at + lead) + 1;
				const expected =
					options.decimalMark !== undefined && free.mark !== mark
						? `a number with a decimal ${mark === '.' ? 'point' : 'comma'} (the decimal mark was set to "${mark}")`
						: `a number (the delimiter was set to ${NAMES[d]})`;
				throw new ImportError(source, i + 1, Math.max(1, column), 'bad-number', cell.trim(), expected);
			}
			at += cell.length + 1;
		}
		return;
	}
}

function info(code: string, message: string, line?: number): Diagnostic {
	return line === undefined ? { code, message, severity: 'info' } : { code, message, severity: 'info', line };
}

function count(text: string, s: string): number {
	let n = 0;
	for (let i = text.indexOf(s); i >= 0; i = text.indexOf(s, i + s.length)) n++;
	return n;
}

function firstIndex(n: number, from: number, pred: (i: number) => boolean): number {
	for (let i = from; i < n; i++) if (pred(i)) return i;
	return -1;
}

function previousNonBlank(lines: string[], i: number): number {
	for (let j = i - 1; j >= 0; j--) if (lines[j].trim() !== '') return j;
	return -1;
}

function lastNonBlank(lines: string[]): number {
	for (let j = lines.length - 1; j >= 0; j--) if (lines[j].trim() !== '') return j;
	return 0;
}

/** A header or units row: no number in it, and as many cells as the data (extra trailing names allowed). */
function isTextRow(cells: string[], columnCount: number, mark: Mark): boolean {
	const t = trimTrailingEmpty(cells).cells;
	if (t.length < Math.min(columnCount, 2) || t.length < columnCount - 1) return false;
	return t.every((c) => c.trim() === '' || (!isNumberCell(c, mark) && !isClockCell(c) && !isDateCell(c)));
}

function bytesPerRow(lines: string[], bodyIdx: number, eolBytes: number): number {
	let bytes = 0;
	let rows = 0;
	for (let i = bodyIdx; i < lines.length; i++, rows++) bytes += lines[i].length + eolBytes;
	return rows > 0 ? bytes / rows : 64;
}

/** Options that cannot be right are refused before reading ('bad-option', line 0). */
function checkOptions(o: CsvOptions, source: string): void {
	const bad = (what: string, value: unknown, expected: string) => {
		throw new ImportError(source, 0, 0, 'bad-option', `${what} = ${String(value)}`, expected);
	};
	if (o.sampleRateHz !== undefined && !(Number.isFinite(o.sampleRateHz) && o.sampleRateHz > 0))
		bad('sampleRateHz', o.sampleRateHz, 'a sample rate in Hz above 0');
	if (o.jitterTolerance !== undefined && !(o.jitterTolerance >= 0 && o.jitterTolerance < 1e6))
		bad('jitterTolerance', o.jitterTolerance, 'a fraction of a sample interval, 0 or more');
	for (const [name, ch] of Object.entries(o.channels ?? {})) {
		for (const key of ['scale', 'offset', 'probeRatio', 'ctRatio', 'vtRatio', 'clampMvPerA', 'shuntOhms'] as const) {
			const v = ch[key];
			if (v === undefined) continue;
			const positive = key !== 'offset' && key !== 'scale';
			if (!Number.isFinite(v) || (positive && v <= 0) || (key === 'scale' && v === 0))
				bad(`channels.${name}.${key}`, v, positive ? 'a finite number above 0' : 'a finite number (scale not 0)');
		}
	}
}
