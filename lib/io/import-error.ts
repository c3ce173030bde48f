/**
 * The one error every importer throws for input it cannot read. It names the file, the 1-based line and
 * column, a stable code, the offending text and what was expected, so front ends can show it in place.
 */
export type ImportErrorCode =
	| 'empty-file'
	| 'binary-as-text'
	| 'missing-header'
	| 'bad-number'
	| 'short-row'
	| 'long-row'
	| 'time-not-increasing'
	| 'no-time-base'
	| 'no-data'
	| 'bad-option'
	| 'unsupported-format'
	| 'bad-wav'
	| 'cfg-syntax'
	| 'cfg-count-mismatch'
	| 'dat-too-short'
	| 'dat-syntax'
	| 'dat-type-mismatch'
	| 'out-of-range'
	| 'missing-companion-file'
	| 'too-large'
	| 'not-same-recording'
	| 'internal-error';

export class ImportError extends Error {
	override readonly name = 'ImportError';
	constructor(
		/** File name as given by the caller, or '<input>'. */
		readonly source: string,
		/** 1-based line (for binary files: 0, and `column` is the byte offset + 1). */
		readonly line: number,
		/** 1-based column in characters (0 when the error concerns the whole line or file). */
		readonly column: number,
		readonly code: ImportErrorCode,
		/** The offending text (cell, line or field), shortened to 80 characters. */
		readonly text: string,
		/** What was expected there, in words. */
		readonly expected: string,
	) {
		super(
			`${source}:${line}:${column}: ${code}: expected ${expected}${text ? `, got ${JSON.stringify(text.slice(0, 80))}` : ''}`,
		);
	}
}

/** Type guard usable across worker boundaries (structured clone drops the prototype). */
export function isImportError(e: unknown): e is ImportError {
	return typeof e === 'object' && e !== null && (e as { name?: unknown }).name === 'ImportError';
}
