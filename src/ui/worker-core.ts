/**
 * The analysis worker's logic, free of worker globals so tests can run it in-process: open files with
 * lib/io, analyse with lib/report (the same code the CLI runs), post progress and results. Captures stay
 * cached here by key so a new reference channel re-analyses without re-reading the file (a new limit
 * table needs no analysis at all: the page applies lib/report's limit step to the report it has).
 */
import type { Capture } from '../../lib/capture.js';
import { gapFreeSpan, isImportError } from '../../lib/io/index.js';
import { analyseCaptureParts } from '../../lib/report/index.js';
import type { AnalysisOptions, AnalysisProgress, AnalysisReport, AnalysisStage } from '../../lib/report/types.js';
import type { FromWorker, ImportProblem, ReportExtras, ToWorker, TrendView } from './protocol.js';
import { etaFrom, lineOfFile, readCaptures } from './worker-open.js';
import { runSurvey, type SurveyProgress } from './survey-worker.js';

export type Post = (msg: FromWorker, transfer?: Transferable[]) => void;

const cache = new Map<string, Capture>();
const trends = new Map<string, TrendView | null>();

/** An importer failure (or any other thrown value) as data the page can show in place. */
export function toProblem(e: unknown, fallbackSource: string): ImportProblem {
	if (isImportError(e)) {
		return {
			source: e.source,
			line: e.line,
			column: e.column,
			code: e.code,
			text: e.text,
			expected: e.expected,
			message: e.message,
		};
	}
	const message = e instanceof Error ? e.message : String(e);
	return {
		source: fallbackSource,
		line: 0,
		column: 0,
		code: 'unreadable',
		text: '',
		expected: 'a file Sinecheck can read',
		message,
	};
}

/** Line `line` (1-based) of a text file's bytes, cut to 160 characters; undefined when the file is shorter. */
export function lineOf(bytes: ArrayBuffer, line: number): string | undefined {
	// decode only as far as needed: errors usually sit in the first rows
	const view = new Uint8Array(bytes);
	let start = 0;
	let seen = 1;
	for (let i = 0; i < view.length && seen < line; i++) {
		if (view[i] === 10) {
			seen++;
			start = i + 1;
		}
	}
	if (seen < line) return undefined;
	let end = start;
	while (end < view.length && view[end] !== 10 && view[end] !== 13 && end - start < 640) end++;
	return new TextDecoder('utf-8').decode(view.subarray(start, end)).slice(0, 160);
}

/**
 * The buffers of a capture's samples, to be moved (not copied) to the page: after the post the worker's
 * arrays are empty, so the capture is not kept here. A later analysis of it gets 'missing' and the page
 * sends it back ('seed', analysis-client.ts): a 279 MB file is not copied on the way in, and the worker
 * does not hold a second copy of the samples.
 */
function sampleBuffers(c: Capture): Transferable[] {
	const transfer = new Set<ArrayBufferLike>(c.channels.map((ch) => ch.samples.buffer));
	if (c.timeS) transfer.add(c.timeS.buffer);
	for (const d of c.digital ?? []) transfer.add(d.states.buffer);
	return [...transfer] as Transferable[];
}

/** Sample index of the largest and smallest value of `x` between i0 and i1 (-1 when all NaN). */
function peakIndices(x: Float64Array, i0: number, i1: number): { max: number; min: number } {
	let max = -1;
	let min = -1;
	for (let i = i0; i < i1; i++) {
		const v = x[i];
		if (v === v) {
			if (max < 0 || v > x[max]) max = i;
			if (min < 0 || v < x[min]) min = i;
		}
	}
	return { max, min };
}

/**
 * What the plots need beside the report: where the analysed window's peaks sit and the whole-cycle
 * boundaries (the reference crossings lib/report measured, handed back by `analyseCaptureParts`).
 * Everything the report carries (harmonics, groups, THD variants) is taken from the report, never recomputed here.
 */
export function extrasFor(
	capture: Capture,
	report: AnalysisReport,
	referenceCrossings: ArrayLike<number> | null,
): ReportExtras {
	const fs = capture.sampleRateHz;
	const n = capture.channels[0]?.samples.length ?? 0;
	const i0 = Math.max(0, Math.floor(report.window.startS * fs));
	const i1 = Math.min(n, Math.ceil(report.window.endS * fs));
	const peakIndex: ReportExtras['peakIndex'] = {};
	for (const ch of capture.channels) peakIndex[ch.name] = peakIndices(ch.samples, i0, i1);
	const cycleBoundariesS: number[] = [];
	if (report.cyclesAnalysed > 0 && report.referenceChannel !== null && referenceCrossings) {
		for (let k = 0; k < referenceCrossings.length; k++) cycleBoundariesS.push(referenceCrossings[k] / fs);
	}
	return { cycleBoundariesS, peakIndex, trend: null };
}

/**
 * The report of a capture, and the plot extras, on its longest stretch without gaps (the whole capture when
 * it has none); times in the extras count from that stretch like the report's, peak indices from the first
 * sample. With `withTrend`, the trend view comes from the analysis's own lib/trend pass (`trend`).
 */
export function analyseSpan(
	capture: Capture,
	analysis: AnalysisOptions,
	withTrend = false,
): { report: AnalysisReport; extras: ReportExtras; trend?: TrendView | null } {
	const want = withTrend ? { trend: {} } : {};
	if (!capture.gaps?.length) {
		const parts = analyseCaptureParts(capture, analysis, want);
		const extras = extrasFor(capture, parts.report, parts.referenceCrossings);
		return { report: parts.report, extras, trend: parts.trend };
	}
	const span = gapFreeSpan(capture);
	const parts = analyseCaptureParts(span.capture, analysis, want);
	const extras = extrasFor(span.capture, parts.report, parts.referenceCrossings);
	for (const k of Object.keys(extras.peakIndex)) {
		const p = extras.peakIndex[k];
		extras.peakIndex[k] = {
			max: p.max < 0 ? -1 : p.max + span.startIndex,
			min: p.min < 0 ? -1 : p.min + span.startIndex,
		};
	}
	const offsetS = span.startIndex / capture.sampleRateHz;
	extras.gaps = {
		offsetS,
		startIndex: span.startIndex,
		endIndex: span.endIndex,
		cells: capture.gaps.map((g) => ({ ...g, timeS: g.sampleIndex / capture.sampleRateHz - offsetS })),
	};
	return { report: parts.report, extras, trend: parts.trend };
}

/** Words for each part of the analysis in the progress line. */
const STAGE_WORDS: Record<AnalysisStage, string> = {
	reference: 'finding whole cycles',
	events: 'voltage events and trends',
	harmonics: 'harmonics',
	channels: 'levels of each channel',
	relations: 'power and phase',
	flicker: 'flicker',
};

/**
 * Analysis options that post lib/report's own progress (stage, windows or channels done of their total,
 * fraction of the whole analysis) with a time left from the rate so far; at most one message per 1 % or
 * stage change.
 */
function withProgress(
	analysis: AnalysisOptions,
	source: string,
	post: (stage: string, fraction: number, etaS: number | null) => void,
): AnalysisOptions {
	const t0 = performance.now();
	let last = -1;
	let lastStage = '';
	return {
		...analysis,
		onProgress: (p: AnalysisProgress) => {
			if (p.stage === lastStage && p.fraction - last < 0.01 && p.done < p.total) return;
			last = p.fraction;
			lastStage = p.stage;
			const count = p.total > 1 ? ` (${p.done} of ${p.total})` : '';
			const etaS = etaFrom(p.fraction, 1, (performance.now() - t0) / 1000);
			post(`Analysing ${source}: ${STAGE_WORDS[p.stage]}${count}`, p.fraction, etaS);
		},
	};
}

/** The 'open' request: read (streamed for one CSV), analyse, trends; progress with a fraction and time left at every stage. */
async function openAndAnalyse(msg: Extract<ToWorker, { type: 'open' }>, post: Post): Promise<void> {
	const names = msg.files.map((f) => f.name).join(', ');
	const progress = (stage: string, fraction: number | null, etaS: number | null = null, expectS?: number) =>
		post({ type: 'progress', jobId: msg.jobId, stage, fraction, etaS, expectS });
	progress(`Reading ${names}`, 0);
	const { captures, problems } = await readCaptures(
		msg.files,
		msg.overrides,
		(f, eta) => progress(`Reading ${names}`, f, eta),
		(e) => toProblem(e, names),
	);
	for (const p of problems) {
		const f = msg.files.find((x) => x.name === p.source);
		if (f && p.line > 0) p.lineText = await lineOfFile(f, p.line);
	}
	if (problems.length > 0 || captures.length === 0) {
		if (problems.length === 0) problems.push(toProblem(new Error('no capture found in these files'), names));
		post({ type: 'import-failed', jobId: msg.jobId, captureKey: msg.captureKey, problems });
		return;
	}
	const capture = captures[0];
	try {
		progress(`Analysing ${capture.source}`, 0);
		const {
			report,
			extras,
			trend = null,
		} = analyseSpan(capture, withProgress(msg.analysis, capture.source, progress), true);
		cache.delete(msg.captureKey);
		trends.set(msg.captureKey, trend);
		post(
			{
				type: 'opened',
				jobId: msg.jobId,
				captureKey: msg.captureKey,
				capture,
				report,
				extras: { ...extras, trend },
			},
			sampleBuffers(capture),
		);
	} catch (e) {
		post({ type: 'failed', jobId: msg.jobId, message: e instanceof Error ? e.message : String(e) });
	}
}

/** 'Record 2 of 3 (week-02.csv), 1,240,000 samples per channel read', with the share of bytes read. */
function surveyStage(p: SurveyProgress): string {
	const at =
		p.filesDone < p.files ? `record ${p.filesDone + 1} of ${p.files} (${p.file})` : `all ${p.files} records read`;
	return `Supply survey: ${at}, ${p.samplesDone.toLocaleString()} samples per channel read`;
}

/** The 'survey' request: every record through lib/trend, then lib/survey's merge and rules. */
async function survey(msg: Extract<ToWorker, { type: 'survey' }>, post: Post): Promise<void> {
	try {
		const t0 = performance.now();
		const { survey, problems } = await runSurvey(
			msg.files,
			msg.standard,
			msg.declaredV,
			(p) => {
				const f = p.bytesTotal > 0 ? p.bytesDone / p.bytesTotal : null;
				const eta = f === null ? null : etaFrom(p.bytesDone, p.bytesTotal, (performance.now() - t0) / 1000);
				post({ type: 'progress', jobId: msg.jobId, stage: surveyStage(p), fraction: f, etaS: eta });
			},
			toProblem,
		);
		for (const p of problems) {
			const f = msg.files.find((x) => x.name === p.source);
			if (f && p.line > 0) p.lineText = await lineOfFile(f, p.line);
		}
		post({ type: 'surveyed', jobId: msg.jobId, survey, problems });
	} catch (e) {
		post({ type: 'failed', jobId: msg.jobId, message: e instanceof Error ? e.message : String(e) });
	}
}

/** Handles one message from the page. */
export function handleMessage(msg: ToWorker, post: Post): void {
	switch (msg.type) {
		case 'seed':
			cache.set(msg.captureKey, msg.capture);
			return;
		case 'forget':
			cache.delete(msg.captureKey);
			trends.delete(msg.captureKey);
			return;
		case 'analyse': {
			const capture = cache.get(msg.captureKey);
			if (!capture) {
				post({ type: 'missing', jobId: msg.jobId, captureKey: msg.captureKey });
				return;
			}
			try {
				const progress = (stage: string, fraction: number, etaS: number | null) =>
					post({ type: 'progress', jobId: msg.jobId, stage, fraction, etaS });
				progress(`Analysing ${capture.source}`, 0, null);
				const analysis = withProgress(msg.analysis, capture.source, progress);
				const known = trends.has(msg.captureKey);
				const { report, extras: plotExtras, trend } = analyseSpan(capture, analysis, !known);
				if (!known) trends.set(msg.captureKey, trend ?? null);
				const extras = { ...plotExtras, trend: trends.get(msg.captureKey) ?? null };
				post({ type: 'analysed', jobId: msg.jobId, captureKey: msg.captureKey, report, extras });
			} catch (e) {
				post({ type: 'failed', jobId: msg.jobId, message: e instanceof Error ? e.message : String(e) });
			}
			return;
		}
		case 'open':
			void openAndAnalyse(msg, post);
			return;
		case 'survey':
			void survey(msg, post);
			return;
	}
}

export type { AnalysisOptions };
