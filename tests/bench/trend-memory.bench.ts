/**
 * `npm run bench -- trend-memory`: peak resident memory of `sinecheck trend` (the built CLI in a child
 * process) on generated CSV recordings, beside the file sizes: 200 MB and 2 GB of 4 channels (memory must
 * be flat in length), and 200 MB of 400 channels (flat in channel count); and a 400 MB COMTRADE BINARY .dat.
 *
 * Target: the 2 GB CSV under 300 MB peak RSS, and the 2 GB peak within a few MB of the 200 MB peak.
 * Reference measured in the same run: the peak RSS of a bare Node process that reads the same file in
 * 1 MiB chunks and counts its lines (the floor for any streaming reader in Node), and the ratio to it.
 * Peak RSS from GNU time's %M when /usr/bin/time exists, else from polling /proc/<pid>/status VmHWM.
 * SINECHECK_BENCH_SCALE=0.1 scales every file down for a quick look.
 * The files are written once to a temporary folder and deleted at the end (about 2.4 GB of disk).
 */
import { spawn } from 'node:child_process';
import {
	closeSync,
	existsSync,
	mkdtempSync,
	openSync,
	readFileSync,
	rmSync,
	statSync,
	writeFileSync,
	writeSync,
} from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { printTable } from './measure.js';

const FS = 10_000;
const PER_CYCLE = 200; // 50 Hz at 10 kS/s
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-memory-'));

/** Writes a CSV of `channels` sine channels (three-phase 230 V voltages, then 12 A currents) until `bytes`. */
function writeCsv(path: string, channels: number, bytes: number): number {
	const names = Array.from({ length: channels }, (_, c) => (c < 3 ? `U${c + 1} (V)` : `I${c - 2} (A)`));
	// the channel values of each of the 200 samples of one cycle, printed once (the signal is periodic)
	const tails = Array.from({ length: PER_CYCLE }, (_, k) =>
		names
			.map((_, c) => {
				const peak = c < 3 ? 230 * Math.SQRT2 : 12 * Math.SQRT2;
				return (peak * Math.sin((2 * Math.PI * k) / PER_CYCLE - (2 * Math.PI * (c % 3)) / 3)).toFixed(c < 3 ? 2 : 3);
			})
			.join(','),
	);
	const fd = openSync(path, 'w');
	const buf = Buffer.allocUnsafe(8 << 20);
	let used = buf.write(`t (s),${names.join(',')}\n`, 0, 'latin1');
	let written = 0;
	for (let k = 0; written + used < bytes; k++) {
		const line = `${Math.floor(k / FS)}.${String(k % FS).padStart(4, '0')},${tails[k % PER_CYCLE]}\n`;
		if (used + line.length > buf.length) {
			writeSync(fd, buf, 0, used);
			written += used;
			used = 0;
		}
		used += buf.write(line, used, 'latin1');
	}
	writeSync(fd, buf, 0, used);
	closeSync(fd);
	return statSync(path).size;
}

/**
 * Writes a COMTRADE 1999 BINARY record of 4 channels (three 230 V phases, one 12 A current; int16 with
 * a = peak / 30000) at 10 kS/s until the .dat reaches `bytes`; returns the .dat size.
 */
function writeComtrade(base: string, bytes: number): number {
	const recordBytes = 8 + 4 * 2;
	const records = Math.floor(bytes / recordBytes);
	const peaks = [230 * Math.SQRT2, 230 * Math.SQRT2, 230 * Math.SQRT2, 12 * Math.SQRT2];
	const a = peaks.map((p) => p / 30_000);
	const cfg = [
		'Tallowmere Joinery,bench-rec,1999',
		'4,4A,0D',
		...['U1', 'U2', 'U3', 'I1'].map(
			(n, c) => `${c + 1},${n},L${(c % 3) + 1},,${c < 3 ? 'V' : 'A'},${a[c]},0,0,-32767,32767,1,1,P`,
		),
		'50',
		'1',
		`${FS},${records}`,
		'01/02/2026,10:00:00.000000',
		'01/02/2026,10:00:00.000000',
		'BINARY',
		'100', // timemult: stamps count 100 µs steps, so a uint32 stamp lasts 4.9 days at 10 kS/s
		'',
	].join('\r\n');
	writeFileSync(`${base}.cfg`, cfg);
	// one cycle of records (200 at 50 Hz), sample numbers and time stamps patched per block
	const block = Buffer.alloc(PER_CYCLE * 2000 * recordBytes);
	const perBlock = block.length / recordBytes;
	for (let r = 0; r < perBlock; r++) {
		for (let c = 0; c < 4; c++)
			block.writeInt16LE(
				Math.round(30_000 * Math.sin((2 * Math.PI * r) / PER_CYCLE - (2 * Math.PI * (c % 3)) / 3)),
				r * recordBytes + 8 + 2 * c,
			);
	}
	const fd = openSync(`${base}.dat`, 'w');
	for (let done = 0; done < records; done += perBlock) {
		const m = Math.min(perBlock, records - done);
		for (let r = 0; r < m; r++) {
			block.writeUInt32LE(done + r + 1, r * recordBytes);
			block.writeUInt32LE(done + r, r * recordBytes + 4);
		}
		writeSync(fd, block, 0, m * recordBytes);
	}
	closeSync(fd);
	return statSync(`${base}.dat`).size;
}

interface Run {
	peakMB: number;
	wallS: number;
	cpuS: number;
	status: number | null;
}

/** Runs node with `args`, stdout discarded; peak RSS, wall and CPU time of that process. */
function measure(args: string[]): Promise<Run> {
	const gnuTime = existsSync('/usr/bin/time');
	const report = join(dir, 'time.txt');
	const cmd = gnuTime ? '/usr/bin/time' : process.execPath;
	const argv = gnuTime ? ['-f', '%M %e %U %S', '-o', report, process.execPath, ...args] : args;
	const t0 = performance.now();
	const child = spawn(cmd, argv, { stdio: ['ignore', 'ignore', 'pipe'] });
	let stderr = '';
	child.stderr.on('data', (d) => (stderr += String(d)));
	let polledKB = 0;
	const poll = gnuTime
		? undefined
		: setInterval(() => {
				try {
					const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
					if (m) polledKB = Math.max(polledKB, Number(m[1]));
				} catch {
					/* exited */
				}
			}, 20);
	return new Promise((resolve) => {
		child.on('close', (status) => {
			if (poll) clearInterval(poll);
			const wallS = (performance.now() - t0) / 1000;
			if (status !== 0)
				console.log(
					`  (exit ${status}: ${stderr
						.split('\n')
						.filter((l) => /sinecheck:|Error/.test(l))
						.slice(0, 3)
						.join(' | ')})`,
				);
			if (gnuTime) {
				const [kb, , user, sys] = readFileSync(report, 'utf8').trim().split('\n').pop()!.split(' ').map(Number);
				resolve({ peakMB: kb / 1024, wallS, cpuS: user + sys, status });
			} else resolve({ peakMB: polledKB / 1024, wallS, cpuS: NaN, status });
		});
	});
}

/** A bare streaming read of the file: 1 MiB chunks, lines counted. */
const FLOOR = `const fs=require('fs');const fd=fs.openSync(process.argv[1],'r');const b=Buffer.alloc(1<<20);let p=0,n,l=0;while((n=fs.readSync(fd,b,0,b.length,p))>0){p+=n;for(let i=0;i<n;i++)if(b[i]===10)l++;}console.log(l);`;

async function main(): Promise<void> {
	await ensureBuiltCli();
	// SINECHECK_BENCH_SCALE=0.1 for a quick look (20 MB / 200 MB files); the targets are for scale 1
	const scale = Number(process.env.SINECHECK_BENCH_SCALE ?? 1) || 1;
	const cases = [
		{ name: 'csv 4 ch 200 MB', channels: 4, bytes: 200e6 * scale },
		{ name: 'csv 4 ch 2 GB', channels: 4, bytes: 2e9 * scale },
		{ name: 'csv 400 ch 200 MB', channels: 400, bytes: 200e6 * scale },
	];
	const rows: (string | number)[][] = [];
	try {
		for (const c of cases) {
			const path = join(dir, `${c.channels}ch-${c.bytes}.csv`);
			const g0 = performance.now();
			const size = writeCsv(path, c.channels, c.bytes);
			console.log(
				`${c.name}: wrote ${(size / 1e6).toFixed(0)} MB in ${((performance.now() - g0) / 1000).toFixed(1)} s`,
			);
			const floor = await measure(['-e', FLOOR, path]);
			const trend = await measure([mainJs, 'trend', path]);
			rows.push([
				c.name,
				size / 1e6,
				String(c.channels),
				trend.peakMB,
				floor.peakMB,
				trend.peakMB / floor.peakMB,
				trend.wallS,
				trend.cpuS,
				size / 1e6 / trend.cpuS,
				String(trend.status ?? 'killed'),
			]);
			rmSync(path);
		}
		{
			// COMTRADE streams too: a BINARY .dat of 400 MB (5.8 hours at 10 kS/s)
			const base = join(dir, 'rec');
			const size = writeComtrade(base, 400e6 * scale);
			const floor = await measure(['-e', FLOOR, `${base}.dat`]);
			const trend = await measure([mainJs, 'trend', `${base}.cfg`]);
			rows.push([
				'comtrade BINARY 4 ch',
				size / 1e6,
				'4',
				trend.peakMB,
				floor.peakMB,
				trend.peakMB / floor.peakMB,
				trend.wallS,
				trend.cpuS,
				size / 1e6 / trend.cpuS,
				String(trend.status ?? 'killed'),
			]);
		}
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
	console.log(
		`\ntrend peak RSS (target: 2 GB CSV < 300 MB, flat in length and channels); load average ${loadavg()
			.map((x) => x.toFixed(1))
			.join(' ')}`,
	);
	printTable(
		[
			'file',
			'size MB',
			'channels',
			'trend peak MB',
			'bare read peak MB',
			'ratio',
			'wall s',
			'cpu s',
			'MB per cpu s',
			'exit',
		],
		rows,
	);
}

main().catch((e) => {
	console.error(e);
	rmSync(dir, { recursive: true, force: true });
	process.exit(1);
});
