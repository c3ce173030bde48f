/**
 * Does the .dat hold what its .cfg declares? An ASCII .dat is lines of comma-separated numbers; a
 * BINARY, BINARY32 or FLOAT32 .dat is fixed-size little-endian records whose first field, the sample
 * number (uint32), starts at 1, so its first bytes are 01 00 00 00. Read as the wrong type, either one
 * gives plausible-looking garbage, so a mismatch is refused before any record is read.
 * Ref: IEEE C37.111-1999/2013, data file formats (from memory).
 */
import { ImportError } from '../import-error.js';
import type { ComtradeConfig } from './cfg.js';

/** Bytes of the .dat looked at. */
export const DAT_TYPE_HEAD_BYTES = 4096;

/** Bytes of one binary record: sample number and time stamp (uint32 each), analog values, status words. */
export function binaryRecordBytes(cfg: Pick<ComtradeConfig, 'fileType' | 'analog' | 'digital'>): number {
	const valueBytes = cfg.fileType === 'BINARY' ? 2 : 4;
	return 8 + cfg.analog.length * valueBytes + 2 * Math.ceil(cfg.digital.length / 16);
}

/** True when the head is text: printable ASCII, tabs and line breaks only, with a comma and a line break. */
function looksLikeText(head: Uint8Array): boolean {
	let comma = false;
	let lineBreak = false;
	for (let i = 0; i < head.length; i++) {
		const b = head[i];
		if (b === 44) comma = true;
		else if (b === 10 || b === 13) lineBreak = true;
		else if (b !== 9 && (b < 32 || b > 126)) return false;
	}
	return comma && (lineBreak || head.length < DAT_TYPE_HEAD_BYTES);
}

/**
 * Refuses a .dat whose content contradicts the declared file type.
 * @param head  the first bytes of the .dat (up to 4 KiB are looked at)
 * @param byteOffset  where the data starts in a larger file (CFF), for the error position
 * @throws ImportError 'dat-type-mismatch' naming the .dat and the .cfg line of the declared type
 */
export function checkDatType(
	cfg: ComtradeConfig,
	head: Uint8Array,
	source: string,
	cfgSource: string,
	byteOffset = 0,
): void {
	const h = head.subarray(0, Math.min(head.length, DAT_TYPE_HEAD_BYTES));
	if (h.length === 0) return;
	const declared = `the .cfg declares ${cfg.fileType} (${cfgSource} line ${cfg.fileTypeLine})`;
	if (cfg.fileType === 'ASCII') {
		const nul = h.indexOf(0);
		if (nul >= 0) {
			throw new ImportError(
				source,
				0,
				byteOffset + nul + 1,
				'dat-type-mismatch',
				hex(h, nul),
				`lines of comma-separated numbers, as ${declared}; this data holds NUL bytes, so it is binary: check the file type in the .cfg`,
			);
		}
		return;
	}
	if (looksLikeText(h)) {
		const line = latin1Line(h);
		throw new ImportError(
			source,
			1,
			0,
			'dat-type-mismatch',
			line,
			`binary records of ${binaryRecordBytes(cfg)} bytes, as ${declared}; this data is text (lines of numbers and commas): check the file type in the .cfg (ASCII?)`,
		);
	}
}

function hex(b: Uint8Array, at: number): string {
	return Array.from(b.subarray(at, at + 8), (x) => x.toString(16).padStart(2, '0')).join(' ');
}

function latin1Line(b: Uint8Array): string {
	let e = 0;
	while (e < b.length && e < 80 && b[e] !== 10 && b[e] !== 13) e++;
	let s = '';
	for (let i = 0; i < e; i++) s += String.fromCharCode(b[i]);
	return s;
}
