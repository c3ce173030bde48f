/**
 * `sinecheck analyse <file|folder>...`: collects the files, analyses them on worker threads, prints
 * one report per file (table, JSON or CSV) in the order given, problems once each on stderr.
 * Returns the exit code: 0 analysed and within limits, 1 a limit failed, 2 bad input or usage.
 */
import { availableParallelism } from 'node:os';
import { csvSummaryHeader, csvSummaryRows } from '../../lib/report/index.js';
import type { ReportJson } from '../../lib/report/to-json.js';
import type { UnitResult } from './analyse-unit.js';
import { problemLine as problemText } from './error-line.js';
import { collectUnits } from './collect-files.js';
import { nextStepsCsvRows, NEXT_STEPS_CSV_COLUMNS } from '../../lib/next-steps/index.js';
import { formatNextSteps } from './format-next-steps.js';
import { formatReport } from './format-table.js';
import { limitsFrom, settingsFromOptions, type RawOptions } from './options.js';
import { defaultHeapMiB, runUnits } from './pool.js';
import { printable, printableJson } from './printable.js';
import { progressBar } from './progress.js';
import { UsageError } from './usage-error.js';

export interface Io {
	out: (text: string) => void;
	err: (text: string) => void;
}

const stdio: Io = {
	out: (t) => void process.stdout.write(t),
	err: (t) => void process.stderr.write(t),
};

function jobsFrom(raw: unknown, units: number): number {
	// One file runs in a worker too: its heap and time limits keep a hostile file from taking the machine.
	if (raw === undefined) return Math.max(1, Math.min(availableParallelism(), units, 8));
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 0)
		throw new UsageError(`--jobs ${String(raw)}: expected a whole number, 0 to analyse in this thread`);
	return n;
}

export async function analyseCommand(paths: string[], raw: RawOptions, io: Io = stdio): Promise<number> {
	if (raw.json && raw.csv) throw new UsageError('--json and --csv cannot be used together');
	const settings = settingsFromOptions(raw);
	if (paths.length === 0)
		throw new UsageError('name at least one capture file or folder, e.g. sinecheck analyse board.csv');
	const limits = limitsFrom(raw.timeLimit, raw.memoryLimit);
	const { units, skipped, problems: pathProblems } = collectUnits(paths);
	const mode = raw.json ? 'json' : raw.csv ? 'csv' : 'table';
	if (skipped.length > 0 && raw.quiet !== true)
		io.err(printable(`note: skipped ${skipped.length} file(s) that are not captures (e.g. ${skipped[0]})`) + '\n');
	for (const p of pathProblems) io.err(`${problemText(p)}\n`);
	if (units.length === 0) {
		if (pathProblems.length === 0)
			io.err(
				printable(
					`sinecheck: no capture files found in ${paths.join(', ')} (looked for ${['.csv', '.txt', '.tsv', '.wav', '.cfg', '.cff'].join(' ')})`,
				) + '\n',
			);
		return 2;
	}
	const jobs = jobsFrom(raw.jobs, units.length);
	const progress = raw.progress === false ? progressBar(0) : progressBar(units.length);

	let badInput = pathProblems.length > 0;
	let limitFailed = false;
	let printedAny = false;
	let reports = 0;
	let problemUnits = pathProblems.length;
	let limitFailures = 0;
	let cellRefused = false;
	// --next-steps: the table shows the next-steps part, --csv gives its rows instead of the channel summary
	// (also shown in the table whenever a site value is given).
	const nextSteps = raw.nextSteps === true || (mode === 'table' && settings.analysis.site !== undefined);
	if (mode === 'csv') io.out((nextSteps ? NEXT_STEPS_CSV_COLUMNS.join(',') : csvSummaryHeader()) + '\r\n');
	const emit = (res: UnitResult) => {
		progress.clear();
		if (res.problems.length > 0) problemUnits++;
		reports += res.reports.length;
		for (const p of res.problems) {
			badInput = true;
			if (p.code === 'bad-number' && !settings.import.gaps) cellRefused = true;
			io.err(`${problemText(p)}\n`);
		}
		for (const r of res.reports) {
			if (r.limits && r.limits.pass === false) {
				limitFailed = true;
				limitFailures++;
			}
			io.out(render(r, mode, printedAny, nextSteps));
			if (mode !== 'table' && raw.quiet !== true)
				for (const a of noteworthy(r)) io.err(`${printable(`${r.file}: ${a}`)}\n`);
			printedAny = true;
		}
	};
	// Results arrive in completion order; print them in the order the files were given.
	const pending = new Map<number, UnitResult>();
	let nextToPrint = 0;
	await runUnits(
		units,
		settings,
		jobs,
		(index, result) => {
			progress.tick(units[index].files[0]);
			pending.set(index, result);
			while (pending.has(nextToPrint)) {
				emit(pending.get(nextToPrint)!);
				pending.delete(nextToPrint);
				nextToPrint++;
			}
		},
		{ heapMiB: limits.heapMiB ?? defaultHeapMiB(jobs), timeLimitS: limits.timeLimitS },
	);
	progress.done();
	if (cellRefused)
		io.err(
			'sinecheck: a cell that is not a number refused a file; --gaps reads such cells as gaps (listed, left out of the figures)\n',
		);
	// The summary line of a batch always prints (a file that crashed or timed out is counted with errors).
	if (units.length + pathProblems.length > 1 && raw.quiet !== true) {
		const failedLimits = limitFailures > 0 ? `; limits failed in ${limitFailures}` : '';
		io.err(
			`analysed ${reports} capture(s) from ${units.length + pathProblems.length} file set(s); ${problemUnits} with errors${failedLimits}\n`,
		);
	}
	return badInput ? 2 : limitFailed ? 1 : 0;
}

function render(r: ReportJson, mode: 'json' | 'csv' | 'table', printedAny: boolean, nextSteps: boolean): string {
	// Always one line per document: a JSON Lines stream whether one file or a folder of them was named,
	// so a script reads the output the same way in both cases (pipe through `jq .` to read it).
	// JSON: C1 and bidi controls as \u escapes (the same value, safe on a terminal). CSV cells are data for a
	// spreadsheet and go out as they are (formula-guarded and quoted). The table escapes control characters.
	if (mode === 'json') return printableJson(JSON.stringify(r)) + '\n';
	if (mode === 'csv')
		return (nextSteps ? nextStepsCsvRows(r) : csvSummaryRows(r)).map((line) => line + '\r\n').join('');
	return (
		(printedAny ? '\n' : '') +
		[...formatReport(r), ...(nextSteps ? formatNextSteps(r) : [])].map(printable).join('\n') +
		'\n'
	);
}

/** What --json/--csv repeat on stderr: the importer's assumptions and warnings, and every analysis warning. */
function noteworthy(r: ReportJson): string[] {
	const importer = (r.diagnostics ?? [])
		.filter((d) => d.severity !== 'info')
		.map((d) => (d.line ? `${d.message} (line ${d.line})` : d.message));
	return [...importer, ...r.warnings, ...r.channels.flatMap((c) => (c.warnings ?? []).map((w) => `${c.name}: ${w}`))];
}
