/**
 * The supply survey's state: the records picked as one recording, the standard and declared voltage
 * chosen, progress, and the survey lib/survey returned (through the worker). It keeps state only.
 */
import type { SurveyStandardId } from '../../../lib/survey/types.js';
import { OPENABLE_EXTENSIONS } from '../files.js';
import type { ImportProblem, SurveyView } from '../protocol.js';
import { AnalysisClient, CancelledError, type Progress, type WorkerLike } from './analysis-client.js';

/** A picked file: its name and the file itself (the worker reads it in slices). */
export interface SurveyFile {
	name: string;
	blob: Blob;
}

export class SurveySession {
	files = $state.raw<SurveyFile[]>([]);
	/** Files of a picked folder that are not recordings (left out, counted). */
	skipped = $state(0);
	standard = $state<SurveyStandardId>('en50160');
	/** The declared supply voltage as typed; empty = taken from the recording. */
	declaredText = $state('230');
	progress = $state<Progress | null>(null);
	view = $state.raw<SurveyView | null>(null);
	problems = $state.raw<ImportProblem[]>([]);
	notice = $state<string | null>(null);
	busy = $derived(this.progress !== null);

	#client: AnalysisClient;

	constructor(makeWorker: () => WorkerLike) {
		this.#client = new AnalysisClient(makeWorker);
	}

	/** Takes picked files (a folder's files too): recordings kept, anything else counted as skipped. */
	pick(list: readonly File[]): void {
		const ok = (f: File) => OPENABLE_EXTENSIONS.includes(f.name.replace(/^.*\./, '').toLowerCase());
		this.files = list.filter(ok).map((f) => ({ name: f.name, blob: f }));
		this.skipped = list.length - this.files.length;
		this.view = null;
		this.problems = [];
		this.notice = null;
	}

	/** The declared voltage typed, or undefined when empty; NaN when it is not a positive number. */
	get declaredV(): number | undefined {
		const t = this.declaredText.trim().replace(',', '.');
		if (t === '') return undefined;
		const v = Number(t);
		return Number.isFinite(v) && v > 0 ? v : NaN;
	}

	async run(): Promise<void> {
		const declaredV = this.declaredV;
		if (this.files.length === 0 || Number.isNaN(declaredV)) return;
		this.notice = null;
		this.progress = { stage: 'Supply survey: starting', fraction: 0 };
		try {
			const r = await this.#client.survey(
				this.files.map((f) => ({ name: f.name, blob: f.blob })),
				this.standard,
				declaredV,
				(p) => (this.progress = p),
			);
			this.view = r.survey;
			this.problems = r.problems;
		} catch (e) {
			this.notice =
				e instanceof CancelledError
					? 'The survey was stopped.'
					: `The survey stopped: ${e instanceof Error ? e.message : String(e)}`;
		} finally {
			this.progress = null;
		}
	}

	cancel(): void {
		this.#client.cancel();
	}

	dispose(): void {
		this.#client.dispose();
	}
}
