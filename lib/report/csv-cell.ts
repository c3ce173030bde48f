/**
 * The one CSV cell writer every CSV output uses (`analyse --csv`, `trend --csv`, the browser's CSV
 * download), so text taken from a file (a channel name, a unit, a file name) can never reach a
 * spreadsheet as a live formula.
 *
 * Formula guard: a spreadsheet reads a cell as a formula when its first character is = + - or @, and
 * some programs strip a leading tab, carriage return, line feed or NUL (and spaces) before looking; the
 * full-width forms U+FF1D U+FF0B U+FF0D U+FF20 (and the small forms U+FE66 U+FE62 U+FE63 U+FE6B) are
 * folded to their ASCII twins by some spreadsheets. Such a cell gets a leading apostrophe (the
 * "treat as text" mark) and is enclosed in double quotes.
 * Ref: OWASP "CSV Injection" page (leading = + - @ tab CR: prefix a single quote, quote the field; from
 * memory) and OWASP ASVS 5.0 requirement 1.2.10 (= + - @ tab and NUL as first character escaped with a
 * single quote; RFC 4180 2.6 and 2.7 escaping) (common practice).
 * A plain decimal number such as -1.5 or +2e-3 is left as it is: it is data, not a formula, and must stay
 * a number in the spreadsheet; "-2+3" or "-1+T(...)" is not a plain number and is guarded.
 *
 * Quoting: RFC 4180 section 2, rules 6 and 7: a field holding the delimiter, a double quote, CR or LF is
 * enclosed in double quotes and each double quote inside is doubled.
 */

/** First characters that make a spreadsheet treat a cell as a formula (or that it strips before looking). */
const FORMULA_START = /^[\s\0]*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20\uFE66\uFE62\uFE63\uFE6B]|^[\t\r\n\0]/;

/** A plain decimal number, optionally signed, with an optional exponent: left as data. */
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * True when a spreadsheet could read `text` as a formula.
 * @example startsLikeFormula('=SUM(A1:A9)') // true
 * @example startsLikeFormula('-1.5') // false (a plain number)
 * @example startsLikeFormula('\uFF1D1+1') // true (full-width equals sign)
 */
export function startsLikeFormula(text: string): boolean {
	return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text);
}

/**
 * `text` as one CSV field: formula-like text gets a leading apostrophe and is quoted; any field holding
 * the delimiter, a double quote, CR or LF is quoted with inner quotes doubled (RFC 4180).
 * @param delimiter  the field separator of the document (',' by default)
 * @example csvCell('U1 rms (V)') // 'U1 rms (V)'
 * @example csvCell('-1+T("x")') // `"'-1+T(""x"")"`
 * @example csvCell('-1.5') // '-1.5'
 */
export function csvCell(text: string, delimiter = ','): string {
	const guarded = startsLikeFormula(text);
	const t = guarded ? `'${text}` : text;
	if (guarded || t.includes(delimiter) || /["\r\n]/.test(t)) return `"${t.replace(/"/g, '""')}"`;
	return t;
}

/** A numeric field: the shortest round-trip decimal; empty for NaN, ±Infinity, null or undefined. */
export function csvNumberCell(value: number | null | undefined): string {
	return typeof value === 'number' && Number.isFinite(value) ? String(value) : '';
}
