/// <reference lib="webworker" />
/**
 * The analysis worker: every figure is computed here, off the page's thread, by lib/ (see worker-core.ts).
 * Cancel = the page terminates this worker and starts a fresh one.
 */
import { handleMessage } from './worker-core.js';
import type { ToWorker } from './protocol.js';

const scope = self as unknown as DedicatedWorkerGlobalScope;
scope.onmessage = (ev: MessageEvent<ToWorker>) => {
	handleMessage(ev.data, (msg, transfer) => scope.postMessage(msg, transfer ?? []));
};
