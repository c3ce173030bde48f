/**
 * Per-channel scale the user states for the acquisition chain, turned into the factor that multiplies the
 * recorded values: engineering value = factor · recorded value. The importer applies it (see
 * toCsvChannelOptions) and records it on the channel (Channel.scaling), so the report shows it.
 */

import type { CsvChannelOptions } from '../../lib/io/csv/types.js';

export type ScaleKind = 'none' | 'probe' | 'clamp-mv-per-a' | 'shunt-ohm' | 'ct' | 'vt' | 'factor';

export interface ChannelScale {
	kind: ScaleKind;
	/** probe: attenuation (10 for ×10); clamp: mV per A; shunt: Ω; factor: plain multiplier. */
	value?: number;
	/** CT/VT: primary rating (A or V). */
	primary?: number;
	/** CT/VT: secondary rating (A or V). */
	secondary?: number;
}

/** Unit the scaled channel ends up in, or undefined when the scale does not change it. */
export function scaledUnit(scale: ChannelScale): 'V' | 'A' | undefined {
	switch (scale.kind) {
		case 'clamp-mv-per-a':
		case 'shunt-ohm':
		case 'ct':
			return 'A';
		case 'vt':
			return 'V';
		default:
			return undefined;
	}
}

/**
 * The multiplier for a stated acquisition chain.
 * - probe ×k (a passive divider probe read as 1:1): factor k (common practice).
 * - current clamp with a voltage output of s mV/A: I = U / (s · 10⁻³ V/A), factor 1000 / s.
 * - shunt of R Ω: I = U / R (Ohm's law), factor 1 / R.
 * - CT or VT primary/secondary (e.g. 200/5 A): factor primary / secondary (common practice: the rated ratio).
 * @returns the factor, or NaN when a value is missing, zero, negative or not finite
 * @example scaleFactor({ kind: 'clamp-mv-per-a', value: 10 }) // 100 (A per V)
 */
export function scaleFactor(scale: ChannelScale): number {
	const ok = (x: number | undefined): x is number => x !== undefined && Number.isFinite(x) && x > 0;
	switch (scale.kind) {
		case 'none':
			return 1;
		case 'probe':
		case 'factor':
			return ok(scale.value) ? scale.value : NaN;
		case 'clamp-mv-per-a':
			return ok(scale.value) ? 1000 / scale.value : NaN;
		case 'shunt-ohm':
			return ok(scale.value) ? 1 / scale.value : NaN;
		case 'ct':
		case 'vt':
			return ok(scale.primary) && ok(scale.secondary) ? scale.primary / scale.secondary : NaN;
	}
}

/** A short description for the report: "clamp 10 mV/A (×100)". */
export function describeScale(scale: ChannelScale): string {
	const f = scaleFactor(scale);
	switch (scale.kind) {
		case 'none':
			return 'as recorded';
		case 'probe':
			return `probe ×${scale.value} (×${f})`;
		case 'factor':
			return `factor ×${f}`;
		case 'clamp-mv-per-a':
			return `clamp ${scale.value} mV/A (×${f})`;
		case 'shunt-ohm':
			return `shunt ${scale.value} Ω (×${f})`;
		case 'ct':
			return `CT ${scale.primary}/${scale.secondary} A (×${f})`;
		case 'vt':
			return `VT ${scale.primary}/${scale.secondary} V (×${f})`;
	}
}

/**
 * The CSV importer's per-channel options for a stated chain (lib/io/csv applies them and reports them):
 * probe → probeRatio, clamp → clampMvPerA, shunt → shuntOhms, CT/VT → ctRatio/vtRatio, factor → scale.
 * @returns {} for 'none' or an incomplete entry (nothing is assumed)
 */
export function toCsvChannelOptions(scale: ChannelScale): CsvChannelOptions {
	if (!Number.isFinite(scaleFactor(scale))) return {};
	switch (scale.kind) {
		case 'probe':
			return { probeRatio: scale.value };
		case 'clamp-mv-per-a':
			return { clampMvPerA: scale.value };
		case 'shunt-ohm':
			return { shuntOhms: scale.value };
		case 'ct':
			return { ctRatio: scaleFactor(scale) };
		case 'vt':
			return { vtRatio: scaleFactor(scale) };
		case 'factor':
			return { scale: scale.value };
		default:
			return {};
	}
}
