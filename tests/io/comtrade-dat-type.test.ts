/**
 * A .dat whose content contradicts the file type its .cfg declares is refused with the place of both.
 * An ASCII .dat is text lines; a binary .dat's first record starts with sample number 1 as a
 * little-endian uint32 (bytes 01 00 00 00), so it holds NUL bytes (IEEE C37.111-1999, data file, from memory).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ImportError, parseComtrade } from '../../lib/index.js';

const FIX = 'tests/fixtures/comtrade/';
const cfgAscii = readFileSync(`${FIX}good-1999.cfg`, 'utf8');
const datAscii = new Uint8Array(readFileSync(`${FIX}good-1999.dat`));

function caught(f: () => unknown): ImportError {
	try {
		f();
	} catch (e) {
		if (e instanceof ImportError) return e;
		throw e;
	}
	throw new Error('no error thrown');
}

describe('parseComtrade with a .dat of the wrong type', () => {
	for (const type of ['BINARY', 'BINARY32', 'FLOAT32']) {
		it(`${type} declared, ASCII text given: dat-type-mismatch on line 1 of the .dat, naming the .cfg line`, () => {
			const cfg = cfgAscii.replace(/^ASCII$/m, type);
			const e = caught(() => parseComtrade(cfg, datAscii, 'bench.cfg'));
			expect(e.code).toBe('dat-type-mismatch');
			expect(e.source).toBe('bench.dat');
			expect(e.line).toBe(1);
			expect(e.text).toBe('1,0,100,10,0');
			// the file type is the 11th line of the fixture
			expect(e.expected).toMatch(new RegExp(`declares ${type} \\(bench.cfg line 11\\)`));
		});
	}

	it('ASCII declared, binary records given: dat-type-mismatch at the first NUL byte', () => {
		// one BINARY record of 2 analog and 1 digital channel: n=1, t=0, 100, 10, status 0 (little-endian)
		const rec = new Uint8Array([1, 0, 0, 0, 0, 0, 0, 0, 100, 0, 10, 0, 0, 0]);
		const cfg = cfgAscii.replace(/^1000,4$/m, '1000,1');
		const e = caught(() => parseComtrade(cfg, rec, 'bench.cfg'));
		expect(e.code).toBe('dat-type-mismatch');
		expect(e.line).toBe(0);
		expect(e.column).toBe(2); // byte offset 1 + 1
	});

	it('the same ASCII record, declared ASCII, still reads its 2 analog channels (the .cfg lists 2A)', () => {
		expect(parseComtrade(cfgAscii, datAscii, 'bench.cfg').channels.length).toBe(2);
	});
});
