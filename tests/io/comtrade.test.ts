import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseComtrade, parseComtradeCff } from '../../lib/index.js';
import {
	comtradeCffBytes,
	comtradeCfgText,
	comtradeDatBytes,
	type WriterSpec,
} from '../../sample-waves/writers/comtrade.js';
import { importErrorOf } from '../helpers/import-error.js';

const FIX = 'tests/fixtures/comtrade/';
const text = (name: string) => readFileSync(FIX + name, 'utf8');
const bytes = (name: string) => new Uint8Array(readFileSync(FIX + name));
const enc = (s: string) => new TextEncoder().encode(s);
const open = (base: string, opts = {}) => parseComtrade(text(base + '.cfg'), bytes(base + '.dat'), base + '.cfg', opts);

const thrown = importErrorOf;

describe('parseComtrade on a hand-written 1999 ASCII record (tests/fixtures/comtrade/good-1999)', () => {
	// Expected values worked by hand from the fixture text: value = a·x + b, then the PS conversion
	// (C37.111-1999, analog channel line, from memory: PS says which side a·x+b gives).
	const c = open('good-1999');

	it('parseComtrade(good-1999) applies a·x+b and kV -> V ×1000 on a primary (P) channel', () => {
		// U1: a = 0.01 kV, b = 0: raw 100 -> 1 kV = 1000 V; raw -50 -> -500 V; raw 0 -> 0 V
		const u1 = c.channels[0];
		expect(u1.name).toBe('U1');
		expect(u1.unit).toBe('V');
		expect(u1.quantity).toBe('voltage');
		expect(u1.samples[0]).toBeCloseTo(1000, 9);
		expect(u1.samples[1]).toBeCloseTo(-500, 9);
		expect(u1.samples[2]).toBe(0);
	});

	it('parseComtrade(good-1999) reports the ASCII missing value 99999 as NaN with a warning', () => {
		expect(c.channels[0].samples[3]).toBeNaN();
		const d = c.diagnostics.find((x) => x.code === 'comtrade-missing-values');
		expect(d?.severity).toBe('warning');
		expect(d?.message).toContain('1 of 4');
	});

	it('parseComtrade(good-1999) converts a secondary (S) channel to primary with ×primary/secondary', () => {
		// I1: a = 0.5, b = -1 secondary A, CT 200:5 -> ×40: raw 10 -> 4 A sec -> 160 A; 20 -> 360; 30 -> 560; 40 -> 760
		expect(Array.from(c.channels[1].samples)).toEqual([160, 360, 560, 760].map((v) => expect.closeTo(v, 9)));
		expect(c.channels[1].scaling?.factor).toBeCloseTo(0.5 * 40, 12);
		expect(c.diagnostics.some((d) => d.code === 'comtrade-values' && /primary/.test(d.message))).toBe(true);
	});

	it('parseComtrade(good-1999, { values: secondary }) gives what the instrument saw', () => {
		const s = open('good-1999', { values: 'secondary' });
		// U1 is primary in the file: 1000 V × 110/11000 = 10 V; I1 is secondary already: 4, 9, 14, 19 A
		expect(s.channels[0].samples[0]).toBeCloseTo(10, 9);
		expect(Array.from(s.channels[1].samples)).toEqual([4, 9, 14, 19].map((v) => expect.closeTo(v, 9)));
	});

	it('parseComtrade(good-1999) keeps rate, lf, start relative to the trigger and the digital channel', () => {
		expect(c.sampleRateHz).toBe(1000);
		expect(c.timeS).toBeUndefined();
		expect(c.nominalFrequencyHz).toBe(50);
		// first data 10:00:00.000000, trigger 10:00:00.002000, first stamp 0: the record starts 2 ms before the trigger
		expect(c.startS).toBeCloseTo(-0.002, 12);
		expect(c.startTime).toBe('2026-02-01T10:00:00.000000');
		expect(c.channels[0].phase).toBe('L1');
		expect(c.digital?.[0].name).toBe('breaker');
		expect(c.digital?.[0].normalState).toBe(0);
		expect(Array.from(c.digital![0].states)).toEqual([0, 0, 1, 1]);
		expect(c.metadata['comtrade.station']).toBe('Sawpit Lane');
	});

	it('parseComtrade reads a .cfg whose every line ends in a comma like the plain one', () => {
		const commas = text('good-1999.cfg').replace(/\n/g, ',\n');
		const t = parseComtrade(commas, bytes('good-1999.dat'), 'commas.cfg');
		expect(t.channels.map((ch) => Array.from(ch.samples))).toEqual(c.channels.map((ch) => Array.from(ch.samples)));
		expect([t.sampleRateHz, t.startS, t.digital?.length, t.metadata['comtrade.timemult']]).toEqual([
			c.sampleRateHz,
			c.startS,
			1,
			'1',
		]);
	});

	it('parseComtrade reads LF and CRLF versions of the same record identically', () => {
		const crlf = parseComtrade(
			text('good-1999.cfg').replace(/\n/g, '\r\n'),
			new TextEncoder().encode(text('good-1999.dat').replace(/\n/g, '\r\n')),
			'x.cfg',
		);
		expect(crlf.channels.map((ch) => Array.from(ch.samples))).toEqual(c.channels.map((ch) => Array.from(ch.samples)));
		expect(crlf.diagnostics.some((d) => d.code === 'comtrade-lf-line-ends')).toBe(false);
		expect(c.diagnostics.some((d) => d.code === 'comtrade-lf-line-ends')).toBe(true);
	});
});

describe('parseComtrade on binary records built byte by byte in the test', () => {
	// BINARY layout (IEEE C37.111, docs/methods.md §8.2: read in a secondary source, python-comtrade's reader): uint32 n, uint32 stamp,
	// int16 per analog, uint16 per 16 digital channels, little-endian.
	const cfg = [
		'Bench,rig,1999',
		'2,1A,1D',
		'1,Ia,A,feeder,A,0.001,0.5,0,-32767,32767,100,1,P',
		'1,trip,,,1',
		'60',
		'1',
		'2000,3',
		'05/03/2026,12:00:00.000000',
		'05/03/2026,12:00:00.000000',
		'BINARY',
		'1',
		'',
	].join('\r\n');
	const record = (n: number, stamp: number, value: number, bits: number) => {
		const b = new Uint8Array(12);
		const v = new DataView(b.buffer);
		v.setUint32(0, n, true);
		v.setUint32(4, stamp, true);
		v.setInt16(8, value, true);
		v.setUint16(10, bits, true);
		return [...b];
	};
	const dat = new Uint8Array([...record(1, 0, 1000, 1), ...record(2, 500, -0x8000, 0), ...record(3, 1000, -2000, 1)]);

	it('parseComtrade(BINARY) decodes int16 values, 0x8000 as missing and LSB-first status bits', () => {
		const c = parseComtrade(cfg, dat, 'bin.cfg');
		// 0.001 × 1000 + 0.5 = 1.5 A; 0.001 × (-2000) + 0.5 = -1.5 A
		expect(c.channels[0].samples[0]).toBeCloseTo(1.5, 12);
		expect(c.channels[0].samples[1]).toBeNaN();
		expect(c.channels[0].samples[2]).toBeCloseTo(-1.5, 12);
		expect(Array.from(c.digital![0].states)).toEqual([1, 0, 1]);
		expect(c.digital![0].normalState).toBe(1);
		expect(c.sampleRateHz).toBe(2000);
		expect(c.startS).toBe(0);
		expect(c.channels[0].phase).toBe('A');
	});

	it('parseComtrade(BINARY) shorter than the cfg says throws dat-too-short at byte offset = length + 1', () => {
		const e = thrown(() => parseComtrade(cfg, dat.subarray(0, 30), 'bin.cfg'));
		expect(e.code).toBe('dat-too-short');
		expect(e.source).toBe('bin.dat');
		expect([e.line, e.column]).toEqual([0, 31]);
	});
});

function spec(fileType: WriterSpec['fileType'], extra: Partial<WriterSpec> = {}): WriterSpec {
	const n = 64;
	const va = Float64Array.from({ length: n }, (_, k) => 325 * Math.sin((2 * Math.PI * k) / 32));
	const ia = Float64Array.from({ length: n }, (_, k) => 14 * Math.sin((2 * Math.PI * k) / 32 - 0.5));
	return {
		station: 'Kiln Yard',
		device: 'relay-7',
		revYear: 2013,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 1600, endSample: n }],
		firstData: '01/03/2026,08:00:00.000000',
		trigger: '01/03/2026,08:00:00.010000',
		fileType,
		analog: [
			{ name: 'VA', unit: 'V', values: va },
			{ name: 'IA', unit: 'A', values: ia },
		],
		digital: Array.from({ length: 17 }, (_, d) => ({
			name: `S${d + 1}`,
			states: Array.from({ length: n }, (_, k) => (k >> (d % 5)) & 1),
		})),
		...extra,
	};
}

describe('parseComtrade round trip through the writer in sample-waves/writers', () => {
	for (const ft of ['ASCII', 'BINARY', 'BINARY32', 'FLOAT32'] as const) {
		it(`parseComtrade(${ft}) returns the written signal within one quantisation step a/2`, () => {
			const s = spec(ft);
			const cfgText = comtradeCfgText(s);
			const c = parseComtrade(cfgText, comtradeDatBytes(s), 'rt.cfg');
			// the multiplier a is field 6 of each analog line of the written .cfg
			const a = cfgText
				.split('\r\n')
				.slice(2, 4)
				.map((l) => Number(l.split(',')[5]));
			s.analog.forEach((ch, i) => {
				const tol = ft === 'FLOAT32' ? 1e-4 * 325 : a[i] / 2 + 1e-9;
				for (let k = 0; k < 64; k++) expect(Math.abs(c.channels[i].samples[k] - ch.values[k])).toBeLessThanOrEqual(tol);
			});
			expect(c.digital).toHaveLength(17);
			for (let d = 0; d < 17; d++) expect(Array.from(c.digital![d].states)).toEqual(Array.from(s.digital![d].states));
			expect(c.startS).toBeCloseTo(-0.01, 12);
		});
	}

	it('parseComtradeCff reads the single-file form with the same content, ASCII and binary', () => {
		for (const ft of ['ASCII', 'BINARY32'] as const) {
			const s = spec(ft);
			const split = parseComtrade(comtradeCfgText(s), comtradeDatBytes(s), 'x.cfg');
			const single = parseComtradeCff(comtradeCffBytes(s, 'header note'), 'x.cff');
			expect(single.channels.map((ch) => Array.from(ch.samples))).toEqual(
				split.channels.map((ch) => Array.from(ch.samples)),
			);
			expect(single.metadata['comtrade.hdr']).toBe('header note');
		}
	});

	it('parseComtrade with nrates = 0 takes the time stamps × timemult as the time base', () => {
		// stamps 0, 100, 250, 450 with timemult 2 -> 0, 200, 500, 900 µs after the first sample
		const s = spec('ASCII', {
			rates: [],
			stampsUs: [0, 100, 250, 450],
			timeMult: 2,
			analog: [{ name: 'VA', unit: 'V', values: [1, 2, 3, 4] }],
			digital: [],
		});
		const c = parseComtrade(comtradeCfgText(s), comtradeDatBytes(s), 'ts.cfg');
		expect(Array.from(c.timeS!)).toEqual([0, 200e-6, 500e-6, 900e-6].map((t) => expect.closeTo(t - 0.01, 12)));
		// mean rate = (N − 1)/(t_last − t_first) = 3 / 900 µs
		expect(c.sampleRateHz).toBeCloseTo(3 / 900e-6, 6);
		expect(c.diagnostics.some((d) => d.code === 'comtrade-time-stamps')).toBe(true);
	});

	it('parseComtrade with two sampling rates keeps each sample at its own time and warns', () => {
		// 4 samples at 1000 Hz then 2 at 250 Hz: times 0, 1, 2, 3, 7, 11 ms from the first sample
		const s = spec('ASCII', {
			rates: [
				{ sampleRateHz: 1000, endSample: 4 },
				{ sampleRateHz: 250, endSample: 6 },
			],
			analog: [{ name: 'VA', unit: 'V', values: [1, 2, 3, 4, 5, 6] }],
			digital: [],
		});
		const c = parseComtrade(comtradeCfgText(s), comtradeDatBytes(s), 'mr.cfg');
		expect(Array.from(c.timeS!)).toEqual([0, 1, 2, 3, 7, 11].map((ms) => expect.closeTo(ms / 1000 - 0.01, 12)));
		expect(c.sampleRateHz).toBeCloseTo(5 / 0.011, 9);
		expect(c.diagnostics.find((d) => d.code === 'comtrade-several-rates')?.severity).toBe('warning');
	});
});

describe('parseComtrade on other revisions and value types', () => {
	it('parseComtrade(1991 .cfg: no revision year, no PS, mm/dd/yy dates, no timemult) reads and says what it assumed', () => {
		const c = open('old-1991');
		// VA: a = 0.5, b = 0: raw 10, 20, -30 -> 5, 10, -15 V
		expect(Array.from(c.channels[0].samples)).toEqual([5, 10, -15]);
		expect(c.channels[0].scaling?.description).toContain('no P/S flag');
		expect(c.diagnostics.find((d) => d.code === 'comtrade-revision-assumed')?.severity).toBe('assumption');
		expect(c.diagnostics.find((d) => d.code === 'comtrade-values')?.severity).toBe('assumption');
		expect(c.diagnostics.some((d) => d.code === 'comtrade-1991-date')).toBe(true);
		// 02/01/91 in the 1991 order mm/dd/yy is 1 February 1991
		expect(c.startTime).toBe('1991-02-01T09:30:00.000');
		expect(c.startS).toBeCloseTo(-0.001, 12);
		expect(c.digital![0]).toMatchObject({ name: 'CB open', normalState: 1 });
	});

	it('parseComtrade(BINARY32, FLOAT32) marks the missing values 0x80000000 and NaN as NaN', () => {
		for (const ft of ['BINARY32', 'FLOAT32'] as const) {
			const s = spec(ft, {
				analog: [{ name: 'VA', unit: 'V', values: [1, NaN, 3, 4], a: 0.5 }],
				digital: [],
				rates: [{ sampleRateHz: 1000, endSample: 4 }],
			});
			const c = parseComtrade(comtradeCfgText(s), comtradeDatBytes(s), 'm.cfg');
			expect(Array.from(c.channels[0].samples)).toEqual([1, NaN, 3, 4]);
			expect(c.diagnostics.find((d) => d.code === 'comtrade-missing-values')?.message).toContain('1 of 4');
		}
	});

	it('parseComtrade(2013 .cfg with 9-digit time stamps) reads the .dat stamps as nanoseconds', () => {
		// stamps 0, 250, 750 ns with nrates = 0; first data 1 µs before the trigger
		const cfg = [
			'Lab,r,2013',
			'1,1A,0D',
			'1,VA,,,V,1,0,0,-99999,99998,1,1,P',
			'50',
			'0',
			'0,3',
			'01/01/2026,00:00:00.000000000',
			'01/01/2026,00:00:00.000001000',
			'ASCII',
			'1',
			'0,0',
			'0,0',
			'',
		].join('\r\n');
		const c = parseComtrade(cfg, enc('1,0,1\r\n2,250,2\r\n3,750,3\r\n'), 'ns.cfg');
		expect(Array.from(c.timeS!)).toEqual([-1e-6, -0.75e-6, -0.25e-6].map((t) => expect.closeTo(t, 15)));
	});

	it('parseComtrade of a .cfg with more channel lines than line 2 declares throws cfg-count-mismatch', () => {
		// good-1999 declares 2A,1D; saying 1A,1D leaves the I1 line where the digital line should be
		const cfg = text('good-1999.cfg').replace('3,2A,1D', '2,1A,1D');
		const e = thrown(() => parseComtrade(cfg, bytes('good-1999.dat'), 'x.cfg'));
		expect([e.code, e.line, e.column]).toEqual(['cfg-count-mismatch', 4, 1]);
	});
});

describe('parseComtrade errors: one fixture per code with its line and column', () => {
	const cases: [string, string, number, (l: string[]) => number][] = [
		// [fixture, code, line, expected column computed from the fixture text]
		['err-cfg-syntax', 'cfg-syntax', 3, (l) => l[2].indexOf('x0.01') + 1],
		['err-cfg-count-total', 'cfg-count-mismatch', 2, () => 1],
		['err-cfg-count-lines', 'cfg-count-mismatch', 5, () => 1], // the digital line where a third analog line should be
		['err-dat-too-short', 'dat-too-short', 5, () => 0], // cfg says 6 records, the .dat ends after line 4
		['err-dat-syntax', 'dat-syntax', 3, (l) => l[2].indexOf('3O') + 1],
		['err-time-not-increasing', 'time-not-increasing', 3, () => 0],
	];
	for (const [base, code, line, column] of cases) {
		it(`parseComtrade(${base}) throws ${code} at line ${line}`, () => {
			const e = thrown(() => open(base));
			const inDat = code.startsWith('dat') || code === 'time-not-increasing';
			const lines = text(base + (inDat ? '.dat' : '.cfg')).split('\n');
			expect(e.code).toBe(code);
			expect(e.source).toBe(base + (inDat ? '.dat' : '.cfg'));
			expect(e.line).toBe(line);
			expect(e.column).toBe(column(lines));
		});
	}

	it('parseComtrade(.dat row errors) point at the column: short row, long row, bad digital state', () => {
		const cfg = text('good-1999.cfg');
		const rows = ['1,0,100,10,0', '2,1000,-50,20,0', '3,2000,0,30,1', '4,3000,5,40,1'];
		const at = (bad: string, k: number) => {
			const r = rows.slice();
			r[k] = bad;
			return thrown(() => parseComtrade(cfg, enc(r.join('\n') + '\n'), 'r.cfg'));
		};
		// short: 4 of 5 fields; the column is just past the end of the line (length 12 + 1)
		expect([at('3,2000,0,30', 2).code, at('3,2000,0,30', 2).line, at('3,2000,0,30', 2).column]).toEqual([
			'dat-syntax',
			3,
			12,
		]);
		// long: a sixth field "7" starts at column 15 of "3,2000,0,30,1,7"
		expect([at('3,2000,0,30,1,7', 2).line, at('3,2000,0,30,1,7', 2).column]).toEqual([3, 15]);
		// digital state 2 at column 13 of "4,3000,5,40,2"
		expect([at('4,3000,5,40,2', 3).line, at('4,3000,5,40,2', 3).column]).toEqual([4, 13]);
	});

	it('parseComtrade warns when sample numbers skip (records missing) and points at the first break', () => {
		const c = parseComtrade(
			text('good-1999.cfg'),
			enc('1,0,100,10,0\n2,1000,-50,20,0\n4,3000,0,30,1\n5,4000,5,40,1\n'),
			'g.cfg',
		);
		const d = c.diagnostics.find((x) => x.code === 'comtrade-sample-number-break');
		expect(d?.severity).toBe('warning');
		expect(d?.message).toContain('line 3 of g.dat');
	});

	it('parseComtrade warns when the time stamps span a different time than the sample rate gives', () => {
		// 4 samples at 1000 Hz span 3 ms; stamps 0 … 6000 µs span 6 ms
		const c = parseComtrade(
			text('good-1999.cfg'),
			enc('1,0,100,10,0\n2,2000,-50,20,0\n3,4000,0,30,1\n4,6000,5,40,1\n'),
			'g.cfg',
		);
		expect(c.diagnostics.find((x) => x.code === 'comtrade-stamps-disagree')?.severity).toBe('warning');
		expect(c.sampleRateHz).toBe(1000);
		expect(
			open('good-1999').diagnostics.some(
				(x) => x.code === 'comtrade-stamps-disagree' || x.code === 'comtrade-sample-number-break',
			),
		).toBe(false);
	});

	it('parseComtrade(.dat with a trailing comma and a blank analog field) reads the row, the blank as missing', () => {
		const c = parseComtrade(
			text('good-1999.cfg'),
			enc('1,0,100,10,0,\r\n2,1000,,20,0\r\n3,2000,0,30,1\r\n4,3000,5,40,1\r\n'),
			'b.cfg',
		);
		expect(c.channels[0].samples[0]).toBeCloseTo(1000, 9);
		expect(c.channels[0].samples[1]).toBeNaN();
		expect(c.channels[0].samples[3]).toBeCloseTo(50, 9);
	});

	it('parseComtrade of a .cfg cut after the channel lines throws cfg-syntax at the line past the end', () => {
		const cut = text('good-1999.cfg').split('\n').slice(0, 6).join('\n');
		const e = thrown(() => parseComtrade(cut, bytes('good-1999.dat'), 'cut.cfg'));
		expect([e.code, e.line]).toEqual(['cfg-syntax', 7]);
	});

	it('parseComtradeCff reports CFG errors with lines counted in the .cff', () => {
		const cff = new TextEncoder().encode(
			'--- file type: CFG ---\n' +
				text('err-cfg-syntax.cfg') +
				'--- file type: DAT ASCII ---\n' +
				text('good-1999.dat'),
		);
		const e = thrown(() => parseComtradeCff(cff, 'x.cff'));
		expect([e.code, e.line]).toEqual(['cfg-syntax', 4]);
	});
});
