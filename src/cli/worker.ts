/**
 * Helper process entry (compiled to dist/src/cli/worker.js, started by pool.ts with fork): analyses the
 * units the parent sends, one message per unit, and answers with plain data. The parent caps its heap
 * and its time per unit; when the parent goes away, so does the helper.
 */
import { analyseUnit } from './analyse-unit.js';
import type { CommandSettings } from './options.js';

export interface WorkRequest {
	id: number;
	files: string[];
	settings: CommandSettings;
}

process.on('message', (req: WorkRequest) => {
	const result = analyseUnit(req.files, req.settings);
	process.send?.({ id: req.id, result });
});
process.on('disconnect', () => process.exit(0));
