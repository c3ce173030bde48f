/**
 * Helper process entry (compiled to dist/src/cli/worker.js, started by helper-process.ts with fork):
 * does one file's work per request, `analyse` (one answer: the unit's reports and problems) or `trend`
 * (a stream of messages: header, rows, notes, then 'done' or 'error'), and answers with plain data. The
 * parent caps its heap and its time per file; when the parent goes away, so does the helper.
 */
import { analyseUnit } from './analyse-unit.js';
import { errorLine } from './error-line.js';
import type { CommandSettings } from './options.js';
import { messageSink, trendFile, type TrendJob, type TrendMessage } from './trend/trend-file.js';

export type WorkRequest =
	{ kind: 'analyse'; id: number; files: string[]; settings: CommandSettings } | { kind: 'trend'; job: TrendJob };

const send = (m: unknown) => process.send?.(m);

process.on('message', (req: WorkRequest) => {
	if (req.kind === 'analyse') {
		send({ id: req.id, result: analyseUnit(req.files, req.settings) });
		return;
	}
	try {
		trendFile(
			req.job,
			messageSink((m: TrendMessage) => send(m)),
		);
		send({ t: 'done' } satisfies TrendMessage);
	} catch (e) {
		send({ t: 'error', line: errorLine(e, req.job.file) } satisfies TrendMessage);
	}
});
process.on('disconnect', () => process.exit(0));
