/**
 * fileList (lib/trend/file-list.ts): the files of a recording named in a sentence. The expected texts are
 * written from the inputs by hand: each file by its name, the shared folder once, a week of hourly files
 * (7 x 24 = 168) shortened to the first three, a count and the last.
 */
import { describe, expect, it } from 'vitest';
import { fileList } from '../../lib/trend/file-list.js';

describe('fileList', () => {
	it('names one, two and four files each, joined in words', () => {
		expect(fileList(['board.csv'])).toBe('board.csv');
		expect(fileList(['a.csv', 'b.csv'])).toBe('a.csv and b.csv');
		expect(fileList(['a.csv', 'b.csv', 'c.csv', 'd.csv'])).toBe('a.csv, b.csv, c.csv and d.csv');
	});

	it('files in one folder are named without it, and the folder is said once (/ and \\ paths)', () => {
		expect(fileList(['hx/h1.csv', 'hx/h2.csv', 'hx/h10.csv'])).toBe('h1.csv, h2.csv and h10.csv (in hx)');
		expect(fileList(['C:\\logs\\wk\\h1.csv', 'C:\\logs\\wk\\h2.csv'])).toBe('h1.csv and h2.csv (in C:\\logs\\wk)');
		// files of two folders keep their paths: a name alone would not say which is which
		expect(fileList(['mon/h1.csv', 'tue/h1.csv'])).toBe('mon/h1.csv and tue/h1.csv');
	});

	it('a week of hourly files: the first three, how many more, and the last', () => {
		const week = Array.from({ length: 168 }, (_, k) => `week/h${String(k + 1).padStart(3, '0')}.csv`);
		// 168 files = 3 named + 164 counted + the last named
		expect(fileList(week)).toBe('h001.csv, h002.csv, h003.csv and 164 more, up to h168.csv (in week)');
	});
});
