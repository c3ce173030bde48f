/**
 * Importer sentences reach users: numbers in them are rounded to their meaning (no float tails such as
 * 99999.99999999999 Hz).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseCsv } from '../../lib/io/csv/index.js';
import { openCaptures } from '../../lib/io/open.js';

function csv(header: string[], n: number, dt: number): string {
	const rows = [...header, 'Time (s),U1 (V)'];
	for (let k = 0; k < n; k++)
		rows.push(`${(k * dt).toFixed(6)},${(325 * Math.sin(2 * Math.PI * 50 * k * dt)).toFixed(3)}`);
	return rows.join('\n') + '\n';
}

describe('importer text rounded to its meaning', () => {
	it('a preamble sample interval of 0.00001 s reads "i.e. 100000 Hz" (1/1e-5, closed form), not a float tail', () => {
		const c = parseCsv(csv(['Sample interval: 0.00001 s'], 400, 1e-5), 'scope.csv');
		const all = c.diagnostics.map((d) => d.message).join('\n');
		expect(all).toContain('100000 Hz');
		expect(all).not.toMatch(/\d\.\d{8,}/);
	});

	it('a COMTRADE channel scaling reads with 6 significant digits at most (the .cfg writes the factor to full float precision)', () => {
		const files = ['cfg', 'dat'].map((e) => ({
			name: `incomer-dip.${e}`,
			bytes: new Uint8Array(readFileSync(join(import.meta.dirname, '..', '..', 'sample-waves', `incomer-dip.${e}`))),
		}));
		for (const ch of openCaptures(files).captures[0].channels) {
			const factor = /^([\d.e+-]+)·x/.exec(ch.scaling!.description)![1];
			expect(factor.replace(/^0\.0*|\./g, '').length).toBeLessThanOrEqual(6);
		}
	});
});
