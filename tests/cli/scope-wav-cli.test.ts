/**
 * `sinecheck analyse` on a one-cycle 8-bit WAV of a scope's two inputs with --probe and --clamp: the
 * settings reach the short-record fit, the resolution and the clipping check as scaled values. The WAV is
 * written by wavefile (npm, an independent writer); its full scale (±4 V at the scope's input) is stated
 * in the file's INFO comment. Expected figures are closed forms of the construction: 230 V RMS at 50.2 Hz
 * through x100 (2.30 V RMS at the input), 10 A RMS fundamental lagging by 25° plus a 3 A 3rd through a
 * 100 mV/A clamp; an 8-bit code on ±4 V is 8/256 V (common practice for a scope's converter).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import wavefile from 'wavefile';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuiltCli, mainJs } from './built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-scope-wav-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FS = 1_000_000;
const F = 50.2;
const N = Math.round(FS / F); // one cycle: 19 920 samples
const Q = 8 / 256;
const LAG_DEG = 25;

/** Unsigned 8-bit WAV codes (128 = 0 V) of volts at the scope's input. */
const codes = (volts: (t: number) => number) =>
	Array.from({ length: N }, (_, k) => 128 + Math.max(-128, Math.min(127, Math.round(volts(k / FS) / Q))));

beforeAll(async () => {
	await ensureBuiltCli();
	const w = 2 * Math.PI * F;
	const u = codes((t) => ((230 * Math.SQRT2) / 100) * Math.sin(w * t + 0.4));
	// clamp output: 0.1 V per A
	const lag = (LAG_DEG * Math.PI) / 180;
	const i = codes((t) => 0.1 * Math.SQRT2 * (10 * Math.sin(w * t + 0.4 - lag) + 3 * Math.sin(3 * (w * t + 0.4))));
	const { WaveFile } = wavefile as unknown as {
		WaveFile: new () => {
			fromScratch(ch: number, rate: number, depth: string, s: number[][]): void;
			setTag(t: string, v: string): void;
			toBuffer(): Uint8Array;
		};
	};
	const wav = new WaveFile();
	wav.fromScratch(2, FS, '8', [u, i]);
	wav.setTag('ICMT', 'sinecheck-calibration: 1=CH1 V 4; 2=CH2 V 4');
	writeFileSync(join(dir, 'drive-scope.wav'), wav.toBuffer());
}, 120_000);

const run = (args: string[]) =>
	spawnSync(process.execPath, [mainJs, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });

describe('analyse: an 8-bit one-cycle WAV with --probe x100 and --clamp 100', () => {
	it('gives 230 V and 10 A fundamentals, the 25° lag, the assumptions said, and no clipping', () => {
		const r = run(['analyse', 'drive-scope.wav', '--probe', 'CH1=x100', '--clamp', 'CH2=100', '--json', '--quiet']);
		expect(r.status, r.stderr).toBe(0);
		const doc = JSON.parse(r.stdout.trim().split('\n')[0]);
		const [u, i] = doc.channels;
		expect([u.unit, u.quantity, i.unit, i.quantity]).toEqual(['V', 'voltage', 'A', 'current']);
		expect(doc.shortRecord.note).toBe('from a fit of a short record');
		// frequency within 0.02 %, fundamentals within 0.1 % (8-bit rounding is far below; see docs/short-record-fit.md)
		expect(Math.abs(doc.frequencyHz / F - 1)).toBeLessThan(2e-4);
		expect(Math.abs(u.harmonics[1].rms / 230 - 1)).toBeLessThan(1e-3);
		expect(Math.abs(i.harmonics[1].rms / 10 - 1)).toBeLessThan(1e-3);
		expect(Math.abs(i.harmonics[3].rms / 3 - 1)).toBeLessThan(1e-2);
		expect(Math.abs(doc.pairs[0].lagDeg - LAG_DEG)).toBeLessThan(0.2);
		// the resolution is in the scaled unit: one code 8/256 V × 100 = 3.125 V; ÷ 0.1 V/A = 0.3125 A
		expect(u.resolution.codeStep).toBeCloseTo(3.125, 9);
		expect(i.resolution.codeStep).toBeCloseTo(0.3125, 9);
		// no false clipping: the 325 V crest sits 23 codes under the WAV's full scale of 400 V
		const all = [...doc.warnings, ...u.warnings, ...i.warnings].join('\n');
		expect(all).not.toMatch(/clipping/i);
		// every assumption is reported: the user's probe and clamp, and the full scale taken as the range
		const said = doc.assumptions.join('\n');
		expect(said).toMatch(/Channel CH1: probe x 100 \(set by the user\); now in V, measures voltage/);
		expect(said).toMatch(/Channel CH2: clamp 100 mV\/A: x 10 \(set by the user\); now in A, measures current/);
		expect(said).toMatch(/full scale is each channel's range/);
		// power: P1 = V1·I1·cos 25° (IEEE 1459 fundamental active power, closed form)
		const p1 = doc.power[0].ieee1459.fundamentalActivePowerW;
		expect(Math.abs(p1 / (230 * 10 * Math.cos((LAG_DEG * Math.PI) / 180)) - 1)).toBeLessThan(3e-3);
	});

	it('the same WAV clipped at full scale is flagged, with the range in volts after the probe', () => {
		// 1.3 × the top code at the input: the crests are held at the converter's limits
		const w = 2 * Math.PI * F;
		const u = codes((t) => 1.3 * 4 * Math.sin(w * t));
		const { WaveFile } = wavefile as unknown as {
			WaveFile: new () => {
				fromScratch(ch: number, rate: number, depth: string, s: number[]): void;
				setTag(t: string, v: string): void;
				toBuffer(): Uint8Array;
			};
		};
		const wav = new WaveFile();
		wav.fromScratch(1, FS, '8', u);
		wav.setTag('ICMT', 'sinecheck-calibration: 1=CH1 V 4');
		writeFileSync(join(dir, 'over.wav'), wav.toBuffer());
		const r = run(['analyse', 'over.wav', '--probe', 'CH1=100', '--json', '--quiet']);
		expect(r.status, r.stderr).toBe(0);
		const doc = JSON.parse(r.stdout.trim().split('\n')[0]);
		const w0 = doc.channels[0].warnings.find((x: string) => /clipping/i.test(x));
		expect(w0).toBeDefined();
		// full scale of an 8-bit WAV: codes 0 … 255 → (k − 128)/128 × 4 V × 100 = −400 … 396.9 V
		expect(w0).toMatch(/-400 … 396\.9/);
		expect(w0).toMatch(/8-bit WAV's full scale/);
	});
});
