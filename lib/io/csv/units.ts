/**
 * Header cells and unit text: `U1 (V)`, `U1 [V]`, `U1/V`, `U1 in V` -> name and unit; unit prefixes
 * (mV, kV, mA, kA, us, ms) -> SI base unit and factor. Prefixes per the SI brochure (BIPM, 9th ed., 3).
 */
import type { Quantity } from '../../capture.js';

/** A unit as written, read: base unit ('V', 'A', 's', or the text itself), factor to it, what it measures. */
export interface ReadUnit {
	unit: string;
	factor: number;
	kind: Quantity | 'time' | 'counts';
}

const PREFIX: Record<string, number> = { n: 1e-9, u: 1e-6, µ: 1e-6, μ: 1e-6, m: 1e-3, '': 1, k: 1e3, K: 1e3, M: 1e6 };

/** Reads unit text such as 'mV', 'kA', '(V)', 'Volts', 'ms', 'µs', 'counts'. Null when empty. */
export function readUnit(text: string): ReadUnit | null {
	if (text.length > 40) return { unit: text, factor: 1, kind: 'other' };
	let t = text.trim().replace(/^[([{]\s*|\s*[)\]}]$/g, '').trim();
	if (t === '') return null;
	t = t.replace(/\s*(rms|pk|peak|inst)$/i, '').replace(/^(volts?|v)$/i, 'V').replace(/^(amps?|amperes?|a)$/i, 'A');
	const m = /^(n|u|µ|μ|m|k|K|M)?(V|A|s|sec|secs|seconds?)$/.exec(t);
	if (m) {
		const base = m[2] === 'V' ? 'V' : m[2] === 'A' ? 'A' : 's';
		const factor = PREFIX[m[1] ?? ''];
		// 'Ms' (megasecond) and 'ks' are not time units anyone writes for samples; treat as unknown text.
		if (base === 's' && factor > 1) return { unit: t, factor: 1, kind: 'other' };
		return { unit: base, factor, kind: base === 'V' ? 'voltage' : base === 'A' ? 'current' : 'time' };
	}
	if (/^(counts?|lsb|raw|adc|digits?|codes?)$/i.test(t)) return { unit: t, factor: 1, kind: 'counts' };
	return { unit: t, factor: 1, kind: 'other' };
}

/** Splits a header cell into name and unit text: `U1 (V)`, `U1 [mV]`, `U1/V`, `U1 in V`, `U1 V`. */
export function splitNameUnit(cell: string): { name: string; unitText: string } {
	const c = cell.trim();
	// long cells are not names; the patterns below would also backtrack on them for too long
	if (c.length > 120) return { name: c, unitText: '' };
	let m = /^(.*?)\s*[([{]\s*([^()[\]{}]*?)\s*[)\]}]$/.exec(c);
	if (m && m[1] !== '') return { name: m[1].trim(), unitText: m[2] };
	m = /^(.*?\S)\s*\/\s*([^/\s]+)$/.exec(c);
	if (m && readUnit(m[2])?.kind !== 'other') return { name: m[1], unitText: m[2] };
	m = /^(.*?\S)\s+in\s+(\S+)$/i.exec(c);
	if (m && readUnit(m[2])?.kind !== 'other') return { name: m[1], unitText: m[2] };
	m = /^(.*?\S)[\s_]+(mV|kV|V|mA|kA|A|s|ms|us|µs|ns)$/.exec(c);
	if (m && !/^(phase|ph|line|l[123]|[abc])$/i.test(m[1].split(/[\s_]+/).pop() ?? '')) return { name: m[1], unitText: m[2] };
	return { name: c, unitText: '' };
}

/** True when every non-empty cell reads as a known unit (a units row). */
export function looksLikeUnitsRow(cells: string[]): boolean {
	let known = 0;
	for (const c of cells) {
		if (c.trim() === '') continue;
		const u = readUnit(c);
		if (!u || u.kind === 'other') return false;
		known++;
	}
	return known > 0;
}
