/**
 * One-call CSV import for text or bytes already in memory; the same path as the streaming reader.
 */
import type { Capture } from '../../capture.js';
import { CsvStreamReader } from './stream-reader.js';
import type { CsvOptions } from './types.js';

const CHUNK_BYTES = 1 << 20;

/**
 * Reads a CSV recording (any common layout: see detectCsvLayout) into a Capture in V and A.
 *
 * @param input       file contents, as text or bytes (UTF-8, Windows-1252 or UTF-16 with BOM)
 * @param source      file name for messages, or '<input>'
 * @param options     overrides for anything detected
 * @param onProgress  called per MiB with bytes done and total bytes
 * @throws ImportError with file, line, column, code, offending text and what was expected
 * @example parseCsv('t (ms);U1 (V)\n0;0\n0,1;3,25\n', 'a.csv').channels[0].samples // Float64Array [0, 3.25]
 */
export function parseCsv(
	input: string | Uint8Array,
	source = '<input>',
	options: CsvOptions = {},
	onProgress?: (bytesDone: number, bytesTotal: number) => void,
): Capture {
	const bytes = typeof input === 'string' ? new TextEncoder().encode(input) : input;
	const reader = new CsvStreamReader(source, options, { totalBytes: bytes.length, onProgress });
	for (let i = 0; i < bytes.length; i += CHUNK_BYTES)
		reader.push(bytes.subarray(i, Math.min(bytes.length, i + CHUNK_BYTES)));
	return reader.finish();
}
