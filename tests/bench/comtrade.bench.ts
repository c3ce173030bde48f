/**
 * `npm run bench -- comtrade`: reading a generated COMTRADE record of 500,000 samples × 6 analog + 2 digital
 * channels through parseComtrade, as ASCII (about 30 MB) and as BINARY (10 MB).
 * No target is set by the issue for COMTRADE; the figures are printed beside references measured in the
 * same run: for ASCII a bare loop (split lines, split commas, Number() into Float64Arrays, no checks), for
 * BINARY a bare DataView loop over the same records. Ratio = parseComtrade time / reference time.
 */
import { parseComtrade } from '../../lib/index.js';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../sample-waves/writers/comtrade.js';
import { peakRssMB, printTable, timeMs } from './measure.js';

const N = 500_000;
const FS = 6400;

function spec(fileType: WriterSpec['fileType']): WriterSpec {
	const wave = (amp: number, deg: number) =>
		Float64Array.from({ length: N }, (_, k) => amp * Math.sin((2 * Math.PI * 50 * k) / FS + (deg * Math.PI) / 180));
	return {
		station: 'Bench',
		device: 'gen',
		revYear: 1999,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: FS, endSample: N }],
		firstData: '01/01/2026,00:00:00.000000',
		trigger: '01/01/2026,00:00:00.100000',
		fileType,
		analog: [0, -120, 120, -20, -140, 100].map((d, i) => ({
			name: `ch${i + 1}`,
			unit: i < 3 ? 'V' : 'A',
			values: wave(i < 3 ? 325 : 60, d),
		})),
		digital: [0, 1].map((d) => ({ name: `s${d}`, states: Array.from({ length: N }, (_, k) => (k >> (8 + d)) & 1) })),
	};
}

function bareAscii(bytes: Uint8Array, nA: number): number {
	const text = new TextDecoder('latin1').decode(bytes);
	const lines = text.split('\r\n');
	const cols = Array.from({ length: nA }, () => new Float64Array(lines.length));
	for (let r = 0; r < lines.length; r++) {
		const f = lines[r].split(',');
		for (let c = 0; c < nA; c++) cols[c][r] = Number(f[2 + c]);
	}
	return cols[0][0];
}

function bareBinary(bytes: Uint8Array, nA: number): number {
	const rec = 8 + 2 * nA + 2;
	const n = Math.floor(bytes.length / rec);
	const v = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const cols = Array.from({ length: nA }, () => new Float64Array(n));
	for (let r = 0; r < n; r++) for (let c = 0; c < nA; c++) cols[c][r] = 0.01 * v.getInt16(r * rec + 8 + 2 * c, true);
	return cols[0][0];
}

const rows: (string | number)[][] = [];
for (const ft of ['ASCII', 'BINARY'] as const) {
	const s = spec(ft);
	const cfg = comtradeCfgText(s);
	const dat = comtradeDatBytes(s);
	const mb = dat.length / 1e6;
	const ours = timeMs(() => void parseComtrade(cfg, dat, 'bench.cfg'), 5, 1);
	const ref = timeMs(() => void (ft === 'ASCII' ? bareAscii(dat, 6) : bareBinary(dat, 6)), 5, 1);
	rows.push([ft, mb, ours, mb / (ours / 1000), ref, mb / (ref / 1000), ours / ref]);
}
printTable(['format', 'MB', 'parseComtrade ms', 'MB/s', 'bare loop ms', 'MB/s', 'ratio'], rows);
console.log(
	`peak RSS ${peakRssMB().toFixed(0)} MB (${N} samples × 6 analog channels = ${((N * 6 * 8) / 1e6).toFixed(0)} MB of Float64Array output)`,
);
