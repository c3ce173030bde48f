/**
 * Scanned columns + layout -> Capture: the time base, channels in V and A with their scaling applied,
 * and every detection, assumption and warning as a Diagnostic.
 */
import { scaleRange, type Capture, type Channel, type ChannelPhase, type Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { channelSettings, setUpChannel } from './channel-setup.js';
import type { RowScanner } from './scan-rows.js';
import { isoOf } from './preamble.js';
import { secondsPerUnit } from './time-column.js';
import { timeBaseFromColumn, type TimeBase } from './timebase.js';
import type { CsvLayout, CsvOptions } from './types.js';

/**
 * The default jitter tolerance: a stamp within 10 % of a sample interval of the uniform grid counts as on it
 * (a project choice, well above the rounding of printed stamps and well below a missing sample).
 */
export const DEFAULT_JITTER_TOLERANCE = 0.1;

/**
 * The capture from the scanned columns: the time base, channels scaled to V and A, and every diagnostic
 * (layout, scanner counts, time base, channels).
 * @throws ImportError 'no-data' (no rows, or no data column) and 'no-time-base'
 */
export function assembleCapture(
	layout: CsvLayout,
	scanner: RowScanner,
	source: string,
	options: CsvOptions,
	extra: Diagnostic[],
): Capture {
	const cols = scanner.result();
	const n = scanner.rows;
	if (n === 0) throw new ImportError(source, layout.bodyLine, 0, 'no-data', '', 'at least one row of numbers');
	const diagnostics: Diagnostic[] = [...extra, ...layout.diagnostics, ...scannerNotes(scanner)];
	const tb =
		layout.timeColumn !== null
			? timeBaseOfColumn(layout, cols[layout.timeColumn], scanner, source, options)
			: { sampleRateHz: layout.statedSampleRateHz!, startS: 0, diagnostics: [] };
	diagnostics.push(...tb.diagnostics);
	if (layout.decimation && !diagnostics.some((d) => d.code === 'decimated'))
		diagnostics.push({
			code: 'decimated',
			severity: 'warning',
			message: `The preamble says the export was decimated ("${layout.decimation.text}"): it does not hold every recorded sample.`,
		});
	const plan = planCsvChannels(layout, options);
	diagnostics.push(...plan.diagnostics);
	const channels: Channel[] = plan.channels.map((p) => {
		const samples = cols[p.column];
		scaleCsvSamples(samples, n, p);
		const ch: Channel = { name: p.name, unit: p.unit, quantity: p.quantity, samples };
		if (p.phase !== undefined) ch.phase = p.phase;
		if (p.scaling) ch.scaling = p.scaling;
		if (p.range) ch.range = p.range;
		return ch;
	});
	if (channels.length === 0)
		throw new ImportError(
			source,
			layout.headerLine ?? layout.bodyLine,
			0,
			'no-data',
			'',
			'at least one data column besides the time column',
		);
	const capture: Capture = {
		source,
		sampleRateHz: tb.sampleRateHz,
		startS: tb.startS,
		channels,
		metadata: layout.metadata,
		diagnostics,
	};
	if (tb.timeS) capture.timeS = tb.timeS;
	if (layout.startTime) capture.startTime = layout.startTime;
	if (layout.nominalFrequencyHz) capture.nominalFrequencyHz = layout.nominalFrequencyHz;
	return capture;
}

/** What the scanner skipped or kept as it was: blank lines, NaN and Infinity cells. */
function scannerNotes(scanner: RowScanner): Diagnostic[] {
	const notes: Diagnostic[] = [];
	if (scanner.blankLines > 0)
		notes.push({
			code: 'blank-lines',
			severity: 'info',
			line: scanner.firstBlankLine,
			message: `${scanner.blankLines} blank line(s) among the data were skipped, the first at line ${scanner.firstBlankLine}.`,
		});
	if (scanner.nonFinite > 0)
		notes.push({
			code: 'non-finite-values',
			severity: 'warning',
			line: scanner.firstNonFiniteLine,
			message: `${scanner.nonFinite} cell(s) hold NaN or Infinity, the first at line ${scanner.firstNonFiniteLine}; they are kept as such.`,
		});
	return notes;
}

/**
 * The time column in s (in place: unit factor, clock stamps counted from the first, which becomes the start
 * time), then its time base.
 * @throws ImportError 'no-time-base' when it gives no rate
 */
function timeBaseOfColumn(
	layout: CsvLayout,
	t: Float64Array,
	scanner: RowScanner,
	source: string,
	options: CsvOptions,
): TimeBase {
	const n = scanner.rows;
	const stated = layout.statedSampleRateHz;
	const f =
		layout.timeUnit === 'index'
			? 1 / stated!
			: layout.timeUnit === 'clock'
				? 1
				: secondsPerUnit(layout.timeUnit as 's');
	if (f !== 1) for (let i = 0; i < n; i++) t[i] *= f;
	if (layout.timeUnit === 'clock') {
		// times from the first stamp; the stamp itself becomes the wall-clock start
		const t0 = t[0];
		for (let i = 0; i < n; i++) t[i] -= t0;
		const first = (layout.preview[0] ?? []).slice(0, layout.clockFields).join(' ');
		const iso = isoOf(first.replace(/^"|"$/g, ''));
		if (iso && !layout.startTime) layout.startTime = iso;
		layout.metadata['first time stamp'] ??= first;
	}
	const col = layout.columns[layout.timeColumn!];
	const tb = timeBaseFromColumn(t, {
		name: col.header || col.name,
		bodyLine: layout.bodyLine,
		rowsAreLines: scanner.blankLines === 0,
		jitterTolerance: options.jitterTolerance ?? DEFAULT_JITTER_TOLERANCE,
		resolutionS: layout.timeResolution === null ? undefined : layout.timeResolution * f,
		statedSampleRateHz: stated,
		repeatedTimes: scanner.repeatedTimes,
		firstRepeatLine: scanner.firstRepeatLine,
	});
	if (!(tb.sampleRateHz > 0))
		throw new ImportError(
			source,
			layout.bodyLine,
			layout.timeColumn! + 1,
			'no-time-base',
			'',
			'at least two rows with different times, or a stated sample rate',
		);
	return tb;
}

/** One channel of a CSV: its column, what it is and the scaling value = factor · raw + offset. */
export interface CsvChannelPlan {
	/** 0-based column index in the file. */
	column: number;
	name: string;
	unit: string;
	quantity: Channel['quantity'];
	phase?: ChannelPhase;
	factor: number;
	offset: number;
	scaling?: Channel['scaling'];
	range?: Channel['range'];
}

/**
 * The channels of a detected layout (every column with the 'channel' role), unique names, and what was
 * said about them; needs no data, so a streaming reader knows its channels before the first row.
 */
export function planCsvChannels(
	layout: CsvLayout,
	options: CsvOptions,
): { channels: CsvChannelPlan[]; diagnostics: Diagnostic[] } {
	const diagnostics: Diagnostic[] = [];
	const channels: CsvChannelPlan[] = [];
	const seen = new Set<string>();
	for (const col of layout.columns) {
		if (col.role !== 'channel') continue;
		const s = setUpChannel(col, layout, options);
		diagnostics.push(...s.diagnostics);
		let name = s.name;
		for (let k = 2; seen.has(name); k++) name = `${s.name} (${k})`;
		if (name !== s.name)
			diagnostics.push({
				code: 'duplicate-name',
				severity: 'warning',
				column: col.index + 1,
				message: `Two columns are named "${s.name}"; column ${col.index + 1} was renamed "${name}".`,
			});
		seen.add(name);
		const p: CsvChannelPlan = {
			column: col.index,
			name,
			unit: s.unit,
			quantity: s.quantity,
			factor: s.factor,
			offset: s.offset,
		};
		if (s.phase !== undefined) p.phase = s.phase;
		if (s.description) p.scaling = { factor: s.factor, offset: s.offset, description: s.description };
		// a range the file states (scope preamble) is in the values as written: scaled like them
		const stated = channelSettings(col, layout, options).range;
		if (stated) p.range = scaleRange(stated, s.factor, s.offset);
		channels.push(p);
	}
	const known = new Set(layout.columns.flatMap((col) => [col.name, col.header, `col${col.index + 1}`]));
	for (const name of Object.keys(layout.preambleChannels))
		if (!known.has(name))
			diagnostics.push({
				code: 'preamble-channel-unmatched',
				severity: 'warning',
				message: `The preamble gives settings for "${name}", which is not a column name; they were not applied.`,
			});
	for (const name of Object.keys(options.channels ?? {}))
		if (!known.has(name))
			diagnostics.push({
				code: 'option-channel-unmatched',
				severity: 'warning',
				message: `Channel settings were given for "${name}", which is not a column name (names: ${layout.columns.map((col) => col.name).join(', ')}); they were not applied.`,
			});
	return { channels, diagnostics };
}

/** Applies a channel's scaling to samples[0, n) in place. A pure power-of-ten division (mV, mA) divides, so 3.25 mA gives the double nearest 0.00325 A. */
export function scaleCsvSamples(samples: Float64Array, n: number, p: Pick<CsvChannelPlan, 'factor' | 'offset'>): void {
	const divisor = 1 / p.factor;
	if (p.factor !== 1 && p.offset === 0 && Number.isInteger(divisor) && 1 / divisor === p.factor)
		for (let i = 0; i < n; i++) samples[i] /= divisor;
	else if (p.factor !== 1 || p.offset !== 0) for (let i = 0; i < n; i++) samples[i] = p.factor * samples[i] + p.offset;
}
