/**
 * The second analysis thread (lib/trend/helper-link.ts, src/cli/trend/helper-thread.ts): a recording
 * analysed with it gives the same result, to the last bit, as without it, and the figures it computes
 * meet their closed forms. Runs the built CLI's modules (dist/): the thread's entry is a built file.
 *
 * The recording (closed form, written here as a float WAV, 3200 S/s, 620 s): three 230 V, 50 Hz phases
 * at 0/-120/+120°; L1 with rectangular flicker, 7 changes/min at ΔV/V = 1.459 % (Pst 1.00 ± 5 %,
 * IEC 61000-4-15:2010 Table 2 and class F1 tolerance, from memory); L2 dips to 161 V (70 %) for 0.5 s
 * from 100 s; L3 with a 5th harmonic of 4 % (THD 4.00 %); a 10 A current with a 3rd harmonic of 20 %.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TrendHelperChannel, TrendHelperResult } from '../../../lib/trend/index.js';
import type { RecordingResult } from '../../../lib/trend/recording-types.js';
import { FloatWavWriter } from '../../trend/float-wav.js';
import { ensureBuiltCli, mainJs, root } from '../built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-helper-thread-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FS = 3200;
const DURATION_S = 620;
const wav = join(dir, 'site.wav');

/** The recording of the module note, in 1-s blocks. */
function writeRecording(): void {
	const w = new FloatWavWriter(
		wav,
		[
			{ name: 'L1', unit: 'V' },
			{ name: 'L2', unit: 'V' },
			{ name: 'L3', unit: 'V' },
			{ name: 'I1', unit: 'A' },
		],
		FS,
		FS * DURATION_S,
	);
	const block = Array.from({ length: 4 }, () => new Float64Array(FS));
	const halfPeriodS = 60 / 7; // 7 level changes per minute
	for (let s = 0; s < DURATION_S; s++) {
		for (let i = 0; i < FS; i++) {
			const t = s + i / FS;
			const w1 = 2 * Math.PI * 50 * t;
			const level = Math.floor(t / halfPeriodS) % 2 === 0 ? 1 : -1;
			const u1 = 230 * (1 + (0.01459 / 2) * level);
			const u2 = t >= 100 && t < 100.5 ? 161 : 230;
			block[0][i] = Math.SQRT2 * u1 * Math.sin(w1);
			block[1][i] = Math.SQRT2 * u2 * Math.sin(w1 - (2 * Math.PI) / 3);
			block[2][i] =
				Math.SQRT2 * 230 * (Math.sin(w1 + (2 * Math.PI) / 3) + 0.04 * Math.sin(5 * (w1 + (2 * Math.PI) / 3)));
			block[3][i] = Math.SQRT2 * 10 * (Math.sin(w1 - 0.3) + 0.2 * Math.sin(3 * (w1 - 0.3)));
		}
		w.write(block);
	}
	w.close();
}

/** The built modules, loaded once. */
let analyseFile: (path: string, source: string, open: object, settings: object) => RecordingResult;
let helperThread: (threads: number) => TrendHelperChannel | undefined;

beforeAll(async () => {
	await ensureBuiltCli();
	writeRecording();
	const dist = (p: string) => import(pathToFileURL(join(root, 'dist', p)).href);
	({ analyseFile } = await dist('src/cli/trend/read-recording.js'));
	({ helperThread } = await dist('src/cli/trend/helper-thread.js'));
}, 120_000);

/** JSON with every number exact and NaN/Infinity kept as text, for a bit-for-bit comparison. */
const exact = (x: unknown) =>
	JSON.stringify(x, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));

describe('second analysis thread', () => {
	it('gives the same result to the last bit, with the flicker and some harmonic windows done on the thread', () => {
		const settings = { harmonics: true, keep: { cycles10: true, cycles150: true, min10: true } };
		const alone = analyseFile(wav, 'site.wav', {}, settings);
		const channel = helperThread(2);
		expect(channel, 'a machine with 2 cores and the built entry file').toBeDefined();
		const seen: TrendHelperResult[] = [];
		const spy: TrendHelperChannel = {
			get busy() {
				return channel!.busy;
			},
			begin: (init) => channel!.begin(init),
			result: () => {
				const r = channel!.result();
				seen.push(r);
				return r;
			},
		};
		const shared = analyseFile(wav, 'site.wav', {}, { ...settings, helper: spy });
		// the thread did its part: one session, the flickermeters and some of the 3100 harmonic windows
		expect(seen).toHaveLength(1);
		expect(seen[0].flicker?.pst).toHaveLength(1);
		expect(seen[0].windows).toBeGreaterThan(0);
		expect(exact(shared)).toBe(exact(alone));

		// and the figures are right (closed forms of the module note)
		const pst = shared.flicker!.pst[0];
		expect(Math.abs(pst.values[0] - 1)).toBeLessThan(0.05); // IEC 61000-4-15 Table 2, class F1
		expect(pst.flagged).toBe(true); // the L2 dip at 100 s falls in it (IEC 61000-4-30 flagging)
		const dips = shared.events.filter((e) => e.kind === 'dip');
		expect(dips).toHaveLength(1);
		expect(dips[0].startS).toBeCloseTo(100, 1);
		expect(dips[0].durationS).toBeGreaterThan(0.48);
		expect(dips[0].durationS).toBeLessThan(0.53);
		expect(Math.abs(dips[0].residualV! - 161) / 161).toBeLessThan(0.01);
		const quiet = shared.cycles10.filter((r) => !r.flagged);
		for (const r of quiet.slice(10, 20)) {
			expect(r.thdPercent[2]).toBeCloseTo(4, 3); // the 5th at 4 %
			expect(r.thdPercent[3]).toBeCloseTo(20, 3); // the 3rd at 20 %
			expect(r.harmonicsPercent![3][3]).toBeCloseTo(20, 3);
			expect(r.rms[1]).toBeCloseTo(230, 6);
			// L1 at 230·(1 ± δ), δ = 0.7295 %, the others at 230 V: u2 = |U2|/|U1| = δ/(3 ± δ) (Fortescue)
			const d = 0.01459 / 2;
			const u2 = [(100 * d) / (3 + d), (100 * d) / (3 - d)];
			expect(Math.min(...u2.map((u) => Math.abs(r.unbalancePercent! - u)))).toBeLessThan(0.001);
		}
	}, 120_000);

	it('the CLI prints the same with 1 and 2 threads, also after a file that fails part-way', () => {
		const bad = join(dir, 'bad.csv');
		const rows = ['time (s),L1 (V)'];
		for (let i = 0; i < 40_000; i++)
			rows.push(`${(i / 4000).toFixed(5)},${(325 * Math.sin((2 * Math.PI * 50 * i) / 4000)).toFixed(2)}`);
		rows[30_000] = '7.49975,abc';
		writeFileSync(bad, rows.join('\n') + '\n');
		const run = (threads: string) =>
			spawnSync(
				process.execPath,
				[mainJs, 'trend', '--each-file', '--interval', '10-min', '--threads', threads, bad, wav],
				{
					encoding: 'utf8',
				},
			);
		const one = run('1');
		const two = run('2');
		expect(one.stderr).toMatch(/bad\.csv:30001:\d+: /);
		expect(one.stdout.split('\n').length).toBeGreaterThan(2);
		expect(two.status).toBe(one.status);
		expect(two.stdout).toBe(one.stdout);
		expect(two.stderr).toBe(one.stderr);
		const usage = run('3');
		expect(usage.status).toBe(2);
		expect(usage.stderr).toMatch(/--threads 3: expected 1 or 2/);
	}, 120_000);

	it('survey prints the same with 1 and 2 threads', () => {
		const run = (threads: string) =>
			spawnSync(process.execPath, [mainJs, 'survey', '--json', '--threads', threads, wav], { encoding: 'utf8' });
		const one = run('1');
		const two = run('2');
		expect(one.status).toBe(0);
		expect(JSON.parse(one.stdout)).toBeTruthy();
		expect(two.stdout).toBe(one.stdout);
		expect(two.stderr).toBe(one.stderr);
	}, 120_000);

	it('starts its thread also in a process run with flags a thread cannot take (node --input-type=module -e)', () => {
		// the thread once inherited --input-type and never started: the analyser then waited for it for ever
		const url = (p: string) => JSON.stringify(pathToFileURL(join(root, 'dist', p)).href);
		const script = `import { analyseFile } from ${url('src/cli/trend/read-recording.js')};
import { helperThread } from ${url('src/cli/trend/helper-thread.js')};
const r = analyseFile(process.argv[1], 'site.wav', {}, { helper: helperThread(2), flicker: false });
console.log(r.cycles10.length);`;
		const r = spawnSync(process.execPath, ['--input-type=module', '-e', script, wav], {
			encoding: 'utf8',
			timeout: 60_000,
		});
		expect(r.signal).toBeNull();
		expect(r.status).toBe(0);
		// 620 s of 10-cycle windows at 50 Hz: 3100, less the last partial one
		expect(Number(r.stdout.trim())).toBeGreaterThanOrEqual(3098);
	}, 120_000);
});
