/**
 * Recordings the trend benches write: a periodic three-phase 230 V / 12 A signal at 10 kS/s (one 50 Hz
 * cycle printed once and repeated), as a CSV with a time column or as a COMTRADE 1999 BINARY record.
 * Both write in large blocks from one reused buffer, so a 1-hour file takes seconds, not minutes.
 */
import { closeSync, openSync, statSync, writeFileSync, writeSync } from 'node:fs';

export const BENCH_FS = 10_000;
const PER_CYCLE = 200; // 50 Hz at 10 kS/s

/** Peak of channel `c`: three 230 V phases, then 12 A currents (common practice: LV supply values). */
function peakOf(c: number): number {
	return c < 3 ? 230 * Math.SQRT2 : 12 * Math.SQRT2;
}

/** Writes a CSV of `channels` sine channels with a time column, stopping at `records` rows or `bytes`. */
export function writeCsv(path: string, channels: number, limit: { records?: number; bytes?: number }): number {
	const names = Array.from({ length: channels }, (_, c) => (c < 3 ? `U${c + 1} (V)` : `I${c - 2} (A)`));
	// the channel values of each of the 200 samples of one cycle, printed once (the signal is periodic)
	const tails = Array.from({ length: PER_CYCLE }, (_, k) =>
		names
			.map((_, c) =>
				(peakOf(c) * Math.sin((2 * Math.PI * k) / PER_CYCLE - (2 * Math.PI * (c % 3)) / 3)).toFixed(c < 3 ? 2 : 3),
			)
			.join(','),
	);
	const records = limit.records ?? Infinity;
	const bytes = limit.bytes ?? Infinity;
	const fd = openSync(path, 'w');
	const buf = Buffer.allocUnsafe(8 << 20);
	let used = buf.write(`t (s),${names.join(',')}\n`, 0, 'latin1');
	let written = 0;
	for (let k = 0; k < records && written + used < bytes; k++) {
		const line = `${Math.floor(k / BENCH_FS)}.${String(k % BENCH_FS).padStart(4, '0')},${tails[k % PER_CYCLE]}\n`;
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
 * Writes `base`.cfg and `base`.dat: a COMTRADE 1999 BINARY record of 4 channels (three 230 V phases, one
 * 12 A current; int16 with a = peak / 30000) at 10 kS/s, `records` records; returns the .dat size.
 */
export function writeComtrade(base: string, records: number): number {
	const recordBytes = 8 + 4 * 2;
	const a = [0, 1, 2, 3].map((c) => peakOf(c) / 30_000);
	const cfg = [
		'Tallowmere Joinery,bench-rec,1999',
		'4,4A,0D',
		...['U1', 'U2', 'U3', 'I1'].map(
			(n, c) => `${c + 1},${n},L${(c % 3) + 1},,${c < 3 ? 'V' : 'A'},${a[c]},0,0,-32767,32767,1,1,P`,
		),
		'50',
		'1',
		`${BENCH_FS},${records}`,
		'01/02/2026,10:00:00.000000',
		'01/02/2026,10:00:00.000000',
		'BINARY',
		'100', // timemult: stamps count 100 µs steps, so a uint32 stamp lasts 4.9 days at 10 kS/s
		'',
	].join('\r\n');
	writeFileSync(`${base}.cfg`, cfg);
	// whole cycles of records, sample numbers and time stamps patched per block
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
