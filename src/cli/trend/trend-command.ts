/**
 * `sinecheck trend <file...>`: per-cycle trends and voltage events of long recordings.
 * CSV of the aggregates on stdout (rows written as they are measured), or with --json one JSON document
 * per recording. Events, diagnostics and errors go to stderr, one line each; progress only on a terminal.
 * A folder is walked as `analyse` walks it (collect-files.ts); a COMTRADE .cfg takes its .dat. Several
 * files are ONE recording (one analyser, in start-time order) when they fit one (same sample rate and
 * channels, start times stated, each following the one before: joinPlan), or with `oneRecording`;
 * otherwise, or with `eachFile`, each file is its own recording. A note on stderr says which was assumed.
 * Error lines have the `analyse` command's shape: `sinecheck: <path as given>[:line[:column]]: message`
 * (`sinecheck: <path>: byte N: message` for an offset in a binary file).
 * Returns the exit code: 0 ok, 2 usage or input error.
 */
import type { OpenOptions } from '../../../lib/io/open.js';
import type { TrendInterval, TrendThresholds } from '../../../lib/trend/types.js';
import { collectUnits } from '../collect-files.js';
import { ERROR_PREFIX as PREFIX, errorLine, problemLine } from '../error-line.js';
import { regularFileProblem } from '../file-checks.js';
import { printable, printableJson } from '../printable.js';
import { UsageError } from '../usage-error.js';
import { defaultHeapMiB, helperAvailable, HelperProcess, timeLimitFor } from '../helper-process.js';
import type { AnalyserSettings } from './read-recording.js';
import type { TrendJob, TrendMessage, TrendSink } from './trend-file.js';

export interface TrendCommandOptions {
	/** Declared voltage Udin in V (line-to-neutral when the channels are). Inferred when absent. */
	nominal?: number | string;
	/** Nominal frequency, 50 or 60 Hz; from the file or the first cycles when absent. */
	frequency?: number | string;
	json?: boolean;
	/** Which aggregate rows the CSV holds: '10/12-cycle' (default; also '200ms'), '150/180-cycle' ('3s'), '10-min' ('10min'). */
	interval?: string;
	dipPercent?: number | string;
	swellPercent?: number | string;
	interruptionPercent?: number | string;
	hysteresisPercent?: number | string;
	/** Also detect rapid voltage changes with this threshold, % of the declared voltage (hysteresis half of it). */
	rvcPercent?: number | string;
	/** false skips the harmonic analysis (THD columns empty). Default true. */
	thd?: boolean;
	/** Also each harmonic order 2-50 per channel (% of the fundamental): JSON `harmonicsPercent`, CSV columns `<name> H<n> (%)`. */
	harmonics?: boolean;
	/** Importer options (calibration, CSV layout...) prepared by the caller. */
	open?: OpenOptions;
	/** Seconds one file may take (default: 60 s plus 1 s per MiB); only when files run in a helper process. */
	timeLimitS?: number;
	/** Heap one file may use, MiB (default: up to half the machine); only in a helper process. */
	memoryLimitMiB?: number;
	/**
	 * The files and folders given are ONE recording split over many files: ordered by start time, fed
	 * through one analyser (state carried across the files), gaps and overlaps reported. Without it (and
	 * without `eachFile`) the files are one recording when they fit one (joinPlan).
	 */
	oneRecording?: boolean;
	/** Each file is its own recording (its own rows or JSON document), even when the files fit one recording. */
	eachFile?: boolean;
	/** Trend in this process, without the time and memory limits of a helper process. */
	inProcess?: boolean;
	/** Threads per recording: 1, or 2 (default) to share the work with a second thread on a machine with 2 or more cores. */
	threads?: number | string;
	/** A helper process already started for this command (prestart.ts); closed when not used. */
	helper?: HelperProcess;
	/** Output streams (tests); default process.stdout / process.stderr. */
	stdout?: NodeJS.WritableStream;
	stderr?: NodeJS.WritableStream & { isTTY?: boolean };
}

class TrendUsageError extends Error {}

/**
 * One error line for a file, in the shape every command uses (src/cli/error-line.ts): an ImportError
 * located as `path:line:column` (line and column left out when 0; `byte N` for an offset in a binary
 * file), any other error after the path. `file` is the path as the user gave it; an ImportError names its
 * own file (a COMTRADE .dat beside the .cfg), which read-recording.ts names with the same folder prefix.
 */
export function trendErrorLine(e: unknown, file: string): string {
	return errorLine(e instanceof TrendUsageError ? new UsageError(e.message) : e, file);
}

const INTERVALS: Record<string, TrendInterval> = {
	'10/12-cycle': '10/12-cycle',
	'200ms': '10/12-cycle',
	'150/180-cycle': '150/180-cycle',
	'3s': '150/180-cycle',
	'10-min': '10-min',
	'10min': '10-min',
};

function num(
	option: string,
	value: number | string | undefined,
	check: (x: number) => boolean,
	what: string,
): number | undefined {
	if (value === undefined || value === null || value === '') return undefined;
	const x = typeof value === 'number' ? value : Number(String(value).replace(',', '.'));
	if (!Number.isFinite(x) || !check(x)) throw new TrendUsageError(`--${option} ${value}: expected ${what}`);
	return x;
}

function settingsFrom(options: TrendCommandOptions): {
	settings: AnalyserSettings;
	interval: TrendInterval;
	flickerCsv: boolean;
} {
	const declaredV = num('nominal', options.nominal, (x) => x > 0, 'the declared voltage in V (a number above 0)');
	const hz = num('frequency', options.frequency, (x) => x === 50 || x === 60, '50 or 60 (Hz)');
	const thresholds: Partial<TrendThresholds> = {};
	const pct = (o: string, v: number | string | undefined) =>
		num(o, v, (x) => x >= 0 && x <= 1000, 'a percentage of the declared voltage');
	const dip = pct('dip-percent', options.dipPercent);
	const swell = pct('swell-percent', options.swellPercent);
	const intr = pct('interruption-percent', options.interruptionPercent);
	const hyst = pct('hysteresis-percent', options.hysteresisPercent);
	if (dip !== undefined) thresholds.dipPercent = dip;
	if (swell !== undefined) thresholds.swellPercent = swell;
	if (intr !== undefined) thresholds.interruptionPercent = intr;
	if (hyst !== undefined) thresholds.hysteresisPercent = hyst;
	const rvcPercent = num(
		'rvc-percent',
		options.rvcPercent,
		(x) => x > 0 && x < 100,
		'a rapid-voltage-change threshold in % of the declared voltage (e.g. 3)',
	);
	const flickerCsv = options.interval === 'flicker';
	const interval = flickerCsv ? '10-min' : INTERVALS[options.interval ?? '10/12-cycle'];
	if (!interval)
		throw new TrendUsageError(
			`--interval ${options.interval}: expected one of ${[...Object.keys(INTERVALS), 'flicker'].join(', ')}`,
		);
	return {
		settings: {
			declaredV,
			nominalHz: hz as 50 | 60 | undefined,
			thresholds,
			rvc: rvcPercent === undefined ? undefined : { thresholdPercent: rvcPercent },
			thd: options.thd !== false,
			harmonics: options.harmonics === true && options.thd !== false,
		},
		interval,
		flickerCsv,
	};
}

/**
 * Trends one file in a helper process: its pieces arrive as messages and go to `sink`. Resolves
 * undefined when the file was trended, or its error line (an import error, a crash, out of memory, time).
 */
async function trendInHelper(
	helper: HelperProcess,
	job: TrendJob,
	sink: TrendSink,
	limitS: number,
): Promise<string | undefined> {
	let line: string | undefined;
	const stopped = await helper.run(
		{ kind: 'trend', job },
		(msg) => {
			const m = msg as TrendMessage;
			if (m.t === 'channels') sink.channels(m.specs);
			else if (m.t === 'flickerHeader') sink.flickerHeader(m.text);
			else if (m.t === 'rows') sink.rows(m.text);
			else if (m.t === 'progress') sink.progress(m.fraction);
			else if (m.t === 'notes') sink.notes(m.lines);
			else if (m.t === 'doc') sink.doc(m.doc);
			else if (m.t === 'failed') sink.failed(m.line);
			else if (m.t === 'error') line = m.line;
			return m.t === 'done' || m.t === 'error';
		},
		limitS,
	);
	return stopped === undefined ? line : `${problemLine({ file: job.file, code: 'stopped', message: stopped })}`;
}

/**
 * Whether the recording files given fit one recording (lib/trend's planRecording: the same sample rate and
 * channels, every start time stated, each file following the one before on the clock), read from each
 * file's head; a file whose head cannot be read makes them separate (its error comes when it is trended).
 * @returns whether to join them, and the note saying what was assumed
 */
async function joinPlan(recordings: string[], open: OpenOptions): Promise<{ one: boolean; note: string }> {
	const { probePart } = await import('./read-recording.js');
	const { planRecording } = await import('../../../lib/trend/index.js');
	const infos = [];
	for (const r of recordings) {
		try {
			// only regular files are read (a FIFO would block); the others fail with their line when trended
			if (regularFileProblem(r).message !== undefined) throw new Error('not a regular file');
			infos.push(probePart(r, r, open));
		} catch {
			return {
				one: false,
				note: `the ${recordings.length} files are trended one by one (${r} could not be read before trending)`,
			};
		}
	}
	const plan = planRecording(infos);
	return plan.one
		? { one: true, note: `${plan.summary} (--each-file trends each file on its own)` }
		: {
				one: false,
				note: `the ${recordings.length} files are trended one by one, as separate recordings: ${plan.reason} (--one-recording reads them as one recording anyway)`,
			};
}

/** Runs the trend command over `files`; see the module comment. */
export async function trendCommand(files: string[], options: TrendCommandOptions = {}): Promise<number> {
	const out = options.stdout ?? process.stdout;
	const err = options.stderr ?? process.stderr;
	const tty = (err as { isTTY?: boolean }).isTTY === true;
	let parsed: ReturnType<typeof settingsFrom>;
	let threads: number;
	try {
		if (files.length === 0) throw new TrendUsageError('trend: give at least one recording file or folder');
		parsed = settingsFrom(options);
		threads = num('threads', options.threads, (x) => x === 1 || x === 2, '1 or 2 (threads)') ?? 2;
	} catch (e) {
		options.helper?.close();
		err.write(`${printable(`${PREFIX}${e instanceof Error ? e.message : String(e)}`)}\n`);
		return 2;
	}
	const { settings, interval, flickerCsv } = parsed;
	// The helper process starts now and loads the trend code while this one walks the paths and loads its own.
	const useHelper = options.inProcess !== true && helperAvailable();
	if (!useHelper) options.helper?.close();
	const helper = useHelper
		? (options.helper ?? new HelperProcess(options.memoryLimitMiB ?? defaultHeapMiB(1), '', ['trend', String(threads)]))
		: undefined;
	helper?.start();
	const { csvHeader } = await import('./trend-output.js');
	// Paths -> recordings: folders walked and COMTRADE companions grouped as `analyse` does; a path that
	// does not exist is an error line of its own, and the others still run.
	const recordings: string[] = [];
	const unitFiles = new Map<string, string[]>();
	const partsOf = new Map<string, string[]>();
	let failed = 0;
	for (const path of files) {
		try {
			const { units, skipped, problems } = collectUnits([path]);
			for (const p of problems) {
				failed++;
				err.write(`${problemLine(p)}\n`);
			}
			if (units.length === 0 && problems.length === 0)
				throw new UsageError(`${path}: no recordings found in this folder (looked for .csv .tsv .txt .wav .cfg .cff)`);
			if (skipped.length > 0)
				err.write(
					`${printable(`note: skipped ${skipped.length} file(s) in ${path} that are not recordings (e.g. ${skipped[0]})`)}\n`,
				);
			for (const u of units) {
				recordings.push(u.files[0]);
				unitFiles.set(u.files[0], u.files);
			}
		} catch (e) {
			failed++;
			err.write(`${trendErrorLine(e, path)}\n`);
		}
	}
	if (options.oneRecording && options.eachFile) {
		err.write(`${PREFIX}trend: give --one-recording or --each-file, not both\n`);
		helper?.close();
		return 2;
	}
	let join = options.oneRecording === true;
	if (!join && !options.eachFile && recordings.length > 1) {
		const plan = await joinPlan(recordings, options.open ?? {});
		join = plan.one;
		err.write(`${printable(`note: ${plan.note}`)}\n`);
	}
	if (join && recordings.length > 1) {
		// one recording: its name is the paths given; every file of it is checked and read in one job
		const label = files.join(', ');
		unitFiles.set(
			label,
			recordings.flatMap((r) => unitFiles.get(r) ?? [r]),
		);
		partsOf.set(label, [...recordings]);
		recordings.splice(0, recordings.length, label);
	}
	const several = recordings.length > 1;
	const docs: unknown[] = [];
	let headerFor = '';
	let recordingNow = '';
	let flickerHeaderFor = '';
	const sink: TrendSink = {
		channels: (chs) => {
			const header = csvHeader(chs, several, settings.harmonics === true);
			if (!options.json && !flickerCsv && header !== headerFor) out.write(header);
			headerFor = header;
		},
		flickerHeader: (header) => {
			if (header !== flickerHeaderFor) out.write(header);
			flickerHeaderFor = header;
		},
		rows: (text) => void out.write(text),
		progress: (f) => void err.write(`\r${printable(recordingNow)}: ${(100 * f).toFixed(0)} %\x1b[K`),
		notes: (lines) => {
			if (tty) err.write('\r\x1b[K');
			for (const l of lines) err.write(`${printable(l)}\n`);
		},
		doc: (d) => void docs.push(d),
		failed: (line) => {
			if (tty) err.write('\r\x1b[K');
			failed++;
			err.write(`${printable(line)}\n`);
		},
	};
	try {
		for (const file of recordings) {
			recordingNow = file;
			const job: TrendJob = {
				file,
				parts: partsOf.get(file),
				open: options.open ?? {},
				settings,
				json: options.json === true,
				interval,
				flickerCsv,
				several,
				progress: tty,
				threads,
			};
			let line: string | undefined;
			try {
				// Only regular files are read (a FIFO would block the reader forever, a device never ends).
				const parts = unitFiles.get(file) ?? [file];
				let bytes = 0;
				for (const f of parts) {
					const check = regularFileProblem(f);
					if (check.message !== undefined) throw new UsageError(f === file ? check.message : `${f}: ${check.message}`);
					bytes += check.size;
				}
				if (helper) line = await trendInHelper(helper, job, sink, timeLimitFor(bytes, options.timeLimitS));
				else (await import('./trend-file.js')).trendFile(job, sink); // the signal library loads only here or in a helper
			} catch (e) {
				line = trendErrorLine(e, file);
			}
			if (line !== undefined) {
				if (tty) err.write('\r\x1b[K');
				failed++;
				err.write(`${line}\n`);
			}
		}
	} finally {
		helper?.close();
	}
	if (options.json && docs.length > 0)
		out.write(`${printableJson(JSON.stringify(several ? docs : docs[0], null, 1))}\n`);
	return failed > 0 ? 2 : 0;
}
