/**
 * Phase rotation (sequence) of a three-phase set, with how clear the verdict is.
 */
import { phasorArgDeg, wrapAngleDeg, type ComplexPhasor } from '../phasor/phasor.js';
import { symmetricalComponents } from '../phasor/sequence.js';

/** Below this |minor|/|major| sequence ratio the rotation is called 'clear' (10 %; our choice, see phaseRotation). */
export const ROTATION_CLEAR_RATIO = 0.1;
/** From this ratio up the rotation is 'undetermined' (70 %; our choice, see phaseRotation). */
export const ROTATION_UNDETERMINED_RATIO = 0.7;

/** Phase rotation verdict. */
export interface PhaseRotation {
	/** 'positive' (L1 → L2 → L3, B lags A by 120°), 'negative' (two phases swapped), or 'undetermined'. */
	rotation: 'positive' | 'negative' | 'undetermined';
	/** 'clear' when the weaker sequence is under 10 % of the stronger, 'probable' under 70 %, else 'doubtful'. */
	clarity: 'clear' | 'probable' | 'doubtful';
	/** |X1| and |X2| of the set (RMS). */
	positiveRms: number;
	negativeRms: number;
	/** min(|X1|, |X2|) / max(|X1|, |X2|): 0 for a perfect set, 1 when no rotation can be told. */
	minorToMajorRatio: number;
	/** ∠Xb − ∠Xa and ∠Xc − ∠Xa, degrees in (−180, 180] (about −120 and +120 for positive rotation). */
	bMinusADeg: number;
	cMinusADeg: number;
	/** One sentence for the user. */
	sentence: string;
}

/**
 * Rotation of phasors (Xa, Xb, Xc) from their sequence components: positive when |X1| > |X2|.
 *
 * Comparing |X1| with |X2| is robust where angle tests fail (a missing or very unbalanced phase).
 * The clarity bands (ratio < 0.1 clear, < 0.7 probable) are our choice: a supply within EN 50160's
 * 2 % negative-sequence limit is always 'clear'; a set with one phase missing (a blown fuse) gives
 * |X2|/|X1| = 0.5 exactly and is still 'probable'; two phases in antiphase (split phase) give 1.
 * Ref: docs/methods.md §7 "Phase rotation" (|V1| ≫ |V2| means ABC) (common practice).
 * @returns 'undetermined' when both sequences are zero or NaN, or the ratio is ≥ 0.7
 * @example phaseRotation(Va, Vb, Vc).rotation // 'positive' for 230∠0°, 220∠−118°, 235∠121°
 */
export function phaseRotation(xa: ComplexPhasor, xb: ComplexPhasor, xc: ComplexPhasor): PhaseRotation {
	const seq = symmetricalComponents(xa, xb, xc);
	const p = seq.positiveRms;
	const n = seq.negativeRms;
	const major = Math.max(p, n);
	const ratio = major > 0 ? Math.min(p, n) / major : NaN;
	const bMinusADeg = wrapAngleDeg(phasorArgDeg(xb) - phasorArgDeg(xa));
	const cMinusADeg = wrapAngleDeg(phasorArgDeg(xc) - phasorArgDeg(xa));
	const clarity: PhaseRotation['clarity'] =
		ratio < ROTATION_CLEAR_RATIO ? 'clear' : ratio < ROTATION_UNDETERMINED_RATIO ? 'probable' : 'doubtful';
	const rotation: PhaseRotation['rotation'] = !(ratio < ROTATION_UNDETERMINED_RATIO)
		? 'undetermined'
		: p > n
			? 'positive'
			: 'negative';
	const pct = (100 * ratio).toFixed(1);
	const sentence =
		rotation === 'undetermined'
			? `phase rotation cannot be told: the weaker sequence is ${Number.isNaN(ratio) ? 'undefined' : `${pct} % of the stronger`}`
			: rotation === 'positive'
				? `positive rotation (phase 2 lags phase 1 by ${(-bMinusADeg).toFixed(1)} deg); negative sequence is ${pct} % of positive (${clarity})`
				: `negative rotation: two phases are swapped (phase 2 leads phase 1 by ${bMinusADeg.toFixed(1)} deg); positive sequence is ${pct} % of negative (${clarity})`;
	return {
		rotation,
		clarity,
		positiveRms: p,
		negativeRms: n,
		minorToMajorRatio: ratio,
		bMinusADeg,
		cMinusADeg,
		sentence,
	};
}
