/**
 * The code step of a digitised channel (the spacing of the values its converter can give), the effective
 * resolution the record uses and the noise floor that rounding to that step implies.
 */

/** What the code step of a channel implies; every value in the channel's unit. */
export interface ChannelResolution {
	/** Spacing q of the values: every sample is offset + k·q for a whole k. */
	codeStep: number;
	/** Codes spanned by the record, (max − min)/q + 1, and that as bits: log2(codes). */
	codesUsed: number;
	bitsUsed: number;
	/** RMS of the rounding error, q/√12 (uniform rounding error). */
	noiseRms: number;
	/**
	 * Smallest harmonic RMS told apart from rounding: q/√12, the whole rounding error as if it all sat at
	 * one order (a conservative floor: rounding a periodic wave puts its error on harmonics of the wave).
	 */
	harmonicFloorRms: number;
}

/** Share of samples that must sit on the grid offset + k·q (within 1 % of q) for q to count as the code step. */
const ON_GRID_SHARE = 0.999;
/** At most this many codes in the record for a code step to be reported (beyond ~20 bits rounding is not what limits a reading). */
const MAX_CODES = 1 << 20;

/**
 * Finds q as the smallest non-zero difference between neighbouring samples, then checks that the samples
 * lie on the grid min + k·q (99.9 % of them within 1 % of q). Two passes, O(N), no allocation.
 *
 * Ref: uniform quantisation noise q²/12, Widrow & Kollár, Quantization Noise (Cambridge 2008), ch. 4
 * (from memory); the floor choice is ours (see `harmonicFloorRms`).
 * @param samples  the channel in its unit, after any scaling (a probe ratio scales q with it)
 * @returns the resolution, or undefined when the values show no common step (a float record, noise)
 * @example channelResolution(8-bit scope channel on ±4 V through a x100 probe)
 *   // { codeStep: 3.125, codesUsed: 209, bitsUsed: 7.7, noiseRms: 0.902, harmonicFloorRms: 0.902 }
 */
export function channelResolution(samples: Float64Array): ChannelResolution | undefined {
	const n = samples.length;
	if (n < 3) return undefined;
	let step = Infinity;
	let min = Infinity;
	let max = -Infinity;
	for (let i = 0; i < n; i++) {
		const x = samples[i];
		if (!Number.isFinite(x)) return undefined;
		if (x < min) min = x;
		if (x > max) max = x;
		if (i > 0) {
			const d = Math.abs(x - samples[i - 1]);
			if (d > 0 && d < step) step = d;
		}
	}
	if (!(step < Infinity) || !(max > min)) return undefined;
	const codes = Math.round((max - min) / step) + 1;
	if (codes > MAX_CODES) return undefined;
	let off = 0;
	for (let i = 0; i < n; i++) {
		const k = (samples[i] - min) / step;
		if (Math.abs(k - Math.round(k)) > 0.01) off++;
	}
	if (off > (1 - ON_GRID_SHARE) * n) return undefined;
	const noiseRms = step / Math.sqrt(12);
	return { codeStep: step, codesUsed: codes, bitsUsed: Math.log2(codes), noiseRms, harmonicFloorRms: noiseRms };
}
