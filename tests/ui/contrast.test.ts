/**
 * Text contrast of Sinecheck's own palette: every text colour in src/ui/app.css on the paper and panel
 * backgrounds, white on the accent (the primary button), and every trace colour on white (the 11 px phasor
 * labels and plot labels are drawn in them) reach 4.5:1, WCAG 2.x success criterion 1.4.3 (AA, normal text).
 * Relative luminance and contrast ratio as WCAG 2.x defines them; the formula is checked on the worked
 * extremes (black on white 21:1, a colour on itself 1:1) and on #767676, the common "lightest grey that
 * passes AA on white" (4.54:1; common practice).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { TRACE_COLOURS } from '../../src/ui/charts/palette.js';

const ROOT = resolve(__dirname, '../..');
/** WCAG 2.x AA for normal-size text (SC 1.4.3). */
const AA_TEXT = 4.5;

function luminance(hex: string): number {
	const c = [1, 3, 5]
		.map((k) => parseInt(hex.slice(k, k + 2), 16) / 255)
		.map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
	return 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
}
function contrast(a: string, b: string): number {
	const [l1, l2] = [luminance(a), luminance(b)].sort((x, y) => y - x);
	return (l1 + 0.05) / (l2 + 0.05);
}

const css = readFileSync(join(ROOT, 'src/ui/app.css'), 'utf8');
const vars = Object.fromEntries(
	[...css.matchAll(/--([a-z-]+):\s*(#[0-9a-f]{6})/gi)].map((m) => [m[1], m[2].toLowerCase()]),
);

describe('contrast of the palette (WCAG 2.x, 4.5:1 for text)', () => {
	it('contrast() gives 21:1 for black on white, 1:1 for a colour on itself, 4.54:1 for #767676 on white', () => {
		expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 6);
		expect(contrast('#0b5d57', '#0b5d57')).toBeCloseTo(1, 9);
		expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
	});

	it('every text colour of app.css on the paper and on the panel', () => {
		for (const name of ['ink', 'muted', 'accent', 'ok', 'attention', 'fail']) {
			for (const bg of ['paper', 'panel', 'accent-soft']) {
				expect(vars[name], name).toMatch(/^#/);
				expect(contrast(vars[name], vars[bg]), `${name} on ${bg}`).toBeGreaterThanOrEqual(AA_TEXT);
			}
		}
	});

	it('white on the accent (primary button, selected channel button)', () => {
		expect(contrast('#ffffff', vars.accent)).toBeGreaterThanOrEqual(AA_TEXT);
	});

	it('every trace colour on white (phasor labels at 11 px, plot labels)', () => {
		expect(TRACE_COLOURS.length).toBeGreaterThan(8);
		for (const c of TRACE_COLOURS) expect(contrast(c, '#ffffff'), c).toBeGreaterThanOrEqual(AA_TEXT);
	});
});
