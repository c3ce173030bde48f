/**
 * The preamble: metadata lines above the table (`key<delim>value[<delim>unit]`, `# key: value`,
 * `key = value`, blank lines). Everything is kept verbatim; the sample rate or interval, start time,
 * nominal frequency, decimation and per-channel scaling are also read out when the key says so.
 */
import type { Diagnostic } from '../../capture.js';
import type { CsvChannelOptions } from './types.js';
import { readUnit, splitNameUnit } from './units.js';

export interface PreambleFacts {
	metadata: Record<string, string>;
	sampleRateHz?: number;
	startTime?: string;
	nominalFrequencyHz?: number;
	timeUnit?: 's' | 'ms' | 'us' | 'ns';
	decimation?: { factor?: number; text: string };
	channels: Record<string, CsvChannelOptions>;
	all: CsvChannelOptions;
	diagnostics: Diagnostic[];
}

/** Reads '10 kHz', '0,0001 s', '1e-4' (with the file's decimal mark) into value and unit text. */
export function readQuantity(text: string, decimalMark: '.' | ','): { value: number; unit: string } | null {
	const t = text.trim();
	const m = /^([-+]?(?:\d+[.,]?\d*|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(.*)$/.exec(t);
	if (!m) return null;
	let num = m[1];
	if (decimalMark === ',' || !num.includes('.')) num = num.replace(',', '.');
	const value = Number(num);
	return Number.isFinite(value) ? { value, unit: m[2].trim() } : null;
}

const RATE_UNIT: Record<string, number> = {
	hz: 1,
	khz: 1e3,
	mhz: 1e6,
	's/s': 1,
	'sa/s': 1,
	'ks/s': 1e3,
	'ksa/s': 1e3,
	'ms/s': 1e6,
	'msa/s': 1e6,
	sps: 1,
	ksps: 1e3,
	msps: 1e6,
	'samples/s': 1,
};
const KEY_RATE =
	/^(sample|sampling|acquisition|scan)?[\s_-]*(rate|frequency|freq)$|^(fs|samplerate|sample_rate|srate)$/i;
const KEY_INTERVAL =
	/^(sample|sampling)?[\s_-]*(interval|period|step|spacing)$|^(dt|delta[\s_-]?t|time[\s_-]?step|timestep|x[\s_-]?increment|xincrement|time[\s_-]?resolution|time[\s_-]?base|sample[\s_-]?time)$/i;
const KEY_START =
	/^(start|start[\s_-]?time|starttime|start[\s_-]?date|trigger[\s_-]?time|date[\s_/-]?time|timestamp|recorded|record[\s_-]?start)$/i;
const KEY_NOMINAL = /^(nominal|mains|line|system|network|grid)[\s_-]?(frequency|freq)$|^f[\s_-]?nom(inal)?$/i;
const KEY_TIME_UNIT = /^(time|x|horizontal)[\s_-]?units?$/i;
const KEY_CHANNEL =
	/^(?:(.+?)[\s_-]+)?(scale|gain|factor|multiplier|offset|unit|units|probe|probe[\s_-]?ratio|attenuation|ct[\s_-]?ratio|vt[\s_-]?ratio|pt[\s_-]?ratio|clamp|clamp[\s_-]?ratio|shunt)(?:[\s_-]+(.+))?$/i;

/** Parses preamble lines (line numbers 1-based, first line = `firstLine`) split with `split`. */
export function readPreamble(
	lines: string[],
	firstLine: number,
	split: (line: string) => string[],
	delimiter: string,
	decimalMark: '.' | ',',
): PreambleFacts {
	const facts: PreambleFacts = { metadata: {}, channels: {}, all: {}, diagnostics: [] };
	let date: string | undefined;
	let time: string | undefined;
	lines.forEach((raw, i) => {
		const lineNo = firstLine + i;
		const line = raw.replace(/^\uFEFF/, '').trim();
		if (line === '') return;
		const body = line.replace(/^(#+|\/\/|%|!|;+)\s*/, '');
		if (body.length > 500) {
			facts.metadata[`line ${lineNo}`] = body;
			return;
		}
		let key: string;
		let value: string;
		const kv = /^([^:=]*[A-Za-z][^:=]*?)\s*[:=]\s*(.*)$/.exec(body);
		const cells = split(body).map((c) => c.trim());
		if (kv && (delimiter === ' ' || split(kv[1]).length === 1)) {
			key = kv[1].trim();
			value = kv[2].trim();
		} else if (cells.length >= 2 && cells[0] !== '') {
			key = cells[0].replace(/\s*[:=]$/, '');
			value = cells
				.slice(1)
				.filter((c) => c !== '')
				.join(' ');
		} else {
			facts.metadata[`line ${lineNo}`] = body;
			return;
		}
		if (key === '') return;
		facts.metadata[key in facts.metadata ? `${key} (line ${lineNo})` : key] = value;
		if (readScopeFact(facts, key, kv ? [value] : cells.slice(1), lineNo, decimalMark)) return;
		readFact(facts, key, value, lineNo, decimalMark);
		if (/^date$/i.test(key)) date = value;
		if (/^time$/i.test(key)) time = value;
	});
	if (!facts.startTime && date) facts.startTime = isoOf(time ? `${date} ${time}` : date);
	return facts;
}

function readFact(facts: PreambleFacts, key: string, value: string, lineNo: number, decimalMark: '.' | ','): void {
	const { name, unitText } = splitNameUnit(key);
	const k = name.toLowerCase();
	const q = readQuantity(unitText ? `${value} ${unitText}` : value, decimalMark);
	const say = (code: string, message: string, severity: Diagnostic['severity'] = 'info') =>
		facts.diagnostics.push({ code, message, severity, line: lineNo });
	if (KEY_NOMINAL.test(k)) {
		if (q && q.value > 0) facts.nominalFrequencyHz = q.value;
		return;
	}
	if (KEY_RATE.test(k) && q && q.value > 0) {
		const mult = RATE_UNIT[q.unit.toLowerCase()] ?? (q.unit === '' ? 1 : NaN);
		if (Number.isFinite(mult)) {
			facts.sampleRateHz = q.value * mult;
			say('rate-in-preamble', `The preamble states a sample rate of ${facts.sampleRateHz} Hz ("${key}").`);
		}
		return;
	}
	if (KEY_INTERVAL.test(k) && q && q.value > 0) {
		const u = readUnit(q.unit || 's');
		if (u && u.kind === 'time') {
			facts.sampleRateHz = 1 / (q.value * u.factor);
			say(
				'rate-in-preamble',
				`The preamble states a sample interval of ${q.value} ${q.unit || 's'} ("${key}"), i.e. ${Number(facts.sampleRateHz.toPrecision(9))} Hz.`,
			);
		}
		return;
	}
	if (KEY_START.test(k)) {
		facts.startTime = isoOf(value) ?? facts.startTime;
		return;
	}
	if (KEY_TIME_UNIT.test(k)) {
		const u = readUnit(value);
		if (u?.kind === 'time')
			facts.timeUnit = u.factor === 1 ? 's' : u.factor === 1e-3 ? 'ms' : u.factor === 1e-6 ? 'us' : 'ns';
		return;
	}
	if (/decimat|downsampl|reduction|every\s*n/i.test(k)) {
		facts.decimation = { text: `${key}: ${value}`, factor: q && q.value > 1 ? q.value : undefined };
		return;
	}
	const m = KEY_CHANNEL.exec(name.trim());
	if (!m) return;
	const channel = (m[1] ?? m[3] ?? '').trim();
	const target: CsvChannelOptions = channel ? (facts.channels[channel] ??= {}) : facts.all;
	const what = m[2].toLowerCase().replace(/[\s_-]+/g, ' ');
	if (what === 'unit' || what === 'units') {
		// 'Units;V;V;A' lists several units: kept as metadata, not applied to every channel
		if (!channel && /\s/.test(value.trim())) return;
		target.unit = value.trim();
		return;
	}
	const ratio = readRatio(value, decimalMark);
	if (ratio === null) return;
	if (what === 'offset') target.offset = q ? q.value : undefined;
	else if (what === 'probe' || what === 'probe ratio' || what === 'attenuation') target.probeRatio = ratio;
	else if (what === 'ct ratio') target.ctRatio = ratio;
	else if (what === 'vt ratio' || what === 'pt ratio') target.vtRatio = ratio;
	else if (what.startsWith('clamp') && q) target.clampMvPerA = /^v\/a$/i.test(q.unit) ? q.value * 1000 : q.value;
	else if (what === 'shunt' && q) target.shuntOhms = /^mohm|^mΩ/i.test(q.unit) ? q.value / 1000 : q.value;
	else target.scale = ratio;
	if (/^(scale|gain|factor|multiplier)$/.test(what) && q && q.unit) target.unit ??= q.unit.replace(/\/.*$/, '');
}

const SCOPE_UNIT = /^vertical[\s_-]*units?$/i;
const SCOPE_DISPLAY = /^vertical[\s_-]*(scale|sensitivity|offset|position)$/i;
const SCOPE_PROBE = /^probe[\s_-]*(attenuation|ratio|factor|gain)?$|^attenuation$/i;
const SCOPE_RANGE = /^(vertical|input|adc|channel)?[\s_-]*(range|full[\s_-]*scale)$/i;

/**
 * Scope-style preamble rows: `Vertical Units`, `Vertical Scale`/`Offset`, `Probe Attenuation`, with one
 * value for every channel or one value per data column (in the order of the columns after the time
 * column). Units and probe attenuation are applied (the attenuation multiplies the values, which are
 * taken as read at the scope's input, and makes the channel a voltage; a probe stated in mV/A or V/A is a
 * clamp and makes it a current); vertical scale and offset are screen settings, reported, not applied.
 * @returns true when the key was one of these (handled here)
 */
function readScopeFact(
	facts: PreambleFacts,
	key: string,
	values: string[],
	lineNo: number,
	decimalMark: '.' | ',',
): boolean {
	const k = key.trim();
	const kind = SCOPE_UNIT.test(k)
		? 'unit'
		: SCOPE_DISPLAY.test(k)
			? 'display'
			: SCOPE_PROBE.test(k)
				? 'probe'
				: SCOPE_RANGE.test(k)
					? 'range'
					: undefined;
	if (!kind) return false;
	if (kind === 'range') return readRangeFact(facts, k, values, lineNo, decimalMark);
	const cells = values.map((v) => v.trim()).filter((v) => v !== '');
	const say = (message: string) =>
		facts.diagnostics.push({ code: 'scope-preamble', message, severity: 'info', line: lineNo });
	if (kind === 'display') {
		say(
			`The preamble's "${k}" (${cells.join(', ')}) is a screen setting; the values in the file are taken as written.`,
		);
		return true;
	}
	cells.forEach((cell, j) => {
		// one value: every channel; several: data column j + 2 (1-based; column 1 is the time)
		const target: CsvChannelOptions = cells.length === 1 ? facts.all : (facts.channels[`col${j + 2}`] ??= {});
		const where = cells.length === 1 ? 'every channel' : `column ${j + 2}`;
		if (kind === 'unit') {
			target.unit = cell;
			say(`The preamble states the unit ${cell} for ${where} ("${k}").`);
			return;
		}
		const q = readQuantity(cell.replace(/^x\s*|\s*x$/gi, ''), decimalMark);
		if (q && /^m?v\/a$/i.test(q.unit)) {
			target.clampMvPerA = /^v\/a$/i.test(q.unit) ? q.value * 1000 : q.value;
			say(
				`The preamble states a clamp of ${target.clampMvPerA} mV/A for ${where} ("${k}"): the values are divided by it and the channel is a current in A.`,
			);
			return;
		}
		const ratio = readRatio(cell.replace(/\s*x$/i, ''), decimalMark);
		if (ratio !== null && ratio > 0) {
			target.probeRatio = ratio;
			say(
				`The preamble states a probe attenuation of ${ratio} for ${where} ("${k}"): the values, read at the scope's input, are multiplied by ${ratio} and the channel is a voltage. If the scope already applied it, give probe ratio 1.`,
			);
		}
	});
	return true;
}

/**
 * A `Vertical Range` / `Input Range` / `Full Scale` row: one range for every channel or one per data column,
 * each as `±4`, `+/-4`, `-4..4` or `-4 to 4` (a unit after the numbers is allowed), in the values as written
 * (before a probe or clamp). A cell read no way is reported and not used.
 */
function readRangeFact(
	facts: PreambleFacts,
	key: string,
	values: string[],
	lineNo: number,
	decimalMark: '.' | ',',
): boolean {
	const cells = values.map((v) => v.trim()).filter((v) => v !== '');
	cells.forEach((cell, j) => {
		const target: CsvChannelOptions = cells.length === 1 ? facts.all : (facts.channels[`col${j + 2}`] ??= {});
		const where = cells.length === 1 ? 'every channel' : `column ${j + 2}`;
		const range = readRange(cell, decimalMark);
		const say = (code: string, message: string, severity: Diagnostic['severity']) =>
			facts.diagnostics.push({ code, message, severity, line: lineNo });
		if (!range) {
			say(
				'range-unreadable',
				`The preamble's "${key}" for ${where} ("${cell}") is not a range like ±4 or -4..4; it is not used, so clipping is judged from the wave's shape.`,
				'warning',
			);
			return;
		}
		target.range = { ...range, source: `the preamble's "${key}"` };
		say(
			'range-in-preamble',
			`The preamble states a range of ${range.min} … ${range.max} for ${where} ("${key}"), in the values as written: flat runs at its limits are taken as clipping.`,
			'info',
		);
	});
	return true;
}

function readRange(cell: string, decimalMark: '.' | ','): { min: number; max: number } | null {
	const pm = /^(?:±|\+\/-|\+-)\s*(.+)$/.exec(cell);
	if (pm) {
		const q = readQuantity(pm[1], decimalMark);
		return q && q.value > 0 ? { min: -q.value, max: q.value } : null;
	}
	const two = /^(.+?)\s*(?:\.\.|…|\bto\b|~)\s*(.+)$/i.exec(cell);
	if (!two) return null;
	const a = readQuantity(two[1], decimalMark);
	const b = readQuantity(two[2], decimalMark);
	return a && b && b.value > a.value ? { min: a.value, max: b.value } : null;
}

/** '200/5', '200:5', 'x10', '10:1', '0,5' -> a number; null when unreadable. */
function readRatio(value: string, decimalMark: '.' | ','): number | null {
	const t = value.trim().replace(/^x\s*/i, '');
	const m = /^([^/:]+?)\s*[/:]\s*([^/:\s]+)/.exec(t);
	if (m) {
		const a = readQuantity(m[1], decimalMark);
		const b = readQuantity(m[2], decimalMark);
		if (a && b && b.value !== 0) return a.value / b.value;
	}
	const q = readQuantity(t, decimalMark);
	return q ? q.value : null;
}

/** 'YYYY-MM-DD hh:mm:ss[.fff]', 'DD.MM.YYYY hh:mm:ss' or 'DD/MM/YYYY ...' -> ISO 8601 (local time), else undefined. */
export function isoOf(text: string): string | undefined {
	const t = text.trim();
	let m =
		/^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})(?:[T\s]+(\d{1,2}):(\d{2})(?::(\d{2})([.,]\d+)?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/.exec(
			t,
		);
	if (!m) {
		const d = /^(\d{1,2})[./](\d{1,2})[./](\d{4})(?:[T\s]+(\d{1,2}):(\d{2})(?::(\d{2})([.,]\d+)?)?)?$/.exec(t);
		if (!d) return undefined;
		m = [d[0], d[3], d[2], d[1], d[4], d[5], d[6], d[7], undefined] as unknown as RegExpExecArray;
	}
	const p = (s: string | undefined, n = 2) => (s ?? '0').padStart(n, '0');
	let iso = `${m[1]}-${p(m[2])}-${p(m[3])}`;
	if (m[4] !== undefined) iso += `T${p(m[4])}:${p(m[5])}:${p(m[6])}${m[7] ? m[7].replace(',', '.') : ''}${m[8] ?? ''}`;
	return iso;
}
