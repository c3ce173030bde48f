/**
 * The page's side of the analysis worker: one request at a time per job id, promises for results, progress
 * callbacks, and cancel (terminate the worker, start a fresh one; the cached captures are re-seeded on
 * demand from the page's copy).
 */
import type { Capture } from '../../../lib/capture.js';
import type { AnalysisOptions, AnalysisReport } from '../../../lib/report/types.js';
import type {
	FileBytes,
	FromWorker,
	ImportOverrides,
	ImportProblem,
	ReportExtras,
	SurveyView,
	ToWorker,
} from '../protocol.js';
import type { SurveyStandardId } from '../../../lib/survey/types.js';

/** The part of a Worker the client uses (a real Worker, or an in-process fake in tests). */
export interface WorkerLike {
	postMessage(msg: ToWorker, transfer?: Transferable[]): void;
	onmessage: ((ev: MessageEvent<FromWorker>) => void) | null;
	terminate(): void;
}

export class CancelledError extends Error {
	override readonly name = 'CancelledError';
	constructor() {
		super('cancelled by the user');
	}
}

export type OpenResult =
	| { ok: true; capture: Capture; report: AnalysisReport; extras: ReportExtras }
	| { ok: false; problems: ImportProblem[] };

/** Stage, its fraction done (null: unknown), seconds left (estimate), and for a stage the worker cannot report on, how long it is expected to take. */
export type Progress = { stage: string; fraction: number | null; etaS?: number | null; expectS?: number };

interface Pending {
	resolve: (msg: FromWorker) => void;
	reject: (e: Error) => void;
	onProgress?: (p: Progress) => void;
}

export class AnalysisClient {
	#worker: WorkerLike | null = null;
	#nextJob = 1;
	#pending = new Map<number, Pending>();

	constructor(private readonly makeWorker: () => WorkerLike) {}

	#ensure(): WorkerLike {
		if (!this.#worker) {
			const w = this.makeWorker();
			w.onmessage = (ev) => this.#receive(ev.data);
			this.#worker = w;
		}
		return this.#worker;
	}

	#receive(msg: FromWorker): void {
		const p = this.#pending.get(msg.jobId);
		if (!p) return;
		if (msg.type === 'progress') {
			p.onProgress?.({ stage: msg.stage, fraction: msg.fraction, etaS: msg.etaS, expectS: msg.expectS });
			return;
		}
		this.#pending.delete(msg.jobId);
		p.resolve(msg);
	}

	#request(
		build: (jobId: number) => ToWorker,
		transfer: Transferable[],
		onProgress?: (p: Progress) => void,
	): Promise<FromWorker> {
		const jobId = this.#nextJob++;
		return new Promise<FromWorker>((resolve, reject) => {
			this.#pending.set(jobId, { resolve, reject, onProgress });
			this.#ensure().postMessage(build(jobId), transfer);
		});
	}

	/** True while a request is running. */
	get busy(): boolean {
		return this.#pending.size > 0;
	}

	/** Imports the files (moved to the worker) and analyses the capture they make. */
	async open(
		captureKey: string,
		files: FileBytes[],
		overrides: ImportOverrides,
		analysis: AnalysisOptions,
		onProgress?: (p: Progress) => void,
	): Promise<OpenResult> {
		const msg = await this.#request(
			(jobId) => ({ type: 'open', jobId, captureKey, files, overrides, analysis }),
			files.flatMap((f) => (f.bytes ? [f.bytes] : [])),
			onProgress,
		);
		if (msg.type === 'opened') return { ok: true, capture: msg.capture, report: msg.report, extras: msg.extras };
		if (msg.type === 'import-failed') return { ok: false, problems: msg.problems };
		throw new Error(msg.type === 'failed' ? msg.message : `unexpected reply ${msg.type}`);
	}

	/** Re-analyses a capture the worker holds; re-seeds it from `capture` if the worker was restarted. */
	async analyse(
		captureKey: string,
		capture: Capture,
		analysis: AnalysisOptions,
		onProgress?: (p: Progress) => void,
	): Promise<{ report: AnalysisReport; extras: ReportExtras }> {
		for (let attempt = 0; attempt < 2; attempt++) {
			const msg = await this.#request((jobId) => ({ type: 'analyse', jobId, captureKey, analysis }), [], onProgress);
			if (msg.type === 'analysed') return { report: msg.report, extras: msg.extras };
			if (msg.type === 'missing') {
				this.#ensure().postMessage({ type: 'seed', captureKey, capture }); // structured clone copies it
				continue;
			}
			throw new Error(msg.type === 'failed' ? msg.message : `unexpected reply ${msg.type}`);
		}
		throw new Error('the analysis worker lost the capture twice');
	}

	/** A supply survey of many records of one recording (files moved to the worker, or read there in slices). */
	async survey(
		files: FileBytes[],
		standard: SurveyStandardId,
		declaredV: number | undefined,
		onProgress?: (p: Progress) => void,
	): Promise<{ survey: SurveyView | null; problems: ImportProblem[] }> {
		const msg = await this.#request(
			(jobId) => ({ type: 'survey', jobId, files, standard, declaredV }),
			files.flatMap((f) => (f.bytes ? [f.bytes] : [])),
			onProgress,
		);
		if (msg.type === 'surveyed') return { survey: msg.survey, problems: msg.problems };
		throw new Error(msg.type === 'failed' ? msg.message : `unexpected reply ${msg.type}`);
	}

	/** Stops whatever runs now: terminates the worker; every pending request rejects with CancelledError. */
	cancel(): void {
		this.#worker?.terminate();
		this.#worker = null;
		for (const p of this.#pending.values()) p.reject(new CancelledError());
		this.#pending.clear();
	}

	forget(captureKey: string): void {
		this.#worker?.postMessage({ type: 'forget', captureKey });
	}

	dispose(): void {
		this.cancel();
	}
}
