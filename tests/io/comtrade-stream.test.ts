/**
 * The binary COMTRADE stream reader (dat-stream.ts, through ComtradeSampleStream) on records built byte by
 * byte here: values scaled by a·x + b, the 'missing' marks (int16 0x8000, int32 0x80000000, FLOAT32 NaN
 * and ±Infinity) as NaN and counted, and sample numbers that skip, whatever the chunking: every split of
 * the .dat into two pushes, chunks of 1 byte and more, chunks that start at an odd byte address.
 * Record layout: uint32 sample number, uint32 time stamp, the analog values, little-endian (IEEE
 * C37.111-1999, data file, binary records; from memory, as docs/methods.md §8.2). The expected values are
 * worked by hand: a = 0.5 and b = −1 are exact in binary, so a·x + b is exact for every x below.
 */
import { describe, expect, it } from 'vitest';
import type { Diagnostic } from '../../lib/capture.js';
import { parseComtradeCfg } from '../../lib/io/comtrade/cfg.js';
import { readComtradeDat, sampleNumberBreaks } from '../../lib/io/comtrade/dat.js';
import { ComtradeSampleStream } from '../../lib/io/comtrade/sample-stream.js';
import type { SampleStreamHeader } from '../../lib/io/csv/sample-stream.js';

type BinType = 'BINARY' | 'BINARY32' | 'FLOAT32' | 'ASCII';

/** A 1999 .cfg of two voltage channels (a = 0.5, b = −1 and a = 2, b = 0), 1000 Hz, `records` records. */
function cfgText(type: BinType, records: number): string {
	return [
		'Tallowmere Joinery,stream-test,1999',
		'2,2A,0D',
		'1,U1,L1,,V,0.5,-1,0,-32767,32767,1,1,P',
		'2,U2,L2,,V,2,0,0,-32767,32767,1,1,P',
		'50',
		'1',
		`1000,${records}`,
		'01/02/2026,10:00:00.000000',
		'01/02/2026,10:00:00.000000',
		type,
		'1',
		'',
	].join('\r\n');
}

/** Records (sample number, value of U1, value of U2) as the bytes of a .dat of `type`. */
function datBytes(type: BinType, records: [number, number, number][]): Uint8Array {
	const size = type === 'BINARY' ? 2 : 4;
	const rb = 8 + 2 * size;
	const out = new Uint8Array(records.length * rb);
	const v = new DataView(out.buffer);
	records.forEach(([n, x, y], r) => {
		v.setUint32(r * rb, n, true);
		v.setUint32(r * rb + 4, r, true);
		for (const [k, val] of [x, y].entries()) {
			const at = r * rb + 8 + k * size;
			if (type === 'BINARY') v.setInt16(at, val, true);
			else if (type === 'BINARY32') v.setInt32(at, val, true);
			else v.setFloat32(at, val, true);
		}
	});
	return out;
}

/** Streams `chunks` through a ComtradeSampleStream; returns the two channels and the late diagnostics. */
function stream(type: BinType, declared: number, chunks: Uint8Array[]): { u: number[][]; late: Diagnostic[] } {
	const cfg = parseComtradeCfg(cfgText(type, declared), 'rec.cfg');
	const u: number[][] = [[], []];
	let header: SampleStreamHeader | undefined;
	const s = new ComtradeSampleStream(
		cfg,
		'rec.cfg',
		'rec.dat',
		{},
		{
			start: (h) => (header = h),
			samples: (cols, n) => cols.forEach((c, k) => u[k].push(...c.subarray(0, n))),
		},
	);
	for (const c of chunks) s.push(c);
	const late = s.end();
	expect(header?.sampleRateHz).toBe(1000);
	return { u, late };
}

/** The bytes split at `at`, each part copied to an odd byte address of a larger buffer (unaligned views). */
function splitUnaligned(bytes: Uint8Array, at: number): Uint8Array[] {
	return [bytes.subarray(0, at), bytes.subarray(at)].map((part) => {
		const host = new Uint8Array(part.length + 3);
		host.set(part, 1);
		return host.subarray(1, 1 + part.length);
	});
}

const MISSING: Record<Exclude<BinType, 'ASCII'>, number> = { BINARY: -0x8000, BINARY32: -0x80000000, FLOAT32: NaN };
/** Sample numbers 1 2 3 5 6 7 (one break, at record 4, 1-based), U1 and U2 raw values with a missing mark each. */
function records(type: Exclude<BinType, 'ASCII'>): [number, number, number][] {
	const m = MISSING[type];
	return [
		[1, 0, 0],
		[2, 32767, -3],
		[3, -32767, m],
		[5, m, 7],
		[6, -1, -32767],
		[7, 3, 1],
	];
}

// a·x + b by hand: U1 = 0.5·x − 1, U2 = 2·x
const U1 = [-1, 16382.5, -16384.5, NaN, -1.5, 0.5];
const U2 = [0, -6, NaN, 14, -65534, 2];

describe('ComtradeSampleStream, binary records split across pushes', () => {
	for (const type of ['BINARY', 'BINARY32', 'FLOAT32'] as const) {
		const bytes = datBytes(type, records(type));
		it(`${type}: every split point into two pushes at odd addresses gives the hand-worked values`, () => {
			for (let at = 0; at <= bytes.length; at++) {
				const { u, late } = stream(type, 6, splitUnaligned(bytes, at));
				expect(u[0]).toEqual(U1);
				expect(u[1]).toEqual(U2);
				const missing = late.filter((d) => d.code === 'comtrade-missing-values').map((d) => d.message);
				expect(missing).toEqual([
					'Channel U1: 1 of 6 values are marked missing in the data; they are NaN.',
					'Channel U2: 1 of 6 values are marked missing in the data; they are NaN.',
				]);
				const br = late.find((d) => d.code === 'comtrade-sample-number-break');
				expect(br?.message).toContain('from record 4 of rec.dat, 1 place(s) in all');
			}
		});

		it(`${type}: chunks of 1 to 25 bytes give the same values`, () => {
			for (let size = 1; size <= 25; size++) {
				const chunks: Uint8Array[] = [];
				for (let p = 0; p < bytes.length; p += size) chunks.push(bytes.slice(p, p + size));
				expect(stream(type, 6, chunks).u).toEqual([U1, U2]);
			}
		});
	}

	it('ASCII (missing mark 99999): every split point and 1- to 25-byte chunks give the hand-worked values', () => {
		const text = records('BINARY')
			.map(([n, x, y], r) => [n, r, x, y].map((v) => (v === -0x8000 ? 99999 : v)).join(','))
			.join('\r\n');
		const bytes = new TextEncoder().encode(`${text}\r\n`);
		const splits = [...Array(bytes.length + 1).keys()].map((at) => splitUnaligned(bytes, at));
		for (let size = 1; size <= 25; size++) {
			const chunks: Uint8Array[] = [];
			for (let p = 0; p < bytes.length; p += size) chunks.push(bytes.slice(p, p + size));
			splits.push(chunks);
		}
		for (const chunks of splits) {
			const { u, late } = stream('ASCII', 6, chunks);
			expect(u).toEqual([U1, U2]);
			expect(late.filter((d) => d.code === 'comtrade-missing-values').length).toBe(2);
		}
	});

	it('FLOAT32: +Infinity and -Infinity are missing too', () => {
		const bytes = datBytes('FLOAT32', [
			[1, Infinity, -0],
			[2, -Infinity, 1.25],
		]);
		const { u, late } = stream('FLOAT32', 2, [bytes]);
		expect(u).toEqual([
			[NaN, NaN],
			[0, 2.5],
		]);
		expect(late.find((d) => d.code === 'comtrade-missing-values')?.message).toContain('U1: 2 of 2');
	});

	it('the whole-file reader keeps every raw value bit for bit (FLOAT32 -0 stays -0, before a·x + b)', () => {
		const cfg = parseComtradeCfg(cfgText('FLOAT32', 2), 'rec.cfg');
		const bytes = datBytes('FLOAT32', [
			[1, -0, 1e-40],
			[2, -3.5, 65504],
		]);
		const host = new Uint8Array(bytes.length + 1);
		host.set(bytes, 1);
		const dat = readComtradeDat(cfg, host.subarray(1), 'rec.dat', 2);
		expect(Object.is(dat.raw[0][0], -0)).toBe(true);
		// 1e-40 is subnormal in single precision: the float32 nearest to it, read exactly
		expect(Array.from(dat.raw[1])).toEqual([Math.fround(1e-40), 65504]);
		expect(dat.raw[0][1]).toBe(-3.5);
		expect(Array.from(dat.stamps)).toEqual([0, 1]);
	});

	it('a sample-number break exactly at a push boundary is found (records 1 2 | 4 5)', () => {
		const bytes = datBytes('BINARY', [
			[1, 0, 0],
			[2, 0, 0],
			[4, 0, 0],
			[5, 0, 0],
		]);
		const { late } = stream('BINARY', 4, [bytes.subarray(0, 24), bytes.subarray(24)]);
		expect(late.find((d) => d.code === 'comtrade-sample-number-break')?.message).toContain(
			'from record 3 of rec.dat, 1 place(s) in all',
		);
	});

	it('records past the declared count are counted, not read: their missing marks and breaks are not reported', () => {
		const bytes = datBytes('BINARY', [
			[1, 2, 4],
			[2, 4, 6],
			[9, -0x8000, -0x8000],
		]);
		for (let at = 0; at <= bytes.length; at++) {
			const { u, late } = stream('BINARY', 2, splitUnaligned(bytes, at));
			expect(u).toEqual([
				[0, 1],
				[8, 12],
			]);
			expect(late.map((d) => d.code)).toEqual(['comtrade-extra-records']);
			expect(late[0].message).toContain('1 record(s) past the 2');
		}
	});

	it('many blocks: 10,000 records with one missing value in the third block of 4096 and a break in the second', () => {
		const recs: [number, number, number][] = Array.from({ length: 10_000 }, (_, r) => [
			r + 1 + (r >= 5000 ? 1 : 0),
			(r % 200) - 100,
			r === 9000 ? -0x8000 : 1,
		]);
		const bytes = datBytes('BINARY', recs);
		const { u, late } = stream('BINARY', 10_000, [bytes.subarray(0, 77_777), bytes.subarray(77_777)]);
		for (const r of [0, 4095, 4096, 8191, 8192, 9999]) expect(u[0][r]).toBe(0.5 * ((r % 200) - 100) - 1);
		expect(u[1][9000]).toBeNaN();
		expect(u[1][8999]).toBe(2);
		expect(late.find((d) => d.code === 'comtrade-missing-values')?.message).toContain('U2: 1 of 10000');
		expect(late.find((d) => d.code === 'comtrade-sample-number-break')?.message).toContain('from record 5001');
	});
});

describe('sampleNumberBreaks (uint32 sample numbers, no wrap-around)', () => {
	const view = (ns: number[]) => {
		const v = new DataView(new ArrayBuffer(ns.length * 8));
		ns.forEach((n, r) => v.setUint32(r * 8, n, true));
		return v;
	};
	it('2^31 − 1 then 2^31 runs on (no break where int32 would overflow)', () => {
		expect(sampleNumberBreaks(view([0x7ffffffe, 0x7fffffff, 0x80000000, 0x80000001]), 4, 8, -1)).toEqual({
			breaks: 0,
			first: -1,
			last: 0x80000001,
		});
	});
	it('0 after 0xFFFFFFFF is a break (the next uint32 would be 2^32)', () => {
		expect(sampleNumberBreaks(view([0xfffffffe, 0xffffffff, 0, 1]), 4, 8, -1)).toEqual({
			breaks: 1,
			first: 2,
			last: 1,
		});
	});
	it('the first record is checked against the previous block when one is given', () => {
		expect(sampleNumberBreaks(view([10, 11]), 2, 8, 8).breaks).toBe(1);
		expect(sampleNumberBreaks(view([10, 11]), 2, 8, 9).breaks).toBe(0);
		expect(sampleNumberBreaks(view([0x80000000]), 1, 8, 0x7fffffff).breaks).toBe(0);
	});
});
