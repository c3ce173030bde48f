/**
 * One helper process (worker.js beside this module: dist/bin/worker.js, started with fork) that does one file's work at a time with
 * a heap cap (--max-old-space-size) and a time limit. A file that crashes the helper, exhausts its heap or
 * runs out of time ends as words for that file's error line; the helper is then replaced.
 * A process, not a worker thread: a V8 fatal out-of-memory error in a worker thread aborts the whole
 * process even under resourceLimits (seen with Node 20 when one array grows past the cap), so only a
 * separate process keeps one file's failure from ending the batch.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { totalmem } from 'node:os';
import { fileURLToPath } from 'node:url';
import { getHeapStatistics } from 'node:v8';
import { bytesWords } from './file-checks.js';

const workerUrl = new URL('./worker.js', import.meta.url);

/** True when the compiled helper file is there to start (not when running from TypeScript sources). */
export function helperAvailable(): boolean {
	return workerUrl.protocol === 'file:' && existsSync(fileURLToPath(workerUrl));
}

/** Default time a file may take: 60 s, plus 1 s per MiB of its files (a rough 4x margin on a slow machine). */
export const BASE_TIME_LIMIT_S = 60;
export const TIME_LIMIT_S_PER_MIB = 1;

/** The time limit for `bytes` of input, s: `fixedS` when given, else the default above. */
export function timeLimitFor(bytes: number, fixedS?: number): number {
	return fixedS ?? BASE_TIME_LIMIT_S + (TIME_LIMIT_S_PER_MIB * bytes) / 2 ** 20;
}

/**
 * Default heap cap per helper, MiB: this process's own heap limit (so `node --max-old-space-size=N`
 * caps the helpers too), and no more than half the machine's memory shared among the helpers, at least 256.
 */
export function defaultHeapMiB(helpers: number): number {
	const ownMiB = getHeapStatistics().heap_size_limit / 2 ** 20;
	const shareMiB = totalmem() / 2 ** 20 / 2 / Math.max(1, helpers);
	return Math.max(256, Math.floor(Math.min(ownMiB, shareMiB)));
}

/** The tail of a helper's stderr kept to tell out-of-memory from other crashes (V8 prints its fatal errors there). */
const STDERR_TAIL_BYTES = 2048;

/**
 * Helpers alive now: killed when this process exits or is stopped by a signal first (stdout closed early,
 * `timeout`, Ctrl-C), so none is left running: a helper in the middle of a file cannot notice its
 * parent is gone.
 */
const live = new Set<ChildProcess>();
const killLive = () => {
	for (const c of live) c.kill('SIGKILL');
};
let hooked = false;
function hookExit(): void {
	if (hooked) return;
	hooked = true;
	process.on('exit', killLive);
	// A signal ends this process with the usual 128 + signal number, after the helpers.
	for (const [signal, n] of [
		['SIGINT', 2],
		['SIGTERM', 15],
		['SIGHUP', 1],
	] as const) {
		process.once(signal, () => {
			killLive();
			process.exit(128 + n);
		});
	}
}

export class HelperProcess {
	private child: ChildProcess | undefined;
	private stderrTail = '';
	/**
	 * @param heapMiB  heap cap of the helper
	 * @param longRecordingHint  appended to memory and time messages (analyse points to `sinecheck trend`)
	 */
	constructor(
		private readonly heapMiB: number,
		private readonly longRecordingHint = '',
		/** What the helper loads as it starts, before the first request (worker.ts): e.g. ['trend', '2']. */
		private readonly preload: string[] = [],
	) {}

	/** Starts the helper now (it loads its code while this process goes on), not at the first `run`. */
	start(): void {
		this.child ??= this.spawn();
	}

	private spawn(): ChildProcess {
		const child = fork(fileURLToPath(workerUrl), this.preload, {
			execArgv: [`--max-old-space-size=${this.heapMiB}`],
			serialization: 'advanced',
			stdio: ['ignore', 'ignore', 'pipe', 'ipc'],
		});
		hookExit();
		live.add(child);
		child.on('exit', () => live.delete(child));
		this.stderrTail = '';
		child.stderr?.setEncoding('utf8');
		child.stderr?.on('data', (t: string) => (this.stderrTail = (this.stderrTail + t).slice(-STDERR_TAIL_BYTES)));
		child.on('error', () => {}); // each run() listens itself; an error between files must not reach this process
		return child;
	}

	private stoppedWords(code: number | null, signal: NodeJS.Signals | null): string {
		const oom = /heap out of memory|Reached heap limit|Allocation failed|invalid table size|invalid array length/i.test(
			this.stderrTail,
		);
		const words = oom
			? `could not analyse: the analysis needed more than the ${bytesWords(this.heapMiB * 2 ** 20)} of memory one file may use (--memory-limit)${this.longRecordingHint}`
			: 'could not analyse: the analysis of this file stopped unexpectedly (a fault in sinecheck: please report it with the file)';
		const last =
			this.stderrTail
				.trim()
				.split('\n')
				.filter((l) => /\S/.test(l))
				.slice(-1)[0] ?? '';
		return words + (process.env.SINECHECK_DEBUG ? ` [detail: exit ${code ?? signal}: ${last}]` : '');
	}

	/**
	 * Sends `request` and hands every answer to `onMessage`, which returns true for the last one.
	 * Resolves undefined when the work ended normally, or the words for the file's error line when the
	 * helper crashed, ran out of memory or ran over `limitS` seconds.
	 */
	run(request: unknown, onMessage: (msg: unknown) => boolean, limitS: number): Promise<string | undefined> {
		const child = (this.child ??= this.spawn());
		return new Promise((resolve) => {
			let done = false;
			const finish = (failure: string | undefined) => {
				if (done) return;
				done = true;
				clearTimeout(timer);
				child.off('message', onAnswer).off('exit', onExit).off('error', onError);
				if (failure !== undefined) {
					this.child = undefined;
					child.kill('SIGKILL');
				}
				resolve(failure);
			};
			const onAnswer = (msg: unknown) => {
				if (onMessage(msg)) finish(undefined);
			};
			// stderr may still be arriving when the process exits: read it once the pipe has closed.
			const onExit = (code: number | null, signal: NodeJS.Signals | null) => {
				const report = () => finish(this.stoppedWords(code, signal));
				if (child.stderr && !child.stderr.readableEnded) child.stderr.once('close', report);
				else report();
			};
			const onError = () =>
				finish('could not analyse: the helper process for this file could not be started or reached');
			const timer = setTimeout(
				() =>
					finish(
						`could not analyse: gave up after ${Math.round(limitS)} s, the time one file may take (--time-limit); the file may be damaged${this.longRecordingHint}`,
					),
				limitS * 1000,
			);
			child.on('message', onAnswer).on('exit', onExit).on('error', onError);
			child.send(request as object);
		});
	}

	/** Lets the helper end (it exits when its channel closes). */
	close(): void {
		const c = this.child;
		this.child = undefined;
		if (c && c.exitCode === null) c.disconnect();
	}
}
