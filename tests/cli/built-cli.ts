/**
 * The built CLI for the end-to-end tests and the CLI bench. `npm test` builds it before vitest runs, so
 * in CI dist/ is always fresh. `mainJs` is what `sinecheck` runs: dist/bin/sinecheck.js, the bundle of
 * tsc's dist/src/cli (src/cli/build-bundle.ts). It is never rebuilt here: rewriting dist/ in place while another process
 * runs it (a bench, another test file, a worker thread loading worker.js) would hand
 * that process half-written modules. A missing or stale build is a clear failure instead.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

export const root = join(import.meta.dirname, '..', '..');
export const mainJs = join(root, 'dist', 'bin', 'sinecheck.js');
/** tsc's output of src/cli, module by module (what the bundle is made from), for benches that import one part. */
export const compiledCli = join(root, 'dist', 'src', 'cli');

/** The newest .ts file under `dir`, with its modification time. */
function newestSource(dir: string): { path: string; ms: number } {
	let newest = { path: '', ms: 0 };
	for (const name of readdirSync(dir)) {
		const p = join(dir, name);
		const st = statSync(p);
		const candidate = st.isDirectory() ? newestSource(p) : name.endsWith('.ts') ? { path: p, ms: st.mtimeMs } : newest;
		if (candidate.ms > newest.ms) newest = candidate;
	}
	return newest;
}

/**
 * Throws, telling to run `npm run build:cli`, when dist/bin/sinecheck.js is missing or older than a source
 * file of lib/ or src/cli/ (build:cli rewrites every output file: tsc's, then the bundle's).
 */
export async function ensureBuiltCli(): Promise<void> {
	const fix = 'run `npm run build:cli` (npm test does it before the tests)';
	if (!existsSync(mainJs)) throw new Error(`${relative(root, mainJs)} is missing: ${fix}`);
	const built = statSync(mainJs).mtimeMs;
	const lib = newestSource(join(root, 'lib'));
	const cli = newestSource(join(root, 'src', 'cli'));
	const newest = lib.ms >= cli.ms ? lib : cli;
	if (newest.ms > built)
		throw new Error(`${relative(root, mainJs)} is older than ${relative(root, newest.path)}: ${fix}`);
}
