/**
 * The files of a recording named in a sentence, the same way in the CLI and the browser: each file by its
 * name, their shared folder said once, and past FILE_LIST_ALL_MAX files the first few, how many more and
 * the last, so a week of hourly files stays one line.
 */

/** Up to this many files are each named; more are shortened to the first FILE_LIST_HEAD, a count and the last. */
export const FILE_LIST_ALL_MAX = 4;
const FILE_LIST_HEAD = 3;

/** `a`, `a and b`, `a, b and c`. */
function joinNames(names: readonly string[]): string {
	if (names.length <= 1) return names.join('');
	return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** Where the folder part of a path ends (after its last / or \), 0 when it has none. */
function nameStart(path: string): number {
	return Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\')) + 1;
}

/**
 * The files named compactly, in the order given.
 * @param sources  file names or paths, as the user gave them
 * @returns the names joined in words; when every path is in one folder, the names alone and
 *   `(in <folder>)` once
 * @example fileList(['hx/h1.csv', 'hx/h2.csv', 'hx/h10.csv']) // 'h1.csv, h2.csv and h10.csv (in hx)'
 * @example fileList(hourlyFiles) // 'h001.csv, h002.csv, h003.csv and 164 more, up to h168.csv'
 */
export function fileList(sources: readonly string[]): string {
	const folder = sources.length > 1 ? sources[0].slice(0, nameStart(sources[0])) : '';
	const shared = folder !== '' && sources.every((s) => s.slice(0, nameStart(s)) === folder);
	const names = shared ? sources.map((s) => s.slice(folder.length)) : [...sources];
	const where = shared ? ` (in ${folder.replace(/[/\\]+$/, '') || folder})` : '';
	if (names.length <= FILE_LIST_ALL_MAX) return joinNames(names) + where;
	const more = names.length - FILE_LIST_HEAD - 1;
	return `${names.slice(0, FILE_LIST_HEAD).join(', ')} and ${more} more, up to ${names[names.length - 1]}${where}`;
}
