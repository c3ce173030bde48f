/**
 * Which picked files belong together: a COMTRADE record is a .cfg with its .dat (and optional .hdr/.inf)
 * sharing a stem; every other file stands alone. Pure, so the picker, drag-and-drop and the demo loader
 * all group the same way.
 */

const COMTRADE_PARTS = ['cfg', 'dat', 'hdr', 'inf'];

function split(name: string): { stem: string; ext: string } {
	const base = name.replace(/^.*[\\/]/, '');
	const dot = base.lastIndexOf('.');
	return dot > 0 ? { stem: base.slice(0, dot), ext: base.slice(dot + 1).toLowerCase() } : { stem: base, ext: '' };
}

/** File extensions the analyser opens (lower case, without dot). */
export const OPENABLE_EXTENSIONS = ['csv', 'txt', 'tsv', 'wav', 'cfg', 'dat', 'cff', 'hdr', 'inf'];

/**
 * Groups file names into captures, keeping the caller's order of first appearance.
 * @example groupFiles(['a.csv', 'F1.CFG', 'F1.dat', 'b.wav']) // [['a.csv'], ['F1.CFG', 'F1.dat'], ['b.wav']]
 */
export function groupFiles<T extends { name: string }>(files: readonly T[]): T[][] {
	const groups: T[][] = [];
	const byStem = new Map<string, T[]>();
	for (const f of files) {
		const { stem, ext } = split(f.name);
		if (COMTRADE_PARTS.includes(ext)) {
			const key = stem.toLowerCase();
			let g = byStem.get(key);
			if (!g) {
				g = [];
				byStem.set(key, g);
				groups.push(g);
			}
			g.push(f);
		} else {
			groups.push([f]);
		}
	}
	// .cfg first inside a COMTRADE group, so the group is named after its configuration file
	for (const g of groups) g.sort((a, b) => rank(a.name) - rank(b.name));
	return groups;
}

function rank(name: string): number {
	const i = COMTRADE_PARTS.indexOf(split(name).ext);
	return i < 0 ? 0 : i;
}

/** Display label of a group: its first file's name. */
export function groupLabel(group: readonly { name: string }[]): string {
	return group[0]?.name.replace(/^.*[\\/]/, '') ?? '';
}
