/**
 * The big recording the big-file bench reads: a CSV of time + 6 channels (three phase voltages and
 * currents with harmonics), 4,000,000 rows at 10 kS/s (400 s), 24 M channel values, about 282 MB.
 * Written once per run from closed-form signals through one reused string buffer.
 */
import { closeSync, openSync, writeSync } from 'node:fs';

export const BIG_ROWS = 4_000_000;
export const BIG_RATE_HZ = 10_000;
export const BIG_CHANNELS = 6;

export function writeBigCsv(path: string, rows = BIG_ROWS): number {
	const fd = openSync(path, 'w');
	let out = 't (s),U1 (V),U2 (V),U3 (V),I1 (A),I2 (A),I3 (A)\n';
	let bytes = 0;
	const w = 2 * Math.PI * 50;
	const third = (2 * Math.PI) / 3;
	for (let i = 0; i < rows; i++) {
		const t = i / BIG_RATE_HZ;
		let line = t.toFixed(7);
		for (let k = 0; k < 3; k++)
			line += ',' + (325.27 * Math.sin(w * t - k * third) + 9 * Math.sin(5 * (w * t - k * third))).toFixed(4);
		for (let k = 0; k < 3; k++)
			line += ',' + (56.57 * Math.sin(w * t - k * third - 0.5) + 11 * Math.sin(5 * (w * t - k * third) + 1)).toFixed(6);
		out += line + '\n';
		if (out.length > 1 << 20) {
			bytes += writeSync(fd, out);
			out = '';
		}
	}
	bytes += writeSync(fd, out);
	closeSync(fd);
	return bytes;
}
