// Fuzzing the CSV reader (fast-check): random bytes, CSV-like text, truncations and byte mutations of
// valid files. The only allowed outcomes are a well-formed Capture or an ImportError. A hang is caught by
// vitest's test timeout; speed is measured in the benches, not here.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CsvStreamReader, parseCsv } from '../../lib/io/csv/index.js';
import { ImportError } from '../../lib/io/import-error.js';
import { sampleCount, type Capture } from '../../lib/capture.js';

const VALID = [
	'Time (ms);U1 (V);I1 [mA]\r\n0,0;0,707;-3,25\r\n0,1;1,5;2\r\n0,2;2,5;3\r\n0,3;2,75;3,5\r\n',
	'# Sample rate: 10 kHz\n# Start: 2031-05-14 09:30:00\nUL1,UL2,UL3\n1,2,3\n4,5,6\n7,8,9\n',
	'"t (s)","U1 (V)"\n"0","1.5"\n"0.001","-2"\n"0.002","2.5e1"\n',
	'Sample interval;0,2;ms\nU1 scale;0,5;V\nSample;U1 (counts)\n0;100\n1;200\n2;300\n',
	'  time   U1   I1\n  0.000  1.0  2.0\n  0.001  1.5  2.5\n  0.002  NaN  3.0\n',
	't [s]\tU1 [V]\tU2 [kV]\t\n0\t1,5\t0,2\t\n0,001\t2,5\t0,3\t\n',
	'Date;Time;U1 [V]\n14.05.2031;23:59:59,998;1,5\n14.05.2031;23:59:59,999;2\n15.05.2031;00:00:00,000;3\n',
	'Timestamp;U1 [V]\n2031-05-14 23:59:59,9990;1,5\n2031-05-14 23:59:59,9995;2\n2031-05-15 00:00:00,0000;3\n',
];

// Codes that concern a whole line or the whole file and so carry column 0 (import-error.ts: "0 when the
// error concerns the whole line or file"); every other code points at a cell, column 1 or more.
const WHOLE_LINE_CODES = ['empty-file', 'no-data', 'no-time-base'];

function check(run: () => Capture): void {
	let capture: Capture | undefined;
	try {
		capture = run();
	} catch (e) {
		if (!(e instanceof ImportError)) throw e;
		expect(e.expected.length).toBeGreaterThan(0);
		if (e.code === 'binary-as-text') {
			// binary input: line 0 and column = byte offset + 1 (import-error.ts)
			expect(e.line).toBe(0);
			expect(e.column).toBeGreaterThanOrEqual(1);
		} else {
			// no options are given here, so 'bad-option' (line 0) cannot occur
			expect(e.line).toBeGreaterThanOrEqual(1);
			if (WHOLE_LINE_CODES.includes(e.code)) expect(e.column).toBeGreaterThanOrEqual(0);
			else expect(e.column).toBeGreaterThanOrEqual(1);
		}
	}
	if (capture) {
		const n = sampleCount(capture);
		expect(capture.channels.length).toBeGreaterThan(0);
		for (const ch of capture.channels) expect(ch.samples.length).toBe(n);
		expect(capture.sampleRateHz).toBeGreaterThan(0);
		expect(Number.isFinite(capture.sampleRateHz)).toBe(true);
		if (capture.timeS) expect(capture.timeS.length).toBe(n);
		for (const d of capture.diagnostics) expect(['info', 'assumption', 'warning']).toContain(d.severity);
	}
}

const enc = (s: string) => new TextEncoder().encode(s);
const validBytes = fc.constantFrom(...VALID.map(enc));

describe('CSV reader fuzz', () => {
	it('parseCsv(random bytes) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(fc.uint8Array({ maxLength: 3000 }), (b) => check(() => parseCsv(b, 'f.csv'))),
			{ numRuns: 400 },
		);
	});

	it('parseCsv(random CSV-like text) returns a capture or throws ImportError', () => {
		const unit = fc.constantFrom(
			...'0123456789012345678901234567890123456789,,,;;\t  \n\n\r..--eE"aV()[]#:=µ'.split(''),
		);
		fc.assert(
			fc.property(fc.string({ unit, maxLength: 600 }), (s) => check(() => parseCsv(s, 'f.csv'))),
			{ numRuns: 600 },
		);
	});

	it('parseCsv(valid files cut at any byte) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(validBytes, fc.nat(), (b, k) => check(() => parseCsv(b.subarray(0, k % (b.length + 1)), 'f.csv'))),
			{ numRuns: 400 },
		);
	});

	it('parseCsv(valid files with bytes replaced, inserted or deleted) returns a capture or throws ImportError', () => {
		const edit = fc.tuple(fc.constantFrom('set', 'insert', 'delete'), fc.nat(), fc.integer({ min: 0, max: 255 }));
		fc.assert(
			fc.property(validBytes, fc.array(edit, { minLength: 1, maxLength: 6 }), (b, edits) => {
				const bytes = Array.from(b);
				for (const [op, at, v] of edits) {
					const i = at % (bytes.length + 1);
					if (op === 'set' && i < bytes.length) bytes[i] = v;
					else if (op === 'insert') bytes.splice(i, 0, v);
					else bytes.splice(i, 1);
				}
				check(() => parseCsv(Uint8Array.from(bytes), 'f.csv'));
			}),
			{ numRuns: 600 },
		);
	});

	it('CsvStreamReader(any chunking) gives the same capture, or the same error, as the whole input', () => {
		fc.assert(
			fc.property(validBytes, fc.array(fc.nat(), { maxLength: 8 }), fc.nat(), (b, cuts, k) => {
				const bytes = b.subarray(0, b.length - (k % 3)); // sometimes no final line break
				const whole = outcome(() => parseCsv(bytes, 'f.csv'));
				const points = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((x, y) => x - y);
				const chunked = outcome(() => {
					const r = new CsvStreamReader('f.csv');
					let from = 0;
					for (const p of [...points, bytes.length]) {
						r.push(bytes.slice(from, p));
						from = p;
					}
					return r.finish();
				});
				expect(chunked).toEqual(whole);
			}),
			{ numRuns: 300 },
		);
	});
});

function outcome(run: () => Capture): unknown {
	try {
		const c = run();
		return {
			...c,
			channels: c.channels.map((ch) => ({ ...ch, samples: Array.from(ch.samples) })),
			timeS: c.timeS && Array.from(c.timeS),
		};
	} catch (e) {
		if (!(e instanceof ImportError)) throw e;
		return { code: e.code, line: e.line, column: e.column, text: e.text };
	}
}
