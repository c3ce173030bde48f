/**
 * The error-line shape shared by `analyse` and `trend` (src/cli/error-line.ts):
 * `sinecheck: <path as given>[:line[:column]]: <message>`, line and column only when known (a 0 is left
 * out), `byte N` for a binary file, whose ImportError carries line 0 and column = offset + 1
 * (lib/io/import-error.ts). Expected lines are written from that rule.
 */
import { describe, expect, it } from 'vitest';
import { ImportError } from '../../lib/io/import-error.js';
import { errorLine, errorPlace, problemFrom, problemLine } from '../../src/cli/error-line.js';
import { problemText } from '../../src/cli/analyse-unit.js';
import { trendErrorLine } from '../../src/cli/trend/trend-command.js';
import { UsageError } from '../../src/cli/usage-error.js';

describe('error lines', () => {
	it('errorPlace(file, line, column) leaves out a 0 line or column and names a binary offset as byte N', () => {
		expect(errorPlace('logs/a.csv', 12, 7)).toBe('logs/a.csv:12:7');
		expect(errorPlace('logs/a.csv', 3, 0)).toBe('logs/a.csv:3');
		expect(errorPlace('logs/a.csv', 0, 0)).toBe('logs/a.csv');
		expect(errorPlace('logs/a.csv')).toBe('logs/a.csv');
		expect(errorPlace('rec/b.wav', 0, 1)).toBe('rec/b.wav: byte 0');
		expect(errorPlace('rec/b.wav', 0, 37)).toBe('rec/b.wav: byte 36');
	});

	it('errorLine(ImportError, path) gives sinecheck: place: code: expected …, got "text"', () => {
		expect(errorLine(new ImportError('logs/a.csv', 12, 7, 'bad-number', 'x1', 'a number'), 'logs/a.csv')).toBe(
			'sinecheck: logs/a.csv:12:7: bad-number: expected a number, got "x1"',
		);
		expect(errorLine(new ImportError('logs/a.csv', 3, 0, 'short-row', '', '4 cells'), 'logs/a.csv')).toBe(
			'sinecheck: logs/a.csv:3: short-row: expected 4 cells',
		);
		expect(errorLine(new ImportError('rec/b.wav', 0, 17, 'bad-wav', '', "a 'data' chunk"), 'rec/b.wav')).toBe(
			"sinecheck: rec/b.wav: byte 16: bad-wav: expected a 'data' chunk",
		);
		// an ImportError names its own file (the .dat beside a .cfg); the path given is the fallback
		expect(errorLine(new ImportError('', 2, 1, 'dat-syntax', 'q', 'a sample number'), 'site/x.dat')).toBe(
			'sinecheck: site/x.dat:2:1: dat-syntax: expected a sample number, got "q"',
		);
	});

	it('errorLine names the path once for a setting that does not fit the file, and says "could not analyse" otherwise', () => {
		expect(errorLine(new RangeError('no channel U9'), 'a.csv')).toBe('sinecheck: a.csv: no channel U9');
		expect(errorLine(new RangeError('a.csv: no channel U9'), 'a.csv')).toBe('sinecheck: a.csv: no channel U9');
		expect(errorLine(new UsageError('a.csv has no channel U9'), 'a.csv')).toBe('sinecheck: a.csv has no channel U9');
		expect(errorLine(new Error('boom'), 'a.csv')).toMatch(
			/^sinecheck: a\.csv: could not analyse: an internal check failed .*report it/,
		);
	});

	it('analyse (problemText of the data a worker sends) and trend (trendErrorLine) print the same line for the same error', () => {
		const errors = [
			new ImportError('d/a.csv', 9, 4, 'bad-number', 'abc', 'a number'),
			new ImportError('d/a.csv', 5, 0, 'time-not-increasing', '0.1', 'a time after the row above'),
			new ImportError('d/b.wav', 0, 41, 'bad-wav', '', "a 'data' chunk"),
			new RangeError('d/a.csv: the reference channel is silent'),
		];
		for (const e of errors) {
			const file = e instanceof ImportError ? e.source : 'd/a.csv';
			// through structured clone, as from a worker thread: plain data only
			const sent = structuredClone(problemFrom(e, file));
			expect(problemText(sent)).toBe(trendErrorLine(e, file));
			expect(problemLine(sent)).toBe(errorLine(e, file));
		}
	});

	it('errorLine never shows an internal or engine message: each reaches the user in plain words', () => {
		const cases: [unknown, RegExp][] = [
			[
				new RangeError('fundamentalHz must be in (0, 5000) Hz, got 7000'),
				/no usable fundamental frequency or sample rate/,
			],
			[
				new RangeError('Invalid typed array length: 4294967296'),
				/more data than analyse can hold in memory.*sinecheck trend/,
			],
			[
				new RangeError('The value of "size" is out of range. It must be >= 0 && <= 4294967296. Received 6442450944'),
				/more data than analyse can hold in memory/,
			],
			[new RangeError('Maximum call stack size exceeded'), /too long for analyse.*sinecheck trend/],
			[
				Object.assign(new Error('ELOOP: too many symbolic links encountered'), { code: 'ELOOP' }),
				/a symbolic link that loops/,
			],
			[new TypeError("Cannot read properties of undefined (reading 'length')"), /an internal check failed/],
			[new RangeError('channels differ in length: 10 vs 12 samples'), /different numbers of samples/],
		];
		for (const [e, words] of cases) {
			const line = errorLine(e, 'x.csv');
			expect(line).toMatch(words);
			const internal = (e as Error).message.slice(0, 24);
			expect(line).not.toContain(internal);
			expect(line).not.toMatch(/ERR_|RangeError|TypeError|^\s+at /m);
		}
	});

	it('errorLine keeps a message written for users: a reference or pairing channel the file lacks', () => {
		expect(
			errorLine(
				new RangeError('x.csv: reference channel "phaseA" not found; the channels are phaseB, phaseC'),
				'x.csv',
			),
		).toBe('sinecheck: x.csv: reference channel "phaseA" not found; the channels are phaseB, phaseC');
		expect(
			errorLine(
				new RangeError('pairing override names channel "I9", which the capture does not have (it has: U1, I1)'),
				'x.csv',
			),
		).toBe('sinecheck: x.csv: pairing override names channel "I9", which the capture does not have (it has: U1, I1)');
	});

	it('problemLine(problem) escapes control and bidi characters of a file name and message (ECMA-48 C0/C1, UAX #9)', () => {
		const line = problemLine({ file: 'a\x1b[2Jb\u202e.csv', code: 'x', message: 'bad\nline\u009b' });
		expect(line).toBe('sinecheck: a\\x1b[2Jb\\u202e.csv: bad\\nline\\x9b');
		expect(line).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u202e]/);
	});
});
