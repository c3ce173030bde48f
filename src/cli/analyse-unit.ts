/**
 * One analysis unit (a capture's files) -> JSON reports or located errors. Runs in a worker thread or
 * in-process; the result is plain data (structured-clone safe).
 */
import { isImportError, type ImportError } from '../../lib/io/index.js';
import { detectFileKind, DETECT_HEAD_BYTES, gapFreeSpan, openCaptures, openCsvChunks } from '../../lib/io/index.js';
import type { InputFile } from '../../lib/io/index.js';
import { analyseCapture } from '../../lib/report/index.js';
import { reportToJson, type ReportJson } from '../../lib/report/index.js';
import { problemFrom, problemLine, type FileProblem } from './error-line.js';
import { ANALYSE_MAX_FILE_BYTES, openRegularFileChunks, readRegularFile, tooLargeWords } from './file-checks.js';
import { UsageError } from './usage-error.js';
import type { CommandSettings } from './options.js';
import { importOptionsFrom } from './import-settings.js';

export type { FileProblem } from './error-line.js';

export interface UnitResult {
	files: string[];
	reports: ReportJson[];
	problems: FileProblem[];
}

/** The printed line of a problem: the shape `trend` uses too (src/cli/error-line.ts). */
export function problemText(p: FileProblem): string {
	return problemLine(p);
}

/**
 * The importer counts a CSV time column from 0; the command line counts from 1 (options.ts passes
 * --time-column N as index N - 1). Its out-of-range error is restated in the user's terms.
 */
function timeColumnProblem(e: ImportError, p: FileProblem, settings: CommandSettings): FileProblem {
	const index = settings.import.timeColumn;
	if (typeof index !== 'number' || e.code !== 'bad-option' || e.text !== `time column index ${index}`) return p;
	const columns = /the file has (\d+) column/.exec(e.expected)?.[1];
	const range =
		columns === undefined
			? "one of the file's columns, counting from 1"
			: `a column number from 1 to ${columns} (the file has ${columns} column${columns === '1' ? '' : 's'})`;
	return { ...p, message: `${e.code}: --time-column ${index + 1}: expected ${range}` };
}

function problemOf(e: unknown, fallbackFile: string, settings: CommandSettings): FileProblem {
	const p = problemFrom(e, fallbackFile);
	return isImportError(e) ? timeColumnProblem(e, p, settings) : p;
}

type Opened = ReturnType<typeof openCaptures>;

/**
 * A unit of one CSV file: read in pieces through one reused buffer (never held whole); null when the file
 * is not a CSV (it is then read whole, as every other format).
 * @throws UsageError when the file cannot be read
 */
function openSingleCsv(name: string, settings: CommandSettings): Opened | null {
	const file = openRegularFileChunks(name, DETECT_HEAD_BYTES);
	try {
		const kind = detectFileKind(name, file.head);
		if (kind.kind !== 'csv' || file.size === 0) return null;
		const options = importOptionsFrom(settings.import);
		try {
			return {
				captures: [openCsvChunks(name, file.size, (push) => file.eachChunk(push), options, kind.byName)],
				errors: [],
			};
		} catch (e) {
			if (isImportError(e)) return { captures: [], errors: [e] };
			throw e;
		}
	} finally {
		file.close();
	}
}

/** Reads the unit's files whole (COMTRADE pairs, WAV, several files); a file that cannot be read becomes the problem, under its own name. */
function readWhole(files: string[], settings: CommandSettings, result: UnitResult): InputFile[] | null {
	const inputs: InputFile[] = [];
	let total = 0;
	for (const name of files) {
		try {
			const bytes = readRegularFile(name, ANALYSE_MAX_FILE_BYTES, files[0]);
			total += bytes.length;
			if (total > ANALYSE_MAX_FILE_BYTES) throw new UsageError(tooLargeWords(total, ANALYSE_MAX_FILE_BYTES, files[0]));
			inputs.push({ name, bytes });
		} catch (e) {
			result.problems.push(problemOf(e, name, settings));
			return null;
		}
	}
	return inputs;
}

/** Reads the unit's files, imports and analyses them. Never throws: every failure becomes a problem. */
export function analyseUnit(files: string[], settings: CommandSettings): UnitResult {
	const result: UnitResult = { files, reports: [], problems: [] };
	let opened: Opened | null = null;
	try {
		if (files.length === 1) opened = openSingleCsv(files[0], settings);
	} catch (e) {
		result.problems.push(problemOf(e, files[0], settings));
		return result;
	}
	if (!opened) {
		const inputs = readWhole(files, settings, result);
		if (!inputs) return result;
		try {
			opened = openCaptures(inputs, importOptionsFrom(settings.import));
		} catch (e) {
			result.problems.push(problemOf(e, files[0], settings));
			return result;
		}
	}
	for (const e of opened.errors) result.problems.push(problemOf(e, files[0], settings));
	for (const capture of opened.captures) {
		try {
			const adjusted = settings.import.gaps ? gapFreeSpan(capture).capture : capture;
			result.reports.push(reportToJson(analyseCapture(adjusted, settings.analysis)));
		} catch (e) {
			result.problems.push(problemOf(e, capture.source, settings));
		}
	}
	return result;
}
