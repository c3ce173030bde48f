/**
 * `sinecheck analyse` on the single-shot scope demo (sample-waves/moulder-drive-scope.csv): the JSON equals
 * the library's report, and the table marks every fitted figure with its uncertainty. Ground truth:
 * sample-waves/ground-truth.json (closed form of the construction).
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { ensureBuiltCli, mainJs, root } from './built-cli.js';

const file = join('sample-waves', 'moulder-drive-scope.csv');
beforeAll(async () => ensureBuiltCli(), 120_000);
const run = (args: string[]) =>
	spawnSync(process.execPath, [mainJs, ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });

describe('sinecheck analyse on a one-cycle 8-bit scope capture', () => {
	it('analyse --json prints exactly what the library gives for the same file, with the short-record fit', () => {
		const r = run(['analyse', file, '--json', '--quiet']);
		expect(r.status, r.stderr).toBe(0);
		const doc = JSON.parse(r.stdout);
		const opened = openCaptures([{ name: file, bytes: new Uint8Array(readFileSync(join(root, file))) }]);
		const lib = reportToJson(analyseCapture(opened.captures[0]));
		expect(doc).toEqual(JSON.parse(JSON.stringify(lib)));
		expect(doc.shortRecord.note).toBe('from a fit of a short record');
	});

	it('analyse prints the lag 25° (ground truth) with its uncertainty and no clipping', () => {
		const r = run(['analyse', file]);
		expect(r.status, r.stderr).toBe(0);
		const m = /CH2 lags CH1 by ([\d.]+) ± ([\d.]+) deg \(([\d.]+) ± ([\d.]+) ms\)/.exec(r.stdout);
		expect(m, r.stdout).not.toBeNull();
		expect(Math.abs(Number(m![1]) - 25)).toBeLessThan(0.2);
		// 25° of a 50.2 Hz cycle = 25 / (360 · 50.2) s = 1.3834 ms (closed form)
		expect(Math.abs(Number(m![3]) - 1000 * (25 / 360 / 50.2))).toBeLessThan(0.01);
		expect(r.stdout).toMatch(/from a fit of a short record/);
		expect(r.stdout).not.toMatch(/clipping/i);
	});

	it("the header says '1 whole cycle analysed' for the capture's one cycle (English grammar, not '1 whole cycles')", () => {
		const r = run(['analyse', file]);
		expect(r.status, r.stderr).toBe(0);
		expect(r.stdout).toMatch(/; 1 whole cycle analysed /);
	});
});
