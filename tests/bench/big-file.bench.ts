/**
 * A big recording opened the way the browser analyser opens it: the worker's code (src/ui/worker-core.ts)
 * in this process, fed the file as a Blob (fs.openAsBlob, as a picked File reaches the worker) that it
 * streams in slices through lib/io's CsvStreamReader, then analysis, trends and events, up to the 'opened'
 * message. Reference measured in the same run on the same file: the CLI, `sinecheck analyse --json --jobs 0`
 * (readFileSync, openCaptures, analyseCapture; no trends). Target: under 6 s for the worker path
 * on a ~279 MB, 24 M-value CSV on this machine. Also printed: the stages the progress reported (each with
 * a fraction or an estimate), the analysis's own steps (the fraction the bar showed as each began against
 * the share of the analysing time gone by then: how honest the bar is), CPU seconds of both runs and of
 * each stage (the machine is shared: CPU time moves less with the load than wall time), peak memory, and
 * the load average (compare ratios).
 * The file (time + 6 channels x 4,000,000 rows, ~282 MB) is written once to a temporary folder and removed.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, openAsBlob, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { handleMessage } from '../../src/ui/worker-core.js';
import type { FromWorker } from '../../src/ui/protocol.js';
import { BIG_CHANNELS, BIG_ROWS, writeBigCsv } from './big-file.js';
import { peakRssMB, printTable } from './measure.js';

const TARGET_S = 6;
/** Loaded before the CLI: prints its CPU seconds to stderr as it exits. */
const CPU_AT_EXIT =
	'data:text/javascript,process.on("exit",()=>{const c=process.cpuUsage();process.stderr.write("cpu-s "+(c.user+c.system)/1e6+"\\n")})';

await ensureBuiltCli();
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-big-'));
const path = join(dir, 'big-recording.csv');
try {
	const tw = performance.now();
	writeBigCsv(path);
	const sizeMB = statSync(path).size / 1e6;
	console.log(
		`file: ${sizeMB.toFixed(1)} MB, ${BIG_ROWS.toLocaleString('en')} rows x ${BIG_CHANNELS} channels = ${((BIG_ROWS * BIG_CHANNELS) / 1e6).toFixed(0)} M values (written in ${((performance.now() - tw) / 1000).toFixed(1)} s)`,
	);
	console.log(
		`load average before: ${loadavg()
			.map((x) => x.toFixed(2))
			.join(' ')}`,
	);

	// the worker path
	const blob = await openAsBlob(path);
	const stages = new Map<
		string,
		{
			firstMs: number;
			lastMs: number;
			firstCpuUs: number;
			lastCpuUs: number;
			updates: number;
			withFraction: number;
			withEstimate: number;
		}
	>();
	// each analysis step as it begins: time and the fraction shown
	const steps: { step: string; atMs: number; fraction: number }[] = [];
	const t0 = performance.now();
	const cpu0 = process.cpuUsage();
	const done = await new Promise<FromWorker>((resolve) => {
		handleMessage(
			{
				type: 'open',
				jobId: 1,
				captureKey: 'big',
				files: [{ name: 'big-recording.csv', blob: blob as unknown as Blob }],
				overrides: {},
				analysis: { limits: 'en50160' },
			},
			(msg) => {
				const now = performance.now() - t0;
				if (msg.type === 'progress') {
					const key = msg.stage.replace(/ of .*| big-recording\.csv.*/, '');
					const c = process.cpuUsage(cpu0);
					const cpuUs = c.user + c.system;
					const s = stages.get(key) ?? {
						...{ firstMs: now, lastMs: now, firstCpuUs: cpuUs, lastCpuUs: cpuUs },
						...{ updates: 0, withFraction: 0, withEstimate: 0 },
					};
					s.lastMs = now;
					s.lastCpuUs = cpuUs;
					s.updates++;
					if (msg.fraction !== null) s.withFraction++;
					if (msg.etaS != null || msg.expectS !== undefined) s.withEstimate++;
					stages.set(key, s);
					const step = /^Analysing .*?: ([^(]*)/.exec(msg.stage)?.[1].trim();
					if (step && step !== steps.at(-1)?.step) steps.push({ step, atMs: now, fraction: msg.fraction ?? NaN });
				} else resolve(msg);
			},
		);
	});
	const workerMs = performance.now() - t0;
	const cpu = process.cpuUsage(cpu0);
	if (done.type !== 'opened')
		throw new Error(`worker path ended with ${done.type}: ${JSON.stringify(done).slice(0, 300)}`);
	const workerPeak = peakRssMB();

	// the reference: the CLI on the same file (its CPU seconds written to stderr as it exits)
	const tc = performance.now();
	const cli = spawnSync(
		process.execPath,
		['--import', CPU_AT_EXIT, mainJs, 'analyse', '--json', '--quiet', '--jobs', '0', path],
		{ encoding: 'utf8', maxBuffer: 1 << 28 },
	);
	const cliMs = performance.now() - tc;
	if (cli.status !== 0) throw new Error(`CLI exited ${cli.status}: ${cli.stderr}`);
	const cliCpuS = Number(/cpu-s ([\d.]+)/.exec(cli.stderr)?.[1] ?? NaN);

	printTable(
		['stage (progress messages)', 'from s', 'to s', 'CPU s', 'updates', 'with fraction', 'with estimate'],
		[...stages].map(([k, s]) => [
			k,
			s.firstMs / 1000,
			s.lastMs / 1000,
			(s.lastCpuUs - s.firstCpuUs) / 1e6,
			s.updates,
			s.withFraction,
			s.withEstimate,
		]),
	);
	printTable(
		['run', 'wall s', 'CPU s', 'MB/s'],
		[
			[
				'worker path: stream + analyse + trends (this process)',
				workerMs / 1000,
				(cpu.user + cpu.system) / 1e6,
				sizeMB / (workerMs / 1000),
			],
			['CLI analyse --jobs 0, reference', cliMs / 1000, cliCpuS, sizeMB / (cliMs / 1000)],
		],
	);
	const analysing = stages.get('Analysing');
	if (analysing) {
		const spanMs = workerMs - analysing.firstMs;
		printTable(
			['analysis step', 'from s', 'fraction shown', 'share of analysing time'],
			steps.map((s) => [s.step, s.atMs / 1000, s.fraction, (s.atMs - analysing.firstMs) / spanMs]),
		);
	}
	console.log(
		`worker path / CLI: ${(workerMs / cliMs).toFixed(2)}x wall, ${((cpu.user + cpu.system) / 1e6 / cliCpuS).toFixed(2)}x CPU; target ${TARGET_S} s for the worker path: ${workerMs / 1000 <= TARGET_S ? 'met' : `NOT met (${(workerMs / 1000 / TARGET_S).toFixed(1)}x over)`}`,
	);
	console.log(
		`peak memory of this process: ${workerPeak.toFixed(0)} MB (file ${sizeMB.toFixed(0)} MB; samples as Float64 ${((BIG_ROWS * (BIG_CHANNELS + 1) * 8) / 1e6).toFixed(0)} MB)`,
	);
	console.log(
		`load average after: ${loadavg()
			.map((x) => x.toFixed(2))
			.join(' ')}`,
	);
} finally {
	rmSync(dir, { recursive: true, force: true });
}
