/**
 * Harmonic windows of every channel on the reference channel's cycles: consecutive, gapless windows of
 * `windowCycles` whole cycles (IEC 61000-4-7: 10 at 50 Hz, 12 at 60 Hz), each synchronised to its own
 * measured cycle length, and their aggregate.
 */
import { blockMeans } from '../signal/block-mean.js';
import type { CycleWindow } from '../signal/cycles.js';
import { harmonicWindowCore, type HarmonicWindowCore } from '../spectrum/harmonics.js';
import { aggregateHarmonicWindows, type HarmonicAggregate } from '../spectrum/harmonic-analysis.js';
import type { HarmonicPhasor } from '../spectrum/types.js';

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
	/**
	 * Each window's fundamental (order 1 of lib/spectrum harmonicWindowCore: RMS, phase at the window start),
	 * all the relations read of single windows. The rest of each window (51 orders, 511 bins: about 8 KB)
	 * is let go once the aggregate is made, so a long record's windows do not pile up (6 channels × 2,000
	 * windows would hold ~100 MB).
	 */
	fundamentals: HarmonicPhasor[];
	/**
	 * Aggregate of the windows (lib/spectrum aggregateHarmonicWindows): magnitudes are the RMS of the
	 * window values (IEC 61000-4-30 aggregation), phases the angle of the windows' phasor sum, at the first
	 * window's start, so they compare between channels.
	 */
	aggregate: HarmonicAggregate;
}

/**
 * Rate above which a channel is averaged in blocks of M samples before its harmonic windows: 400 kS/s
 * keeps the averaging's droop (πhfM/fs)²/6 under 1e-4 up to order 50 of 60 Hz, and the DFT of a
 * 10 MS/s record 25 times shorter (time-domain figures still use every sample).
 */
export const HARMONIC_RATE_HZ = 400_000;

/** Every window of one channel, and their aggregate; `onWindow` after each window. `slots` must not be empty. */
export function channelSpectrum(
	samples: Float64Array,
	sampleRateHz: number,
	slots: WindowSlot[],
	maxOrder: number,
	onWindow?: () => void,
): ChannelSpectrum {
	const m = Math.floor(sampleRateHz / HARMONIC_RATE_HZ);
	if (m >= 2) return decimatedSpectrum(samples, sampleRateHz, slots, maxOrder, m, onWindow);
	const windows = slots.map((s) => {
		const w = harmonicWindowCore(samples, sampleRateHz, {
			fundamentalHz: s.fundamentalHz,
			startIndex: s.startIndex,
			cycles: s.cycles,
			maxOrder,
		});
		onWindow?.();
		return w;
	});
	return spectrumOf(windows);
}

/** The aggregate of a channel's windows and each window's fundamental, the windows themselves dropped. */
function spectrumOf(windows: HarmonicWindowCore[]): ChannelSpectrum {
	return { fundamentals: windows.map((w) => w.set.orders[1]), aggregate: aggregateHarmonicWindows(windows) };
}

/**
 * channelSpectrum after averaging blocks of M samples (anti-alias: the average's nulls fall on every
 * multiple of the new rate). Block j stands at (jM + (M − 1)/2): window starts are mapped to that time
 * base and back, so phases refer to the same instants. O(N).
 */
function decimatedSpectrum(
	samples: Float64Array,
	sampleRateHz: number,
	slots: WindowSlot[],
	maxOrder: number,
	m: number,
	onWindow?: () => void,
): ChannelSpectrum {
	const y = blockMeans(samples, m);
	const shift = (m - 1) / 2;
	const windows = slots.map((s) => {
		const w = harmonicWindowCore(y, sampleRateHz / m, {
			fundamentalHz: s.fundamentalHz,
			startIndex: Math.max(0, (s.startIndex - shift) / m),
			cycles: s.cycles,
			maxOrder,
		});
		onWindow?.();
		return { ...w, startIndex: w.startIndex * m + shift, endIndex: w.endIndex * m + shift };
	});
	return spectrumOf(windows);
}
