// What the CSV reader assumes is said, and what it cannot read is named: the comma read as a delimiter or
// a decimal mark, quantities taken from units, a time unit with nothing to apply to, a decimal mark set
// against the file, option errors. Expected values are read off the fixture text by hand.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { ImportError } from '../../lib/io/import-error.js';
import { parseCsv } from '../../lib/io/csv/index.js';
import type { CsvOptions } from '../../lib/io/csv/index.js';

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

const codes = (c: Capture) => c.diagnostics.map((d) => d.code);
const find = (c: Capture, code: string) => c.diagnostics.filter((d) => d.code === code);

// Library option keys that must not appear in messages shown by both the CLI and the web front end.
const OPTION_KEYS =
	/channels\.|clampMvPerA|shuntOhms|timeUnit|timeColumn|sampleRateHz|decimalMark|headerRow|in the options/;

describe('parseCsv: a comma that is either a delimiter or a decimal mark', () => {
	it('parseCsv(one column named U1, rows like 20,412) reads decimal commas and says it assumed so', () => {
		const c = parseCsv(fixture('decimal-comma-one-column.csv'), 'a.csv', { sampleRateHz: 1000 });
		// the fixture's four rows, read by hand with a decimal comma
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1']);
		expect(Array.from(c.channels[0].samples)).toEqual([20.412, 21.5, -3.25, 4]);
		const a = find(c, 'comma-ambiguous');
		expect(a).toHaveLength(1);
		expect(a[0].severity).toBe('assumption');
		expect(a[0].message).toMatch(/decimal comma assumed because the header has 1 column/i);
		expect(a[0].message).toMatch(/override/i);
		// line 1 is the header, not a preamble
		expect(codes(c)).not.toContain('preamble');
		expect(codes(c)).not.toContain('no-header');
	});

	it('parseCsv(the same rows under a header U1,U2) reads two columns and says it assumed so', () => {
		const c = parseCsv(fixture('comma-two-columns.csv'), 'a.csv', { sampleRateHz: 1000 });
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1', 'U2']);
		// the fixture's rows split at the comma, by hand
		expect(Array.from(c.channels[0].samples)).toEqual([20, 21, -3, 4]);
		expect(Array.from(c.channels[1].samples)).toEqual([412, 5, 25, 0]);
		const a = find(c, 'comma-ambiguous');
		expect(a).toHaveLength(1);
		expect(a[0].severity).toBe('assumption');
		expect(a[0].message).toMatch(/column separators because the header has 2 columns/);
	});

	it('parseCsv(rows like 20,412 with no header) reports the choice as an assumption rather than guessing silently', () => {
		const c = parseCsv('20,412\n21,5\n-3,25\n4,0\n', 'a.csv', { sampleRateHz: 1000 });
		expect(find(c, 'comma-ambiguous').map((d) => d.severity)).toEqual(['assumption']);
	});

	it('parseCsv(the one-column file with the delimiter set to comma) follows the setting with no ambiguity note', () => {
		const c = parseCsv(fixture('decimal-comma-one-column.csv'), 'a.csv', {
			sampleRateHz: 1000,
			delimiter: ',',
			decimalMark: '.',
		});
		expect(c.channels).toHaveLength(2);
		expect(codes(c)).not.toContain('comma-ambiguous');
	});

	it('parseCsv(t,U1 with decimal-point times) is not ambiguous: 0.001,2 cannot be one decimal-comma number', () => {
		const c = parseCsv('t,U1\n0,1\n0.001,2\n0.002,3\n', 'a.csv');
		expect(codes(c)).not.toContain('comma-ambiguous');
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1']);
	});
});

describe('parseCsv: a line of names that does not fit the data', () => {
	it('parseCsv(2 names over 4-column rows) keeps line 1 as a preamble line but warns about it', () => {
		const c = parseCsv('U1,U2\n1,2,3,4\n5,6,7,8\n9,10,11,12\n', 'a.csv', { sampleRateHz: 1000 });
		const w = find(c, 'header-like-preamble');
		// line 1 holds 2 names; the data rows below hold 4 cells each (counted by hand)
		expect(w.map((d) => [d.severity, d.line])).toEqual([['warning', 1]]);
		expect(w[0].message).toMatch(/2 names.*4 column/);
	});
});

describe('parseCsv: a decimal mark set against the file', () => {
	it('parseCsv(decimal-comma file, decimal point set) throws bad-number at the first data cell', () => {
		const e = errorOf(() => parseCsv(fixture('decimal-comma-semicolon.csv'), 'a.csv', { decimalMark: '.' }));
		// line 2 is `0,0000;1,5`: its first cell starts at column 1
		expect([e.code, e.line, e.column, e.text]).toEqual(['bad-number', 2, 1, '0,0000']);
		expect(e.expected).toMatch(/decimal point/);
	});

	it('parseCsv(semicolon file, comma delimiter set) throws bad-number at the first data row, naming the setting', () => {
		const e = errorOf(() => parseCsv('t;U1\n0;1\n1;2\n', 'a.csv', { delimiter: ',' }));
		// line 2 is `0;1`: under a comma delimiter it is one cell starting at column 1
		expect([e.code, e.line, e.column, e.text]).toEqual(['bad-number', 2, 1, '0;1']);
		expect(e.expected).toMatch(/delimiter was set to comma/);
	});
});

describe('parseCsv: quantities and units are reported', () => {
	it('parseCsv(CH2 in mV, I_L1 with no unit) says where each quantity came from, once per channel', () => {
		const c = parseCsv('t (s),CH2 (mV),I_L1\n0,1,2\n0.001,2,3\n0.002,3,4\n', 'a.csv');
		const fromUnit = find(c, 'quantity-from-unit');
		expect(fromUnit.map((d) => d.message)).toEqual(['Channel "CH2" taken as a voltage from its unit mV.']);
		// column 2 of the file (1-based)
		expect(fromUnit[0].column).toBe(2);
		const fromName = c.diagnostics.filter((d) => d.code === 'unit-assumed' || d.code === 'quantity-from-name');
		expect(fromName).toHaveLength(1);
		expect(fromName[0].message).toMatch(/"I_L1".*current/);
	});

	it('parseCsv(a timeUnit for a file without a time column) warns that it was not used', () => {
		const c = parseCsv('U1 (V)\n1\n2\n3\n', 'a.csv', { sampleRateHz: 1000, timeUnit: 'ms' });
		const w = find(c, 'time-unit-unused');
		expect(w.map((d) => d.severity)).toEqual(['warning']);
		// the capture still uses the given rate
		expect(c.sampleRateHz).toBe(1000);
	});
});

describe('parseCsv: messages name no library option keys', () => {
	const inputs: [string, CsvOptions][] = [
		['t,U1 (mV),X\n0,1,2\n1,2,3\n2,3,4\n', {}],
		['t (s),U1 (counts)\n0,1\n0.001,2\n0.002,3\n', {}],
		['0,1\n0.001,2\n0.002,3\n0.003,4\n', {}],
		['t,I1 (mV)\n0,1\n0.001,2\n0.002,3\n', {}],
	];
	for (const [text, options] of inputs) {
		it(`parseCsv(${JSON.stringify(text.split('\n')[0])}) diagnostics are worded for any front end`, () => {
			const c = parseCsv(text, 'a.csv', options);
			expect(c.diagnostics.length).toBeGreaterThan(0);
			for (const d of c.diagnostics) expect(d.message).not.toMatch(OPTION_KEYS);
		});
	}

	it('parseCsv(no time base) says what to give without naming an option key', () => {
		const e = errorOf(() => parseCsv('U1\n1\n2\n3\n', 'a.csv'));
		expect(e.code).toBe('no-time-base');
		expect(e.expected).not.toMatch(OPTION_KEYS);
		expect(e.expected).toMatch(/sample rate/);
	});
});

describe('parseCsv: time column errors', () => {
	it('parseCsv(timeColumn 4 in a 2-column file) names the range with the same base as the option (from 0)', () => {
		const e = errorOf(() => parseCsv('t,U1\n0,1\n1,2\n', 'a.csv', { timeColumn: 4 }));
		expect(e.code).toBe('bad-option');
		// CsvOptions.timeColumn is documented 0-based; two columns give indexes 0 and 1
		expect(e.expected).toMatch(/from 0 to 1, counting from 0/);
		expect(e.text).toMatch(/4/);
	});

	it('parseCsv(a sample-number column and no rate) quotes the header cell as written', () => {
		const e = errorOf(() => parseCsv('n,U1\n0,1\n1,2\n2,3\n', 'a.csv'));
		// the header `n` on line 1, column 1
		expect([e.code, e.line, e.column, e.text]).toEqual(['no-time-base', 1, 1, 'n']);
	});

	it('parseCsv(an unnamed sample-number column and no rate) quotes its first cell, not an invented name', () => {
		const e = errorOf(() => parseCsv('0,1\n1,2\n2,3\n3,4\n', 'a.csv'));
		// no header: the first data row is line 1, its first cell `0`
		expect([e.code, e.line, e.column, e.text]).toEqual(['no-time-base', 1, 1, '0']);
	});
});
