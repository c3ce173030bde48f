/**
 * Worker thread entry (compiled to dist/src/cli/worker.js): analyses the units the main thread sends,
 * one message per unit, and answers with plain data. The main thread caps its heap and time (pool.ts).
 */
import { parentPort } from 'node:worker_threads';
import { analyseUnit } from './analyse-unit.js';
import type { CommandSettings } from './options.js';

export interface WorkRequest {
	id: number;
	files: string[];
	settings: CommandSettings;
}

parentPort?.on('message', (req: WorkRequest) => {
	const result = analyseUnit(req.files, req.settings);
	parentPort?.postMessage({ id: req.id, result });
});
