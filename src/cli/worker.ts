/**
 * Helper process entry (bundled to dist/bin/worker.js, started by helper-process.ts with fork):
 * does one file's work per request, `analyse` (one answer: the unit's reports and problems) or `trend`
 * (a stream of messages: header, rows, notes, then 'done' or 'error'), and answers with plain data. The
 * parent caps its heap and its time per file; when the parent goes away, so does the helper.
 */
import type { CommandSettings } from './options.js';
import type { TrendJob, TrendMessage } from './trend/trend-file.js';

export type WorkRequest =
	{ kind: 'analyse'; id: number; files: string[]; settings: CommandSettings } | { kind: 'trend'; job: TrendJob };

const send = (m: unknown) => process.send?.(m);

// A stack asked for with SINECHECK_DEBUG names the modules (dist/src/cli/...) through the bundle's source maps.
if (process.env.SINECHECK_DEBUG) process.setSourceMapsEnabled(true);

// Each command's code loads on its first request, or at once when the parent says which command it runs
// (argv: 'trend' and the threads): the loading then overlaps the parent's own start. A trend helper
// with 2 threads also starts its analysis thread now, beside the loading (the thread loads its own code).
if (process.argv[2] === 'trend' && Number(process.argv[3]) >= 2)
	void import('./trend/helper-thread.js').then((t) => t.helperThread(2));
const trendCode = process.argv[2] === 'trend' ? import('./trend/trend-file.js') : undefined;

process.on('message', async (req: WorkRequest) => {
	if (req.kind === 'analyse') {
		const { analyseUnit } = await import('./analyse-unit.js');
		send({ id: req.id, result: analyseUnit(req.files, req.settings) });
		return;
	}
	try {
		const { messageSink, trendFile } = await (trendCode ?? import('./trend/trend-file.js'));
		trendFile(
			req.job,
			messageSink((m: TrendMessage) => send(m)),
		);
		send({ t: 'done' } satisfies TrendMessage);
	} catch (e) {
		const { errorLine } = await import('./error-line.js');
		send({ t: 'error', line: errorLine(e, req.job.file) } satisfies TrendMessage);
	}
});
process.on('disconnect', () => process.exit(0));
