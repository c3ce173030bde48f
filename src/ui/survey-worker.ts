/**
 * The worker's supply survey: the picked files of one recording fed, in the order of their start times,
 * through ONE lib/trend recording analyser (as `sinecheck survey` does), so half-cycle RMS, events in
 * progress and every aggregation run on across a file boundary and the survey does not depend on where
 * the recorder cut its files. A CSV, or the .dat of a COMTRADE record with one sampling rate, is read in
 * slices from the picked file; WAV, .cff and other COMTRADE records are opened whole by lib/io and fed in
 * blocks. Files that state no start time while others do, and files with another sample rate or other
 * channels, are refused by name (lib/trend's orderRecordingParts and recording analyser) and the rest is
 * still surveyed. Then lib/survey's merge and assessment. Progress counts files and samples. Nothing here
 * computes a statistic: the figures come from lib.
 */
import type { Diagnostic } from '../../lib/capture.js';
import {
	cffLayout,
	csvOptionsWithSettings,
	CsvSampleStream,
	DETECT_HEAD_BYTES,
	ComtradeSampleStream,
	decodeText,
	detectFileKind,
	ImportError,
	openCapture,
	parseComtradeCfg,
	streamableRate,
	type ComtradeConfig,
	type SampleSink,
	type SampleStreamHeader,
} from '../../lib/io/index.js';
import {
	assessSurvey,
	recordingNotesOf,
	SurveyMergeError,
	surveyInputFromTrend,
	trendDocumentOf,
} from '../../lib/survey/index.js';
import type { SurveyStandardId } from '../../lib/survey/types.js';
import {
	clockTimeOf,
	createRecordingAnalyser,
	orderRecordingParts,
	RecordingMismatch,
	TREND_MAX_CHANNELS,
	trendLimitProblem,
	type RecordingAnalyser,
} from '../../lib/trend/index.js';
import { groupFiles, groupLabel } from './files.js';
import type { FileBytes, ImportProblem, SurveyFileLine, SurveyView } from './protocol.js';
import { bytesOf, READ_SLICE_BYTES } from './worker-open.js';

/** Bytes of a CSV read per step while looking for its start time (its header comes within the first rows). */
const START_PROBE_BYTES = 256 * 1024;
/** At most this much of a CSV is read to find its header before the survey orders the files. */
const START_PROBE_MAX_BYTES = 8 << 20;
/** Bytes of a .cff read to find its CFG section. */
const CFF_HEAD_BYTES = 16 << 20;
/** Samples per channel fed to the analyser at a time from a file opened whole. */
const BLOCK_FRAMES = 65_536;

export interface SurveyProgress {
	filesDone: number;
	files: number;
	file: string;
	samplesDone: number;
	bytesDone: number;
	bytesTotal: number;
}

const sizeOf = (f: FileBytes): number => (f.blob ? f.blob.size : (f.bytes?.byteLength ?? 0));

async function slice(f: FileBytes, from: number, to: number): Promise<Uint8Array> {
	return f.blob
		? new Uint8Array(await f.blob.slice(from, to).arrayBuffer())
		: new Uint8Array(f.bytes!, from, to - from);
}

type Kind = 'csv' | 'comtrade' | 'cff' | 'whole';

/** One record of the recording: a file, or a .cfg with its .dat (and .hdr/.inf). */
interface Part {
	group: FileBytes[];
	source: string;
	kind: Kind;
	clockStartS?: number;
}

class HeaderFound extends Error {}

/**
 * The start time a CSV states in its head (preamble or first date/time cell), read slice by slice until
 * the header is known. Undefined when it states none.
 * @throws ImportError when the head cannot be read (the file fails as it would in the full read)
 */
async function csvStartS(f: FileBytes): Promise<number | undefined> {
	let header: SampleStreamHeader | undefined;
	const stream = new CsvSampleStream(f.name, csvOptionsWithSettings({}), {
		start: (h) => {
			header = h;
			throw new HeaderFound();
		},
		samples: () => undefined,
	});
	const total = sizeOf(f);
	try {
		for (let at = 0; at < Math.min(total, START_PROBE_MAX_BYTES) && !header; at += START_PROBE_BYTES)
			stream.push(await slice(f, at, Math.min(total, at + START_PROBE_BYTES)));
		if (!header && total <= START_PROBE_MAX_BYTES) stream.end();
	} catch (e) {
		if (!(e instanceof HeaderFound)) throw e;
	}
	return clockTimeOf(header?.startTime)?.unixS;
}

async function cfgOf(f: FileBytes): Promise<ComtradeConfig> {
	return parseComtradeCfg(decodeText(await bytesOf(f)).text, f.name);
}

/** What a record is and the start time it states; throws the reader's error when its head cannot be read. */
async function probe(group: FileBytes[]): Promise<Part> {
	const f = group[0];
	const source = groupLabel(group);
	const { kind } = detectFileKind(f.name, await slice(f, 0, Math.min(DETECT_HEAD_BYTES, sizeOf(f))));
	if (kind === 'csv' && group.length === 1) return { group, source, kind: 'csv', clockStartS: await csvStartS(f) };
	if (kind === 'comtrade-cfg') {
		const cfg = await cfgOf(f);
		const streamed = streamableRate(cfg) && group.some((g) => /\.dat$/i.test(g.name));
		return {
			group,
			source,
			kind: streamed ? 'comtrade' : 'whole',
			clockStartS: clockTimeOf(cfg.firstData?.iso)?.unixS,
		};
	}
	if (kind === 'comtrade-cff') {
		const head = await slice(f, 0, Math.min(sizeOf(f), CFF_HEAD_BYTES));
		const cfg = cffLayout(head, f.name, sizeOf(f)).cfg;
		return { group, source, kind: 'cff', clockStartS: clockTimeOf(cfg.firstData?.iso)?.unixS };
	}
	// WAV (no start time in its header), or anything lib/io refuses when it is opened
	return { group, source, kind: 'whole' };
}

/** What a record says about itself before its samples (a stream header or an opened capture). */
type PartHead = Pick<SampleStreamHeader, 'sampleRateHz' | 'channels' | 'startTime' | 'nominalFrequencyHz'>;

/** Begins `part` in the recording: lib/trend's bounds, then the recording's own checks, as ImportErrors. */
function beginPart(recording: RecordingAnalyser, source: string, h: PartHead): void {
	const limit = trendLimitProblem(h.sampleRateHz, h.channels.length);
	if (limit) throw new ImportError(source, 0, 0, 'out-of-range', limit.got, limit.expected);
	const nominal = h.nominalFrequencyHz === 50 || h.nominalFrequencyHz === 60 ? h.nominalFrequencyHz : undefined;
	try {
		recording.beginPart({
			source,
			sampleRateHz: h.sampleRateHz,
			channels: h.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
			clockStartS: clockTimeOf(h.startTime)?.unixS,
			nominalHz: nominal,
		});
	} catch (e) {
		if (e instanceof RecordingMismatch) throw new ImportError(source, 0, 0, 'not-same-recording', e.got, e.expected);
		throw e;
	}
}

type OnSamples = (n: number, bytes: number) => void;

/** The sink of a stream: begins the part once the header is known, then feeds each block. */
function partSink(
	recording: RecordingAnalyser,
	source: string,
	onSamples: OnSamples,
): SampleSink & { notes: Diagnostic[] } {
	const views: Float64Array[] = [];
	const sink = {
		notes: [] as Diagnostic[],
		start(h: SampleStreamHeader) {
			beginPart(recording, source, h);
			sink.notes = h.diagnostics;
		},
		samples(chunk: Float64Array[], n: number) {
			for (let c = 0; c < chunk.length; c++) views[c] = chunk[c].length === n ? chunk[c] : chunk[c].subarray(0, n);
			views.length = chunk.length;
			recording.push(views);
			onSamples(n, 0);
		},
	};
	return sink;
}

/** Pushes a picked file to `push` in READ_SLICE_BYTES slices (the page never holds it whole). */
async function streamSlices(f: FileBytes, push: (chunk: Uint8Array) => void, onSamples: OnSamples): Promise<void> {
	const total = sizeOf(f);
	for (let at = 0; at < total; at += READ_SLICE_BYTES) {
		const end = Math.min(total, at + READ_SLICE_BYTES);
		push(await slice(f, at, end));
		onSamples(0, end - at);
	}
}

/** One CSV streamed from the picked file into the recording; returns what the reader detected or assumed. */
async function feedCsv(p: Part, recording: RecordingAnalyser, onSamples: OnSamples): Promise<Diagnostic[]> {
	const f = p.group[0];
	const sink = partSink(recording, p.source, onSamples);
	const stream = new CsvSampleStream(f.name, csvOptionsWithSettings({}), sink, {
		totalBytes: sizeOf(f),
		maxChannels: TREND_MAX_CHANNELS,
	});
	await streamSlices(f, (c) => stream.push(c), onSamples);
	const late = stream.end();
	return [...sink.notes, ...late];
}

/** A COMTRADE .cfg with its .dat and one sampling rate: the .dat streamed slice by slice. */
async function feedComtrade(p: Part, recording: RecordingAnalyser, onSamples: OnSamples): Promise<Diagnostic[]> {
	const cfgFile = p.group[0];
	const dat = p.group.find((f) => /\.dat$/i.test(f.name))!;
	const cfg = await cfgOf(cfgFile);
	if (cfg.analog.length > TREND_MAX_CHANNELS) {
		const limit = trendLimitProblem(streamableRate(cfg)!.sampleRateHz, cfg.analog.length)!;
		throw new ImportError(cfgFile.name, 2, 0, 'out-of-range', limit.got, limit.expected);
	}
	const sink = partSink(recording, p.source, onSamples);
	const stream = new ComtradeSampleStream(cfg, cfgFile.name, dat.name, {}, sink);
	onSamples(0, sizeOf(cfgFile));
	await streamSlices(dat, (c) => stream.push(c), onSamples);
	const late = stream.end();
	return [...sink.notes, ...late];
}

/** A WAV, .cff or COMTRADE record that is not streamed: opened whole by lib/io, then fed in blocks. */
async function feedWhole(p: Part, recording: RecordingAnalyser, onSamples: OnSamples): Promise<Diagnostic[]> {
	const inputs = await Promise.all(p.group.map(async (f) => ({ name: f.name, bytes: await bytesOf(f) })));
	const capture = openCapture(inputs[0], inputs.slice(1));
	onSamples(
		0,
		p.group.reduce((s, f) => s + sizeOf(f), 0),
	);
	beginPart(recording, p.source, capture);
	const n = capture.channels[0]?.samples.length ?? 0;
	for (let off = 0; off < n; off += BLOCK_FRAMES) {
		const end = Math.min(n, off + BLOCK_FRAMES);
		recording.push(capture.channels.map((c) => c.samples.subarray(off, end)));
		onSamples(end - off, 0);
	}
	return capture.diagnostics;
}

/**
 * Import notes of several files: a warning once per (code, message), naming its file; any other note
 * (what was detected or assumed, the same in every file of a recording) once per code.
 */
function addNotes(all: Diagnostic[], seen: Set<string>, notes: Diagnostic[], source: string, several: boolean): void {
	for (const d of notes) {
		const key = d.severity === 'warning' ? `${d.code}\u0000${d.message}` : d.code;
		if (seen.has(key)) continue;
		seen.add(key);
		all.push(several && d.severity === 'warning' ? { ...d, message: `${source}: ${d.message}` } : d);
	}
}

/** The recording's name in merge messages: its file, or its first and last files. */
function recordingName(parts: Part[]): string {
	if (parts.length === 1) return parts[0].source;
	return `${parts[0].source} to ${parts[parts.length - 1].source} (${parts.length} files)`;
}

/** Why a record is not used, in words for its line in the file list (the problem list gives the details). */
function notUsed(p: ImportProblem): string {
	if (p.code === 'unreadable') return p.message;
	const at = p.line > 0 ? ` (line ${p.line}${p.column > 0 ? `, column ${p.column}` : ''})` : '';
	return `expected ${p.expected}${p.text ? `; it has ${p.text}` : ''}${at}`;
}

interface Read {
	problems: ImportProblem[];
	lines: SurveyFileLine[];
}

/** Probes every record (kind and start time), orders them; unreadable heads and unplaceable files become problems. */
async function orderedParts(
	files: FileBytes[],
	toProblem: (e: unknown, source: string) => ImportProblem,
	read: Read,
): Promise<{ parts: Part[]; placement: 'clock' | 'sequence'; notes: Diagnostic[] }> {
	const probed: Part[] = [];
	for (const group of groupFiles(files)) {
		try {
			probed.push(await probe(group));
		} catch (e) {
			const problem = toProblem(e, groupLabel(group));
			read.problems.push(problem);
			read.lines.push({ name: groupLabel(group), startS: null, durationS: 0, problem: notUsed(problem) });
		}
	}
	const order = orderRecordingParts(probed);
	for (const { part, expected } of order.refused) {
		const problem = toProblem(
			new ImportError(part.source, 0, 0, 'not-same-recording', 'no start time', expected),
			part.source,
		);
		read.problems.push(problem);
		read.lines.push({ name: part.source, startS: null, durationS: 0, problem: notUsed(problem) });
	}
	return { parts: order.ordered, placement: order.placement, notes: order.notes };
}

/**
 * Reads every record into one recording analyser, then merges and judges it.
 * @returns the survey (with the records that could not be read, or not placed, listed as problems), or
 *   only problems when no record could be read or the recording cannot be surveyed
 */
export async function runSurvey(
	files: FileBytes[],
	standard: SurveyStandardId,
	declaredV: number | undefined,
	onProgress: (p: SurveyProgress) => void,
	toProblem: (e: unknown, source: string) => ImportProblem,
): Promise<{ survey: SurveyView | null; problems: ImportProblem[] }> {
	const read: Read = { problems: [], lines: [] };
	const { parts, placement, notes } = await orderedParts(files, toProblem, read);
	const bytesTotal = parts.reduce((s, r) => s + r.group.reduce((t, f) => t + sizeOf(f), 0), 0);
	// records refused before reading (unreadable head, no start time) count as done
	const p: SurveyProgress = {
		filesDone: read.lines.length,
		files: parts.length + read.lines.length,
		file: '',
		samplesDone: 0,
		bytesDone: 0,
		bytesTotal,
	};
	let last = 0;
	const onSamples = (n: number, bytes: number) => {
		p.samplesDone += n;
		p.bytesDone += bytes;
		const now = performance.now();
		if (now - last > 150) {
			last = now;
			onProgress({ ...p });
		}
	};
	const recording = createRecordingAnalyser({
		placement,
		declaredV,
		harmonics: true,
		keep: { cycles10: false, cycles150: false, min10: true },
	});
	const importNotes: Diagnostic[] = [];
	const seen = new Set<string>();
	const failed = new Map<string, string>();
	for (const part of parts) {
		p.file = part.source;
		onProgress({ ...p });
		try {
			const feed = part.kind === 'csv' ? feedCsv : part.kind === 'comtrade' ? feedComtrade : feedWhole;
			addNotes(importNotes, seen, await feed(part, recording, onSamples), part.source, parts.length > 1);
		} catch (e) {
			const problem = toProblem(e, part.source);
			read.problems.push(problem);
			failed.set(part.source, notUsed(problem));
		}
		p.filesDone++;
		onProgress({ ...p });
	}
	if (!recording.started) return { survey: null, problems: read.problems };
	const result = recording.finish();
	result.diagnostics = [...notes, ...importNotes, ...result.diagnostics];
	const rate = result.sampleRateHz;
	const clock0 = result.clockStartS;
	const lines: SurveyFileLine[] = parts.map((part) => {
		const placed = result.parts.find((x) => x.source === part.source);
		const problem = failed.get(part.source);
		return {
			name: part.source,
			startS: placed && clock0 !== undefined ? clock0 + placed.startS : null,
			durationS: placed ? placed.samples / rate : 0,
			...(problem === undefined ? {} : { problem }),
		};
	});
	try {
		const { input, diagnostics } = surveyInputFromTrend([trendDocumentOf(recordingName(parts), result)], declaredV);
		const survey = assessSurvey(input, standard);
		const said = [...recordingNotesOf(result), ...diagnostics].map((d) => d.message);
		return {
			survey: { result: survey, input, notes: said, files: [...lines, ...read.lines], samples: p.samplesDone },
			problems: read.problems,
		};
	} catch (e) {
		if (e instanceof SurveyMergeError) {
			const problem = toProblem(e, e.source);
			problem.code = 'not-one-recording';
			problem.expected = `a recording that can be surveyed: it ${e.message.replace(/\.$/, '')}`;
			return { survey: null, problems: [...read.problems, problem] };
		}
		throw e;
	}
}
