/**
 * Hostile and huge input through the BUILT command (node dist/bin/sinecheck.js, the bundle of dist/src/cli) in child processes with a
 * heap cap (--max-old-space-size), an address-space cap (prlimit --as, when the machine has prlimit) and
 * a wall-clock limit (the whole process group is killed when it runs over). Every run must end with a
 * report or a located error line per file (`sinecheck: <path>[:line[:column]]: ...`), never a crash
 * (no V8 "FATAL" text, no stack lines, no raw engine error codes) and never a hang; a batch always
 * prints its summary line.
 * Sources: the CLI's own contract (DEVELOPERS.md: exit 0 ok, 1 a limit failed, 2 input or usage);
 * OWASP CSV-injection guidance for the cell checks (see tests/report/csv-cell.test.ts); papaparse (npm)
 * as the independent CSV reader; fast-check (npm) for the generated files.
 */
import { spawn, spawnSync } from 'node:child_process';
import {
	chmodSync,
	mkdirSync,
	mkdtempSync,
	readFileSync,
	rmSync,
	symlinkSync,
	truncateSync,
	writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startsLikeFormula } from '../../lib/report/csv-cell.js';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../sample-waves/writers/comtrade.js';
import { ensureBuiltCli, mainJs, root } from './built-cli.js';
import { writeCsvCapture } from './fixtures.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-hostile-'));
afterAll(() => {
	spawnSync('chmod', ['-R', 'u+rwx', dir]);
	rmSync(dir, { recursive: true, force: true });
});

/** Caps on every run: the main process heap, each file's helper heap, the address space, the wall clock. */
const MAIN_HEAP_MIB = 256;
const FILE_HEAP_MIB = 96;
const ADDRESS_SPACE_BYTES = 3 * 2 ** 30;
const WALL_LIMIT_MS = 45_000;
const hasPrlimit = spawnSync('prlimit', ['--version']).status === 0;
if (!hasPrlimit)
	console.warn(
		'prlimit not found: the address-space cap is not applied in tests/cli/hostile-input.test.ts (heap and time caps still are)',
	);

interface Run {
	code: number | null;
	signal: NodeJS.Signals | null;
	stdout: string;
	stderr: string;
	timedOut: boolean;
	ms: number;
}

/**
 * Runs the built CLI with the caps above. `closeStdoutAfter` closes our end of its stdout after that
 * many bytes (like `| head -c N`). `uid` runs it as another user (when this test runs as root).
 * `termAfterMs` sends it SIGTERM that long after its first helper process appears.
 */
function runCli(
	args: string[],
	opts: { closeStdoutAfter?: number; uid?: number; termAfterMs?: number } = {},
): Promise<Run & { leftInGroup: string }> {
	const node = [process.execPath, `--max-old-space-size=${MAIN_HEAP_MIB}`, mainJs, ...args];
	const cmd = hasPrlimit ? ['prlimit', `--as=${ADDRESS_SPACE_BYTES}`, ...node] : node;
	const t0 = Date.now();
	return new Promise((resolve) => {
		const child = spawn(cmd[0], cmd.slice(1), {
			cwd: dir,
			detached: true,
			uid: opts.uid,
			gid: opts.uid,
			env: { ...process.env, SINECHECK_DEBUG: '' },
		});
		let stdout = '';
		let stderr = '';
		let timedOut = false;
		child.stdout.setEncoding('utf8').on('data', (t: string) => {
			stdout += t;
			if (opts.closeStdoutAfter !== undefined && stdout.length >= opts.closeStdoutAfter) child.stdout.destroy();
		});
		child.stderr.setEncoding('utf8').on('data', (t: string) => (stderr += t));
		const timer = setTimeout(() => {
			timedOut = true;
			process.kill(-child.pid!, 'SIGKILL'); // the whole group: the CLI and its helper processes
		}, WALL_LIMIT_MS);
		// SIGTERM `termAfterMs` after a helper process appears in the CLI's group (it then works on the file,
		// however fast this machine is); polled every 50 ms.
		let term: NodeJS.Timeout | undefined;
		const watch =
			opts.termAfterMs === undefined
				? undefined
				: setInterval(() => {
						if (term || groupMembers(child.pid!).filter((pid) => pid !== child.pid).length === 0) return;
						term = setTimeout(() => child.kill('SIGTERM'), opts.termAfterMs);
					}, 50);
		child.on('close', (code, signal) => {
			clearTimeout(timer);
			clearTimeout(term);
			clearInterval(watch);
			// Processes still in the CLI's process group (helpers left behind), then none are left for later tests.
			const left = spawnSync('ps', ['-eo', 'pgid=,pid=,args='], { encoding: 'utf8' })
				.stdout.split('\n')
				.filter((l) => l.trim().split(/\s+/)[0] === String(child.pid) && !l.includes('<defunct>')) // a zombie is already dead
				.join('\n');
			if (left !== '') process.kill(-child.pid!, 'SIGKILL');
			resolve({ code, signal, stdout, stderr, timedOut, ms: Date.now() - t0, leftInGroup: left });
		});
	});
}

/** Process ids in process group `pgid` (zombies left out). */
function groupMembers(pgid: number): number[] {
	return spawnSync('ps', ['-eo', 'pgid=,pid=,stat='], { encoding: 'utf8' })
		.stdout.split('\n')
		.map((l) => l.trim().split(/\s+/))
		.filter(([g, , stat]) => g === String(pgid) && !stat?.startsWith('Z'))
		.map(([, pid]) => Number(pid));
}

/** The run ended by itself, with a documented exit code, and printed nothing a user should never see. */
function expectClean(r: Run): void {
	expect(r.timedOut, `no hang (ran ${r.ms} ms)\n${r.stderr.slice(-2000)}`).toBe(false);
	expect(r.signal).toBe(null);
	expect([0, 1, 2]).toContain(r.code);
	for (const text of [r.stdout, r.stderr]) {
		expect(text).not.toMatch(/FATAL|Native stack|heap out of memory|^\s+at \S/m);
		expect(text).not.toMatch(
			/\b(RangeError|TypeError|ReferenceError|SyntaxError)\b|ERR_[A-Z_]{3,}|EPIPE|internal error/,
		);
	}
}

/** stderr holds a located error line for `file`: `sinecheck: <file>` then `:line`, `: byte N` or `: message`. */
function errorLineFor(stderr: string, file: string): string | undefined {
	return stderr.split('\n').find((l) => l.startsWith(`sinecheck: ${file}:`) || l.startsWith(`sinecheck: ${file} `));
}

/** JSON Lines reports on stdout, by file. */
function reportsByFile(stdout: string): Map<string, { channels: unknown[] }> {
	const out = new Map<string, { channels: unknown[] }>();
	for (const line of stdout.split('\n').filter((l) => l.trim() !== '')) {
		const r = JSON.parse(line) as { file: string; channels: unknown[] };
		out.set(r.file, r);
	}
	return out;
}

const CAPS = ['--time-limit', '12', '--memory-limit', String(FILE_HEAP_MIB)];
const SINE = { frequencyHz: 50, sampleRateHz: 5000, cycles: 12 };
const U1 = [{ header: 'U1 (V)', tones: [{ order: 1, rms: 230 }] }];
const ESC_NAME = 'esc\x1b[31mred\u202e.csv';
const nobody = process.getuid?.() === 0 ? 65534 : undefined;
/**
 * As root, the unreadable sub-folder is only unreadable to another user, so that case runs as `nobody`; it
 * needs the checkout to be readable by that user (a clone under a private temporary folder is not).
 */
const nobodyCanRun =
	nobody === undefined || spawnSync(process.execPath, [mainJs, '--version'], { uid: nobody }).status === 0;
if (!nobodyCanRun)
	console.warn(
		`skipped the unreadable-folder case in tests/cli/hostile-input.test.ts: user nobody cannot run ${mainJs} (the checkout is not readable by other users)`,
	);

function comtradeSpec(name: string, unit: string): WriterSpec {
	const n = 1000; // 1 s at 1 kHz, 50 Hz
	return {
		station: 'Tallowmere Joinery',
		device: 'board 2',
		revYear: 1999,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 1000, endSample: n }],
		firstData: '01/03/2026,08:00:00.000000',
		trigger: '01/03/2026,08:00:00.000000',
		fileType: 'ASCII',
		analog: [
			{ name, unit, values: Array.from({ length: n }, (_, k) => 325 * Math.sin((2 * Math.PI * 50 * k) / 1000)) },
		],
	};
}

beforeAll(async () => {
	await ensureBuiltCli();
	chmodSync(dir, 0o755);
	// A folder of good captures with every kind of bad entry beside them.
	const batch = join(dir, 'batch');
	mkdirSync(join(batch, 'locked'), { recursive: true });
	writeCsvCapture(join(batch, 'a-good.csv'), U1, SINE);
	writeCsvCapture(join(batch, 'z-good.csv'), U1, SINE);
	writeCsvCapture(join(batch, ESC_NAME), U1, SINE);
	writeCsvCapture(join(batch, 'locked', 'hidden-good.csv'), U1, SINE);
	chmodSync(join(batch, 'locked'), 0o000);
	symlinkSync('gone.csv', join(batch, 'b-dangling.csv'));
	symlinkSync('.', join(batch, 'c-loop')); // a link to the folder it is in
	spawnSync('mkfifo', [join(batch, 'd-pipe.csv')]);
	// +-1e308 alternating: a signal whose every figure overflows (the crossing tracker's hardest case).
	const rows = ['t (s),U1 (V)'];
	for (let k = 0; k < 10_000; k++) rows.push(`${(k / 1e4).toFixed(4)},${(-1) ** k * 1e308}`);
	writeFileSync(join(batch, 'e-extreme.csv'), rows.join('\n') + '\n');
	// Files named on the command line that are not regular files, and a sparse file over 2 GiB.
	spawnSync('mkfifo', [join(dir, 'pipe.csv')]);
	writeFileSync(join(dir, 'folder-dat.cfg'), comtradeCfgText(comtradeSpec('U1', 'V')));
	mkdirSync(join(dir, 'folder-dat.dat'));
	writeFileSync(join(dir, 'huge.csv'), '');
	truncateSync(join(dir, 'huge.csv'), 2 ** 31 + 4096);
	writeCsvCapture(join(dir, '-x.csv'), U1, SINE);
	// A 50 Hz sine whose time stamps jump by 1e6 s halfway (the 10-s frequency loop's hardest case).
	const jump = ['t (s),U1 (V)'];
	for (let k = 0; k < 2000; k++)
		jump.push(
			`${(k / 1e4 + (k >= 1000 ? 1e6 : 0)).toFixed(4)},${(325 * Math.sin((2 * Math.PI * 50 * k) / 1e4)).toFixed(3)}`,
		);
	writeFileSync(join(dir, 'jump.csv'), jump.join('\n') + '\n');
	// Formula-like channel names (CSV-injection cases).
	const attack = comtradeSpec('-1+T("', `")+cmd|' /C calc'!A0+T(""`);
	writeFileSync(join(dir, 'attack.cfg'), comtradeCfgText(attack));
	writeFileSync(join(dir, 'attack.dat'), comtradeDatBytes(attack));
	writeCsvCapture(
		join(dir, 'fullwidth.csv'),
		[{ header: '\uFF1DHYPERLINK("x") (V)', tones: [{ order: 1, rms: 230 }] }],
		SINE,
	);
	writeCsvCapture(join(dir, '-2+3.csv'), U1, SINE);
	// A long, ordinary record (1.5 M rows x 3 channels, ~45 MB): its analysis takes over a second, so a
	// signal sent 0.3 s after its helper process starts arrives while the helper works on it.
	writeCsvCapture(
		join(dir, 'long.csv'),
		['U1', 'U2', 'U3'].map((n) => ({ header: `${n} (V)`, tones: [{ order: 1, rms: 230 }] })),
		{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 7500 },
	);
}, 60_000);

describe('sinecheck under hostile input (built CLI, capped child processes)', () => {
	it.skipIf(!nobodyCanRun)(
		'analyse <folder> with a dangling link, a link loop, a FIFO, an unreadable sub-folder and a +-1e308 file: every good file reported, each bad entry a located line, the summary printed',
		async () => {
			const r = await runCli(['analyse', 'batch', '--json', ...CAPS], { uid: nobody });
			expectClean(r);
			expect(r.code).toBe(2);
			const reports = reportsByFile(r.stdout);
			for (const good of ['batch/a-good.csv', 'batch/z-good.csv', `batch/${ESC_NAME}`])
				expect(reports.get(good)?.channels.length, good).toBe(1);
			expect(errorLineFor(r.stderr, 'batch/b-dangling.csv')).toMatch(/symbolic link to something that does not exist/);
			expect(errorLineFor(r.stderr, 'batch/c-loop')).toMatch(/loop/);
			expect(errorLineFor(r.stderr, 'batch/d-pipe.csv')).toMatch(/named pipe \(FIFO\), not a regular file/);
			expect(errorLineFor(r.stderr, 'batch/locked')).toMatch(/cannot read this folder: permission denied/);
			// the overflowing file: a report, or a located line (out of memory, time limit or an import error)
			expect(reports.has('batch/e-extreme.csv') || errorLineFor(r.stderr, 'batch/e-extreme.csv') !== undefined).toBe(
				true,
			);
			expect(r.stderr).toMatch(/^analysed \d+ capture\(s\) from \d+ file set\(s\); \d+ with errors/m);
			// control characters of a file name never reach the terminal raw (JSON escapes them too)
			expect(r.stdout + r.stderr).not.toMatch(/[\u001b\u202e]/);
		},
		60_000,
	);

	it('analyse <fifo> /dev/zero <cfg whose .dat is a folder> <good>: a clear line for each, no hang, the good file still reported', async () => {
		const r = await runCli([
			'analyse',
			'pipe.csv',
			'/dev/zero',
			'folder-dat.cfg',
			'batch/a-good.csv',
			'--json',
			...CAPS,
		]);
		expectClean(r);
		expect(r.code).toBe(2);
		expect(errorLineFor(r.stderr, 'pipe.csv')).toMatch(
			/named pipe \(FIFO\), not a regular file: only regular files are read/,
		);
		expect(errorLineFor(r.stderr, '/dev/zero')).toMatch(/character device, not a regular file/);
		expect(r.stderr).toMatch(/^sinecheck: folder-dat\.dat: a folder, not a regular file/m);
		expect(reportsByFile(r.stdout).has('batch/a-good.csv')).toBe(true);
		expect(r.stderr).toMatch(/^analysed 1 capture\(s\) from 4 file set\(s\); 3 with errors/m);
	}, 60_000);

	it('trend <time stamps jumping by 1e6 s> <good> <good>: the good files trended, the jump a located warning, no crash', async () => {
		const r = await runCli(['trend', 'jump.csv', 'batch/a-good.csv', 'batch/z-good.csv', '--nominal', '230', ...CAPS]);
		expectClean(r);
		for (const good of ['batch/a-good.csv', 'batch/z-good.csv'])
			expect(r.stdout).toMatch(new RegExp(`^${good.replace(/[.]/g, '\\.')},10/12-cycle,`, 'm'));
		// The jump is between lines 1001 and 1002 of the file written above: the warning names line 1002.
		expect(r.stderr).toMatch(/^jump\.csv: warning: .*gap.*line 1002/m);
	}, 60_000);

	it('trend <fifo> /dev/zero: a clear line for each, exit 2, no hang', async () => {
		const r = await runCli(['trend', 'pipe.csv', '/dev/zero']);
		expectClean(r);
		expect(r.code).toBe(2);
		expect(errorLineFor(r.stderr, 'pipe.csv')).toMatch(/named pipe \(FIFO\)/);
		expect(errorLineFor(r.stderr, '/dev/zero')).toMatch(/character device/);
	}, 60_000);

	it('analyse <file> stopped with SIGTERM mid-file leaves no helper process running', async () => {
		const r = await runCli(['analyse', 'long.csv', '--time-limit', '40'], { termAfterMs: 300 });
		expect(r.timedOut).toBe(false);
		expect(r.code).toBe(143); // 128 + SIGTERM (15), common practice for a command ended by a signal
		expect(r.leftInGroup).toBe('');
	}, 60_000);

	it('analyse <file over 2 GiB> is refused before reading, naming the 2 GiB limit and `sinecheck trend`', async () => {
		const r = await runCli(['analyse', 'huge.csv', ...CAPS]);
		expectClean(r);
		expect(r.code).toBe(2);
		const line = errorLineFor(r.stderr, 'huge.csv');
		expect(line).toMatch(/2 GiB/);
		expect(line).toMatch(/sinecheck trend huge\.csv/);
		expect(r.ms).toBeLessThan(WALL_LIMIT_MS); // refused by its size: never read
	}, 60_000);

	it('analyse -- -x.csv takes the name after -- as a file, not an option', async () => {
		const r = await runCli(['analyse', '--json', '--', '-x.csv']);
		expectClean(r);
		expect(r.code).toBe(0);
		expect(reportsByFile(r.stdout).has('-x.csv')).toBe(true);
	}, 60_000);

	it('analyse <folder> --json with stdout closed early (like `| head -c 200`) exits quietly', async () => {
		const r = await runCli(
			['analyse', '--json', '--quiet', '--jobs', '1', 'batch/a-good.csv', 'batch/z-good.csv', 'fullwidth.csv'],
			{ closeStdoutAfter: 1 },
		);
		expectClean(r);
		expect(r.stdout.length).toBeGreaterThan(0);
		expect(r.stderr).toBe('');
	}, 60_000);

	it('analyse <file with control characters in its name> prints the table with them escaped', async () => {
		const r = await runCli(['analyse', `batch/${ESC_NAME}`]);
		expectClean(r);
		expect(r.code).toBe(0);
		expect(r.stdout).toContain('batch/esc\\x1b[31mred\\u202e.csv');
		expect(r.stdout + r.stderr).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202e]/);
	}, 60_000);

	it('trend --csv and analyse --csv: formula-like channel, unit and file names reach no cell as a live formula', async () => {
		const t = await runCli(['trend', '--nominal', '230', '--', 'attack.cfg', '-2+3.csv']);
		expectClean(t);
		const a = await runCli(['analyse', '--csv', '--', 'fullwidth.csv', '-2+3.csv']);
		expectClean(a);
		for (const text of [t.stdout, a.stdout]) {
			const rows = Papa.parse<string[]>(text.trim(), { newline: text.includes('\r\n') ? '\r\n' : '\n' }).data;
			expect(rows.length).toBeGreaterThan(2);
			for (const row of rows) for (const cell of row) expect(startsLikeFormula(cell), JSON.stringify(cell)).toBe(false);
		}
		expect(t.stdout).toContain(`"'-1+T("" rms ("")+cmd|' /C calc'!A0+T("""")"`);
		expect(t.stdout).toMatch(/^"'-2\+3\.csv",/m);
		expect(a.stdout).toContain(`"'\uFF1DHYPERLINK(""x"")"`);
	}, 90_000);
});

// ---- generated files (fast-check): a few folders of odd files, each through the CLI once ----

const seedWav = readFileSync(join(root, 'sample-waves', 'spindle-clamp.wav'));
const seedCfg = readFileSync(join(root, 'sample-waves', 'incomer-dip.cfg'), 'latin1');
const seedDat = readFileSync(join(root, 'sample-waves', 'incomer-dip.dat'));
const extreme = fc.constantFrom(
	'1e308',
	'-1e308',
	'5e-324',
	'NaN',
	'Infinity',
	'-0',
	'0',
	'1e-300',
	'9'.repeat(400),
	'',
	'x',
	'1,5',
	'1e6',
);

/** One generated capture: a file name (or .cfg/.dat pair) and its bytes. */
const generatedFile = fc.oneof(
	fc
		.record({ ext: fc.constantFrom('.csv', '.wav', '.txt', '.cff'), bytes: fc.uint8Array({ maxLength: 2048 }) })
		.map((f) => [{ ext: f.ext, bytes: f.bytes }]),
	fc
		.record({
			header: fc.constantFrom('t (s),U1 (V)', 'N (V),U1 (V)', 'U1 (V)', 't (s);U1 (V);I1 (A)', 'sample,U1 (V)'),
			rows: fc.array(fc.tuple(fc.oneof(fc.double(), extreme.map(Number)), extreme, fc.double({ noNaN: false })), {
				minLength: 0,
				maxLength: 400,
			}),
		})
		.map(({ header, rows }) => [
			{ ext: '.csv', bytes: Buffer.from([header, ...rows.map(([t, a, b]) => `${t},${a},${b}`)].join('\n')) },
		]),
	fc.nat({ max: seedWav.length }).map((n) => [{ ext: '.wav', bytes: seedWav.subarray(0, n) }]),
	fc.tuple(fc.nat({ max: seedCfg.length }), fc.nat({ max: seedDat.length })).map(([a, b]) => [
		{ ext: '.cfg', bytes: Buffer.from(seedCfg.slice(0, a), 'latin1') },
		{ ext: '.dat', bytes: seedDat.subarray(0, b) },
	]),
);

describe('sinecheck on generated files (fast-check)', () => {
	let round = 0;
	it('analyse and trend <folder of generated files> give each file a report (trend: rows or notes) or a located error line; never a crash or a hang', async () => {
		await fc.assert(
			fc.asyncProperty(fc.array(generatedFile, { minLength: 4, maxLength: 8 }), async (files) => {
				const folder = join(dir, `gen-${round++}`);
				mkdirSync(folder);
				const names: string[] = [];
				files.forEach((parts, i) => {
					for (const p of parts) writeFileSync(join(folder, `f${i}${p.ext}`), p.bytes);
					names.push(`gen-${round - 1}/f${i}${parts[0].ext}`);
				});
				const r = await runCli(['analyse', folder.slice(dir.length + 1), '--json', ...CAPS]);
				expectClean(r);
				const reports = reportsByFile(r.stdout);
				for (const name of names) {
					const datName = name.replace(/\.cfg$/, '.dat');
					const answered =
						reports.has(name) ||
						errorLineFor(r.stderr, name) !== undefined ||
						errorLineFor(r.stderr, datName) !== undefined;
					expect(answered, `${name}\n${r.stderr}`).toBe(true);
				}
				expect(r.stderr).toMatch(/^analysed \d+ capture\(s\) from \d+ file set\(s\)/m);
				const t = await runCli(['trend', folder.slice(dir.length + 1), ...CAPS]);
				expectClean(t);
				for (const name of names) {
					const datName = name.replace(/\.cfg$/, '.dat');
					const trended =
						t.stdout.includes(`\n${name},`) || t.stderr.split('\n').some((l) => l.startsWith(`${name}: `));
					const answered =
						trended || errorLineFor(t.stderr, name) !== undefined || errorLineFor(t.stderr, datName) !== undefined;
					expect(answered, `trend ${name}\n${t.stderr}`).toBe(true);
				}
			}),
			{ numRuns: 3, endOnFailure: true },
		);
	}, 180_000);
});
