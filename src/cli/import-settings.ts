/**
 * The command line's import options as lib/io's reader options: --rate, --scale, --probe, --clamp, --unit and --quantity
 * become lib/io's import settings, which lib/io/open.ts applies to every format (CSV while it reads,
 * WAV and COMTRADE afterwards), each step reported as a diagnostic; the CSV layout options go to the CSV
 * reader, --secondary to the COMTRADE reader. A setting naming a channel the file does not have is an
 * ImportError from lib/io, never ignored.
 */
import type { ChannelSettings, ImportSettings as LibImportSettings } from '../../lib/io/import-settings.js';
import type { OpenOptions } from '../../lib/io/open.js';
import type { ImportSettings } from './options.js';

/** Reader options for the command line's settings. */
export function importOptionsFrom(s: ImportSettings): OpenOptions {
	const channels: Record<string, ChannelSettings> = {};
	const probe = s.probe ?? {};
	const clamp = s.clamp ?? {};
	const names = new Set([s.scale, s.unit, s.quantity, probe, clamp].flatMap((m) => Object.keys(m)));
	for (const name of names) {
		const o: ChannelSettings = {};
		if (s.scale[name] !== undefined) o.scale = s.scale[name];
		if (probe[name] !== undefined) o.probeRatio = probe[name];
		if (clamp[name] !== undefined) o.clampMvPerA = clamp[name];
		if (s.unit[name] !== undefined) o.unit = s.unit[name];
		if (s.quantity[name] !== undefined) o.quantity = s.quantity[name];
		channels[name] = o;
	}
	const settings: LibImportSettings = {};
	if (s.sampleRateHz !== undefined) settings.sampleRateHz = s.sampleRateHz;
	if (names.size > 0) settings.channels = channels;
	const csv: NonNullable<OpenOptions['csv']> = {};
	if (s.delimiter !== undefined) csv.delimiter = s.delimiter;
	if (s.decimalMark !== undefined) csv.decimalMark = s.decimalMark;
	if (s.timeColumn !== undefined) csv.timeColumn = s.timeColumn;
	if (s.timeUnit !== undefined) csv.timeUnit = s.timeUnit;
	if (s.gaps) csv.unreadableCells = 'gap';
	return { csv, settings, ...(s.comtradeValues ? { comtrade: { values: s.comtradeValues } } : {}) };
}
