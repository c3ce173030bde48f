/**
 * `sinecheck analyse` of a high-rate scope capture end to end (the built CLI, one process: read, parse,
 * analyse, print JSON) beside numpy.loadtxt reading the same file alone, in the same run, and the ratio
 * (target: within 1.5x of the reader alone). Without python3 + numpy the reference is the project's bare
 * CSV reader (parseCsv, no analysis). The capture: 2 channels × SCOPE_SAMPLES samples (default 1e7) at
 * 10 MS/s, 8-bit codes, scope preamble (probe x100, clamp 100 mV/A), written here in closed form.
 * Set SCOPE_SAMPLES to try a smaller file.
 */
import { spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, readFileSync, rmSync, statSync, writeSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { printTable } from './measure.js';

const N = Number(process.env.SCOPE_SAMPLES ?? 1e7);
const FS = 10e6;
const F = 50.2;
await ensureBuiltCli();
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-scope-'));
const file = join(dir, 'scope.csv');

function writeCapture(): void {
	const fd = openSync(file, 'w');
	writeSync(fd, 'Sample Interval,1e-07\nVertical Units,V,V\nProbe Attenuation,100,100 mV/A\nTime,CH1,CH2\n');
	const q1 = 8 / 256;
	const q2 = 4 / 256;
	const chunk: string[] = [];
	for (let k = 0; k < N; k++) {
		const t = (k - N / 2) / FS;
		const w = 2 * Math.PI * F * t;
		const u = (230 * Math.SQRT2 * Math.sin(w)) / 100;
		const i = 0.1 * (10 * Math.SQRT2 * Math.sin(w - 0.436) + 3 * Math.SQRT2 * Math.sin(3 * (w - 0.436) - 0.52));
		chunk.push(`${t.toExponential(7)},${(q1 * Math.round(u / q1)).toFixed(5)},${(q2 * Math.round(i / q2)).toFixed(6)}`);
		if (chunk.length === 100_000) {
			writeSync(fd, chunk.join('\n') + '\n');
			chunk.length = 0;
		}
	}
	if (chunk.length) writeSync(fd, chunk.join('\n') + '\n');
	closeSync(fd);
}

function wallMs(cmd: string, args: string[]): { ms: number; out: string } {
	const t0 = performance.now();
	const r = spawnSync(cmd, args, { encoding: 'utf8', maxBuffer: 1 << 28 });
	const ms = performance.now() - t0;
	if (r.status !== 0 && r.status !== 1) throw new Error(`${cmd} exited ${r.status}: ${r.stderr}`);
	return { ms, out: r.stdout };
}

writeCapture();
const mb = statSync(file).size / 1048576;
const hasNumpy = spawnSync('python3', ['-c', 'import numpy'], { encoding: 'utf8' }).status === 0;
const reader = hasNumpy
	? () =>
			wallMs('python3', [
				'-c',
				`import numpy; a = numpy.loadtxt(${JSON.stringify(file)}, delimiter=',', skiprows=4); print(a.shape)`,
			])
	: () =>
			wallMs(process.execPath, [
				'--import',
				'tsx',
				'-e',
				`import { parseCsv } from ${JSON.stringify(join(import.meta.dirname, '..', '..', 'lib', 'io', 'csv', 'parse-csv.ts'))}; import { readFileSync } from 'node:fs'; console.log(parseCsv(new Uint8Array(readFileSync(${JSON.stringify(file)})), 'scope.csv').channels.length)`,
			]);
const analyse = () => wallMs(process.execPath, [mainJs, 'analyse', file, '--json', '--quiet']);

// interleaved so machine load affects both alike
const r1 = reader();
const a1 = analyse();
const r2 = reader();
const a2 = analyse();
const readMs = Math.min(r1.ms, r2.ms);
const analyseMs = Math.min(a1.ms, a2.ms);
const doc = JSON.parse(a1.out);
console.log(
	`file: 2 channels x ${N.toExponential(0)} samples at ${FS / 1e6} MS/s, ${mb.toFixed(0)} MB; load average ${loadavg()
		.map((x) => x.toFixed(2))
		.join(' ')}`,
);
console.log(
	`analysis: ${doc.frequencyHz?.toFixed(4)} Hz, ${doc.cyclesAnalysed} cycles, lag ${doc.pairs?.[0]?.lagDeg?.toFixed(2)} deg, P ${doc.power?.[0]?.activeW?.toFixed(1)} W`,
);
printTable(
	['run', 'wall ms (best of 2)', 'MB/s'],
	[
		[
			hasNumpy ? 'numpy.loadtxt alone (reference)' : 'parseCsv alone (reference; numpy not importable)',
			readMs,
			(1000 * mb) / readMs,
		],
		['sinecheck analyse --json (read + parse + analyse)', analyseMs, (1000 * mb) / analyseMs],
	],
);
console.log(`ratio analyse / reader: ${(analyseMs / readMs).toFixed(2)}x (target <= 1.5x)`);
rmSync(dir, { recursive: true, force: true });
void readFileSync;
