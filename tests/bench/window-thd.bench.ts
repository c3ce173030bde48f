/**
 * `npm run bench -- window-thd`: the THD of one 10-cycle window on 4 channels (three 230 V phases with a
 * busy harmonic mix, one 12 A current) at 10 kS/s and 49.97 Hz (so the window is resampled), as the trend
 * analyser runs it once per window (lib/trend/window-thd.ts `thdWindow`: one placement, the four channels
 * resampled in one pass, each real 2048-point DFT as a 1024-point complex one), beside references measured
 * in this run over the same window:
 * - per channel: `thdPercent` on each channel alone (own pass over the points);
 * - the bare FFTs: fft.js transform of 1024 complex points 4 times (what thdWindow spends on FFTs), and
 *   realTransform of 2048 points 4 times (what one real FFT per channel, the earlier way, spent).
 * Cases are timed in CPU time in interleaved passes; the best pass counts (a shared machine disturbs the
 * figures least that way). The load average is printed.
 */
import FFT from 'fft.js';
import { cpus, loadavg } from 'node:os';
import { WindowThd, type WindowThdOut } from '../../lib/trend/window-thd.js';
import { printTable } from './measure.js';

const FS = 10_000;
const F1 = 49.97;
const CYCLES = 10;
const RING = 1 << 14;
const CHANNELS = 4;

/** Ring buffers of 4 channels: 230 V phases with 5 %, 3 %, 1 % 5th, 7th, 11th and 0.3 % odd orders to 49; a 12 A current with 30 % 5th. */
function rings(): Float64Array[] {
	return Array.from({ length: CHANNELS }, (_, c) => {
		const x = new Float64Array(RING);
		const shift = (-2 * Math.PI * c) / 3;
		const w = (2 * Math.PI * F1) / FS;
		for (let i = 0; i < RING; i++) {
			const a = w * i + shift;
			if (c === 3) x[i] = 16.97 * (Math.sin(a) + 0.3 * Math.sin(5 * a) + 0.1 * Math.sin(7 * a));
			else {
				let v = 325.27 * Math.sin(a) + 16.26 * Math.sin(5 * a) + 9.76 * Math.sin(7 * a) + 3.25 * Math.sin(11 * a);
				for (let h = 13; h <= 49; h += 2) v += 0.98 * Math.sin(h * a + h);
				x[i] = v;
			}
		}
		return x;
	});
}

/** µs of CPU time per call over `reps` calls. */
function batchUs(fn: (i: number) => void, reps: number): number {
	const c0 = process.cpuUsage();
	for (let i = 0; i < reps; i++) fn(i);
	const c = process.cpuUsage(c0);
	return (c.user + c.system) / reps;
}

const rs = rings();
const mask = RING - 1;
const lengthT = (CYCLES * FS) / F1;
/** Window starts spread over the ring (some wrap round its end), a new placement each call. */
const starts = Array.from({ length: 64 }, (_, k) => 10.37 + k * 251.3);
const thd = new WindowThd(CYCLES);
const out: WindowThdOut = { thd: new Float64Array(CHANNELS), fundamentals: new Float64Array(2 * CHANNELS) };
const fft = new FFT(2048);
const fftIn = new Float64Array(2048).map((_, i) => Math.sin(i * 0.0307) + 0.05 * Math.sin(i * 0.7));
const fftOut = new Float64Array(4096);
const fft1024 = new FFT(1024);
const fft1024Out = new Float64Array(2048);
let sink = 0;

const cases: [string, (i: number) => void][] = [
	[
		'thdWindow, 4 channels (trend analyser)',
		(i) => {
			const s = starts[i & 63];
			thd.thdWindow(rs, mask, s, s + lengthT, FS, out);
			sink += out.thd[0];
		},
	],
	[
		'ref: thdPercent per channel, 4 channels',
		(i) => {
			const s = starts[i & 63];
			for (let c = 0; c < CHANNELS; c++) sink += thd.thdPercent(rs[c], mask, s, s + lengthT, FS);
		},
	],
	[
		'ref: fft.js transform 1024 (complex), 4 times',
		() => {
			for (let c = 0; c < CHANNELS; c++) fft1024.transform(fft1024Out, fftIn);
			sink += fft1024Out[2];
		},
	],
	[
		'ref: fft.js realTransform 2048, 4 times',
		() => {
			for (let c = 0; c < CHANNELS; c++) fft.realTransform(fftOut, fftIn);
			sink += fftOut[2];
		},
	],
];
const best = cases.map(() => Infinity);
const REPS = 2000;
for (let pass = 0; pass < 7; pass++)
	cases.forEach(([, fn], k) => {
		const us = batchUs(fn, REPS);
		if (pass > 0) best[k] = Math.min(best[k], us);
	});
const base = best[0];
printTable(
	['4-channel window', 'µs (best pass, cpu)', 'x thdWindow'],
	cases.map(([name], k) => [name, best[k], best[k] / base]),
);
console.log(
	`windows of 4 channels per hour at 50 Hz: 18 000 -> ${((18_000 * base) / 1e6).toFixed(2)} s of cpu per hour of recording by thdWindow`,
);
console.log(
	`load average ${loadavg()
		.map((x) => x.toFixed(1))
		.join(' ')} on ${cpus().length} cores (check sum, ignore: ${sink.toExponential(3)})`,
);
