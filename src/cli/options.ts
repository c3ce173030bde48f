/**
 * Command-line option values -> the library's options. Every malformed value is a UsageError naming
 * the option and what was expected; nothing is guessed.
 */
import { REPORT_LIMIT_TABLE_IDS, type AnalysisOptions, type ReportLimitTableId } from '../../lib/report/index.js';
import { siteFromOptions } from './site-options.js';
import { UsageError } from './usage-error.js';

/** Per-file import settings the user gives on the command line (applied by the importer). */
export interface ImportSettings {
	/** Sample rate in Hz for files without a time base. */
	sampleRateHz?: number;
	/** channel name -> multiplying factor (probe ratio, CT ratio, A per V of a clamp...). */
	scale: Record<string, number>;
	/** channel name -> unit text ('V', 'mV', 'kA'...). */
	unit: Record<string, string>;
	/** channel name -> quantity. */
	quantity: Record<string, 'voltage' | 'current' | 'other'>;
	/** channel name -> voltage probe attenuation (x100 probe: 100); makes the channel a voltage. */
	probe?: Record<string, number>;
	/** channel name -> current clamp sensitivity, mV per A; makes the channel a current in A. */
	clamp?: Record<string, number>;
	/** CSV layout overrides (every detection of the CSV reader can be overridden). */
	delimiter?: ',' | ';' | '\t' | ' ';
	decimalMark?: '.' | ',';
	/** 0-based index of the time column, or 'none'. */
	timeColumn?: number | 'none';
	timeUnit?: 's' | 'ms' | 'us' | 'ns' | 'index';
	/** COMTRADE: primary (network side, default) or secondary (what the recorder saw) values. */
	comtradeValues?: 'primary' | 'secondary';
	/** CSV: cells that are not numbers become listed gaps (figures from the longest stretch without gaps). */
	gaps?: boolean;
}

const DELIMITERS: Record<string, ',' | ';' | '\t' | ' '> = {
	comma: ',',
	',': ',',
	semicolon: ';',
	';': ';',
	tab: '\t',
	space: ' ',
};

export interface CommandSettings {
	analysis: AnalysisOptions;
	import: ImportSettings;
}

/** Raw options as cac gives them (kebab-case options arrive camel-cased). */
export type RawOptions = Record<string, unknown>;

function list(value: unknown): string[] {
	if (value === undefined || value === null || value === false) return [];
	return (Array.isArray(value) ? value : [value]).map((v) => String(v));
}

function last(option: string, value: unknown): string | undefined {
	const all = list(value);
	if (all.length === 0) return undefined;
	if (all.some((v) => v === 'true')) throw new UsageError(`--${option} needs a value`);
	return all[all.length - 1];
}

function positiveNumber(option: string, value: unknown, what: string): number | undefined {
	const text = last(option, value);
	if (text === undefined) return undefined;
	const x = Number(text.replace(',', '.'));
	if (!Number.isFinite(x) || x <= 0) throw new UsageError(`--${option} ${text}: expected ${what} (a number above 0)`);
	return x;
}

const EXAMPLE_VALUE: Record<string, string> = { scale: '100', unit: 'V', probe: 'x100', clamp: '100' };

function assignments(option: string, value: unknown, what: string): [string, string][] {
	return list(value).map((text) => {
		const at = text.lastIndexOf('=');
		if (at <= 0 || at === text.length - 1)
			throw new UsageError(
				`--${option} ${text}: expected <channel>=<${what}>, e.g. --${option} U1=${EXAMPLE_VALUE[option] ?? 'voltage'}`,
			);
		return [text.slice(0, at).trim(), text.slice(at + 1).trim()];
	});
}

/** Turns cac's option object into analysis and import settings, or throws UsageError. */
export function settingsFromOptions(raw: RawOptions): CommandSettings {
	const analysis: AnalysisOptions = {};
	const limits = last('limits', raw.limits);
	if (limits !== undefined) {
		if (!(REPORT_LIMIT_TABLE_IDS as readonly string[]).includes(limits)) {
			throw new UsageError(`--limits ${limits}: expected one of ${REPORT_LIMIT_TABLE_IDS.join(', ')}`);
		}
		analysis.limits = limits as ReportLimitTableId;
	}
	analysis.iscIl = positiveNumber('isc-il', raw.iscIl, 'the ratio ISC/IL at the point of common coupling');
	analysis.ilA = positiveNumber('il', raw.il, 'the maximum demand load current in A');
	if ((analysis.iscIl !== undefined || analysis.ilA !== undefined) && analysis.limits !== 'ieee519') {
		if (analysis.limits !== undefined) throw new UsageError('--isc-il and --il apply to --limits ieee519 only');
	}
	const edition = last('ieee519-edition', raw.ieee519Edition);
	if (edition !== undefined) {
		if (edition !== '2014' && edition !== '2022')
			throw new UsageError(`--ieee519-edition ${edition}: expected 2014 or 2022`);
		analysis.ieee519Edition = edition;
	}
	const ref = last('ref', raw.ref);
	if (ref !== undefined) analysis.refChannel = ref;
	const window = positiveNumber('window', raw.window, 'a whole number of cycles');
	if (window !== undefined) {
		if (!Number.isInteger(window)) throw new UsageError(`--window ${window}: expected a whole number of cycles`);
		analysis.windowCycles = window;
	}
	analysis.nominalV = positiveNumber('nominal', raw.nominal, 'the nominal voltage in V');
	const hz = positiveNumber('nominal-hz', raw.nominalHz, 'the nominal frequency in Hz, 50 or 60');
	if (hz !== undefined) {
		if (hz !== 50 && hz !== 60) throw new UsageError(`--nominal-hz ${hz}: expected 50 or 60`);
		analysis.nominalHz = hz;
	}
	const maxOrder = positiveNumber('max-order', raw.maxOrder, 'the highest harmonic order, 2 to 50');
	if (maxOrder !== undefined) {
		if (!Number.isInteger(maxOrder) || maxOrder < 2 || maxOrder > 100)
			throw new UsageError(`--max-order ${maxOrder}: expected a whole number from 2 to 100`);
		analysis.maxOrder = maxOrder;
	}
	if (raw.wholeRecord === true) analysis.span = 'whole-record';
	if (raw.singleBins === true) {
		if (analysis.limits === undefined)
			throw new UsageError('--single-bins applies to a limit check: give --limits too');
		analysis.harmonicBasis = 'single-bins';
	}
	analysis.declaredV = positiveNumber('declared', raw.declared, 'the declared supply voltage in V');
	const pairs = assignments('pair', raw.pair, 'current channel');
	if (pairs.length > 0) analysis.pairs = pairs.map(([voltage, current]) => ({ voltage, current }));
	analysis.site = siteFromOptions(raw);
	for (const key of Object.keys(analysis) as (keyof AnalysisOptions)[])
		if (analysis[key] === undefined) delete analysis[key];

	const settings: ImportSettings = { scale: {}, unit: {}, quantity: {} };
	const rate = positiveNumber('rate', raw.rate, 'the sample rate in Hz');
	if (rate !== undefined) settings.sampleRateHz = rate;
	for (const [channel, text] of assignments('scale', raw.scale, 'factor')) {
		const f = Number(text.replace(',', '.'));
		if (!Number.isFinite(f) || f === 0) throw new UsageError(`--scale ${channel}=${text}: expected a non-zero number`);
		settings.scale[channel] = f;
	}
	for (const [channel, unit] of assignments('unit', raw.unit, 'unit')) settings.unit[channel] = unit;
	for (const [channel, text] of assignments('probe', raw.probe, 'ratio')) {
		// 'x100', '100', '100:1' (common ways to write a probe's attenuation)
		const m = /^x?\s*([0-9.,eE+-]+)\s*(?::\s*1)?$/i.exec(text);
		const f = m ? Number(m[1].replace(',', '.')) : NaN;
		if (!(Number.isFinite(f) && f > 0))
			throw new UsageError(`--probe ${channel}=${text}: expected the probe's attenuation, e.g. x100, 100 or 100:1`);
		(settings.probe ??= {})[channel] = f;
	}
	for (const [channel, text] of assignments('clamp', raw.clamp, 'mV per A')) {
		const f = Number(text.replace(/\s*mv\/a$/i, '').replace(',', '.'));
		if (!(Number.isFinite(f) && f > 0))
			throw new UsageError(`--clamp ${channel}=${text}: expected the clamp's output in mV per A, e.g. 100`);
		(settings.clamp ??= {})[channel] = f;
	}
	const delimiter = last('delimiter', raw.delimiter);
	if (delimiter !== undefined) {
		if (!(delimiter in DELIMITERS))
			throw new UsageError(`--delimiter ${delimiter}: expected comma, semicolon, tab or space`);
		settings.delimiter = DELIMITERS[delimiter];
	}
	const decimal = last('decimal', raw.decimal);
	if (decimal !== undefined) {
		if (decimal !== 'point' && decimal !== 'comma')
			throw new UsageError(`--decimal ${decimal}: expected point or comma`);
		settings.decimalMark = decimal === 'point' ? '.' : ',';
	}
	const timeColumn = last('time-column', raw.timeColumn);
	if (timeColumn !== undefined) {
		const n = Number(timeColumn);
		if (timeColumn === 'none') settings.timeColumn = 'none';
		else if (Number.isInteger(n) && n >= 1) settings.timeColumn = n - 1;
		else throw new UsageError(`--time-column ${timeColumn}: expected a column number from 1, or none`);
	}
	const timeUnit = last('time-unit', raw.timeUnit);
	if (timeUnit !== undefined) {
		if (!['s', 'ms', 'us', 'ns', 'index'].includes(timeUnit))
			throw new UsageError(`--time-unit ${timeUnit}: expected s, ms, us, ns or index`);
		settings.timeUnit = timeUnit as ImportSettings['timeUnit'];
	}
	if (raw.secondary === true) settings.comtradeValues = 'secondary';
	if (raw.gaps === true) settings.gaps = true;
	for (const [channel, q] of assignments('quantity', raw.quantity, 'quantity')) {
		if (q !== 'voltage' && q !== 'current' && q !== 'other')
			throw new UsageError(`--quantity ${channel}=${q}: expected voltage, current or other`);
		settings.quantity[channel] = q;
	}
	return { analysis, import: settings };
}

export { limitsFrom } from './limits-options.js';
