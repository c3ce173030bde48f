/**
 * The long aggregates across file boundaries: an 11-minute three-phase recording written as 1, 2 and 7
 * binary COMTRADE records (FLOAT32, each with its first-sample stamp) gives exactly the same 10/12-cycle,
 * 150/180-cycle and 10-minute rows, 10-s values, events and Pst through `trend --one-recording`; the
 * 1-file result checked against the closed form of the signal.
 *
 * The signal (closed form, tests/trend/signals.ts): 230 V RMS per phase, 50 Hz, 1600 S/s, 660 s from
 * 2026-05-04 08:49:41.051 on the recorder's clock, so the 10-minute interval 08:50:00-09:00:00 lies
 * whole inside it (IEC 61000-4-30:2015, 4.5.3; from memory); L2 dips to 115 V (50 %) for 0.4 s from
 * 299.9 s, across the file boundary at 300.1 s.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../../sample-waves/writers/comtrade.js';
import { makeChannels } from '../../trend/signals.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-split-cfg-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FS = 1600;
const DURATION_S = 660;
const DIP = { fromS: 299.9, toS: 300.3, rms: 115 };
const xs = makeChannels(
	[
		{ rms: 230, phaseDeg: 0 },
		{ rms: 230, phaseDeg: -120, steps: [DIP] },
		{ rms: 230, phaseDeg: 120 },
	],
	{ f0Hz: 50 },
	FS,
	DURATION_S,
);
const N = xs[0].length;
/** 08:49:41.051000 in µs; one sample is 625 µs at 1600 S/s, so every file's stamp is exact. */
const START_US = (8 * 3600 + 49 * 60 + 41) * 1e6 + 51_000;
const TICK_S = 18.949; // 08:50:00 − 08:49:41.051

function stamp(i: number): string {
	const us = START_US + i * (1e6 / FS);
	const s = Math.floor(us / 1e6);
	const p = (x: number, w = 2) => String(x).padStart(w, '0');
	return `04/05/2026,${p(Math.floor(s / 3600))}:${p(Math.floor(s / 60) % 60)}:${p(s % 60)}.${p(us % 1e6, 6)}`;
}

function writeRecord(base: string, from: number, to: number): void {
	const spec: WriterSpec = {
		station: 'Tallowmere Joinery',
		device: 'incomer logger',
		revYear: 2013,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: FS, endSample: to - from }],
		firstData: stamp(from),
		trigger: stamp(from),
		fileType: 'FLOAT32',
		analog: ['L1', 'L2', 'L3'].map((name, c) => ({ name, phase: name, unit: 'V', values: xs[c].subarray(from, to) })),
	};
	writeFileSync(`${base}.cfg`, comtradeCfgText(spec));
	writeFileSync(`${base}.dat`, comtradeDatBytes(spec));
}

function split(name: string, cutsS: number[]): string {
	const folder = join(dir, name);
	mkdirSync(folder, { recursive: true });
	const edges = [0, ...cutsS.map((t) => Math.round(t * FS)), N];
	for (let k = 0; k + 1 < edges.length; k++) writeRecord(join(folder, `hour-${k}`), edges[k], edges[k + 1]);
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
	frequency: unknown[];
	events: { kind: string; channels: string[]; startS: number; durationS: number; residualV?: number }[];
	flicker: { pst: { startS: number; values: number[] }[] } | null;
	gaps: unknown[];
}

async function trendOf(folder: string): Promise<Doc> {
	const out = textSink();
	const err = textSink();
	const code = await trendCommand([folder], { json: true, nominal: 230, oneRecording: true, stdout: out, stderr: err });
	expect(err.text()).not.toMatch(/sinecheck:/);
	expect(code).toBe(0);
	return JSON.parse(out.text()) as Doc;
}

describe('trend --one-recording over COMTRADE records: 150/180-cycle, 10-min and flicker run on across files', () => {
	let one: Doc;

	it('1 record: the whole 10-min interval from 08:50:00 holds 230 V on L1 and L3 and is flagged by the dip; the dip is 115 V for 0.4 s', async () => {
		one = await trendOf(split('one', []));
		const min10 = one.aggregates.filter((a) => a.interval === '10-min');
		expect(min10.map((a) => a.complete)).toEqual([false, true, false]);
		// first whole cycle at or after the tick: within one cycle (20 ms) of 18.949 s
		expect(min10[1].startS).toBeGreaterThanOrEqual(TICK_S - 1 / FS);
		expect(min10[1].startS).toBeLessThan(TICK_S + 0.02);
		expect(min10[1].durationS).toBeCloseTo(600, 1);
		expect(min10[1].flagged).toBe(true);
		// closed form: RMS of 230·√2·sin is 230 V (FLOAT32 storage keeps ~7 digits)
		expect(min10[1].rms[0]).toBeCloseTo(230, 2);
		expect(min10[1].rms[2]).toBeCloseTo(230, 2);
		for (const r of one.aggregates.filter((a) => a.interval === '150/180-cycle' && !a.flagged))
			for (const v of r.rms) expect(v).toBeCloseTo(230, 2);
		const dips = one.events.filter((e) => e.kind === 'dip');
		expect(dips).toHaveLength(1);
		expect(dips[0].channels).toEqual(['L2']);
		expect(Math.abs(dips[0].startS - DIP.fromS)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dips[0].durationS - (DIP.toS - DIP.fromS))).toBeLessThanOrEqual(0.02);
		expect(Math.abs(dips[0].residualV! - DIP.rms)).toBeLessThanOrEqual(0.002 * 230);
		// one Pst for the complete interval 08:50-09:00 (IEC 61000-4-15 via lib/flicker); a steady sine: near 0
		expect(one.flicker?.pst).toHaveLength(1);
		expect(one.flicker!.pst[0].startS).toBeCloseTo(TICK_S, 3);
		expect(one.flicker!.pst[0].values[0]).toBeLessThan(0.05);
	});

	it('a record at another sample rate is refused with not-same-recording at its .cfg rate line; the first still counts', async () => {
		const folder = join(dir, 'rates');
		mkdirSync(folder, { recursive: true });
		writeRecord(join(folder, 'a'), 0, 2 * FS);
		const spec: WriterSpec = {
			station: 'Tallowmere Joinery',
			device: 'incomer logger',
			revYear: 2013,
			lineFrequencyHz: 50,
			rates: [{ sampleRateHz: 2 * FS, endSample: 4 * FS }],
			firstData: stamp(2 * FS),
			trigger: stamp(2 * FS),
			fileType: 'FLOAT32',
			analog: ['L1', 'L2', 'L3'].map((name, c) => ({
				name,
				phase: name,
				unit: 'V',
				values: xs[c].subarray(0, 4 * FS),
			})),
		};
		const cfg = comtradeCfgText(spec);
		writeFileSync(join(folder, 'b.cfg'), cfg);
		writeFileSync(join(folder, 'b.dat'), comtradeDatBytes(spec));
		// the line of the .cfg that states the rate: `<rate>,<last sample>` (IEEE C37.111, from memory)
		const rateLine = cfg.split(/\r?\n/).findIndex((l) => l.startsWith(`${2 * FS},`)) + 1;
		const out = textSink();
		const err = textSink();
		const code = await trendCommand([folder], {
			json: true,
			nominal: 230,
			oneRecording: true,
			stdout: out,
			stderr: err,
		});
		expect(code).toBe(2);
		expect(rateLine).toBeGreaterThan(0);
		expect(err.text()).toMatch(
			new RegExp(`b\\.cfg:${rateLine}:1: not-same-recording: expected the sample rate of .*a\\.cfg, ${FS} Hz`),
		);
		expect(JSON.parse(out.text()).parts).toHaveLength(1);
	});

	for (const [name, cuts] of [
		['two', [300.1]],
		['seven', [60, 150.5, 230, 300.1, 400, 520.7]],
	] as const) {
		it(`${cuts.length + 1} records (cut at ${cuts.join(', ')} s): every row, 10-s value, event and Pst exactly as from 1 record`, async () => {
			const r = await trendOf(split(name, [...cuts]));
			expect(r.aggregates).toEqual(one.aggregates);
			expect(r.frequency).toEqual(one.frequency);
			expect(r.events).toEqual(one.events);
			expect(r.flicker).toEqual(one.flicker);
			expect(r.gaps).toEqual([]);
		});
	}
});
