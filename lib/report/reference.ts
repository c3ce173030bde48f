/**
 * The reference channel and its whole-cycle window: measured once per capture, then every channel is
 * analysed on that same window so phases, power and sequence components compare sample for sample.
 */
import type { Capture, Channel } from '../capture.js';
import { findWholeCycles, type CycleWindow } from '../signal/cycles.js';

export interface ReferenceChoice {
	/** Index of the reference channel in capture.channels, or -1 when the capture has no channels. */
	index: number;
	/** Its whole-cycle window, or undefined when no channel shows a periodic fundamental. */
	window?: CycleWindow;
	/** Why no window, when there is none (the last failure met). */
	failure?: string;
	/** Sentences for the report's assumptions. */
	assumptions: string[];
}

function candidates(channels: Channel[]): number[] {
	const order = (q: string) => channels.map((c, i) => (c.quantity === q ? i : -1)).filter((i) => i >= 0);
	return [...order('voltage'), ...order('current'), ...order('other')];
}

/**
 * Picks the reference: `refChannel` when given (RangeError when the capture has no such channel),
 * else the first voltage channel, else the first current channel, else the first channel. When the
 * default choice shows no periodic fundamental (a dead phase, a DC channel) the next candidate is
 * tried, and the report says so.
 * @param nominalHz  narrows the frequency search (0.7…1.3 × nominal); undefined = search 50/60 Hz mains and beyond
 */
export function chooseReference(
	capture: Capture,
	refChannel: string | undefined,
	nominalHz: number | undefined,
): ReferenceChoice {
	const channels = capture.channels;
	const assumptions: string[] = [];
	if (channels.length === 0) return { index: -1, failure: 'The capture has no analogue channels.', assumptions };
	const opts = nominalHz !== undefined ? { nominalHz, toRecordEnd: true } : { toRecordEnd: true };
	if (refChannel !== undefined) {
		const index = channels.findIndex((c) => c.name === refChannel);
		if (index < 0) {
			throw new RangeError(
				`${capture.source}: reference channel "${refChannel}" not found; the channels are ${channels.map((c) => c.name).join(', ')}`,
			);
		}
		const found = findWholeCycles(channels[index].samples, capture.sampleRateHz, opts);
		if (found.ok)
			return { index, window: found, assumptions: [`Reference channel ${refChannel} (chosen by the user).`] };
		return {
			index,
			failure: `${refChannel}: ${found.message}`,
			assumptions: [`Reference channel ${refChannel} (chosen by the user).`],
		};
	}
	const order = candidates(channels);
	let failure = '';
	for (let k = 0; k < order.length; k++) {
		const c = channels[order[k]];
		const found = findWholeCycles(c.samples, capture.sampleRateHz, opts);
		if (found.ok) {
			const why =
				k === 0
					? `the first ${c.quantity === 'other' ? '' : `${c.quantity} `}channel`
					: `the first channel with a periodic fundamental (${failure})`;
			assumptions.push(`Reference channel ${c.name}: ${why}; every channel is analysed on its whole cycles.`);
			return { index: order[k], window: found, assumptions };
		}
		failure = failure ? failure : `${c.name}: ${found.message}`;
		// every channel has the same length: one too short for two cycles means all are (another channel's
		// harmonic could otherwise pass for a fundamental); the short-record fit takes over
		if (found.code === 'too-short') break;
	}
	return {
		index: order[0],
		failure,
		assumptions: [`Reference channel ${channels[order[0]].name}: the first ${channels[order[0]].quantity} channel.`],
	};
}
