/**
 * The worker's file reading: a single CSV is streamed from the picked file (Blob) in slices through
 * lib/io's CsvStreamReader, so the page never holds the file and the worker holds only one slice of its
 * text at a time; everything else goes through openCaptures on the whole bytes. Progress with the bytes
 * read and a time estimate from the rate so far.
 */
import type { Capture } from '../../lib/capture.js';
import {
	csvOptionsWithSettings,
	CsvStreamReader,
	detectFileKind,
	DETECT_HEAD_BYTES,
	openCaptures,
} from '../../lib/io/index.js';
import type { FileBytes, ImportOverrides, ImportProblem } from './protocol.js';

/** Slice read per step: large enough that per-slice overhead is small, small enough to keep memory bounded. */
export const READ_SLICE_BYTES = 4 << 20;

export type ReadProgress = (fraction: number, etaS: number | null) => void;

/** The bytes of a file (read whole: WAV, COMTRADE, or a CSV that is not streamed). */
export async function bytesOf(f: FileBytes): Promise<Uint8Array> {
	if (f.bytes) return new Uint8Array(f.bytes);
	return new Uint8Array(await f.blob!.arrayBuffer());
}

/** Seconds left at a steady rate, after at least 3 % done and 0.3 s spent (earlier guesses are noise). */
export function etaFrom(done: number, total: number, elapsedS: number): number | null {
	if (total <= 0 || done <= 0 || done / total < 0.03 || elapsedS < 0.3) return null;
	return (elapsedS * (total - done)) / done;
}

/** Whether lib/io reads this file as CSV (its format decided from the head bytes and the name, in one place). */
async function isCsv(f: FileBytes): Promise<boolean> {
	const head = f.bytes
		? new Uint8Array(f.bytes, 0, Math.min(DETECT_HEAD_BYTES, f.bytes.byteLength))
		: new Uint8Array(await f.blob!.slice(0, DETECT_HEAD_BYTES).arrayBuffer());
	return detectFileKind(f.name, head).kind === 'csv';
}

/** Streams one CSV through the reader from its blob or bytes, reporting progress per slice. */
async function streamCsv(f: FileBytes, overrides: ImportOverrides, progress: ReadProgress): Promise<Capture> {
	const total = f.blob ? f.blob.size : f.bytes!.byteLength;
	const reader = new CsvStreamReader(f.name, csvOptionsWithSettings(overrides), { totalBytes: total });
	const t0 = performance.now();
	let last = -1;
	for (let at = 0; at < total; at += READ_SLICE_BYTES) {
		const end = Math.min(total, at + READ_SLICE_BYTES);
		const chunk = f.blob
			? new Uint8Array(await f.blob.slice(at, end).arrayBuffer())
			: new Uint8Array(f.bytes!, at, end - at);
		reader.push(chunk);
		const fraction = end / total;
		if (fraction - last >= 0.01 || end === total) {
			last = fraction;
			progress(fraction, etaFrom(end, total, (performance.now() - t0) / 1000));
		}
	}
	return reader.finish();
}

/** Opens the files of one capture; failures become problems (the worker's "import-failed"). */
export async function readCaptures(
	files: FileBytes[],
	overrides: ImportOverrides,
	progress: ReadProgress,
	toProblem: (e: unknown) => ImportProblem,
): Promise<{ captures: Capture[]; problems: ImportProblem[] }> {
	const problems: ImportProblem[] = [];
	try {
		const only = files.length === 1 ? files[0] : undefined;
		if (only && (await isCsv(only))) {
			try {
				return { captures: [await streamCsv(only, overrides, progress)], problems };
			} catch (e) {
				return { captures: [], problems: [toProblem(e)] };
			}
		}
		const inputs = await Promise.all(files.map(async (f) => ({ name: f.name, bytes: await bytesOf(f) })));
		const result = openCaptures(inputs, overrides);
		progress(1, 0);
		for (const e of result.errors) problems.push(toProblem(e));
		return { captures: result.captures, problems };
	} catch (e) {
		return { captures: [], problems: [toProblem(e)] };
	}
}

/** Line `line` (1-based) of a file, read slice by slice (a Blob) and cut to 160 characters; undefined when shorter. */
export async function lineOfFile(f: FileBytes, line: number): Promise<string | undefined> {
	const total = f.blob ? f.blob.size : f.bytes!.byteLength;
	let seen = 1;
	let collected: number[] | null = line === 1 ? [] : null;
	for (let at = 0; at < total; at += READ_SLICE_BYTES) {
		const end = Math.min(total, at + READ_SLICE_BYTES);
		const view = f.blob
			? new Uint8Array(await f.blob.slice(at, end).arrayBuffer())
			: new Uint8Array(f.bytes!, at, end - at);
		for (let i = 0; i < view.length; i++) {
			const b = view[i];
			if (collected) {
				if (b === 10 || b === 13 || collected.length >= 640)
					return new TextDecoder('utf-8').decode(new Uint8Array(collected)).slice(0, 160);
				collected.push(b);
			} else if (b === 10 && ++seen === line) collected = [];
		}
	}
	return collected ? new TextDecoder('utf-8').decode(new Uint8Array(collected)).slice(0, 160) : undefined;
}
