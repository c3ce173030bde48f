/**
 * Symmetrical components (Fortescue) of a three-phase set of phasors.
 */
import { phasorAbs, phasorAdd, phasorArgDeg, phasorMul, phasorScale, type ComplexPhasor } from './phasor.js';

/** The operator a = e^{j120°} = −1/2 + j√3/2. */
export const FORTESCUE_A: ComplexPhasor = { re: -0.5, im: Math.sqrt(3) / 2 };
const A2: ComplexPhasor = { re: -0.5, im: -Math.sqrt(3) / 2 };

/** Zero, positive and negative sequence phasors, same unit as the inputs (RMS). */
export interface SequenceComponents {
	zero: ComplexPhasor;
	positive: ComplexPhasor;
	negative: ComplexPhasor;
	/** |X0|, |X1|, |X2| (RMS). */
	zeroRms: number;
	positiveRms: number;
	negativeRms: number;
	/** ∠X1 and ∠X2, degrees in (−180, 180] (NaN for a zero component). */
	positivePhaseDeg: number;
	negativePhaseDeg: number;
}

/**
 * Symmetrical components of phasors (Xa, Xb, Xc) in that phase order.
 *
 * X0 = (Xa + Xb + Xc)/3;  X1 = (Xa + a·Xb + a²·Xc)/3;  X2 = (Xa + a²·Xb + a·Xc)/3,  a = e^{j120°}
 *
 * Ref: C. L. Fortescue, "Method of symmetrical co-ordinates applied to the solution of polyphase networks",
 * AIEE Trans. 37 (1918) 1027–1140 (from memory); formulas as in docs/methods.md §7.
 * @example symmetricalComponents(phasorFromPolarDeg(230, 0), phasorFromPolarDeg(230, -120), phasorFromPolarDeg(230, 120)).positiveRms // 230
 */
export function symmetricalComponents(xa: ComplexPhasor, xb: ComplexPhasor, xc: ComplexPhasor): SequenceComponents {
	const zero = phasorScale(phasorAdd(phasorAdd(xa, xb), xc), 1 / 3);
	const positive = phasorScale(phasorAdd(phasorAdd(xa, phasorMul(FORTESCUE_A, xb)), phasorMul(A2, xc)), 1 / 3);
	const negative = phasorScale(phasorAdd(phasorAdd(xa, phasorMul(A2, xb)), phasorMul(FORTESCUE_A, xc)), 1 / 3);
	return {
		zero,
		positive,
		negative,
		zeroRms: phasorAbs(zero),
		positiveRms: phasorAbs(positive),
		negativeRms: phasorAbs(negative),
		positivePhaseDeg: phasorArgDeg(positive),
		negativePhaseDeg: phasorArgDeg(negative),
	};
}

/**
 * Phase phasors from sequence components (the inverse transform).
 *
 * Xa = X0 + X1 + X2;  Xb = X0 + a²·X1 + a·X2;  Xc = X0 + a·X1 + a²·X2
 *
 * Ref: as symmetricalComponents.
 * @example phasesFromSequence({re:0,im:0}, {re:230,im:0}, {re:0,im:0})[1] // 230∠−120°
 */
export function phasesFromSequence(
	zero: ComplexPhasor,
	positive: ComplexPhasor,
	negative: ComplexPhasor,
): [ComplexPhasor, ComplexPhasor, ComplexPhasor] {
	return [
		phasorAdd(phasorAdd(zero, positive), negative),
		phasorAdd(phasorAdd(zero, phasorMul(A2, positive)), phasorMul(FORTESCUE_A, negative)),
		phasorAdd(phasorAdd(zero, phasorMul(FORTESCUE_A, positive)), phasorMul(A2, negative)),
	];
}
