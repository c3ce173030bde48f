/**
 * What the streaming trend analyser accepts: bounds on the sample rate and on the memory its per-channel
 * ring buffers take, checked before any sample is read, so a corrupt header or time column (a rate of
 * 1e-300 Hz, time stamps a million seconds apart, 100,000 columns) is refused with a sentence instead of a
 * loop that never ends or memory that runs out.
 */

/** Highest power frequency the crossing tracker follows, Hz (crossing-tracker.ts). */
const MAX_TRACKED_HZ = 72;

/**
 * Lowest sample rate: 4 samples per cycle at the highest tracked frequency (72 Hz), so every half cycle
 * holds at least two samples to place a zero crossing between (common practice: well above the Nyquist
 * rate of the fundamental).
 */
export const TREND_MIN_SAMPLE_RATE_HZ = 4 * MAX_TRACKED_HZ;

/** Highest sample rate: 10 MS/s, beyond any mains recorder (the ring buffers hold 0.5 s per channel). */
export const TREND_MAX_SAMPLE_RATE_HZ = 10e6;

/** Most channels in one run: every channel keeps its own ring buffer and running sums. */
export const TREND_MAX_CHANNELS = 1024;

/** Memory the ring buffers (channels × at least 0.5 s of 8-byte samples) may take together. */
export const TREND_RING_BUDGET_BYTES = 256 * 2 ** 20;

/** Ring buffer length in samples for `sampleRateHz`: a power of two holding 0.5 s plus one block and a margin. */
export function trendRingLength(sampleRateHz: number, blockSamples: number): number {
	let n = 1;
	while (n < Math.ceil(0.5 * sampleRateHz) + blockSamples + 16) n *= 2;
	return n;
}

/** Which bound a recording breaks, for the importer's error ('sample-rate' or 'channels'). */
export interface TrendLimitProblem {
	what: 'sample-rate' | 'channels';
	/** What was expected, in words, naming the limit. */
	expected: string;
	/** The offending value as text. */
	got: string;
}

/**
 * The first bound that a recording of `channelCount` channels at `sampleRateHz` breaks, or undefined when
 * the analyser can take it.
 * Ref: common practice (sampling well above twice the power frequency)
 * @example trendLimitProblem(1e-300, 3) // { what: 'sample-rate', expected: 'a sample rate from 288 Hz to 10000000 Hz', got: '1e-300 Hz' }
 */
export function trendLimitProblem(
	sampleRateHz: number,
	channelCount: number,
	blockSamples = 4096,
): TrendLimitProblem | undefined {
	if (!(
		Number.isFinite(sampleRateHz) &&
		sampleRateHz >= TREND_MIN_SAMPLE_RATE_HZ &&
		sampleRateHz <= TREND_MAX_SAMPLE_RATE_HZ
	)) {
		return {
			what: 'sample-rate',
			expected: `a sample rate from ${TREND_MIN_SAMPLE_RATE_HZ} Hz to ${TREND_MAX_SAMPLE_RATE_HZ} Hz (at least 4 samples per cycle of the power frequency)`,
			got: `${Number(sampleRateHz.toPrecision(6))} Hz`,
		};
	}
	if (!(Number.isInteger(channelCount) && channelCount >= 1 && channelCount <= TREND_MAX_CHANNELS)) {
		return {
			what: 'channels',
			expected: `1 to ${TREND_MAX_CHANNELS} channels in one recording (split the file to trend more)`,
			got: `${channelCount} channels`,
		};
	}
	const bytes = channelCount * trendRingLength(sampleRateHz, blockSamples) * 8;
	if (bytes > TREND_RING_BUDGET_BYTES) {
		const maxCh = Math.floor(TREND_RING_BUDGET_BYTES / (trendRingLength(sampleRateHz, blockSamples) * 8));
		return {
			what: 'channels',
			expected: `at most ${maxCh} channels at ${sampleRateHz} Hz (each keeps half a second of samples; ${TREND_RING_BUDGET_BYTES / 2 ** 20} MB in all)`,
			got: `${channelCount} channels`,
		};
	}
	return undefined;
}
