import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { collectUnits } from '../../src/cli/collect-files.js';

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

	it('collectUnits([missing, good]) reports the missing path as a problem and still collects the good file', () => {
		const missing = join(root, 'nope.csv');
		const { units, problems } = collectUnits([missing, a]);
		expect(units).toEqual([{ files: [a] }]);
		expect(problems).toEqual([{ file: missing, code: 'unreadable', message: 'no such file or folder' }]);
	});

	it('collectUnits([folder]) reports a dangling link, a link loop, a FIFO and a device-like entry each once, and keeps every good file', () => {
		const base = join(root, 'hostile');
		const good1 = touch('hostile', 'a.csv');
		const good2 = touch('hostile', 'deep', 'z.csv');
		symlinkSync(join(base, 'gone.csv'), join(base, 'b-dangling.csv'));
		symlinkSync(base, join(base, 'deep', 'back-up')); // a link to an ancestor: a loop
		symlinkSync('c-loop2.csv', join(base, 'c-loop1.csv'));
		symlinkSync('c-loop1.csv', join(base, 'c-loop2.csv')); // two links pointing at each other (ELOOP)
		symlinkSync(join(base, 'deep'), join(base, 'e-again')); // a second way into a folder: walked once
		const fifo = join(base, 'd-pipe.csv');
		const made = spawnSync('mkfifo', [fifo]).status === 0;
		const { units, problems } = collectUnits([base]);
		expect(units).toEqual([{ files: [good1] }, { files: [good2] }]);
		const byFile = new Map(problems.map((p) => [p.file, p.message]));
		expect(byFile.get(join(base, 'b-dangling.csv'))).toMatch(/symbolic link to something that does not exist/);
		expect(byFile.get(join(base, 'c-loop1.csv'))).toMatch(/loops back on itself/);
		expect(byFile.get(join(base, 'c-loop2.csv'))).toMatch(/loops back on itself/);
		expect(byFile.get(join(base, 'deep', 'back-up'))).toMatch(/a loop/);
		if (made) expect(byFile.get(fifo)).toMatch(/named pipe \(FIFO\), not a regular file/);
		else console.warn('mkfifo not available: the FIFO case of collectUnits is not checked here');
		expect(problems.length).toBe(made ? 5 : 4);
	});

	it('collectUnits([/dev/null]) names a device as not a regular file (no read is tried)', () => {
		const { units, problems } = collectUnits(['/dev/null']);
		expect(units).toEqual([]);
		expect(problems).toEqual([
			{
				file: '/dev/null',
				code: 'unreadable',
				message: 'a character device, not a regular file: only regular files are read',
			},
		]);
	});
});
