/** Small helpers shared by the benches: timing, peak memory of this process, table printing. */
import { readFileSync } from 'node:fs';

/** Median wall time in ms of `runs` calls after `warmup` calls. */
export function timeMs(fn: () => void, runs = 7, warmup = 2): number {
	for (let i = 0; i < warmup; i++) fn();
	const t: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		fn();
		t.push(performance.now() - t0);
	}
	t.sort((a, b) => a - b);
	return t[Math.floor(t.length / 2)];
}

/** Peak resident set size of this process so far, in MB (Linux VmHWM). */
export function peakRssMB(): number {
	try {
		const m = /VmHWM:\s+(\d+)\s+kB/.exec(readFileSync('/proc/self/status', 'utf8'));
		if (m) return Number(m[1]) / 1024;
	} catch {
		/* not Linux */
	}
	return process.memoryUsage().rss / 1048576;
}

/** Print rows as an aligned table. */
export function printTable(header: string[], rows: (string | number)[][]): void {
	const cells = [header, ...rows.map((r) => r.map((c) => (typeof c === 'number' ? fmt(c) : c)))];
	const widths = header.map((_, i) => Math.max(...cells.map((r) => String(r[i] ?? '').length)));
	for (const r of cells) console.log(r.map((c, i) => String(c ?? '').padStart(widths[i])).join('  '));
}

function fmt(x: number): string {
	if (!Number.isFinite(x)) return String(x);
	const a = Math.abs(x);
	return a >= 1000 ? x.toFixed(0) : a >= 10 ? x.toFixed(1) : x.toFixed(3);
}
