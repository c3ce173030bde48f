/**
 * The built CLI for the end-to-end tests: `npm test` builds it before vitest runs; when a test is run on
 * its own and the sources are newer than dist/, it is rebuilt here, once, under a lock so that two test
 * files never rewrite dist/ while the other runs it.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export const root = join(import.meta.dirname, '..', '..');
export const mainJs = join(root, 'dist', 'src', 'cli', 'main.js');

function newestSourceMs(dir: string): number {
	let newest = 0;
	for (const name of readdirSync(dir)) {
		const p = join(dir, name);
		const st = statSync(p);
		if (st.isDirectory()) newest = Math.max(newest, newestSourceMs(p));
		else if (name.endsWith('.ts')) newest = Math.max(newest, st.mtimeMs);
	}
	return newest;
}

function stale(): boolean {
	if (!existsSync(mainJs)) return true;
	const built = statSync(mainJs).mtimeMs;
	return Math.max(newestSourceMs(join(root, 'lib')), newestSourceMs(join(root, 'src', 'cli'))) > built;
}

/** Builds dist/ with `tsc -p tsconfig.cli.json` when it is missing or older than the sources. */
export async function ensureBuiltCli(): Promise<void> {
	const lock = join(root, 'dist', '.cli-build-lock');
	mkdirSync(join(root, 'dist'), { recursive: true });
	for (let tries = 0; ; tries++) {
		try {
			mkdirSync(lock);
			break;
		} catch {
			// A lock left by a test run that was killed mid-build: older than 3 minutes, take it over.
			if (existsSync(lock) && Date.now() - statSync(lock).mtimeMs > 180_000) rmdirSync(lock);
			if (tries > 600) throw new Error(`waited 2 minutes for ${lock}; remove it if no build is running`);
			await new Promise((r) => setTimeout(r, 200));
		}
	}
	try {
		if (!stale()) return;
		try {
			execFileSync(process.execPath, [join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', join(root, 'tsconfig.cli.json')], { cwd: root, stdio: 'pipe' });
		} catch (e) {
			// tsc still writes the files when another area has a type error in progress; `npm test` type-checks
			// everything before the tests, so here only warn.
			console.warn(`tsc -p tsconfig.cli.json reported errors; testing the files it wrote:\n${String((e as { stdout?: Buffer }).stdout ?? e)}`);
		}
	} finally {
		rmdirSync(lock);
	}
}
