/**
 * Voltages to an artificial star point from line-to-line channels, so a 3-wire capture of U12, U23, U31
 * (no neutral) gets per-phase phasors, power and sequence figures.
 */
import { phasorScale, phasorSub, type ComplexPhasor } from '../phasor/phasor.js';

/**
 * Voltages from each line to the artificial star point (the point where three equal resistors would meet):
 *
 * v1 = (u12 − u31)/3,  v2 = (u23 − u12)/3,  v3 = (u31 − u23)/3
 *
 * They hold no zero sequence, and their differences give back u12, u23, u31. Because the line currents
 * of a 3-wire circuit sum to zero, Σ v_x·i_x is the true total power whatever the reference point, so
 * IEEE 1459 '3-wire' totals (P, S_e, S1+…) are exact on them; single phase figures are relative to this
 * artificial point (equal to the phase values for a balanced star load).
 * Ref: Blondel's theorem (n − 1 wattmeters for n wires) (textbook, from memory).
 * @throws RangeError for channels of unequal length
 * @example artificialNeutralVoltages(u12, u23, u31)[0] // 230 V RMS from a 400 V balanced set
 */
export function artificialNeutralVoltages(
	u12: Float64Array,
	u23: Float64Array,
	u31: Float64Array,
): [Float64Array, Float64Array, Float64Array] {
	const n = u12.length;
	if (u23.length !== n || u31.length !== n)
		throw new RangeError(`line-voltage channels differ in length: ${n}, ${u23.length}, ${u31.length} samples`);
	const v1 = new Float64Array(n);
	const v2 = new Float64Array(n);
	const v3 = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		v1[i] = (u12[i] - u31[i]) / 3;
		v2[i] = (u23[i] - u12[i]) / 3;
		v3[i] = (u31[i] - u23[i]) / 3;
	}
	return [v1, v2, v3];
}

/** Phasor form of artificialNeutralVoltages (fundamental line-voltage phasors in, star phasors out). */
export function artificialNeutralPhasors(
	u12: ComplexPhasor,
	u23: ComplexPhasor,
	u31: ComplexPhasor,
): [ComplexPhasor, ComplexPhasor, ComplexPhasor] {
	return [
		phasorScale(phasorSub(u12, u31), 1 / 3),
		phasorScale(phasorSub(u23, u12), 1 / 3),
		phasorScale(phasorSub(u31, u23), 1 / 3),
	];
}

/**
 * The third line voltage of a 3-wire set when only two were recorded: u31 = −(u12 + u23) (Kirchhoff's
 * voltage law around the three lines). New array.
 * @throws RangeError for channels of unequal length
 */
export function thirdLineVoltage(u12: Float64Array, u23: Float64Array): Float64Array {
	if (u12.length !== u23.length)
		throw new RangeError(`line-voltage channels differ in length: ${u12.length} vs ${u23.length} samples`);
	const out = new Float64Array(u12.length);
	for (let i = 0; i < out.length; i++) out[i] = -(u12[i] + u23[i]);
	return out;
}
