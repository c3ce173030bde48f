/**
 * A binary .dat (BINARY, BINARY32, FLOAT32) pushed in chunks of any size, decoded and scaled (a·x + b) in
 * one pass per channel straight from the pushed bytes into columns reused from push to push: no copy of
 * the chunk, no fresh memory per chunk. A record split between two pushes is completed in a one-record
 * buffer. Sample numbers are checked across pushes as well as within them, and missing values and sample
 * numbers in the declared records only, as the whole-file reader (dat.ts) does.
 * Ref: IEEE C37.111-1999/2013, data file, binary records (from memory; layouts as in docs/methods.md §8.2).
 */
import type { ComtradeConfig } from './cfg.js';
import { decodeColumn, sampleNumberBreaks } from './dat.js';
import { binaryRecordBytes } from './dat-type.js';

/** The sample number and the time stamp (uint32 each) before the analog values of a record. */
const RECORD_HEADER_BYTES = 8;
/** Columns grow by this factor when a push holds more records than they do (once, for steady chunks). */
const GROWTH_FACTOR = 1.5;
/**
 * Records decoded channel by channel before the next ones: 4096 records of a few channels are some tens of
 * KiB, which stay in the core's cache while each channel's values are taken out (measured ~10 % faster
 * than a whole 1 MiB chunk per channel).
 */
const BLOCK_RECORDS = 4096;

export class BinaryDatStream {
	readonly recordBytes: number;
	/** Scaled values per analog channel; rows [0, n) of the last push() are valid until the next push. */
	columns: Float64Array[];
	/** 'Missing' marks per analog channel so far. */
	readonly missing: number[];
	/** Whole records decoded so far (at most the limit). */
	records = 0;
	/** Whole records past the limit (counted, not read). */
	extra = 0;
	/** Records whose sample number is not the previous one + 1, and the 1-based record of the first. */
	breaks = 0;
	firstBreak = 0;
	private readonly type: ComtradeConfig['fileType'];
	private readonly valueBytes: number;
	private readonly partial: Uint8Array;
	private readonly partialView: DataView;
	private partialLen = 0;
	private lastSample = -1;

	/**
	 * @param scale  a and b of each analog channel, in the .cfg's order (at least one)
	 * @param limit  records to read (the count the .cfg declares); sample numbers and missing values are
	 *   checked in these only, as the whole-file reader does
	 */
	constructor(
		cfg: Pick<ComtradeConfig, 'fileType' | 'analog' | 'digital'>,
		private readonly scale: readonly { a: number; b: number }[],
		private readonly limit: number,
	) {
		this.type = cfg.fileType;
		this.valueBytes = cfg.fileType === 'BINARY' ? 2 : 4;
		this.recordBytes = binaryRecordBytes(cfg);
		this.partial = new Uint8Array(this.recordBytes);
		this.partialView = new DataView(this.partial.buffer);
		this.columns = scale.map(() => new Float64Array(0));
		this.missing = scale.map(() => 0);
	}

	/** The bytes of a record begun but not finished by the pushes so far. */
	get pending(): Uint8Array {
		return this.partial.subarray(0, this.partialLen);
	}

	/**
	 * Decodes the whole records the chunk completes or holds, up to the record limit; returns how many
	 * (rows [0, n) of `columns`). Records past the limit are counted in `extra`, not read.
	 */
	push(chunk: Uint8Array): number {
		const rb = this.recordBytes;
		const whole = Math.min(Math.floor((this.partialLen + chunk.length) / rb), this.limit - this.records);
		if (whole > this.columns[0].length) this.grow(whole);
		let rows = 0;
		let p = 0;
		if (this.partialLen > 0) {
			p = Math.min(rb - this.partialLen, chunk.length);
			this.partial.set(chunk.subarray(0, p), this.partialLen);
			this.partialLen += p;
			if (this.partialLen < rb) return 0;
			rows = this.decode(this.partialView, 1, 0);
			this.partialLen = 0;
		}
		const m = Math.floor((chunk.length - p) / rb);
		if (m > 0) {
			rows += this.decode(new DataView(chunk.buffer, chunk.byteOffset + p, m * rb), m, rows);
			p += m * rb;
		}
		this.partial.set(chunk.subarray(p));
		this.partialLen = chunk.length - p;
		return rows;
	}

	/** Up to `n` whole records from byte 0 of `view` into rows [row, …), to the limit; returns how many. */
	private decode(view: DataView, n: number, row: number): number {
		const k = Math.min(n, this.limit - this.records);
		this.extra += n - k;
		if (k <= 0) return 0;
		// in blocks of a few KiB, so that the bytes stay in the core's cache from one channel to the next
		for (let r = 0; r < k; r += BLOCK_RECORDS) {
			const m = Math.min(BLOCK_RECORDS, k - r);
			const block = new DataView(view.buffer, view.byteOffset + r * this.recordBytes, m * this.recordBytes);
			this.checkSampleNumbers(block, m, this.records + r);
			for (let c = 0; c < this.columns.length; c++) {
				const span = {
					col: this.columns[c],
					row: row + r,
					n: m,
					at: RECORD_HEADER_BYTES + c * this.valueBytes,
					recordBytes: this.recordBytes,
				};
				this.missing[c] += decodeColumn(block, span, this.type, this.scale[c]);
			}
		}
		this.records += k;
		return k;
	}

	/** Sample numbers of `n` records from byte 0 of `view`, the first being record `done` (0-based) of the file. */
	private checkSampleNumbers(view: DataView, n: number, done: number): void {
		const sn = sampleNumberBreaks(view, n, this.recordBytes, this.lastSample);
		if (sn.breaks > 0 && this.breaks === 0) this.firstBreak = done + sn.first + 1;
		this.breaks += sn.breaks;
		this.lastSample = sn.last;
	}

	private grow(rows: number): void {
		const cap = Math.max(rows, Math.ceil(this.columns[0].length * GROWTH_FACTOR));
		this.columns = this.columns.map(() => new Float64Array(cap));
	}
}
