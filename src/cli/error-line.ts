/**
 * The one shape of a per-file error line, shared by `analyse` and `trend`:
 * `sinecheck: <path as given>[:line[:column]]: <message>`, line and column left out when 0, and
 * `sinecheck: <path>: byte N: <message>` for an offset in a binary file (an ImportError of a binary file
 * carries line 0 and column = offset + 1, lib/io/import-error.ts).
 */
import { isImportError } from '../../lib/io/import-error.js';
import { UsageError } from './usage-error.js';

/** Every error line starts so. */
export const ERROR_PREFIX = 'sinecheck: ';

/** A per-file problem as plain data (structured-clone safe, so a worker thread can send it). */
export interface FileProblem {
	file: string;
	/** 1-based; 0 or absent when the problem is not at a line. */
	line?: number;
	/** 1-based column when `line` > 0; for a binary file (line 0) the byte offset + 1; 0 or absent when unknown. */
	column?: number;
	code: string;
	/** The text after the place, e.g. `bad-number: expected a number, got "x"`. */
	message: string;
	/** true when `message` already starts with the file name (printed once, not twice). */
	namesFile?: boolean;
}

/** `path:line:column`, `path:line`, `path: byte N` or `path`. */
export function errorPlace(file: string, line = 0, column = 0): string {
	if (line > 0) return `${file}:${line}${column > 0 ? `:${column}` : ''}`;
	return column > 0 ? `${file}: byte ${column - 1}` : file;
}

/** The printed line of a problem (no trailing newline). */
export function problemLine(p: FileProblem): string {
	if (p.namesFile) return `${ERROR_PREFIX}${p.message}`;
	return `${ERROR_PREFIX}${errorPlace(p.file, p.line, p.column)}: ${p.message}`;
}

/**
 * Any error thrown while reading or analysing `file` (the path as the user gave it) as a problem: an
 * ImportError keeps its place (it names its own file, e.g. the .dat beside a .cfg, when it has one);
 * a UsageError or RangeError (a setting that does not fit the file) is its message after the path;
 * anything else is `could not analyse: <message>`.
 */
export function problemFrom(e: unknown, file: string): FileProblem {
	if (isImportError(e)) {
		const got = e.text ? `, got ${JSON.stringify(e.text.slice(0, 80))}` : '';
		return { file: e.source || file, line: e.line, column: e.column, code: e.code, message: `${e.code}: expected ${e.expected}${got}` };
	}
	const message = e instanceof Error ? e.message : String(e);
	if (e instanceof UsageError || e instanceof RangeError) {
		// Library messages may already start with the path; the line names it once.
		if (message.startsWith(`${file}: `)) return { file, code: 'bad-option', message: message.slice(file.length + 2) };
		if (message.startsWith(`${file} `)) return { file, code: 'bad-option', message, namesFile: true };
		return { file, code: 'bad-option', message };
	}
	return { file, code: 'internal-error', message: `could not analyse: ${message}` };
}

/** One error line for an error met while handling `file`. */
export function errorLine(e: unknown, file: string): string {
	return problemLine(problemFrom(e, file));
}
