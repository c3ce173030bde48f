/**
 * Two cursors on the wave plot: the time and value of every channel at each, and the differences between
 * them. The phase difference is the time difference as a share of the fundamental period:
 * Δφ = 360° · f · Δt, wrapped to (−180°, 180°] (a closed-form identity for a periodic signal of frequency f).
 */
import { timeAt, type TimeBase } from './decimate.js';

export interface CursorReading {
	/** Sample times at cursor A and B (s, on the plot's time axis). */
	aS: number;
	bS: number;
	/** B − A, s. */
	deltaS: number;
	/** 360 · f · Δt wrapped to (−180, 180] degrees; NaN without a frequency. */
	phaseDeg: number;
	/** Per channel: value at A, at B, and B − A. */
	values: { a: number; b: number; delta: number }[];
}

/** Wraps an angle to (−180°, 180°]. */
export function wrapDeg(deg: number): number {
	const w = deg - 360 * Math.floor((deg + 180) / 360);
	return w === -180 ? 180 : w;
}

/**
 * Reading of two cursors at sample indices iA and iB.
 * @example a 50 Hz sine, cursors 5 ms apart: phaseDeg 90
 */
export function cursorReading(
	channels: readonly Float64Array[],
	base: TimeBase,
	iA: number,
	iB: number,
	frequencyHz: number,
): CursorReading {
	const aS = timeAt(base, iA);
	const bS = timeAt(base, iB);
	const deltaS = bS - aS;
	return {
		aS,
		bS,
		deltaS,
		phaseDeg: Number.isFinite(frequencyHz) && frequencyHz > 0 ? wrapDeg(360 * frequencyHz * deltaS) : NaN,
		values: channels.map((c) => ({ a: c[iA], b: c[iB], delta: c[iB] - c[iA] })),
	};
}
