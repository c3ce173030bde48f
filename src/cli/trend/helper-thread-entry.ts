/** The worker thread of helper-thread.ts: runs each session it is sent and answers on its port. */
import { parentPort, workerData, type MessagePort } from 'node:worker_threads';
import { runTrendHelperSession, type TrendHelperInit } from '../../../lib/trend/index.js';

const port = (workerData as { port: MessagePort }).port;
parentPort!.on('message', (init: TrendHelperInit) => runTrendHelperSession(init, (r) => port.postMessage(r)));
