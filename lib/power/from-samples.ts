/**
 * Sample-level base of lib/polyphase's threePhaseFromSamples: find the whole cycles of the reference channel
 * (lib/signal) and analyse each channel on that same window (lib/spectrum). Pairs of channels are analysed
 * by the report (lib/report/relations.ts) from its own windows.
 */
import { MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import { findWholeCycles } from '../signal/cycles.js';
import { harmonicWindow } from '../spectrum/harmonics.js';
import type { HarmonicSet } from '../spectrum/types.js';
import type { PowerSampleWindow } from './sample-span.js';

/** Why a sample-level analysis could not run (no whole cycles in the reference channel, ...). */
export interface PowerSampleFailure {
	ok: false;
	code: string;
	message: string;
}

/** The window every channel was analysed on: whole cycles of the reference channel's fundamental. */
export interface AnalysedWindow extends PowerSampleWindow {
	frequencyHz: number;
}

/** Options shared by the sample-level entry points. */
export interface FromSamplesOptions {
	/** Nominal system frequency, Hz (narrows the fundamental search). */
	nominalHz?: number;
	/** Use at most this many whole cycles from the start (default: all of them). */
	maxCycles?: number;
	/** Highest harmonic order analysed (default 50). */
	maxOrder?: number;
}

/**
 * Whole-cycle window of `reference`, and each channel's harmonic set on exactly that window.
 * @returns the window and sets, or a failure from findWholeCycles (code and message passed through)
 */
export function harmonicSetsOnReferenceWindow(
	reference: Float64Array,
	channels: readonly Float64Array[],
	sampleRateHz: number,
	opts: FromSamplesOptions = {},
): { ok: true; window: AnalysedWindow; sets: HarmonicSet[] } | PowerSampleFailure {
	for (const c of channels)
		if (c.length !== reference.length)
			throw new RangeError(`channels differ in length: ${c.length} vs ${reference.length} samples`);
	const w = findWholeCycles(reference, sampleRateHz, {
		...(opts.nominalHz ? { nominalHz: opts.nominalHz } : {}),
		...(opts.maxCycles ? { maxCycles: opts.maxCycles } : {}),
	});
	if (!w.ok) return { ok: false, code: w.code, message: w.message };
	const span: AnalysedWindow = {
		startIndex: w.startIndex,
		endIndex: w.endIndex,
		cycles: w.cycles,
		frequencyHz: w.frequencyHz,
	};
	const sets = channels.map(
		(c) =>
			harmonicWindow(c, sampleRateHz, {
				fundamentalHz: span.frequencyHz,
				startIndex: span.startIndex,
				cycles: span.cycles,
				maxOrder: opts.maxOrder ?? MAX_HARMONIC_ORDER,
			}).set,
	);
	return { ok: true, window: span, sets };
}
