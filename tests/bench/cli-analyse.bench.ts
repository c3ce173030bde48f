/**
 * `sinecheck analyse <folder>`: wall time for a folder of captures in helper processes (the default) beside
 * the same command in one process (--jobs 0), measured in the same run, and the ratio. Captures: 12 CSV
 * files, three-phase V and I (6 channels), 5 s at 10 kS/s, written here from closed-form signals.
 * Then the cost of the helper process for ONE file (what the time and memory limits cost a single run):
 * `analyse <one file>` by default beside `--jobs 0`, wall time median of 5 each, interleaved.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { writeCsvCapture } from '../cli/fixtures.js';
import { printTable } from './measure.js';

const FILES = 12;
await ensureBuiltCli();
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-bench-'));
for (let f = 0; f < FILES; f++) {
	writeCsvCapture(
		join(dir, `board-${String(f).padStart(2, '0')}.csv`),
		[0, 1, 2].flatMap((k) => [
			{
				header: `L${k + 1} (V)`,
				tones: [
					{ order: 1, rms: 230 - f, phaseDeg: -120 * k },
					{ order: 5, rms: 6, phaseDeg: 10 },
				],
			},
			{
				header: `I${k + 1} (A)`,
				tones: [
					{ order: 1, rms: 20, phaseDeg: -120 * k - 25 },
					{ order: 3, rms: 5, phaseDeg: -360 * k },
				],
			},
		]),
		{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 250 },
	);
}

function wallMs(args: string[], target = dir): number {
	const t0 = performance.now();
	const r = spawnSync(process.execPath, [mainJs, 'analyse', target, '--json', '--quiet', ...args], {
		encoding: 'utf8',
		maxBuffer: 1 << 28,
	});
	const ms = performance.now() - t0;
	if (r.status !== 0) throw new Error(`sinecheck exited ${r.status}: ${r.stderr}`);
	return ms;
}

// Interleave the two so machine load affects both alike; median of 3 each.
const one: number[] = [];
const many: number[] = [];
for (let i = 0; i < 3; i++) {
	one.push(wallMs(['--jobs', '0']));
	many.push(wallMs([]));
}
const median = (x: number[]) => x.sort((a, b) => a - b)[1];
const m1 = median(one);
const mN = median(many);
console.log(
	`${FILES} files, 6 channels x 50,000 samples each; ${availableParallelism()} cores available (helpers used: ${Math.min(availableParallelism(), FILES, 8)})`,
);
printTable(
	['run', 'wall ms', 'files/s'],
	[
		['one process (--jobs 0), reference', m1, (1000 * FILES) / m1],
		['helper processes (default)', mN, (1000 * FILES) / mN],
	],
);
console.log(`speed-up of helper processes over one process: ${(m1 / mN).toFixed(2)}x`);

const single = join(dir, 'board-00.csv');
const inProcess: number[] = [];
const inHelper: number[] = [];
for (let i = 0; i < 5; i++) {
	inProcess.push(wallMs(['--jobs', '0'], single));
	inHelper.push(wallMs([], single));
}
const med5 = (x: number[]) => x.sort((a, b) => a - b)[2];
const s1 = med5(inProcess);
const sH = med5(inHelper);
printTable(
	['one file', 'wall ms'],
	[
		['in this process (--jobs 0), reference', s1],
		['in a helper process (default: time and memory limits)', sH],
	],
);
console.log(`helper process cost for one file: ${(sH - s1).toFixed(0)} ms (ratio ${(sH / s1).toFixed(2)}x)`);
rmSync(dir, { recursive: true, force: true });
