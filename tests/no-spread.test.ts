/**
 * No data spread into call arguments: `Math.min(...values)` and the like pass every value as an argument,
 * and V8 overflows the stack somewhere above 10^5 of them (common practice; measured in
 * tests/signal/hostile-input.test.ts). lib/ and src/ use minOf / maxOf (lib/signal/extremes.ts) instead.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

function filesUnder(dir: string): string[] {
	const out: string[] = [];
	for (const name of readdirSync(dir)) {
		const p = join(dir, name);
		if (statSync(p).isDirectory()) out.push(...filesUnder(p));
		else if (/\.(ts|svelte)$/.test(name)) out.push(p);
	}
	return out;
}

describe('no spreading of arrays into Math.min / Math.max / String.fromCharCode / apply', () => {
	it('lib/ and src/ hold none', () => {
		const offenders: string[] = [];
		for (const f of [...filesUnder('lib'), ...filesUnder('src')]) {
			const code = readFileSync(f, 'utf8')
				.replace(/\/\*[\s\S]*?\*\//g, '')
				.replace(/\/\/.*$/gm, '');
			code.split('\n').forEach((line, i) => {
				if (/Math\.(min|max)\([^)]*\.\.\.|\.apply\(\s*(null|Math|undefined)\s*,/.test(line))
					offenders.push(`${relative('.', f)}:${i + 1}: ${line.trim()}`);
			});
		}
		expect(offenders).toEqual([]);
	});
});
