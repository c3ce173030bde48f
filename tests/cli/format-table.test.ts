/**
 * Limit rows of the readable report (src/cli/format-table.ts limitRowText). The rule: value, limit and
 * margin (limit - value, percent points) share 2 decimals, or more (up to 6) until the margin shows a
 * non-zero digit; never "-0"; "at the limit" when even 6 decimals show no difference. Expected texts are
 * written from the rule and the numbers given here.
 */
import { describe, expect, it } from 'vitest';
import { limitRowText } from '../../src/cli/format-table.js';

const row = (value: number, limit: number, figure = 'harmonic', order = 5) => ({
	channel: 'U1',
	order,
	figure,
	value,
	limit,
	margin: limit - value,
	pass: value <= limit,
	source: 'table row (from memory)',
});

describe('limitRowText', () => {
	it('limitRowText(row) prints an ordinary excess with 2 decimals', () => {
		expect(limitRowText(row(6.5, 6))).toBe('U1 h5: 6.50 % over limit 6.00 % (margin -0.50) [table row (from memory)]');
	});

	it('limitRowText(row) never reads "8.00 % over limit 8.00 % (margin -0.00)": a THD 0.004 points over 8 % gets 3 decimals', () => {
		expect(limitRowText(row(8.004, 8, 'thd', 0))).toBe(
			'U1 THD: 8.004 % over limit 8.000 % (margin -0.004) [table row (from memory)]',
		);
		expect(limitRowText(row(8.00004, 8, 'thd', 0))).toBe(
			'U1 THD: 8.00004 % over limit 8.00000 % (margin -0.00004) [table row (from memory)]',
		);
	});

	it('limitRowText(row) says "at the limit" when the excess is below a millionth of a point, with no -0 anywhere', () => {
		const text = limitRowText(row(6 + 1e-9, 6));
		expect(text).toBe('U1 h5: 6.00 % at the limit of 6.00 % [table row (from memory)]');
		expect(text).not.toMatch(/-0/);
	});

	it('limitRowText(row) prints a row within its limit as such (margin positive)', () => {
		expect(limitRowText(row(5, 6))).toBe('U1 h5: 5.00 % within limit 6.00 % (margin 1.00) [table row (from memory)]');
	});
});
