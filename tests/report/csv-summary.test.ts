import { describe, expect, it } from 'vitest';
import { csvNumberCell, csvTextCell, CSV_SUMMARY_COLUMNS, csvSummaryHeader } from '../../lib/report/csv-summary.js';

// Formula injection: a spreadsheet evaluates a cell that starts with = + - @ (tab and CR are stripped by
// some programs first). Guard: leading apostrophe, then quote (OWASP "CSV Injection", from memory).
// Quoting: RFC 4180 section 2 (fields with comma, quote, CR or LF are enclosed in double quotes; a quote
// inside is doubled).
describe('csvTextCell', () => {
	it('csvTextCell(text) prefixes an apostrophe and quotes a cell starting with =, +, -, @, tab or CR', () => {
		expect(csvTextCell('=HYPERLINK("http://x","y")')).toBe(`"'=HYPERLINK(""http://x"",""y"")"`);
		expect(csvTextCell('+1+1')).toBe(`"'+1+1"`);
		expect(csvTextCell('-1.5')).toBe('-1.5'); // a plain number stays a number
		expect(csvTextCell('-2+3')).toBe(`"'-2+3"`);
		expect(csvTextCell('@SUM(A1)')).toBe(`"'@SUM(A1)"`);
		expect(csvTextCell('\t=1')).toBe(`"'\t=1"`);
		expect(csvTextCell('\r=1')).toBe(`"'\r=1"`);
	});

	it('csvTextCell(text) leaves a plain name as it is and quotes commas and quotes per RFC 4180', () => {
		expect(csvTextCell('U1')).toBe('U1');
		expect(csvTextCell('a,b')).toBe('"a,b"');
		expect(csvTextCell('say "hi"')).toBe('"say ""hi"""');
		expect(csvTextCell('two\nlines')).toBe('"two\nlines"');
		expect(csvTextCell('')).toBe('');
	});

	it('csvTextCell(text) keeps an equals sign that is not the first character', () => {
		expect(csvTextCell('U1=L1')).toBe('U1=L1');
	});
});

describe('csvNumberCell', () => {
	it('csvNumberCell(x) writes the shortest round-trip decimal and an empty cell for NaN, Infinity and null', () => {
		expect(csvNumberCell(230.5)).toBe('230.5');
		expect(csvNumberCell(-0.25)).toBe('-0.25');
		expect(Number(csvNumberCell(0.1 + 0.2))).toBe(0.1 + 0.2);
		expect(csvNumberCell(NaN)).toBe('');
		expect(csvNumberCell(Infinity)).toBe('');
		expect(csvNumberCell(null)).toBe('');
	});
});

describe('csvSummaryHeader', () => {
	it('csvSummaryHeader() names every column once, starting with file and channel', () => {
		const cols = csvSummaryHeader().split(',');
		expect(cols).toEqual([...CSV_SUMMARY_COLUMNS]);
		expect(new Set(cols).size).toBe(cols.length);
		expect(cols.slice(0, 2)).toEqual(['file', 'channel']);
	});
});
