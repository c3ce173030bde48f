/**
 * Build step, not part of the command (run by `npm run build:cli` after tsc): bundles the compiled CLI in
 * dist/src/cli into dist/bin, the files `sinecheck` runs (package.json "bin"). A command then starts by
 * reading a few files instead of resolving and linking some 150 modules in each of its processes and
 * threads (the main process, the helper process, the analysis thread): measured ~0.1 s less per `trend`,
 * ~0.2 s less for `trend` of a one-second file (tests/bench/trend.bench.ts prints the whole command's time).
 *
 * Three entries, one folder: sinecheck.js (main.ts), worker.js (the helper process, found by
 * helper-process.ts as ./worker.js beside its own module) and helper-thread-entry.js (the analysis thread,
 * found by trend/helper-thread.ts the same way); code they share goes in chunk-*.js files in the same
 * folder, so `new URL('./x.js', import.meta.url)` finds its file from any chunk. Packages (cac, fft.js,
 * papaparse, wavefile) are bundled too; the CommonJS ones get a `require` for Node's own modules.
 */
import { build } from 'esbuild';
import { rmSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '..', '..', '..');
const compiled = join(root, 'dist', 'src', 'cli');
const outdir = join(root, 'dist', 'bin');

rmSync(outdir, { recursive: true, force: true });
await build({
	entryPoints: {
		sinecheck: join(compiled, 'main.js'),
		worker: join(compiled, 'worker.js'),
		'helper-thread-entry': join(compiled, 'trend', 'helper-thread-entry.js'),
	},
	outdir,
	chunkNames: 'chunk-[hash]',
	bundle: true,
	splitting: true,
	format: 'esm',
	platform: 'node',
	target: 'node20',
	logLevel: 'warning',
	// read only when SINECHECK_DEBUG is set (main.ts, worker.ts): a stack then names tsc's modules and lines
	sourcemap: 'linked',
	banner: {
		js: "import { createRequire as bundleRequire } from 'node:module'; const require = bundleRequire(import.meta.url);",
	},
});
