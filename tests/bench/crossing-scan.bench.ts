/**
 * `npm run bench -- crossing-scan`: the trend analyser's zero-crossing tracker (lib/trend/crossing-tracker.ts)
 * on 60 s of a 230 V, 50.01 Hz supply with a 1 % 5th harmonic at 10 kS/s, in blocks of 4096 samples as the
 * analyser feeds it: the scan alone (rising boundaries only) and with the Urms(1/2) sums (voltage channels),
 * in ns per sample, beside a bare sum of squares over the same samples measured in this run (the reference
 * kernel: one load, one multiply-add per sample). CPU time, best of several interleaved passes; the load
 * average is printed.
 */
import { cpus, loadavg } from 'node:os';
import { CrossingTracker } from '../../lib/trend/crossing-tracker.js';
import { printTable } from './measure.js';

const FS = 10_000;
const BLOCK = 4096;
const BLOCKS = 147; // ~60 s
const RING = 1 << 14;
const ring = new Float64Array(RING);
const signal = new Float64Array(BLOCK * BLOCKS);
const w = (2 * Math.PI * 50.01) / FS;
for (let k = 0; k < signal.length; k++) signal[k] = 325.27 * Math.sin(w * k) + 3.25 * Math.sin(5 * w * k + 0.3);
let halves = 0;
let rises = 0;
let sum = 0;
const sink = {
	halfCycle: () => void halves++,
	rising: () => void rises++,
};

/** CPU ns per sample of `fn` over the whole signal. */
function nsPerSample(fn: () => void): number {
	const c0 = process.cpuUsage();
	fn();
	const c = process.cpuUsage(c0);
	return ((c.user + c.system) * 1000) / signal.length;
}

/** The blocks through the ring (as the analyser copies them) and, unless `bare`, a tracker. */
function pass(mode: 'scan' | 'scan+urms' | 'bare'): void {
	const t = new CrossingTracker(0, ring, FS, 50, sink, mode === 'scan+urms');
	for (let b = 0, abs = 0; b < BLOCKS; b++, abs += BLOCK) {
		const chunk = signal.subarray(b * BLOCK, (b + 1) * BLOCK);
		ring.set(chunk, abs & (RING - 1));
		if (mode !== 'bare') t.scan(chunk, 0, BLOCK, abs);
		else {
			let s = 0;
			for (let k = 0; k < BLOCK; k++) s += chunk[k] * chunk[k];
			sum += s;
		}
	}
}

const modes = ['scan', 'scan+urms', 'bare'] as const;
const best = modes.map(() => Infinity);
for (let p = 0; p < 8; p++)
	modes.forEach(
		(m, k) =>
			(best[k] = Math.min(
				best[k],
				nsPerSample(() => pass(m)),
			)),
	);
const ref = best[2];
printTable(
	['pass (incl. the copy into the ring)', 'ns/sample (best, cpu)', 'x bare sum of squares'],
	[
		['crossing tracker: scan, rising boundaries', best[0], best[0] / ref],
		['crossing tracker: scan and Urms(1/2)', best[1], best[1] / ref],
		['ref: bare sum of squares', ref, 1],
	],
);
console.log(
	`load average ${loadavg()
		.map((x) => x.toFixed(1))
		.join(' ')} on ${cpus().length} cores (check sums, ignore: ${halves} ${rises} ${sum.toExponential(3)})`,
);
