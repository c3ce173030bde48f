/**
 * A small delimited-text writer for the demo captures: optional preamble lines, a names row, an optional
 * units row, then one row per sample. Decimal comma when asked (then the delimiter must not be a comma).
 */

export interface CsvWriteSpec {
	delimiter: ',' | ';' | '\t';
	decimalComma?: boolean;
	lineEnd?: '\n' | '\r\n';
	/** Lines written verbatim before the table. */
	preamble?: string[];
	names: string[];
	/** A units row under the names, when given. */
	units?: string[];
	columns: ArrayLike<number>[];
	/** Digits after the decimal mark, per column. */
	decimals: number[];
}

export function csvText(spec: CsvWriteSpec): string {
	if (spec.decimalComma && spec.delimiter === ',') throw new RangeError('a decimal comma needs another delimiter');
	const eol = spec.lineEnd ?? '\r\n';
	const out: string[] = [...(spec.preamble ?? []), spec.names.join(spec.delimiter)];
	if (spec.units) out.push(spec.units.join(spec.delimiter));
	const n = spec.columns[0].length;
	const fmt = spec.columns.map((_, c) => (v: number) => {
		let s = v.toFixed(spec.decimals[c]);
		if (/^-0(\.0*)?$/.test(s)) s = s.slice(1); // no "-0.000"
		return spec.decimalComma ? s.replace('.', ',') : s;
	});
	for (let k = 0; k < n; k++) out.push(spec.columns.map((col, c) => fmt[c](col[k])).join(spec.delimiter));
	return out.join(eol) + eol;
}
