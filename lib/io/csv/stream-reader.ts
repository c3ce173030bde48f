/**
 * Streaming CSV reader: feed the file in chunks (a CLI read stream, a browser File sliced), get a
 * Capture at the end. Layout detection runs on the first 64 KiB; after that the bytes go straight to the
 * row scanner, so the text of the file is never held whole.
 */
import type { Capture, Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { assembleCapture } from './assemble.js';
import { detectCsvLayout } from './detect.js';
import { RowScanner } from './scan-rows.js';
import { gapDiagnostic, scanWithGaps, type GapContext } from './gap-cells.js';
import type { CsvLayout, CsvOptions, CsvRowSummary, CsvStreamOptions } from './types.js';

const HEAD_BYTES = 64 * 1024;
const HEAD_MAX_BYTES = 4 * 1024 * 1024;

/**
 * Reads a CSV recording pushed in chunks. Feeding it from one reused buffer is cheapest (a fresh buffer per
 * chunk costs a first touch of its memory); errors surface from push() or finish().
 *
 * @example
 * const reader = new CsvStreamReader('feeder.csv', {}, { totalBytes: file.size, onProgress });
 * for await (const chunk of stream) reader.push(chunk);
 * const capture = reader.finish();
 */
export class CsvStreamReader {
	private head = new Uint8Array(HEAD_BYTES);
	private headLen = 0;
	private detectAt = HEAD_BYTES;
	private scanner: RowScanner | null = null;
	private carry = new Uint8Array(4096);
	private carryLen = 0;
	private eol = 10;
	private bytesDone = 0;
	private transcode: InstanceType<typeof TextDecoder> | null = null;
	private readonly notes: Diagnostic[] = [];
	private detected: CsvLayout | null = null;
	private finished = false;
	private rowsDone = 0;
	private gapCtx: GapContext | null = null;

	constructor(
		readonly source: string,
		private readonly options: CsvOptions = {},
		private readonly stream: CsvStreamOptions = {},
	) {}

	/** The layout detected from the head, once enough bytes have arrived (null before). */
	get layout(): CsvLayout | null {
		return this.detected;
	}

	/**
	 * Takes the next chunk. The chunk may be reused by the caller afterwards (nothing keeps a reference).
	 * @throws ImportError as soon as a bad row arrives (the reader is then unusable)
	 */
	push(chunk: Uint8Array): void {
		if (this.finished) throw new Error('CsvStreamReader: push() after finish()');
		this.bytesDone += chunk.length;
		// a plain Uint8Array view of a Node Buffer (a subclass): the scanner then sees one array type only,
		// which keeps its element loads monomorphic
		let bytes =
			Object.getPrototypeOf(chunk) === Uint8Array.prototype
				? chunk
				: new Uint8Array(chunk.buffer, chunk.byteOffset, chunk.byteLength);
		if (this.transcode) bytes = new TextEncoder().encode(this.transcode.decode(chunk, { stream: true }));
		if (this.scanner) this.feed(bytes);
		else {
			this.appendHead(bytes);
			if (this.headLen >= this.detectAt) this.tryStart();
		}
		this.stream.onProgress?.(this.bytesDone, this.stream.totalBytes ?? 0);
	}

	/** Ends the input and returns the capture; throws ImportError for anything it cannot read. */
	finish(): Capture {
		if (this.stream.onRows) throw new Error('CsvStreamReader: row mode ends with end(), not finish()');
		this.endInput();
		const g = this.gapCtx;
		if (g && g.count > 0)
			this.notes.push(gapDiagnostic(g, (k) => this.detected!.columns[k]?.name ?? `column ${k + 1}`));
		const capture = assembleCapture(this.detected!, this.scanner!, this.source, this.options, this.notes);
		if (g && g.count > 0) {
			const channelColumns = this.detected!.columns.filter((c) => c.role === 'channel').map((c) => c.index);
			capture.gaps = g.gaps.map((x) => ({
				channel: capture.channels[channelColumns.indexOf(x.tableColumn)]?.name ?? `column ${x.tableColumn + 1}`,
				sampleIndex: x.row,
				line: x.line,
				column: x.column,
				text: x.text,
			}));
		}
		return capture;
	}

	/** Row mode: ends the input (the last rows go to onRows) and says what was read. */
	end(): CsvRowSummary {
		if (!this.stream.onRows) throw new Error('CsvStreamReader: end() is for row mode (onRows)');
		this.endInput();
		const s = this.scanner!;
		if (this.rowsDone === 0)
			throw new ImportError(this.source, this.detected!.bodyLine, 0, 'no-data', '', 'at least one row of numbers');
		return {
			layout: this.detected!,
			rows: this.rowsDone,
			blankLines: s.blankLines,
			firstBlankLine: s.firstBlankLine,
			nonFinite: s.nonFinite,
			firstNonFiniteLine: s.firstNonFiniteLine,
			repeatedTimes: s.repeatedTimes,
			firstRepeatLine: s.firstRepeatLine,
			diagnostics: this.notes,
		};
	}

	private endInput(): void {
		if (this.finished) throw new Error('CsvStreamReader: finish() called twice');
		this.finished = true;
		if (!this.scanner) this.start(true);
		if (this.transcode) this.feed(new TextEncoder().encode(this.transcode.decode()));
		if (this.carryLen > 0) {
			this.appendCarry(new Uint8Array([this.eol]));
			this.scan(this.carry, 0, this.carryLen);
			this.carryLen = 0;
		}
	}

	/** Scans whole lines; in row mode hands the rows over and reuses the buffers. */
	private scan(buf: Uint8Array, start: number, end: number): void {
		const s = this.scanner!;
		// with `unreadableCells: 'gap'` through the gap reader (gap-cells.ts)
		if (this.gapCtx) scanWithGaps(s, buf, start, end, this.gapCtx);
		else s.scan(buf, start, end);
		const onRows = this.stream.onRows;
		if (onRows && s.rows > 0) {
			const rows = s.rows;
			this.rowsDone += rows;
			s.rows = 0;
			onRows(s.columns, rows);
		}
	}

	private tryStart(): void {
		this.checkWidth();
		try {
			this.start(false);
		} catch (e) {
			if (e instanceof ImportError && e.code === 'no-data' && this.headLen < HEAD_MAX_BYTES)
				this.detectAt = this.headLen * 2;
			else throw e;
		}
	}

	/**
	 * A data row of K cells holds at least K − 1 delimiters, and each cell at most one decimal comma, so a
	 * line with more than `maxColumns` of one of , ; tab has more than maxColumns cells (a quoted header
	 * cell full of commas aside).
	 */
	private checkWidth(): void {
		const max = this.stream.maxColumns;
		if (max === undefined) return;
		const h = this.head;
		let line = 1;
		let comma = 0;
		let semi = 0;
		let tab = 0;
		for (let i = 0; i < this.headLen && line <= 64; i++) {
			const b = h[i];
			if (b === 44) comma++;
			else if (b === 59) semi++;
			else if (b === 9) tab++;
			else if (b === 10) {
				line++;
				comma = semi = tab = 0;
				continue;
			}
			if (comma > max || semi > max || tab > max)
				throw new ImportError(
					this.source,
					line,
					0,
					'out-of-range',
					`more than ${max} fields`,
					`at most ${max} columns in one recording (split the file into parts of fewer columns)`,
				);
		}
	}

	private start(wholeFile: boolean): void {
		if (wholeFile) this.checkWidth();
		let head = this.head.subarray(0, this.headLen);
		if (head.length === 0)
			throw new ImportError(this.source, 1, 0, 'empty-file', '', 'rows of numbers (the file is empty)');
		if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) {
			this.transcode = new TextDecoder(head[0] === 0xff ? 'utf-16le' : 'utf-16be');
			head = new TextEncoder().encode(this.transcode.decode(head, { stream: !wholeFile }));
			this.notes.push({ code: 'utf16', severity: 'info', message: 'The file is UTF-16 text; it was read as such.' });
			this.head = head;
			this.headLen = head.length;
		}
		checkNotBinary(head, this.source);
		const bom = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf;
		let textEnd = head.length;
		if (!wholeFile) {
			const lastLf = Math.max(head.lastIndexOf(10), head.lastIndexOf(13));
			if (lastLf > 0) textEnd = lastLf + 1;
		}
		let text: string;
		let encoding = 'utf-8';
		try {
			text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(head.subarray(0, textEnd));
		} catch {
			encoding = 'windows-1252';
			text = new TextDecoder(encoding).decode(head.subarray(0, textEnd));
			this.notes.push({
				code: 'encoding',
				severity: 'assumption',
				message: 'The file is not valid UTF-8; its text was read as Windows-1252 (Latin-1).',
			});
		}
		const layout = detectCsvLayout(text, this.options, wholeFile, this.source);
		this.detected = layout;
		this.eol = layout.lineBreak === '\r' ? 13 : 10;
		this.stream.onLayout?.(layout);
		const total = this.stream.totalBytes;
		// row mode: buffers for one chunk's rows (they grow to the most rows one chunk holds)
		const capacityRows = this.stream.onRows
			? 1024
			: total && total > 0
				? (total / Math.max(4, layout.bytesPerRow)) * 1.1 + 1024
				: 16384;
		this.scanner = new RowScanner(
			{
				delimiter: layout.delimiter,
				decimalMark: layout.decimalMark,
				lineBreak: layout.lineBreak,
				columnCount: layout.columnCount,
				bodyLine: layout.bodyLine,
				timeColumn: layout.timeColumn ?? -1,
				clockColumn: layout.timeUnit === 'clock' ? (layout.timeColumn ?? -1) : -1,
				clockFields: layout.clockFields,
				capacityRows,
			},
			this.source,
			encoding,
		);
		if (this.options.unreadableCells === 'gap') {
			const timeColumns =
				layout.timeColumn === null
					? []
					: layout.clockFields === 2
						? [layout.timeColumn, layout.timeColumn + 1]
						: [layout.timeColumn];
			this.gapCtx = {
				delimiter: layout.delimiter,
				decimalMark: layout.decimalMark,
				eol: this.eol,
				timeColumns,
				gaps: [],
				count: 0,
			};
		}
		// The BOM belongs to line 1 but is not part of its first field.
		this.feed(head.subarray(bom ? 3 : 0));
		this.head = new Uint8Array(0);
	}

	private feed(chunk: Uint8Array): void {
		const eol = this.eol;
		let start = 0;
		if (this.carryLen > 0) {
			const i = chunk.indexOf(eol);
			if (i < 0) {
				this.appendCarry(chunk);
				return;
			}
			this.appendCarry(chunk.subarray(0, i + 1));
			this.scan(this.carry, 0, this.carryLen);
			this.carryLen = 0;
			start = i + 1;
		}
		const last = chunk.lastIndexOf(eol);
		if (last >= start) {
			this.scan(chunk, start, last + 1);
			start = last + 1;
		}
		if (start < chunk.length) this.appendCarry(chunk.subarray(start));
	}

	private appendCarry(bytes: Uint8Array): void {
		if (this.carryLen + bytes.length > this.carry.length) {
			const next = new Uint8Array(Math.max(this.carry.length * 2, this.carryLen + bytes.length));
			next.set(this.carry.subarray(0, this.carryLen));
			this.carry = next;
		}
		this.carry.set(bytes, this.carryLen);
		this.carryLen += bytes.length;
	}

	private appendHead(bytes: Uint8Array): void {
		if (this.headLen + bytes.length > this.head.length) {
			const next = new Uint8Array(Math.max(this.head.length * 2, this.headLen + bytes.length));
			next.set(this.head.subarray(0, this.headLen));
			this.head = next;
		}
		this.head.set(bytes, this.headLen);
		this.headLen += bytes.length;
	}
}

/** A NUL byte, or more than 1% control bytes, in the head: not a text file. */
function checkNotBinary(head: Uint8Array, source: string): void {
	const n = Math.min(head.length, HEAD_BYTES);
	let control = 0;
	for (let i = 0; i < n; i++) {
		const b = head[i];
		if (b === 0) {
			let zeros = 0;
			for (let j = i & 1; j < Math.min(n, 256); j += 2) if (head[j] === 0) zeros++;
			const utf16 = zeros * 2 >= Math.min(n, 256) - 2;
			throw binaryError(
				source,
				head,
				i,
				utf16
					? 'UTF-8 text (this looks like UTF-16 text without a byte order mark: save it as UTF-8)'
					: 'a text file (found a NUL byte: this looks like a binary file)',
			);
		}
		if ((b < 9 || (b > 13 && b < 32 && b !== 26) || b === 127) && ++control > Math.max(4, n / 100))
			throw binaryError(source, head, i, 'a text file (found many control bytes: this looks like a binary file)');
	}
}

function binaryError(source: string, head: Uint8Array, at: number, expected: string): ImportError {
	const bytes = Array.from(head.subarray(at, at + 8), (b) => b.toString(16).padStart(2, '0')).join(' ');
	return new ImportError(source, 0, at + 1, 'binary-as-text', bytes, expected);
}
