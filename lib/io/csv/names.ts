/**
 * What a column name says beyond the channel's identity: a time or sample index column, a min/max
 * envelope. Voltage or current and the phase come from lib/channel-identity.ts, as in every importer.
 */

const TIME_NAME =
	/^(t|time|times|zeit|temps|tiempo|tempo|timestamp|time ?stamp|elapsed|elapsed time|rel\.? ?time|relative time|x|sec|seconds|time ?\(.*\))$/i;
const INDEX_NAME =
	/^(sample|samples|sample ?(no\.?|nr\.?|number|index|#)|index|idx|n|no\.?|nr\.?|#|point|pt|pts|record|rec)$/i;

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
