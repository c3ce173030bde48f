/**
 * The checks made before a file is read (src/cli/file-checks.ts) and the escaping of printed names
 * (src/cli/printable.ts). Sources: POSIX file types (regular file, FIFO, character device; common
 * practice), Node's one-read limit of 2^31 - 1 bytes (kIoMaxLength; from memory), ECMA-48 C0/C1 control
 * sets and Unicode UAX #9 directional formatting characters (from memory).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ANALYSE_MAX_FILE_BYTES, bytesWords, readRegularFile, regularFileProblem } from '../../src/cli/file-checks.js';
import { printable, printableJson } from '../../src/cli/printable.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-checks-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('file checks before reading', () => {
	it('readRegularFile(regular file) returns its bytes', () => {
		writeFileSync(join(dir, 'a.csv'), 't,U1\n0,1\n');
		expect(new TextDecoder().decode(readRegularFile(join(dir, 'a.csv')))).toBe('t,U1\n0,1\n');
	});

	it('readRegularFile(FIFO) refuses at once instead of waiting for a writer', () => {
		const fifo = join(dir, 'p.csv');
		if (spawnSync('mkfifo', [fifo]).status !== 0)
			return void console.warn('mkfifo not available: FIFO case not checked');
		expect(() => readRegularFile(fifo)).toThrow('a named pipe (FIFO), not a regular file: only regular files are read');
		expect(regularFileProblem(fifo).message).toMatch(/named pipe/);
	});

	it('readRegularFile(/dev/zero, a folder) refuses a device and a folder', () => {
		expect(() => readRegularFile('/dev/zero')).toThrow('a character device, not a regular file');
		expect(() => readRegularFile(dir)).toThrow('a folder, not a regular file');
	});

	it('readRegularFile(file over the limit) refuses by its size, naming the limit and `sinecheck trend`', () => {
		const big = join(dir, 'big.csv');
		writeFileSync(big, '');
		truncateSync(big, 2 ** 31 + 1); // sparse: no disk used, never read
		expect(ANALYSE_MAX_FILE_BYTES).toBe(2 ** 31 - 1);
		expect(() => readRegularFile(big, ANALYSE_MAX_FILE_BYTES, 'logs/big.csv')).toThrow(
			/the file is 2\.0 GiB, more than the 2 GiB analyse reads into memory at once; for long recordings use `sinecheck trend logs\/big\.csv`/,
		);
	});

	it('readRegularFile(missing) says so in words', () => {
		expect(() => readRegularFile(join(dir, 'none.csv'))).toThrow('cannot read the file: no such file or folder');
	});

	it('bytesWords(n) rounds binary multiples: 512 bytes, 1.5 KiB, 2 GiB', () => {
		expect(bytesWords(512)).toBe('512 bytes');
		expect(bytesWords(1536)).toBe('1.5 KiB');
		expect(bytesWords(2 ** 31)).toBe('2 GiB');
		expect(bytesWords(160 * 2 ** 20)).toBe('160 MiB');
	});
});

describe('printable', () => {
	it('printable(text) escapes C0, DEL, C1, bidi controls and line separators, and keeps other text', () => {
		expect(printable('a\tb\nc\rd')).toBe('a\\tb\\nc\\rd');
		expect(printable('\x1b[31mred\x07')).toBe('\\x1b[31mred\\x07');
		expect(printable('x\x7fy\x9bz')).toBe('x\\x7fy\\x9bz');
		expect(printable('abc\u202ecba\u2066\u2028')).toBe('abc\\u202ecba\\u2066\\u2028');
		expect(printable('Tallowmere Ü1 (V) ±5 %')).toBe('Tallowmere Ü1 (V) ±5 %');
	});

	it('printableJson(JSON) escapes what JSON.stringify leaves raw and still parses to the same value', () => {
		const value = { file: 'a\u009b\u202e\u2028b\x1b.csv' };
		const text = printableJson(JSON.stringify(value));
		expect(text).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u202e\u2028]/);
		expect(JSON.parse(text)).toEqual(value);
	});
});
