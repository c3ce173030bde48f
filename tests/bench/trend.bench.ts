/**
 * `npm run bench -- trend`: a generated 1-hour recording, 4 channels (L1-L3 at 230 V, one current with a
 * 5th harmonic) at 10 kS/s = 144 million samples, written to a temporary 32-bit float WAV (576 MB) in
 * blocks, then streamed end to end through the CLI's file reader and the trend analyser (Urms(1/2),
 * events, 10/12-cycle RMS and THD, 150/180-cycle, 10-min, 10 s frequency), as `sinecheck trend` does in
 * CSV mode (rows handed on, none kept).
 *
 * Target: ≥ 200x real time on one core (the hour in < 18 s); peak memory < 300 MB whatever
 * the length (checked by running a 10-minute file first: the peak must not grow with the hour).
 * References measured in the same run: the same file read by the same reader plus a bare sum of
 * squares (I/O and decoding floor), and a bare in-memory sum-of-squares pass (the ~0.6 ns/sample kernel).
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyseFile } from '../../src/cli/trend/read-recording.js';
import { openWavStream } from '../../src/cli/trend/wav-stream.js';
import type { TrendRow } from '../../lib/trend/types.js';
import { FloatWavWriter } from '../trend/float-wav.js';
import { peakRssMB, printTable } from './measure.js';

const FS = 10_000;
const BLOCK = 65_536;
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-bench-'));

/** Writes `durationS` of 4 channels: frequency wandering 49.95-50.05 Hz, a 100 ms 70 % dip on L2 every 7 min, a 1.5 s interruption at 30 min, a 0.5 s 112 % swell at 45 min. */
function generate(path: string, durationS: number): number {
	const frames = durationS * FS;
	const w = new FloatWavWriter(
		path,
		[
			{ name: 'L1', unit: 'V' },
			{ name: 'L2', unit: 'V' },
			{ name: 'L3', unit: 'V' },
			{ name: 'I1', unit: 'A' },
		],
		FS,
		frames,
	);
	const bufs = [0, 1, 2, 3].map(() => new Float64Array(BLOCK));
	const a = 230 * Math.SQRT2;
	const ai = 12 * Math.SQRT2;
	const k120 = (2 * Math.PI) / 3;
	let phase = 0;
	for (let off = 0; off < frames; off += BLOCK) {
		const n = Math.min(BLOCK, frames - off);
		for (let k = 0; k < n; k++) {
			const t = (off + k) / FS;
			const f = 50 + 0.05 * Math.sin((2 * Math.PI * t) / 97);
			phase += (2 * Math.PI * f) / FS;
			if (phase > 2 * Math.PI) phase -= 2 * Math.PI;
			let g1 = 1;
			let g2 = 1;
			const m7 = t % 420;
			if (m7 >= 200 && m7 < 200.1) g2 = 0.7;
			if (t >= 1800 && t < 1801.5) g1 = g2 = 0;
			if (t >= 2700 && t < 2700.5) g1 = g2 = 1.12;
			bufs[0][k] = g1 * a * Math.sin(phase);
			bufs[1][k] = g2 * a * Math.sin(phase - k120);
			bufs[2][k] = g1 * a * Math.sin(phase + k120);
			bufs[3][k] = g1 * (ai * Math.sin(phase - 0.5) + 0.25 * ai * Math.sin(5 * phase - 2.5));
		}
		w.write(bufs.map((b) => b.subarray(0, n)));
	}
	w.close();
	return frames;
}

/** CPU time (user + system) of this process in ms: on a shared, loaded machine it shows the work done, while wall time also counts waiting for a core. */
function cpuMs(): number {
	const c = process.cpuUsage();
	return (c.user + c.system) / 1000;
}

function analyse(path: string): { ms: number; cpu: number; rows: number; events: string[] } {
	let rows = 0;
	const c0 = cpuMs();
	const t0 = performance.now();
	const r = analyseFile(
		path,
		path,
		{},
		{
			declaredV: 230,
			keep: { cycles10: false, cycles150: false, min10: false },
			onRow: (_row: TrendRow) => void rows++,
		},
	);
	const ms = performance.now() - t0;
	return {
		ms,
		cpu: cpuMs() - c0,
		rows,
		events: r.events.map((e) => `${e.kind}@${e.startS.toFixed(2)}s/${e.durationS.toFixed(3)}s`),
	};
}

function readAndSumSquares(path: string): { ms: number; cpu: number; sum: number } {
	const c0 = cpuMs();
	const t0 = performance.now();
	const s = openWavStream(path, path, {}, BLOCK);
	const bufs = [0, 1, 2, 3].map(() => new Float64Array(BLOCK));
	let sum = 0;
	for (;;) {
		const n = s.read(bufs);
		if (n === 0) break;
		for (const b of bufs) for (let k = 0; k < n; k++) sum += b[k] * b[k];
	}
	s.close();
	return { ms: performance.now() - t0, cpu: cpuMs() - c0, sum };
}

function bareSumSquares(samples: number): { ms: number; cpu: number; sum: number } {
	const x = new Float64Array(1 << 22);
	for (let i = 0; i < x.length; i++) x[i] = Math.sin(i * 0.0314);
	const c0 = cpuMs();
	const t0 = performance.now();
	let sum = 0;
	for (let done = 0; done < samples; done += x.length) for (let i = 0; i < x.length; i++) sum += x[i] * x[i];
	return { ms: performance.now() - t0, cpu: cpuMs() - c0, sum };
}

try {
	const short = join(dir, 'ten-minutes.wav');
	const long = join(dir, 'one-hour.wav');
	let t = performance.now();
	generate(short, 600);
	const shortRun = analyse(short);
	const peakShort = peakRssMB();
	rmSync(short);
	const hourFrames = generate(long, 3600);
	const genS = (performance.now() - t) / 1000;
	console.log(
		`generated ${(statSync(long).size / 1e6).toFixed(0)} MB float WAV (plus a 10-min one) in ${genS.toFixed(1)} s; the file is read back from the page cache`,
	);
	const ref = readAndSumSquares(long);
	t = performance.now();
	const run = analyse(long);
	const peakLong = peakRssMB();
	const samples = hourFrames * 4;
	const bare = bareSumSquares(samples);
	const nsPer = (ms: number) => (ms * 1e6) / samples;
	const rt = (ms: number) => 3_600_000 / ms;
	printTable(
		[
			'pass over 1 h x 4 ch @ 10 kS/s',
			'wall s',
			'cpu s',
			'ns/sample (cpu)',
			'Msamples/s (cpu)',
			'x real time (wall)',
			'x real time (cpu)',
		],
		[
			[
				'trend analyser, file to results',
				run.ms / 1000,
				run.cpu / 1000,
				nsPer(run.cpu),
				samples / run.cpu / 1000,
				rt(run.ms),
				rt(run.cpu),
			],
			[
				'ref: same reader + sum of squares',
				ref.ms / 1000,
				ref.cpu / 1000,
				nsPer(ref.cpu),
				samples / ref.cpu / 1000,
				rt(ref.ms),
				rt(ref.cpu),
			],
			[
				'ref: bare in-memory sum of squares',
				bare.ms / 1000,
				bare.cpu / 1000,
				nsPer(bare.cpu),
				samples / bare.cpu / 1000,
				rt(bare.ms),
				rt(bare.cpu),
			],
		],
	);
	console.log(
		`ratio analyser / (reader + sum of squares) = ${(run.cpu / ref.cpu).toFixed(2)} (cpu), ${(run.ms / ref.ms).toFixed(2)} (wall); analyser / bare kernel = ${(run.cpu / bare.cpu).toFixed(1)} (cpu)`,
	);
	console.log(
		`load average during the run: ${loadavg()
			.map((x) => x.toFixed(1))
			.join(' ')} on ${cpus().length} cores (wall time counts waiting for a core when the machine is shared)`,
	);
	console.log(
		`target >= 200x real time on one core: ${rt(run.cpu).toFixed(0)}x by cpu time, ${rt(run.ms).toFixed(0)}x by wall time -> ${rt(run.cpu) >= 200 ? 'met by cpu time' : 'NOT met'}${rt(run.ms) >= 200 ? ' and wall time' : ''}`,
	);
	console.log(
		`peak RSS after the 10-min file ${peakShort.toFixed(0)} MB, after the 1-h file ${peakLong.toFixed(0)} MB (target < 300 MB, not growing with length) -> ${peakLong < 300 ? 'met' : 'NOT met'}`,
	);
	console.log(
		`rows handed on: ${shortRun.rows} (10 min), ${run.rows} (1 h); events in the hour: ${run.events.length}: ${run.events.slice(0, 4).join(', ')}${run.events.length > 4 ? ', ...' : ''}`,
	);
	console.log(`(check sums, ignore: ${ref.sum.toExponential(3)} ${bare.sum.toExponential(3)})`);
} finally {
	rmSync(dir, { recursive: true, force: true });
}
