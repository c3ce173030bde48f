/**
 * Runs analysis units on worker threads (node:worker_threads), at most `jobs` at a time, and hands back
 * each result as it completes. The worker is the compiled dist/src/cli/worker.js beside this file; when
 * it is absent (running from TypeScript sources) or `jobs` is 0, units run in this thread instead.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { analyseUnit, type UnitResult } from './analyse-unit.js';
import type { AnalysisUnit } from './collect-files.js';
import type { CommandSettings } from './options.js';
import type { WorkRequest } from './worker.js';

const workerUrl = new URL('./worker.js', import.meta.url);

/** True when the compiled worker file is there to start. */
export function workerAvailable(): boolean {
	return workerUrl.protocol === 'file:' && existsSync(fileURLToPath(workerUrl));
}

/**
 * Analyses every unit; calls `onResult(index, result)` once per unit in completion order.
 * @param jobs  worker threads to use; 0 = in this thread
 */
export async function runUnits(
	units: AnalysisUnit[],
	settings: CommandSettings,
	jobs: number,
	onResult: (index: number, result: UnitResult) => void,
): Promise<void> {
	if (jobs <= 0 || !workerAvailable()) {
		for (let i = 0; i < units.length; i++) {
			onResult(i, analyseUnit(units[i].files, settings));
			// Let the progress bar and stdout drain between files.
			await new Promise((r) => setImmediate(r));
		}
		return;
	}
	let next = 0;
	const runWorker = () =>
		new Promise<void>((resolve) => {
			let worker: Worker | undefined;
			let current = -1;
			const start = () => {
				worker = new Worker(workerUrl);
				worker.on('message', (msg: { id: number; result: UnitResult }) => {
					onResult(msg.id, msg.result);
					feed();
				});
				worker.on('error', (e) => {
					// A crash loses only the unit in hand: report it and carry on with a fresh worker.
					if (current >= 0) {
						const file = units[current].files[0];
						onResult(current, { files: units[current].files, reports: [], problems: [{ file, code: 'internal-error', message: `could not analyse: ${e.message}` }] });
					}
					worker?.removeAllListeners();
					void worker?.terminate();
					if (next < units.length) {
						start();
						feed();
					} else resolve();
				});
			};
			const feed = () => {
				if (next >= units.length) {
					current = -1;
					void worker?.terminate().then(() => resolve());
					return;
				}
				current = next++;
				const req: WorkRequest = { id: current, files: units[current].files, settings };
				worker?.postMessage(req);
			};
			start();
			feed();
		});
	const n = Math.min(jobs, units.length);
	await Promise.all(Array.from({ length: n }, runWorker));
}
