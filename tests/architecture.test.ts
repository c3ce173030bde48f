import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The design card: src -> lib, never back; lib is pure TypeScript (no DOM framework, no Node APIs).
function filesUnder(dir: string): string[] {
	const out: string[] = [];
	for (const name of readdirSync(dir)) {
		const p = join(dir, name);
		if (statSync(p).isDirectory()) out.push(...filesUnder(p));
		else if (/\.(ts|svelte)$/.test(name)) out.push(p);
	}
	return out;
}

const importRe = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;

describe('dependency direction', () => {
	const libFiles = filesUnder('lib');

	it('lib/ files import nothing from src/, svelte, uplot or node:*', () => {
		const offenders: string[] = [];
		for (const f of libFiles) {
			const text = readFileSync(f, 'utf8');
			for (const m of text.matchAll(importRe)) {
				const spec = m[1] ?? m[2];
				if (
					/(^|\/)src\//.test(spec) ||
					/^(svelte|uplot)(\/|$)/.test(spec) ||
					spec.startsWith('node:') ||
					/^(fs|path|os|worker_threads|child_process)$/.test(spec)
				) {
					offenders.push(`${relative('.', f)} imports ${spec}`);
				}
			}
		}
		expect(offenders).toEqual([]);
	});

	it('lib/ files use no DOM or Node globals (document, window, process, Buffer, require)', () => {
		const offenders: string[] = [];
		for (const f of libFiles) {
			const code = readFileSync(f, 'utf8')
				.replace(/\/\*[\s\S]*?\*\//g, '')
				.replace(/\/\/.*$/gm, '');
			// `window` is a fine local name in signal code (a harmonic window), so only its browser members count.
			const m = code.match(
				/\b(document\.\w|process\.\w|Buffer\.\w|require\s*\(|window\.(?:document|location|navigator|localStorage|addEventListener|postMessage)\b|typeof\s+window\b)/,
			);
			if (m) offenders.push(`${relative('.', f)} uses ${m[1]}`);
		}
		expect(offenders).toEqual([]);
	});

	it('the global check flags browser/Node globals but not a local variable named window', () => {
		const re =
			/\b(document\.\w|process\.\w|Buffer\.\w|require\s*\(|window\.(?:document|location|navigator|localStorage|addEventListener|postMessage)\b|typeof\s+window\b)/;
		expect(re.test('const n = window.startIndex + 1;')).toBe(false);
		expect(re.test('document.createElement("a")')).toBe(true);
		expect(re.test('process.exit(1)')).toBe(true);
		expect(re.test('window.localStorage.getItem("k")')).toBe(true);
	});

	it('the checker itself catches a forbidden import (guards against a check that cannot fail)', () => {
		const sample = "import { x } from '../src/ui/state.js';\nimport fs from 'node:fs';";
		const specs = [...sample.matchAll(importRe)].map((m) => m[1] ?? m[2]);
		expect(specs).toEqual(['../src/ui/state.js', 'node:fs']);
	});
});
