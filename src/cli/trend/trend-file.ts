/**
 * One recording through `trend`, wherever it runs (in this process, or in a helper process that sends
 * each piece back as a message): the CSV header and rows as they are measured, progress, the
 * diagnostic and event lines, or the JSON document. Plain data in and out, so a helper can run it.
 */
import { eventsCountedOnce } from '../../../lib/report/index.js';
import type { OpenOptions } from '../../../lib/io/open.js';
import type { TrendChannelSpec, TrendInterval, TrendResult } from '../../../lib/trend/types.js';
import { analyseRecording, type AnalyserSettings } from './read-recording.js';
import { errorLine } from '../error-line.js';
import { helperThread, settleHelperThread } from './helper-thread.js';
import { csvRow, eventLine, flickerCsvHeader, flickerCsvRows, flickerLine, trendJson } from './trend-output.js';

export interface TrendJob {
	/** The recording's name in output and messages (its file, or the paths given for one recording of many files). */
	file: string;
	/** The files of one recording split over many files (read-recording.ts orders and joins them); default [file]. */
	parts?: string[];
	open: OpenOptions;
	/** Analyser settings without callbacks (thresholds, declared voltage, THD...). */
	settings: AnalyserSettings;
	json: boolean;
	interval: TrendInterval;
	/** CSV of Pst per 10 min and Plt per 2 h instead of the aggregate rows (`--interval flicker`). */
	flickerCsv?: boolean;
	/** Several files in the run: each CSV row starts with its file. */
	several: boolean;
	/** Report progress (only when stderr is a terminal). */
	progress: boolean;
	/** Threads to analyse with: 2 shares the work with a second thread (helper-thread.ts) where there are 2 cores. */
	threads?: number;
}

/** Where the pieces of one file's trend go, in order. */
export interface TrendSink {
	channels(specs: TrendChannelSpec[]): void;
	/** The flicker CSV header (the command writes it once for files that share it). */
	flickerHeader(text: string): void;
	rows(text: string): void;
	progress(fraction: number): void;
	/** Lines for stderr (diagnostics, events), without line ends, not yet made printable. */
	notes(lines: string[]): void;
	/** The JSON document of the file (with `json`). */
	doc(d: unknown): void;
	/** The error line of one file of a recording of several files that could not be read (or not to its end). */
	failed(line: string): void;
}

const ROWS_PER_WRITE = 256;
const PROGRESS_EVERY_MS = 250;

/**
 * Trends one file into `sink`.
 * @throws ImportError, or any error of the analysis (the caller makes it the file's error line)
 */
export function trendFile(job: TrendJob, sink: TrendSink): void {
	const { file, json, interval, several } = job;
	const flickerCsv = job.flickerCsv === true && !json;
	let pending: string[] = [];
	const flush = () => {
		if (pending.length > 0) sink.rows(pending.join(''));
		pending = [];
	};
	let lastDraw = 0;
	const onProgress = job.progress
		? (f: number) => {
				const now = Date.now();
				if (now - lastDraw < PROGRESS_EVERY_MS) return;
				lastDraw = now;
				sink.progress(f);
			}
		: undefined;
	const parts = job.parts ?? [file];
	const helper = helperThread(job.threads ?? 1);
	let analysed: ReturnType<typeof analyseRecording>;
	try {
		analysed = analyseRecording(
			parts.map((f) => ({ path: f, source: f })),
			job.open,
			{
				...job.settings,
				helper,
				// CSV rows go out as they are measured, so nothing accumulates; JSON keeps them all.
				keep: json ? undefined : { cycles10: false, cycles150: false, min10: false },
				onRow: json
					? undefined
					: (row) => {
							if (flickerCsv || row.interval !== interval) return;
							pending.push(csvRow(row, several ? file : undefined));
							if (pending.length >= ROWS_PER_WRITE) flush();
						},
			},
			{
				onProgress,
				onChannels: (chs) => {
					flush();
					sink.channels(chs);
				},
			},
		);
	} finally {
		settleHelperThread();
	}
	const { result: read, failures } = analysed;
	flush();
	// one file: its error is the job's; of several, each failed file is a line and the rest still counts
	if (!read || (parts.length === 1 && failures.length > 0)) {
		for (const f of failures.slice(1)) sink.failed(errorLine(f.error, f.source));
		throw failures[0]?.error ?? new Error(`${file}: no samples could be read`);
	}
	for (const f of failures) sink.failed(errorLine(f.error, f.source));
	const result: TrendResult = read;
	// lib's messages name no CLI option (the UI shows them too): the option is added here
	const hint = (d: { code: string }) =>
		d.code === 'events-not-detected' || d.code === 'declared-voltage-unknown' ? ' (--nominal <V>)' : '';
	const lines = result.diagnostics.map((d) => `${file}: ${d.severity}: ${d.message}${hint(d)}`);
	// each all-phase interruption once, not also as the dip that contains it
	result.events = eventsCountedOnce(result.events);
	if (flickerCsv) {
		if (result.flicker) {
			sink.flickerHeader(flickerCsvHeader(result.flicker, several));
			sink.rows(flickerCsvRows(result.flicker, several ? file : undefined).join(''));
		} else lines.push(`${file}: flicker not measured (no voltage channel, or under 1600 samples per second)`);
	}
	if (json) sink.doc(trendJson(file, result));
	else {
		lines.push(...result.events.map((e) => `${file}: ${eventLine(e, result.declaredV)}`));
		if (result.flicker && !flickerCsv) lines.push(`${file}: ${flickerLine(result.flicker)}`);
	}
	sink.notes(lines);
}

/** The messages a helper process sends for one file, in order; 'done' or 'error' ends them. */
export type TrendMessage =
	| { t: 'channels'; specs: TrendChannelSpec[] }
	| { t: 'flickerHeader'; text: string }
	| { t: 'rows'; text: string }
	| { t: 'progress'; fraction: number }
	| { t: 'notes'; lines: string[] }
	| { t: 'doc'; doc: unknown }
	| { t: 'failed'; line: string }
	| { t: 'done' }
	| { t: 'error'; line: string };

/** A sink that sends every piece through `send` (a helper process's channel to its parent). */
export function messageSink(send: (m: TrendMessage) => void): TrendSink {
	return {
		channels: (specs) => send({ t: 'channels', specs }),
		flickerHeader: (text) => send({ t: 'flickerHeader', text }),
		rows: (text) => send({ t: 'rows', text }),
		progress: (fraction) => send({ t: 'progress', fraction }),
		notes: (lines) => send({ t: 'notes', lines }),
		doc: (doc) => send({ t: 'doc', doc }),
		failed: (line) => send({ t: 'failed', line }),
	};
}
