/**
 * A CSV recording as a stream of sample blocks, for consumers that keep running state only (lib/trend):
 * the channels and the sample rate are known after the first rows, every later row goes straight through
 * and is not kept. Memory: one chunk's rows plus the first `PROBE_ROWS` rows while the rate is found.
 *
 * The time column is checked as it passes: the rate comes from the first rows (as `parseCsv` finds it),
 * later rows are checked step by step (a step off by more than the jitter tolerance, a gap over 1.5
 * intervals) and the mean rate of the whole file is compared with the one used. Nothing is resampled: the
 * samples are handed on as evenly spaced, and every departure is reported.
 */
import type { Channel, Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { DEFAULT_JITTER_TOLERANCE, planCsvChannels, scaleCsvSamples, type CsvChannelPlan } from './assemble.js';
import { isoOf } from './preamble.js';
import { StreamTimeCheck } from './stream-time.js';
import { CsvStreamReader } from './stream-reader.js';
import { secondsPerUnit } from './time-column.js';
import type { CsvLayout, CsvOptions } from './types.js';

/** Rows read before the sample rate is fixed (the rate of a uniform file is exact from these). */
export const PROBE_ROWS = 4096;

/** What a sample stream knows before its first samples. */
export interface SampleStreamHeader {
	sampleRateHz: number;
	channels: Pick<Channel, 'name' | 'unit' | 'quantity' | 'phase' | 'scaling' | 'range'>[];
	nominalFrequencyHz?: number;
	startTime?: string;
	/** Everything detected or assumed so far (layout, channels, time base of the first rows). */
	diagnostics: Diagnostic[];
}

/** Where the samples go. */
export interface SampleSink {
	/** Once, before any samples; may throw (then the stream stops with that error). */
	start(header: SampleStreamHeader): void;
	/** The next `n` samples of every channel (header order), in arrays valid until this returns. */
	samples(chunk: Float64Array[], n: number): void;
}

export interface CsvSampleStreamOptions {
	totalBytes?: number;
	onProgress?: (bytesDone: number, bytesTotal: number) => void;
	/** More data columns than this: an 'out-of-range' ImportError at the header before any row is read. */
	maxChannels?: number;
}

/**
 * @example
 * const s = new CsvSampleStream('feeder.csv', {}, { start: (h) => (a = createTrendAnalyser(...)), samples: (x, n) => a.push(x.map((c) => c.subarray(0, n))) });
 * for (const chunk of chunks) s.push(chunk);
 * const lateNotes = s.end();
 */
export class CsvSampleStream {
	private readonly reader: CsvStreamReader;
	private plan: CsvChannelPlan[] = [];
	private planNotes: Diagnostic[] = [];
	private detected: CsvLayout | null = null;
	private timeFactor = 1;
	private clockZero = NaN;
	private probe: Float64Array[] = [];
	private probeT = new Float64Array(0);
	private probeRows = 0;
	private check: StreamTimeCheck | null = null;
	private started = false;
	private out: Float64Array[] = [];

	constructor(
		readonly source: string,
		private readonly options: CsvOptions,
		private readonly sink: SampleSink,
		private readonly stream: CsvSampleStreamOptions = {},
	) {
		this.reader = new CsvStreamReader(source, options, {
			totalBytes: stream.totalBytes,
			onProgress: stream.onProgress,
			onLayout: (l) => this.onLayout(l),
			// the time column and a channel per column: refuse a far wider file before detecting its layout
			maxColumns: stream.maxChannels === undefined ? undefined : stream.maxChannels + 1,
			onRows: (cols, rows) => this.onRows(cols, rows),
		});
	}

	/** The layout detected from the head (null before enough bytes arrived). */
	get layout(): CsvLayout | null {
		return this.detected;
	}

	/** The next bytes of the file; throws ImportError at the first bad row. */
	push(chunk: Uint8Array): void {
		this.reader.push(chunk);
	}

	/** Ends the file; returns what was found after the header (blank lines, non-finite cells, time steps). */
	end(): Diagnostic[] {
		const summary = this.reader.end();
		if (!this.started) this.startStream();
		const notes: Diagnostic[] = [...summary.diagnostics];
		if (summary.blankLines > 0)
			notes.push({
				code: 'blank-lines',
				severity: 'info',
				line: summary.firstBlankLine,
				message: `${summary.blankLines} blank line(s) among the data were skipped, the first at line ${summary.firstBlankLine}.`,
			});
		if (summary.nonFinite > 0)
			notes.push({
				code: 'non-finite-values',
				severity: 'warning',
				line: summary.firstNonFiniteLine,
				message: `${summary.nonFinite} cell(s) hold NaN or Infinity, the first at line ${summary.firstNonFiniteLine}; they are kept as such.`,
			});
		if (summary.repeatedTimes > 0)
			notes.push({
				code: 'repeated-times',
				severity: 'warning',
				line: summary.firstRepeatLine,
				message: `${summary.repeatedTimes} row(s) repeat the previous time stamp, first at line ${summary.firstRepeatLine}; each row is taken as one sample.`,
			});
		if (this.check) notes.push(...this.check.finish(summary.blankLines === 0));
		return notes;
	}

	private onLayout(layout: CsvLayout): void {
		this.detected = layout;
		const { channels, diagnostics } = planCsvChannels(layout, this.options);
		const max = this.stream.maxChannels;
		if (max !== undefined && channels.length > max) {
			throw new ImportError(
				this.source,
				layout.headerLine ?? layout.bodyLine,
				0,
				'out-of-range',
				`${channels.length} data columns`,
				`at most ${max} channels in one recording (split the file into parts of fewer columns)`,
			);
		}
		if (channels.length === 0)
			throw new ImportError(
				this.source,
				layout.headerLine ?? layout.bodyLine,
				0,
				'no-data',
				'',
				'at least one data column besides the time column',
			);
		this.plan = channels;
		this.planNotes = diagnostics;
		this.out = channels.map(() => new Float64Array(0));
		if (layout.timeColumn !== null) {
			const stated = layout.statedSampleRateHz;
			this.timeFactor =
				layout.timeUnit === 'index'
					? 1 / stated!
					: layout.timeUnit === 'clock'
						? 1
						: secondsPerUnit(layout.timeUnit as 's');
		}
	}

	private onRows(cols: Float64Array[], rows: number): void {
		const layout = this.detected!;
		const tc = layout.timeColumn;
		if (tc !== null) {
			const t = cols[tc];
			if (layout.timeUnit === 'clock' && Number.isNaN(this.clockZero)) this.clockZero = t[0];
			const f = this.timeFactor;
			const z = layout.timeUnit === 'clock' ? this.clockZero : 0;
			// (t − 0) · 1 is t, bit for bit (−0 and NaN included): times in seconds need no pass
			if (z !== 0 || f !== 1) shiftScale(t, rows, z, f);
		}
		for (const p of this.plan) scaleCsvSamples(cols[p.column], rows, p);
		let from = 0;
		if (!this.started) {
			from = this.addToProbe(cols, rows);
			if (this.probeRows < PROBE_ROWS) return;
			this.startStream();
		}
		if (from >= rows) return;
		if (tc !== null) this.check!.rows(cols[tc], from, rows);
		for (let k = 0; k < this.plan.length; k++) this.out[k] = cols[this.plan[k].column].subarray(from, rows);
		this.sink.samples(this.out, rows - from);
	}

	/** Copies rows into the probe up to PROBE_ROWS; returns the first row not taken. */
	private addToProbe(cols: Float64Array[], rows: number): number {
		if (this.probe.length === 0) {
			this.probe = this.plan.map(() => new Float64Array(PROBE_ROWS));
			this.probeT = new Float64Array(PROBE_ROWS);
		}
		const take = Math.min(rows, PROBE_ROWS - this.probeRows);
		const tc = this.detected!.timeColumn;
		for (let k = 0; k < this.plan.length; k++)
			this.probe[k].set(cols[this.plan[k].column].subarray(0, take), this.probeRows);
		if (tc !== null) this.probeT.set(cols[tc].subarray(0, take), this.probeRows);
		this.probeRows += take;
		return take;
	}

	private startStream(): void {
		const layout = this.detected!;
		this.started = true;
		const n = this.probeRows;
		const diagnostics: Diagnostic[] = [...layout.diagnostics];
		let rateHz = layout.statedSampleRateHz ?? NaN;
		if (layout.timeColumn !== null && n > 0) {
			const col = layout.columns[layout.timeColumn];
			this.check = new StreamTimeCheck(this.probeT.subarray(0, n), {
				name: col.header || col.name,
				bodyLine: layout.bodyLine,
				jitterTolerance: this.options.jitterTolerance ?? DEFAULT_JITTER_TOLERANCE,
				resolutionS: layout.timeResolution === null ? undefined : layout.timeResolution * this.timeFactor,
				statedSampleRateHz: layout.statedSampleRateHz,
			});
			rateHz = this.check.sampleRateHz;
			diagnostics.push(...this.check.startDiagnostics);
			if (!(rateHz > 0))
				throw new ImportError(
					this.source,
					layout.bodyLine,
					layout.timeColumn + 1,
					'no-time-base',
					'',
					'at least two rows with different times, or a stated sample rate',
				);
		}
		if (layout.decimation && !diagnostics.some((d) => d.code === 'decimated'))
			diagnostics.push({
				code: 'decimated',
				severity: 'warning',
				message: `The preamble says the export was decimated ("${layout.decimation.text}"): it does not hold every recorded sample.`,
			});
		diagnostics.push(...this.planNotes);
		const header: SampleStreamHeader = {
			sampleRateHz: rateHz,
			channels: this.plan.map((p) => ({
				name: p.name,
				unit: p.unit,
				quantity: p.quantity,
				...(p.phase !== undefined ? { phase: p.phase } : {}),
				...(p.scaling ? { scaling: p.scaling } : {}),
				...(p.range ? { range: p.range } : {}),
			})),
			diagnostics,
		};
		if (layout.nominalFrequencyHz) header.nominalFrequencyHz = layout.nominalFrequencyHz;
		if (layout.startTime) header.startTime = layout.startTime;
		else if (layout.timeUnit === 'clock') {
			// date/time stamps: the first one is the wall-clock start (as parseCsv takes it, assemble.ts)
			const first = (layout.preview[0] ?? []).slice(0, layout.clockFields).join(' ');
			const iso = isoOf(first.replace(/^"|"$/g, ''));
			if (iso) header.startTime = iso;
		}
		this.sink.start(header);
		if (n > 0)
			this.sink.samples(
				this.probe.map((p) => p.subarray(0, n)),
				n,
			);
		this.probe = [];
	}
}

/** t[i] = (t[i] − z) · f for i < n: its own function, so the per-row loop is optimised whole. */
function shiftScale(t: Float64Array, n: number, z: number, f: number): void {
	for (let i = 0; i < n; i++) t[i] = (t[i] - z) * f;
}
