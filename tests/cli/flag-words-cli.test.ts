/**
 * Flags of two or more words (--each-file, --next-steps, ...) placed before a path, through the BUILT
 * command: the path after such a flag is a path, not the flag's value. (The argument parser under the CLI
 * knew these flags only by their camelCase names and took the next word as a value: `trend --each-file
 * a.csv` answered "give at least one recording file".) Each check asks for something only the file can
 * give: its name in the output.
 */
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { ensureBuiltCli, mainJs, root } from './built-cli.js';

beforeAll(async () => ensureBuiltCli());

function run(args: string[]): { code: number | null; stdout: string; stderr: string } {
	const r = spawnSync(process.execPath, [mainJs, ...args], { cwd: root, encoding: 'utf8' });
	return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const FILE = 'sample-waves/board-unbalance.csv';

describe('a flag of several words before a path leaves the path a path', () => {
	for (const flags of [
		['--next-steps'],
		['--whole-record'],
		['--no-progress'],
		['--single-bins', '--limits', 'en50160'],
	])
		it(`analyse ${flags[0]} ${FILE}: the file is analysed`, () => {
			const r = run(['analyse', ...flags, FILE, '--csv']);
			expect(r.stderr).not.toMatch(/name at least one capture file/);
			expect(r.code).toBe(0);
			expect(r.stdout).toContain('board-unbalance.csv');
		});

	for (const flag of ['--each-file', '--one-recording', '--no-thd'])
		it(`trend ${flag} ${FILE}: the file is trended`, () => {
			const r = run(['trend', flag, FILE, '--interval', '10-min']);
			expect(r.stderr).not.toMatch(/give at least one recording file/);
			expect(r.code).toBe(0);
			expect(r.stdout).toMatch(/^interval,/m);
		});

	it('trend --one-recording --each-file <file>: the usage error names the two flags, not a missing file', () => {
		const r = run(['trend', '--one-recording', '--each-file', FILE]);
		expect(r.code).toBe(2);
		expect(r.stderr).toMatch(/give --one-recording or --each-file, not both/);
	});

	it('a path after -- that looks like a flag is still a path (left as written)', () => {
		const r = run(['trend', '--', '--each-file']);
		expect(r.code).toBe(2);
		expect(r.stderr).toMatch(/--each-file/);
		expect(r.stderr).not.toMatch(/give at least one recording file/);
	});
});
