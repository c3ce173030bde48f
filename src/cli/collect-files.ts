/**
 * Command-line paths -> analysis units. A folder is walked (sorted, hidden entries and node_modules
 * skipped); a COMTRADE .cfg travels with its .dat (and .hdr/.inf) of the same stem, so one unit is what
 * one capture needs. The walk never stops on a bad entry: entries are lstat'ed, symbolic links followed
 * once (a link back into a folder on the way down is a loop), and a missing path, an unreadable folder,
 * a dangling link or a FIFO/device/socket becomes a problem of its own beside the good files.
 */
import { lstatSync, readdirSync, realpathSync, statSync, type Stats } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import type { FileProblem } from './error-line.js';
import { fsErrorWords, kindWords } from './file-checks.js';

/** Extensions analysed when a folder is walked (files named explicitly are always tried). */
export const CAPTURE_EXTENSIONS = ['.csv', '.tsv', '.txt', '.wav', '.cfg', '.cff', '.dat'];
const COMPANION_EXTENSIONS = ['.dat', '.hdr', '.inf'];

/** Files that make up one capture; `files[0]` is the one the report is named after. */
export interface AnalysisUnit {
	files: string[];
}

export interface Collected {
	units: AnalysisUnit[];
	/** Files skipped while walking folders (unknown extension), for an info line. */
	skipped: string[];
	/**
	 * Paths that could not be taken, each reported like a bad file: missing, unreadable folder, dangling
	 * symbolic link, link loop, not a regular file (FIFO, device, socket). The other files are still collected.
	 */
	problems: FileProblem[];
}

interface WalkState {
	files: string[];
	skipped: string[];
	problems: FileProblem[];
	/** Real paths of the folders on the way down (a link back to one of them is a loop). */
	ancestors: Set<string>;
	/** Real paths of every folder walked (a second link to one is walked once). */
	walked: Set<string>;
}

const isCaptureName = (name: string) =>
	CAPTURE_EXTENSIONS.includes(extname(name).toLowerCase()) ||
	COMPANION_EXTENSIONS.includes(extname(name).toLowerCase());

/** An entry of a folder that cannot be walked or read: reported like a bad file, the walk goes on. */
function entryProblem(state: WalkState, file: string, message: string): void {
	state.problems.push({ file, code: 'unreadable', message });
}

function walk(dir: string, state: WalkState): void {
	let real: string;
	let names: string[];
	try {
		real = realpathSync(dir);
		names = readdirSync(dir).sort();
	} catch (e) {
		entryProblem(state, dir, `cannot read this folder: ${fsErrorWords((e as NodeJS.ErrnoException).code)} (skipped)`);
		return;
	}
	if (state.ancestors.has(real)) {
		entryProblem(state, dir, 'a symbolic link back to a folder that contains it (a loop; skipped)');
		return;
	}
	if (state.walked.has(real)) return; // a second way into a folder already walked
	state.walked.add(real);
	state.ancestors.add(real);
	for (const name of names) {
		if (name.startsWith('.') || name === 'node_modules') continue;
		visit(join(dir, name), name, state);
	}
	state.ancestors.delete(real);
}

function visit(p: string, name: string, state: WalkState): void {
	let st: Stats;
	try {
		st = lstatSync(p);
		if (st.isSymbolicLink()) st = statSync(p);
	} catch (e) {
		const code = (e as NodeJS.ErrnoException).code;
		const why = code === 'ENOENT' ? 'a symbolic link to something that does not exist' : fsErrorWords(code);
		// A broken link or unreadable entry that could not be a capture is only a note, not an error.
		if (isCaptureName(name) || code !== 'ENOENT') entryProblem(state, p, `${why} (skipped)`);
		else state.skipped.push(p);
		return;
	}
	if (st.isDirectory()) walk(p, state);
	else if (!isCaptureName(name)) state.skipped.push(p);
	else if (st.isFile()) state.files.push(p);
	else entryProblem(state, p, `${kindWords(st)}, not a regular file: only regular files are read (skipped)`);
}

function stemKey(path: string): string {
	return join(dirname(path), basename(path, extname(path))).toLowerCase();
}

/**
 * Expands folders and groups companions. Never throws: a path that cannot be taken is in `problems`.
 * @example collectUnits(['sample-waves']) // { units: [{ files: ['sample-waves/board.cfg', 'sample-waves/board.dat'] }, ...] }
 */
export function collectUnits(paths: string[]): Collected {
	const state: WalkState = { files: [], skipped: [], problems: [], ancestors: new Set(), walked: new Set() };
	for (const p of paths) {
		let st: Stats;
		try {
			st = statSync(p);
		} catch (e) {
			const code = (e as NodeJS.ErrnoException).code;
			let dangling = false;
			try {
				dangling = code === 'ENOENT' && lstatSync(p).isSymbolicLink();
			} catch {
				// not there at all
			}
			state.problems.push({
				file: p,
				code: 'unreadable',
				message: dangling ? 'a symbolic link to something that does not exist' : fsErrorWords(code),
			});
			continue;
		}
		if (st.isDirectory()) walk(p, state);
		else if (st.isFile()) state.files.push(p);
		else
			state.problems.push({
				file: p,
				code: 'unreadable',
				message: `${kindWords(st)}, not a regular file: only regular files are read`,
			});
	}
	const { files, skipped, problems } = state;
	// Every file of a folder next to a .cfg of the same stem is that .cfg's companion.
	const dirFiles = new Map<string, string[]>();
	const siblings = (dir: string): string[] => {
		let list = dirFiles.get(dir);
		if (!list) {
			try {
				list = readdirSync(dir);
			} catch {
				list = [];
			}
			dirFiles.set(dir, list);
		}
		return list;
	};
	const cfgByStem = new Map<string, string>();
	for (const f of files) {
		if (extname(f).toLowerCase() !== '.cfg') continue;
		cfgByStem.set(stemKey(f), f);
	}
	// A .dat/.hdr/.inf named on its own goes with the .cfg beside it, even if the .cfg was not named.
	for (const f of files) {
		const ext = extname(f).toLowerCase();
		if (!COMPANION_EXTENSIONS.includes(ext) || cfgByStem.has(stemKey(f))) continue;
		const stem = basename(f, extname(f));
		const cfg = siblings(dirname(f)).find(
			(n) => extname(n).toLowerCase() === '.cfg' && basename(n, extname(n)) === stem,
		);
		if (cfg) cfgByStem.set(stemKey(f), join(dirname(f), cfg));
	}
	const seen = new Set<string>();
	const units: AnalysisUnit[] = [];
	for (const f of files) {
		const ext = extname(f).toLowerCase();
		const key = stemKey(f);
		const cfg = ext === '.cfg' ? f : COMPANION_EXTENSIONS.includes(ext) ? cfgByStem.get(key) : undefined;
		if (cfg) {
			if (seen.has(stemKey(cfg))) continue;
			seen.add(stemKey(cfg));
			const stem = basename(cfg, extname(cfg));
			const companions = siblings(dirname(cfg))
				.filter((n) => COMPANION_EXTENSIONS.includes(extname(n).toLowerCase()) && basename(n, extname(n)) === stem)
				.sort(
					(a, b) =>
						COMPANION_EXTENSIONS.indexOf(extname(a).toLowerCase()) -
						COMPANION_EXTENSIONS.indexOf(extname(b).toLowerCase()),
				)
				.map((n) => join(dirname(cfg), n));
			units.push({ files: [cfg, ...companions] });
		} else if (ext === '.hdr' || ext === '.inf') {
			skipped.push(f); // COMTRADE header/information file without its .cfg: nothing to analyse
		} else {
			if (seen.has(f)) continue;
			seen.add(f);
			units.push({ files: [f] });
		}
	}
	return { units, skipped, problems };
}
