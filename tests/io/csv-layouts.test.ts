// Layouts read from text written in the test: the fixture text is the external truth for every value.
import { describe, expect, it } from 'vitest';
import { detectCsvLayout, parseCsv } from '../../lib/io/csv/index.js';

const codes = (c: { diagnostics: { code: string }[] }) => c.diagnostics.map((d) => d.code);

describe('parseCsv layouts', () => {
	it('parseCsv(semicolon + decimal comma, CRLF, units in brackets) reads 0,707 as 0.707 V and mA as A', () => {
		const c = parseCsv('Time (ms);U1 (V);I1 [mA]\r\n0,0;0,707;-3,25\r\n0,1;1,5;2\r\n0,2;2,5;3\r\n', 'a.csv');
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1', 'I1']);
		expect(Array.from(c.channels[0].samples)).toEqual([0.707, 1.5, 2.5]);
		expect(Array.from(c.channels[1].samples)).toEqual([-0.00325, 0.002, 0.003]);
		expect(c.channels[1].unit).toBe('A');
		expect(c.channels[1].quantity).toBe('current');
		// 0.1 ms step = 10 kHz (closed form: 1 / 0.1e-3 s)
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(codes(c)).toEqual(expect.arrayContaining(['decimal-comma', 'line-break', 'delimiter', 'header', 'time-column', 'unit-normalised']));
	});

	it('detectCsvLayout(head) reports the delimiter and decimal mark of 0,707;-3,25 as semicolon and comma', () => {
		const l = detectCsvLayout('U1;U2\n0,707;-3,25\n0,5;1,25\n', { sampleRateHz: 1000 });
		expect(l.delimiter).toBe(';');
		expect(l.decimalMark).toBe(',');
		expect(l.headerLine).toBe(1);
		expect(l.bodyLine).toBe(2);
	});
});
