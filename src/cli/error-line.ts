/**
 * The one shape of a per-file error line, shared by `analyse` and `trend`:
 * `sinecheck: <path as given>[:line[:column]]: <message>`, line and column left out when 0, and
 * `sinecheck: <path>: byte N: <message>` for an offset in a binary file (an ImportError of a binary file
 * carries line 0 and column = offset + 1, lib/io/import-error.ts).
 */
import { isImportError } from '../../lib/io/index.js';
import { fsErrorWords } from './file-checks.js';
import { printable } from './printable.js';
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

/** The printed line of a problem (no trailing newline); control characters in names are escaped. */
export function problemLine(p: FileProblem): string {
	if (p.namesFile) return printable(`${ERROR_PREFIX}${p.message}`);
	return printable(`${ERROR_PREFIX}${errorPlace(p.file, p.line, p.column)}: ${p.message}`);
}

/** Appended to a reworded message when SINECHECK_DEBUG is set: the original text, for a bug report. */
function detail(e: unknown): string {
	if (!process.env.SINECHECK_DEBUG) return '';
	const err = e instanceof Error ? e : new Error(String(e));
	return ` [detail: ${err.name}: ${err.message}]${process.env.SINECHECK_DEBUG === 'stack' && err.stack ? `\n${err.stack}` : ''}`;
}

/** Engine and library texts that mean "too much data for one piece of memory". */
const TOO_BIG =
	/Invalid (typed )?array length|Array buffer allocation failed|allocation failed|out of memory|"size" (argument )?is out of range|ERR_FS_FILE_TOO_LARGE|ERR_BUFFER_TOO_LARGE|ERR_STRING_TOO_LONG|Cannot create a string longer|string longer than/i;

/**
 * RangeError texts of lib/ written for programmers (a parameter name, a contract), as opposed to those
 * written for users (a reference or pairing channel the file does not have).
 */
const INTERNAL_RANGE =
	/^[a-z]+[A-Z]\w*\b|^cycles must|^threshold \w+ must|must satisfy|does not lie inside|bad span|no windows|windows differ|dft|mixed-radix|harmonic sets|push expects|bins for order|differ in length|^ref has|at least one channel|needs? [a-z]+[A-Z]|Maximum call stack|Invalid|out of range/;

/** True for a message written for the program rather than a user: every non-RangeError, and internal RangeErrors. */
function looksInternal(e: unknown, message: string): boolean {
	if (e instanceof UsageError) return false;
	if (!(e instanceof RangeError)) return true;
	return INTERNAL_RANGE.test(message) || TOO_BIG.test(message);
}

/**
 * An internal error text in words a user can act on. The original text is kept only under
 * SINECHECK_DEBUG (see detail()).
 */
export function userWords(e: unknown): string {
	const err = e as NodeJS.ErrnoException;
	const message = e instanceof Error ? e.message : String(e);
	if (TOO_BIG.test(message) || TOO_BIG.test(err?.code ?? '')) {
		return 'the file holds more data than analyse can hold in memory at once; for long recordings use `sinecheck trend <file>`, which reads it in pieces';
	}
	if (/Maximum call stack/.test(message))
		return 'the record is too long for analyse; for long recordings use `sinecheck trend <file>`';
	if (typeof err?.code === 'string' && /^E[A-Z]+$/.test(err.code))
		return `cannot read the file: ${fsErrorWords(err.code)}`;
	if (/fundamentalHz|sampleRateHz|frequency|\bf1\b|fs\b/.test(message)) {
		return 'could not analyse: no usable fundamental frequency or sample rate could be taken from the samples (check the time column, or give --rate)';
	}
	if (/differ in length/.test(message)) return 'could not analyse: the channels hold different numbers of samples';
	if (/thresholds must satisfy/.test(message))
		return 'the thresholds must keep interruption < dip < 100 % < swell (of the declared voltage)';
	return 'could not analyse: an internal check failed on the data of this file (a fault in sinecheck: please report it with the file; SINECHECK_DEBUG=1 shows the detail)';
}

/**
 * Any error thrown while reading or analysing `file` (the path as the user gave it) as a problem: an
 * ImportError keeps its place (it names its own file, e.g. the .dat beside a .cfg, when it has one);
 * a UsageError, or a RangeError written for users (a setting that does not fit the file), is its message
 * after the path; anything else (an engine or internal message) is put in user words (userWords).
 */
export function problemFrom(e: unknown, file: string): FileProblem {
	if (isImportError(e)) {
		const got = e.text ? `, got ${JSON.stringify(e.text.slice(0, 80))}` : '';
		return {
			file: e.source || file,
			line: e.line,
			column: e.column,
			code: e.code,
			message: `${e.code}: expected ${e.expected}${got}`,
		};
	}
	const message = e instanceof Error ? e.message : String(e);
	if (!looksInternal(e, message)) {
		// Library messages may already start with the path; the line names it once.
		if (message.startsWith(`${file}: `)) return { file, code: 'bad-option', message: message.slice(file.length + 2) };
		if (message.startsWith(`${file} `)) return { file, code: 'bad-option', message, namesFile: true };
		return { file, code: 'bad-option', message };
	}
	return { file, code: 'internal-error', message: userWords(e) + detail(e) };
}

/** One error line for an error met while handling `file`. */
export function errorLine(e: unknown, file: string): string {
	return problemLine(problemFrom(e, file));
}
