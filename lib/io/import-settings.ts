/**
 * Import settings the user states for any format: a sample rate, and per channel a scale, unit, quantity
 * and measuring chain (probe, clamp, shunt, CT, VT). lib/io/open.ts hands them to the CSV reader (which
 * applies them while it reads, so a unit of mV is normalised there) and applies them here to a WAV or
 * COMTRADE capture after reading. Every applied setting becomes a diagnostic and goes on the channel's
 * scaling; a setting naming a channel the capture does not have is an error, never ignored.
 */
import { scaleRange, type Capture, type Channel, type Diagnostic, type Quantity } from '../capture.js';
import { normaliseUnitText } from '../channel-identity.js';
import type { CsvChannelOptions } from './csv/types.js';
import { ImportError } from './import-error.js';

/** One channel's settings: the CSV reader's per-channel options without the rename. */
export type ChannelSettings = Omit<CsvChannelOptions, 'name'>;

/** Settings for every format, keyed by channel name (`col<N>` too for a CSV file without names). */
export interface ImportSettings {
	/** Sample rate in Hz, for a file without a time base (or to replace a WAV/COMTRADE rate). */
	sampleRateHz?: number;
	channels?: Record<string, ChannelSettings>;
}

/** True when the settings would change anything. */
export function hasImportSettings(s: ImportSettings | undefined): boolean {
	return s !== undefined && (s.sampleRateHz !== undefined || Object.keys(s.channels ?? {}).length > 0);
}

/**
 * What a channel's settings do, in apply order: scale and offset, the unit's prefix, probe/VT/CT ratio,
 * clamp (1000 / (mV/A): A per V) or shunt (1 / R, Ohm's law). Ratios are primary/secondary (common practice).
 */
export function settingsChain(s: ChannelSettings): {
	factor: number;
	offset: number;
	unit?: string;
	quantity?: Quantity;
	steps: string[];
} {
	let factor = s.scale ?? 1;
	let offset = s.offset ?? 0;
	const steps: string[] = [];
	let unit: string | undefined;
	let quantity: Quantity | undefined;
	if (s.scale !== undefined || s.offset !== undefined) steps.push(`x ${factor}${offset ? ` + ${offset}` : ''}`);
	if (s.unit !== undefined) {
		const u = normaliseUnitText(s.unit);
		factor *= u.factor;
		offset *= u.factor;
		unit = u.unit;
		if (u.quantity !== 'other') quantity = u.quantity;
		steps.push(`unit ${s.unit}${u.factor !== 1 ? ` (x ${u.factor} to ${u.unit})` : ''}`);
	}
	const ratio = (r: number | undefined, what: string) => {
		if (r === undefined) return;
		factor *= r;
		offset *= r;
		steps.push(`${what} x ${r}`);
	};
	ratio(s.probeRatio, 'probe');
	ratio(s.vtRatio, 'VT ratio');
	ratio(s.ctRatio, 'CT ratio');
	if (s.clampMvPerA !== undefined) {
		ratio(1000 / s.clampMvPerA, `clamp ${s.clampMvPerA} mV/A:`);
		[unit, quantity] = ['A', 'current'];
	}
	if (s.shuntOhms !== undefined) {
		ratio(1 / s.shuntOhms, `shunt ${s.shuntOhms} ohm:`);
		[unit, quantity] = ['A', 'current'];
	}
	// a voltage probe or VT ratio makes a voltage, a CT a current (a clamp or shunt did so above), as in the CSV reader
	if (s.clampMvPerA === undefined && s.shuntOhms === undefined) {
		if ((s.probeRatio !== undefined || s.vtRatio !== undefined) && s.ctRatio === undefined) {
			[unit, quantity] = ['V', 'voltage'];
		} else if (s.ctRatio !== undefined && s.probeRatio === undefined && s.vtRatio === undefined) {
			[unit, quantity] = ['A', 'current'];
		}
	}
	if (s.quantity !== undefined) {
		quantity = s.quantity;
		steps.push(`measures ${s.quantity}`);
	}
	return {
		factor,
		offset,
		...(unit !== undefined ? { unit } : {}),
		...(quantity !== undefined ? { quantity } : {}),
		steps,
	};
}

/** Throws when a setting names a channel the capture does not have (CSV captures also take `col<N>`). */
export function checkSettingNames(capture: Capture, s: ImportSettings): void {
	const known = new Set(capture.channels.map((c) => c.name));
	for (const name of Object.keys(s.channels ?? {})) {
		if (known.has(name) || (capture.format === 'csv' && /^col\d+$/.test(name))) continue;
		throw new ImportError(
			capture.source,
			0,
			0,
			'bad-option',
			`settings for channel ${name}`,
			`a channel this file has (${[...known].join(', ')})`,
		);
	}
}

function applyToChannel(c: Channel, s: ChannelSettings, diagnostics: Diagnostic[]): Channel {
	const chain = settingsChain(s);
	let unit = chain.unit ?? c.unit;
	const quantity = chain.quantity ?? c.quantity;
	if (unit === '' && quantity === 'voltage') unit = 'V';
	if (unit === '' && quantity === 'current') unit = 'A';
	let samples = c.samples;
	if (chain.factor !== 1 || chain.offset !== 0) {
		samples = new Float64Array(c.samples.length);
		for (let i = 0; i < samples.length; i++) samples[i] = chain.factor * c.samples[i] + chain.offset;
	}
	const what = chain.steps.join(', ');
	diagnostics.push({
		code: 'channel-from-user',
		severity: 'info',
		message: `Channel ${c.name}: ${what} (set by the user); now in ${unit || 'no unit'}, measures ${quantity}.`,
	});
	const before = c.scaling ?? { factor: 1, offset: 0, description: '' };
	const scaling = {
		factor: before.factor * chain.factor,
		offset: before.offset * chain.factor + chain.offset,
		description: [before.description, what].filter(Boolean).join('; '),
	};
	const range = c.range ? { range: scaleRange(c.range, chain.factor, chain.offset) } : {};
	return { ...c, samples, unit, quantity, scaling, ...range };
}

/**
 * The settings applied to a capture its reader did not apply them to (WAV, COMTRADE): returns a new
 * capture (the input is not mutated). A CSV capture is only checked for names: the CSV reader applied them.
 * @throws ImportError 'bad-option' for a setting naming a channel the capture does not have, or a rate
 *   for a capture with an explicit, non-uniform time base
 * @example applyImportSettings(wavCapture, { channels: { ch1: { scale: 400, unit: 'V' } } }).channels[0].unit // 'V'
 */
export function applyImportSettings(capture: Capture, s: ImportSettings): Capture {
	checkSettingNames(capture, s);
	if (capture.format === 'csv' || !hasImportSettings(s)) return capture;
	const diagnostics = [...capture.diagnostics];
	let sampleRateHz = capture.sampleRateHz;
	if (s.sampleRateHz !== undefined && s.sampleRateHz !== capture.sampleRateHz) {
		if (capture.timeS)
			throw new ImportError(
				capture.source,
				0,
				0,
				'bad-option',
				`rate ${s.sampleRateHz} Hz`,
				'no sample rate: this file has an explicit, non-uniform time base a single rate cannot replace',
			);
		diagnostics.push({
			code: 'rate-from-user',
			severity: 'assumption',
			message: `Sample rate set to ${s.sampleRateHz} Hz by the user (the file states ${capture.sampleRateHz} Hz).`,
		});
		sampleRateHz = s.sampleRateHz;
	}
	const channels = capture.channels.map((c) => {
		const cs = s.channels?.[c.name];
		return cs && Object.keys(cs).length > 0 ? applyToChannel(c, cs, diagnostics) : c;
	});
	return { ...capture, sampleRateHz, channels, diagnostics };
}
