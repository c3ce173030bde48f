/**
 * The analyser's session: the captures opened (demo and user files), which one is shown, the analysis
 * options, progress and errors. Every figure comes from the worker (lib/); this class only keeps state.
 */
import type { Capture } from '../../../lib/capture.js';
import { applyLimits, LIMIT_STEP_OPTIONS } from '../../../lib/report/index.js';
import type { AnalysisOptions, AnalysisReport, ReportLimitTableId } from '../../../lib/report/types.js';
import { groupFiles, groupLabel } from '../files.js';
import type { FileBytes, ImportOverrides, ImportProblem, ReportExtras } from '../protocol.js';
import { AnalysisClient, CancelledError, type Progress, type WorkerLike } from './analysis-client.js';
import { fileIdentity, SettingsMemory } from './remembered.js';

/** A file the session can (re-)read: a picked File, a demo URL, or bytes in a test. */
export interface SourceFile {
	name: string;
	/** One line saying what the file shows (the demos). */
	description?: string;
	/** The picked file itself: the worker reads it in slices (never held whole by the page). */
	blob?: Blob;
	read: () => Promise<ArrayBuffer>;
}

export interface LoadedCapture {
	key: string;
	label: string;
	/** Name, size and content hash of its files (not for demos): finds it again and its remembered settings. */
	identity?: string;
	/** One line saying what the capture shows (the demos), from its first file. */
	description?: string;
	demo: boolean;
	files: SourceFile[];
	status: 'loading' | 'ready' | 'error' | 'cancelled';
	capture: Capture | null;
	report: AnalysisReport | null;
	extras: ReportExtras | null;
	problems: ImportProblem[];
	overrides: ImportOverrides;
	analysis: AnalysisOptions;
}

export class Session {
	/** Replaced wholesale on every change (holds big sample arrays: never deep-proxied). */
	items = $state.raw<LoadedCapture[]>([]);
	selectedKey = $state<string | null>(null);
	progress = $state<Progress | null>(null);
	/** A message about the last operation that failed outside any one file (worker crash, cancel). */
	notice = $state<string | null>(null);
	limits = $state<ReportLimitTableId | undefined>('en50160');
	/** Channel compared with the reference (lag shown on the waves), by name; null = the first other channel. */
	compareChannel = $state<string | null>(null);

	selected = $derived(this.items.find((c) => c.key === this.selectedKey) ?? null);
	busy = $derived(this.progress !== null);

	#client: AnalysisClient;
	#nextKey = 1;

	readonly #memory: SettingsMemory;

	constructor(makeWorker: () => WorkerLike, memory = new SettingsMemory()) {
		this.#client = new AnalysisClient(makeWorker);
		this.#memory = memory;
	}

	/** Identity of a group of files ("name|size|hash" joined by " + "); undefined when a file cannot be read. */
	async #identity(g: SourceFile[]): Promise<string | undefined> {
		try {
			const parts = await Promise.all(
				g.map(async (f) => {
					if (f.blob)
						return fileIdentity({
							name: f.name,
							size: f.blob.size,
							slice: async (a, b) => new Uint8Array(await f.blob!.slice(a, b).arrayBuffer()),
						});
					const bytes = new Uint8Array(await f.read());
					return fileIdentity({ name: f.name, size: bytes.length, slice: async (a, b) => bytes.subarray(a, b) });
				}),
			);
			return parts.join(' + ');
		} catch {
			return undefined;
		}
	}

	#remember(key: string): void {
		const item = this.#get(key);
		if (item?.identity && item.status === 'ready')
			this.#memory.set(
				item.identity,
				$state.snapshot(item.overrides) as ImportOverrides,
				$state.snapshot(item.analysis) as AnalysisOptions,
			);
	}

	#replace(key: string, patch: Partial<LoadedCapture>): void {
		this.items = this.items.map((c) => (c.key === key ? { ...c, ...patch } : c));
	}

	#get(key: string): LoadedCapture | undefined {
		return this.items.find((c) => c.key === key);
	}

	/**
	 * Opens files (grouped: a .cfg with its .dat); one capture per group, loaded one after the other.
	 * @returns the keys of the new captures
	 */
	async open(files: SourceFile[], opts: { demo?: boolean; select?: boolean } = {}): Promise<string[]> {
		const keys: string[] = [];
		const fresh: LoadedCapture[] = [];
		const again: string[] = [];
		for (const g of groupFiles(files)) {
			const identity = opts.demo ? undefined : await this.#identity(g);
			// the same file opened again: no second entry; shown (and read again if it failed or was stopped)
			const known = identity ? this.items.find((c) => c.identity === identity) : undefined;
			if (known) {
				keys.push(known.key);
				if (known.status === 'error' || known.status === 'cancelled') {
					this.#replace(known.key, { files: g, status: 'loading' });
					again.push(known.key);
				}
				continue;
			}
			const remembered = identity ? this.#memory.get(identity) : undefined;
			const key = `c${this.#nextKey++}`;
			keys.push(key);
			fresh.push({
				key,
				label: groupLabel(g),
				identity,
				description: g.find((f) => f.description)?.description,
				demo: opts.demo ?? false,
				files: g,
				status: 'loading',
				capture: null,
				report: null,
				extras: null,
				problems: [],
				overrides: remembered?.overrides ?? {},
				analysis: { ...remembered?.analysis, limits: this.limits },
			});
		}
		this.items = [...this.items, ...fresh];
		if ((opts.select ?? true) && keys[0]) this.selectedKey = keys[0];
		for (const key of [...again, ...fresh.map((f) => f.key)]) await this.#load(key);
		return keys;
	}

	async #load(key: string): Promise<void> {
		const item = this.#get(key);
		if (!item) return;
		this.notice = null;
		this.progress = { stage: `Reading ${item.label}`, fraction: 0 };
		try {
			const files: FileBytes[] = await Promise.all(
				item.files.map(async (f) =>
					f.blob ? { name: f.name, blob: f.blob } : { name: f.name, bytes: await f.read() },
				),
			);
			const result = await this.#client.open(
				key,
				files,
				$state.snapshot(item.overrides) as ImportOverrides,
				$state.snapshot(item.analysis) as AnalysisOptions,
				(p) => (this.progress = p),
			);
			if (result.ok) {
				this.#replace(key, {
					status: 'ready',
					capture: result.capture,
					report: result.report,
					extras: result.extras,
					problems: [],
				});
				this.#remember(key);
			} else {
				this.#replace(key, { status: 'error', problems: result.problems });
			}
		} catch (e) {
			if (e instanceof CancelledError) {
				this.#replace(key, { status: 'cancelled' });
				this.notice = `Stopped loading ${item.label}.`;
			} else {
				const message = e instanceof Error ? e.message : String(e);
				this.#replace(key, {
					status: 'error',
					problems: [
						{
							source: item.label,
							line: 0,
							column: 0,
							code: 'analysis-failed',
							text: '',
							expected: 'an analysable capture',
							message,
						},
					],
				});
			}
		} finally {
			this.progress = null;
		}
	}

	/** Re-reads the selected capture's files with new import overrides (the file check's "apply"). */
	async reimport(key: string, overrides: ImportOverrides): Promise<void> {
		this.#replace(key, { overrides, status: 'loading' });
		this.#client.forget(key);
		await this.#load(key);
	}

	/** Re-analyses a capture with changed options (reference channel, span, window); limit options only re-run the limit step. */
	async reanalyse(key: string, patch: Partial<AnalysisOptions>): Promise<void> {
		const item = this.#get(key);
		if (!item || !item.capture) return;
		const analysis = { ...item.analysis, ...patch };
		if (item.report && Object.keys(patch).every((k) => (LIMIT_STEP_OPTIONS as readonly string[]).includes(k))) {
			// limit evaluation is a pure function of the report: no new analysis, nothing to wait for
			this.#replace(key, { analysis, report: applyLimits($state.snapshot(item.report) as AnalysisReport, analysis) });
			return;
		}
		this.#replace(key, { analysis });
		this.progress = { stage: `Analysing ${item.label}`, fraction: null };
		try {
			const r = await this.#client.analyse(key, item.capture, analysis, (p) => (this.progress = p));
			this.#replace(key, { report: r.report, extras: r.extras });
			this.#remember(key);
		} catch (e) {
			this.notice =
				e instanceof CancelledError
					? 'Analysis stopped; the figures shown are from the previous settings.'
					: `Analysis failed: ${e instanceof Error ? e.message : String(e)}`;
			this.#replace(key, { analysis: item.analysis });
		} finally {
			this.progress = null;
		}
	}

	/** Sets the limit table for every capture: lib/report's limit step on each report there is (instant, no new analysis). */
	async setLimits(id: ReportLimitTableId | undefined): Promise<void> {
		this.limits = id;
		this.items = this.items.map((c) => {
			const analysis = { ...c.analysis, limits: id };
			return {
				...c,
				analysis,
				report: c.report ? applyLimits($state.snapshot(c.report) as AnalysisReport, analysis) : c.report,
			};
		});
	}

	select(key: string): void {
		this.selectedKey = key;
		this.compareChannel = null;
	}

	/** Closes a capture (and frees its samples in the worker). */
	close(key: string): void {
		this.#client.forget(key);
		this.items = this.items.filter((c) => c.key !== key);
		if (this.selectedKey === key)
			this.selectedKey = this.items.find((c) => c.status === 'ready')?.key ?? this.items[0]?.key ?? null;
	}

	/** Stops the running import or analysis; the session keeps everything already loaded. */
	cancel(): void {
		this.#client.cancel();
	}

	dispose(): void {
		this.#client.dispose();
	}
}
