/**
 * Header cells and unit text: `U1 (V)`, `U1 [V]`, `U1/V`, `U1 in V` -> name and unit; unit prefixes
 * (mV, kV, mA, kA, us, ms) -> SI base unit and factor (readUnit, in lib/channel-identity.ts, shared by every importer).
 */
import { readUnit } from '../../channel-identity.js';

export { readUnit, type ReadUnit } from '../../channel-identity.js';

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
	if (m && !/^(phase|ph|line|l[123]|[abc])$/i.test(m[1].split(/[\s_]+/).pop() ?? ''))
		return { name: m[1], unitText: m[2] };
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
