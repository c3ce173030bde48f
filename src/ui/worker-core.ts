/**
 * The analysis worker's logic, free of worker globals so tests can run it in-process: open files with
 * lib/io, analyse with lib/report (the same code the CLI runs), post progress and results. Captures stay
 * cached here by key so a new reference channel or limit table re-analyses without re-reading the file.
 */
import type { Capture } from '../../lib/capture.js';
import { isImportError } from '../../lib/io/import-error.js';
import { openCaptures } from '../../lib/io/open.js';
import { parseCsv } from '../../lib/io/csv/index.js';
import { analyseCapture, REPORT_DEFAULT_MAX_ORDER } from '../../lib/report/analyse.js';
import { chooseReference } from '../../lib/report/reference.js';
import { channelSpectrum, planWindows } from '../../lib/report/spectra.js';
import type { AnalysisOptions, AnalysisReport } from '../../lib/report/types.js';
import { analyseTrend } from '../../lib/trend/analyse-capture.js';
import { eventsCountedOnce } from '../../lib/report/events.js';
import type { FromWorker, ImportProblem, ReportExtras, ToWorker, TrendView } from './protocol.js';
import { minOf } from '../../lib/signal/extremes.js';

export type Post = (msg: FromWorker, transfer?: Transferable[]) => void;

const cache = new Map<string, Capture>();
const trends = new Map<string, TrendView | null>();

/**
 * Trends and events of a capture (lib/trend), collecting the Urms(1/2) values it reports per half cycle.
 * Null with no voltage or current channel; a refusal by the analyser becomes `problem`.
 */
export function trendFor(capture: Capture): TrendView | null {
	const channels = capture.channels.filter((c) => c.quantity !== 'other');
	if (channels.length === 0) return null;
	const times: number[][] = capture.channels.map(() => []);
	const values: number[][] = capture.channels.map(() => []);
	try {
		const result = analyseTrend(capture, {
			flickerPinst: true,
			onHalfCycle: (channel, startS, rmsV) => {
				times[channel].push(startS);
				values[channel].push(rmsV);
			},
		});
		// each all-phase interruption once, as the analysis report counts it (not also as the dip containing it)
		result.events = eventsCountedOnce(result.events);
		const used = capture.channels.map((c, k) => ({ c, k })).filter(({ k }) => values[k].length > 0);
		const n = minOf(used.map(({ k }) => values[k].length));
		const first = used[0]?.k ?? 0;
		return {
			result,
			halfCycle: {
				timeS: Float64Array.from(times[first].slice(0, n)),
				rms: used.map(({ k }) => Float64Array.from(values[k].slice(0, n))),
				channels: used.map(({ c }) => c.name),
			},
		};
	} catch (e) {
		const problem = e instanceof Error ? e.message : String(e);
		return { result: null, halfCycle: { timeS: new Float64Array(0), rms: [], channels: [] }, problem };
	}
}

/** An importer failure (or any other thrown value) as data the page can show in place. */
export function toProblem(e: unknown, fallbackSource: string): ImportProblem {
	if (isImportError(e)) {
		return { source: e.source, line: e.line, column: e.column, code: e.code, text: e.text, expected: e.expected, message: e.message };
	}
	const message = e instanceof Error ? e.message : String(e);
	return { source: fallbackSource, line: 0, column: 0, code: 'unreadable', text: '', expected: 'a file Sinecheck can read', message };
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

/** Copy of a capture whose sample buffers can be moved to the page (the cached original stays intact). */
function transferableCopy(c: Capture): { capture: Capture; transfer: Transferable[] } {
	const transfer: Transferable[] = [];
	const channels = c.channels.map((ch) => {
		const samples = ch.samples.slice();
		transfer.push(samples.buffer);
		return { ...ch, samples };
	});
	const timeS = c.timeS?.slice();
	if (timeS) transfer.push(timeS.buffer);
	return { capture: { ...c, channels, timeS }, transfer };
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
 * boundaries (the reference crossings lib/report used, found again by the same call).
 */
export function extrasFor(capture: Capture, report: AnalysisReport, analysis: AnalysisOptions): ReportExtras {
	const fs = capture.sampleRateHz;
	const n = capture.channels[0]?.samples.length ?? 0;
	const i0 = Math.max(0, Math.floor(report.window.startS * fs));
	const i1 = Math.min(n, Math.ceil(report.window.endS * fs));
	const peakIndex: ReportExtras['peakIndex'] = {};
	for (const ch of capture.channels) peakIndex[ch.name] = peakIndices(ch.samples, i0, i1);
	const cycleBoundariesS: number[] = [];
	const groups: ReportExtras['groups'] = {};
	if (report.cyclesAnalysed > 0 && report.referenceChannel !== null) {
		const ref = chooseReference(capture, report.referenceChannel, analysis.nominalHz ?? capture.nominalFrequencyHz);
		if (ref.window) {
			for (const x of ref.window.crossings) cycleBoundariesS.push(x / fs);
			// the same windows lib/report analysed, for the groups the report does not carry
			const slots = planWindows(ref.window, fs, report.window.harmonicWindowCycles);
			if (slots.length > 0) {
				for (const ch of capture.channels) {
					const agg = channelSpectrum(ch.samples, fs, slots, analysis.maxOrder ?? REPORT_DEFAULT_MAX_ORDER).aggregate;
					groups[ch.name] = {
						harmonicGroupRms: Array.from(agg.groups.harmonicGroupRms),
						harmonicSubgroupRms: Array.from(agg.groups.harmonicSubgroupRms),
						interharmonicGroupRms: Array.from(agg.groups.interharmonicGroupRms),
						thdG50Percent: agg.thd.thdG50Percent,
						thdS50Percent: agg.thd.thdS50Percent,
					};
				}
			}
		}
	}
	return { cycleBoundariesS, groups, peakIndex, trend: null };
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
				post({ type: 'progress', jobId: msg.jobId, stage: `Analysing ${capture.source}`, fraction: null });
				const report = analyseCapture(capture, msg.analysis);
				if (!trends.has(msg.captureKey)) trends.set(msg.captureKey, trendFor(capture));
				const extras = { ...extrasFor(capture, report, msg.analysis), trend: trends.get(msg.captureKey) ?? null };
				post({ type: 'analysed', jobId: msg.jobId, captureKey: msg.captureKey, report, extras });
			} catch (e) {
				post({ type: 'failed', jobId: msg.jobId, message: e instanceof Error ? e.message : String(e) });
			}
			return;
		}
		case 'open': {
			const names = msg.files.map((f) => f.name).join(', ');
			post({ type: 'progress', jobId: msg.jobId, stage: `Reading ${names}`, fraction: 0 });
			let captures: Capture[] = [];
			const problems: ImportProblem[] = [];
			try {
				const only = msg.files.length === 1 ? msg.files[0] : undefined;
				const bytes = only ? new Uint8Array(only.bytes) : undefined;
				if (only && bytes && /\.(csv|txt|tsv)$/i.test(only.name) && !(bytes[0] === 0x52 && bytes[1] === 0x49 && bytes[2] === 0x46 && bytes[3] === 0x46)) {
					// one table: the same reader openCaptures picks for it, called directly for its byte progress
					let last = 0;
					const onProgress = (done: number, total: number) => {
						const f = total ? done / total : 0;
						if (f - last >= 0.02 || f === 1) {
							last = f;
							post({ type: 'progress', jobId: msg.jobId, stage: `Reading ${names}`, fraction: f });
						}
					};
					try {
						captures = [parseCsv(bytes, only.name, msg.overrides.csv, onProgress)];
					} catch (e) {
						problems.push(toProblem(e, names));
					}
				} else {
					const result = openCaptures(
						msg.files.map((f) => ({ name: f.name, bytes: new Uint8Array(f.bytes) })),
						msg.overrides,
					);
					captures = result.captures;
					for (const e of result.errors) problems.push(toProblem(e, names));
				}
			} catch (e) {
				problems.push(toProblem(e, names));
			}
			for (const p of problems) {
				const f = msg.files.find((x) => x.name === p.source);
				if (f && p.line > 0) p.lineText = lineOf(f.bytes, p.line);
			}
			if (problems.length > 0 || captures.length === 0) {
				if (problems.length === 0) problems.push(toProblem(new Error('no capture found in these files'), names));
				post({ type: 'import-failed', jobId: msg.jobId, captureKey: msg.captureKey, problems });
				return;
			}
			const capture = captures[0];
			try {
				post({ type: 'progress', jobId: msg.jobId, stage: `Analysing ${capture.source}`, fraction: null });
				const report = analyseCapture(capture, msg.analysis);
				cache.set(msg.captureKey, capture);
				post({ type: 'progress', jobId: msg.jobId, stage: `Trends and events of ${capture.source}`, fraction: null });
				const trend = trendFor(capture);
				trends.set(msg.captureKey, trend);
				const { capture: copy, transfer } = transferableCopy(capture);
				post({ type: 'opened', jobId: msg.jobId, captureKey: msg.captureKey, capture: copy, report, extras: { ...extrasFor(capture, report, msg.analysis), trend } }, transfer);
			} catch (e) {
				post({ type: 'failed', jobId: msg.jobId, message: e instanceof Error ? e.message : String(e) });
			}
			return;
		}
	}
}

export type { AnalysisOptions };
