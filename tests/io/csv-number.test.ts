// The scanner's numbers against the platform's parseFloat (ECMA-262 StringToNumber, correctly rounded):
// every cell must give the very same binary64 value, bit for bit (Object.is: -0 and NaN included).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../lib/io/csv/index.js';
import { decimalValue, NO_DIGITS, NO_EXPONENT_DIGITS, readDecimal } from '../../lib/io/csv/decimal.js';

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

	it('parseCsv reads numerals around nine and ten significand digits and 2^31, 2^32 as parseFloat does', () => {
		// where a reader summing digits in int32 would overflow (10^9 − 1 < 2^31 − 1 < 10^10): both sides,
		// leading zeros (they count as digits), signs, exponents, and 2^31 − 1, 2^31, 2^32 themselves
		const cells = [
			'999999999',
			'9999999999',
			'-999999999',
			'+123456789',
			'2147483647',
			'2147483648',
			'-4294967296.5',
			'0.000000001',
			'0.0000000001',
			'000000000123',
			'99999.9999',
			'99999.99999',
			'-12345.6789e-3',
			'-12345.67891e-3',
			'123456789E22',
			'1234567890e-25',
			'3599.9999',
		];
		for (const comma of [false, true]) {
			const got = readColumn(cells, comma);
			cells.forEach((c, i) => expect(Object.is(got[i], parseFloat(c)), `${c} -> ${got[i]}`).toBe(true));
		}
		// stated literally (ECMA-262 number values of the numerals)
		expect(readColumn(['9999999999', '2147483648', '-4294967296.5'], false)).toEqual(
			Float64Array.from([9999999999, 2147483648, -4294967296.5]),
		);
	});

	it('parseCsv keeps NaN and Infinity cells as such and says so in a warning', () => {
		const c = parseCsv('t,U1\n0,NaN\n1,-Infinity\n2,inf\n3,1\n', 'n.csv');
		expect(Array.from(c.channels[0].samples)).toEqual([NaN, -Infinity, Infinity, 1]);
		const w = c.diagnostics.find((d) => d.code === 'non-finite-values');
		expect(w?.severity).toBe('warning');
		expect(w?.line).toBe(2);
	});
});

// Hand-built decimal numerals: optional sign, up to 25 integer and 25 fraction digits (past 2^53 and the
// exact powers of ten), an optional exponent in either case with an optional '+', near under- and overflow.
const numeral = fc
	.tuple(
		fc.constantFrom('', '-', '+'),
		fc.string({ unit: fc.constantFrom(...'0123456789'), maxLength: 25 }),
		fc.option(fc.string({ unit: fc.constantFrom(...'0123456789'), maxLength: 25 })),
		fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '+', '-'), fc.nat({ max: 400 }))),
	)
	.filter(([, a, b]) => a.length + (b ?? '').length > 0)
	.map(([s, a, b, e]) => `${s}${a}${b === null ? '' : `.${b}`}${e === null ? '' : `${e[0]}${e[1]}${e[2]}`}`);

describe('readDecimal, the byte-level number reader', () => {
	const bytesOf = (s: string) => new TextEncoder().encode(s);

	it('readDecimal(bytes of a numeral) gives Number(numeral) bit for bit and ends after it (ECMA-262 StringToNumber)', () => {
		fc.assert(
			fc.property(numeral, fc.constantFrom(',', ';', '\n', '\r\n', ' '), (s, after) => {
				const end = readDecimal(bytesOf(s + after), 0, 0x2e);
				expect(end, s).toBe(s.length);
				expect(Object.is(decimalValue[0], Number(s)), `${s} -> ${decimalValue[0]}`).toBe(true);
				expect(Object.is(decimalValue[0], parseFloat(s)), s).toBe(true);
			}),
			{ numRuns: 3000 },
		);
	});

	it('readDecimal(bytes with a decimal comma) gives Number(the point form) bit for bit', () => {
		fc.assert(
			fc.property(numeral, (s) => {
				const end = readDecimal(bytesOf(s.replace('.', ',') + ';'), 0, 0x2c);
				expect(end, s).toBe(s.length);
				expect(Object.is(decimalValue[0], Number(s)), `${s} -> ${decimalValue[0]}`).toBe(true);
			}),
			{ numRuns: 3000 },
		);
	});

	it('readDecimal says NO_DIGITS for words and bare marks, NO_EXPONENT_DIGITS for an exponent mark alone', () => {
		for (const s of ['NaN', 'inf', '-', '+', '.', '-.', 'e5', ''])
			expect(readDecimal(bytesOf(s + ','), 0, 0x2e), s).toBe(NO_DIGITS);
		for (const s of ['1e', '2E+', '-3.5e-']) expect(readDecimal(bytesOf(s + ','), 0, 0x2e), s).toBe(NO_EXPONENT_DIGITS);
	});

	it('parseCsv reads the same cells alike on the plain-row path and, quoted, on the general path', () => {
		fc.assert(
			fc.property(fc.array(numeral, { minLength: 2, maxLength: 30 }), (cells) => {
				const plain = cells.map((c, i) => `${i},${c}`).join('\n');
				const quoted = cells.map((c, i) => `${i},"${c}"`).join('\n');
				const a = parseCsv(`t (s),U1 (V)\n${plain}\n`, 'p.csv').channels[0].samples;
				const b = parseCsv(`t (s),U1 (V)\n${quoted}\n`, 'q.csv').channels[0].samples;
				cells.forEach((c, i) => {
					expect(Object.is(a[i], Number(c)), `${c} -> ${a[i]}`).toBe(true);
					expect(Object.is(b[i], Number(c)), `"${c}" -> ${b[i]}`).toBe(true);
				});
			}),
			{ numRuns: 200 },
		);
	});
});
