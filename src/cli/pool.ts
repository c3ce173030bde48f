/**
 * Runs analysis units in helper processes (node:child_process fork), at most `jobs` at a time, and hands
 * back each result as it completes. Each helper has a heap cap (--max-old-space-size) and each unit a
 * time limit: a unit that crashes its helper, runs out of memory or runs out of time becomes that unit's
 * error line, the helper is replaced, and the other units carry on. The helper is the compiled
 * dist/src/cli/worker.js beside this file; when it is absent (running from TypeScript sources) or `jobs`
 * is 0, units run in this process instead, without those limits.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { totalmem } from 'node:os';
import { fileURLToPath } from 'node:url';
import { getHeapStatistics } from 'node:v8';
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
	/** Heap (V8 old generation) a helper process may use, MiB. */
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

/** The tail of a helper's stderr kept for SINECHECK_DEBUG (V8 prints its fatal errors there). */
const STDERR_TAIL_BYTES = 2048;

/**
 * One helper process, replaced after any unit that crashes it, exhausts its heap or runs out of time.
 * A process, not a worker thread: a V8 fatal out-of-memory error in a worker thread aborts the whole
 * process even under resourceLimits (seen with Node 20 when one array grows past the cap), so only a
 * separate process keeps one file's failure from ending the batch.
 */
class Slot {
	private child: ChildProcess | undefined;
	private stderrTail = '';
	constructor(
		private readonly settings: CommandSettings,
		private readonly limits: UnitLimits,
	) {}

	private spawn(): ChildProcess {
		const child = fork(fileURLToPath(workerUrl), [], {
			execArgv: [`--max-old-space-size=${this.limits.heapMiB}`],
			serialization: 'advanced',
			stdio: ['ignore', 'ignore', 'pipe', 'ipc'],
		});
		this.stderrTail = '';
		child.stderr?.setEncoding('utf8');
		child.stderr?.on('data', (t: string) => (this.stderrTail = (this.stderrTail + t).slice(-STDERR_TAIL_BYTES)));
		child.on('error', () => {}); // each run() listens itself; an error between units must not reach this process
		return child;
	}

	private stoppedWords(code: number | null, signal: NodeJS.Signals | null): string {
		const oom = /heap out of memory|Reached heap limit|Allocation failed|invalid table size|invalid array length/i.test(this.stderrTail);
		const words = oom
			? `could not analyse: the analysis needed more than the ${bytesWords(this.limits.heapMiB * 2 ** 20)} of memory one file may use (--memory-limit); for long recordings use \`sinecheck trend\``
			: 'could not analyse: the analysis of this file stopped unexpectedly (a fault in sinecheck: please report it with the file)';
		const last = this.stderrTail.trim().split('\n').filter((l) => /\S/.test(l)).slice(-1)[0] ?? '';
		return words + (process.env.SINECHECK_DEBUG ? ` [detail: exit ${code ?? signal}: ${last}]` : '');
	}

	run(id: number, unit: AnalysisUnit): Promise<UnitResult> {
		const child = (this.child ??= this.spawn());
		const limitS = timeLimitS(unit, this.limits);
		return new Promise((resolve) => {
			let done = false;
			const finish = (result: UnitResult, broken: boolean) => {
				if (done) return;
				done = true;
				clearTimeout(timer);
				child.off('message', onMessage).off('exit', onExit).off('error', onError);
				if (broken) {
					this.child = undefined;
					child.kill('SIGKILL');
				}
				resolve(result);
			};
			const onMessage = (msg: { id: number; result: UnitResult }) => {
				if (msg.id === id) finish(msg.result, false);
			};
			// stderr may still be arriving when the process exits: read it once the pipe has closed.
			const onExit = (code: number | null, signal: NodeJS.Signals | null) => {
				const report = () => finish(failure(unit, this.stoppedWords(code, signal)), true);
				if (child.stderr && !child.stderr.readableEnded) child.stderr.once('close', report);
				else report();
			};
			const onError = () => finish(failure(unit, 'could not analyse: the helper process for this file could not be started or reached'), true);
			const timer = setTimeout(
				() => finish(failure(unit, `could not analyse: gave up after ${Math.round(limitS)} s, the time one file may take (--time-limit); the file may be damaged, or use \`sinecheck trend\` for long recordings`), true),
				limitS * 1000,
			);
			child.on('message', onMessage).on('exit', onExit).on('error', onError);
			const req: WorkRequest = { id, files: unit.files, settings: this.settings };
			child.send(req);
		});
	}

	close(): void {
		const c = this.child;
		this.child = undefined;
		if (c && c.exitCode === null) c.disconnect();
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
			slot.close();
		}
	};
	await Promise.all(Array.from({ length: Math.min(jobs, units.length) }, drain));
}
