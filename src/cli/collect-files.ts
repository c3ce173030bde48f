/**
 * Command-line paths -> analysis units. A folder is walked (sorted, hidden entries and node_modules
 * skipped); a COMTRADE .cfg travels with its .dat (and .hdr/.inf) of the same stem, so one unit is what
 * one capture needs.
 */
import { readdirSync, statSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import { UsageError } from './usage-error.js';

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
}

function walk(dir: string, out: string[], skipped: string[]): void {
	for (const name of readdirSync(dir).sort()) {
		if (name.startsWith('.') || name === 'node_modules') continue;
		const p = join(dir, name);
		const st = statSync(p);
		if (st.isDirectory()) walk(p, out, skipped);
		else if (CAPTURE_EXTENSIONS.includes(extname(name).toLowerCase()) || COMPANION_EXTENSIONS.includes(extname(name).toLowerCase())) out.push(p);
		else skipped.push(p);
	}
}

function stemKey(path: string): string {
	return join(dirname(path), basename(path, extname(path))).toLowerCase();
}

/**
 * Expands folders and groups companions. Throws UsageError for a path that does not exist.
 * @example collectUnits(['sample-waves']) // { units: [{ files: ['sample-waves/board.cfg', 'sample-waves/board.dat'] }, ...] }
 */
export function collectUnits(paths: string[]): Collected {
	const files: string[] = [];
	const skipped: string[] = [];
	for (const p of paths) {
		let st;
		try {
			st = statSync(p);
		} catch {
			throw new UsageError(`${p}: no such file or folder`);
		}
		if (st.isDirectory()) walk(p, files, skipped);
		else files.push(p);
	}
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
		const cfg = siblings(dirname(f)).find((n) => extname(n).toLowerCase() === '.cfg' && basename(n, extname(n)) === stem);
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
				.sort((a, b) => COMPANION_EXTENSIONS.indexOf(extname(a).toLowerCase()) - COMPANION_EXTENSIONS.indexOf(extname(b).toLowerCase()))
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
	return { units, skipped };
}
