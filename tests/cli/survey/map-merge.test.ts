/**
 * The runnable map/merge example of docs/survey.md, run as written (its shell block, with `npx sinecheck`
 * resolving to the built CLI as after an install) over a 2-hour recording written as two hourly COMTRADE
 * files (tests/helpers/plt-recording.ts: Pst 1.00 for the first hour and 0.50 for the second, by
 * IEC 61000-4-15:2010 Table 2 and the proportionality of Pst to ΔV/V). Checks: the merge makes Plt from
 * the twelve Pst the map wrote, by the cubic mean computed here by hand (IEC 61000-4-15:2010, 5.7.3; from
 * memory), and for files cut on a 10-minute tick the merged survey agrees with the one-recording survey
 * of the same files (docs/survey.md, "What differs").
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { surveyCommand } from '../../../src/cli/survey/index.js';
import { writePltRecording } from '../../helpers/plt-recording.js';
import { ensureBuiltCli, mainJs, root } from '../built-cli.js';
import { textSink } from '../trend/text-sink.js';

const work = mkdtempSync(join(tmpdir(), 'sinecheck-map-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
beforeAll(async () => ensureBuiltCli());

/** The shell block of docs/survey.md that starts with the one-machine map comment. */
function exampleBlock(): string {
	const doc = readFileSync(join(root, 'docs', 'survey.md'), 'utf8');
	const blocks = [...doc.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1]);
	const block = blocks.find((b) => b.includes('xargs') && b.includes('survey rows/'));
	expect(block, 'docs/survey.md shows the map/merge example').toBeDefined();
	return block!;
}

interface Line {
	id: string;
	channel?: string;
	value: number | null;
	used: number;
}

describe('docs/survey.md map/merge example', () => {
	it('runs as written; the merge gives Plt as the cubic mean of the 12 Pst the map wrote, and the one-recording figures', async () => {
		// an installed CLI, as `npm install sinecheck` leaves it for npx
		mkdirSync(join(work, 'node_modules', '.bin'), { recursive: true });
		const shim = join(work, 'node_modules', '.bin', 'sinecheck');
		writeFileSync(shim, `#!/bin/sh\nexec "${process.execPath}" "${mainJs}" "$@"\n`);
		chmodSync(shim, 0o755);
		// two hourly files cut on the 09:00:00 tick (3610 s after 07:59:50)
		writePltRecording(join(work, 'logger-week'), [3610]);

		const r = spawnSync('sh', ['-c', `set -e\n${exampleBlock()}`], {
			cwd: work,
			encoding: 'utf8',
			timeout: 540_000,
			env: { ...process.env, npm_config_offline: 'true', npm_config_update_notifier: 'false' },
		});
		expect(r.stderr).not.toMatch(/sinecheck: /);
		expect(r.status).toBeLessThan(2);
		expect(readdirSync(join(work, 'rows')).sort()).toEqual(['part1.cfg.json', 'part2.cfg.json']);
		const survey = JSON.parse(readFileSync(join(work, 'survey.json'), 'utf8')) as { lines: Line[] };

		// the twelve 10-minute Pst of the map's documents, 08:00 to 10:00 on the clock (the row of 08:50 is
		// partial in the first file, its last 10/12-cycle window cut at 09:00; its Pst is whole)
		const pst: number[] = [];
		for (const name of ['part1.cfg.json', 'part2.cfg.json']) {
			const doc = JSON.parse(readFileSync(join(work, 'rows', name), 'utf8')) as {
				clockStartS: number;
				aggregates: { interval: string; pst?: (number | null)[] }[];
			};
			for (const a of doc.aggregates) if (a.interval === '10-min' && a.pst) pst.push(a.pst[0]!);
		}
		expect(pst).toHaveLength(12);
		const plt = survey.lines.find((l) => l.id === 'flicker-plt')!;
		expect(plt.used).toBe(1);
		expect(plt.value).toBeCloseTo(Math.cbrt(pst.reduce((s, v) => s + v ** 3, 0) / 12), 9);
		// and near the hand value from the test points, ∛((6·1³ + 6·0.5³)/12) = 0.8255, to class F1's 5 %
		expect(Math.abs(plt.value! - 0.8255)).toBeLessThanOrEqual(0.05 * 0.8255);

		// the same files read as one recording: the same supply-voltage figures; Plt within 1 % (the second
		// file's flickermeter settles over its first 5 s, docs/survey.md "What differs")
		const out = textSink();
		await surveyCommand([join(work, 'logger-week')], { json: true, nominal: 230, stdout: out, stderr: textSink() });
		const one = JSON.parse(out.text()) as { lines: Line[]; coverage: { completeIntervals: number } };
		expect(one.coverage.completeIntervals).toBe(12);
		for (const id of ['supply-voltage-95', 'supply-voltage-100', 'frequency-99.5', 'frequency-100']) {
			const a = survey.lines.find((l) => l.id === id)!;
			const b = one.lines.find((l) => l.id === id)!;
			expect([a.used, a.value]).toEqual([b.used, b.value]);
		}
		const onePlt = one.lines.find((l) => l.id === 'flicker-plt')!;
		expect(Math.abs(plt.value! - onePlt.value!)).toBeLessThanOrEqual(0.01 * onePlt.value!);
	}, 600_000);
});
