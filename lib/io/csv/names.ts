/**
 * What a column name says: time or sample index, voltage or current, which phase, min/max envelope.
 * Letter conventions are common practice: U or V for voltage, I for current (IEC 60050 letter symbols,
 * from memory); phases L1/L2/L3, A/B/C, R/S/T, R/Y/B, U/V/W or 1/2/3; N for neutral.
 */
import type { Quantity } from '../../capture.js';

const TIME_NAME = /^(t|time|times|zeit|temps|tiempo|tempo|timestamp|time ?stamp|elapsed|elapsed time|rel\.? ?time|relative time|x|sec|seconds|time ?\(.*\))$/i;
const INDEX_NAME = /^(sample|samples|sample ?(no\.?|nr\.?|number|index|#)|index|idx|n|no\.?|nr\.?|#|point|pt|pts|record|rec)$/i;

/** True when the name denotes a time column. */
export function isTimeName(name: string): boolean {
	return TIME_NAME.test(name.trim());
}

/** True when the name denotes a sample number column. */
export function isIndexName(name: string): boolean {
	return INDEX_NAME.test(name.trim());
}

/** min/max envelope columns of a peak-detect export: 'U1 min', 'U1_max', 'min(U1)', 'Max U1'. */
export function minMaxOf(name: string): { base: string; which: 'min' | 'max' } | null {
	if (name.length > 120) return null;
	let m = /^(.+?)[\s_.-]+(min|max|minimum|maximum)$/i.exec(name.trim());
	if (m) return { base: m[1], which: m[2].toLowerCase().startsWith('min') ? 'min' : 'max' };
	m = /^(min|max|minimum|maximum)\b[\s_.(-]*(.+?)\)?$/i.exec(name.trim());
	if (m) return { base: m[2], which: m[1].toLowerCase().startsWith('min') ? 'min' : 'max' };
	return null;
}

/** Voltage or current from the name alone, or null when the name does not say. */
export function quantityFromName(name: string): Quantity | null {
	const n = name.trim().slice(0, 120);
	if (/(volt|voltage|spannung|tension|tensi[oó]n|u_?ln|u_?ll)/i.test(n)) return 'voltage';
	if (/(current|strom|courant|corriente|amp)/i.test(n)) return 'current';
	if (/^(u|v|e)(?![a-z]{2})[\s_-]?(l?[1-3]|[a-c]|[rsty]|[uvw]|n)?([\s_-]?(n|l?[1-3]|[a-c]))?\b/i.test(n)) return 'voltage';
	if (/^l[1-3][\s_-]?(n|l[1-3])$/i.test(n)) return 'voltage';
	if (/^i(?![a-z]{2})[\s_-]?(l?[1-3]|[a-c]|[rsty]|[uvw]|n)?\b/i.test(n)) return 'current';
	return null;
}

/**
 * Phase label from a channel name, only when the name is one of the clear forms: a quantity letter then a
 * phase (`U1`, `UL2`, `Ia`, `V_B`, `IR`, `UL1-N`), a bare phase (`L3`, `L1-N`), or `Phase B` style.
 * Line-to-line names give 'L1-L2'; the neutral gives 'N'.
 */
export function phaseFromName(name: string): string | undefined {
	const n = name.trim().slice(0, 120);
	let m = /^(?:[uvei][\s_-]?)?(l?[1-3]|[a-c])[\s_-]?(l?[1-3]|[a-c])$/i.exec(n);
	if (m && m[1].toUpperCase() !== m[2].toUpperCase() && !/n/i.test(m[2])) return `${m[1].toUpperCase()}-${m[2].toUpperCase()}`;
	m = /^(?:[uvi][\s_-]?)?(l[1-3]|[1-3]|[abc]|[rst]|y|[uvw]|n)(?:[\s_-]?n)?$/i.exec(n);
	if (m && !/^[uvi]$/i.test(n)) return m[1].toUpperCase();
	m = /^(?:phase|ph|line)[\s_-]*(l?[1-3]|[abc]|[rst]|y)\b/i.exec(n);
	if (m) return m[1].toUpperCase();
	return undefined;
}
