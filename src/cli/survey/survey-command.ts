/**
 * `sinecheck survey <path...>`: a voltage-characteristics survey (EN 50160 or IEC 61000-2-2) of one
 * recording that may span many files. Each path is a recording file or folder (analysed here, one file
 * at a time, in bounded memory) or a JSON file written by `sinecheck trend --json` (the per-file step run
 * elsewhere: this command is then the merge). Returns 0 when every measured rule is met, 1 when one is
 * not, 2 for an input or usage error (the survey of the other files is still printed).
 */
import { readFileSync, statSync } from 'node:fs';
import { extname } from 'node:path';
import type { OpenOptions } from '../../../lib/io/open.js';
import { assessSurvey } from '../../../lib/survey/index.js';
import {
	recordingNotesOf,
	SurveyMergeError,
	surveyInputFromTrend,
	trendDocumentOf,
	type TrendDocument,
} from '../../../lib/survey/index.js';
import type { Diagnostic } from '../../../lib/capture.js';
import type { SurveyStandardId } from '../../../lib/survey/types.js';
import { collectUnits } from '../collect-files.js';
import { ERROR_PREFIX, errorLine, problemLine } from '../error-line.js';
import { UsageError } from '../usage-error.js';
import { analyseRecording, type RecordingFile } from '../trend/read-recording.js';
import { helperThread, settleHelperThread } from '../trend/helper-thread.js';
import { surveyCsv, surveyJson, surveyTable } from './survey-output.js';

export interface SurveyCommandOptions {
	standard?: string;
	/** Declared supply voltage Un in V, line-to-neutral for line-to-neutral channels. */
	nominal?: number | string;
	frequency?: number | string;
	json?: boolean;
	/** One CSV row per rule line and per event-table cell. */
	csv?: boolean;
	open?: OpenOptions;
	/** Threads per recording: 1, or 2 (default) to share the work with a second thread where there are 2 or more cores. */
	threads?: number | string;
	stdout?: NodeJS.WritableStream;
	stderr?: NodeJS.WritableStream;
}

const STANDARDS: Record<string, SurveyStandardId> = { en50160: 'en50160', 'iec61000-2-2': 'iec61000-2-2' };

function isTrendDocument(x: unknown): x is TrendDocument {
	const d = x as TrendDocument;
	return (
		typeof d === 'object' &&
		d !== null &&
		Array.isArray(d.aggregates) &&
		Array.isArray(d.channels) &&
		Array.isArray(d.events) &&
		Array.isArray(d.frequency) &&
		typeof d.durationS === 'number'
	);
}

/** The trend documents in a JSON file: one document, an array of them, or JSON Lines. */
function documentsIn(path: string): TrendDocument[] {
	const text = readFileSync(path, 'utf8');
	let values: unknown[];
	try {
		const v: unknown = JSON.parse(text);
		values = Array.isArray(v) ? v : [v];
	} catch {
		values = text
			.split('\n')
			.filter((l) => l.trim() !== '')
			.map((l, i) => {
				try {
					return JSON.parse(l) as unknown;
				} catch {
					throw new UsageError(`${path}:${i + 1}: not JSON: expected the output of 'sinecheck trend --json'`);
				}
			});
	}
	const bad = values.findIndex((v) => !isTrendDocument(v));
	if (bad >= 0)
		throw new UsageError(
			`${path}: document ${bad + 1} is not a trend document: expected the output of 'sinecheck trend --json'`,
		);
	return values as TrendDocument[];
}

function number(
	name: string,
	v: number | string | undefined,
	ok: (x: number) => boolean,
	what: string,
): number | undefined {
	if (v === undefined || v === '') return undefined;
	const x = Number(String(v).replace(',', '.'));
	if (!Number.isFinite(x) || !ok(x)) throw new UsageError(`--${name} ${v}: expected ${what}`);
	return x;
}

export async function surveyCommand(paths: string[], options: SurveyCommandOptions = {}): Promise<number> {
	const out = options.stdout ?? process.stdout;
	const err = options.stderr ?? process.stderr;
	let standard: SurveyStandardId;
	let declaredV: number | undefined;
	let nominalHz: number | undefined;
	let threads: number;
	try {
		if (paths.length === 0)
			throw new UsageError('survey: give the recording files or folders (or trend JSON files) of one recording');
		const s = STANDARDS[(options.standard ?? 'en50160').toLowerCase()];
		if (!s) throw new UsageError(`--standard ${options.standard}: expected en50160 or iec61000-2-2`);
		standard = s;
		declaredV = number(
			'nominal',
			options.nominal,
			(x) => x > 0,
			'the declared supply voltage in V (line-to-neutral for line-to-neutral channels)',
		);
		nominalHz = number('frequency', options.frequency, (x) => x === 50 || x === 60, '50 or 60 (Hz)');
		threads = number('threads', options.threads, (x) => x === 1 || x === 2, '1 or 2 (threads)') ?? 2;
		if (options.json && options.csv) throw new UsageError('survey: give --json or --csv, not both');
	} catch (e) {
		err.write(`${ERROR_PREFIX}${(e as Error).message}\n`);
		return 2;
	}
	const docs: TrendDocument[] = [];
	const recordingNotes: Diagnostic[] = [];
	const files: RecordingFile[] = [];
	let failed = 0;
	for (const path of paths) {
		try {
			const isJson = ['.json', '.jsonl'].includes(extname(path).toLowerCase()) && statSync(path).isFile();
			if (isJson) docs.push(...documentsIn(path));
			else {
				// a FIFO, a dangling link or an unreadable entry is said by name, as trend and analyse say it
				const { units, problems } = collectUnits([path]);
				for (const p of problems) {
					failed++;
					err.write(`${problemLine(p)}\n`);
				}
				for (const u of units) files.push({ path: u.files[0], source: u.files[0] });
			}
		} catch (e) {
			failed++;
			err.write(`${errorLine(e, path)}\n`);
		}
	}
	if (files.length > 0) {
		// every recording file given is one recording: one analyser, fed in start-time order
		let analysed: ReturnType<typeof analyseRecording>;
		try {
			analysed = analyseRecording(files, options.open ?? {}, {
				declaredV,
				nominalHz: nominalHz as 50 | 60 | undefined,
				harmonics: true,
				keep: { cycles10: false, cycles150: false, min10: true },
				helper: helperThread(threads),
			});
		} finally {
			settleHelperThread();
		}
		const { result, failures } = analysed;
		for (const f of failures) {
			failed++;
			err.write(`${errorLine(f.error, f.source)}\n`);
		}
		if (result) {
			// the merge's document with each interval's Pst, the Plt values and the recording's files and gaps
			const source = files.length === 1 ? files[0].source : paths.join(', ');
			docs.push(trendDocumentOf(source, result));
			recordingNotes.push(...recordingNotesOf(result));
		}
	}
	if (docs.length === 0) {
		err.write(`${ERROR_PREFIX}survey: no recording could be read\n`);
		return 2;
	}
	try {
		const merged = surveyInputFromTrend(docs, declaredV);
		const input = merged.input;
		// what the readers detected or assumed and what the recording found (overlaps, order), then the merge's notes
		const diagnostics = [...recordingNotes, ...merged.diagnostics];
		const result = assessSurvey(input, standard);
		const notes = diagnostics.map((d) => d.message);
		if (options.json)
			out.write(
				`${surveyJson(result, { files: docs.flatMap((d) => d.parts?.map((p) => p.source) ?? [d.source]), clockAligned: input.clockAligned, spanStartS: input.spanStartS, diagnostics })}\n`,
			);
		else if (options.csv) {
			out.write(surveyCsv(result));
			for (const n of notes) err.write(`note: ${n}\n`);
		} else out.write(surveyTable(result, input.spanStartS, input.clockAligned, notes));
		if (failed > 0) return 2;
		return result.meets === false ? 1 : 0;
	} catch (e) {
		if (e instanceof SurveyMergeError) {
			err.write(`${ERROR_PREFIX}${e.source}: ${e.message}\n`);
			return 2;
		}
		throw e;
	}
}
