/**
 * A recording cut into many files is one recording: the same synthetic three-phase recording written as
 * 1, 2 and 7 CSV files with a date/time column gives exactly the same rows, 10-s values and events
 * through `trend --one-recording` (one analyser fed the files in start-time order), the 1-file result
 * itself checked against the closed form of the signal. A gap between two files is reported with its
 * start and length and no row spans it; an overlap is dropped; a file with other channels is refused.
 *
 * The signal (closed form, tests/trend/signals.ts): 230 V RMS per phase, 50 Hz, phases 0/-120/+120°,
 * 5000 S/s, 24 s from 2026-05-04 08:59:51.0510 on the recorder's clock (a 10-minute tick 8.949 s in);
 * L2 dips to 161 V (70 %) for 0.7 s from 11.9 s (across the file boundary at 12.3 s), L1 swells to
 * 264.5 V (115 %) for 0.3 s from 17.0 s.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { surveyCommand } from '../../../src/cli/survey/index.js';
import { makeChannels } from '../../trend/signals.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-split-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FS = 5000;
const DURATION_S = 24;
const DIP = { fromS: 11.9, toS: 12.6, rms: 161 };
const SWELL = { fromS: 17.0, toS: 17.3, rms: 264.5 };
const xs = makeChannels(
	[
		{ rms: 230, phaseDeg: 0, steps: [SWELL] },
		{ rms: 230, phaseDeg: -120, steps: [DIP] },
		{ rms: 230, phaseDeg: 120 },
	],
	{ f0Hz: 50 },
	FS,
	DURATION_S,
);
const N = xs[0].length;
/** 08:59:51.0510 in units of 0.1 ms (the stamps are written from integers: no rounding drift). */
const START_TENTH_MS = (8 * 3600 + 59 * 60 + 51) * 10_000 + 510;
const TENTH_MS_PER_SAMPLE = 10_000 / FS;

function stamp(i: number): string {
	const t = START_TENTH_MS + i * TENTH_MS_PER_SAMPLE;
	const s = Math.floor(t / 10_000);
	const p = (x: number, w = 2) => String(x).padStart(w, '0');
	return `2026-05-04 ${p(Math.floor(s / 3600))}:${p(Math.floor(s / 60) % 60)}:${p(s % 60)}.${p(t % 10_000, 4)}`;
}

/** Samples [from, to) as a CSV file with a date/time column; `names` the voltage channels written. */
function writeCsv(path: string, from: number, to: number, names = ['L1', 'L2', 'L3']): void {
	const lines = [`Timestamp,${names.map((n) => `${n} (V)`).join(',')}`];
	for (let i = from; i < to; i++) lines.push(`${stamp(i)},${names.map((_, c) => xs[c][i].toFixed(3)).join(',')}`);
	writeFileSync(path, `${lines.join('\n')}\n`);
}

/** The recording cut at these times (s) into files in a fresh folder, named so their order is not the time order. */
function split(name: string, cutsS: number[]): string {
	const folder = join(dir, name);
	mkdirSync(folder, { recursive: true });
	const edges = [0, ...cutsS.map((t) => Math.round(t * FS)), N];
	for (let k = 0; k + 1 < edges.length; k++)
		writeCsv(join(folder, `part-${String.fromCharCode(122 - k)}.csv`), edges[k], edges[k + 1]);
	return folder;
}

interface Doc {
	aggregates: {
		interval: string;
		startS: number;
		durationS: number;
		complete: boolean;
		flagged: boolean;
		rms: number[];
	}[];
	frequency: { startS: number; durationS: number; frequencyHz: number; complete: boolean }[];
	events: {
		kind: string;
		channels: string[];
		startS: number;
		durationS: number;
		residualV?: number;
		maximumV?: number;
		ended: boolean;
	}[];
	flicker: unknown;
	durationS: number;
	gaps: { startS: number; durationS: number }[];
	overlaps: { durationS: number; droppedSamples: number }[];
	parts: { source: string }[];
}

async function trendOf(folder: string): Promise<{ doc: Doc; code: number; err: string }> {
	const out = textSink();
	const err = textSink();
	const code = await trendCommand([folder], {
		json: true,
		nominal: 230,
		oneRecording: true,
		stdout: out,
		stderr: err,
	});
	return { doc: JSON.parse(out.text()) as Doc, code, err: err.text() };
}

const basic = (d: Doc) => d.aggregates.filter((a) => a.interval === '10/12-cycle');

describe('trend --one-recording: a recording cut into files is one recording', () => {
	let one: Doc;

	it('1 file: 10/12-cycle RMS 230 V, the dip (161 V, 0.7 s) and the swell (264.5 V, 0.3 s) match the closed form', async () => {
		const r = await trendOf(split('one', []));
		expect(r.code).toBe(0);
		one = r.doc;
		// Closed form: the RMS of 230·√2·sin is 230 V; samples printed to 1 mV, so within 0.01 V.
		const rows = basic(one);
		expect(rows.length).toBeGreaterThan(100);
		for (const row of rows.filter((x) => !x.flagged))
			for (const v of row.rms) expect(Math.abs(v - 230)).toBeLessThan(0.01);
		// Events: stamped at the start of the Urms(1/2) window that began/ended them, so within one cycle
		// (20 ms) of the step; Urms(1/2) in the middle of a step equals the step's RMS (closed form, 0.2 %).
		const dip = one.events.find((e) => e.kind === 'dip')!;
		expect(dip.channels).toEqual(['L2']);
		expect(Math.abs(dip.startS - DIP.fromS)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dip.durationS - (DIP.toS - DIP.fromS))).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dip.residualV! - DIP.rms)).toBeLessThanOrEqual(0.002 * 230);
		const swell = one.events.find((e) => e.kind === 'swell')!;
		expect(swell.channels).toEqual(['L1']);
		expect(Math.abs(swell.startS - SWELL.fromS)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(swell.durationS - (SWELL.toS - SWELL.fromS))).toBeLessThanOrEqual(0.02);
		expect(Math.abs(swell.maximumV! - SWELL.rms)).toBeLessThanOrEqual(0.002 * 230);
		expect(one.events.filter((e) => e.kind === 'dip' || e.kind === 'swell')).toHaveLength(2);
		// 10-s values of a 50 Hz sine: 50 Hz; the first is partial up to the 08:59:51.051 + 8.949 s tick.
		expect(one.frequency[1].startS).toBeCloseTo(8.949, 3);
		for (const f of one.frequency.filter((x) => x.complete)) expect(f.frequencyHz).toBeCloseTo(50, 3);
		// The 10-minute tick at 09:00:00 (8.949 s in) cuts the 10-min interval: two partial rows.
		const min10 = one.aggregates.filter((a) => a.interval === '10-min');
		expect(min10.map((a) => a.complete)).toEqual([false, false]);
		expect(min10[1].startS).toBeGreaterThanOrEqual(8.949 - 1 / FS);
		expect(min10[1].startS).toBeLessThan(8.949 + 0.02);
		expect(one.gaps).toEqual([]);
	});

	for (const [name, cuts] of [
		['two', [12.3]],
		['seven', [2.1, 5.5, 8.7, 12.3, 15.02, 19.9]],
	] as const) {
		it(`${cuts.length + 1} files (cut at ${cuts.join(', ')} s): rows, 10-s values and events exactly as from 1 file; the dip across 12.3 s is one event`, async () => {
			const r = await trendOf(split(name, [...cuts]));
			expect(r.code).toBe(0);
			expect(r.doc.parts).toHaveLength(cuts.length + 1);
			// the files are named z, y, x...: read in time order, not name order
			expect(r.doc.parts.map((p) => p.source.slice(-10))).toEqual(
				Array.from({ length: cuts.length + 1 }, (_, k) => `part-${String.fromCharCode(122 - k)}.csv`),
			);
			expect(r.doc.aggregates).toEqual(one.aggregates);
			expect(r.doc.frequency).toEqual(one.frequency);
			expect(r.doc.events).toEqual(one.events);
			expect(r.doc.flicker).toEqual(one.flicker);
			expect(r.doc.durationS).toBe(one.durationS);
			expect(r.doc.gaps).toEqual([]);
			expect(r.doc.events.filter((e) => e.kind === 'dip')).toHaveLength(1);
		});
	}

	it('a gap of 2 s between two files is reported with its start and length, and no row or 10-s value spans it', async () => {
		const folder = join(dir, 'gap');
		mkdirSync(folder, { recursive: true });
		const gapFrom = 9.5 * FS;
		const gapTo = 11.5 * FS;
		writeCsv(join(folder, 'a.csv'), 0, gapFrom);
		writeCsv(join(folder, 'b.csv'), gapTo, N);
		const r = await trendOf(folder);
		expect(r.code).toBe(0);
		expect(r.doc.gaps).toHaveLength(1);
		expect(r.doc.gaps[0].startS).toBeCloseTo(9.5, 6);
		expect(r.doc.gaps[0].durationS).toBeCloseTo(2, 6);
		expect(r.err).toMatch(/No data for 2\.000 s from 9\.500 s/);
		const spans = (a: { startS: number; durationS: number }) =>
			a.startS < 11.5 - 1e-9 && a.startS + a.durationS > 9.5 + 1e-9;
		expect(r.doc.aggregates.filter(spans)).toEqual([]);
		expect(r.doc.frequency.filter(spans)).toEqual([]);
		// the 10-min interval from the 09:00:00 tick (8.949 s) ends at the gap, partial; rows after it are at their clock times
		const min10 = r.doc.aggregates.filter((a) => a.interval === '10-min');
		expect(min10.map((a) => a.complete)).toEqual([false, false, false]);
		expect(min10[2].startS).toBeGreaterThanOrEqual(11.5);
		expect(min10[1].startS + min10[1].durationS).toBeLessThanOrEqual(9.5);
		expect(r.doc.durationS).toBeCloseTo(DURATION_S, 6);
		// the dip at 11.9 s lies after the gap: still found, with its closed-form residual
		const dip = r.doc.events.find((e) => e.kind === 'dip')!;
		expect(Math.abs(dip.startS - DIP.fromS)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dip.residualV! - DIP.rms)).toBeLessThanOrEqual(0.002 * 230);
	});

	it('a file that starts 1 s before the one before it ends: the overlap is reported, its repeated samples dropped, the rows as from 1 file', async () => {
		const folder = join(dir, 'overlap');
		mkdirSync(folder, { recursive: true });
		writeCsv(join(folder, 'a.csv'), 0, 13 * FS);
		writeCsv(join(folder, 'b.csv'), 12 * FS, N);
		const r = await trendOf(folder);
		expect(r.code).toBe(0);
		expect(r.doc.overlaps).toHaveLength(1);
		expect(r.doc.overlaps[0].durationS).toBeCloseTo(1, 6);
		expect(r.doc.overlaps[0].droppedSamples).toBe(FS);
		expect(r.err).toMatch(/b\.csv starts 1\.000 s before the file before it ends/);
		expect(r.doc.aggregates).toEqual(one.aggregates);
		expect(r.doc.events).toEqual(one.events);
	});

	it('a file with other channels is refused with a located not-same-recording error; the other files still count', async () => {
		const folder = join(dir, 'mismatch');
		mkdirSync(folder, { recursive: true });
		writeCsv(join(folder, 'a.csv'), 0, 12 * FS);
		writeCsv(join(folder, 'b.csv'), 12 * FS, N, ['L1', 'L2']);
		const r = await trendOf(folder);
		expect(r.code).toBe(2);
		expect(r.err).toMatch(
			/b\.csv:1: not-same-recording: expected the channels of .*a\.csv: L1 \(voltage, V\), L2 \(voltage, V\), L3/,
		);
		expect(r.doc.parts).toHaveLength(1);
		expect(basic(r.doc).length).toBeGreaterThan(50);
	});

	it('a file stamped 70 years later is a gap, not a hang; a file wholly inside another is dropped whole; both reported', async () => {
		const folder = join(dir, 'far');
		mkdirSync(folder, { recursive: true });
		writeCsv(join(folder, 'a.csv'), 0, 12 * FS);
		writeCsv(join(folder, 'inside.csv'), 2 * FS, 4 * FS);
		writeCsv(join(folder, 'b.csv'), 12 * FS, N);
		writeFileSync(
			join(folder, 'b.csv'),
			readFileSync(join(folder, 'b.csv'), 'utf8').replace(/2026-05-04/g, '2096-05-04'),
		);
		const r = await trendOf(folder);
		expect(r.code).toBe(0);
		// 2026-05-04 to 2096-05-04: 70 years with 18 leap days (2028, 2032 ... 2096; hand count); b.csv starts 12 s in, where a.csv ends
		const years70S = (70 * 365 + 18) * 86_400;
		expect(r.doc.gaps).toHaveLength(1);
		expect(r.doc.gaps[0].startS).toBeCloseTo(12, 6);
		expect(r.doc.gaps[0].durationS).toBeCloseTo(years70S, 0);
		expect(r.doc.overlaps).toHaveLength(1);
		expect(r.doc.overlaps[0].droppedSamples).toBe(2 * FS);
		expect(r.err).toMatch(/inside\.csv starts 10\.000 s before the file before it ends/);
	});

	it('survey of the 7-file folder equals the survey of the 1-file folder (the files analysed as one recording)', async () => {
		const run = async (folder: string) => {
			const out = textSink();
			const code = await surveyCommand([folder], { json: true, nominal: 230, stdout: out, stderr: textSink() });
			const doc = JSON.parse(out.text());
			delete doc.files;
			return { code, doc };
		};
		const a = await run(join(dir, 'one'));
		const b = await run(join(dir, 'seven'));
		expect(b.code).toBe(a.code);
		expect(b.doc).toEqual(a.doc);
		// one recording of 24 s (closed form: the samples written), its one dip and one swell counted once each
		expect(b.doc.coverage.spanS).toBeCloseTo(DURATION_S, 6);
		const total = (t: { counts: number[][]; outside: number }) =>
			t.counts.flat().reduce((x: number, y: number) => x + y, 0) + t.outside;
		expect(total(b.doc.dips)).toBe(1);
		expect(total(b.doc.swells)).toBe(1);
	});
});
