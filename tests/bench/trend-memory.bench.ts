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
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuiltCli, mainJs } from '../cli/built-cli.js';
import { printTable } from './measure.js';
import { writeComtrade, writeCsv } from './trend-files.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-memory-'));

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
			const size = writeCsv(path, c.channels, { bytes: c.bytes });
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
			const size = writeComtrade(base, Math.floor((400e6 * scale) / 16)); // 16-byte records
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
