/**
 * The line cursor the .cfg reader walks with: the next line's fields, strict numbers, and errors that
 * point at the line and column (shifted by `lineOffset` for a CFF section).
 */
import type { Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { type Field, splitFields, strictNumber } from './text.js';

export type CfgErrorCode = 'cfg-syntax' | 'cfg-count-mismatch';

/** What a number field must be: an integer, at least `min`; `blank` is the value of an empty field. */
export interface CfgNumberRule {
	int?: boolean;
	min?: number;
	blank?: number;
}

/** Drop one trailing empty field (a line ending in a comma) when the line has one field more than `wanted`. */
export function trimTrailing(f: Field[], wanted: number): Field[] {
	return f.length === wanted + 1 && f[wanted].text === '' ? f.slice(0, wanted) : f;
}

/** Reads a .cfg line by line; `at` is the index of the next line to read. */
export class CfgCursor {
	at = 0;
	readonly diagnostics: Diagnostic[] = [];
	readonly metadata: Record<string, string> = {};

	constructor(
		readonly lines: string[],
		readonly source: string,
		readonly lineOffset: number,
	) {}

	/** 1-based line number of line index `k` in the file. */
	lineNo(k: number): number {
		return k + 1 + this.lineOffset;
	}

	/** Index of the line read last. */
	get last(): number {
		return this.at - 1;
	}

	/** True while lines are left. */
	get more(): boolean {
		return this.at < this.lines.length;
	}

	fail(k: number, column: number, code: CfgErrorCode, got: string, expected: string): never {
		throw new ImportError(this.source, this.lineNo(k), column, code, got, expected);
	}

	/** The fields of the next line; `what` names the line in the error when the file ends first. */
	next(what: string): Field[] {
		if (this.at >= this.lines.length)
			this.fail(this.at, 0, 'cfg-syntax', '', `${what} (the file ends at line ${this.lineNo(this.at - 1)})`);
		return splitFields(this.lines[this.at++]);
	}

	/** The fields of the next line without moving past it (undefined at the end). */
	peek(): Field[] | undefined {
		return this.more ? splitFields(this.lines[this.at]) : undefined;
	}

	/** A strict number from field `f` of line `k`; `what` is the expectation in the error. */
	num(f: Field | undefined, k: number, what: string, opt?: CfgNumberRule): number {
		const t = f?.text ?? '';
		if (t === '' && opt?.blank !== undefined) return opt.blank;
		const v = strictNumber(t);
		if (!Number.isFinite(v) || (opt?.int && !Number.isInteger(v)) || (opt?.min !== undefined && v < opt.min)) {
			this.fail(k, f?.column ?? this.lines[k].length + 1, 'cfg-syntax', t, what);
		}
		return v;
	}
}
