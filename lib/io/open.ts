/**
 * Format dispatch: file names and bytes -> captures, the one entry point the CLI and the UI share.
 * Picks the reader by content first (a RIFF WAVE header, a CFF section line), then by extension:
 * .csv/.txt/.tsv CSV, .wav WAV, .cfg with the .dat of the same base name (case-insensitive) COMTRADE,
 * .cff single-file COMTRADE. Platform-free: takes bytes, never paths.
 */
import type { Capture } from '../capture.js';
import { type ComtradeOptions, parseComtrade } from './comtrade/parse.js';
import { parseComtradeCff } from './comtrade/cff.js';
import { decodeText } from './comtrade/text.js';
import { type CsvOptions, CsvStreamReader, parseCsv } from './csv/index.js';
import { ImportError, isImportError } from './import-error.js';
import { applyImportSettings, hasImportSettings, type ImportSettings } from './import-settings.js';
import { parseWav, type WavOptions } from './wav.js';

/** A file handed to the importers: its name (with extension; a path is fine) and its bytes. */
export interface InputFile {
	name: string;
	bytes: Uint8Array;
}

/** Per-format options, passed on to the reader that takes the file. */
export interface OpenOptions {
	csv?: CsvOptions;
	wav?: WavOptions;
	comtrade?: ComtradeOptions;
	/** Rate and per-channel scale, unit, quantity and measuring chain, applied to every format (import-settings.ts). */
	settings?: ImportSettings;
	/** Called while a CSV file is read, with bytes done and the total (the UI's progress bar). */
	onProgress?: (bytesDone: number, bytesTotal: number) => void;
}

/**
 * What a file is, as the readers see it: 'comtrade-part' is a .dat/.hdr/.inf (read with its .cfg),
 * 'binary' a file no reader takes.
 */
export type FileKind = 'csv' | 'wav' | 'comtrade-cfg' | 'comtrade-cff' | 'comtrade-part' | 'binary';

/** Bytes of a file's head that detectFileKind looks at (a WAV header, a CFF section line, NUL bytes). */
export const DETECT_HEAD_BYTES = 4096;

const COMTRADE_COMPANIONS = ['dat', 'hdr', 'inf'];

function splitName(name: string): { base: string; ext: string } {
	const slash = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'));
	const dot = name.lastIndexOf('.');
	if (dot <= slash + 1) return { base: name.toLowerCase(), ext: '' };
	return { base: name.slice(0, dot).toLowerCase(), ext: name.slice(dot + 1).toLowerCase() };
}

const startsWithAscii = (b: Uint8Array, text: string, at = 0) => {
	if (b.length < at + text.length) return false;
	for (let i = 0; i < text.length; i++) if (b[at + i] !== text.charCodeAt(i)) return false;
	return true;
};

function isWav(b: Uint8Array): boolean {
	return (startsWithAscii(b, 'RIFF') || startsWithAscii(b, 'RIFX')) && startsWithAscii(b, 'WAVE', 8);
}

function isCff(b: Uint8Array): boolean {
	const at = startsWithAscii(b, '\xEF\xBB\xBF') ? 3 : 0;
	return /^---\s*file type:\s*cfg/i.test(new TextDecoder('latin1').decode(b.subarray(at, at + 40)));
}

function looksBinary(b: Uint8Array): boolean {
	const n = Math.min(b.length, 4096);
	for (let i = 0; i < n; i++) if (b[i] === 0) return true;
	return false;
}

/**
 * The reader a file calls for: by content first (a RIFF WAVE header, a CFF section line), then by
 * extension; text with no telling extension is a table (`byName` false then, to be reported).
 * The one place Sinecheck decides a file's format; `head` needs only the first DETECT_HEAD_BYTES bytes.
 * @example detectFileKind('scope.csv', wavBytes).kind // 'wav'
 */
export function detectFileKind(name: string, head: Uint8Array): { kind: FileKind; byName: boolean } {
	const { ext } = splitName(name);
	if (isWav(head)) return { kind: 'wav', byName: ext === 'wav' };
	if (ext === 'wav') return { kind: 'wav', byName: true }; // not RIFF: the reader says why
	if (ext === 'cff' || isCff(head)) return { kind: 'comtrade-cff', byName: ext === 'cff' };
	if (ext === 'cfg') return { kind: 'comtrade-cfg', byName: true };
	if (COMTRADE_COMPANIONS.includes(ext)) return { kind: 'comtrade-part', byName: true };
	if (ext === 'csv' || ext === 'txt' || ext === 'tsv') return { kind: 'csv', byName: true };
	if (looksBinary(head)) return { kind: 'binary', byName: false };
	return { kind: 'csv', byName: false };
}

/** CSV options with the import settings merged in (the CSV reader applies them while it reads). */
export function csvOptionsWithSettings(options: OpenOptions): CsvOptions {
	const s = options.settings;
	if (!hasImportSettings(s)) return options.csv ?? {};
	const channels = { ...options.csv?.channels };
	for (const [name, cs] of Object.entries(s?.channels ?? {})) channels[name] = { ...channels[name], ...cs };
	return {
		...options.csv,
		...(s?.sampleRateHz !== undefined ? { sampleRateHz: s.sampleRateHz } : {}),
		...(Object.keys(channels).length ? { channels } : {}),
	};
}

/** A capture whose format came from its content against what its name says: reported. */
function byContent(capture: Capture, byName: boolean, what: string): Capture {
	if (!byName)
		capture.diagnostics.unshift({
			code: 'format-from-content',
			severity: 'info',
			message: `${capture.source} was read as ${what} from its content, whatever its name says.`,
		});
	return capture;
}

/** Read one file with the reader its content and name call for; the import settings applied to every format. */
function readOne(file: InputFile, companions: InputFile[], options: OpenOptions): Capture {
	const capture = readByKind(file, companions, options);
	return options.settings ? applyImportSettings(capture, options.settings) : capture;
}

function readByKind(file: InputFile, companions: InputFile[], options: OpenOptions): Capture {
	const { base, ext } = splitName(file.name);
	if (file.bytes.length === 0) throw new ImportError(file.name, 0, 0, 'empty-file', '', 'a file with data in it');
	const { kind, byName } = detectFileKind(file.name, file.bytes.subarray(0, DETECT_HEAD_BYTES));
	if (kind === 'wav')
		return byContent(
			{ ...parseWav(file.bytes, file.name, options.wav), format: 'wav' },
			byName || ext === 'wav',
			'a WAV file',
		);
	if (kind === 'comtrade-cff')
		return byContent(
			{ ...parseComtradeCff(file.bytes, file.name, options.comtrade), format: 'comtrade' },
			byName,
			'a single-file COMTRADE record (.cff)',
		);
	const sibling = (wanted: string) =>
		companions.find((c) => c !== file && splitName(c.name).base === base && splitName(c.name).ext === wanted);
	if (kind === 'comtrade-cfg') {
		const dat = sibling('dat');
		if (!dat)
			throw new ImportError(
				file.name,
				0,
				0,
				'missing-companion-file',
				'',
				`the data file ${file.name.replace(/\.cfg$/i, '.dat')} next to this .cfg (give both files)`,
			);
		const { text, encoding } = decodeText(file.bytes);
		const capture = parseComtrade(text, dat.bytes, file.name, { ...options.comtrade, datSource: dat.name });
		if (encoding === 'latin1')
			capture.diagnostics.push({
				code: 'comtrade-latin1',
				severity: 'assumption',
				message: `${file.name} is not valid UTF-8; read as Latin-1 (Windows-1252), as older recorders write.`,
			});
		for (const kind of ['hdr', 'inf']) {
			const f = sibling(kind);
			if (f) capture.metadata[`comtrade.${kind}`] = decodeText(f.bytes).text.trim();
		}
		return { ...capture, format: 'comtrade' };
	}
	if (kind === 'comtrade-part') {
		throw new ImportError(
			file.name,
			0,
			0,
			'missing-companion-file',
			'',
			`the configuration file ${file.name.replace(/\.[^.]+$/, '.cfg')} that describes this COMTRADE .${ext} file`,
		);
	}
	if (kind === 'binary') {
		throw new ImportError(
			file.name,
			0,
			0,
			'unsupported-format',
			ext ? `.${ext}` : '',
			'a .csv/.txt/.tsv table, a .wav file, a COMTRADE .cfg with its .dat, or a .cff file',
		);
	}
	return csvCapture(parseCsv(file.bytes, file.name, csvOptionsWithSettings(options), options.onProgress), byName);
}

/** A capture the CSV reader made, marked as such (and said to be read by content when the name does not tell). */
function csvCapture(read: Capture, byName: boolean): Capture {
	const capture: Capture = { ...read, format: 'csv' };
	if (byName) return capture;
	capture.diagnostics.unshift({
		code: 'format-from-content',
		severity: 'assumption',
		message: `The name ${capture.source} does not say the format; the text was read as a delimited table.`,
	});
	return capture;
}

/**
 * Opens one CSV file fed in chunks, so the file is never held whole (a 300 MB file read whole costs its
 * size in fresh memory): the very capture openCapture gives for the same bytes. Call it when
 * detectFileKind(name, head).kind is 'csv'.
 *
 * @param feed  pushes the file's bytes in order; a chunk may be one reused buffer (nothing keeps it)
 * @throws ImportError for anything the reader refuses; an error thrown by `feed` itself passes through
 * @example openCsvChunks('scope.csv', size, (push) => { for (const c of chunks) push(c); }, {}, true)
 */
export function openCsvChunks(
	name: string,
	totalBytes: number,
	feed: (push: (chunk: Uint8Array) => void) => void,
	options: OpenOptions = {},
	byName = true,
): Capture {
	if (totalBytes === 0) throw new ImportError(name, 0, 0, 'empty-file', '', 'a file with data in it');
	const reader = new CsvStreamReader(name, csvOptionsWithSettings(options), {
		totalBytes,
		onProgress: options.onProgress,
	});
	const push = (chunk: Uint8Array) => {
		try {
			reader.push(chunk);
		} catch (e) {
			throw wrap(name, e);
		}
	};
	feed(push);
	try {
		const capture = csvCapture(reader.finish(), byName);
		return options.settings ? applyImportSettings(capture, options.settings) : capture;
	} catch (e) {
		throw wrap(name, e);
	}
}

function wrap(name: string, e: unknown): ImportError {
	if (isImportError(e)) return e;
	// A reader failing any other way is a bug; the user still gets a typed error for that one file.
	return new ImportError(
		name,
		0,
		0,
		'internal-error',
		e instanceof Error ? e.message : String(e),
		'a file the reader could handle (this is a fault in Sinecheck; please report it)',
	);
}

/**
 * Open every capture in a set of files. A .cfg takes the .dat (and .hdr/.inf) of the same base name,
 * case-insensitively; every other file stands alone. One bad file never stops the others: its error is
 * returned in `errors`, in input order.
 * @example openCaptures([{ name: 'a.cfg', bytes: cfg }, { name: 'A.DAT', bytes: dat }]).captures.length // 1
 */
export function openCaptures(
	files: InputFile[],
	options: OpenOptions = {},
): { captures: Capture[]; errors: ImportError[] } {
	const captures: Capture[] = [];
	const errors: ImportError[] = [];
	const cfgBases = new Set(files.filter((f) => splitName(f.name).ext === 'cfg').map((f) => splitName(f.name).base));
	for (const file of files) {
		const { base, ext } = splitName(file.name);
		if (COMTRADE_COMPANIONS.includes(ext) && cfgBases.has(base)) continue; // read with its .cfg
		try {
			captures.push(readOne(file, files, options));
		} catch (e) {
			errors.push(wrap(file.name, e));
		}
	}
	return { captures, errors };
}

/**
 * Open one capture; `companions` supplies the .dat (and .hdr/.inf) of a .cfg.
 * @throws ImportError for anything that cannot be read (including 'missing-companion-file')
 */
export function openCapture(file: InputFile, companions: InputFile[] = [], options: OpenOptions = {}): Capture {
	try {
		return readOne(file, [file, ...companions], options);
	} catch (e) {
		throw wrap(file.name, e);
	}
}
