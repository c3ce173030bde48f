/**
 * Recently opened files, kept in the browser's localStorage: names and when, never the data.
 */

export interface RecentEntry {
	name: string;
	/** ISO 8601 time it was opened. */
	openedAt: string;
}

export const RECENT_STORAGE_KEY = 'sinecheck.recent.v1';
export const RECENT_MAX = 12;

function storage(): Storage | null {
	try {
		return typeof localStorage === 'undefined' ? null : localStorage;
	} catch {
		return null; // storage disabled (private mode, file:// in some browsers)
	}
}

export class RecentFiles {
	entries = $state<RecentEntry[]>([]);

	constructor() {
		this.entries = RecentFiles.read();
	}

	static read(): RecentEntry[] {
		try {
			const raw = storage()?.getItem(RECENT_STORAGE_KEY);
			const parsed: unknown = raw ? JSON.parse(raw) : [];
			if (!Array.isArray(parsed)) return [];
			return parsed.filter((e): e is RecentEntry => typeof e?.name === 'string' && typeof e?.openedAt === 'string');
		} catch {
			return [];
		}
	}

	/** Puts `name` first (dropping an older entry of the same name), keeps at most RECENT_MAX. */
	// a time stamp turned into text at once, not reactive state
	// eslint-disable-next-line svelte/prefer-svelte-reactivity
	add(name: string, when: Date = new Date()): void {
		const next = [{ name, openedAt: when.toISOString() }, ...this.entries.filter((e) => e.name !== name)].slice(
			0,
			RECENT_MAX,
		);
		this.entries = next;
		try {
			storage()?.setItem(RECENT_STORAGE_KEY, JSON.stringify(next));
		} catch {
			/* quota or disabled storage: the list still works for this session */
		}
	}

	clear(): void {
		this.entries = [];
		try {
			storage()?.removeItem(RECENT_STORAGE_KEY);
		} catch {
			/* ignore */
		}
	}
}
