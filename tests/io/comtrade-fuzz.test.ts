import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isImportError, parseComtrade, parseComtradeCff } from '../../lib/index.js';
import {
	comtradeCffBytes,
	comtradeCfgText,
	comtradeDatBytes,
	type WriterSpec,
} from '../../sample-waves/writers/comtrade.js';

// Property: on any input the COMTRADE readers return a capture or throw the typed ImportError,
// never anything else, and they finish (vitest's timeout bounds every property run).
function readsOrRefuses(f: () => unknown): boolean {
	try {
		const c = f() as { channels: unknown[] };
		return Array.isArray(c.channels);
	} catch (e) {
		if (isImportError(e)) return true;
		throw e; // fast-check reports the input and this error
	}
}

const enc = new TextEncoder();
const cfgText = readFileSync('tests/fixtures/comtrade/good-1999.cfg', 'utf8');
const datText = readFileSync('tests/fixtures/comtrade/good-1999.dat', 'utf8');

function binarySpec(fileType: WriterSpec['fileType']): WriterSpec {
	const n = 24;
	return {
		station: 'Fuzz',
		device: 'bench',
		revYear: 2013,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 1200, endSample: n }],
		firstData: '01/01/2026,00:00:00.000000',
		trigger: '01/01/2026,00:00:00.005000',
		fileType,
		analog: [{ name: 'U1', unit: 'V', values: Array.from({ length: n }, (_, k) => 300 * Math.sin(k / 3)) }],
		digital: [{ name: 'trip', states: Array.from({ length: n }, (_, k) => k & 1) }],
	};
}

// Characters that make a .cfg line mean something else: digits, separators, line ends, signs, letters of A/D/P/S.
const cfgChar = fc.constantFrom(...'0123456789,,\n\r-+.eE/:ADPSadps x');

function mutate(text: string, edits: { at: number; ch: string; op: number }[]): string {
	let s = text;
	for (const { at, ch, op } of edits) {
		const i = s.length === 0 ? 0 : at % (s.length + 1);
		s =
			op === 0
				? s.slice(0, i) + ch + s.slice(i + 1)
				: op === 1
					? s.slice(0, i) + ch + s.slice(i)
					: s.slice(0, i) + s.slice(i + 1);
	}
	return s;
}
const edits = fc.array(fc.record({ at: fc.nat(), ch: cfgChar, op: fc.integer({ min: 0, max: 2 }) }), {
	minLength: 1,
	maxLength: 6,
});

describe('COMTRADE readers under fuzzing (fast-check)', () => {
	it('parseComtrade(random text, random bytes) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(fc.string({ maxLength: 400 }), fc.uint8Array({ maxLength: 400 }), (cfg, dat) =>
				readsOrRefuses(() => parseComtrade(cfg, dat, 'r.cfg')),
			),
			{ numRuns: 300 },
		);
	});

	it('parseComtrade(truncated .cfg, truncated .dat) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(fc.nat({ max: cfgText.length }), fc.nat({ max: datText.length }), (a, b) =>
				readsOrRefuses(() => parseComtrade(cfgText.slice(0, a), enc.encode(datText.slice(0, b)), 't.cfg')),
			),
			{ numRuns: 300 },
		);
	});

	it('parseComtrade(mutated .cfg, mutated ASCII .dat) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(edits, edits, (e1, e2) =>
				readsOrRefuses(() => parseComtrade(mutate(cfgText, e1), enc.encode(mutate(datText, e2)), 'm.cfg')),
			),
			{ numRuns: 500 },
		);
	});

	for (const ft of ['BINARY', 'BINARY32', 'FLOAT32'] as const) {
		it(`parseComtrade(mutated .cfg, byte-flipped ${ft} .dat) returns a capture or throws ImportError`, () => {
			const spec = binarySpec(ft);
			const cfg = comtradeCfgText(spec);
			const dat = comtradeDatBytes(spec);
			fc.assert(
				fc.property(
					edits,
					fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 8 }),
					fc.nat({ max: dat.length }),
					(e, flips, cut) => {
						const d = dat.slice(0, cut);
						for (const [at, v] of flips) if (d.length > 0) d[at % d.length] = v;
						return readsOrRefuses(() => parseComtrade(mutate(cfg, e), d, 'b.cfg'));
					},
				),
				{ numRuns: 300 },
			);
		});
	}

	it('parseComtradeCff(random, truncated or byte-flipped .cff) returns a capture or throws ImportError', () => {
		const cff = comtradeCffBytes(binarySpec('BINARY'));
		fc.assert(
			fc.property(fc.uint8Array({ maxLength: 300 }), (b) => readsOrRefuses(() => parseComtradeCff(b, 'r.cff'))),
			{ numRuns: 200 },
		);
		fc.assert(
			fc.property(
				fc.nat({ max: cff.length }),
				fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 6 }),
				(cut, flips) => {
					const b = cff.slice(0, cut);
					for (const [at, v] of flips) if (b.length > 0) b[at % b.length] = v;
					return readsOrRefuses(() => parseComtradeCff(b, 'm.cff'));
				},
			),
			{ numRuns: 400 },
		);
	});

	it('the property itself fails on an error that is not an ImportError (guards against a check that cannot fail)', () => {
		expect(() =>
			readsOrRefuses(() => {
				throw new TypeError('boom');
			}),
		).toThrow(TypeError);
		expect(readsOrRefuses(() => parseComtrade('', new Uint8Array(0), 'e.cfg'))).toBe(true);
	});
});
