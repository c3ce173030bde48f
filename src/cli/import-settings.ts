/**
 * The command line's --rate, --scale, --unit and --quantity applied to an import: CSV files take them
 * through the CSV reader's own options (so a unit of mV is normalised to V there, before analysis);
 * WAV and COMTRADE captures get them applied afterwards, each step recorded as a diagnostic and on the
 * channel's scaling, so the report says what was done. A setting naming a channel the file does not
 * have is an error, never ignored.
 */
import type { Capture, Channel } from '../../lib/capture.js';
import type { CsvChannelOptions } from '../../lib/io/csv/index.js';
import type { OpenOptions } from '../../lib/io/open.js';
import { normaliseUnitText } from '../../lib/channel-identity.js';
import type { ImportSettings } from './options.js';

/** Reader options for the settings (the CSV reader takes them all). */
export function importOptionsFrom(s: ImportSettings): OpenOptions {
	const channels: Record<string, CsvChannelOptions> = {};
	const names = new Set([...Object.keys(s.scale), ...Object.keys(s.unit), ...Object.keys(s.quantity)]);
	for (const name of names) {
		const o: CsvChannelOptions = {};
		if (s.scale[name] !== undefined) o.scale = s.scale[name];
		if (s.unit[name] !== undefined) o.unit = s.unit[name];
		if (s.quantity[name] !== undefined) o.quantity = s.quantity[name];
		channels[name] = o;
	}
	const csv: NonNullable<OpenOptions['csv']> = {};
	if (s.sampleRateHz !== undefined) csv.sampleRateHz = s.sampleRateHz;
	if (names.size > 0) csv.channels = channels;
	if (s.delimiter !== undefined) csv.delimiter = s.delimiter;
	if (s.decimalMark !== undefined) csv.decimalMark = s.decimalMark;
	if (s.timeColumn !== undefined) csv.timeColumn = s.timeColumn;
	if (s.timeUnit !== undefined) csv.timeUnit = s.timeUnit;
	return { csv, ...(s.comtradeValues ? { comtrade: { values: s.comtradeValues } } : {}) };
}

function readByCsv(source: string): boolean {
	return !/\.(wav|cfg|cff|dat)$/i.test(source);
}

function channelsNamed(capture: Capture, s: ImportSettings): void {
	const known = new Set(capture.channels.map((c) => c.name));
	for (const [option, map] of [['scale', s.scale], ['unit', s.unit], ['quantity', s.quantity]] as const) {
		for (const name of Object.keys(map)) {
			if (known.has(name) || (readByCsv(capture.source) && /^col\d+$/.test(name))) continue;
			throw new RangeError(`--${option} ${name}=...: ${capture.source} has no channel named ${name} (its channels: ${[...known].join(', ')})`);
		}
	}
}

/**
 * The settings applied to a capture the CSV reader did not read (WAV, COMTRADE); a CSV capture is only
 * checked for channel names. Returns a new capture; the input is not mutated.
 * @throws RangeError when a setting names a channel the capture does not have
 */
export function applyImportSettings(capture: Capture, s: ImportSettings): Capture {
	channelsNamed(capture, s);
	if (readByCsv(capture.source)) return capture;
	const diagnostics = [...capture.diagnostics];
	let sampleRateHz = capture.sampleRateHz;
	if (s.sampleRateHz !== undefined && s.sampleRateHz !== capture.sampleRateHz) {
		if (capture.timeS) throw new RangeError(`--rate: ${capture.source} has an explicit, non-uniform time base; a single rate cannot replace it`);
		diagnostics.push({ code: 'rate-from-user', severity: 'assumption', message: `Sample rate set to ${s.sampleRateHz} Hz by --rate (the file states ${capture.sampleRateHz} Hz).` });
		sampleRateHz = s.sampleRateHz;
	}
	const channels = capture.channels.map((c): Channel => {
		const factor = s.scale[c.name];
		const unitText = s.unit[c.name];
		const quantity = s.quantity[c.name];
		if (factor === undefined && unitText === undefined && quantity === undefined) return c;
		let samples = c.samples;
		let total = factor ?? 1;
		let unit = c.unit;
		let q = c.quantity;
		if (unitText !== undefined) {
			const u = normaliseUnitText(unitText);
			total *= u.factor;
			unit = u.unit;
			if (u.quantity !== 'other') q = u.quantity;
		}
		if (quantity !== undefined) q = quantity;
		if (total !== 1) {
			samples = new Float64Array(c.samples.length);
			for (let i = 0; i < samples.length; i++) samples[i] = total * c.samples[i];
		}
		const before = c.scaling ?? { factor: 1, offset: 0, description: '' };
		const what = [factor !== undefined ? `x ${factor} (--scale)` : '', unitText !== undefined ? `unit ${unitText} (--unit)` : '', quantity !== undefined ? `${quantity} (--quantity)` : ''].filter(Boolean).join(', ');
		diagnostics.push({ code: 'channel-from-user', severity: 'info', message: `Channel ${c.name}: ${what}.` });
		return {
			...c,
			samples,
			unit,
			quantity: q,
			scaling: { factor: before.factor * total, offset: before.offset * total, description: [before.description, what].filter(Boolean).join('; ') },
		};
	});
	return { ...capture, sampleRateHz, channels, diagnostics };
}
