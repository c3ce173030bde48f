// Layouts read from text written in the tests (scenarios of our own). The fixture text is the external
// truth for every value asserted; rates are closed forms (1 / step).
import { describe, expect, it } from 'vitest';
import { detectCsvLayout, parseCsv } from '../../lib/io/csv/index.js';
import type { Capture } from '../../lib/capture.js';

const codes = (c: { diagnostics: { code: string }[] }) => c.diagnostics.map((d) => d.code);
const diag = (c: Capture, code: string) => c.diagnostics.find((d) => d.code === code);
const values = (c: Capture, i: number) => Array.from(c.channels[i].samples);

describe('parseCsv: delimiters and decimal marks', () => {
	it('parseCsv(semicolon + decimal comma, CRLF, units in brackets) reads 0,707 as 0.707 V and mA as A', () => {
		const c = parseCsv('Time (ms);U1 (V);I1 [mA]\r\n0,0;0,707;-3,25\r\n0,1;1,5;2\r\n0,2;2,5;3\r\n', 'a.csv');
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1', 'I1']);
		expect(values(c, 0)).toEqual([0.707, 1.5, 2.5]);
		expect(values(c, 1)).toEqual([-0.00325, 0.002, 0.003]);
		expect(c.channels[1].unit).toBe('A');
		expect(c.channels[1].quantity).toBe('current');
		expect(c.channels[1].scaling?.factor).toBe(0.001);
		// 0.1 ms step = 10 kHz (closed form: 1 / 0.1e-3 s)
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(codes(c)).toEqual(
			expect.arrayContaining(['decimal-comma', 'line-break', 'delimiter', 'header', 'time-column', 'unit-normalised']),
		);
	});

	it('detectCsvLayout(head) reports the delimiter and decimal mark of 0,707;-3,25 as semicolon and comma', () => {
		const l = detectCsvLayout('U1;U2\n0,707;-3,25\n0,5;1,25\n', { sampleRateHz: 1000 });
		expect([l.delimiter, l.decimalMark, l.headerLine, l.bodyLine]).toEqual([';', ',', 1, 2]);
		expect(l.preview).toEqual([
			['0,707', '-3,25'],
			['0,5', '1,25'],
		]);
	});

	it('parseCsv(tab-separated, decimal comma) reads the values', () => {
		const c = parseCsv('t [s]\tU1 [V]\n0\t1,5\n0,001\t-2,25\n0,002\t3\n', 'a.csv');
		expect(values(c, 0)).toEqual([1.5, -2.25, 3]);
		expect(c.sampleRateHz).toBeCloseTo(1000, 6);
	});

	it('parseCsv(columns aligned with runs of spaces) reads space-separated values', () => {
		const c = parseCsv(
			'   time      UL1      UL2\n  0.000    325.0   -162.5\n  0.001    320.5   -150.0\n  0.002    310.0   -140.25\n',
			'a.txt',
		);
		expect(values(c, 0)).toEqual([325, 320.5, 310]);
		expect(values(c, 1)).toEqual([-162.5, -150, -140.25]);
		expect(c.diagnostics.find((d) => d.code === 'delimiter')?.message).toMatch(/spaces/);
	});

	it('parseCsv(quoted fields, decimal commas inside the quotes of a comma file) reads the numbers', () => {
		const c = parseCsv('"Time (s)","U1 (V)"\n"0","0,5"\n"0,001","-1,25"\n"0,002","2"\n', 'a.csv');
		expect(values(c, 0)).toEqual([0.5, -1.25, 2]);
		expect(codes(c)).toContain('quoted-fields');
	});

	it('parseCsv(rows ending with a delimiter) ignores the trailing empty column and says so', () => {
		const c = parseCsv('t;U1;I1;\n0;1;2;\n0,5;3;4;\n1;5;6;\n', 'a.csv');
		expect(values(c, 1)).toEqual([2, 4, 6]);
		expect(c.channels.length).toBe(2);
		expect(codes(c)).toContain('trailing-empty-columns');
	});

	it('parseCsv(blank lines and delimiter-only rows among and after the data) skips them and says where', () => {
		const c = parseCsv('t;U1;I1\r\n0;1;2\r\n\r\n1;3;4\r\n;;\r\n2;5;6\r\n;;\r\n', 'a.csv');
		expect(values(c, 0)).toEqual([1, 3, 5]);
		const b = diag(c, 'blank-lines');
		expect([b?.line, b?.message]).toEqual([3, '3 blank line(s) among the data were skipped, the first at line 3.']);
	});

	it('parseCsv(UTF-8 BOM, CR-only line breaks) skips the BOM and splits on CR', () => {
		const c = parseCsv('\uFEFFt,U1\r0,1\r0.5,2\r1,3\r', 'a.csv');
		expect(values(c, 0)).toEqual([1, 2, 3]);
		expect(codes(c)).toEqual(expect.arrayContaining(['utf8-bom', 'line-break']));
	});

	it('parseCsv(Windows-1252 bytes: µs in the header) reads the unit as microseconds', () => {
		const text = 'Zeit [\u00b5s];U1 [V]\n0;1\n100;2\n200;3\n';
		const bytes = Uint8Array.from(text, (ch) => ch.charCodeAt(0)); // one byte per character: Latin-1
		const c = parseCsv(bytes, 'a.csv');
		// 100 us step = 10 kHz
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(codes(c)).toContain('encoding');
	});

	it('parseCsv(UTF-16LE text with BOM) reads it like UTF-8', () => {
		const text = '\uFEFFt,U1\n0,1\n1,2\n2,3\n';
		const bytes = new Uint8Array(text.length * 2);
		for (let i = 0; i < text.length; i++) {
			bytes[2 * i] = text.charCodeAt(i) & 0xff;
			bytes[2 * i + 1] = text.charCodeAt(i) >> 8;
		}
		const c = parseCsv(bytes, 'a.csv');
		expect(values(c, 0)).toEqual([1, 2, 3]);
		expect(codes(c)).toContain('utf16');
	});
});

describe('parseCsv: header, units, preamble', () => {
	it('parseCsv(header units in four forms and with prefixes) gives names without units and values in V and A', () => {
		const c = parseCsv(
			't/s,U1 in kV,U2 [V],I1 (kA),I2/mA\n0,0.5,1,1.25,250\n1,0.25,2,2.5,500\n2,1,3,0.5,750\n',
			'a.csv',
		);
		expect(c.channels.map((ch) => [ch.name, ch.unit, ch.quantity])).toEqual([
			['U1', 'V', 'voltage'],
			['U2', 'V', 'voltage'],
			['I1', 'A', 'current'],
			['I2', 'A', 'current'],
		]);
		// kV x 1000, kA x 1000, mA / 1000 (SI prefixes)
		expect(values(c, 0)).toEqual([500, 250, 1000]);
		expect(values(c, 2)).toEqual([1250, 2500, 500]);
		expect(values(c, 3)).toEqual([0.25, 0.5, 0.75]);
	});

	it('parseCsv(a units row under the names) takes the units from it', () => {
		const c = parseCsv('Time;U1;I1\nms;mV;A\n0;500;1\n1;250;2\n2;-125;3\n', 'a.csv');
		expect(values(c, 0)).toEqual([0.5, 0.25, -0.125]);
		expect(c.channels[0].unit).toBe('V');
		expect(c.sampleRateHz).toBeCloseTo(1000, 6);
		expect(diag(c, 'header')?.message).toMatch(/line 2 their units/);
	});

	it('parseCsv(a preamble of key;value;unit and # key: value lines) keeps it as metadata and takes rate, start and frequency', () => {
		const text = [
			'# Site: Workshop feeder, board 2',
			'# Start time: 2031-05-14 09:30:00.250',
			'Sample interval;0,2;ms',
			'Nominal frequency;50;Hz',
			'',
			'U L1-N;I L1',
			'V;A',
			'325,1;10,5',
			'-324,9;-10,25',
			'0;0',
		].join('\n');
		const c = parseCsv(text, 'a.csv');
		expect(c.metadata).toEqual({
			Site: 'Workshop feeder, board 2',
			'Start time': '2031-05-14 09:30:00.250',
			'Sample interval': '0,2 ms',
			'Nominal frequency': '50 Hz',
		});
		// 0.2 ms interval = 5000 Hz
		expect(c.sampleRateHz).toBeCloseTo(5000, 9);
		expect(c.startTime).toBe('2031-05-14T09:30:00.250');
		expect(c.nominalFrequencyHz).toBe(50);
		expect(values(c, 0)).toEqual([325.1, -324.9, 0]);
		expect(codes(c)).toEqual(expect.arrayContaining(['preamble', 'rate-in-preamble', 'no-time-column']));
	});

	it('parseCsv(no header) names channels by column and says what it assumed', () => {
		const c = parseCsv('0.0000,1.5,2.5\n0.0001,1.75,2.25\n0.0002,2,2\n0.0003,2.25,1.75\n', 'a.csv');
		expect(c.channels.map((ch) => ch.name)).toEqual(['col2', 'col3']);
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(codes(c)).toEqual(expect.arrayContaining(['no-header', 'time-column-guessed', 'quantity-unknown']));
		expect(c.channels[0].quantity).toBe('other');
		expect(diag(c, 'quantity-unknown')?.severity).toBe('assumption');
	});

	it('parseCsv(options) overrides the header row, units, quantity and time column', () => {
		const c = parseCsv('0,1,2\n1,3,4\n2,5,6\n', 'a.csv', {
			headerRow: 'none',
			timeColumn: 'none',
			sampleRateHz: 2000,
			channels: { col1: { name: 'Ua', unit: 'V' }, col2: { unit: 'mA' }, col3: { quantity: 'other' } },
		});
		expect(c.channels.map((ch) => [ch.name, ch.unit, ch.quantity])).toEqual([
			['Ua', 'V', 'voltage'],
			['col2', 'A', 'current'],
			['col3', '', 'other'],
		]);
		expect(values(c, 1)).toEqual([0.001, 0.003, 0.005]);
		expect(c.sampleRateHz).toBe(2000);
	});
});

describe('parseCsv: time base', () => {
	it('parseCsv(time in us, scientific notation, starting before the trigger) gives startS < 0 and the rate', () => {
		const c = parseCsv('t (us),U1 (V)\n-2.0E+02,1\n-1.0E+02,2\n0.0E+00,3\n1.0E+02,4\n', 'a.csv');
		expect(c.startS).toBeCloseTo(-200e-6, 15);
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(c.timeS).toBeUndefined();
	});

	it('parseCsv(absolute time starting at 12.5 s) keeps the start', () => {
		const c = parseCsv('time,U1\n12.5,1\n12.5002,2\n12.5004,3\n', 'a.csv', { timeUnit: 's' });
		expect(c.startS).toBe(12.5);
		expect(c.sampleRateHz).toBeCloseTo(5000, 3);
	});

	it('parseCsv(a sample-number column and an interval in the preamble) builds the time from both', () => {
		const c = parseCsv('Sample interval: 0.1 ms\nSample;U1\n-10;1\n-9;2\n-8;3\n', 'a.csv');
		expect(c.sampleRateHz).toBe(10_000);
		// sample -10 at 10 kHz = -1 ms
		expect(c.startS).toBeCloseTo(-0.001, 15);
		expect(codes(c)).toContain('sample-index');
	});

	it('parseCsv(time stamps rounded to the printed digits) still counts as uniform sampling', () => {
		// 3 kHz printed to 0.1 ms: 0, 0.3, 0.7, 1.0 ms lie 0.033 ms off the 1/3 ms grid, within half the printed 0.1 ms
		const c = parseCsv('t (ms),U1\n0.0,1\n0.3,2\n0.7,3\n1.0,4\n1.3,5\n1.7,6\n2.0,7\n', 'a.csv');
		expect(c.timeS).toBeUndefined();
		expect(c.sampleRateHz).toBeCloseTo(3000, 6);
	});

	it('parseCsv(steps that wander beyond the tolerance) keeps the explicit time base and warns', () => {
		const c = parseCsv('t (ms),U1\n0,1\n1,2\n2.4,3\n3,4\n4,5\n', 'a.csv');
		expect(Array.from(c.timeS ?? [])).toEqual([0, 0.001, 0.0024, 0.003, 0.004]);
		expect(diag(c, 'irregular-time')?.severity).toBe('warning');
	});

	it('parseCsv(a jitter tolerance option) decides what counts as uniform', () => {
		const c = parseCsv('t (ms),U1\n0,1\n1,2\n2.4,3\n3,4\n4,5\n', 'a.csv', { jitterTolerance: 0.5 });
		expect(c.timeS).toBeUndefined();
	});

	it('parseCsv(a gap in the time column) reports it with its line and does not resample', () => {
		const c = parseCsv('t (s),U1\n0,1\n1,2\n2,3\n5,4\n6,5\n7,6\n', 'a.csv');
		expect(Array.from(c.timeS ?? [])).toEqual([0, 1, 2, 5, 6, 7]);
		const g = diag(c, 'time-gaps');
		expect(g?.line).toBe(5);
		expect(g?.message).toMatch(/1 gap/);
		expect(c.channels[0].samples.length).toBe(6);
	});

	it('parseCsv(a stated rate twice the time column step) recognises a decimated export', () => {
		const c = parseCsv('Sample rate;10;kHz\nt (ms);U1\n0;1\n0,2;2\n0,4;3\n0,6;4\n', 'a.csv');
		expect(c.sampleRateHz).toBeCloseTo(5000, 6);
		expect(diag(c, 'decimated')?.message).toMatch(/2 times/);
	});

	it('parseCsv(date-and-time stamps with a decimal comma, across midnight) counts time from the first stamp', () => {
		const c = parseCsv(
			'Timestamp;U1 [V]\n2031-05-14 23:59:59,9990;1,5\n2031-05-14 23:59:59,9995;2\n2031-05-15 00:00:00,0000;3\n2031-05-15 00:00:00,0005;4\n',
			'a.csv',
		);
		// 0.5 ms steps = 2 kHz; the first stamp is the wall-clock start
		expect(c.sampleRateHz).toBe(2000);
		expect(c.startS).toBe(0);
		expect(c.startTime).toBe('2031-05-14T23:59:59.9990');
		expect(values(c, 0)).toEqual([1.5, 2, 3, 4]);
	});

	it('parseCsv(time-of-day stamps without a date, across midnight) counts the new day', () => {
		const c = parseCsv('time,U1 (V)\n23:59:59.998,1\n23:59:59.999,2\n00:00:00.000,3\n00:00:00.001,4\n', 'a.csv');
		expect(c.sampleRateHz).toBeCloseTo(1000, 3);
		expect(c.timeS).toBeUndefined();
	});

	it('parseCsv(a Date column then a Time column, decimal comma) joins them into the time base', () => {
		const c = parseCsv(
			'Date;Time;U1 [V];I1 [A]\n14.05.2031;23:59:59,998;1,5;2\n14.05.2031;23:59:59,999;2;3\n15.05.2031;00:00:00,000;3;4\n',
			'a.csv',
		);
		// 1 ms steps = 1 kHz, across midnight
		expect(c.sampleRateHz).toBe(1000);
		expect(c.startTime).toBe('2031-05-14T23:59:59.998');
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1', 'I1']);
		expect(values(c, 1)).toEqual([2, 3, 4]);
	});

	it('parseCsv(date and time separated by the same spaces as the columns) joins them too', () => {
		const c = parseCsv(
			'date time U1\n2031-05-14 12:00:00.000 1\n2031-05-14 12:00:00.001 2\n2031-05-14 12:00:00.002 3\n',
			'a.txt',
		);
		expect(c.sampleRateHz).toBe(1000);
		expect(values(c, 0)).toEqual([1, 2, 3]);
	});

	it('parseCsv(a broken time-of-day stamp) throws bad-number at that cell', () => {
		expect(() => parseCsv('time,U1\n12:00:00.000,1\n12:00:00.001,2\n12:00:0x,3\n', 'a.csv')).toThrow(
			/a.csv:4:1: bad-number/,
		);
	});

	it('parseCsv(a preamble that says the export is decimated) warns that not every sample is there', () => {
		const c = parseCsv('Decimation;4\nt (ms);U1\n0;1\n0,4;2\n0,8;3\n', 'a.csv');
		expect(diag(c, 'decimated')?.message).toMatch(/Decimation: 4/);
	});

	it('parseCsv(a stated rate that fits no integer ratio) warns and uses the time column', () => {
		const c = parseCsv('Sample rate;7000;Hz\nt (ms);U1\n0;1\n0,1;2\n0,2;3\n', 'a.csv');
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
		expect(diag(c, 'rate-mismatch')?.severity).toBe('warning');
	});

	it('parseCsv(a header written as a comment: # t, U1) reads the names', () => {
		const c = parseCsv('# t (s), U1 (V)\n0, 1\n0.5, 2\n1, 3\n', 'a.csv');
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1']);
		expect(c.sampleRateHz).toBe(2);
	});

	it('parseCsv(min and max rows sharing each time stamp) recognises a peak-detect export', () => {
		const c = parseCsv('t (s);U1\n0;-1\n0;1\n1;-2\n1;2\n2;-3\n2;3\n', 'a.csv');
		expect(codes(c)).toContain('min-max-rows');
	});

	it('parseCsv(U1 min / U1 max columns) recognises min/max envelope columns', () => {
		const c = parseCsv('t (s);U1 min (V);U1 max (V)\n0;-1;1\n1;-2;2\n2;-3;3\n', 'a.csv');
		expect(c.diagnostics.filter((d) => d.code === 'min-max-column').length).toBe(2);
		expect(c.channels.map((ch) => ch.name)).toEqual(['U1 min', 'U1 max']);
	});
});

describe('parseCsv: scaling, quantities and phases', () => {
	it('parseCsv(raw counts with scale and offset in the preamble) gives value = a * x + b', () => {
		const c = parseCsv('U1 scale;0,5;V\nU1 offset;-2\nSample rate;1000;Hz\nU1 (counts)\n4\n8\n-4\n', 'a.csv');
		// 0.5 * 4 - 2 = 0, 0.5 * 8 - 2 = 2, 0.5 * -4 - 2 = -4
		expect(values(c, 0)).toEqual([0, 2, -4]);
		expect(c.channels[0].scaling).toEqual({ factor: 0.5, offset: -2, description: 'raw x 0.5 + -2' });
		expect(c.channels[0].unit).toBe('V');
	});

	it('parseCsv(settings for a channel that is not there) warns instead of ignoring them silently', () => {
		const c = parseCsv('U9 scale;2\nt;U1\n0;1\n1;2\n', 'a.csv', { channels: { U2: { probeRatio: 10 } } });
		expect(codes(c)).toEqual(expect.arrayContaining(['preamble-channel-unmatched', 'option-channel-unmatched']));
		expect(values(c, 0)).toEqual([1, 2]);
	});

	it('parseCsv(a scope-style preamble with interval, trigger and a units list) reads rate and time', () => {
		const text =
			'Record Length,4\nSample Interval,1.0E-05\nUnits,V,V\nTime,CH1,CH2\n-2.0E-05,0.125,-1.5\n-1.0E-05,0.25,-1.25\n0.0E+00,0.5,-1\n1.0E-05,1,-0.5\n';
		const c = parseCsv(text, 'scope.csv');
		expect(c.sampleRateHz).toBeCloseTo(100_000, 3);
		expect(c.startS).toBeCloseTo(-2e-5, 15);
		expect(values(c, 1)).toEqual([-1.5, -1.25, -1, -0.5]);
		expect(c.metadata.Units).toBe('V V');
	});

	it('parseCsv(raw counts and no scale) warns that the values are counts', () => {
		const c = parseCsv('Sample rate;1000;Hz\nU1 (counts)\n4\n8\n', 'a.csv');
		expect(diag(c, 'raw-counts-unscaled')?.severity).toBe('warning');
	});

	it('parseCsv(probe x10, clamp 100 mV/A, shunt 0.01 ohm, CT 200/5) scales each channel', () => {
		const c = parseCsv('I4 CT ratio;200/5\nt (s);U1 (V);I2 (V);I3 (V);I4 (A)\n0;1;0.5;0.25;1\n1;2;1;0.5;2\n', 'a.csv', {
			channels: { U1: { probeRatio: 10 }, I2: { clampMvPerA: 100 }, I3: { shuntOhms: 0.01 } },
		});
		expect(values(c, 0)).toEqual([10, 20]); // x10 probe
		expect(values(c, 1)).toEqual([5, 10]); // 0.5 V / 0.1 V/A
		expect(values(c, 2)).toEqual([25, 50]); // 0.25 V / 0.01 ohm
		expect(values(c, 3)).toEqual([40, 80]); // 1 A x 200/5
		expect(c.channels.map((ch) => [ch.unit, ch.quantity])).toEqual([
			['V', 'voltage'],
			['A', 'current'],
			['A', 'current'],
			['A', 'current'],
		]);
	});

	it('parseCsv(a current-named channel recorded in volts) keeps the unit and warns about the disagreement', () => {
		const c = parseCsv('t (s);I1 (mV)\n0;100\n1;200\n', 'a.csv');
		expect([c.channels[0].unit, c.channels[0].quantity]).toEqual(['V', 'voltage']);
		expect(diag(c, 'name-unit-disagree')?.severity).toBe('warning');
	});

	it('parseCsv(phase names in the usual schemes) fills Channel.phase', () => {
		const c = parseCsv('t;UL1;UL2;UL3;Ia;Ib;Ic;IN;V_R;U12\n0;1;2;3;4;5;6;7;8;9\n1;1;2;3;4;5;6;7;8;9\n', 'a.csv');
		expect(c.channels.map((ch) => [ch.name, ch.quantity, ch.phase])).toEqual([
			['UL1', 'voltage', 'L1'],
			['UL2', 'voltage', 'L2'],
			['UL3', 'voltage', 'L3'],
			['Ia', 'current', 'A'],
			['Ib', 'current', 'B'],
			['Ic', 'current', 'C'],
			['IN', 'current', 'N'],
			['V_R', 'voltage', 'R'],
			['U12', 'voltage', 'L1-L2'], // one form in every format (L1-L2, as COMTRADE and WAV give)
		]);
	});

	it('parseCsv(a name that says nothing) leaves the phase unset and asks for the quantity', () => {
		const c = parseCsv('t;Probe A-3 (x)\n0;1\n1;2\n', 'a.csv');
		expect(c.channels[0].phase).toBeUndefined();
		expect(c.channels[0].quantity).toBe('other');
	});
});
