/**
 * CSV and COMTRADE as streams of sample blocks (what `trend` reads): the samples handed on are the numbers
 * written (closed form, rounded as printed or quantised as stored), whatever the chunk size; the time
 * column is checked as it passes; bounds are refused before any row is kept.
 */
import { describe, expect, it } from 'vitest';
import { ComtradeSampleStream } from '../../lib/io/comtrade/sample-stream.js';
import { parseComtradeCfg } from '../../lib/io/comtrade/cfg.js';
import { CsvSampleStream, type SampleStreamHeader } from '../../lib/io/csv/sample-stream.js';
import { ImportError } from '../../lib/io/import-error.js';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../sample-waves/writers/comtrade.js';

/** Collects what a stream hands on. */
function collector() {
	const got: { header?: SampleStreamHeader; samples: number[][] } = { samples: [] };
	return {
		got,
		sink: {
			start(h: SampleStreamHeader) {
				got.header = h;
				got.samples = h.channels.map(() => []);
			},
			samples(chunk: Float64Array[], n: number) {
				chunk.forEach((c, k) => {
					for (let i = 0; i < n; i++) got.samples[k].push(c[i]);
				});
			},
		},
	};
}

function pushInChunks(push: (b: Uint8Array) => void, bytes: Uint8Array, size: number): void {
	for (let p = 0; p < bytes.length; p += size) push(bytes.subarray(p, p + size));
}

const u1 = (k: number) => Number((325 * Math.sin((2 * Math.PI * 50 * k) / 10_000)).toFixed(3));
const i1 = (k: number) => Number((12 * Math.sin((2 * Math.PI * 50 * k) / 10_000 - 0.5)).toFixed(4));

function csvText(rows: number, time: (k: number) => number = (k) => k / 10_000): Uint8Array {
	const lines = ['t (s),U1 (V),I1 (mA)'];
	for (let k = 0; k < rows; k++) lines.push(`${time(k).toFixed(4)},${u1(k)},${i1(k) * 1000}`);
	return new TextEncoder().encode(`${lines.join('\n')}\n`);
}

describe('CsvSampleStream', () => {
	for (const chunk of [7, 4096, 1 << 20]) {
		it(`hands on every written value (mA scaled to A) at 10 kS/s, in chunks of ${chunk} bytes`, () => {
			const rows = 9000; // more than the 4096 rows used to find the rate
			const { got, sink } = collector();
			const s = new CsvSampleStream('feeder.csv', {}, sink);
			pushInChunks((b) => s.push(b), csvText(rows), chunk);
			const late = s.end();
			expect(got.header!.sampleRateHz).toBeCloseTo(10_000, 6); // stamps 1e-4 s apart
			expect(got.header!.channels.map((c) => [c.name, c.unit, c.quantity])).toEqual([
				['U1', 'V', 'voltage'],
				['I1', 'A', 'current'],
			]);
			expect(got.samples[0].length).toBe(rows);
			for (let k = 0; k < rows; k += 997) {
				expect(got.samples[0][k]).toBe(u1(k));
				expect(got.samples[1][k]).toBeCloseTo(i1(k), 12);
			}
			expect(late.filter((d) => d.severity === 'warning')).toEqual([]);
		});
	}

	it('a jump of 1e6 s after the first rows is one located time-gaps warning; the rate stays 10 kS/s', () => {
		const { got, sink } = collector();
		const s = new CsvSampleStream('jump.csv', {}, sink);
		pushInChunks(
			(b) => s.push(b),
			csvText(20_000, (k) => k / 10_000 + (k >= 10_000 ? 1e6 : 0)),
			65_536,
		);
		const late = s.end();
		expect(got.header!.sampleRateHz).toBeCloseTo(10_000, 6);
		const gap = late.find((d) => d.code === 'time-gaps');
		// row 10000 (0-based) is on line 10002: the header is line 1, row 0 line 2
		expect(gap?.line).toBe(10_002);
		expect(gap?.message).toMatch(/longest 1e\+06 s|longest 1000000 s/);
	});

	it('a jump inside the first rows: the rate is the median step (10 kS/s), not the mean (0.003 Hz)', () => {
		const { got, sink } = collector();
		const s = new CsvSampleStream('jump.csv', {}, sink);
		s.push(csvText(3000, (k) => k / 10_000 + (k >= 1000 ? 1e6 : 0)));
		s.end();
		expect(got.header!.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(got.header!.diagnostics.some((d) => d.code === 'time-base-treated-uniform')).toBe(true);
	});

	it('100,000 columns are refused at line 1 before any row buffer exists (out-of-range)', () => {
		const header = ['t (s)', ...Array.from({ length: 100_000 }, (_, k) => `U${k} (V)`)].join(',');
		const s = new CsvSampleStream('wide.csv', {}, collector().sink, { maxChannels: 1024 });
		let e: unknown;
		try {
			pushInChunks((b) => s.push(b), new TextEncoder().encode(`${header}\n0,${'1,'.repeat(99_999)}1\n`), 1 << 20);
			s.end();
		} catch (x) {
			e = x;
		}
		expect(e).toBeInstanceOf(ImportError);
		expect((e as ImportError).code).toBe('out-of-range');
		expect((e as ImportError).line).toBe(1);
	});
});

describe('ComtradeSampleStream', () => {
	const n = 3000;
	const volts = Array.from({ length: n }, (_, k) => 325 * Math.sin((2 * Math.PI * 50 * k) / 5000));
	const amps = Array.from({ length: n }, (_, k) => 20 * Math.sin((2 * Math.PI * 50 * k) / 5000 - 0.3));
	const spec = (fileType: WriterSpec['fileType']): WriterSpec => ({
		station: 'Tallowmere Joinery',
		device: 'rec-1',
		revYear: 1999,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 5000, endSample: n }],
		firstData: '01/02/2026,10:00:00.000000',
		trigger: '01/02/2026,10:00:00.000000',
		fileType,
		analog: [
			{ name: 'U1', phase: 'L1', unit: 'V', values: volts },
			{ name: 'I1', phase: 'L1', unit: 'A', values: amps },
		],
	});
	// quantisation step of each type: a = peak / (0.95 · full scale) as the writer sets it; ASCII prints
	// integers to 99998, BINARY int16, BINARY32 int32, FLOAT32 single precision (~6e-8 relative)
	const step: Record<WriterSpec['fileType'], number> = {
		ASCII: 325 / (0.95 * 99998),
		BINARY: 325 / (0.95 * 32767),
		BINARY32: 325 / (0.95 * 2147483647),
		FLOAT32: 325 * 1.2e-7,
	};

	for (const type of ['ASCII', 'BINARY', 'BINARY32', 'FLOAT32'] as const) {
		it(`${type}: the .dat pushed in 1000-byte chunks gives the written values within one quantisation step`, () => {
			const s = spec(type);
			const cfg = parseComtradeCfg(comtradeCfgText(s), 'rec.cfg');
			const { got, sink } = collector();
			const stream = new ComtradeSampleStream(cfg, 'rec.cfg', 'rec.dat', {}, sink);
			pushInChunks((b) => stream.push(b), comtradeDatBytes(s), 1000);
			stream.end();
			expect(got.header!.sampleRateHz).toBe(5000);
			expect(got.samples[0].length).toBe(n);
			for (let k = 0; k < n; k += 101) {
				expect(Math.abs(got.samples[0][k] - volts[k])).toBeLessThanOrEqual(step[type]);
				expect(Math.abs(got.samples[1][k] - amps[k])).toBeLessThanOrEqual((step[type] * 20) / 325 + 1e-12);
			}
		});
	}

	it('BINARY declared, ASCII .dat pushed: dat-type-mismatch before any sample is handed on', () => {
		const cfg = parseComtradeCfg(comtradeCfgText(spec('BINARY')), 'rec.cfg');
		const { got, sink } = collector();
		const stream = new ComtradeSampleStream(cfg, 'rec.cfg', 'rec.dat', {}, sink);
		expect(() => {
			pushInChunks((b) => stream.push(b), comtradeDatBytes(spec('ASCII')), 1 << 16);
			stream.end();
		}).toThrow(/dat-type-mismatch/);
		expect(got.samples.every((c) => c.length === 0)).toBe(true);
	});

	it('a .dat shorter than the .cfg declares is dat-too-short', () => {
		const s = spec('BINARY32');
		const cfg = parseComtradeCfg(comtradeCfgText(s), 'rec.cfg');
		const stream = new ComtradeSampleStream(cfg, 'rec.cfg', 'rec.dat', {}, collector().sink);
		const dat = comtradeDatBytes(s);
		stream.push(dat.subarray(0, dat.length - 100));
		expect(() => stream.end()).toThrow(/dat-too-short/);
	});
});
