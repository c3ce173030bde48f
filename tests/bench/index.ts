/**
 * `npm run bench [-- filter]`: runs every tests/bench/*.bench.ts in its own child process (so peak memory
 * is that bench's alone) and prints what each prints: figures beside a reference measured in the same run.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filter = process.argv[2] ?? '';
const files = readdirSync(here)
	.filter((f) => f.endsWith('.bench.ts') && f.includes(filter))
	.sort();
if (files.length === 0) {
	console.error(`no bench matches "${filter}"`);
	process.exit(2);
}
let failed = 0;
for (const f of files) {
	console.log(`\n=== ${f} ===`);
	const r = spawnSync(process.execPath, ['--import', 'tsx', '--expose-gc', join(here, f)], { stdio: 'inherit' });
	if (r.status !== 0) {
		failed++;
		console.log(`(${f} exited with ${r.status})`);
	}
}
process.exit(failed ? 1 : 0);
