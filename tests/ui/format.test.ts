import { afterEach, describe, expect, it } from 'vitest';
import {
	decimalsFor,
	formatDeg,
	formatDuration,
	formatFixed,
	formatPercent,
	formatQuantity,
	setDisplayLocale,
} from '../../src/ui/format.js';

afterEach(() => setDisplayLocale('en-US'));

describe('formatQuantity', () => {
	it('formatQuantity picks the SI prefix that keeps 1 ≤ mantissa < 1000 (SI brochure prefixes m, k)', () => {
		setDisplayLocale('en-US');
		expect(formatQuantity(230.14, 'V')).toBe('230.1 V');
		expect(formatQuantity(0.00512, 'A')).toBe('5.120 mA');
		expect(formatQuantity(12_345, 'W')).toBe('12.35 kW');
		expect(formatQuantity(-26.28, 'A')).toBe('-26.28 A');
	});

	it('formatQuantity writes a decimal comma in a locale that uses one (de-DE, Intl.NumberFormat)', () => {
		setDisplayLocale('de-DE');
		expect(formatQuantity(230.14, 'V')).toBe('230,1 V');
		expect(formatPercent(4.237)).toBe('4,24 %');
		expect(formatDeg(32.04)).toBe('32,0°');
	});

	it('formatQuantity shows "–" for NaN and null (a figure the data cannot give), never "NaN"', () => {
		expect(formatQuantity(NaN, 'V')).toBe('–');
		expect(formatQuantity(null, 'V')).toBe('–');
		expect(formatPercent(undefined)).toBe('–');
	});

	it('formatQuantity below the stated resolution shows a plain 0 (no "0.000000 µV" for rounding noise)', () => {
		setDisplayLocale('en-US');
		expect(formatQuantity(3e-14, 'V', 4, 230e-6)).toBe('0 V');
		expect(formatQuantity(0.5, 'V', 4, 230e-6)).toBe('500.0 mV');
	});

	it('formatQuantity leaves units it does not know unprefixed', () => {
		setDisplayLocale('en-US');
		expect(formatQuantity(12_345, 'counts')).toBe('12,345 counts');
	});
});

describe('formatDuration / formatFixed / decimalsFor', () => {
	it('formatDuration shows ms below a second and µs below a millisecond', () => {
		setDisplayLocale('en-US');
		expect(formatDuration(0.00178)).toBe('1.78 ms');
		expect(formatDuration(2.5)).toBe('2.500 s');
		expect(formatDuration(0.00005)).toBe('50.0 µs');
	});

	it('formatFixed never prints a negative zero', () => {
		setDisplayLocale('en-US');
		expect(formatFixed(-0.00001, 2)).toBe('0.00');
	});

	it('decimalsFor gives the decimals for 4 significant digits', () => {
		expect(decimalsFor(230.1)).toBe(1);
		expect(decimalsFor(5.12)).toBe(3);
		expect(decimalsFor(12_345)).toBe(0);
	});
});
