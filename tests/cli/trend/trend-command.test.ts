import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { trendErrorLine } from '../../../src/cli/trend/trend-command.js';
import { ImportError } from '../../../lib/io/import-error.js';
import { FloatWavWriter } from '../../trend/float-wav.js';
import { makeChannels } from '../../trend/signals.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const sink = textSink;

// Three phases at 230 V, 50 Hz, 10 kS/s, 2 s, with a 70 % dip of 60 ms on L2 from 0.5057 s, and a 10 A current.
const T0 = 0.5057;
const FS = 10_000;
const xs = makeChannels(
	[
		{ rms: 230, phaseDeg: 0 },
		{ rms: 230, phaseDeg: -120, steps: [{ fromS: T0, toS: T0 + 0.06, rms: 161 }] },
		{ rms: 230, phaseDeg: 120 },
		{ rms: 10, phaseDeg: -30 },
	],
	{ f0Hz: 50 },
	FS,
	2,
);
const wavPath = join(dir, 'board.wav');
{
	const w = new FloatWavWriter(
		wavPath,
		[
			{ name: 'L1', unit: 'V' },
			{ name: 'L2', unit: 'V' },
			{ name: 'L3', unit: 'V' },
			{ name: 'I1', unit: 'A' },
		],
		FS,
		xs[0].length,
	);
	// in uneven blocks, as the bench does
	for (let off = 0; off < xs[0].length; off += 7001)
		w.write(xs.map((x) => x.subarray(off, Math.min(x.length, off + 7001))));
	w.close();
}

describe('trendCommand', () => {
	it('trendCommand([wav], { json }) streams a float WAV and reports the 70 % dip on L2 (residual 161 V within 0.2 % of 230 V)', async () => {
		const out = sink();
		const err = sink();
		const code = await trendCommand([wavPath], { json: true, nominal: 230, stdout: out, stderr: err });
		expect(code).toBe(0);
		const doc = JSON.parse(out.text());
		expect(doc.declaredV).toBe(230);
		expect(doc.channels.map((c: { name: string }) => c.name)).toEqual(['L1', 'L2', 'L3', 'I1']);
		expect(doc.events.length).toBe(1);
		const e = doc.events[0];
		expect(e.kind).toBe('dip');
		expect(e.channels).toEqual(['L2']);
		expect(Math.abs(e.startS - T0)).toBeLessThanOrEqual(0.01);
		expect(Math.abs(e.durationS - 0.06)).toBeLessThanOrEqual(0.02);
		expect(Math.abs(e.residualV - 161)).toBeLessThanOrEqual(0.46);
		const basic = doc.aggregates.filter((a: { interval: string }) => a.interval === '10/12-cycle');
		expect(basic.length).toBeGreaterThanOrEqual(8);
		for (const a of basic) {
			expect(a.rms[0]).toBeCloseTo(230, 3); // closed form; float32 storage keeps ~7 digits
			expect(a.rms[3]).toBeCloseTo(10, 4);
			if (!a.flagged) expect(a.rms[1]).toBeCloseTo(230, 3);
		}
		expect(basic.some((a: { flagged: boolean }) => a.flagged)).toBe(true);
	});

	it('trendCommand([wav], { json }) lists an interruption of all three phases once, not also as the dip that contains it', async () => {
		const cut = [{ fromS: 0.5, toS: 0.7, rms: 0 }];
		const ys = makeChannels(
			[
				{ rms: 230, phaseDeg: 0, steps: cut },
				{ rms: 230, phaseDeg: -120, steps: cut },
				{ rms: 230, phaseDeg: 120, steps: cut },
			],
			{ f0Hz: 50 },
			FS,
			2,
		);
		const path = join(dir, 'outage.wav');
		const w = new FloatWavWriter(
			path,
			[
				{ name: 'L1', unit: 'V' },
				{ name: 'L2', unit: 'V' },
				{ name: 'L3', unit: 'V' },
			],
			FS,
			ys[0].length,
		);
		w.write(ys);
		w.close();
		const out = sink();
		const code = await trendCommand([path], { json: true, nominal: 230, stdout: out, stderr: sink() });
		expect(code).toBe(0);
		const doc = JSON.parse(out.text());
		expect(doc.events.map((e: { kind: string }) => e.kind)).toEqual(['interruption']);
	});

	it('trendCommand([wav]) writes CSV rows of 10/12-cycle aggregates and prints the event on stderr', async () => {
		const out = sink();
		const err = sink();
		const code = await trendCommand([wavPath], { nominal: '230', stdout: out, stderr: err });
		expect(code).toBe(0);
		const lines = out.text().trim().split('\n');
		expect(lines[0]).toBe(
			'interval,start_s,duration_s,cycles,frequency_hz,complete,flagged,L1 rms (V),L1 THD (%),L2 rms (V),L2 THD (%),L3 rms (V),L3 THD (%),I1 rms (A),I1 THD (%)',
		);
		expect(lines.length).toBeGreaterThanOrEqual(9);
		for (const l of lines.slice(1)) {
			const c = l.split(',');
			expect(c.length).toBe(15);
			expect(c[0]).toBe('10/12-cycle');
			expect(Number(c[4])).toBeCloseTo(50, 3);
			expect(Number(c[7])).toBeCloseTo(230, 2);
			expect(Number(c[8])).toBeLessThan(0.01); // a pure sine: THD ~ 0
		}
		expect(err.text()).toMatch(/board\.wav: dip on L2 at 0\.\d+ s/);
	});

	it('trendCommand([wav], { harmonics }) adds 49 columns per channel, H2-H50, each ~0 % for pure sines', async () => {
		const out = sink();
		const code = await trendCommand([wavPath], { nominal: 230, harmonics: true, stdout: out, stderr: sink() });
		expect(code).toBe(0);
		const lines = out.text().trim().split('\n');
		const head = lines[0].split(',');
		expect(head.length).toBe(15 + 4 * 49);
		expect(head[15]).toBe('L1 H2 (%)');
		expect(head[head.length - 1]).toBe('I1 H50 (%)');
		const cells = lines[1].split(',').slice(15).map(Number);
		expect(Math.max(...cells)).toBeLessThan(0.01);
	});

	it('trendCommand([csv]) reads a CSV recording and gives the same 230 V aggregates', async () => {
		const fs = 5000;
		const [u] = makeChannels([{ rms: 230, phaseDeg: 10 }], { f0Hz: 50 }, fs, 1);
		const rows = ['time (s),U1 (V)', ...Array.from(u, (v, i) => `${(i / fs).toFixed(6)},${v.toFixed(6)}`)];
		const p = join(dir, 'short.csv');
		writeFileSync(p, rows.join('\n') + '\n');
		const out = sink();
		const err = sink();
		const code = await trendCommand([p], { json: true, nominal: 230, stdout: out, stderr: err });
		expect(err.text()).not.toMatch(/cannot analyse/);
		expect(code).toBe(0);
		const doc = JSON.parse(out.text());
		expect(doc.sampleRateHz).toBeCloseTo(fs, 6);
		const basic = doc.aggregates.filter((a: { interval: string }) => a.interval === '10/12-cycle');
		expect(basic.length).toBeGreaterThanOrEqual(4);
		for (const a of basic) expect(a.rms[0]).toBeCloseTo(230, 3);
		expect(doc.events).toEqual([]);
	});

	it('bad input gives exit code 2 and one line naming the file, no stack trace', async () => {
		const p = join(dir, 'broken.wav');
		writeFileSync(p, Buffer.concat([Buffer.from('RIFF'), Buffer.alloc(4), Buffer.from('WAVEjunk'), Buffer.alloc(8)]));
		for (const [files, opts] of [
			[[p], {}],
			[[join(dir, 'absent.wav')], {}],
			[[wavPath], { nominal: 'abc' }],
			[[wavPath], { interval: '7min' }],
			[[wavPath], { rvcPercent: '-3' }],
			[[], {}],
		] as const) {
			const out = sink();
			const err = sink();
			const code = await trendCommand([...files], { ...opts, stdout: out, stderr: err });
			expect(code).toBe(2);
			const lines = err.text().trim().split('\n');
			expect(lines.length).toBe(1);
			expect(lines[0]).not.toMatch(/\n\s+at /);
			expect(lines[0]).toMatch(/^sinecheck: /);
			if (files.length > 0 && Object.keys(opts).length === 0) expect(lines[0]).toContain(files[0]);
		}
	});

	// The error-line shape is the `analyse` command's (src/cli/analyse-unit.ts problemText, main.ts prefix):
	// `sinecheck: <path as given>[:line[:column]]: <code>: expected …, got "…"`; line and column left out when 0,
	// and a binary file's offset (ImportError line 0, column = offset + 1) printed as `byte N`.
	it('error lines: sinecheck: prefix, the path as given, line/column only when known, byte N for a binary offset', () => {
		const got = ', got "x"';
		expect(trendErrorLine(new ImportError('data/a.csv', 12, 7, 'bad-number', 'x', 'a number'), 'data/a.csv')).toBe(
			`sinecheck: data/a.csv:12:7: bad-number: expected a number${got}`,
		);
		expect(trendErrorLine(new ImportError('data/a.csv', 3, 0, 'no-data', '', 'rows of numbers'), 'data/a.csv')).toBe(
			'sinecheck: data/a.csv:3: no-data: expected rows of numbers',
		);
		expect(
			trendErrorLine(new ImportError('data/a.cfg', 0, 0, 'missing-companion-file', '', 'the .dat'), 'data/a.cfg'),
		).toBe('sinecheck: data/a.cfg: missing-companion-file: expected the .dat');
		// WAV / binary .dat: column 37 = byte offset 36
		expect(trendErrorLine(new ImportError('rec/b.wav', 0, 37, 'bad-wav', '', "'data' chunk"), 'rec/b.wav')).toBe(
			"sinecheck: rec/b.wav: byte 36: bad-wav: expected 'data' chunk",
		);
		expect(trendErrorLine(new RangeError('sample rate must be above 0'), 'rec/b.wav')).toBe(
			'sinecheck: rec/b.wav: sample rate must be above 0',
		);
		expect(trendErrorLine(new Error('boom'), 'rec/b.wav')).toMatch(
			/^sinecheck: rec\/b\.wav: could not analyse: an internal check failed/,
		);
	});

	it('a bad WAV in a sub-folder is named by the path as given (not its base name), with its byte offset', async () => {
		const sub = join(dir, 'site-7');
		mkdirSync(sub, { recursive: true });
		const p = join(sub, 'truncated.wav');
		// RIFF/WAVE header and a 'fmt ' chunk that says 16 bytes but stops after 4: no 'data' chunk anywhere
		writeFileSync(
			p,
			Buffer.concat([
				Buffer.from('RIFF'),
				Buffer.alloc(4),
				Buffer.from('WAVEfmt '),
				Buffer.from([16, 0, 0, 0, 1, 0, 1, 0]),
			]),
		);
		const given = relative(process.cwd(), p);
		const err = sink();
		const code = await trendCommand([given], { stdout: sink(), stderr: err });
		expect(code).toBe(2);
		const line = err.text().trim();
		expect(line.split('\n')).toHaveLength(1);
		expect(line.startsWith(`sinecheck: ${given}: `)).toBe(true);
		expect(line).toMatch(/: byte \d+: bad-wav: /);
	});

	it('a missing path gives `sinecheck: <path>: no such file or folder` and the other files still run', async () => {
		const absent = join(dir, 'absent.wav');
		const err = sink();
		const out = sink();
		const code = await trendCommand([absent, wavPath], { json: true, nominal: 230, stdout: out, stderr: err });
		expect(code).toBe(2);
		expect(err.text()).toContain(`sinecheck: ${absent}: no such file or folder\n`);
		expect(JSON.parse(out.text()).channels).toHaveLength(4);
	});

	it('a folder is walked as analyse walks it: each recording in it trended, other files skipped with a note', async () => {
		const folder = join(dir, 'walk');
		mkdirSync(folder, { recursive: true });
		copyFileSync(wavPath, join(folder, 'a.wav'));
		copyFileSync(wavPath, join(folder, 'b.wav'));
		writeFileSync(join(folder, 'notes.md'), 'not a recording\n');
		const out = sink();
		const err = sink();
		const code = await trendCommand([folder], { json: true, nominal: 230, stdout: out, stderr: err });
		expect(code).toBe(0);
		const docs = JSON.parse(out.text());
		expect(docs).toHaveLength(2);
		expect(err.text()).toMatch(/note: skipped 1 file/);
		const empty = join(dir, 'empty-folder');
		mkdirSync(empty, { recursive: true });
		const err2 = sink();
		expect(await trendCommand([empty], { stdout: sink(), stderr: err2 })).toBe(2);
		expect(err2.text()).toMatch(
			new RegExp(`^sinecheck: ${empty.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: no recordings found`),
		);
	});

	const feeder = '../shared/data/feeder-sag-1999/feeder-sag.cfg';
	if (!existsSync(feeder))
		console.warn(`tests/cli/trend/trend-command.test.ts: ${feeder} is absent; the COMTRADE case is skipped.`);
	it.skipIf(!existsSync(feeder))(
		'trendCommand([cfg], { nominal: 7200 }) reads the COMTRADE field recording and reports the dip on Vb and Vc',
		async () => {
			const out = sink();
			const err = sink();
			const code = await trendCommand([feeder], { json: true, nominal: 7200, stdout: out, stderr: err });
			expect(code).toBe(0);
			const doc = JSON.parse(out.text());
			expect(doc.events.map((e: { kind: string }) => e.kind)).toEqual(['dip']);
			expect(doc.events[0].channels).toEqual(['Vb', 'Vc']);
		},
	);

	it.skipIf(!existsSync(feeder))(
		'a COMTRADE .cfg whose .dat is cut short: the error names the .dat by the folder the user gave',
		async () => {
			const sub = join(dir, 'cut');
			mkdirSync(sub, { recursive: true });
			copyFileSync(feeder, join(sub, 'feeder.cfg'));
			// keep the first 10 of the 3584 records the .cfg announces (PROVENANCE.md): too short
			const dat = readFileSync(feeder.replace(/\.cfg$/, '.dat'), 'utf8')
				.split(/\r?\n/)
				.slice(0, 10)
				.join('\n');
			writeFileSync(join(sub, 'feeder.dat'), dat + '\n');
			const given = relative(process.cwd(), join(sub, 'feeder.cfg'));
			const err = sink();
			expect(await trendCommand([given], { stdout: sink(), stderr: err })).toBe(2);
			const line = err.text().trim();
			expect(line).toMatch(/^sinecheck: /);
			expect(line).toContain(given.replace(/\.cfg$/, '.dat'));
		},
	);
});
