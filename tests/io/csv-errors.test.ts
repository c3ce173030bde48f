// One fixture per error code (tests/fixtures/csv/<code>.csv, layouts of our own). Line and column are
// counted by hand from the fixture text, which is the reference here.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ImportError, isImportError } from '../../lib/io/import-error.js';
import { CsvStreamReader, parseCsv } from '../../lib/io/csv/index.js';

const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../fixtures/csv/${name}`, import.meta.url)));

function errorOf(run: () => unknown): ImportError {
	try {
		run();
	} catch (e) {
		expect(e).toBeInstanceOf(ImportError);
		return e as ImportError;
	}
	throw new Error('expected an ImportError, got a capture');
}

const cases: { file: string; code: string; line: number; column: number; text: string }[] = [
	// line 4 is `0.0002,2.7 V,0.75`: the second field starts after 7 characters
	{ file: 'bad-number.csv', code: 'bad-number', line: 4, column: 8, text: '2.7 V' },
	// line 4 is `0,2` then CR LF: the missing field would start at column 4
	{ file: 'short-row.csv', code: 'short-row', line: 4, column: 4, text: '0,2' },
	// line 3 is `0.001<TAB>3<TAB>4<TAB>5`: the fourth field starts at column 11
	{ file: 'long-row.csv', code: 'long-row', line: 3, column: 11, text: '5' },
	// line 5 goes back from 0.002 s to 0.0015 s
	{ file: 'time-not-increasing.csv', code: 'time-not-increasing', line: 5, column: 1, text: '0.0015' },
	// a text cell in the 2nd data row of a short file: line 3 is `0.0001,abc`, `0.0001,` is 7 characters,
	// so `abc` starts at column 8; the header on line 1 stays the header (not a preamble)
	{ file: 'text-cell-second-row.csv', code: 'bad-number', line: 3, column: 8, text: 'abc' },
	{ file: 'empty-file.csv', code: 'empty-file', line: 1, column: 0, text: '' },
	// a PNG signature: its first NUL byte is at byte offset 8 (line 0, column = offset + 1 for binary input)
	{ file: 'binary-as-text.csv', code: 'binary-as-text', line: 0, column: 9, text: '00 00 00 0d 49 48 44 52' },
	// two text lines and no number: reported at the last line
	{ file: 'no-data.csv', code: 'no-data', line: 2, column: 0, text: 'Note,readings follow on the next sheet' },
	// no time column, no rate in a preamble, none given: reported at the header line
	{ file: 'no-time-base.csv', code: 'no-time-base', line: 1, column: 0, text: '' },
];

describe('parseCsv errors', () => {
	for (const c of cases) {
		it(`parseCsv(${c.file}) throws ImportError ${c.code} at line ${c.line}, column ${c.column}`, () => {
			const e = errorOf(() => parseCsv(fixture(c.file), c.file));
			expect({ code: e.code, line: e.line, column: e.column, text: e.text, source: e.source }).toEqual({
				...c,
				source: c.file,
				file: undefined,
			});
			expect(e.expected.length).toBeGreaterThan(0);
			expect(isImportError(e)).toBe(true);
		});
	}

	it('parseCsv(the same fixtures fed one byte at a time) throws the same error at the same place', () => {
		for (const c of cases) {
			const bytes = fixture(c.file);
			const e = errorOf(() => {
				const r = new CsvStreamReader(c.file);
				for (let i = 0; i < bytes.length; i++) r.push(bytes.subarray(i, i + 1));
				return r.finish();
			});
			expect([c.file, e.code, e.line, e.column]).toEqual([c.file, c.code, c.line, c.column]);
		}
	});

	it('parseCsv(options pointing outside the file) throws bad-option', () => {
		expect(errorOf(() => parseCsv('t,U1\n0,1\n1,2\n', 'a.csv', { timeColumn: 5 })).code).toBe('bad-option');
		expect(errorOf(() => parseCsv('t,U1\n0,1\n1,2\n', 'a.csv', { headerRow: 9 })).code).toBe('bad-option');
		expect(errorOf(() => parseCsv('U1\n1\n2\n', 'a.csv', { sampleRateHz: -5 })).text).toBe('sampleRateHz = -5');
		expect(errorOf(() => parseCsv('t,U1\n0,1\n1,2\n', 'a.csv', { channels: { U1: { shuntOhms: 0 } } })).code).toBe(
			'bad-option',
		);
	});

	it('parseCsv(an empty cell) throws bad-number at that cell, not a silent NaN', () => {
		const e = errorOf(() => parseCsv('t,U1,U2\n0,1,2\n1,,3\n', 'a.csv'));
		expect([e.code, e.line, e.column]).toEqual(['bad-number', 3, 3]);
	});

	it('parseCsv(a bad cell in the first data row) reports it rather than taking the row as a preamble', () => {
		const e = errorOf(() => parseCsv('t,U1\n0,abc\n0.001,2\n0.002,3\n', 'a.csv'));
		expect([e.code, e.line, e.column, e.text]).toEqual(['bad-number', 2, 3, 'abc']);
		const f = errorOf(() => parseCsv('0,1\n0.001,2,\n0.002;3\n0.003,4\n0.004,5\n', 'b.csv'));
		expect([f.code, f.line, f.column, f.text]).toEqual(['bad-number', 3, 1, '0.002;3']);
	});

	it('parseCsv(a number with two decimal points) throws bad-number with the cell text', () => {
		const e = errorOf(() => parseCsv('t,U1\n0,1\n1,2.5.1\n', 'a.csv'));
		expect([e.code, e.line, e.column, e.text]).toEqual(['bad-number', 3, 3, '2.5.1']);
	});

	it('parseCsv(a truncated last line) throws short-row rather than loading part of the row', () => {
		const e = errorOf(() => parseCsv('t;U1;U2\n0;1;2\n1;3', 'a.csv'));
		expect([e.code, e.line, e.column]).toEqual(['short-row', 3, 4]);
	});

	it('parseCsv(UTF-16 text without a byte order mark) says so in the binary-as-text error', () => {
		const text = 't,U1\n0,1\n1,2\n';
		const bytes = new Uint8Array(text.length * 2);
		for (let i = 0; i < text.length; i++) bytes[2 * i] = text.charCodeAt(i);
		const e = errorOf(() => parseCsv(bytes, 'a.csv'));
		expect([e.code, e.line, e.column]).toEqual(['binary-as-text', 0, 2]);
		expect(e.expected).toMatch(/UTF-16/);
	});

	it('ImportError message names file, line, column, code and the offending text', () => {
		const e = errorOf(() => parseCsv(fixture('bad-number.csv'), 'bad-number.csv'));
		expect(e.message).toBe('bad-number.csv:4:8: bad-number: expected a number, got "2.7 V"');
	});
});
