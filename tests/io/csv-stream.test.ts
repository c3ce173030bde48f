// The streaming reader on inputs larger than its 64 KiB detection head: chunk boundaries anywhere
// (inside numbers, between CR and LF) must not change a single value; progress reaches the total.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CsvStreamReader, parseCsv } from '../../lib/io/csv/index.js';
import { ImportError } from '../../lib/io/import-error.js';

/** 6000 rows of `t;U1;I1` with a decimal comma and CRLF; the values are written from i by formula. */
function bigFile(): { bytes: Uint8Array; t: number[]; u: number[] } {
	const lines = ['# Recorder: workshop board 2', 'Time (ms);U1 (V);I1 (A)'];
	const t: number[] = [];
	const u: number[] = [];
	for (let i = 0; i < 6000; i++) {
		const ti = (i * 125) / 1000; // 0.125 ms steps = 8 kHz
		const ui = Math.round(325 * Math.sin(i / 10) * 1000) / 1000;
		t.push(ti);
		u.push(ui);
		lines.push(`${String(ti).replace('.', ',')};${String(ui).replace('.', ',')};${i % 7}`);
	}
	return { bytes: new TextEncoder().encode(lines.join('\r\n') + '\r\n'), t, u };
}

describe('CsvStreamReader', () => {
	const big = bigFile();

	it('CsvStreamReader(a file over 64 KiB in random chunks) reads every value as written', () => {
		fc.assert(
			fc.property(fc.array(fc.nat({ max: big.bytes.length }), { minLength: 1, maxLength: 30 }), (cuts) => {
				const points = [...new Set(cuts)].sort((a, b) => a - b);
				const r = new CsvStreamReader('big.csv');
				let from = 0;
				for (const p of [...points, big.bytes.length]) {
					r.push(big.bytes.slice(from, p));
					from = p;
				}
				const c = r.finish();
				expect(Array.from(c.channels[0].samples)).toEqual(big.u);
				expect(c.sampleRateHz).toBeCloseTo(8000, 6);
				expect(c.metadata.Recorder).toBe('workshop board 2');
			}),
			{ numRuns: 15 },
		);
	});

	it('CsvStreamReader reports an error past the head with its true line number', () => {
		const text = new TextDecoder().decode(big.bytes).split('\r\n');
		text[5002] = '625,25;1,5;x'; // line 5003 (1-based)
		const bytes = new TextEncoder().encode(text.join('\r\n'));
		// the error surfaces from push() as soon as the scanner reaches the line
		try {
			const r = new CsvStreamReader('big.csv');
			for (let i = 0; i < bytes.length; i += 7777) r.push(bytes.subarray(i, i + 7777));
			r.finish();
			throw new Error('no error');
		} catch (e) {
			expect(e).toBeInstanceOf(ImportError);
			expect([(e as ImportError).code, (e as ImportError).line, (e as ImportError).column]).toEqual([
				'bad-number',
				5003,
				12,
			]);
		}
	});

	it('parseCsv(onProgress) reports rising byte counts ending at the total', () => {
		const seen: [number, number][] = [];
		parseCsv(big.bytes, 'big.csv', {}, (done, total) => seen.push([done, total]));
		expect(seen.length).toBeGreaterThan(0);
		expect(seen[seen.length - 1]).toEqual([big.bytes.length, big.bytes.length]);
		for (let i = 1; i < seen.length; i++) expect(seen[i][0]).toBeGreaterThan(seen[i - 1][0]);
	});

	it('CsvStreamReader.layout is available once the head has arrived, before finish()', () => {
		const r = new CsvStreamReader('big.csv');
		r.push(big.bytes.subarray(0, 70_000));
		expect(r.layout?.delimiter).toBe(';');
		expect(r.layout?.decimalMark).toBe(',');
		expect(r.layout?.headerLine).toBe(2);
	});
});
