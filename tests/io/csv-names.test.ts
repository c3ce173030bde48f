// Header cells, units and channel names. Unit prefixes per the SI brochure (BIPM, 9th edition, 2019,
// table 7: m = 1e-3, k = 1e3, µ = 1e-6, n = 1e-9); letter and phase conventions are common practice.
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../lib/io/csv/parse-csv.js';
import { isIndexName, isTimeName, minMaxOf } from '../../lib/io/csv/names.js';
import { looksLikeUnitsRow, readUnit, splitNameUnit } from '../../lib/io/csv/units.js';

describe('splitNameUnit', () => {
	it('splitNameUnit(cell) reads the four usual forms U1 (V), U1 [V], U1/V, U1 in V', () => {
		for (const cell of ['U1 (V)', 'U1 [V]', 'U1/V', 'U1 in V', ' U1 (V) '])
			expect(splitNameUnit(cell)).toEqual({ name: 'U1', unitText: 'V' });
	});

	it('splitNameUnit(cell) leaves names that only look like fractions or phases alone', () => {
		expect(splitNameUnit('L1/L2')).toEqual({ name: 'L1/L2', unitText: '' });
		expect(splitNameUnit('Phase A')).toEqual({ name: 'Phase A', unitText: '' });
		expect(splitNameUnit('U1')).toEqual({ name: 'U1', unitText: '' });
	});
});

describe('readUnit', () => {
	it('readUnit(text) gives the SI prefix factors for V, A and s', () => {
		expect(readUnit('mV')).toEqual({ unit: 'V', factor: 1e-3, kind: 'voltage' });
		expect(readUnit('kV')).toEqual({ unit: 'V', factor: 1e3, kind: 'voltage' });
		expect(readUnit('mA')).toEqual({ unit: 'A', factor: 1e-3, kind: 'current' });
		expect(readUnit('kA')).toEqual({ unit: 'A', factor: 1e3, kind: 'current' });
		expect(readUnit('µs')).toEqual({ unit: 's', factor: 1e-6, kind: 'time' });
		expect(readUnit('us')).toEqual({ unit: 's', factor: 1e-6, kind: 'time' });
		expect(readUnit('ms')).toEqual({ unit: 's', factor: 1e-3, kind: 'time' });
		expect(readUnit('(V)')).toEqual({ unit: 'V', factor: 1, kind: 'voltage' });
		expect(readUnit('Volts')).toEqual({ unit: 'V', factor: 1, kind: 'voltage' });
	});

	it('readUnit(text) keeps unknown units as text and recognises raw counts', () => {
		expect(readUnit('W')).toEqual({ unit: 'W', factor: 1, kind: 'other' });
		expect(readUnit('counts')?.kind).toBe('counts');
		expect(readUnit('')).toBeNull();
	});

	it('looksLikeUnitsRow(cells) accepts a row of units and rejects names', () => {
		expect(looksLikeUnitsRow(['s', 'V', '[mA]', ''])).toBe(true);
		expect(looksLikeUnitsRow(['t', 'U1', 'I1'])).toBe(false);
	});
});

describe('channel names', () => {
	it('isTimeName / isIndexName / minMaxOf recognise time, sample number and envelope columns', () => {
		for (const n of ['t', 'Time', 'TIME', 'Zeit', 'timestamp', 'x']) expect(isTimeName(n), n).toBe(true);
		for (const n of ['Sample', 'No.', 'index', '#', 'Sample no']) expect(isIndexName(n), n).toBe(true);
		expect(isTimeName('U1')).toBe(false);
		expect(minMaxOf('U1 min')).toEqual({ base: 'U1', which: 'min' });
		expect(minMaxOf('I2_Max')).toEqual({ base: 'I2', which: 'max' });
		expect(minMaxOf('min(U3)')).toEqual({ base: 'U3', which: 'min' });
		expect(minMaxOf('U1')).toBeNull();
	});
});

describe('a stated electrical unit wins over a name that looks like a counter', () => {
	// "N" is the neutral conductor (IEC 60445, from memory); "N (V)" is its voltage to earth, not a sample number
	const rows = (k: number) =>
		`${(230 * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * k) / 10_000)).toFixed(3)},${(0.5 * Math.sin((2 * Math.PI * 150 * k) / 10_000)).toFixed(4)},${(k / 10_000).toFixed(4)}`;
	const text = ['L1 (V),N (V),t (s)', ...Array.from({ length: 400 }, (_, k) => rows(k))].join('\n');

	it('parseCsv takes "N (V)" as a voltage channel and "t (s)" as the time base', () => {
		const c = parseCsv(text, 'neutral.csv');
		expect(c.channels.map((ch) => [ch.name, ch.quantity, ch.unit])).toEqual([
			['L1', 'voltage', 'V'],
			['N', 'voltage', 'V'],
		]);
		// time stamps 1e-4 s apart: 10 kS/s (closed form)
		expect(c.sampleRateHz).toBeCloseTo(10_000, 6);
	});

	it('"n" without a unit is still a sample number', () => {
		expect(() => parseCsv('n,U (V)\n0,1\n1,-1\n2,1\n', 'idx.csv')).toThrow(/sample rate/);
	});
});
