/**
 * One analysis unit (a capture's files) -> JSON reports or located errors. Runs in a worker thread or
 * in-process; the result is plain data (structured-clone safe).
 */
import { readFileSync } from 'node:fs';
import { isImportError } from '../../lib/io/import-error.js';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson, type ReportJson } from '../../lib/report/to-json.js';
import type { CommandSettings } from './options.js';
import { importOptionsFrom, applyImportSettings } from './import-settings.js';

/** A per-file problem, as data: printed once to stderr as `file:line:column: message`. */
export interface FileProblem {
	file: string;
	/** 1-based; 0 or absent when the problem is not at a line. */
	line?: number;
	column?: number;
	code: string;
	message: string;
}

export interface UnitResult {
	files: string[];
	reports: ReportJson[];
	problems: FileProblem[];
}

/** Located text of a problem: `file:line:column: message` (line/column omitted when unknown). */
export function problemText(p: FileProblem): string {
	const where = p.line ? `${p.file}:${p.line}:${p.column ?? 0}` : p.file;
	return `${where}: ${p.message}`;
}

function problemOf(e: unknown, fallbackFile: string): FileProblem {
	if (isImportError(e)) {
		const got = e.text ? `, got ${JSON.stringify(e.text.slice(0, 80))}` : '';
		return { file: e.source || fallbackFile, line: e.line, column: e.column, code: e.code, message: `${e.code}: expected ${e.expected}${got}` };
	}
	if (e instanceof RangeError) {
		// Library messages may already start with the file name; the printed line names it once.
		const message = e.message.startsWith(`${fallbackFile}: `) ? e.message.slice(fallbackFile.length + 2) : e.message;
		return { file: fallbackFile, code: 'bad-option', message };
	}
	const message = e instanceof Error ? e.message : String(e);
	return { file: fallbackFile, code: 'internal-error', message: `could not analyse: ${message}` };
}

/** Reads the unit's files, imports and analyses them. Never throws: every failure becomes a problem. */
export function analyseUnit(files: string[], settings: CommandSettings): UnitResult {
	const result: UnitResult = { files, reports: [], problems: [] };
	let inputs: { name: string; bytes: Uint8Array }[];
	try {
		inputs = files.map((name) => ({ name, bytes: readFileSync(name) }));
	} catch (e) {
		const err = e as NodeJS.ErrnoException;
		result.problems.push({ file: err.path ?? files[0], code: 'unreadable', message: `cannot read the file (${err.code ?? err.message})` });
		return result;
	}
	let opened: ReturnType<typeof openCaptures>;
	try {
		opened = openCaptures(inputs, importOptionsFrom(settings.import));
	} catch (e) {
		result.problems.push(problemOf(e, files[0]));
		return result;
	}
	for (const e of opened.errors) result.problems.push(problemOf(e, files[0]));
	for (const capture of opened.captures) {
		try {
			const adjusted = applyImportSettings(capture, settings.import);
			result.reports.push(reportToJson(analyseCapture(adjusted, settings.analysis)));
		} catch (e) {
			result.problems.push(problemOf(e, capture.source));
		}
	}
	return result;
}
