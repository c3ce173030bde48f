/**
 * Text from files (file names, channel names, offending text) made safe to print on a terminal: control
 * characters (C0, DEL, C1) and the characters that reorder or break a line (bidirectional embedding and
 * isolate controls, line and paragraph separators) are written as visible escapes, so a file name can
 * neither move the cursor, recolour the terminal, hide text nor split one report line into two.
 * Ref: ECMA-48 (C0 and C1 control sets) and Unicode UAX #9 (explicit directional formatting characters)
 * (common practice; from memory).
 */

// control characters are exactly what this pattern is for
// eslint-disable-next-line no-control-regex
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const NAMED: Record<string, string> = { '\t': '\\t', '\n': '\\n', '\r': '\\r' };

function escape(c: string): string {
	const code = c.charCodeAt(0);
	return (
		NAMED[c] ?? (code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`)
	);
}

/**
 * `text` with every unsafe character escaped (`\x1b`, `\n`, `\u202e`...).
 * @example printable('a\x1b[31mb.csv') // 'a\\x1b[31mb.csv'
 */
export function printable(text: string): string {
	return text.replace(UNSAFE, escape);
}

/**
 * A JSON text with the characters JSON.stringify leaves raw but a terminal acts on (DEL, C1, bidi
 * controls, U+2028/U+2029) written as \u escapes: the same JSON value, safe to print.
 */
export function printableJson(json: string): string {
	return json.replace(
		/[\u007f-\u009f\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g,
		(c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`,
	);
}
