/**
 * Hostile and huge input through the built CLI in a child process with a heap cap and a time limit:
 * each case ends with a report or a located error line, never a hang, a crash or a stack trace.
 * The nasty files are generated here into a temporary folder.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../../sample-waves/writers/comtrade.js';
import { FloatWavWriter } from '../../trend/float-wav.js';
import { ensureBuiltCli, mainJs } from '../built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-hostile-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
beforeAll(ensureBuiltCli);

/** Runs the CLI with a 256 MB heap and a 60 s limit; a hang shows as status null and signal SIGTERM. */
function cli(...args: string[]): { status: number | null; signal: string | null; stdout: string; stderr: string } {
	const r = spawnSync(process.execPath, ['--max-old-space-size=256', mainJs, ...args], {
		cwd: dir,
		encoding: 'utf8',
		timeout: 60_000,
		maxBuffer: 64 << 20,
	});
	return { status: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

/** No JavaScript stack frame reached the user. */
function noStack(text: string): void {
	expect(text).not.toMatch(/^\s+at .+[(:]\d+/m);
	expect(text).not.toMatch(/FATAL ERROR|RangeError|TypeError/);
}

const sine = (k: number, fs: number, peak = 325) => peak * Math.sin((2 * Math.PI * 50 * k) / fs);

function write(name: string, text: string): string {
	writeFileSync(join(dir, name), text);
	return name;
}

describe('case 1: a CSV alternating +-1e308 (squares overflow)', () => {
	const file = () =>
		write(
			'overflow.csv',
			[
				't (s),U1 (V)',
				...Array.from({ length: 10_000 }, (_, k) => `${(k / 1e4).toFixed(4)},${k % 2 === 0 ? '1e308' : '-1e308'}`),
			].join('\n'),
		);

	it('analyse finishes and says which sample is too large (no endless loop)', () => {
		const r = cli('analyse', file());
		expect(r.signal).toBeNull();
		expect(r.status).toBe(0);
		expect(r.stdout).toMatch(/Sample at index 0 is 1e\+308: the samples are too large/);
		noStack(r.stdout + r.stderr);
	});

	it('trend finishes and names the channel and time of the first window it could not square', () => {
		const r = cli('trend', file());
		expect(r.signal).toBeNull();
		expect(r.status).toBe(0);
		expect(r.stderr).toMatch(/too large to square.*the first on U1 at \d/);
		noStack(r.stderr);
	});
});

describe('case 2: a record of more than 125,000 cycles', () => {
	it('analyse of 130,000 cycles (50 Hz at 1 kS/s, 43 min) reports instead of overflowing the stack', () => {
		const fs = 1000;
		const frames = 130_000 * 20;
		const w = new FloatWavWriter(join(dir, 'long.wav'), [{ name: 'U1', unit: 'V' }], fs, frames);
		const block = new Float64Array(100_000);
		for (let off = 0; off < frames; off += block.length) {
			const m = Math.min(block.length, frames - off);
			for (let i = 0; i < m; i++) block[i] = sine(off + i, fs);
			w.write([block.subarray(0, m)]);
		}
		w.close();
		const r = cli('analyse', 'long.wav', '--json');
		expect(r.signal).toBeNull();
		noStack(r.stderr);
		expect(r.status).toBe(0);
		const doc = JSON.parse(r.stdout.trim().split('\n')[0]);
		// 325 V peak: RMS 325/sqrt 2 = 229.8 V (closed form)
		expect(JSON.stringify(doc)).toMatch(/"lowestRms":229\.8/);
	}, 120_000);
});

describe('case 3: trend on impossible time bases', () => {
	it('a COMTRADE sample rate of 1e-300 Hz is an out-of-range error at the .cfg line of the rate', () => {
		const cfg = [
			'Tallowmere Joinery,rec-1,1999',
			'1,1A,0D',
			'1,U1,L1,,V,1,0,0,-32767,32767,1,1,P',
			'50',
			'1',
			'1e-300,1000',
			'01/02/2026,10:00:00.000000',
			'01/02/2026,10:00:00.000000',
			'ASCII',
			'1',
			'',
		].join('\r\n');
		write('slow.cfg', cfg);
		write(
			'slow.dat',
			Array.from({ length: 1000 }, (_, k) => `${k + 1},${k * 100},${Math.round(sine(k, 1e4, 300))}`).join('\r\n') +
				'\r\n',
		);
		const r = cli('trend', 'slow.cfg');
		expect(r.signal).toBeNull();
		expect(r.status).toBe(2);
		expect(r.stderr).toMatch(/^sinecheck: slow\.cfg:6:1: out-of-range: expected a sample rate from 288 Hz/m);
		noStack(r.stderr);
	});

	it('time stamps 1e-300 s apart (a rate of 1e300 Hz) are out-of-range at the first time stamp, line 2 column 1', () => {
		const rows = Array.from({ length: 5000 }, (_, k) => `${(k * 1e-300).toExponential(6)},${sine(k, 1e4).toFixed(3)}`);
		write('squeezed.csv', ['t (s),U1 (V)', ...rows].join('\n'));
		const r = cli('trend', 'squeezed.csv');
		expect(r.signal).toBeNull();
		expect(r.status).toBe(2);
		expect(r.stderr).toMatch(
			/^sinecheck: squeezed\.csv:2:1: out-of-range: expected a sample rate from 288 Hz to 10000000 Hz.*got "1e\+300 Hz"/m,
		);
		noStack(r.stderr);
	});

	it('time stamps that jump by 1e6 s: trend finishes, the gap is a warning at its line', () => {
		const rows = Array.from(
			{ length: 20_000 },
			(_, k) => `${(k / 1e4 + (k >= 10_000 ? 1e6 : 0)).toFixed(4)},${sine(k, 1e4).toFixed(3)}`,
		);
		write('jump.csv', ['t (s),U1 (V)', ...rows].join('\n'));
		const r = cli('trend', 'jump.csv');
		expect(r.signal).toBeNull();
		expect(r.status).toBe(0);
		// row 10000 (0-based) of the data is line 10002
		expect(r.stderr).toMatch(/jump\.csv: warning: Time column "t \(s\)" has 1 gap\(s\).*before line 10002/);
		noStack(r.stderr);
	});
});

describe('case 7: a COMTRADE .dat declared BINARY that is ASCII text', () => {
	const n = 500;
	const spec = (fileType: WriterSpec['fileType']): WriterSpec => ({
		station: 'Tallowmere Joinery',
		device: 'rec-1',
		revYear: 1999,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 5000, endSample: n }],
		firstData: '01/02/2026,10:00:00.000000',
		trigger: '01/02/2026,10:00:00.000000',
		fileType,
		analog: [{ name: 'U1', phase: 'L1', unit: 'V', values: Array.from({ length: n }, (_, k) => sine(k, 5000)) }],
	});
	beforeAll(() => {
		write('mixed.cfg', comtradeCfgText(spec('BINARY')));
		writeFileSync(join(dir, 'mixed.dat'), comtradeDatBytes(spec('ASCII')));
	});

	for (const command of ['analyse', 'trend']) {
		it(`${command} refuses it with dat-type-mismatch on line 1 of the .dat`, () => {
			const r = cli(command, 'mixed.cfg');
			expect(r.signal).toBeNull();
			expect(r.status).toBe(2);
			expect(r.stderr).toMatch(
				/^sinecheck: mixed\.dat:1: dat-type-mismatch: expected binary records .* the \.cfg declares BINARY \(mixed\.cfg line \d+\)/m,
			);
			noStack(r.stderr);
		});
	}
});

describe('case 10: a column headed "N (V)"', () => {
	it('analyse takes it as the neutral voltage channel, not a sample number', () => {
		const rows = Array.from(
			{ length: 2000 },
			(_, k) => `${sine(k, 1e4).toFixed(3)},${sine(3 * k, 1e4, 0.7).toFixed(4)},${(k / 1e4).toFixed(4)}`,
		);
		write('neutral.csv', ['L1 (V),N (V),t (s)', ...rows].join('\n'));
		const r = cli('analyse', 'neutral.csv');
		expect(r.signal).toBeNull();
		expect(r.status).toBe(0);
		expect(r.stdout).toMatch(/N \(V\)/);
		noStack(r.stdout + r.stderr);
	});
});

describe('case 8: a CSV of 100,000 columns through trend', () => {
	it('is refused at line 1 (too many columns) within a 256 MB heap', () => {
		const header = ['t (s)', ...Array.from({ length: 100_000 }, (_, k) => `U${k} (V)`)].join(',');
		const row = (r: number) => `${(r / 1e4).toFixed(4)},${'1.5,'.repeat(99_999)}1.5`;
		write('wide.csv', [header, ...Array.from({ length: 12 }, (_, r) => row(r))].join('\n'));
		const r = cli('trend', 'wide.csv');
		expect(r.signal).toBeNull();
		expect(r.status).toBe(2);
		expect(r.stderr).toMatch(/^sinecheck: wide\.csv:1: out-of-range: expected at most \d+ columns/m);
		noStack(r.stderr);
	});
});
