import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { collectUnits } from '../../src/cli/collect-files.js';
import { UsageError } from '../../src/cli/usage-error.js';

const root = mkdtempSync(join(tmpdir(), 'sinecheck-collect-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

function touch(...parts: string[]): string {
	const p = join(root, ...parts);
	mkdirSync(join(p, '..'), { recursive: true });
	writeFileSync(p, 'x');
	return p;
}

describe('collectUnits', () => {
	const a = touch('site', 'a.csv');
	const cfg = touch('site', 'fault.cfg');
	const dat = touch('site', 'fault.dat');
	const hdr = touch('site', 'fault.hdr');
	const deep = touch('site', 'week2', 'b.wav');
	touch('site', 'notes.md');
	touch('site', '.hidden.csv');

	it('collectUnits([folder]) walks sub-folders in name order and keeps a .cfg with its .dat and .hdr', () => {
		const { units, skipped } = collectUnits([join(root, 'site')]);
		expect(units).toEqual([{ files: [a] }, { files: [cfg, dat, hdr] }, { files: [deep] }]);
		expect(skipped).toEqual([join(root, 'site', 'notes.md')]);
	});

	it('collectUnits([dat]) analyses a .dat named on its own with the .cfg beside it', () => {
		expect(collectUnits([dat]).units).toEqual([{ files: [cfg, dat, hdr] }]);
	});

	it('collectUnits(paths) lists a file named twice once', () => {
		expect(collectUnits([a, a, cfg, dat]).units).toEqual([{ files: [a] }, { files: [cfg, dat, hdr] }]);
	});

	it('collectUnits([missing]) throws a UsageError naming the path', () => {
		expect(() => collectUnits([join(root, 'nope.csv')])).toThrow(UsageError);
		expect(() => collectUnits([join(root, 'nope.csv')])).toThrow(/nope\.csv: no such file or folder/);
	});
});
