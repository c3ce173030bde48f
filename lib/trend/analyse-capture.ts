/**
 * Whole-capture convenience over the streaming analyser: feeds a Capture through
 * `createTrendAnalyser` in chunks and returns its result, with the capture's own diagnostics first.
 */
import type { Capture } from '../capture.js';
import { createTrendAnalyser } from './analyser.js';
import type { TrendOptions, TrendResult } from './types.js';

/** Samples per channel per push: small enough to stay in cache, large enough to amortise the calls. */
const CHUNK = 65_536;

/**
 * Per-cycle trends and voltage events of a capture held in memory.
 *
 * @param capture  uniformly sampled capture (an explicit `timeS` is treated as uniform at the mean rate,
 *   reported as a diagnostic)
 * @param opts  as for `createTrendAnalyser`, minus what the capture says (rate, channels; nominal
 *   frequency from `capture.nominalFrequencyHz` when it is 50 or 60 and none is given)
 * @example analyseTrend(capture, { declaredV: 230 }).events // [{ kind: 'dip', channels: ['L2'], ... }]
 */
export function analyseTrend(
	capture: Capture,
	opts: Omit<TrendOptions, 'sampleRateHz' | 'channels'> = {},
): TrendResult {
	const nominal =
		opts.nominalHz ??
		(capture.nominalFrequencyHz === 50 || capture.nominalFrequencyHz === 60 ? capture.nominalFrequencyHz : undefined);
	const analyser = createTrendAnalyser({
		...opts,
		nominalHz: nominal,
		sampleRateHz: capture.sampleRateHz,
		channels: capture.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
	});
	const n = capture.channels[0]?.samples.length ?? 0;
	for (let off = 0; off < n; off += CHUNK) {
		const end = Math.min(n, off + CHUNK);
		analyser.push(capture.channels.map((c) => c.samples.subarray(off, end)));
	}
	const result = analyser.finish();
	const extra = capture.timeS
		? [
				{
					code: 'time-base-treated-uniform',
					severity: 'warning' as const,
					message: `The capture has an explicit time base; trends treat it as uniform at its mean rate ${capture.sampleRateHz} Hz.`,
				},
			]
		: [];
	result.diagnostics = [...extra, ...result.diagnostics];
	return result;
}
