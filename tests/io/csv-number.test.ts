// The scanner's numbers against the platform's parseFloat (ECMA-262 StringToNumber, correctly rounded):
// every cell must give the very same binary64 value, bit for bit (Object.is: -0 and NaN included).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../lib/io/csv/index.js';

/** Reads `cells` as column U1 of a file with an index-like time column; returns the samples. */
function readColumn(cells: string[], comma: boolean): Float64Array {
	const d = comma ? ';' : ',';
	// a first row of 0 keeps at least two rows, so the time column gives a rate
	const body = ['0', ...cells].map((c, i) => `${i}${d}${comma ? c.replace('.', ',') : c}`).join('\n');
	return parseCsv(`t (s)${d}U1 (V)\n${body}\n`, 'n.csv').channels[0].samples.subarray(1);
}

const printed = fc.oneof(
	fc.double({ noNaN: true }).map((x) => String(x)),
	fc
		.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 0, max: 20 }))
		.map(([x, k]) => x.toExponential(k)),
	fc
		.tuple(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 12 }))
		.map(([x, k]) => x.toFixed(k)),
	fc
		.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 1, max: 21 }))
		.map(([x, k]) => x.toPrecision(k)),
	// hand-built numerals: long significands (past 2^53), exponents near under- and overflow
	fc
		.tuple(
			fc.constantFrom('', '-', '+'),
			fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: 1, maxLength: 25 }),
			fc.string({ unit: fc.constantFrom(...'0123456789'), maxLength: 25 }),
			fc.option(fc.integer({ min: -400, max: 400 })),
		)
		.map(([s, a, b, e]) => `${s}${a}${b ? `.${b}` : ''}${e === null ? '' : `e${e}`}`),
);

describe('CSV number scanner', () => {
	it('parseCsv(cells) gives parseFloat(cell) bit for bit, decimal point', () => {
		fc.assert(
			fc.property(fc.array(printed, { minLength: 1, maxLength: 40 }), (cells) => {
				const got = readColumn(cells, false);
				cells.forEach((c, i) => expect(Object.is(got[i], parseFloat(c)), `${c} -> ${got[i]}`).toBe(true));
			}),
			{ numRuns: 300 },
		);
	});

	it('parseCsv(cells with a decimal comma, semicolon-separated) gives parseFloat of the point form bit for bit', () => {
		fc.assert(
			fc.property(fc.array(printed, { minLength: 1, maxLength: 40 }), (cells) => {
				const got = readColumn(cells, true);
				cells.forEach((c, i) => expect(Object.is(got[i], parseFloat(c)), `${c} -> ${got[i]}`).toBe(true));
			}),
			{ numRuns: 300 },
		);
	});

	it('parseCsv reads the edge numerals as parseFloat does: -0, 5e-324, 1.7976931348623157e308, 9007199254740993, .5, 1.', () => {
		const cells = [
			'-0',
			'5e-324',
			'1.7976931348623157e308',
			'9007199254740993',
			'.5',
			'1.',
			'0.1',
			'1e23',
			'2.2250738585072011e-308',
		];
		const got = readColumn(cells, false);
		cells.forEach((c, i) => expect(Object.is(got[i], parseFloat(c)), c).toBe(true));
		// values stated literally (ECMA-262 number values): 0.5, 1, the nearest double to 9007199254740993 is 2^53
		expect([got[4], got[5], got[3]]).toEqual([0.5, 1, 2 ** 53]);
	});

	it('parseCsv keeps NaN and Infinity cells as such and says so in a warning', () => {
		const c = parseCsv('t,U1\n0,NaN\n1,-Infinity\n2,inf\n3,1\n', 'n.csv');
		expect(Array.from(c.channels[0].samples)).toEqual([NaN, -Infinity, Infinity, 1]);
		const w = c.diagnostics.find((d) => d.code === 'non-finite-values');
		expect(w?.severity).toBe('warning');
		expect(w?.line).toBe(2);
	});
});
