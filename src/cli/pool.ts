/**
 * Runs analysis units on worker threads (node:worker_threads), at most `jobs` at a time, and hands back
 * each result as it completes. Each worker has a heap cap (resourceLimits) and each unit a time limit:
 * a unit that crashes its worker, runs out of memory or runs out of time becomes that unit's error line,
 * the worker is replaced, and the other units carry on. The worker is the compiled dist/src/cli/worker.js
 * beside this file; when it is absent (running from TypeScript sources) or `jobs` is 0, units run in
 * this thread instead, without those limits.
 */
import { existsSync, statSync } from 'node:fs';
import { totalmem } from 'node:os';
import { fileURLToPath } from 'node:url';
import { getHeapStatistics } from 'node:v8';
import { Worker } from 'node:worker_threads';
import type { UnitResult } from './analyse-unit.js';
import type { AnalysisUnit } from './collect-files.js';
import { bytesWords } from './file-checks.js';
import type { CommandSettings } from './options.js';
import type { WorkRequest } from './worker.js';

const workerUrl = new URL('./worker.js', import.meta.url);

/** True when the compiled worker file is there to start. */
export function workerAvailable(): boolean {
	return workerUrl.protocol === 'file:' && existsSync(fileURLToPath(workerUrl));
}

/** Limits on one unit's analysis in a worker. */
export interface UnitLimits {
	/** Heap (V8 old generation) a worker may use, MiB. */
	heapMiB: number;
	/** Fixed time limit per unit in s; undefined = the default, which grows with the unit's size. */
	timeLimitS?: number;
}

/** Default time a unit may take: 60 s, plus 1 s per MiB of its files (a rough 4x margin on a slow machine). */
export const BASE_TIME_LIMIT_S = 60;
export const TIME_LIMIT_S_PER_MIB = 1;

/**
 * Default heap cap per worker, MiB: this process's own heap limit (so `node --max-old-space-size=N`
 * caps the workers too), and no more than half the machine's memory shared among the workers, at least 256.
 */
export function defaultHeapMiB(jobs: number): number {
	const ownMiB = getHeapStatistics().heap_size_limit / 2 ** 20;
	const shareMiB = totalmem() / 2 ** 20 / 2 / Math.max(1, jobs);
	return Math.max(256, Math.floor(Math.min(ownMiB, shareMiB)));
}

function unitBytes(unit: AnalysisUnit): number {
	let total = 0;
	for (const f of unit.files) {
		try {
			total += statSync(f).size;
		} catch {
			// the worker reports an unreadable file itself
		}
	}
	return total;
}

/** The time limit of one unit, s. */
export function timeLimitS(unit: AnalysisUnit, limits: UnitLimits): number {
	return limits.timeLimitS ?? BASE_TIME_LIMIT_S + (TIME_LIMIT_S_PER_MIB * unitBytes(unit)) / 2 ** 20;
}

function failure(unit: AnalysisUnit, message: string): UnitResult {
	return { files: unit.files, reports: [], problems: [{ file: unit.files[0], code: 'stopped', message }] };
}

/** One worker thread, replaced after any unit that crashes it, exhausts its heap or runs out of time. */
class Slot {
	private worker: Worker | undefined;
	constructor(
		private readonly settings: CommandSettings,
		private readonly limits: UnitLimits,
	) {}

	private spawn(): Worker {
		const w = new Worker(workerUrl, { resourceLimits: { maxOldGenerationSizeMb: this.limits.heapMiB } });
		w.on('error', () => {}); // each run() listens itself; an error between units must not reach the process
		return w;
	}

	run(id: number, unit: AnalysisUnit): Promise<UnitResult> {
		const w = (this.worker ??= this.spawn());
		const limitS = timeLimitS(unit, this.limits);
		return new Promise((resolve) => {
			let done = false;
			const finish = (result: UnitResult, broken: boolean) => {
				if (done) return;
				done = true;
				clearTimeout(timer);
				w.off('message', onMessage).off('error', onError).off('exit', onExit);
				if (broken) {
					this.worker = undefined;
					void w.terminate();
				}
				resolve(result);
			};
			const onMessage = (msg: { id: number; result: UnitResult }) => {
				if (msg.id === id) finish(msg.result, false);
			};
			const onError = (e: Error & { code?: string }) => {
				const words =
					e.code === 'ERR_WORKER_OUT_OF_MEMORY'
						? `could not analyse: the analysis needed more than the ${bytesWords(this.limits.heapMiB * 2 ** 20)} of memory one file may use (--memory-limit); for long recordings use \`sinecheck trend\``
						: 'could not analyse: the analysis of this file stopped unexpectedly (a fault in sinecheck: please report it with the file)';
				const debug = process.env.SINECHECK_DEBUG ? ` [detail: ${e.code ?? e.name}: ${e.message}]` : '';
				finish(failure(unit, words + debug), true);
			};
			const onExit = (code: number) => finish(failure(unit, `could not analyse: the analysis of this file stopped unexpectedly (exit code ${code})`), true);
			const timer = setTimeout(
				() => finish(failure(unit, `could not analyse: gave up after ${Math.round(limitS)} s, the time one file may take (--time-limit); the file may be damaged, or use \`sinecheck trend\` for long recordings`), true),
				limitS * 1000,
			);
			w.on('message', onMessage).on('error', onError).on('exit', onExit);
			const req: WorkRequest = { id, files: unit.files, settings: this.settings };
			w.postMessage(req);
		});
	}

	async close(): Promise<void> {
		const w = this.worker;
		this.worker = undefined;
		if (w) await w.terminate();
	}
}

/**
 * Analyses every unit; calls `onResult(index, result)` once per unit in completion order.
 * @param jobs  worker threads to use; 0 = in this thread (no memory or time limit)
 */
export async function runUnits(
	units: AnalysisUnit[],
	settings: CommandSettings,
	jobs: number,
	onResult: (index: number, result: UnitResult) => void,
	limits: UnitLimits = { heapMiB: defaultHeapMiB(jobs) },
): Promise<void> {
	if (jobs <= 0 || !workerAvailable()) {
		const { analyseUnit } = await import('./analyse-unit.js');
		for (let i = 0; i < units.length; i++) {
			onResult(i, analyseUnit(units[i].files, settings));
			// Let the progress bar and stdout drain between files.
			await new Promise((r) => setImmediate(r));
		}
		return;
	}
	let next = 0;
	const drain = async () => {
		const slot = new Slot(settings, limits);
		try {
			while (next < units.length) {
				const i = next++;
				onResult(i, await slot.run(i, units[i]));
			}
		} finally {
			await slot.close();
		}
	};
	await Promise.all(Array.from({ length: Math.min(jobs, units.length) }, drain));
}
