/**
 * Line and field splitting for COMTRADE text (.cfg, ASCII .dat), keeping 1-based columns so errors can
 * point at the offending field. Accepts CRLF, LF and lone CR line ends.
 */

export interface Field {
	/** Field text with surrounding spaces removed. */
	text: string;
	/** 1-based column of the first non-space character (of the field start when blank). */
	column: number;
}

/** Split one line at commas; columns are 1-based character positions in the line. */
export function splitFields(line: string): Field[] {
	const out: Field[] = [];
	let start = 0;
	for (;;) {
		const comma = line.indexOf(',', start);
		const end = comma < 0 ? line.length : comma;
		const raw = line.slice(start, end);
		const lead = raw.length - raw.trimStart().length;
		out.push({ text: raw.trim(), column: start + 1 + (raw.trim() ? lead : 0) });
		if (comma < 0) return out;
		start = comma + 1;
	}
}

/** Split text into lines at CRLF, LF or CR; says which line end the text mostly uses. */
export function splitLines(text: string): { lines: string[]; lineEnd: 'CRLF' | 'LF' | 'CR' | 'none' } {
	const lines = text.split(/\r\n|\n|\r/);
	const crlf = text.indexOf('\r\n') >= 0;
	const lf = /(^|[^\r])\n/.test(text);
	const lineEnd = crlf && !lf ? 'CRLF' : lf ? 'LF' : text.indexOf('\r') >= 0 ? 'CR' : 'none';
	return { lines, lineEnd };
}

/** Strict number: decimal or scientific notation, nothing else (no hex, no blank). NaN otherwise. */
export function strictNumber(text: string): number {
	return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text) ? Number(text) : NaN;
}

/** Decode text bytes: UTF-8 when valid (BOM dropped), else Latin-1 (older recorders), saying which. */
export function decodeText(bytes: Uint8Array): { text: string; encoding: 'utf-8' | 'latin1' } {
	try {
		const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
		return { text: text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, encoding: 'utf-8' };
	} catch {
		return { text: new TextDecoder('latin1').decode(bytes), encoding: 'latin1' };
	}
}
