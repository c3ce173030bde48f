/**
 * Options and detected layout of the CSV importer. Every detection has an override here; every override
 * and every detection is reported as a Diagnostic on the capture.
 */
import type { ChannelRange, Diagnostic, Quantity } from '../../capture.js';

/** Per-channel settings, keyed by channel name (without unit, as in the header) or `col<N>` (1-based). */
export interface CsvChannelOptions {
	/** Rename the channel. */
	name?: string;
	/** Unit of the values as written in the file ('V', 'mV', 'kV', 'A', 'mA', 'kA', 'counts', ...). */
	unit?: string;
	quantity?: Quantity;
	/** value = scale * raw + offset, applied before unit normalisation (e.g. ADC counts to volts). */
	scale?: number;
	offset?: number;
	/** Voltage probe attenuation (x10 probe: 10): the file holds probe-output volts. */
	probeRatio?: number;
	/** Current clamp sensitivity in mV per A: the file holds clamp-output volts; the channel becomes A. */
	clampMvPerA?: number;
	/** Current shunt resistance in ohm: the file holds the shunt voltage; the channel becomes A. */
	shuntOhms?: number;
	/** CT ratio primary/secondary (e.g. 200/5 = 40): the file holds secondary amps. */
	ctRatio?: number;
	/** VT ratio primary/secondary (e.g. 11000/110 = 100): the file holds secondary volts. */
	vtRatio?: number;
	/** The range the file states for the values as written (a scope's vertical range); scaled with them. */
	range?: ChannelRange;
}

export interface CsvOptions {
	delimiter?: ',' | ';' | '\t' | ' ';
	decimalMark?: '.' | ',';
	/** 1-based line of the channel names, or 'none' for a file without a header. */
	headerRow?: number | 'none';
	/** true: the line right under the names holds the units; false: it does not. */
	unitsRow?: boolean;
	/** 0-based column index of the time (or sample index) column, or 'none'. */
	timeColumn?: number | 'none';
	/** What the time column holds: seconds, ms, us, ns, or 'index' (a sample number). */
	timeUnit?: 's' | 'ms' | 'us' | 'ns' | 'index';
	/** Sample rate in Hz when the file has no time column (or a sample-index column). */
	sampleRateHz?: number;
	/** Per-channel unit, quantity and scaling, keyed by channel name or `col<N>` (1-based column). */
	channels?: Record<string, CsvChannelOptions>;
	/**
	 * Largest deviation of a time stamp from the uniform grid, as a fraction of one sample interval, still
	 * taken as uniform sampling (default 0.1). Beyond it the capture keeps its explicit time base.
	 */
	jitterTolerance?: number;
	/**
	 * A data cell that is not a number: 'refuse' (default) stops with an ImportError naming line and column;
	 * 'gap' keeps the file, reads the cell as NaN, lists it in `Capture.gaps` and in a warning. Time cells
	 * are never read as gaps.
	 */
	unreadableCells?: 'refuse' | 'gap';
}

/** Progress reporting and pre-sizing for the streaming reader. */
export interface CsvStreamOptions {
	/** Total size of the input in bytes, when known: pre-sizes the output columns and feeds progress. */
	totalBytes?: number;
	/** Called after each chunk with bytes consumed so far and the total (0 when unknown). */
	onProgress?: (bytesDone: number, bytesTotal: number) => void;
	/**
	 * Row mode (with `onRows`): called once the layout is detected, before any row buffer is allocated; it
	 * may throw (e.g. an ImportError for too many columns).
	 */
	onLayout?: (layout: CsvLayout) => void;
	/**
	 * Most columns taken: a line at the head with more delimiters (comma, semicolon or tab) than this is
	 * refused ('out-of-range') before the layout is detected, so a file of 100,000 columns costs nothing.
	 */
	maxColumns?: number;
	/**
	 * Row mode: the rows of each chunk as they are read, one array per column (raw numbers, time column as
	 * written), valid for [0, rows) until the callback returns (the arrays are reused). Nothing is kept, so
	 * memory does not grow with the file; end with `CsvStreamReader.end()` instead of `finish()`.
	 */
	onRows?: (columns: Float64Array[], rows: number) => void;
}

/** What a row-mode CsvStreamReader saw, from `end()`. */
export interface CsvRowSummary {
	layout: CsvLayout;
	/** Data rows read. */
	rows: number;
	blankLines: number;
	firstBlankLine: number;
	nonFinite: number;
	firstNonFiniteLine: number;
	repeatedTimes: number;
	firstRepeatLine: number;
	/** Notes of the reader itself (encoding, UTF-16). */
	diagnostics: Diagnostic[];
}

/** What one column of the table was taken to be. */
export interface CsvColumnLayout {
	/** 0-based column index. */
	index: number;
	/** Header cell as written ('' when there is no header). */
	header: string;
	/** Name without its unit, or `col<N>` when the file has no header. */
	name: string;
	/** Unit text as written (from the header, the units row, the preamble or options), '' if none. */
	unitText: string;
	role: 'time' | 'index' | 'channel';
}

/** The layout detected from the head of a file (and the options applied to it). */
export interface CsvLayout {
	delimiter: ',' | ';' | '\t' | ' ';
	decimalMark: '.' | ',';
	lineBreak: '\n' | '\r\n' | '\r';
	bom: boolean;
	/** Quoted fields seen in the head. */
	quoted: boolean;
	/** 1-based line of the names, or null when the file has no header. */
	headerLine: number | null;
	/** 1-based line of the units row, or null. */
	unitsLine: number | null;
	/** 1-based line of the first data row. */
	bodyLine: number;
	/** Number of data columns (trailing empty columns not counted). */
	columnCount: number;
	/** Empty columns seen at the end of data rows (a delimiter at line end), accepted and ignored. */
	trailingEmptyColumns: number;
	columns: CsvColumnLayout[];
	/** 0-based index of the time or sample-index column, or null. 'clock' time stamps are in column 0. */
	timeColumn: number | null;
	/** Unit of the time column ('index' for a sample number), or null without a time column. */
	timeUnit: 's' | 'ms' | 'us' | 'ns' | 'index' | 'clock' | null;
	/** 2 when the time-of-day stamps are split over a date column and a time column, else 1. */
	clockFields: 1 | 2;
	/** Resolution of the printed time stamps in the time column's unit (0.001 for 0.123), or null. */
	timeResolution: number | null;
	/** Every preamble key/value, verbatim (value and unit joined by a space). */
	metadata: Record<string, string>;
	/** Sample rate stated by the preamble or options, in Hz. */
	statedSampleRateHz?: number;
	/** Start time stated by the preamble, ISO 8601 when it could be read as one. */
	startTime?: string;
	nominalFrequencyHz?: number;
	/** Per-channel settings gathered from the preamble (scale, offset, unit), merged under options. */
	preambleChannels: Record<string, CsvChannelOptions>;
	/** Settings stated in the preamble for every channel (a global scale/offset). */
	preambleAll: CsvChannelOptions;
	/** Decimation noted by the preamble (factor, when stated). */
	decimation?: { factor?: number; text: string };
	/** The first data rows as cells, for a live preview. */
	preview: string[][];
	/** Average bytes per data line in the head (for pre-sizing). */
	bytesPerRow: number;
	diagnostics: Diagnostic[];
}
