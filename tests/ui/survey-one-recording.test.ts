/**
 * The browser's survey (src/ui/survey-worker.ts, in-process on Blobs as the page hands picked files over)
 * reads the files of a recording as ONE recording: the same closed-form recording cut into 1, 2 and 7
 * files gives the same survey, figure for figure, and the same as `sinecheck survey --json` on those
 * files; a dip across a file boundary is one dip; a missing file is a gap that is reported and that no
 * interval spans. CSV, COMTRADE ASCII and BINARY32 (streamed), .cff and WAV (opened whole) are each cut
 * and compared with their own 1-file survey (each format quantises the samples its own way).
 *
 * The recording (closed form, tests/trend/signals.ts): 3 phases, 50 Hz, 1000 S/s, 625 s from
 * 2026-05-04 08:49:40 UTC, so the 10-minute interval 08:50:00-09:00:00 lies whole inside it
 * (IEC 61000-4-30:2015, 4.5.3; from memory). L1 and L2 at 230 V, L3 at 220 V RMS, 120° apart; L1 dips to
 * 138 V (60 % of 230 V) for 300 ms from 5.0 s, across the cut at 5.2 s, before the complete interval.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { SurveyResult } from '../../lib/survey/types.js';
import { surveyCommand } from '../../src/cli/survey/index.js';
import type { FileBytes, SurveyView } from '../../src/ui/protocol.js';
import { runSurvey } from '../../src/ui/survey-worker.js';
import { toProblem } from '../../src/ui/worker-core.js';
import {
	comtradeCffBytes,
	comtradeCfgText,
	comtradeDatBytes,
	type WriterSpec,
} from '../../sample-waves/writers/comtrade.js';
import { wavFloat32Bytes } from '../../sample-waves/writers/wav.js';
import { textSink } from '../cli/trend/text-sink.js';
import { makeChannels } from '../trend/signals.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-ui-survey-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FS = 1000;
const DURATION_S = 625;
const START_MS = Date.parse('2026-05-04T08:49:40Z');
const DIP = { fromS: 5.0, toS: 5.3, rms: 138 };
const RMS = [230, 230, 220];
const xs = makeChannels(
	[
		{ rms: RMS[0], phaseDeg: 0, steps: [DIP] },
		{ rms: RMS[1], phaseDeg: -120 },
		{ rms: RMS[2], phaseDeg: 120 },
	],
	{ f0Hz: 50 },
	FS,
	DURATION_S,
);
const N = xs[0].length;
const NAMES = ['L1', 'L2', 'L3'];
const CUTS: Record<string, number[]> = {
	one: [],
	two: [5.2],
	seven: [5.2, 90.5, 222.22, 300, 410.003, 555.5],
};

/** Samples [from, to) as CSV text: a start-time preamble line, then time (s) and the three phases. */
function csvText(from: number, to: number): string {
	const rows = [`Start time,${new Date(START_MS + from).toISOString()}`, 'time (s),L1 (V),L2 (V),L3 (V)'];
	for (let i = from; i < to; i++)
		rows.push(`${((i - from) / FS).toFixed(3)},${xs[0][i].toFixed(3)},${xs[1][i].toFixed(3)},${xs[2][i].toFixed(3)}`);
	return rows.join('\n') + '\n';
}

/** COMTRADE writer spec of samples [from, to), its first-sample stamp exact to the ms (1 sample = 1 ms). */
function spec(from: number, to: number, fileType: WriterSpec['fileType']): WriterSpec {
	const d = new Date(START_MS + from);
	const p = (x: number, w = 2) => String(x).padStart(w, '0');
	const stamp = `${p(d.getUTCDate())}/${p(d.getUTCMonth() + 1)}/${d.getUTCFullYear()},${p(d.getUTCHours())}:${p(d.getUTCMinutes())}:${p(d.getUTCSeconds())}.${p(d.getUTCMilliseconds() * 1000, 6)}`;
	// one fixed multiplier for every file, so every cut quantises the samples alike
	const a = fileType === 'ASCII' ? 0.01 : 1e-6;
	return {
		station: 'Tallowmere Joinery',
		device: 'supply logger',
		revYear: 2013,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: FS, endSample: to - from }],
		firstData: stamp,
		trigger: stamp,
		fileType,
		analog: NAMES.map((name, c) => ({ name, phase: name, unit: 'V', a, values: xs[c].subarray(from, to) })),
	};
}

type Format = 'csv' | 'ascii' | 'binary32' | 'cff' | 'wav';

/** Record k of a cut, as the named files a logger would write. */
function record(format: Format, k: number, from: number, to: number): { name: string; bytes: Uint8Array }[] {
	const base = `h-${k + 1}`;
	if (format === 'csv') return [{ name: `${base}.csv`, bytes: new TextEncoder().encode(csvText(from, to)) }];
	if (format === 'cff') return [{ name: `${base}.cff`, bytes: comtradeCffBytes(spec(from, to, 'BINARY32')) }];
	if (format === 'wav') {
		const FULL = 400;
		const chans = xs.map((x) => Array.from(x.subarray(from, to), (v) => v / FULL));
		const cal = NAMES.map((n, c) => `${c + 1}=${n} V ${FULL}`).join('; ');
		return [{ name: `${base}.wav`, bytes: wavFloat32Bytes(chans, FS, { ICMT: `sinecheck-calibration: ${cal}` }) }];
	}
	const s = spec(from, to, format === 'ascii' ? 'ASCII' : 'BINARY32');
	return [
		{ name: `${base}.cfg`, bytes: new TextEncoder().encode(comtradeCfgText(s)) },
		{ name: `${base}.dat`, bytes: comtradeDatBytes(s) },
	];
}

/** The recording cut at `cuts` (s), files k in `skip` left out; written to a folder, and as picked Blobs (last file first). */
function cut(
	format: Format,
	name: string,
	cuts: number[],
	skip: number[] = [],
): { folder: string; picked: FileBytes[] } {
	const folder = join(dir, `${format}-${name}`);
	mkdirSync(folder, { recursive: true });
	const edges = [0, ...cuts.map((t) => Math.round(t * FS)), N];
	const picked: FileBytes[] = [];
	for (let k = 0; k + 1 < edges.length; k++) {
		if (skip.includes(k)) continue;
		for (const f of record(format, k, edges[k], edges[k + 1])) {
			writeFileSync(join(folder, f.name), f.bytes);
			picked.unshift({ name: f.name, blob: new Blob([new Uint8Array(f.bytes)]) });
		}
	}
	return { folder, picked };
}

async function browser(picked: FileBytes[]): Promise<SurveyView> {
	const { survey, problems } = await runSurvey(picked, 'en50160', 230, () => undefined, toProblem);
	expect(problems).toEqual([]);
	return survey!;
}

/** The parts of a survey that are figures and verdicts (the notes name files), as JSON gives them. */
function figures(r: SurveyResult | Record<string, unknown>): unknown {
	const { coverage, lines, dips, swells, interruptions, meets, weekNote } = r as SurveyResult;
	return JSON.parse(
		JSON.stringify({ coverage, lines, dips, swells, interruptions, meets, weekNote }, (_k, v) =>
			typeof v === 'number' && !Number.isFinite(v) ? null : v,
		),
	);
}

async function cli(folder: string): Promise<Record<string, unknown>> {
	const out = textSink();
	const err = textSink();
	const code = await surveyCommand([folder], { json: true, nominal: 230, stdout: out, stderr: err });
	expect(err.text()).not.toMatch(/sinecheck:/);
	expect(code).toBeLessThan(2);
	return JSON.parse(out.text()) as Record<string, unknown>;
}

const line = (r: SurveyResult, id: string, channel?: string) =>
	r.lines.find((l) => l.id === id && (channel === undefined || l.channel === channel))!;

describe('the browser survey reads the files of a recording as one recording', () => {
	const views: Record<string, SurveyView> = {};

	it('CSV, 1 file: one complete interval 08:50-09:00, 230/230/220 V, unbalance and the dip as the closed form gives them', async () => {
		const v = await browser(cut('csv', 'one', CUTS.one).picked);
		views.one = v;
		const r = v.result;
		expect(r.coverage.completeIntervals).toBe(1);
		const complete = v.input.intervals.filter((i) => i.complete);
		expect(complete[0].startS).toBeGreaterThanOrEqual(Date.parse('2026-05-04T08:50:00Z') / 1000 - 0.001);
		// closed form: RMS of U·√2·sin is U (samples written to 1 mV)
		for (const [c, u] of RMS.entries()) expect(complete[0].rmsV[c]).toBeCloseTo(u, 2);
		// negative-sequence unbalance with one phase δ = 10 V low at balanced angles: δ/(Ua+Ub+Uc) (Fortescue; closed form)
		expect(line(r, 'unbalance').value).toBeCloseTo((100 * 10) / 680, 2);
		// EN 50160:2010 Table 5: residual 60 % is the row 70 % > u >= 40 %, 300 ms the column > 200 ms to 500 ms
		expect(r.dips.counts[2][1]).toBe(1);
		expect(r.dips.counts.flat().reduce((a, b) => a + b, 0)).toBe(1);
		const dips = v.input.events.filter((e) => e.kind === 'dip');
		expect(dips).toHaveLength(1);
		// Urms(1/2) is refreshed each half cycle: start and length within one cycle (20 ms) of the step
		expect(Math.abs(dips[0].startS - (START_MS / 1000 + DIP.fromS))).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dips[0].durationS - (DIP.toS - DIP.fromS))).toBeLessThanOrEqual(0.02);
		expect(v.samples).toBe(N);
	});

	for (const name of ['two', 'seven']) {
		it(`CSV, ${CUTS[name].length + 1} files picked in reverse order: the same figures as 1 file; the dip across the cut at 5.2 s is one dip`, async () => {
			const v = await browser(cut('csv', name, CUTS[name]).picked);
			expect(figures(v.result)).toEqual(figures(views.one.result));
			expect(v.input.events).toEqual(views.one.input.events);
			expect(v.files.map((f) => f.name)).toEqual(
				CUTS[name].map((_, k) => `h-${k + 1}.csv`).concat(`h-${CUTS[name].length + 1}.csv`),
			);
			expect(v.samples).toBe(N);
		});
	}

	it('`sinecheck survey --json` on the same 1, 2 and 7 files gives the same figures as the browser', async () => {
		for (const name of ['one', 'two', 'seven'])
			expect(figures(await cli(join(dir, `csv-${name}`)))).toEqual(figures(views.one.result));
	});

	it('a missing file is a gap: reported with its length, no interval spans it, the interval it cuts is not complete', async () => {
		// file 3 of the 7 (90.5 s to 222.22 s) left out: 131.72 s without data
		const { picked, folder } = cut('csv', 'gap', CUTS.seven, [2]);
		const v = await browser(picked);
		expect(v.notes.some((n) => n.includes('No data for 131.7 s'))).toBe(true);
		const gapFrom = START_MS / 1000 + 90.5;
		const gapTo = START_MS / 1000 + 222.22;
		for (const i of v.input.intervals) expect(i.startS < gapFrom && i.startS + i.durationS > gapTo).toBe(false);
		expect(v.result.coverage.completeIntervals).toBe(0);
		expect(v.result.coverage.gaps.some((g) => g.endS - g.startS > 131)).toBe(true);
		expect(figures(await cli(folder))).toEqual(figures(v.result));
	});

	for (const format of ['ascii', 'binary32', 'cff', 'wav'] as const) {
		it(`${format === 'wav' ? 'WAV (no start time: ordered by name, said so)' : format === 'cff' ? '.cff' : `COMTRADE ${format.toUpperCase()}`}: 7 files give the 1-file figures, as the CLI does; the dip is one`, async () => {
			const one = await browser(cut(format, 'one', []).picked);
			const seven = cut(format, 'seven', CUTS.seven);
			const v = await browser(seven.picked);
			expect(figures(v.result)).toEqual(figures(one.result));
			expect(v.result.dips.counts.flat().reduce((a, b) => a + b, 0)).toBe(1);
			expect(v.files.map((f) => f.name.replace(/\.\w+$/, ''))).toEqual(
				CUTS.seven.map((_, k) => `h-${k + 1}`).concat('h-7'),
			);
			expect(figures(await cli(seven.folder))).toEqual(figures(v.result));
			if (format === 'wav') expect(v.notes.some((n) => n.includes('order of their names'))).toBe(true);
			else expect(v.result.coverage.completeIntervals).toBe(1);
		});
	}
});
