/**
 * Which column is the time base: by name or unit in the header, else (no header, or an unnamed first
 * column) a first column that rises in near-equal steps. Its unit: option, header, preamble, else guessed
 * from the step size (an 'assumption'). Without a time column the rate must come from the preamble or
 * options, else 'no-time-base'.
 */
import { ImportError } from '../import-error.js';
import { cellValue } from './cells.js';
import { clockFractionDigits, isClockCell, isDateCell } from './clock-time.js';
import { isIndexName, isTimeName } from './names.js';
import type { CsvLayout, CsvOptions } from './types.js';
import { readUnit } from './units.js';
import { maxOf, minOf } from '../../signal/extremes.js';

type TimeUnit = NonNullable<CsvLayout['timeUnit']>;
const UNIT_OF_FACTOR: [number, TimeUnit][] = [
	[1, 's'],
	[1e-3, 'ms'],
	[1e-6, 'us'],
	[1e-9, 'ns'],
];
const FACTOR: Record<Exclude<TimeUnit, 'index' | 'clock'>, number> = { s: 1, ms: 1e-3, us: 1e-6, ns: 1e-9 };

/** Seconds per unit of a time column ('index' has none: it needs the sample rate). */
export function secondsPerUnit(unit: Exclude<TimeUnit, 'index' | 'clock'>): number {
	return FACTOR[unit];
}

type Say = (code: string, message: string, severity?: 'info' | 'assumption' | 'warning') => void;

/** A time column found: its index, whether it holds times or sample numbers, and how it was found (for messages). */
interface TimePick {
	tc: number;
	role: 'time' | 'index';
	how: string;
}

/** Sets layout.timeColumn, layout.timeUnit and the column roles; adds the diagnostics. */
export function chooseTimeColumn(
	layout: CsvLayout,
	preview: string[][],
	options: CsvOptions,
	preambleUnit: TimeUnit | undefined,
	source: string,
): void {
	const say: Say = (code, message, severity = 'info') => layout.diagnostics.push({ code, message, severity });
	if (options.timeColumn !== 'none' && useClockStamps(layout, preview, say)) return;
	const pick = pickTimeColumn(layout, preview, options, source, say);
	if (pick === null) {
		noTimeColumn(layout, options, source, say);
		return;
	}
	const { tc, role, how } = pick;
	const cols = layout.columns;
	cols[tc].role = role;
	layout.timeColumn = tc;
	layout.timeResolution = printedResolution(
		preview.map((r) => r[tc] ?? ''),
		layout.decimalMark,
	);
	if (role === 'index' || options.timeUnit === 'index') {
		sampleNumberColumn(layout, preview, pick, source, say);
		return;
	}
	const name = cols[tc].header || `col${tc + 1}`;
	const { unit, from } = timeUnitOf(layout, preview, tc, options, preambleUnit, say);
	layout.timeUnit = unit;
	say('time-column', `Column "${name}" is the time base (${how}), in ${unit} (${from}).`);
}

/**
 * Time-of-day stamps (or a date then a time) first in the rows: they can only be the time base (detection
 * allows them at the start of a row only). Returns false when the rows start otherwise.
 */
function useClockStamps(layout: CsvLayout, preview: string[][], say: Say): boolean {
	const cols = layout.columns;
	const split =
		preview.length > 0 && cols.length > 2 && isDateCell(preview[0][0] ?? '') && isClockCell(preview[0][1] ?? '');
	if (!(preview.length > 0 && (split || isClockCell(preview[0][0] ?? '')))) return false;
	const clockAt = split ? 1 : 0;
	cols[0].role = 'time';
	cols[clockAt].role = 'time';
	layout.timeColumn = 0;
	layout.timeUnit = 'clock';
	layout.clockFields = split ? 2 : 1;
	const digits = Math.max(0, maxOf(preview.map((r) => clockFractionDigits(r[clockAt] ?? ''))));
	layout.timeResolution = 10 ** -digits;
	const first = preview[0].slice(0, clockAt + 1).join(' ');
	const where = split
		? `Columns "${cols[0].header || 'col1'}" and "${cols[1].header || 'col2'}" hold date and time of day`
		: `Column "${cols[0].header || 'col1'}" holds time-of-day stamps`;
	say('time-column', `${where} (first ${first}); times are counted from the first stamp.`);
	return true;
}

/** The time column as set, else by name or unit, else a first column without a name that rises evenly; null for none. */
function pickTimeColumn(
	layout: CsvLayout,
	preview: string[][],
	options: CsvOptions,
	source: string,
	say: Say,
): TimePick | null {
	const cols = layout.columns;
	if (typeof options.timeColumn === 'number') {
		const tc = options.timeColumn;
		if (!Number.isInteger(tc) || tc < 0 || tc >= cols.length)
			throw new ImportError(
				source,
				0,
				0,
				'bad-option',
				`time column index ${tc}`,
				`a time column index from 0 to ${cols.length - 1}, counting from 0 (the file has ${cols.length} column${cols.length === 1 ? '' : 's'})`,
			);
		const role = options.timeUnit === 'index' || isIndexName(cols[tc].name) ? 'index' : 'time';
		return { tc, role, how: 'as set' };
	}
	if (options.timeColumn === 'none' || cols.length <= 1) return null;
	return namedTimeColumn(layout) ?? guessedTimeColumn(layout, preview, say);
}

/** The first column named or unit-marked as time or sample number (a stated electrical unit wins over a name). */
function namedTimeColumn(layout: CsvLayout): TimePick | null {
	for (const c of layout.columns) {
		const u = readUnit(c.unitText);
		// a stated electrical unit wins over a name: "N (V)" is the neutral's voltage, not a sample number
		if (isElectricalUnit(c.unitText)) continue;
		if (isTimeName(c.name) || u?.kind === 'time') return { tc: c.index, role: 'time', how: `named "${c.header}"` };
		if (isIndexName(c.name)) return { tc: c.index, role: 'index', how: `named "${c.header}"` };
	}
	return null;
}

/** An unnamed first column rising in equal steps: times, or sample numbers when the steps are whole ones (an assumption). */
function guessedTimeColumn(layout: CsvLayout, preview: string[][], say: Say): TimePick | null {
	const mark = layout.decimalMark;
	if (layout.columns[0].header !== '' || !risesEvenly(preview, mark)) return null;
	const ints = preview.every((r, i) => i === 0 || cellValue(r[0], mark) - cellValue(preview[i - 1][0], mark) === 1);
	const role = ints && Number.isInteger(cellValue(preview[0][0], mark)) ? 'index' : 'time';
	const how = 'because its values rise in equal steps';
	say(
		'time-column-guessed',
		`The first column was taken as the ${role === 'index' ? 'sample number' : 'time'} ${how}; give the time column to change this.`,
		'assumption',
	);
	return { tc: 0, role, how };
}

/** No time column: the samples are evenly spaced at the stated rate, which must exist ('no-time-base'). */
function noTimeColumn(layout: CsvLayout, options: CsvOptions, source: string, say: Say): void {
	layout.timeColumn = null;
	layout.timeUnit = null;
	if (layout.statedSampleRateHz === undefined || !(layout.statedSampleRateHz > 0))
		throw new ImportError(
			source,
			layout.headerLine ?? layout.bodyLine,
			0,
			'no-time-base',
			'',
			'a time column, a sample rate or interval in the preamble, or a given sample rate',
		);
	say(
		'no-time-column',
		`No time column: samples are taken as evenly spaced at ${layout.statedSampleRateHz} Hz (${options.sampleRateHz ? 'as set' : 'from the preamble'}).`,
		'assumption',
	);
	if (options.timeUnit !== undefined)
		say(
			'time-unit-unused',
			`A time unit (${options.timeUnit}) was given, but the file has no time column; it was not used.`,
			'warning',
		);
}

/** A column of sample numbers: times are number / the stated rate, which must exist ('no-time-base'). */
function sampleNumberColumn(layout: CsvLayout, preview: string[][], pick: TimePick, source: string, say: Say): void {
	const { tc, how } = pick;
	const col = layout.columns[tc];
	col.role = 'index';
	layout.timeUnit = 'index';
	// for an error, the text as written: the header cell, else the column's first data cell
	const written = col.header || (preview[0]?.[tc] ?? '');
	if (layout.statedSampleRateHz === undefined || !(layout.statedSampleRateHz > 0))
		throw new ImportError(
			source,
			col.header ? layout.headerLine! : layout.bodyLine,
			tc + 1,
			'no-time-base',
			written,
			`a sample rate or interval in the preamble, or a given sample rate (column ${tc + 1} holds sample numbers, not times)`,
		);
	say(
		'sample-index',
		`Column "${col.header || `col${tc + 1}`}" holds sample numbers (${how}); times are number / ${layout.statedSampleRateHz} Hz.`,
	);
}

/** The time column's unit: as set, from the header, from the preamble, else guessed from the step (an assumption). */
function timeUnitOf(
	layout: CsvLayout,
	preview: string[][],
	tc: number,
	options: CsvOptions,
	preambleUnit: TimeUnit | undefined,
	say: Say,
): { unit: TimeUnit; from: string } {
	if (options.timeUnit) return { unit: options.timeUnit, from: 'as set' };
	const headerUnit = readUnit(layout.columns[tc].unitText);
	if (headerUnit?.kind === 'time') {
		const unit = UNIT_OF_FACTOR.find(([f]) => f === headerUnit.factor)?.[1];
		if (unit) return { unit, from: 'from the header' };
	} else if (preambleUnit) return { unit: preambleUnit, from: 'from the preamble' };
	const unit = guessUnit(preview, tc, layout.decimalMark, layout.statedSampleRateHz);
	say(
		'time-unit-assumed',
		`The time column "${layout.columns[tc].header || `col${tc + 1}`}" states no unit; ${unit} assumed from its step size${layout.statedSampleRateHz ? ' and the stated sample rate' : ''}. Give the time unit to change this.`,
		'assumption',
	);
	return { unit, from: 'assumed' };
}

/** Units of measured electrical quantities (V, A with SI prefixes; W, VA, var, Hz, ohm, %, p.u.): never a time or sample number. */
const ELECTRICAL_UNIT = /^(W|kW|MW|VA|kVA|MVA|var|kvar|Mvar|Hz|Ω|ohms?|%|p\.?u\.?)$/i;

function isElectricalUnit(text: string): boolean {
	const u = readUnit(text);
	if (!u) return false;
	return u.kind === 'voltage' || u.kind === 'current' || ELECTRICAL_UNIT.test(u.unit);
}

function risesEvenly(preview: string[][], mark: '.' | ','): boolean {
	if (preview.length < 3) return false;
	const v = preview.map((r) => cellValue(r[0], mark));
	const steps: number[] = [];
	for (let i = 1; i < v.length; i++) {
		if (!(v[i] > v[i - 1])) return false;
		steps.push(v[i] - v[i - 1]);
	}
	const sorted = [...steps].sort((a, b) => a - b);
	const med = sorted[sorted.length >> 1];
	// whole multiples of the usual step are gaps (reported later), not a sign of a non-time column
	return steps.every((s) => Math.abs(s - med * Math.max(1, Math.round(s / med))) <= 0.5 * med && s <= 4 * med);
}

/** Unit that makes the step a plausible mains-recording interval (200 Hz .. 100 MHz), or matches the stated rate. */
function guessUnit(
	preview: string[][],
	tc: number,
	mark: '.' | ',',
	statedHz: number | undefined,
): Exclude<TimeUnit, 'index' | 'clock'> {
	const v = preview.map((r) => cellValue(r[tc], mark)).filter(Number.isFinite);
	const step = v.length > 1 ? (v[v.length - 1] - v[0]) / (v.length - 1) : NaN;
	if (!(step > 0)) return 's';
	if (statedHz && statedHz > 0) {
		for (const [f, u] of UNIT_OF_FACTOR)
			if (Math.abs(step * f * statedHz - 1) < 0.05 && u !== 'index') return u as Exclude<TimeUnit, 'index' | 'clock'>;
	}
	if (step < 5e-3) return 's';
	if (step < 5) return 'ms';
	if (step < 5000) return 'us';
	return 'ns';
}

/**
 * Finest printed resolution among the cells, 10^(exponent - digits after the mark); null without cells.
 * The finest, because writers that drop trailing zeros print 3 for 3.0.
 */
function printedResolution(cells: string[], mark: '.' | ','): number | null {
	const r: number[] = [];
	for (const c of cells) {
		const m = /^[-+]?\d*(?:[.,](\d*))?(?:[eE]([-+]?\d+))?$/.exec(c.trim());
		if (m && c.trim() !== '') r.push(10 ** (Number(m[2] ?? 0) - (m[1]?.length ?? 0)));
	}
	if (r.length === 0) return null;
	void mark;
	return minOf(r);
}
