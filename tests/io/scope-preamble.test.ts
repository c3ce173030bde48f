import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../lib/io/csv/parse-csv.js';

const body = (rows: number) =>
	Array.from(
		{ length: rows },
		(_, k) => `${((k - rows / 2) * 1e-6).toExponential(6)},${(k % 7) * 0.03125 - 0.1},${(k % 5) * 0.015625}`,
	).join('\n');

describe('parseCsv: scope preamble rows', () => {
	it('parseCsv(Vertical Units per column, Probe Attenuation 100 and 100 mV/A) scales CH1 × 100 to a voltage and CH2 ÷ 0.1 V/A to a current', () => {
		const text = [
			'Vertical Units,V,V',
			'Vertical Scale,1,0.5',
			'Probe Attenuation,100,100 mV/A',
			'Sample Interval,1e-6',
			'Time,CH1,CH2',
			body(64),
		].join('\n');
		const c = parseCsv(text, 'scope.csv');
		const [u, i] = c.channels;
		expect(u.quantity).toBe('voltage');
		expect(u.unit).toBe('V');
		expect(i.quantity).toBe('current');
		expect(i.unit).toBe('A');
		// row 3: CH1 = 3·0.03125 − 0.1 = −0.00625 V at the input → × 100 = −0.625 V; CH2 = 3·0.015625 V → ÷ 0.1 V/A = 0.46875 A
		expect(u.samples[3]).toBeCloseTo(-0.625, 9);
		expect(i.samples[3]).toBeCloseTo(0.46875, 9);
		const said = c.diagnostics.map((d) => d.message).join('\n');
		expect(said).toMatch(/probe attenuation of 100 for column 2/);
		expect(said).toMatch(/clamp of 100 mV\/A for column 3/);
		expect(said).toMatch(/"Vertical Scale" \(1, 0.5\) is a screen setting/);
		expect(c.diagnostics.find((d) => d.code === 'preamble-channel-unmatched')).toBeUndefined();
	});

	it('parseCsv(one Vertical Units value and one Probe Attenuation x10) applies them to every channel', () => {
		const text = ['Vertical Units,V', 'Probe Attenuation,x10', 'Sample Interval,1e-6', 'Time,CH1,CH2', body(64)].join(
			'\n',
		);
		const c = parseCsv(text, 'scope.csv');
		for (const ch of c.channels) expect(ch.quantity).toBe('voltage');
		expect(c.channels[1].samples[3]).toBeCloseTo(10 * 3 * 0.015625, 9);
	});

	it('parseCsv(Vertical Range per column as ±4 and -2..2 V, probe x100 and 100 mV/A) scales each range with its channel', () => {
		const text = [
			'Vertical Range,±4,-2..2 V',
			'Probe Attenuation,100,100 mV/A',
			'Sample Interval,1e-6',
			'Time,CH1,CH2',
			body(64),
		].join('\n');
		const c = parseCsv(text, 'scope.csv');
		// ±4 V at the input × 100 = ±400 V; −2 … 2 V ÷ 0.1 V/A = −20 … 20 A
		expect(c.channels[0].range).toMatchObject({ min: -400, max: 400 });
		expect(c.channels[1].range?.min).toBeCloseTo(-20, 12);
		expect(c.channels[1].range?.max).toBeCloseTo(20, 12);
		expect(c.diagnostics.map((d) => d.message).join('\n')).toMatch(/range of -4 … 4 for column 2/);
	});

	it('parseCsv(an unreadable Vertical Range) says so and sets no range', () => {
		const text = ['Vertical Range,wide', 'Sample Interval,1e-6', 'Time,CH1', body(64).replace(/,[^,]*$/gm, '')].join(
			'\n',
		);
		const c = parseCsv(text, 'scope.csv');
		expect(c.channels[0].range).toBeUndefined();
		expect(c.diagnostics.find((d) => d.code === 'range-unreadable')?.message).toMatch(/"wide"/);
	});
});
