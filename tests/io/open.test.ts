import { readFileSync } from 'node:fs';
import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import { ImportError, openCapture, openCaptures, openCsvChunks, type InputFile } from '../../lib/index.js';
import { comtradeCffBytes, type WriterSpec } from '../../sample-waves/writers/comtrade.js';

const fx = (path: string, name = path.split('/').pop()!): InputFile => ({
	name,
	bytes: new Uint8Array(readFileSync('tests/fixtures/' + path)),
});
const enc = new TextEncoder();
const { WaveFile } = wavefile as unknown as {
	WaveFile: new () => {
		fromScratch(ch: number, rate: number, depth: string, s: number[]): void;
		toBuffer(): Uint8Array;
	};
};
function wavBytes(): Uint8Array {
	const w = new WaveFile();
	w.fromScratch(1, 4000, '16', [0, 16384, 0, -16384]);
	return w.toBuffer();
}
const cffSpec: WriterSpec = {
	station: 'Mill',
	device: 'r1',
	revYear: 2013,
	lineFrequencyHz: 50,
	rates: [{ sampleRateHz: 1000, endSample: 3 }],
	firstData: '01/01/2026,00:00:00.000000',
	trigger: '01/01/2026,00:00:00.000000',
	fileType: 'ASCII',
	analog: [{ name: 'IA', unit: 'A', values: [1, 2, 3] }],
};

describe('openCaptures', () => {
	it('openCaptures pairs a .cfg with the .dat of the same base name in another case', () => {
		const { captures, errors } = openCaptures([
			fx('comtrade/good-1999.cfg', 'rec/Good.CFG'),
			fx('comtrade/good-1999.dat', 'rec/good.dat'),
		]);
		expect(errors).toEqual([]);
		expect(captures.map((c) => c.source)).toEqual(['rec/Good.CFG']);
		expect(captures[0].channels.map((c) => c.name)).toEqual(['U1', 'I1']);
	});

	it('openCaptures reports a lone .cfg and a lone .dat as missing-companion-file (line 0, column 0)', () => {
		const { captures, errors } = openCaptures([fx('comtrade/lone.cfg'), fx('comtrade/good-1999.dat', 'orphan.dat')]);
		expect(captures).toEqual([]);
		expect(errors.map((e) => [e.code, e.source, e.line, e.column])).toEqual([
			['missing-companion-file', 'lone.cfg', 0, 0],
			['missing-companion-file', 'orphan.dat', 0, 0],
		]);
		expect(errors[0].message).toContain('lone.dat');
	});

	it('openCaptures keeps going past a bad file and returns the others in input order', () => {
		const files: InputFile[] = [
			{ name: 'broken.wav', bytes: enc.encode('not a wave') },
			fx('comtrade/good-1999.cfg'),
			{ name: 'clamp.wav', bytes: wavBytes() },
			fx('comtrade/err-dat-syntax.cfg'),
			fx('comtrade/err-dat-syntax.dat'),
			fx('comtrade/good-1999.dat'),
		];
		const { captures, errors } = openCaptures(files);
		expect(captures.map((c) => c.source)).toEqual(['good-1999.cfg', 'clamp.wav']);
		expect(errors.map((e) => [e.source, e.code])).toEqual([
			['broken.wav', 'bad-wav'],
			['err-dat-syntax.dat', 'dat-syntax'],
		]);
		for (const e of errors) expect(e).toBeInstanceOf(ImportError);
	});

	it('openCaptures recognises a WAV and a CFF by their content whatever the extension', () => {
		const { captures, errors } = openCaptures([
			{ name: 'rec.bin', bytes: wavBytes() },
			{ name: 'relay.rec', bytes: comtradeCffBytes(cffSpec) },
			{ name: 'relay.CFF', bytes: comtradeCffBytes(cffSpec) },
		]);
		expect(errors).toEqual([]);
		expect(captures.map((c) => [c.source, c.sampleRateHz, c.channels.length])).toEqual([
			['rec.bin', 4000, 1],
			['relay.rec', 1000, 1],
			['relay.CFF', 1000, 1],
		]);
	});

	it('openCaptures reads .csv, .txt and .tsv with the CSV reader', () => {
		const { captures, errors } = openCaptures([
			{ name: 'a.csv', bytes: enc.encode('t (s),U1 (V)\n0,1\n0.001,2\n0.002,3\n') },
			{ name: 'b.TXT', bytes: enc.encode('t (s);I1 (A)\n0;1,5\n0,001;2,5\n0,002;3,5\n') },
			{ name: 'c.tsv', bytes: enc.encode('t (s)\tU2 (V)\n0\t1\n0.001\t2\n0.002\t3\n') },
		]);
		expect(errors).toEqual([]);
		expect(captures.map((c) => [c.channels[0].name, c.channels[0].unit])).toEqual([
			['U1', 'V'],
			['I1', 'A'],
			['U2', 'V'],
		]);
		for (const c of captures) expect(c.sampleRateHz).toBeCloseTo(1000, 6);
	});

	it('openCaptures refuses an empty file and an unknown binary file with typed errors', () => {
		const { errors } = openCaptures([
			{ name: 'empty.csv', bytes: new Uint8Array(0) },
			{ name: 'photo.jpg', bytes: new Uint8Array([0xff, 0xd8, 0, 0, 1]) },
		]);
		expect(errors.map((e) => e.code)).toEqual(['empty-file', 'unsupported-format']);
	});

	it('openCaptures attaches a .hdr of the same base name to the COMTRADE capture metadata', () => {
		const { captures } = openCaptures([
			fx('comtrade/good-1999.cfg'),
			fx('comtrade/good-1999.dat'),
			{ name: 'good-1999.hdr', bytes: enc.encode('Incomer test, relay 3\n') },
		]);
		expect(captures[0].metadata['comtrade.hdr']).toBe('Incomer test, relay 3');
	});

	it('openCaptures passes per-format options on (COMTRADE secondary values)', () => {
		const { captures } = openCaptures([fx('comtrade/good-1999.cfg'), fx('comtrade/good-1999.dat')], {
			comtrade: { values: 'secondary' },
		});
		// U1 raw 100 × 0.01 kV = 1 kV primary; VT 11000:110 -> 10 V secondary
		expect(captures[0].channels[0].samples[0]).toBeCloseTo(10, 9);
	});
});

describe('openCapture', () => {
	it('openCapture(cfg, [dat]) returns the capture; openCapture(cfg) throws missing-companion-file', () => {
		expect(openCapture(fx('comtrade/good-1999.cfg'), [fx('comtrade/good-1999.dat')]).channels).toHaveLength(2);
		expect(() => openCapture(fx('comtrade/good-1999.cfg'))).toThrow(ImportError);
		try {
			openCapture(fx('comtrade/good-1999.cfg'));
		} catch (e) {
			expect((e as ImportError).code).toBe('missing-companion-file');
		}
	});
});

describe('openCsvChunks: one CSV fed in pieces', () => {
	// 3 cycles of 50 Hz at 1 kS/s, mV in the file: each sample must equal Number(cell) / 1000 as openCapture reads it
	const rows = Array.from(
		{ length: 60 },
		(_, i) =>
			`${(i / 1000).toFixed(3).replace('.', ',')};${(325e3 * Math.sin((2 * Math.PI * 50 * i) / 1000)).toFixed(1).replace('.', ',')}`,
	);
	const text = `Zeit (s);U1 (mV)\n${rows.join('\n')}\n`;
	const bytes = enc.encode(text);
	const inPieces = (sizes: number[]) => (push: (c: Uint8Array) => void) => {
		const buf = new Uint8Array(64); // one reused buffer, as the CLI feeds it
		for (let at = 0, k = 0; at < bytes.length; k++) {
			const n = Math.min(sizes[k % sizes.length], buf.length, bytes.length - at);
			buf.set(bytes.subarray(at, at + n));
			push(buf.subarray(0, n));
			at += n;
		}
	};

	it('openCsvChunks(file in 1..64-byte pieces through one reused buffer) gives the capture openCapture gives for the whole bytes', () => {
		const whole = openCapture({ name: 'board.dat.txt', bytes }, [], {
			settings: { channels: { U1: { probeRatio: 10 } } },
		});
		for (const sizes of [[1], [7, 64, 3], [64]]) {
			const c = openCsvChunks('board.dat.txt', bytes.length, inPieces(sizes), {
				settings: { channels: { U1: { probeRatio: 10 } } },
			});
			expect(c.format).toBe('csv');
			expect(c.sampleRateHz).toBe(whole.sampleRateHz);
			expect(Array.from(c.channels[0].samples)).toEqual(Array.from(whole.channels[0].samples));
			expect(c.diagnostics.map((d) => d.code)).toEqual(whole.diagnostics.map((d) => d.code));
		}
		// the values themselves: Number(cell with a point) mV to V (/1000), probe x10: Number(cell) / 100 within rounding
		const cell = Number(rows[7].split(';')[1].replace(',', '.'));
		expect(Math.abs(whole.channels[0].samples[7] - cell / 100)).toBeLessThanOrEqual(1e-15 * Math.abs(cell));
	});

	it('openCsvChunks(a file with a bad cell) throws the ImportError openCapture throws: same line, column and code', () => {
		const bad = enc.encode('t (s),U1 (V)\n0,1\n0.001,2x\n');
		const expectedError = (() => {
			try {
				openCapture({ name: 'bad.csv', bytes: bad });
			} catch (e) {
				return e as ImportError;
			}
		})()!;
		expect(expectedError).toBeInstanceOf(ImportError);
		expect(() => openCsvChunks('bad.csv', bad.length, (push) => push(bad))).toThrowError(
			expect.objectContaining({ line: 3, column: expectedError.column, code: 'bad-number' }),
		);
		expect(expectedError.line).toBe(3);
	});
});
