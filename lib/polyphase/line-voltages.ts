/**
 * Line-to-line voltages derived from line-to-neutral channels, and the √3 check of a star system.
 */
import { phasorAbs, phasorArgDeg, phasorSub, wrapAngleDeg, type ComplexPhasor } from '../phasor/phasor.js';

/**
 * Line-to-line samples v_xy[n] = v_x[n] − v_y[n] (new array; inputs untouched). Same unit as the inputs.
 * @throws RangeError for arrays of unequal length
 * @example lineToLineSamples(u1, u2) // 400 V RMS from two 230 V phases 120° apart
 */
export function lineToLineSamples(from: Float64Array, to: Float64Array): Float64Array {
	if (from.length !== to.length)
		throw new RangeError(`channels differ in length: ${from.length} vs ${to.length} samples`);
	const out = new Float64Array(from.length);
	for (let i = 0; i < out.length; i++) out[i] = from[i] - to[i];
	return out;
}

/**
 * Line-to-line phasors V12 = V1 − V2, V23 = V2 − V3, V31 = V3 − V1 from line-to-neutral phasors.
 * @example lineVoltagePhasors(230∠0°, 230∠−120°, 230∠120°)[0] // 398.37∠30°
 */
export function lineVoltagePhasors(
	v1: ComplexPhasor,
	v2: ComplexPhasor,
	v3: ComplexPhasor,
): [ComplexPhasor, ComplexPhasor, ComplexPhasor] {
	return [phasorSub(v1, v2), phasorSub(v2, v3), phasorSub(v3, v1)];
}

/** Tolerance of the √3 check on the line/phase magnitude ratio: ±2 % (our choice; above the 2 % unbalance EN 50160 allows, a set is not balanced). */
export const SQRT3_RATIO_TOLERANCE_PERCENT = 2;
/** Tolerance on the 30° lead of V12 over V1: ±3° (our choice). */
export const STAR_ANGLE_TOLERANCE_DEG = 3;

/** Result of the √3 check. */
export interface Sqrt3Check {
	/** |V12|/|V1|, |V23|/|V2|, |V31|/|V3|. */
	ratios: [number, number, number];
	/** Mean of the ratios and its deviation from √3, %. */
	meanRatio: number;
	deviationPercent: number;
	/** ∠V12 − ∠V1 etc., degrees: +30 in positive rotation, −30 in negative. */
	leadDeg: [number, number, number];
	/** True when every ratio is within ±2 % of √3 and every lead within ±3° of +30° or all of −30°. */
	consistent: boolean;
	sentence: string;
}

/**
 * The √3 check of a star system: each line voltage is √3 times its phase voltage and leads it by 30°
 * (positive rotation). Derived line voltages pass on a balanced set; failing shows unbalance or
 * channels that are not what their names say.
 *
 * |V12| = √3·|V1|, ∠V12 = ∠V1 + 30° (balanced, ABC rotation)
 *
 * Ref: balanced star relations V_ab = √3·V_an∠30° (textbook, common practice; docs/methods.md §7).
 * @param phase  line-to-neutral fundamental phasors V1, V2, V3
 * @param line  line-to-line phasors V12, V23, V31 (measured, or lineVoltagePhasors(...) when not)
 * @returns ratios NaN where a phase voltage is zero
 * @example sqrt3Check([230∠0°, 230∠−120°, 230∠120°], lineVoltagePhasors(...)).consistent // true
 */
export function sqrt3Check(
	phase: [ComplexPhasor, ComplexPhasor, ComplexPhasor],
	line: [ComplexPhasor, ComplexPhasor, ComplexPhasor],
): Sqrt3Check {
	const ratios = [0, 1, 2].map((k) => phasorAbs(line[k]) / phasorAbs(phase[k])) as [number, number, number];
	const leadDeg = [0, 1, 2].map((k) => wrapAngleDeg(phasorArgDeg(line[k]) - phasorArgDeg(phase[k]))) as [
		number,
		number,
		number,
	];
	const meanRatio = (ratios[0] + ratios[1] + ratios[2]) / 3;
	const deviationPercent = (100 * (meanRatio - Math.sqrt(3))) / Math.sqrt(3);
	const ratiosOk = ratios.every((r) => Math.abs(r / Math.sqrt(3) - 1) * 100 <= SQRT3_RATIO_TOLERANCE_PERCENT);
	const lead = leadDeg.every((a) => Math.abs(a - 30) <= STAR_ANGLE_TOLERANCE_DEG);
	const lag = leadDeg.every((a) => Math.abs(a + 30) <= STAR_ANGLE_TOLERANCE_DEG);
	const consistent = ratiosOk && (lead || lag);
	const r = ratios.map((x) => x.toFixed(3)).join(', ');
	const a = leadDeg.map((x) => x.toFixed(1)).join(', ');
	const sentence = consistent
		? `line/phase voltage ratios ${r} are √3 within ${SQRT3_RATIO_TOLERANCE_PERCENT} % and line voltages ${lead ? 'lead' : 'lag'} by 30 deg: a balanced star${lead ? '' : ' in negative rotation'}`
		: `line/phase voltage ratios ${r} (√3 = 1.732) and angles ${a} deg (expected ±30): not a balanced star; the set is unbalanced, or channels are not line-to-neutral as named`;
	return { ratios, meanRatio, deviationPercent, leadDeg, consistent, sentence };
}
