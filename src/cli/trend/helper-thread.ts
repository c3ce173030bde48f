/**
 * The second thread `trend` and `survey` share a recording's analysis with (lib/trend/helper-link.ts):
 * one Node worker thread per process, made on first use and kept for the next recording. It runs
 * helper-thread-entry.js. A session cut short (an error in the middle of a recording) leaves the thread
 * waiting: `settle` then ends it, and the next recording gets a new one.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import type { TrendHelperChannel, TrendHelperInit, TrendHelperResult } from '../../../lib/trend/index.js';

/** How long `result` waits for the message that follows the helper's last command, ms. */
const RESULT_WAIT_MS = 10_000;

class HelperThread implements TrendHelperChannel {
	busy = false;
	private readonly worker: Worker;
	private readonly port: MessagePort;
	private readonly nap = new Int32Array(new SharedArrayBuffer(4));

	constructor(entry: URL) {
		const { port1, port2 } = new MessageChannel();
		// execArgv: none of this process's flags (`--input-type` with `-e`, seen, keeps the thread from starting)
		this.worker = new Worker(entry, { workerData: { port: port2 }, transferList: [port2], execArgv: [] });
		this.worker.unref();
		this.port = port1;
		this.port.unref();
	}

	begin(init: TrendHelperInit): void {
		this.busy = true;
		this.worker.postMessage(init);
	}

	result(): TrendHelperResult {
		const t0 = Date.now();
		for (;;) {
			const m = receiveMessageOnPort(this.port);
			if (m) {
				this.busy = false;
				const r = m.message as TrendHelperResult;
				if (r.error !== undefined) throw new Error(`the second analysis thread failed: ${r.error}`);
				return r;
			}
			if (Date.now() - t0 > RESULT_WAIT_MS) throw new Error('the second analysis thread did not answer');
			Atomics.wait(this.nap, 0, 0, 1);
		}
	}

	end(): void {
		void this.worker.terminate();
	}
}

let thread: HelperThread | undefined;

/**
 * The process's helper thread for `threads` ≥ 2 on a machine with 2 or more cores; undefined otherwise,
 * or where the built entry file is missing (the sources run under a test runner).
 */
export function helperThread(threads: number): TrendHelperChannel | undefined {
	if (threads < 2 || availableParallelism() < 2) return undefined;
	if (thread) return thread;
	const entry = new URL('./helper-thread-entry.js', import.meta.url);
	if (!existsSync(fileURLToPath(entry))) return undefined;
	return (thread = new HelperThread(entry));
}

/** After a recording: a thread left in the middle of a session is ended (the next use makes a new one). */
export function settleHelperThread(): void {
	if (thread?.busy) {
		thread.end();
		thread = undefined;
	}
}
