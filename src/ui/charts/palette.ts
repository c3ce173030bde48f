/**
 * Sinecheck's own trace colours: voltages in warm inks, currents in cool inks, others in greys. Traces are
 * also named in the legend and at their level labels, so colour is never the only cue.
 */
import type { Quantity } from '../../../lib/capture.js';

const VOLTAGE = ['#a4372a', '#b86e00', '#7a3f8f', '#8a5a44'];
const CURRENT = ['#1c63a8', '#13806b', '#4b5fc4', '#2f7d9b'];
const OTHER = ['#555555', '#777777', '#333333'];

/** Colour of the k-th channel of a quantity (k counted within that quantity). */
export function traceColour(quantity: Quantity, k: number): string {
	const set = quantity === 'voltage' ? VOLTAGE : quantity === 'current' ? CURRENT : OTHER;
	return set[k % set.length];
}

/** Colours for every channel of a capture, in channel order. */
export function channelColours(channels: readonly { quantity: Quantity }[]): string[] {
	const seen: Record<string, number> = {};
	return channels.map((c) => {
		const k = seen[c.quantity] ?? 0;
		seen[c.quantity] = k + 1;
		return traceColour(c.quantity, k);
	});
}
