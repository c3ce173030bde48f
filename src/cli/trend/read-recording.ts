/**
 * Feeds one recording file through a trend analyser, streaming where the format allows:
 * - WAV: the data chunk is read from disk in blocks (wav-stream.ts); memory does not grow with length;
 * - CSV/TXT/TSV: lib/io's CsvStreamReader reads the text in 1 MiB chunks (the text is never held whole,
 *   the sample columns are), then the capture goes through the analyser;
 * - COMTRADE (.cfg + .dat, .cff): read whole by lib/io (openCapture), then analysed.
 */
import { closeSync, openSync, readdirSync, readFileSync, readSync, statSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import type { Capture, Diagnostic } from '../../../lib/capture.js';
import { CsvStreamReader } from '../../../lib/io/csv/stream-reader.js';
import { ImportError } from '../../../lib/io/import-error.js';
import { openCapture, type InputFile, type OpenOptions } from '../../../lib/io/open.js';
import { createTrendAnalyser } from '../../../lib/trend/analyser.js';
import type { TrendChannelSpec, TrendOptions, TrendResult } from '../../../lib/trend/types.js';
import { isWavHead, openWavStream } from './wav-stream.js';

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

function analyseWhole(capture: Capture, settings: AnalyserSettings, hooks: AnalyseFileHooks): TrendResult {
	const onProgress = hooks.onProgress;
	const nominal = settings.nominalHz ?? (capture.nominalFrequencyHz === 50 || capture.nominalFrequencyHz === 60 ? capture.nominalFrequencyHz : undefined);
	const a = createTrendAnalyser({
		...settings,
		nominalHz: nominal,
		sampleRateHz: capture.sampleRateHz,
		channels: capture.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
	});
	hooks.onChannels?.(capture.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })));
	const n = capture.channels[0]?.samples.length ?? 0;
	for (let off = 0; off < n; off += BLOCK_FRAMES) {
		const end = Math.min(n, off + BLOCK_FRAMES);
		a.push(capture.channels.map((c) => c.samples.subarray(off, end)));
		onProgress?.(end / n);
	}
	return withImportNotes(a.finish(), capture.diagnostics, capture.timeS !== undefined, capture.sampleRateHz);
}

function withImportNotes(result: TrendResult, notes: Diagnostic[], explicitTime: boolean, rateHz: number): TrendResult {
	const extra: Diagnostic[] = explicitTime
		? [{ code: 'time-base-treated-uniform', severity: 'warning', message: `The file has an explicit time base; trends treat it as uniform at its mean rate ${rateHz} Hz.` }]
		: [];
	result.diagnostics = [...notes, ...extra, ...result.diagnostics];
	return result;
}

/** `name` with its file name replaced by `file`, keeping the folder part exactly as it was written. */
function besideName(name: string, file: string): string {
	return name.slice(0, name.length - basename(name).length) + file;
}

/**
 * Companion files of a COMTRADE .cfg: same base name, any case, in the same folder. Each is named as the
 * user would write it (the .cfg's `source` with the file name swapped), so errors about a .dat show its
 * path, not a bare file name.
 */
function companions(path: string, source: string): InputFile[] {
	const dir = dirname(path);
	const base = basename(path, extname(path)).toLowerCase();
	return readdirSync(dir)
		.filter((f) => f !== basename(path) && basename(f, extname(f)).toLowerCase() === base && ['.dat', '.hdr', '.inf'].includes(extname(f).toLowerCase()))
		.map((f) => ({ name: besideName(source, f), bytes: new Uint8Array(readFileSync(join(dir, f))) }));
}

/**
 * Analyses one file.
 * @param path  the file on disk
 * @param source  the name to show in messages and errors
 * @throws ImportError for anything the readers cannot take (file, line, column, what was expected)
 */
export function analyseFile(path: string, source: string, open: OpenOptions, settings: AnalyserSettings, hooks: AnalyseFileHooks = {}): TrendResult {
	const onProgress = hooks.onProgress;
	const size = statSync(path).size;
	const first = head(path, 64);
	const ext = extname(path).toLowerCase();
	if (isWavHead(first)) {
		const wav = openWavStream(path, source, open.wav, BLOCK_FRAMES);
		try {
			const h = wav.header;
			const specs = h.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit }));
			const a = createTrendAnalyser({ ...settings, sampleRateHz: wav.sampleRateHz, channels: specs });
			hooks.onChannels?.(specs);
			const bufs = h.channels.map(() => new Float64Array(BLOCK_FRAMES));
			let done = 0;
			for (;;) {
				const n = wav.read(bufs);
				if (n === 0) break;
				a.push(bufs.map((b) => b.subarray(0, n)));
				done += n;
				onProgress?.(done / Math.max(1, wav.frames));
			}
			return withImportNotes(a.finish(), h.diagnostics, false, wav.sampleRateHz);
		} finally {
			wav.close();
		}
	}
	if (ext === '.cfg' || ext === '.cff') {
		// named by `source` (the path as given), so errors and the report name the file as the user wrote it
		const file = { name: source, bytes: new Uint8Array(readFileSync(path)) };
		const capture = openCapture(file, ext === '.cfg' ? companions(path, source) : [], open);
		capture.source = source;
		return analyseWhole(capture, settings, hooks);
	}
	if (ext === '.dat' || ext === '.hdr' || ext === '.inf') {
		throw new ImportError(source, 0, 0, 'unsupported-format', ext, 'the .cfg file of a COMTRADE record (its .dat is found beside it)');
	}
	const reader = new CsvStreamReader(source, open.csv ?? {}, { totalBytes: size, onProgress: (d, t) => onProgress?.(t > 0 ? (0.5 * d) / t : 0) });
	const fd = openSync(path, 'r');
	try {
		const buf = Buffer.allocUnsafe(1 << 20);
		let pos = 0;
		for (;;) {
			const n = readSync(fd, buf, 0, buf.length, pos);
			if (n === 0) break;
			reader.push(buf.subarray(0, n));
			pos += n;
		}
	} finally {
		closeSync(fd);
	}
	const capture = reader.finish();
	return analyseWhole(capture, settings, { ...hooks, onProgress: onProgress ? (f) => onProgress(0.5 + 0.5 * f) : undefined });
}
