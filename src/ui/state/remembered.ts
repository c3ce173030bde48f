/**
 * Settings remembered per file, in the browser's localStorage: the import settings (file check) and the
 * analysis choices (reference channel, IEEE 519 figures) of a file, found again when the same file is opened
 * later. A file is known by its name, its size and a content hash (FNV-1a over its first and last 64 KiB:
 * quick on a 300 MB file, and an edited file almost always changes size or one of its ends). Never the data.
 */
import type { AnalysisOptions } from '../../../lib/report/types.js';
import type { ImportOverrides } from '../protocol.js';

export const SETTINGS_STORAGE_KEY = 'sinecheck.settings.v1';
/** Files remembered at most (the oldest is forgotten first). */
export const SETTINGS_MAX = 60;
const SAMPLE_BYTES = 64 * 1024;

/**
 * 32-bit FNV-1a hash of bytes, continuing from `hash` (offset basis 0x811c9dc5, prime 16777619; the FNV
 * reference by Fowler, Noll and Vo).
 * @example fnv1a32(new TextEncoder().encode('a')) // 0xe40c292c
 */
export function fnv1a32(bytes: Uint8Array, hash = 0x811c9dc5): number {
	let h = hash >>> 0;
	for (let i = 0; i < bytes.length; i++) {
		h ^= bytes[i];
		h = Math.imul(h, 16777619) >>> 0;
	}
	return h >>> 0;
}

/** What the identity needs of a file: its name, size and a way to read a byte range. */
export interface IdentitySource {
	name: string;
	size: number;
	slice: (start: number, end: number) => Promise<Uint8Array>;
}

/** "name|size|hash" of one file. */
export async function fileIdentity(f: IdentitySource): Promise<string> {
	const head = await f.slice(0, Math.min(f.size, SAMPLE_BYTES));
	const tail =
		f.size > SAMPLE_BYTES ? await f.slice(Math.max(SAMPLE_BYTES, f.size - SAMPLE_BYTES), f.size) : new Uint8Array(0);
	const h = fnv1a32(tail, fnv1a32(head));
	return `${f.name}|${f.size}|${h.toString(16).padStart(8, '0')}`;
}

/** The settings kept for a file. */
export interface RememberedSettings {
	overrides: ImportOverrides;
	analysis: Pick<AnalysisOptions, 'refChannel' | 'iscIl' | 'ilA' | 'nominalV'>;
	savedAt: string;
}

function storage(): Storage | null {
	try {
		return typeof localStorage === 'undefined' ? null : localStorage;
	} catch {
		return null;
	}
}

export class SettingsMemory {
	#all(): Record<string, RememberedSettings> {
		try {
			const raw = storage()?.getItem(SETTINGS_STORAGE_KEY);
			const parsed: unknown = raw ? JSON.parse(raw) : {};
			return parsed && typeof parsed === 'object' && !Array.isArray(parsed)
				? (parsed as Record<string, RememberedSettings>)
				: {};
		} catch {
			return {};
		}
	}

	get(identity: string): RememberedSettings | undefined {
		return this.#all()[identity];
	}

	/** Keeps the settings of `identity` (the newest SETTINGS_MAX files). */
	set(identity: string, overrides: ImportOverrides, analysis: AnalysisOptions, when = new Date()): void {
		const all = this.#all();
		const { refChannel, iscIl, ilA, nominalV } = analysis;
		all[identity] = {
			overrides,
			analysis: JSON.parse(JSON.stringify({ refChannel, iscIl, ilA, nominalV })),
			savedAt: when.toISOString(),
		};
		const kept = Object.entries(all)
			.sort((a, b) => b[1].savedAt.localeCompare(a[1].savedAt))
			.slice(0, SETTINGS_MAX);
		try {
			storage()?.setItem(SETTINGS_STORAGE_KEY, JSON.stringify(Object.fromEntries(kept)));
		} catch {
			/* quota or disabled storage: settings last for this session only */
		}
	}
}
