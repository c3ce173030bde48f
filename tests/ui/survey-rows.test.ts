/**
 * How the survey's lines are shown (src/ui/survey-rows.ts): lines written here by hand in lib/survey's
 * contract, so every expectation follows from the input alone.
 */
import { describe, expect, it } from 'vitest';
import type { SurveyLine } from '../../lib/survey/types.js';
import { EN50160_SURVEY } from '../../lib/survey/index.js';
import { bandLimitLines, percentileLimitLines, ruleRows, verdictGroups } from '../../src/ui/survey-rows.js';

function line(
	id: string,
	channel: string | undefined,
	verdict: SurveyLine['verdict'],
	value = NaN,
	limit = NaN,
): SurveyLine {
	const harmonic = id.startsWith('harmonic-');
	return {
		id,
		quantity: harmonic ? `Harmonic voltage h${id.slice(9)}, 10-minute means` : 'Supply voltage, 10-minute means',
		rule: harmonic ? `95 % of values ≤ ${limit} %` : '95 % of values within 230 V ± 10 %',
		channel,
		measured: 'as measured',
		value,
		limit,
		unit: '%',
		verdict,
		source: harmonic
			? `EN 50160:2010, Table 1 (LV), odd orders not multiples of 3, h = ${id.slice(9)}`
			: 'EN 50160:2010, 4.2.2',
		used: 1,
		excludedFlagged: 0,
		excludedPartial: 0,
	};
}

describe('verdictGroups', () => {
	it('one entry per rule with its phases together: any phase failing fails the rule and is named', () => {
		const g = verdictGroups([
			line('v', 'L1', 'meets'),
			line('v', 'L2', 'does not meet'),
			line('v', 'L3', 'not measured'),
		]);
		expect(g).toHaveLength(1);
		expect(g[0].verdict).toBe('does not meet');
		expect(g[0].failing).toEqual(['L2']);
	});

	it('all harmonic orders make one entry; a failing order is named with its phase; the source is the table', () => {
		const g = verdictGroups([line('harmonic-5', 'L1', 'meets', 3, 6), line('harmonic-7', 'L2', 'does not meet', 6, 5)]);
		expect(g).toHaveLength(1);
		expect(g[0].failing).toEqual(['L2 h7']);
		expect(g[0].source).toBe('EN 50160:2010, Table 1 (LV)');
	});

	it('a rule no phase could measure is "not measured", not met', () => {
		expect(verdictGroups([line('v', 'L1', 'not measured')])[0].verdict).toBe('not measured');
	});
});

describe('ruleRows', () => {
	it("a phase's harmonic orders that all meet are one row naming the order nearest its limit (value/limit)", () => {
		// h5 at 3 of 6 % is 50 % of its limit, h7 at 4 of 5 % is 80 %: h7 is nearer
		const rows = ruleRows([line('harmonic-5', 'L1', 'meets', 3, 6), line('harmonic-7', 'L1', 'meets', 4, 5)]);
		expect(rows).toHaveLength(1);
		expect(rows[0].quantity).toBe('Harmonic voltages, orders 5 to 7');
		expect(rows[0].measured).toContain('order 7 at 4.00 %');
	});

	it('an order that fails gets its own row and no summary row', () => {
		const rows = ruleRows([line('harmonic-5', 'L1', 'meets', 3, 6), line('harmonic-7', 'L1', 'does not meet', 6, 5)]);
		expect(rows.map((r) => r.verdict)).toEqual(['does not meet']);
	});
});

describe('limit lines', () => {
	it('EN 50160 voltage bands at 230 V: 207 and 253 V, then 195.5 V (253 V only once) (EN 50160:2010, 4.2.2)', () => {
		const lines = bandLimitLines(EN50160_SURVEY, 'voltage', 230, 'V', (x, d) => x.toFixed(d));
		expect(lines.map((l) => l.value)).toEqual([0.9 * 230, 1.1 * 230, 0.85 * 230]);
		expect(lines[0].label).toBe('207 V (−10 %)');
	});

	it('the THD limit of EN 50160 is 8 % (EN 50160:2010, 4.2.5)', () => {
		expect(percentileLimitLines(EN50160_SURVEY, 'thd', '%')).toEqual([{ value: 8, label: 'limit 8 %' }]);
	});
});
