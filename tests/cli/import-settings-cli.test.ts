/**
 * The built command with --scale/--unit/--quantity on files that are not CSV: the settings apply to every
 * format (lib/io/import-settings.ts), and the format comes from the content. Expected figures are closed
 * forms: a sine of peak √2·230 V has RMS 230 V; a float WAV sample x at scale 400 is 400·x V.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import wavefile from 'wavefile';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeChannels } from '../trend/signals.js';
import { ensureBuiltCli, mainJs } from './built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-settings-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
beforeAll(ensureBuiltCli);

const run = (args: string[]) =>
	spawnSync(process.execPath, [mainJs, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });

// 230 V, 50 Hz, 6.4 kS/s, 1.5 s with a 70 % dip for 100 ms from 0.5 s, stored as fractions of 400 V
const FS = 6400;
const [u] = makeChannels(
	[{ rms: 230, phaseDeg: 0, steps: [{ fromS: 0.5, toS: 0.6, rms: 161 }] }],
	{ f0Hz: 50 },
	FS,
	1.5,
);
beforeAll(() => {
	const { WaveFile } = wavefile as unknown as {
		WaveFile: new () => {
			fromScratch(ch: number, rate: number, depth: string, s: number[]): void;
			toBuffer(): Uint8Array;
		};
	};
	const w = new WaveFile();
	w.fromScratch(
		1,
		FS,
		'32f',
		Array.from(u, (v) => v / 400),
	);
	writeFileSync(join(dir, 'logger.wav'), w.toBuffer());
	writeFileSync(join(dir, 'logger-named.csv'), w.toBuffer());
});

describe('import settings on the command line', () => {
	it('analyse: a WAV named .csv is read as WAV and --scale/--unit make it 230 V', () => {
		const r = run(['analyse', 'logger-named.csv', '--scale', 'ch1=400', '--unit', 'ch1=V', '--json', '--quiet']);
		expect(r.stderr).toBe('');
		const report = JSON.parse(r.stdout.trim().split('\n')[0]);
		const ch = report.channels[0];
		expect([ch.name, ch.unit, ch.quantity]).toEqual(['ch1', 'V', 'voltage']);
		// whole cycles of the record (the dip included): the RMS lies between 161 V and 230 V
		expect(ch.rms).toBeGreaterThan(161);
		expect(ch.rms).toBeLessThanOrEqual(230.5);
		expect(report.diagnostics.map((d: { code: string }) => d.code)).toEqual(
			expect.arrayContaining(['format-from-content', 'channel-from-user']),
		);
	});

	it('trend: a float WAV given --scale, --unit and --quantity gives its dip', () => {
		const r = run([
			'trend',
			'logger.wav',
			'--scale',
			'ch1=400',
			'--unit',
			'ch1=V',
			'--quantity',
			'ch1=voltage',
			'--nominal',
			'230',
			'--json',
		]);
		expect(r.status).toBe(0);
		const doc = JSON.parse(r.stdout);
		expect(doc.events.map((e: { kind: string }) => e.kind)).toEqual(['dip']);
		expect(Math.abs(doc.events[0].startS - 0.5)).toBeLessThanOrEqual(0.01);
		expect(Math.abs(doc.events[0].residualV - 161)).toBeLessThanOrEqual(2);
	});

	it('a setting for a channel the file lacks is an error naming the channels it has', () => {
		const r = run(['analyse', 'logger.wav', '--scale', 'U9=400']);
		expect(r.status).toBe(2);
		expect(r.stderr).toContain('U9');
		expect(r.stderr).toContain('(ch1)');
	});
});
