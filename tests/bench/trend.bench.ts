/**
 * `npm run bench -- trend`: `sinecheck trend` (the built CLI, in a child process, as a user runs it) on
 * a generated 1-hour recording of 4 channels (three 230 V phases, one 12 A current) at 10 kS/s = 144
 * million samples, from a CSV with a time column (1.4 GB) and from a COMTRADE 1999 BINARY record
 * (576 MB .dat), as a real-time factor and peak memory. Each format also runs on a 10-minute file first:
 * the peak must not grow with the length.
 *
 * Targets: ≥ 2000x real time from binary COMTRADE, ≥ 500x from CSV; peak RSS < 300 MB and flat in length.
 * References measured in the same run, over the same samples:
 * - the bare reader: the same file through the same streaming reader (lib/io's CsvSampleStream or
 *   ComtradeSampleStream, 1 MiB chunks, as the CLI reads it) into a sum of squares, in this process;
 * - the bare kernel: a sum of squares over 144 million samples already in memory (~0.6 ns/sample).
 * And, from binary COMTRADE, the built analyser in a bare Node process: whole, without flicker, and without
 * flicker and THD, to show where the time goes; and, timed inside its process after a warm-up on the 10-minute
 * file, on 2 threads and on 1 (the difference to the CLI is the CLI's start and V8's first compilations). The verdict is by wall time (recording length ÷ elapsed time,
 * the median of five runs), as a user waits for it: `trend` shares a recording's work with a second thread
 * (--threads, default 2), so its CPU time (user + system of all its threads and processes, also printed)
 * is more than its wall time. On a shared machine wall time also counts waiting for a core: the load
 * average is printed, and a run on one thread (--threads 1) is shown beside it.
 * SINECHECK_BENCH_SCALE=0.1 scales the durations down for a quick look (the targets are for scale 1).
 */
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, readFileSync, readSync, rmSync, statSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ComtradeSampleStream, CsvSampleStream, parseComtradeCfg, type SampleSink } from '../../lib/io/index.js';
import { compiledCli, ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { printTable } from './measure.js';
import { BENCH_FS, writeComtrade, writeCsv } from './trend-files.js';

const CHANNELS = 4;
const CHUNK_BYTES = 1 << 20;
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-bench-'));

/** CPU time (user + system) of this process in s. */
function cpuS(): number {
	const c = process.cpuUsage();
	return (c.user + c.system) / 1e6;
}

interface Run {
	wallS: number;
	cpuS: number;
	peakMB: number;
}

/** A sink that only sums the squares of what the reader hands on. */
function sumSink(): SampleSink & { sum: number } {
	const s = {
		sum: 0,
		start() {},
		samples(chunk: Float64Array[], n: number) {
			let a = s.sum;
			for (const x of chunk) for (let k = 0; k < n; k++) a += x[k] * x[k];
			s.sum = a;
		},
	};
	return s;
}

/** The file's bytes in 1 MiB chunks from one buffer, as the CLI reads them. */
function streamBytes(path: string, push: (b: Uint8Array) => void): void {
	const fd = openSync(path, 'r');
	const buf = new Uint8Array(CHUNK_BYTES);
	for (let pos = 0, n; (n = readSync(fd, buf, 0, buf.length, pos)) > 0; pos += n) push(buf.subarray(0, n));
	closeSync(fd);
}

/** The bare reader: the same streaming reader as `trend`, into a sum of squares. */
function bareReader(kind: 'csv' | 'comtrade', path: string): { wallS: number; cpuS: number; sum: number } {
	const c0 = cpuS();
	const t0 = performance.now();
	const sink = sumSink();
	if (kind === 'csv') {
		const s = new CsvSampleStream(path, {}, sink, { totalBytes: statSync(path).size });
		streamBytes(path, (b) => s.push(b));
		s.end();
	} else {
		const cfg = parseComtradeCfg(readFileSync(path.replace(/\.dat$/, '.cfg'), 'latin1'), 'bench.cfg');
		const s = new ComtradeSampleStream(cfg, 'bench.cfg', 'bench.dat', {}, sink);
		streamBytes(path, (b) => s.push(b));
		s.end();
	}
	return { wallS: (performance.now() - t0) / 1000, cpuS: cpuS() - c0, sum: sink.sum };
}

/** The bare kernel: a sum of squares over `samples` samples in memory (one 32 MB array, reused). */
function bareKernel(samples: number): { wallS: number; cpuS: number; sum: number } {
	const x = new Float64Array(1 << 22);
	for (let i = 0; i < x.length; i++) x[i] = Math.sin(i * 0.0314);
	const c0 = cpuS();
	const t0 = performance.now();
	let sum = 0;
	for (let done = 0; done < samples; done += x.length) {
		const m = Math.min(x.length, samples - done);
		for (let i = 0; i < m; i++) sum += x[i] * x[i];
	}
	return { wallS: (performance.now() - t0) / 1000, cpuS: cpuS() - c0, sum };
}

/** Runs `node args` under GNU time: wall, CPU (with any helper process) and peak RSS. */
function timed(args: string[]): Promise<Run> {
	const report = join(dir, 'time.txt');
	const t0 = performance.now();
	const child = spawn('/usr/bin/time', ['-f', '%M %U %S', '-o', report, process.execPath, ...args], {
		stdio: ['ignore', 'ignore', 'pipe'],
	});
	let stderr = '';
	child.stderr.on('data', (d) => (stderr += String(d)));
	return new Promise((resolve, reject) => {
		child.on('close', (status) => {
			if (status !== 0) return reject(new Error(`node ${args[0]} exited with ${status}: ${stderr.slice(0, 400)}`));
			const [kb, user, sys] = readFileSync(report, 'utf8').trim().split('\n').pop()!.split(' ').map(Number);
			resolve({ wallS: (performance.now() - t0) / 1000, cpuS: user + sys, peakMB: kb / 1024 });
		});
	});
}

/** Runs of the trend CLI per file; the verdict takes the median by wall time. */
const RUNS = 5;

/** `sinecheck trend <file>`, the built CLI (with its default of 2 threads, or `threads`). */
function cliTrend(file: string, threads?: string): Promise<Run> {
	return timed([mainJs, 'trend', ...(threads ? ['--threads', threads] : []), file]);
}

/**
 * The built analyser (dist/, the CLI's code) in a bare Node process on `cfg` with `settings`, rows handed
 * on and none kept: the parts of the analyser's time.
 */
function builtAnalyser(cfg: string, settings: { flicker?: boolean; thd?: boolean }): Promise<Run> {
	const reader = pathToFileURL(join(compiledCli, 'trend', 'read-recording.js')).href;
	const script = `import { analyseFile } from ${JSON.stringify(reader)}; analyseFile(process.argv[1], 'bench.cfg', {}, { ...${JSON.stringify(settings)}, keep: { cycles10: false, cycles150: false, min10: false }, onRow: () => {} });`;
	return timed(['--input-type=module', '-e', script, cfg]);
}

/**
 * The built analyser in a bare Node process on `cfg`, timed inside the process after a warm-up on
 * `warmCfg` (so neither the process's start nor V8's first compilations count), with `threads` 1 or 2
 * (the CLI's second thread): what the CLI's own start and warm-up cost, by difference.
 */
function warmAnalyser(warmCfg: string, cfg: string, threads: 1 | 2): { wallS: number; cpuS: number } {
	const dist = compiledCli;
	const reader = pathToFileURL(join(dist, 'trend', 'read-recording.js')).href;
	const thread = pathToFileURL(join(dist, 'trend', 'helper-thread.js')).href;
	const script = `import { analyseFile } from ${JSON.stringify(reader)}; import { helperThread } from ${JSON.stringify(thread)};
const s = { helper: helperThread(${threads}), keep: { cycles10: false, cycles150: false, min10: false }, onRow: () => {} };
analyseFile(process.argv[1], 'bench.cfg', {}, s);
const c0 = process.cpuUsage(), t0 = performance.now();
analyseFile(process.argv[2], 'bench.cfg', {}, s);
const c = process.cpuUsage(c0);
console.log(JSON.stringify({ wallS: (performance.now() - t0) / 1000, cpuS: (c.user + c.system) / 1e6 }));`;
	const r = spawnSync(process.execPath, ['--input-type=module', '-e', script, warmCfg, cfg], { encoding: 'utf8' });
	if (r.status !== 0) throw new Error(`warm analyser exited with ${r.status}: ${r.stderr.slice(0, 400)}`);
	return JSON.parse(r.stdout.trim().split('\n').pop()!);
}

async function main(): Promise<void> {
	await ensureBuiltCli();
	const scale = Number(process.env.SINECHECK_BENCH_SCALE ?? 1) || 1;
	const hourS = 3600 * scale;
	const shortS = 600 * scale;
	const files = (s: number) => ({
		csv: join(dir, `rec-${s}.csv`),
		cfg: join(dir, `rec-${s}.cfg`),
		dat: join(dir, `rec-${s}.dat`),
	});
	const g0 = performance.now();
	for (const s of [shortS, hourS]) {
		const f = files(s);
		writeCsv(f.csv, CHANNELS, { records: Math.round(s * BENCH_FS) });
		writeComtrade(f.cfg.replace(/\.cfg$/, ''), Math.round(s * BENCH_FS));
	}
	const hour = files(hourS);
	console.log(
		`wrote ${hourS} s of ${CHANNELS} channels at ${BENCH_FS} S/s: CSV ${(statSync(hour.csv).size / 1e6).toFixed(0)} MB, COMTRADE .dat ${(statSync(hour.dat).size / 1e6).toFixed(0)} MB (and ${shortS} s ones) in ${((performance.now() - g0) / 1000).toFixed(1)} s; read back from the page cache`,
	);
	const samples = Math.round(hourS * BENCH_FS) * CHANNELS;
	const rt = (s: number) => hourS / s;
	const nsPer = (s: number) => (s * 1e9) / samples;
	const rows: (string | number)[][] = [];
	const verdicts: string[] = [];
	for (const [kind, target] of [
		['comtrade', 2000],
		['csv', 500],
	] as const) {
		const file = kind === 'csv' ? hour.csv : hour.cfg;
		const short = await cliTrend(kind === 'csv' ? files(shortS).csv : files(shortS).cfg);
		// three runs with the second thread, the median by wall time; one run on one thread for reference
		const runs: Run[] = [];
		for (let k = 0; k < RUNS; k++) runs.push(await cliTrend(file));
		const trend = runs.sort((a, b) => a.wallS - b.wallS)[RUNS >> 1];
		const alone = await cliTrend(file, '1');
		const reader = bareReader(kind, kind === 'csv' ? hour.csv : hour.dat);
		const label = kind === 'csv' ? 'CSV' : 'COMTRADE BINARY';
		const row = (name: string, r: Run | ReturnType<typeof bareReader>, peak: number | string) => [
			name,
			r.wallS,
			r.cpuS,
			nsPer(r.cpuS),
			rt(r.cpuS),
			rt(r.wallS),
			peak,
		];
		rows.push(row(`trend CLI, ${label} (2 threads, median of ${RUNS})`, trend, trend.peakMB));
		rows.push(row(`  the same on 1 thread (--threads 1)`, alone, alone.peakMB));
		rows.push(row(`ref: bare reader, ${label}`, reader, ''));
		verdicts.push(
			`${label}: ${rt(trend.wallS).toFixed(0)}x real time (wall, median of ${runs.map((r) => rt(r.wallS).toFixed(0)).join(' / ')}), target >= ${target}x -> ${rt(trend.wallS) >= target ? 'met' : 'NOT met'}; by CPU of both threads ${rt(trend.cpuS).toFixed(0)}x; on 1 thread ${rt(alone.wallS).toFixed(0)}x (wall), ${rt(alone.cpuS).toFixed(0)}x (cpu); trend / bare reader = ${(trend.wallS / reader.wallS).toFixed(2)} (wall); peak RSS ${short.peakMB.toFixed(0)} MB (${shortS} s) -> ${trend.peakMB.toFixed(0)} MB (${hourS} s), target < 300 MB and flat -> ${trend.peakMB < 300 && trend.peakMB < short.peakMB + 20 ? 'met' : 'NOT met'}`,
		);
	}
	const kernel = bareKernel(samples);
	rows.push([
		'ref: bare in-memory sum of squares',
		kernel.wallS,
		kernel.cpuS,
		nsPer(kernel.cpuS),
		rt(kernel.cpuS),
		rt(kernel.wallS),
		'',
	]);
	const parts = [
		['built analyser, COMTRADE, all', await builtAnalyser(hour.cfg, {})],
		['  without flicker', await builtAnalyser(hour.cfg, { flicker: false })],
		['  without flicker and THD', await builtAnalyser(hour.cfg, { flicker: false, thd: false })],
	] as const;
	for (const [name, r] of parts) rows.push([name, r.wallS, r.cpuS, nsPer(r.cpuS), rt(r.cpuS), rt(r.wallS), r.peakMB]);
	for (const threads of [2, 1] as const) {
		const r = warmAnalyser(files(shortS).cfg, hour.cfg, threads);
		const name = `built analyser, COMTRADE, warm, ${threads} thread${threads > 1 ? 's' : ''} (timed inside)`;
		rows.push([name, r.wallS, r.cpuS, nsPer(r.cpuS), rt(r.cpuS), rt(r.wallS), '']);
	}
	console.log(`\n${hourS} s x ${CHANNELS} channels @ ${BENCH_FS} S/s = ${(samples / 1e6).toFixed(0)} million samples`);
	printTable(
		['pass', 'wall s', 'cpu s', 'ns/sample (cpu)', 'x real time (cpu)', 'x real time (wall)', 'peak RSS MB'],
		rows,
	);
	const trendRows = rows.filter((r) => String(r[0]).startsWith('trend CLI'));
	for (const v of verdicts) console.log(v);
	console.log(
		`trend / bare kernel (cpu): ${trendRows.map((r) => `${String(r[0]).slice(10)} ${((r[2] as number) / kernel.cpuS).toFixed(0)}`).join(', ')}`,
	);
	console.log(
		`load average ${loadavg()
			.map((x) => x.toFixed(1))
			.join(' ')} on ${cpus().length} cores (wall time counts waiting for a core when the machine is shared)`,
	);
	console.log(`(check sums, ignore: ${kernel.sum.toExponential(3)})`);
}

main()
	.catch((e) => {
		console.error(e);
		process.exitCode = 1;
	})
	.finally(() => rmSync(dir, { recursive: true, force: true }));
