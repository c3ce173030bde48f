/**
 * CSV import speed and memory: Sinecheck's streaming reader against papaparse's best configuration
 * (Node file stream, `step` callback, parseFloat per field into pre-sized Float64Arrays), on a generated
 * 1,000,000-row x 5-column file (time + 4 channels, ~54 MB) and its semicolon/decimal-comma twin.
 * Each case runs in a fresh child process, so its peak memory (VmHWM minus the baseline just before the
 * parse) is its own. Target: throughput >= 3x papaparse; peak memory < 3x the final arrays.
 */
import { spawnSync } from 'node:child_process';
import { createReadStream, mkdtempSync, openSync, readSync, rmSync, statSync, writeSync, closeSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { CsvStreamReader } from '../../lib/io/csv/index.js';
import { peakRssMB, printTable } from './measure.js';

const ROWS = 1_000_000;
const COLS = 5;
const CHUNK = 1 << 20;
const RUNS = 5;

interface CaseResult {
	ms: number;
	cpuMs: number;
	rows: number;
	checksum: number;
	baseMB: number;
	peakMB: number;
	finalBytes: number;
}

function writeFile(path: string, comma: boolean): void {
	const fd = openSync(path, 'w');
	const d = comma ? ';' : ',';
	const fix = (x: number, k: number) => (comma ? x.toFixed(k).replace('.', ',') : x.toFixed(k));
	let out = `t (s)${d}U1 (V)${d}U2 (V)${d}U3 (V)${d}I1 (A)\n`;
	const w = 2 * Math.PI * 50;
	for (let i = 0; i < ROWS; i++) {
		const t = i / 10_000;
		out += `${fix(t, 7)}${d}${fix(325 * Math.sin(w * t), 5)}${d}${fix(325 * Math.sin(w * t - 2.0944), 5)}${d}${fix(325 * Math.sin(w * t + 2.0944), 5)}${d}${fix(41.2 * Math.sin(w * t - 0.5) + 3 * Math.sin(5 * w * t), 6)}\n`;
		if (out.length > 1 << 20) {
			writeSync(fd, out);
			out = '';
		}
	}
	writeSync(fd, out);
	closeSync(fd);
}

function checksum(cols: Float64Array[]): number {
	let s = 0;
	for (const c of cols) for (let i = 0; i < c.length; i++) s += c[i] * ((i % 7) + 1);
	return s;
}

/**
 * 'stream': chunks from fs.createReadStream, as papaparse gets them. 'reuse': fs.readSync into one reused
 * 1 MiB buffer, the way a front end can feed CsvStreamReader (it keeps no reference to a chunk), which
 * spares the first-touch cost of a fresh buffer per chunk.
 */
async function runSinecheck(path: string, feed: 'stream' | 'reuse'): Promise<CaseResult> {
	const totalBytes = statSync(path).size;
	globalThis.gc?.();
	const baseMB = peakRssMB();
	const t0 = performance.now();
	const c0 = process.cpuUsage();
	const reader = new CsvStreamReader(path, {}, { totalBytes });
	if (feed === 'stream') {
		for await (const chunk of createReadStream(path, { highWaterMark: CHUNK })) reader.push(chunk as Uint8Array);
	} else {
		const fd = openSync(path, 'r');
		const buf = new Uint8Array(CHUNK);
		for (let n = readSync(fd, buf); n > 0; n = readSync(fd, buf)) reader.push(buf.subarray(0, n));
		closeSync(fd);
	}
	const cap = reader.finish();
	const ms = performance.now() - t0;
	const cu = process.cpuUsage(c0);
	const cols = cap.channels.map((c) => c.samples);
	const finalBytes = cols.reduce((a, c) => a + c.byteLength, 0) + (cap.timeS?.byteLength ?? 0);
	// the time column is checked through the rate: uniform 10 kHz from 0 s
	const okTime = Math.abs(cap.sampleRateHz - 10_000) < 1e-6 && cap.startS === 0 && !cap.timeS;
	return {
		ms,
		cpuMs: (cu.user + cu.system) / 1000,
		rows: cols[0].length,
		checksum: okTime ? checksum(cols) : NaN,
		baseMB,
		peakMB: peakRssMB(),
		finalBytes,
	};
}

async function runPapa(path: string, comma: boolean): Promise<CaseResult> {
	globalThis.gc?.();
	const baseMB = peakRssMB();
	const t0 = performance.now();
	const c0 = process.cpuUsage();
	const cols = Array.from({ length: COLS }, () => new Float64Array(ROWS));
	let n = -1; // header row first
	await new Promise<void>((resolve, reject) => {
		Papa.parse(createReadStream(path, { highWaterMark: CHUNK }), {
			delimiter: comma ? ';' : ',',
			newline: '\n',
			skipEmptyLines: true,
			step: (r: Papa.ParseStepResult<string[]>) => {
				if (n >= 0) {
					const row = r.data;
					for (let c = 0; c < COLS; c++) cols[c][n] = parseFloat(comma ? row[c].replace(',', '.') : row[c]);
				}
				n++;
			},
			complete: () => resolve(),
			error: (e: Error) => reject(e),
		});
	});
	const ms = performance.now() - t0;
	const cu = process.cpuUsage(c0);
	return {
		ms,
		cpuMs: (cu.user + cu.system) / 1000,
		rows: n,
		checksum: checksum(cols.slice(1)),
		baseMB,
		peakMB: peakRssMB(),
		finalBytes: (COLS - 1) * 8 * n,
	};
}

async function child(kind: string, path: string, comma: boolean): Promise<void> {
	const r =
		kind === 'papaparse'
			? await runPapa(path, comma)
			: await runSinecheck(path, kind === 'sinecheck' ? 'stream' : 'reuse');
	process.stdout.write(JSON.stringify(r));
}

function main(): void {
	const dir = mkdtempSync(join(tmpdir(), 'sinecheck-csv-bench-'));
	const self = fileURLToPath(import.meta.url);
	try {
		const files = [
			{ label: 'comma, decimal point', path: join(dir, 'point.csv'), comma: false },
			{ label: 'semicolon, decimal comma', path: join(dir, 'comma.csv'), comma: true },
		];
		for (const f of files) writeFile(f.path, f.comma);
		const loadBefore = loadavg()[0];
		const rows: (string | number)[][] = [];
		for (const f of files) {
			const mb = statSync(f.path).size / 1e6;
			const res: Record<string, CaseResult[]> = { papaparse: [], sinecheck: [], 'sinecheck-reuse': [] };
			// alternate the readers so that load from other processes hits all of them alike
			for (let i = 0; i < RUNS; i++) {
				for (const kind of Object.keys(res)) {
					const p = spawnSync(
						process.execPath,
						['--import', 'tsx', '--expose-gc', self, 'child', kind, f.path, String(f.comma)],
						{ encoding: 'utf8', maxBuffer: 1 << 20 },
					);
					if (p.status !== 0) throw new Error(`${kind} child failed: ${p.stderr}`);
					res[kind].push(JSON.parse(p.stdout) as CaseResult);
				}
			}
			const best = (k: string, key: 'ms' | 'cpuMs') => Math.min(...res[k].map((r) => r[key]));
			const sc = res.sinecheck[0];
			const same = Object.values(res).every((rs) => rs.every((r) => r.checksum === sc.checksum && r.rows === sc.rows));
			const finalMB = sc.finalBytes / 1048576;
			const peak = (k: string) => Math.max(...res[k].map((r) => r.peakMB - r.baseMB));
			const ppMs = best('papaparse', 'ms');
			const ppCpu = best('papaparse', 'cpuMs');
			rows.push([
				`${f.label} (${mb.toFixed(1)} MB)`,
				'papaparse step (stream)',
				(mb / ppMs) * 1000,
				ppMs,
				(mb / ppCpu) * 1000,
				peak('papaparse'),
				'',
				'',
			]);
			for (const [kind, label] of [
				['sinecheck', 'sinecheck (stream)'],
				['sinecheck-reuse', 'sinecheck (reused buffer)'],
			]) {
				const [ms, cpu] = [best(kind, 'ms'), best(kind, 'cpuMs')];
				rows.push(['', label, (mb / ms) * 1000, ms, (mb / cpu) * 1000, peak(kind), finalMB, peak(kind) / finalMB]);
				rows.push(['', '  ratio to papaparse (target >= 3)', ppMs / ms, '', ppCpu / cpu, '', '', '']);
			}
			rows.push(['', same ? 'values identical in every run' : 'VALUES DIFFER', '', '', '', '', '', '']);
		}
		// other processes on the machine slow wall-clock figures; CPU time is less affected by them
		console.log(
			`load average ${loadBefore.toFixed(1)} before, ${loadavg()[0].toFixed(1)} after, on ${cpus().length} CPUs`,
		);
		console.log(
			`${ROWS} rows x ${COLS} columns; best of ${RUNS} alternating runs, each in its own process (wall clock, and CPU time user+sys);`,
		);
		console.log(
			"peak MB = largest peak RSS minus the RSS just before the parse; final arrays = the capture's Float64Arrays",
		);
		printTable(
			['file', 'reader', 'MB/s wall', 'ms wall', 'MB/s cpu', 'peak MB', 'final arrays MB', 'peak/final (target < 3)'],
			rows,
		);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

if (process.argv[2] === 'child') await child(process.argv[3], process.argv[4], process.argv[5] === 'true');
else main();
