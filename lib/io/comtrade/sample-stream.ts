/**
 * A COMTRADE record as a stream of sample blocks for consumers that keep running state only (lib/trend):
 * the .cfg is read whole (it is small), the .dat is pushed in chunks of any size and each run of whole
 * records (ASCII lines, or fixed-size BINARY / BINARY32 / FLOAT32 records) is read, scaled and handed on;
 * nothing is kept, so memory does not grow with the record. Binary records are read straight from each
 * chunk by dat-stream.ts; ASCII lines through dat-ascii.ts, as the whole-file reader. Records with one sampling rate only (the
 * usual case); a record with several rates or with time stamps as its only time base is read whole by
 * `parseComtrade` instead (`streamableRate` says which).
 * Ref: IEEE C37.111-1999/2013 (from memory).
 */
import type { Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import type { SampleSink, SampleStreamHeader } from '../csv/sample-stream.js';
import type { ComtradeConfig } from './cfg.js';
import { readComtradeDat, type DatColumns } from './dat.js';
import { BinaryDatStream } from './dat-stream.js';
import { binaryRecordBytes, checkDatType, DAT_TYPE_HEAD_BYTES } from './dat-type.js';
import { scaleChannel, uniqueNames, valuesNote, type ComtradeOptions } from './parse.js';

/** The one sampling rate of a record (with its .cfg line), or undefined when it has several or none. */
export function streamableRate(cfg: ComtradeConfig): { sampleRateHz: number; line: number } | undefined {
	const rates = cfg.rates.filter((r) => r.sampleRateHz > 0);
	if (rates.length === 0 || rates.length !== cfg.rates.length || new Set(rates.map((r) => r.sampleRateHz)).size !== 1)
		return undefined;
	return { sampleRateHz: rates[0].sampleRateHz, line: rates[0].line };
}

const LF = 10;
const CR = 13;

export class ComtradeSampleStream {
	private readonly ascii: boolean;
	private readonly recordBytes: number;
	private readonly expected: number;
	private readonly factors: number[];
	private readonly offsets: number[];
	private readonly names: string[];
	private carry = new Uint8Array(0);
	private work = new Uint8Array(0);
	private bytesDone = 0;
	private linesDone = 0;
	private readonly byteBase: number;
	private records = 0;
	private extra = 0;
	private checked = false;
	private readonly missing: number[];
	private breaks = 0;
	private firstBreak = 0;
	/** The last chunk's columns of an ASCII .dat, filled again by the next: no fresh memory per chunk. */
	private asciiColumns: DatColumns | undefined;
	/** The decoder of a binary .dat (undefined for ASCII). */
	private readonly binary: BinaryDatStream | undefined;

	/**
	 * @param cfg  the parsed .cfg (parseComtradeCfg) of a record with one sampling rate
	 * @param source  the .cfg name; `datSource` the .dat name, for errors
	 * @throws ImportError 'unsupported-format' when the record has no single sampling rate
	 */
	constructor(
		private readonly cfg: ComtradeConfig,
		readonly source: string,
		readonly datSource: string,
		options: ComtradeOptions,
		private readonly sink: SampleSink,
		/** Where the data starts in a larger file (a .cff): lines before it, and its byte offset. */
		offsets: { line?: number; byte?: number } = {},
	) {
		this.linesDone = offsets.line ?? 0;
		this.byteBase = offsets.byte ?? 0;
		const rate = streamableRate(cfg);
		if (!rate)
			throw new ImportError(
				source,
				cfg.rates[0]?.line ?? 0,
				0,
				'unsupported-format',
				'',
				'one sampling rate for streaming (read the record whole instead)',
			);
		this.ascii = cfg.fileType === 'ASCII';
		this.recordBytes = binaryRecordBytes(cfg);
		this.expected = cfg.rates[cfg.rates.length - 1].endSample;
		const want = options.values ?? 'primary';
		const diagnostics: Diagnostic[] = [...cfg.diagnostics];
		diagnostics.push({
			code: 'comtrade-format',
			severity: 'info',
			message: `COMTRADE ${cfg.revYear} ${cfg.fileType}, station "${cfg.station}", device "${cfg.device}": ${cfg.analog.length} analog and ${cfg.digital.length} digital channels.`,
		});
		if (cfg.lineEnd === 'LF')
			diagnostics.push({
				code: 'comtrade-lf-line-ends',
				severity: 'info',
				message: 'The .cfg uses LF line ends where the standard asks for CRLF; read as usual.',
			});
		diagnostics.push({
			code: 'comtrade-rate',
			severity: 'info',
			line: rate.line,
			message: `Sample rate ${rate.sampleRateHz} Hz from the .cfg; record time stamps are not used for timing.`,
		});
		const channels = cfg.analog.map((a) => scaleChannel(a, new Float64Array(0), want, diagnostics));
		uniqueNames(channels, diagnostics);
		if (cfg.analog.length > 0) diagnostics.push(valuesNote(cfg, want));
		const skewed = cfg.analog.filter((a) => a.skewUs !== 0);
		if (skewed.length > 0)
			diagnostics.push({
				code: 'comtrade-skew-ignored',
				severity: 'info',
				message: `Channel skews (${skewed.map((a) => `${a.name} ${a.skewUs} µs`).join(', ')}) are reported, not corrected.`,
			});
		this.factors = channels.map((c) => c.scaling!.factor);
		this.offsets = channels.map((c) => c.scaling!.offset);
		this.names = channels.map((c) => c.name);
		this.missing = channels.map(() => 0);
		if (channels.length === 0) throw new ImportError(source, 2, 0, 'no-data', '', 'at least one analog channel');
		if (!this.ascii)
			this.binary = new BinaryDatStream(
				cfg,
				channels.map((c) => ({ a: c.scaling!.factor, b: c.scaling!.offset })),
				this.expected,
			);
		const header: SampleStreamHeader = {
			sampleRateHz: rate.sampleRateHz,
			channels: channels.map(({ name, unit, quantity, phase, scaling }) => ({
				name,
				unit,
				quantity,
				...(phase ? { phase } : {}),
				...(scaling ? { scaling } : {}),
			})),
			diagnostics,
		};
		if (cfg.lineFrequencyHz > 0) header.nominalFrequencyHz = cfg.lineFrequencyHz;
		if (cfg.firstData) header.startTime = cfg.firstData.iso;
		sink.start(header);
	}

	/** The next bytes of the .dat. @throws ImportError as the whole-file reader would, at the same place */
	push(chunk: Uint8Array): void {
		if (this.binary) return this.pushBinary(this.binary, chunk);
		// the partial line left over and the chunk, in one buffer reused from push to push
		const total = this.carry.length + chunk.length;
		if (this.work.length < total) this.work = new Uint8Array(Math.max(total, 2 * this.work.length));
		this.work.set(this.carry);
		this.work.set(chunk, this.carry.length);
		const bytes = this.work.subarray(0, total);
		if (!this.checked && bytes.length >= DAT_TYPE_HEAD_BYTES) this.checkType(bytes);
		const cut = lastLineEnd(bytes);
		if (cut > 0) this.read(bytes.subarray(0, cut));
		this.carry = bytes.slice(cut);
	}

	/**
	 * Binary records straight from the chunk. The type is checked on the same bytes as for an ASCII .dat:
	 * the first 4 KiB once that many have arrived, else the whole records of the first push that holds one.
	 */
	private pushBinary(bin: BinaryDatStream, chunk: Uint8Array): void {
		if (!this.checked) {
			const pending = bin.pending;
			const total = pending.length + chunk.length;
			const upTo = total >= DAT_TYPE_HEAD_BYTES ? DAT_TYPE_HEAD_BYTES : total - (total % this.recordBytes);
			if (upTo > 0) {
				const head = new Uint8Array(upTo);
				head.set(pending.subarray(0, upTo));
				if (upTo > pending.length) head.set(chunk.subarray(0, upTo - pending.length), pending.length);
				this.checkType(head);
			}
		}
		const rows = bin.push(chunk);
		this.bytesDone = (bin.records + bin.extra) * this.recordBytes;
		this.extra = bin.extra;
		this.breaks = bin.breaks;
		this.firstBreak = bin.firstBreak;
		if (rows === 0) return;
		this.records += rows;
		this.sink.samples(bin.columns, rows);
	}

	/** Ends the .dat; returns what was found in it. @throws ImportError 'dat-too-short', 'no-data' */
	end(): Diagnostic[] {
		const carry = this.binary ? this.binary.pending : this.carry;
		if (!this.checked && carry.length > 0) this.checkType(carry);
		const notes: Diagnostic[] = [];
		if (carry.length > 0) {
			if (this.ascii) this.read(carry);
			else if (this.records < this.expected) {
				const total = this.bytesDone + carry.length;
				throw new ImportError(
					this.datSource,
					0,
					this.byteBase + total + 1,
					'dat-too-short',
					'',
					`${this.expected} records of ${this.recordBytes} bytes (${this.expected * this.recordBytes} bytes) as the .cfg says; the data has ${total} bytes`,
				);
			} else
				notes.push({
					code: 'comtrade-trailing-bytes',
					severity: 'warning',
					message: `The data ends with ${carry.length} byte(s) that do not make a whole record; they are ignored.`,
				});
		}
		if (this.records < this.expected) {
			if (this.ascii)
				throw new ImportError(
					this.datSource,
					this.linesDone + 1,
					0,
					'dat-too-short',
					'',
					`${this.expected} records as the .cfg says (rates ending at sample ${this.expected}); the file ends after ${this.linesDone}`,
				);
			throw new ImportError(
				this.datSource,
				0,
				this.byteBase + this.bytesDone + 1,
				'dat-too-short',
				'',
				`${this.expected} records of ${this.recordBytes} bytes (${this.expected * this.recordBytes} bytes) as the .cfg says; the data has ${this.bytesDone} bytes`,
			);
		}
		if (this.records === 0) throw new ImportError(this.datSource, 1, 0, 'no-data', '', 'at least one data record');
		if (this.extra > 0)
			notes.push({
				code: 'comtrade-extra-records',
				severity: 'warning',
				message: `The data holds ${this.extra} record(s) past the ${this.records} the .cfg declares; they are ignored.`,
			});
		if (this.breaks > 0)
			notes.push({
				code: 'comtrade-sample-number-break',
				severity: 'warning',
				message: `Sample numbers do not run on by one from record ${this.firstBreak} of ${this.datSource}, ${this.breaks} place(s) in all: records may be missing; times follow the sample rate.`,
			});
		(this.binary?.missing ?? this.missing).forEach((m, c) => {
			if (m > 0)
				notes.push({
					code: 'comtrade-missing-values',
					severity: 'warning',
					line: this.cfg.analog[c].line,
					message: `Channel ${this.names[c]}: ${m} of ${this.records} values are marked missing in the data; they are NaN.`,
				});
		});
		return notes;
	}

	private checkType(head: Uint8Array): void {
		this.checked = true;
		checkDatType(this.cfg, head, this.datSource, this.source, this.byteBase);
	}

	/** Reads whole lines of an ASCII .dat, scales them and hands them on. */
	private read(bytes: Uint8Array): void {
		if (!this.checked) this.checkType(bytes);
		const dat = readComtradeDat(
			this.cfg,
			bytes,
			this.datSource,
			undefined,
			{ line: this.linesDone, byte: this.byteBase + this.bytesDone },
			this.asciiColumns,
		);
		this.asciiColumns = dat;
		this.linesDone += dat.records;
		this.bytesDone += bytes.length;
		const take = Math.max(0, Math.min(dat.records, this.expected - this.records));
		this.extra += dat.records - take;
		if (dat.sampleNumberBreaks > 0 && this.breaks === 0) this.firstBreak = this.records + dat.firstBreakRecord;
		this.breaks += dat.sampleNumberBreaks;
		if (take === 0) return;
		for (let c = 0; c < dat.raw.length; c++) {
			scaleInPlace(dat.raw[c], take, this.factors[c], this.offsets[c]);
			this.missing[c] += dat.missing[c];
		}
		this.records += take;
		this.sink.samples(dat.raw, take);
	}
}

/** x[k] = a·x[k] + b for k < n: its own function, so the per-sample loop is optimised whole. */
function scaleInPlace(x: Float64Array, n: number, a: number, b: number): void {
	for (let k = 0; k < n; k++) x[k] = a * x[k] + b;
}

/** Index just past the last line break (LF, or a lone CR), 0 when there is none. */
function lastLineEnd(b: Uint8Array): number {
	const lf = b.lastIndexOf(LF);
	if (lf >= 0) return lf + 1;
	const cr = b.lastIndexOf(CR);
	return cr >= 0 && cr < b.length - 1 ? cr + 1 : 0;
}
