/**
 * `sinecheck analyse --gaps`: the BUILT command on a 230 V RMS (325.27 V peak) 50 Hz sine written here
 * with one "OVL" cell at line 5002. Without --gaps the file is refused at that line and column with a hint;
 * with it the cell is listed and the figures are the sine's (closed form: RMS = peak/√2).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuiltCli, mainJs } from './built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-gaps-'));
const run = (args: string[]) =>
	spawnSync(process.execPath, [mainJs, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });

beforeAll(async () => {
	await ensureBuiltCli();
	const rows = ['t (s),U1 (V),I1 (A)'];
	for (let k = 0; k < 10_000; k++) {
		const t = k / 10_000;
		const u = rows.length + 1 === 5002 ? 'OVL' : (325.27 * Math.sin(2 * Math.PI * 50 * t)).toFixed(3);
		rows.push(`${t.toFixed(4)},${u},${(14.14 * Math.sin(2 * Math.PI * 50 * t - Math.PI / 6)).toFixed(4)}`);
	}
	writeFileSync(join(dir, 'ovl.csv'), rows.join('\n') + '\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('analyse --gaps', () => {
	it('without it: exit 2, the place of the cell and a hint to --gaps', () => {
		const r = run(['analyse', 'ovl.csv']);
		expect(r.status).toBe(2);
		expect(r.stderr).toContain('ovl.csv:5002:8: bad-number');
		expect(r.stderr).toContain('--gaps reads such cells as gaps');
	});

	it('with it: the cell is listed in the assumptions and U1 RMS is 325.27/√2 = 230.0 V over the stretch before it', () => {
		const r = run(['analyse', '--json', '--gaps', '--quiet', 'ovl.csv']);
		expect(r.status, r.stderr).toBe(0);
		const report = JSON.parse(r.stdout);
		expect(report.channels[0].rms).toBeCloseTo(325.27 / Math.SQRT2, 2);
		expect(report.assumptions.join(' ')).toContain('line 5002, column 8 ("OVL", U1)');
		expect(report.assumptions.join(' ')).toContain('longest stretch without gaps');
	});
});
