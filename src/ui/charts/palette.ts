/**
 * Sinecheck's own trace colours: voltages in warm inks, currents in cool inks (no two of them blue), others in
 * greys. Every colour reaches 4.5:1 on white, so the 11 px phasor labels drawn in it are readable (WCAG 2.x AA;
 * tests/ui/contrast.test.ts). Colour is never the only cue: each quantity also has its own line pattern
 * (`traceDash`) and every trace is named in the legend.
 */
import type { Quantity } from '../../../lib/capture.js';

const VOLTAGE = ['#a12a1e', '#7a4d00', '#6a2e8a', '#6e4433'];
const CURRENT = ['#0d5c8a', '#0b6b4f', '#4b3fa6', '#5a6300'];
const OTHER = ['#555555', '#666666', '#333333'];

/** Line pattern per quantity in CSS pixels (canvas setLineDash / SVG stroke-dasharray): voltage solid, current dashed, other dotted. */
export function traceDash(quantity: Quantity): number[] {
	return quantity === 'voltage' ? [] : quantity === 'current' ? [7, 3] : [2, 3];
}

/** Every trace colour (for the contrast check). */
export const TRACE_COLOURS: readonly string[] = [...VOLTAGE, ...CURRENT, ...OTHER];

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
