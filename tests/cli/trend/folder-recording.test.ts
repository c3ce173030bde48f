/**
 * `sinecheck trend <folder>`: files that fit one recording (same sample rate and channels, start times
 * stated, each following the one before) are read as ONE recording by default, and a note says so;
 * `--each-file` keeps one set of rows per file; files that do not fit stay separate, with the reason.
 *
 * The signal (closed form, tests/trend/signals.ts): 230 V RMS per phase, 50 Hz, phases 0/-120/+120°,
 * 1000 S/s, 180 s from 2026-05-04 10:00:00 UTC written as three 60-s CSV files (each over 1 MiB, so its
 * length is estimated from its size); L2 dips to 161 V (70 %) for 0.7 s from 59.8 s, across the first cut.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { wavFloat32Bytes } from '../../../sample-waves/writers/wav.js';
import { makeChannels } from '../../trend/signals.js';
import { ensureBuiltCli, mainJs, root } from '../built-cli.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-folder-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
beforeAll(async () => ensureBuiltCli());

const FS = 1000;
const FILE_S = 60;
const START_MS = Date.parse('2026-05-04T10:00:00Z');
const DIP = { fromS: 59.8, toS: 60.5, rms: 161 };
const xs = makeChannels(
	[
		{ rms: 230, phaseDeg: 0 },
		{ rms: 230, phaseDeg: -120, steps: [DIP] },
		{ rms: 230, phaseDeg: 120 },
	],
	{ f0Hz: 50 },
	FS,
	3 * FILE_S,
);

/** File k (60 s) as CSV, starting at `startMs` on the clock, with the voltage channels `names`. */
function csv(k: number, startMs = START_MS + k * FILE_S * 1000, names = ['L1', 'L2', 'L3']): string {
	const rows = [`Start time,${new Date(startMs).toISOString()}`, `time (s),${names.map((n) => `${n} (V)`).join(',')}`];
	for (let i = k * FILE_S * FS; i < (k + 1) * FILE_S * FS; i++)
		rows.push(`${(i / FS - k * FILE_S).toFixed(3)},${names.map((_, c) => xs[c][i].toFixed(3)).join(',')}`);
	return rows.join('\n') + '\n';
}

function folder(name: string, files: Record<string, string | Uint8Array>): string {
	const f = join(dir, name);
	mkdirSync(f, { recursive: true });
	for (const [n, text] of Object.entries(files)) writeFileSync(join(f, n), text);
	return f;
}

interface Doc {
	aggregates: unknown[];
	events: { kind: string; channels: string[]; startS: number; durationS: number; residualV?: number }[];
	parts?: { source: string }[];
}

async function trend(path: string, extra: { oneRecording?: boolean; eachFile?: boolean } = {}) {
	const out = textSink();
	const err = textSink();
	const code = await trendCommand([path], {
		json: true,
		nominal: 230,
		inProcess: true,
		stdout: out,
		stderr: err,
		...extra,
	});
	return { code, json: JSON.parse(out.text()) as Doc | Doc[], err: err.text() };
}

describe('trend on a folder: one recording when the files fit one', () => {
	const hourly = () => folder('consecutive', { 'c.csv': csv(2), 'a.csv': csv(0), 'b.csv': csv(1) });

	it('three consecutive files: one document, the files in start-time order, the dip across the cut one event (closed form), and a note', async () => {
		const r = await trend(hourly());
		expect(r.code).toBe(0);
		expect(Array.isArray(r.json)).toBe(false);
		const doc = r.json as Doc;
		expect(doc.parts!.map((p) => p.source.slice(-5))).toEqual(['a.csv', 'b.csv', 'c.csv']);
		expect(r.err).toMatch(/note: The 3 files have the same sample rate and channels .* read as one recording/);
		expect(r.err).toContain('--each-file');
		const dips = doc.events.filter((e) => e.kind === 'dip');
		expect(dips).toHaveLength(1);
		// Urms(1/2) refreshed each half cycle: start and length within one cycle (20 ms) of the step
		expect(Math.abs(dips[0].startS - DIP.fromS)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dips[0].durationS - (DIP.toS - DIP.fromS))).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dips[0].residualV! - DIP.rms)).toBeLessThanOrEqual(0.002 * 230);
		// the same as asking for one recording
		const forced = (await trend(hourly(), { oneRecording: true })).json as Doc;
		expect(doc.aggregates).toEqual(forced.aggregates);
		expect(doc.events).toEqual(forced.events);
	});

	it('--each-file: one document per file; the dip is then cut in two at the file boundary', async () => {
		const r = await trend(hourly(), { eachFile: true });
		expect(r.code).toBe(0);
		const docs = r.json as Doc[];
		expect(docs).toHaveLength(3);
		expect(docs.flatMap((d) => d.events.filter((e) => e.kind === 'dip'))).toHaveLength(2);
		expect(r.err).not.toContain('note: The 3 files');
	});

	it('--one-recording with --each-file is a usage error', async () => {
		const out = textSink();
		const err = textSink();
		const code = await trendCommand([hourly()], { oneRecording: true, eachFile: true, stdout: out, stderr: err });
		expect(code).toBe(2);
		expect(err.text()).toContain('not both');
	});

	it('files that do not fit stay separate, each with the reason: other channels, a gap longer than the files, no start time', async () => {
		const channels = await trend(folder('channels', { 'a.csv': csv(0), 'b.csv': csv(1, undefined, ['L1', 'L2']) }));
		expect((channels.json as Doc[]).length).toBe(2);
		expect(channels.err).toMatch(/trended one by one, as separate recordings: .*b\.csv has other channels/);
		// b starts 2 h after a: a gap longer than either 60-s file
		const far = await trend(folder('far', { 'a.csv': csv(0), 'b.csv': csv(1, START_MS + 7200_000) }));
		expect((far.json as Doc[]).length).toBe(2);
		expect(far.err).toMatch(/gap longer than the files.*--one-recording/);
		const wav = (k: number) =>
			wavFloat32Bytes(
				xs.map((x) => Array.from(x.subarray(k * 1000, (k + 1) * 1000), (v) => v / 400)),
				FS,
				{ ICMT: 'sinecheck-calibration: 1=L1 V 400; 2=L2 V 400; 3=L3 V 400' },
			);
		const wavs = await trend(folder('wav', { 'a.wav': wav(0), 'b.wav': wav(1) }));
		expect((wavs.json as Doc[]).length).toBe(2);
		expect(wavs.err).toMatch(/a\.wav states no start time/);
	});

	it('the help says what trend assumes of several files, and names --each-file', () => {
		const r = spawnSync(process.execPath, [mainJs, 'trend', '--help'], { cwd: root, encoding: 'utf8' });
		expect(r.status).toBe(0);
		expect(r.stdout).toContain('--each-file');
		expect(r.stdout).toMatch(/are read as one without it/);
		expect(r.stdout).toContain('sinecheck trend logger/week2/ --nominal 230 --interval 10-min');
	});
});
