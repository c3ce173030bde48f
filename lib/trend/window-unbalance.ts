/**
 * Voltage unbalance of one 10/12-cycle window from the fundamental DFT bins of three voltage channels
 * windowed on the same crossings (so their phasors share one time frame).
 */
import { symmetricalComponents } from '../polyphase/sequence.js';

/**
 * u2 = |U2| / |U1| × 100 % of three phasors given as (re, im) pairs in `bins` (channel order), taking the
 * smaller sequence over the larger so that a reversed channel order gives the same figure. NaN when all
 * three are zero. Ref: IEC 61000-4-30:2015, 5.7.2 (from memory); Fortescue (1918); docs/methods.md §7.
 * @example windowUnbalancePercent(binsOf(230∠0°, 220∠−118°, 235∠121°)) // 2.7699 (docs/methods.md §7 check vector)
 */
export function windowUnbalancePercent(bins: Float64Array): number {
	const s = symmetricalComponents(
		{ re: bins[0], im: bins[1] },
		{ re: bins[2], im: bins[3] },
		{ re: bins[4], im: bins[5] },
	);
	const v1 = Math.hypot(s.positive.re, s.positive.im);
	const v2 = Math.hypot(s.negative.re, s.negative.im);
	const hi = Math.max(v1, v2);
	return hi > 0 ? (100 * Math.min(v1, v2)) / hi : NaN;
}
