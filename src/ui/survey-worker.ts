/**
 * The worker's supply survey: many picked files of one recording, each run through lib/trend's streaming
 * analyser (a CSV read slice by slice from the picked file; WAV and COMTRADE opened whole by lib/io and fed
 * in blocks), in the order of their start times, then lib/survey's merge and assessment. Progress counts
 * files and samples. Nothing here computes a statistic: the figures come from lib.
 */
import type { Diagnostic } from '../../lib/capture.js';
import {
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
	SurveyMergeError,
	surveyInputFromTrend,
	trendDocumentOf,
	type TrendDocument,
} from '../../lib/survey/index.js';
import type { SurveyStandardId } from '../../lib/survey/types.js';
import { clockTimeOf, createTrendAnalyser, TREND_MAX_CHANNELS, trendLimitProblem } from '../../lib/trend/index.js';
import type { TrendAnalyser } from '../../lib/trend/index.js';
import type { TrendChannelSpec, TrendOptions } from '../../lib/trend/types.js';
import { groupFiles, groupLabel } from './files.js';
import type { FileBytes, ImportProblem, SurveyFileLine, SurveyView } from './protocol.js';
import { bytesOf, READ_SLICE_BYTES } from './worker-open.js';

/** Bytes of a CSV read to find its start time before the survey orders the files. */
const START_PROBE_BYTES = 256 * 1024;
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

type Settings = Pick<TrendOptions, 'declaredV'>;

const sizeOf = (f: FileBytes): number => (f.blob ? f.blob.size : (f.bytes?.byteLength ?? 0));

async function slice(f: FileBytes, from: number, to: number): Promise<Uint8Array> {
	return f.blob
		? new Uint8Array(await f.blob.slice(from, to).arrayBuffer())
		: new Uint8Array(f.bytes!, from, to - from);
}

async function isCsv(f: FileBytes): Promise<boolean> {
	return detectFileKind(f.name, await slice(f, 0, Math.min(DETECT_HEAD_BYTES, sizeOf(f)))).kind === 'csv';
}

/** The start time a CSV states in its head (preamble or first date/time cell), as Unix seconds; undefined when none. */
async function csvStartS(f: FileBytes): Promise<number | undefined> {
	let header: SampleStreamHeader | undefined;
	const stop = new Error('header read');
	const stream = new CsvSampleStream(f.name, csvOptionsWithSettings({}), {
		start: (h) => {
			header = h;
			throw stop;
		},
		samples: () => undefined,
	});
	try {
		stream.push(await slice(f, 0, Math.min(START_PROBE_BYTES, sizeOf(f))));
		if (!header) stream.end();
	} catch {
		// the header was read (or the head cannot be read: the full read reports that with its place)
	}
	return clockTimeOf(header?.startTime)?.unixS;
}

function analyser(
	settings: Settings,
	rateHz: number,
	specs: TrendChannelSpec[],
	nominal: number | undefined,
	startTime: string | undefined,
): TrendAnalyser {
	return createTrendAnalyser({
		...settings,
		sampleRateHz: rateHz,
		channels: specs,
		nominalHz: nominal === 50 || nominal === 60 ? nominal : undefined,
		clockStartS: clockTimeOf(startTime)?.unixS,
		harmonics: true,
		keep: { cycles10: false, cycles150: false, min10: true },
	});
}

/** Refuses a rate or channel count lib/trend cannot take, before any sample (the message says which bound). */
function checkLimits(source: string, rateHz: number, channels: number): void {
	const limit = trendLimitProblem(rateHz, channels);
	if (limit) throw new ImportError(source, 0, 0, 'out-of-range', limit.got, limit.expected);
}

type OnSamples = (n: number, bytes: number) => void;

/** The sink that makes the analyser once a stream's header is known (bounds checked first) and feeds it. */
function trendSink(
	source: string,
	settings: Settings,
	onSamples: OnSamples,
): SampleSink & { finish(late: Diagnostic[]): TrendDocument } {
	let a: TrendAnalyser | undefined;
	let header: SampleStreamHeader | undefined;
	const views: Float64Array[] = [];
	return {
		start(h) {
			checkLimits(source, h.sampleRateHz, h.channels.length);
			header = h;
			const specs = h.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit }));
			a = analyser(settings, h.sampleRateHz, specs, h.nominalFrequencyHz, h.startTime);
		},
		samples(chunk, n) {
			for (let c = 0; c < chunk.length; c++) views[c] = chunk[c].length === n ? chunk[c] : chunk[c].subarray(0, n);
			views.length = chunk.length;
			a!.push(views);
			onSamples(n, 0);
		},
		finish(late) {
			const result = a!.finish();
			result.diagnostics = [...(header?.diagnostics ?? []), ...late, ...result.diagnostics];
			return trendDocumentOf(source, result);
		},
	};
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

/** One CSV streamed from the picked file into a trend analyser, slice by slice. */
async function csvDocument(f: FileBytes, settings: Settings, onSamples: OnSamples): Promise<TrendDocument> {
	const sink = trendSink(f.name, settings, onSamples);
	const stream = new CsvSampleStream(f.name, csvOptionsWithSettings({}), sink, {
		totalBytes: sizeOf(f),
		maxChannels: TREND_MAX_CHANNELS,
	});
	await streamSlices(f, (c) => stream.push(c), onSamples);
	return sink.finish(stream.end());
}

/** The configuration of a COMTRADE .cfg (read whole: a few lines per channel). */
async function cfgOf(f: FileBytes): Promise<ComtradeConfig> {
	return parseComtradeCfg(decodeText(await bytesOf(f)).text, f.name);
}

/**
 * A COMTRADE .cfg with its .dat and one sampling rate: the .dat streamed slice by slice. Undefined when the
 * record has several rates or time stamps only (then it is read whole).
 */
async function comtradeDocument(
	group: FileBytes[],
	settings: Settings,
	onSamples: OnSamples,
): Promise<TrendDocument | undefined> {
	const cfgFile = group[0];
	const dat = group.find((f) => /\.dat$/i.test(f.name));
	if (!/\.cfg$/i.test(cfgFile.name) || !dat) return undefined;
	const cfg = await cfgOf(cfgFile);
	if (!streamableRate(cfg)) return undefined;
	if (cfg.analog.length > TREND_MAX_CHANNELS)
		checkLimits(cfgFile.name, streamableRate(cfg)!.sampleRateHz, cfg.analog.length);
	const sink = trendSink(cfgFile.name, settings, onSamples);
	const stream = new ComtradeSampleStream(cfg, cfgFile.name, dat.name, {}, sink);
	onSamples(0, sizeOf(cfgFile));
	await streamSlices(dat, (c) => stream.push(c), onSamples);
	return sink.finish(stream.end());
}

/** A WAV, or a COMTRADE record that cannot be streamed, opened whole by lib/io, then fed to the analyser in blocks. */
async function wholeDocument(
	group: FileBytes[],
	settings: Settings,
	onSamples: (n: number, bytes: number) => void,
): Promise<TrendDocument> {
	const inputs = await Promise.all(group.map(async (f) => ({ name: f.name, bytes: await bytesOf(f) })));
	const capture = openCapture(inputs[0], inputs.slice(1));
	onSamples(
		0,
		group.reduce((s, f) => s + sizeOf(f), 0),
	);
	checkLimits(inputs[0].name, capture.sampleRateHz, capture.channels.length);
	const specs = capture.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit }));
	const a = analyser(settings, capture.sampleRateHz, specs, capture.nominalFrequencyHz, capture.startTime);
	const n = capture.channels[0]?.samples.length ?? 0;
	for (let off = 0; off < n; off += BLOCK_FRAMES) {
		const end = Math.min(n, off + BLOCK_FRAMES);
		a.push(capture.channels.map((c) => c.samples.subarray(off, end)));
		onSamples(end - off, 0);
	}
	const result = a.finish();
	result.diagnostics = [...capture.diagnostics, ...result.diagnostics];
	return trendDocumentOf(inputs[0].name, result);
}

/** The picked files as records (a .cfg with its .dat is one), ordered by the start time each states, then by name. */
async function ordered(files: FileBytes[]): Promise<{ group: FileBytes[]; name: string; startS?: number }[]> {
	const groups = groupFiles(files).map((group) => ({
		group,
		name: groupLabel(group),
		startS: undefined as number | undefined,
	}));
	for (const g of groups) {
		if (g.group.length === 1 && (await isCsv(g.group[0]))) g.startS = await csvStartS(g.group[0]);
		else if (/\.cfg$/i.test(g.group[0].name)) {
			try {
				g.startS = clockTimeOf((await cfgOf(g.group[0])).firstData?.iso)?.unixS;
			} catch {
				// an unreadable .cfg is reported, with its place, when the record is read
			}
		}
	}
	const key = (s: number | undefined) => (s === undefined ? Infinity : s);
	return groups.sort((a, b) => key(a.startS) - key(b.startS) || a.name.localeCompare(b.name, 'en', { numeric: true }));
}

/**
 * Reads and analyses every record, then merges and judges them.
 * @returns the survey (with the records that could not be read listed as problems), or only problems
 *   when no record could be read or the records do not form one recording
 */
export async function runSurvey(
	files: FileBytes[],
	standard: SurveyStandardId,
	declaredV: number | undefined,
	onProgress: (p: SurveyProgress) => void,
	toProblem: (e: unknown, source: string) => ImportProblem,
): Promise<{ survey: SurveyView | null; problems: ImportProblem[] }> {
	const records = await ordered(files);
	const bytesTotal = files.reduce((s, f) => s + sizeOf(f), 0);
	const problems: ImportProblem[] = [];
	const docs: TrendDocument[] = [];
	const lines: SurveyFileLine[] = [];
	const p: SurveyProgress = { filesDone: 0, files: records.length, file: '', samplesDone: 0, bytesDone: 0, bytesTotal };
	let last = 0;
	for (const r of records) {
		p.file = r.name;
		onProgress({ ...p });
		const onSamples = (n: number, bytes: number) => {
			p.samplesDone += n;
			p.bytesDone += bytes;
			const now = performance.now();
			if (now - last > 150) {
				last = now;
				onProgress({ ...p });
			}
		};
		try {
			const one = r.group.length === 1 && (await isCsv(r.group[0]));
			const doc = one
				? await csvDocument(r.group[0], { declaredV }, onSamples)
				: ((await comtradeDocument(r.group, { declaredV }, onSamples)) ??
					(await wholeDocument(r.group, { declaredV }, onSamples)));
			docs.push(doc);
			lines.push({ name: r.name, startS: doc.clockStartS ?? null, durationS: doc.durationS });
		} catch (e) {
			problems.push(toProblem(e, r.name));
			lines.push({ name: r.name, startS: null, durationS: 0, problem: problems[problems.length - 1].message });
		}
		p.filesDone++;
		onProgress({ ...p });
	}
	if (docs.length === 0) return { survey: null, problems };
	try {
		const { input, diagnostics } = surveyInputFromTrend(docs, declaredV);
		const result = assessSurvey(input, standard);
		const notes: Diagnostic[] = [...diagnostics];
		return {
			survey: { result, input, notes: notes.map((d) => d.message), files: lines, samples: p.samplesDone },
			problems,
		};
	} catch (e) {
		if (e instanceof SurveyMergeError) {
			const p = toProblem(e, e.source);
			p.code = 'not-one-recording';
			p.expected = `a file of the same recording as the others: it ${e.message.replace(/\.$/, '')}`;
			return { survey: null, problems: [...problems, p] };
		}
		throw e;
	}
}
