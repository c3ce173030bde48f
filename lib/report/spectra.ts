/**
 * Harmonic windows of every channel on the reference channel's cycles: consecutive, gapless windows of
 * `windowCycles` whole cycles (IEC 61000-4-7: 10 at 50 Hz, 12 at 60 Hz), each synchronised to its own
 * measured cycle length, and their aggregate.
 */
import type { CycleWindow } from '../signal/cycles.js';
import { harmonicWindow } from '../spectrum/harmonics.js';
import { aggregateHarmonicWindows, type HarmonicAggregate } from '../spectrum/harmonic-analysis.js';
import type { HarmonicWindow } from '../spectrum/types.js';

/** Where each harmonic window sits: start (fractional sample index), cycles and the cycle-synchronous fundamental. */
export interface WindowSlot {
	startIndex: number;
	cycles: number;
	fundamentalHz: number;
}

/**
 * Consecutive windows of `windowCycles` cycles from the reference crossings; one shorter window of every
 * whole cycle there is when the span holds fewer than `windowCycles`.
 */
export function planWindows(window: CycleWindow, sampleRateHz: number, windowCycles: number): WindowSlot[] {
	const c = window.cycles >= windowCycles ? windowCycles : window.cycles;
	const count = Math.floor(window.cycles / c);
	const slots: WindowSlot[] = [];
	for (let w = 0; w < count; w++) {
		const s = window.crossings[w * c];
		const e = window.crossings[(w + 1) * c];
		slots.push({ startIndex: s, cycles: c, fundamentalHz: (c * sampleRateHz) / (e - s) });
	}
	return slots;
}

export interface ChannelSpectrum {
	windows: HarmonicWindow[];
	/**
	 * Aggregate of the windows (lib/spectrum aggregateHarmonicWindows): magnitudes are the RMS of the
	 * window values (IEC 61000-4-30 aggregation), phases the angle of the windows' phasor sum, at the first
	 * window's start, so they compare between channels.
	 */
	aggregate: HarmonicAggregate;
}

/** Every window of one channel, and their aggregate. `slots` must not be empty. */
export function channelSpectrum(samples: Float64Array, sampleRateHz: number, slots: WindowSlot[], maxOrder: number): ChannelSpectrum {
	const windows = slots.map((s) => harmonicWindow(samples, sampleRateHz, { fundamentalHz: s.fundamentalHz, startIndex: s.startIndex, cycles: s.cycles, maxOrder }));
	return { windows, aggregate: aggregateHarmonicWindows(windows) };
}
