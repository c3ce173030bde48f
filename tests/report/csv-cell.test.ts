/**
 * The shared CSV cell guard (lib/report/csv-cell.ts) and the writers that use it.
 * Sources: OWASP "CSV Injection" (leading = + - @ tab CR get a leading apostrophe and the field is
 * quoted; from memory) and OWASP ASVS 5.0 requirement 1.2.10 (= + - @ tab NUL); full-width forms
 * U+FF1D U+FF0B U+FF0D U+FF20 per the Unicode "Halfwidth and Fullwidth Forms" block (common practice:
 * some spreadsheets fold them to ASCII). RFC 4180 section 2 rules 6-7 for quoting; papaparse (npm) reads
 * the written fields back as an independent RFC 4180 reader.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, startsLikeFormula } from '../../lib/report/csv-cell.js';
import { reportsToCsv } from '../../lib/report/csv-summary.js';
import type { ReportJson } from '../../lib/report/to-json.js';
import { csvHeader, csvRow } from '../../src/cli/trend/trend-output.js';
import type { TrendRow } from '../../lib/trend/types.js';

/** The one field papaparse reads from a line. */
function readBack(field: string): string {
	if (field === '') return '';
	const parsed = Papa.parse<string[]>(field, { delimiter: ',', newline: '\r\n' });
	expect(parsed.data.length).toBe(1);
	expect(parsed.data[0].length).toBe(1);
	return parsed.data[0][0];
}

const FORMULA_FIRST = ['=', '+', '-', '@', '\t', '\r', '\uFF1D', '\uFF0B', '\uFF0D', '\uFF20'];

describe('csvCell', () => {
	it('csvCell(text) prefixes an apostrophe and quotes a cell starting with = + - @ tab CR (OWASP)', () => {
		expect(csvCell('=HYPERLINK("http://example.invalid")')).toBe(`"'=HYPERLINK(""http://example.invalid"")"`);
		expect(csvCell('+1+1')).toBe(`"'+1+1"`);
		expect(csvCell('@SUM(A1)')).toBe(`"'@SUM(A1)"`);
		expect(csvCell('\t=1+1')).toBe(`"'\t=1+1"`);
		expect(csvCell('\r=1+1')).toBe(`"'\r=1+1"`);
		expect(csvCell('\0=1+1')).toBe(`"'\0=1+1"`);
	});

	it('csvCell(text) guards the full-width = + - @ (U+FF1D U+FF0B U+FF0D U+FF20) as their ASCII twins', () => {
		for (const c of ['\uFF1D', '\uFF0B', '\uFF0D', '\uFF20']) expect(csvCell(`${c}1+1`)).toBe(`"'${c}1+1"`);
	});

	it('csvCell(text) guards formulas that open with a signed number: "-2+3" and -1+T(...)', () => {
		expect(csvCell('-2+3')).toBe(`"'-2+3"`);
		const attack = `-1+T(" rms (")+cmd|' /C calc'!A0+T("")`;
		expect(csvCell(attack)).toBe(`"'${attack.replace(/"/g, '""')}"`);
		expect(startsLikeFormula('-1e3+1')).toBe(true);
	});

	it('csvCell(text) guards a formula behind leading spaces (some spreadsheets trim them)', () => {
		expect(startsLikeFormula('  =1+1')).toBe(true);
		expect(csvCell(' =1+1')).toBe(`"' =1+1"`);
	});

	it('csvCell(text) leaves plain numbers as numbers: -1.5, +2, -3e-4, .5 (data, not formulas)', () => {
		for (const t of ['-1.5', '+2', '-3e-4', '.5', '-0', '1E+6']) {
			expect(startsLikeFormula(t)).toBe(false);
			expect(csvCell(t)).toBe(t);
		}
	});

	it('csvCell(text) leaves plain names alone and quotes delimiter, quote, CR and LF (RFC 4180)', () => {
		expect(csvCell('U1 rms (V)')).toBe('U1 rms (V)');
		expect(csvCell('U1=L1')).toBe('U1=L1');
		expect(csvCell('a,b')).toBe('"a,b"');
		expect(csvCell('a;b', ';')).toBe('"a;b"');
		expect(csvCell('say "hi"')).toBe('"say ""hi"""');
		expect(csvCell('two\nlines')).toBe('"two\nlines"');
		expect(csvCell('')).toBe('');
	});

	it('csvCell(any text) reads back (papaparse) as the text, or the text after one apostrophe, never as a formula', () => {
		const text = fc.oneof(
			fc.string({ unit: 'grapheme', maxLength: 24 }),
			fc.tuple(fc.constantFrom(...FORMULA_FIRST), fc.string({ maxLength: 16 })).map(([a, b]) => a + b),
			fc.double({ noNaN: true }).map(String),
		);
		fc.assert(
			fc.property(text, (t) => {
				const back = readBack(csvCell(t));
				if (back === t) return !startsLikeFormula(t);
				return back === `'${t}` && startsLikeFormula(t);
			}),
			{ numRuns: 400 },
		);
	});
});

describe('CSV writers use the guard', () => {
	const row: TrendRow = {
		interval: '10/12-cycle',
		startS: 0,
		durationS: 0.2,
		cycles: 10,
		frequencyHz: 50,
		complete: true,
		flagged: false,
		rms: [230],
		thdPercent: [1],
	} as TrendRow;

	it('trend csvHeader(channels) guards header cells built from a channel name and unit (COMTRADE attack name)', () => {
		const header = csvHeader([{ name: '-1+T("', unit: `")+cmd|' /C calc'!A0+T(""`, quantity: 'voltage' }], false);
		const cells = Papa.parse<string[]>(header.trim()).data[0];
		const rms = cells[7];
		expect(rms).toBe(`'-1+T(" rms (")+cmd|' /C calc'!A0+T("")`);
		for (const c of cells) expect(startsLikeFormula(c)).toBe(false);
	});

	it('trend csvHeader(channels) guards tab-, CR- and full-width-equals-prefixed channel names', () => {
		for (const name of ['\t=1+1', '\r=1+1', '\uFF1D1+1']) {
			const cells = Papa.parse<string[]>(
				csvHeader([{ name, unit: 'V', quantity: 'voltage' }], false).replace(/\n$/, ''),
				{ newline: '\n' },
			).data[0];
			expect(cells[7]).toBe(`'${name} rms (V)`);
		}
	});

	it('trend csvRow(row, file) guards a file column starting with "-2+"', () => {
		const cells = Papa.parse<string[]>(csvRow(row, '-2+3.csv').trim()).data[0];
		expect(cells[0]).toBe(`'-2+3.csv`);
	});

	it('reportsToCsv (analyse --csv, the browser download) guards a full-width equals sign in a channel name', () => {
		const report = {
			file: '\uFF1Dx.csv',
			cyclesAnalysed: 10,
			channels: [{ name: '\uFF1D1+1', unit: 'V', quantity: 'voltage', harmonics: [], averageResponding: {} }],
			pairs: [],
		} as unknown as ReportJson;
		const lines = reportsToCsv([report]).split('\r\n');
		const cells = Papa.parse<string[]>(lines[1]).data[0];
		expect(cells[0]).toBe(`'\uFF1Dx.csv`);
		expect(cells[1]).toBe(`'\uFF1D1+1`);
	});
});

describe('one guard for every CSV writer', () => {
	/** Every .ts and .svelte file under `dir`. */
	function sources(dir: string): string[] {
		return readdirSync(dir).flatMap((n) => {
			const p = join(dir, n);
			return statSync(p).isDirectory() ? sources(p) : /\.(ts|svelte)$/.test(n) ? [p] : [];
		});
	}

	it('no file in lib/ or src/ but csv-cell.ts carries its own formula-character pattern (a leading = + - @ class)', () => {
		const own = sources('lib')
			.concat(sources('src'))
			.filter(
				(p) => !p.endsWith(join('report', 'csv-cell.ts')) && /\[\^?=\+\\?-@|\^\[=\+/.test(readFileSync(p, 'utf8')),
			);
		expect(own).toEqual([]);
	});
});
