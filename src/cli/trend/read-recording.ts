/**
 * Feeds one recording, one file or many, through ONE trend analyser (lib/trend's recording analyser),
 * streaming every format from disk in fixed-size blocks, so memory stays flat in the length of the
 * recording and in its channel count. The files of a recording are ordered by their stated start times
 * (read first from each file's head) and fed one after another: the analyser's state runs on across a
 * file boundary; a gap or overlap between files is found from the start times and reported; a file with
 * another sample rate or other channels is refused with a located 'not-same-recording' error, and a file
 * that fails part-way keeps the samples read before the error (the rest is a gap). Formats:
 * - WAV: the data chunk is read in blocks (wav-stream.ts);
 * - CSV/TXT/TSV: lib/io's CsvSampleStream takes the text in 1 MiB chunks and hands on each chunk's rows;
 *   no column is held whole;
 * - COMTRADE .cfg + .dat, or .cff, with one sampling rate: the .cfg (or the .cff's head) is read whole,
 *   the data in 1 MiB chunks (ComtradeSampleStream, any file type). A record with several rates or with
 *   time stamps only is read whole (up to WHOLE_READ_MAX_BYTES).
 * The sample rate and channel count are checked against lib/trend's bounds before any sample is analysed
 * (an ImportError 'out-of-range' at the place the rate or the columns come from).
 * This file is the file-system adapter: lib gets bytes only.
 */
import { closeSync, openSync, readdirSync, readFileSync, readSync, statSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import type { Capture, Diagnostic } from '../../../lib/capture.js';
import { cffLayout } from '../../../lib/io/index.js';
import { parseComtradeCfg } from '../../../lib/io/index.js';
import { ComtradeSampleStream, streamableRate } from '../../../lib/io/index.js';
import { decodeText } from '../../../lib/io/index.js';
import { CsvSampleStream, type SampleSink, type SampleStreamHeader } from '../../../lib/io/index.js';
import { ImportError } from '../../../lib/io/index.js';
import { hasImportSettings } from '../../../lib/io/index.js';
import {
	csvOptionsWithSettings,
	DETECT_HEAD_BYTES,
	detectFileKind,
	openCapture,
	type InputFile,
	type OpenOptions,
} from '../../../lib/io/index.js';
import { createRecordingAnalyser, RecordingMismatch, type RecordingAnalyser } from '../../../lib/trend/index.js';
import type { RecordingResult } from '../../../lib/trend/index.js';
import { TREND_MAX_CHANNELS, trendLimitProblem } from '../../../lib/trend/index.js';
import { clockTimeOf, orderRecordingParts, type RecordingPartInfo } from '../../../lib/trend/index.js';
import type { TrendChannelSpec, TrendOptions, TrendResult } from '../../../lib/trend/types.js';
import { openWavStream } from './wav-stream.js';

export type AnalyserSettings = Omit<TrendOptions, 'sampleRateHz' | 'channels'>;

/** Called now and then with the fraction of the file done (0…1). */
export type OnProgress = (fraction: number) => void;

export interface AnalyseFileHooks {
	onProgress?: OnProgress;
	/** Called once the channels are known, before the first sample is analysed. */
	onChannels?: (channels: TrendChannelSpec[]) => void;
}

const BLOCK_FRAMES = 65_536;

function head(path: string, bytes: number): Uint8Array {
	const fd = openSync(path, 'r');
	try {
		const b = Buffer.alloc(bytes);
		const n = readSync(fd, b, 0, bytes, 0);
		return b.subarray(0, n);
	} finally {
		closeSync(fd);
	}
}

/** The assumption made when a start time states no zone (lib/trend/clock.ts takes it as written). */
function clockNotes(startTime: string | undefined): Diagnostic[] {
	const clock = clockTimeOf(startTime);
	return clock?.zone === 'as written'
		? [
				{
					code: 'clock-zone-as-written',
					severity: 'assumption',
					message: `The start time ${startTime} states no time zone: it is taken as the recorder's clock, as written.`,
				},
			]
		: [];
}

/** A capture read whole (bounded by WHOLE_READ_MAX_BYTES) into the recording, its rate checked first. */
function analyseWhole(
	capture: Capture,
	target: PartTarget,
	hooks: AnalyseFileHooks,
	ratePlace: RatePlace,
): Diagnostic[] {
	target.begin(capture, ratePlace);
	const n = capture.channels[0]?.samples.length ?? 0;
	for (let off = 0; off < n; off += BLOCK_FRAMES) {
		const end = Math.min(n, off + BLOCK_FRAMES);
		target.push(capture.channels.map((c) => c.samples.subarray(off, end)));
		hooks.onProgress?.(end / n);
	}
	const extra: Diagnostic[] = capture.timeS
		? [
				{
					code: 'time-base-treated-uniform',
					severity: 'warning',
					message: `The file has an explicit time base; trends treat it as uniform at its mean rate ${capture.sampleRateHz} Hz.`,
				},
			]
		: [];
	return [...capture.diagnostics, ...extra, ...clockNotes(capture.startTime)];
}

/** `name` with its file name replaced by `file`, keeping the folder part exactly as it was written. */
function besideName(name: string, file: string): string {
	return name.slice(0, name.length - basename(name).length) + file;
}

/** Largest file read whole (a COMTRADE record with several rates or time stamps only). */
const WHOLE_READ_MAX_BYTES = 512 * 2 ** 20;
/** Largest .cfg: a few lines per channel. */
const CFG_MAX_BYTES = 16 * 2 ** 20;
const CHUNK_BYTES = 1 << 20;

/** Where the sample rate of a recording was read, for an 'out-of-range' error. */
interface RatePlace {
	source: string;
	line: number;
	column: number;
}

/** What a file says about itself before its first sample. */
interface PartHead {
	sampleRateHz: number;
	channels: readonly { name: string; quantity: TrendChannelSpec['quantity']; unit: string }[];
	startTime?: string;
	nominalFrequencyHz?: number;
}

/** Where one file's samples go: the recording, after the file's rate and channels are checked. */
interface PartTarget {
	/**
	 * Checks lib/trend's bounds and that the file fits the recording (same rate and channels), each as an
	 * ImportError at `ratePlace` (the channels at `channelsPlace`, default: the rate's line, column 0).
	 */
	begin(h: PartHead, ratePlace: RatePlace, channelsPlace?: RatePlace): void;
	push(views: Float64Array[]): void;
}

/** The sink that begins the part once the header is known (after the checks) and pushes each block. */
function trendSink(
	target: PartTarget,
	place: (h: SampleStreamHeader) => RatePlace,
	channelsPlace?: () => RatePlace,
): SampleSink & { header(): SampleStreamHeader } {
	let head: SampleStreamHeader | undefined;
	const views: Float64Array[] = [];
	return {
		start(h) {
			target.begin(h, place(h), channelsPlace?.());
			head = h;
		},
		samples(chunk, n) {
			for (let c = 0; c < chunk.length; c++) views[c] = chunk[c].length === n ? chunk[c] : chunk[c].subarray(0, n);
			views.length = chunk.length;
			target.push(views);
		},
		header: () => head!,
	};
}

/** Pushes bytes [from, to) of the file at `path` to `push` in 1 MiB chunks from one reused buffer. */
function streamFile(
	path: string,
	push: (chunk: Uint8Array) => void,
	onBytes?: (done: number) => void,
	from = 0,
	to = Infinity,
): void {
	const fd = openSync(path, 'r');
	try {
		const buf = new Uint8Array(CHUNK_BYTES);
		let pos = from;
		for (;;) {
			const n = readSync(fd, buf, 0, Math.min(buf.length, to - pos), pos);
			if (n === 0) break;
			push(buf.subarray(0, n));
			pos += n;
			onBytes?.(pos);
		}
	} finally {
		closeSync(fd);
	}
}

function analyseCsv(
	path: string,
	source: string,
	size: number,
	open: OpenOptions,
	target: PartTarget,
	hooks: AnalyseFileHooks,
): Diagnostic[] {
	// the rate comes from the time column's first rows, or the preamble / options
	const ratePlace = (): RatePlace => {
		const l = stream.layout;
		if (!l) return { source, line: 0, column: 0 };
		return l.timeColumn !== null
			? { source, line: l.bodyLine, column: l.timeColumn + 1 }
			: { source, line: l.headerLine ?? l.bodyLine, column: 0 };
	};
	// the channels come from the header line
	const sink = trendSink(target, ratePlace, () => ({
		source,
		line: stream.layout?.headerLine ?? stream.layout?.bodyLine ?? 0,
		column: 0,
	}));
	const stream: CsvSampleStream = new CsvSampleStream(source, csvOptionsWithSettings(open), sink, {
		totalBytes: size,
		maxChannels: TREND_MAX_CHANNELS,
		onProgress: (d, t) => hooks.onProgress?.(t > 0 ? d / t : 0),
	});
	streamFile(path, (chunk) => stream.push(chunk));
	const late = stream.end();
	const h = sink.header();
	return [...h.diagnostics, ...late, ...clockNotes(h.startTime)];
}

/** The .dat (and .hdr/.inf) beside a .cfg: same base name, any case. */
function companionPaths(path: string): Map<string, string> {
	const dir = dirname(path);
	const base = basename(path, extname(path)).toLowerCase();
	const out = new Map<string, string>();
	for (const f of readdirSync(dir)) {
		const ext = extname(f).toLowerCase();
		if (
			f !== basename(path) &&
			basename(f, extname(f)).toLowerCase() === base &&
			['.dat', '.hdr', '.inf'].includes(ext)
		)
			out.set(ext, f);
	}
	return out;
}

function readWhole(path: string, source: string): Uint8Array {
	const size = statSync(path).size;
	if (size > WHOLE_READ_MAX_BYTES) {
		throw new ImportError(
			source,
			0,
			0,
			'too-large',
			`${Math.round(size / 2 ** 20)} MB`,
			`at most ${WHOLE_READ_MAX_BYTES / 2 ** 20} MB for a COMTRADE record with several sampling rates or with time stamps only (read whole); a record with one sampling rate is streamed at any size`,
		);
	}
	return new Uint8Array(readFileSync(path));
}

function analyseComtrade(
	path: string,
	source: string,
	open: OpenOptions,
	target: PartTarget,
	hooks: AnalyseFileHooks,
): Diagnostic[] {
	const cfgSize = statSync(path).size;
	if (cfgSize > CFG_MAX_BYTES)
		throw new ImportError(
			source,
			0,
			0,
			'too-large',
			`${Math.round(cfgSize / 2 ** 20)} MB`,
			`a .cfg of at most ${CFG_MAX_BYTES / 2 ** 20} MB (a few lines per channel)`,
		);
	const cfgBytes = new Uint8Array(readFileSync(path));
	const { text, encoding } = decodeText(cfgBytes);
	const cfg = parseComtradeCfg(text, source);
	const found = companionPaths(path);
	const datName = found.get('.dat');
	if (!datName)
		throw new ImportError(
			source,
			0,
			0,
			'missing-companion-file',
			'',
			`the data file ${basename(source).replace(/\.cfg$/i, '.dat')} next to this .cfg`,
		);
	const datSource = besideName(source, datName);
	const datPath = join(dirname(path), datName);
	if (cfg.analog.length > TREND_MAX_CHANNELS)
		throw new ImportError(
			source,
			2,
			0,
			'out-of-range',
			`${cfg.analog.length} analog channels`,
			`at most ${TREND_MAX_CHANNELS} channels in one recording`,
		);
	const rate = streamableRate(cfg);
	if (!rate || hasImportSettings(open.settings)) {
		// several rates, time stamps only, or import settings (lib/io applies them to the whole capture): read whole (bounded)
		const companions: InputFile[] = [...found.values()].map((f) => ({
			name: besideName(source, f),
			bytes: f === datName ? readWhole(datPath, datSource) : new Uint8Array(readFileSync(join(dirname(path), f))),
		}));
		const capture = openCapture({ name: source, bytes: cfgBytes }, companions, open);
		capture.source = source;
		return analyseWhole(capture, target, hooks, { source, line: cfg.rates[0]?.line ?? 0, column: 0 });
	}
	const sink = trendSink(target, () => ({ source, line: rate.line, column: 1 }));
	const stream = new ComtradeSampleStream(cfg, source, datSource, open.comtrade ?? {}, sink);
	const datSize = statSync(datPath).size;
	streamFile(
		datPath,
		(chunk) => stream.push(chunk),
		(done) => hooks.onProgress?.(datSize > 0 ? done / datSize : 0),
	);
	const late = stream.end();
	const notes = [...sink.header().diagnostics, ...late, ...clockNotes(sink.header().startTime)];
	if (encoding === 'latin1')
		notes.push({
			code: 'comtrade-latin1',
			severity: 'assumption',
			message: `${source} is not valid UTF-8; read as Latin-1 (Windows-1252), as older recorders write.`,
		});
	return notes;
}

/** Bytes of a .cff read to find its CFG section and the DAT section's header line. */
const CFF_HEAD_BYTES = 16 * 2 ** 20;

/** A .cff: CFG (and INF, HDR) sections from the head, the DAT section streamed from its offset. */
function analyseCff(
	path: string,
	source: string,
	size: number,
	open: OpenOptions,
	target: PartTarget,
	hooks: AnalyseFileHooks,
): Diagnostic[] {
	const fd = openSync(path, 'r');
	let head: Uint8Array;
	try {
		head = new Uint8Array(Math.min(size, CFF_HEAD_BYTES));
		head = head.subarray(0, readSync(fd, head, 0, head.length, 0));
	} finally {
		closeSync(fd);
	}
	const { cfg, dat } = cffLayout(head, source, size);
	const rate = streamableRate(cfg);
	if (!rate || hasImportSettings(open.settings))
		return analyseWhole(openCapture({ name: source, bytes: readWhole(path, source) }, [], open), target, hooks, {
			source,
			line: cfg.rates[0]?.line ?? 0,
			column: 0,
		});
	if (cfg.analog.length > TREND_MAX_CHANNELS)
		throw new ImportError(
			source,
			0,
			0,
			'out-of-range',
			`${cfg.analog.length} analog channels`,
			`at most ${TREND_MAX_CHANNELS} channels in one recording`,
		);
	const sink = trendSink(target, () => ({ source, line: rate.line, column: 1 }));
	const stream = new ComtradeSampleStream(cfg, source, source, open.comtrade ?? {}, sink, {
		line: dat.headerLine,
		byte: dat.start,
	});
	streamFile(
		path,
		(chunk) => stream.push(chunk),
		(done) => hooks.onProgress?.(size > 0 ? done / size : 0),
		dat.start,
		dat.end,
	);
	const late = stream.end();
	return [
		{ code: 'comtrade-cff', severity: 'info', message: 'Single-file COMTRADE (.cff); its data section was streamed.' },
		...sink.header().diagnostics,
		...late,
		...clockNotes(sink.header().startTime),
	];
}

/** One WAV file streamed into the recording (the WAV header states no start time). */
function readWav(
	path: string,
	source: string,
	open: OpenOptions,
	target: PartTarget,
	hooks: AnalyseFileHooks,
): Diagnostic[] {
	const wav = openWavStream(path, source, open.wav, BLOCK_FRAMES, open.settings);
	try {
		const h = wav.header;
		// bytes 24-27 of the fmt chunk hold the rate, 22-23 the channel count
		target.begin(
			{ sampleRateHz: wav.sampleRateHz, channels: h.channels },
			{ source, line: 0, column: 25 },
			{
				source,
				line: 0,
				column: 23,
			},
		);
		const bufs = h.channels.map(() => new Float64Array(BLOCK_FRAMES));
		let done = 0;
		for (;;) {
			const n = wav.read(bufs);
			if (n === 0) break;
			target.push(bufs.map((b) => b.subarray(0, n)));
			done += n;
			hooks.onProgress?.(done / Math.max(1, wav.frames));
		}
		return h.diagnostics;
	} finally {
		wav.close();
	}
}

/** One file of a recording into `target`, by its kind; returns what the reader detected or assumed. */
function readPart(
	path: string,
	source: string,
	open: OpenOptions,
	target: PartTarget,
	hooks: AnalyseFileHooks,
): Diagnostic[] {
	const size = statSync(path).size;
	const ext = extname(path).toLowerCase();
	const { kind } = detectFileKind(path, head(path, DETECT_HEAD_BYTES));
	if (kind === 'wav') return readWav(path, source, open, target, hooks);
	if (kind === 'comtrade-cff') return analyseCff(path, source, size, open, target, hooks);
	if (kind === 'comtrade-cfg') return analyseComtrade(path, source, open, target, hooks);
	if (kind === 'comtrade-part') {
		throw new ImportError(
			source,
			0,
			0,
			'unsupported-format',
			ext,
			'the .cfg file of a COMTRADE record (its .dat is found beside it)',
		);
	}
	if (kind === 'binary')
		throw new ImportError(
			source,
			0,
			0,
			'unsupported-format',
			ext,
			'a .csv/.txt/.tsv table, a .wav file, a COMTRADE .cfg with its .dat, or a .cff file',
		);
	return analyseCsv(path, source, size, open, target, hooks);
}

/** Stops a CSV stream once its header is known (startOf). */
class HeaderFound extends Error {}

/**
 * The start time a file states (ISO text), read from its head only: the .cfg (or the .cff's CFG section),
 * or a CSV's preamble or first date/time stamp. Undefined for WAV and for files that state none.
 * @throws ImportError when the head cannot be read (the file then fails as it would in the full pass)
 */
function startOf(path: string, source: string, open: OpenOptions): string | undefined {
	const size = statSync(path).size;
	const { kind } = detectFileKind(path, head(path, DETECT_HEAD_BYTES));
	if (kind === 'wav' || kind === 'binary' || kind === 'comtrade-part') return undefined;
	if (kind === 'comtrade-cfg') {
		if (size > CFG_MAX_BYTES) return undefined;
		return parseComtradeCfg(decodeText(new Uint8Array(readFileSync(path))).text, source).firstData?.iso;
	}
	if (kind === 'comtrade-cff')
		return cffLayout(head(path, Math.min(size, CFF_HEAD_BYTES)), source, size).cfg.firstData?.iso;
	let found: SampleStreamHeader | undefined;
	const stream = new CsvSampleStream(source, csvOptionsWithSettings(open), {
		start(h) {
			found = h;
			throw new HeaderFound();
		},
		samples() {},
	});
	try {
		streamFile(path, (chunk) => stream.push(chunk));
		stream.end();
	} catch (e) {
		if (!(e instanceof HeaderFound)) throw e;
	}
	return found?.startTime;
}

/** Bytes of a CSV read to estimate its length from its rows' mean size. */
const CSV_ESTIMATE_BYTES = 1 << 20;

/**
 * A CSV's length in s from its size: the data rows in its first MiB give the mean bytes per row (exact
 * when the whole file is in that MiB). `bodyLine` is the 1-based line of the first data row.
 */
function csvDurationS(path: string, size: number, bodyLine: number, rateHz: number): { s: number; exact: boolean } {
	const h = head(path, Math.min(size, CSV_ESTIMATE_BYTES));
	let line = 1;
	let body = 0;
	let rows = 0;
	let lastEnd = 0;
	for (let i = 0; i < h.length; i++) {
		if (h[i] !== 10) continue;
		line++;
		if (line === bodyLine) body = i + 1;
		else if (line > bodyLine) rows++;
		lastEnd = i + 1;
	}
	const whole = h.length === size;
	if (whole) return { s: (rows + (lastEnd < size ? 1 : 0)) / rateHz, exact: true };
	if (rows === 0) return { s: NaN, exact: false };
	return { s: (size - body) / ((lastEnd - body) / rows) / rateHz, exact: false };
}

/**
 * What a file says about itself before its samples: start time, sample rate, channels and length (exact
 * from a COMTRADE sample count, estimated from the size for a CSV). A WAV states no start time: only its
 * name. Reads the head of the file only (for a CSV, until its channels and rate are known).
 * @throws ImportError when the head cannot be read
 */
export function probePart(path: string, source: string, open: OpenOptions): RecordingPartInfo {
	const size = statSync(path).size;
	const { kind } = detectFileKind(path, head(path, DETECT_HEAD_BYTES));
	if (kind === 'wav' || kind === 'binary' || kind === 'comtrade-part') return { source };
	if (kind === 'comtrade-cfg' || kind === 'comtrade-cff') {
		if (kind === 'comtrade-cfg' && size > CFG_MAX_BYTES) return { source };
		const cfg =
			kind === 'comtrade-cfg'
				? parseComtradeCfg(decodeText(new Uint8Array(readFileSync(path))).text, source)
				: cffLayout(head(path, Math.min(size, CFF_HEAD_BYTES)), source, size).cfg;
		let header: SampleStreamHeader | undefined;
		const rate = streamableRate(cfg);
		if (rate)
			new ComtradeSampleStream(cfg, source, source, open.comtrade ?? {}, { start: (h) => (header = h), samples() {} });
		const last = cfg.rates[cfg.rates.length - 1];
		return {
			source,
			clockStartS: clockTimeOf(cfg.firstData?.iso)?.unixS,
			sampleRateHz: rate?.sampleRateHz,
			channels: header?.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
			durationS: rate && last ? last.endSample / rate.sampleRateHz : undefined,
			durationExact: true,
		};
	}
	let found: SampleStreamHeader | undefined;
	const stream = new CsvSampleStream(source, csvOptionsWithSettings(open), {
		start(h) {
			found = h;
			throw new HeaderFound();
		},
		samples() {},
	});
	try {
		streamFile(path, (chunk) => stream.push(chunk));
		stream.end();
	} catch (e) {
		if (!(e instanceof HeaderFound)) throw e;
	}
	if (!found) return { source };
	const d = csvDurationS(path, size, stream.layout?.bodyLine ?? 1, found.sampleRateHz);
	return {
		source,
		clockStartS: clockTimeOf(found.startTime)?.unixS,
		sampleRateHz: found.sampleRateHz,
		channels: found.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
		durationS: Number.isFinite(d.s) ? d.s : undefined,
		durationExact: d.exact,
	};
}

/** One file of a recording: its path on disk and its name in messages. */
export interface RecordingFile {
	path: string;
	source: string;
}

/** A file of the recording that could not be read (or not to its end). */
export interface RecordingFailure {
	source: string;
	error: unknown;
}

/**
 * The files in recording order (lib/trend's orderRecordingParts, as the browser orders them): by stated
 * start time when every file states one; by name when none does (reported); a file that states none while
 * the others do is refused (it cannot be placed on their clock). A file whose head cannot be read is a
 * failure and left out.
 */
function orderFiles(
	files: RecordingFile[],
	open: OpenOptions,
	failures: RecordingFailure[],
	notes: Diagnostic[],
): { ordered: RecordingFile[]; placement: 'clock' | 'sequence' } {
	if (files.length < 2) return { ordered: files, placement: 'clock' };
	const infos: { file: RecordingFile; source: string; clockStartS?: number }[] = [];
	for (const f of files) {
		try {
			infos.push({ file: f, source: f.source, clockStartS: clockTimeOf(startOf(f.path, f.source, open))?.unixS });
		} catch (error) {
			failures.push({ source: f.source, error });
		}
	}
	const order = orderRecordingParts(infos);
	for (const { part, expected } of order.refused)
		failures.push({
			source: part.source,
			error: new ImportError(part.source, 0, 0, 'not-same-recording', 'no start time', expected),
		});
	notes.push(...order.notes);
	return { ordered: order.ordered.map((x) => x.file), placement: order.placement };
}

/** The target of one file: the bounds, then the recording's own checks, as located ImportErrors. */
function partTarget(recording: RecordingAnalyser, source: string, hooks: AnalyseFileHooks): PartTarget {
	return {
		begin(h, ratePlace, channelsPlace = { ...ratePlace, column: 0 }) {
			const limit = trendLimitProblem(h.sampleRateHz, h.channels.length);
			const at = (what: string) => (what === 'sample-rate' ? ratePlace : channelsPlace);
			if (limit)
				throw new ImportError(
					at(limit.what).source,
					at(limit.what).line,
					at(limit.what).column,
					'out-of-range',
					limit.got,
					limit.expected,
				);
			const specs = h.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit }));
			const first = !recording.started;
			const nominal = h.nominalFrequencyHz === 50 || h.nominalFrequencyHz === 60 ? h.nominalFrequencyHz : undefined;
			try {
				recording.beginPart({
					source,
					sampleRateHz: h.sampleRateHz,
					channels: specs,
					clockStartS: clockTimeOf(h.startTime)?.unixS,
					nominalHz: nominal,
				});
			} catch (e) {
				if (!(e instanceof RecordingMismatch)) throw e;
				const p = at(e.what);
				throw new ImportError(p.source, p.line, p.column, 'not-same-recording', e.got, e.expected);
			}
			if (first) hooks.onChannels?.(specs);
		},
		push: (views) => recording.push(views),
	};
}

/**
 * Import notes of several files: a warning once per (code, message), naming its file; any other note
 * (what was detected or assumed, the same in every file of a recording) once per code, from the first file.
 */
function addNotes(all: Diagnostic[], seen: Set<string>, notes: Diagnostic[], source: string, several: boolean): void {
	for (const d of notes) {
		const key = d.severity === 'warning' ? `${d.code}\u0000${d.message}` : d.code;
		if (seen.has(key)) continue;
		seen.add(key);
		all.push(several && d.severity === 'warning' ? { ...d, message: `${source}: ${d.message}` } : d);
	}
}

/**
 * Analyses one recording made of `files` (one or many) through one trend analyser; see the module comment.
 * @returns the result (undefined when no file could be read) and the files that failed, each with its
 *   error (an ImportError located in that file, or any error of its reading); a file that failed part-way
 *   keeps the samples read before the error
 */
export function analyseRecording(
	files: RecordingFile[],
	open: OpenOptions,
	settings: AnalyserSettings,
	hooks: AnalyseFileHooks = {},
): { result: RecordingResult | undefined; failures: RecordingFailure[] } {
	const failures: RecordingFailure[] = [];
	const notes: Diagnostic[] = [];
	const { ordered, placement } = orderFiles(files, open, failures, notes);
	const recording = createRecordingAnalyser({ ...settings, placement });
	const sizes = ordered.map((f) => statSync(f.path).size);
	const total = sizes.reduce((a, b) => a + b, 0);
	const seen = new Set<string>();
	let done = 0;
	ordered.forEach((f, k) => {
		const onProgress =
			hooks.onProgress && ((x: number) => hooks.onProgress!(total > 0 ? (done + x * sizes[k]) / total : x));
		try {
			addNotes(
				notes,
				seen,
				readPart(f.path, f.source, open, partTarget(recording, f.source, hooks), { ...hooks, onProgress }),
				f.source,
				ordered.length > 1,
			);
		} catch (error) {
			failures.push({ source: f.source, error });
		}
		done += sizes[k];
	});
	if (!recording.started) return { result: undefined, failures };
	const result = recording.finish();
	result.diagnostics = [...notes, ...result.diagnostics];
	return { result, failures };
}

/**
 * Analyses one file (a recording of one file).
 * @param path  the file on disk
 * @param source  the name to show in messages and errors
 * @throws ImportError for anything the readers cannot take (file, line, column, what was expected)
 */
export function analyseFile(
	path: string,
	source: string,
	open: OpenOptions,
	settings: AnalyserSettings,
	hooks: AnalyseFileHooks = {},
): TrendResult {
	const { result, failures } = analyseRecording([{ path, source }], open, settings, hooks);
	if (failures.length > 0) throw failures[0].error;
	return result!;
}
