/**
 * Load character of a voltage/current pair from the fundamental angle: inductive, capacitive or resistive.
 */
import { wrapAngleDeg } from '../phasor/phasor.js';

/**
 * Default band within which a load is called resistive: |θ1| ≤ 3.0° (cos 3° = 0.9986).
 * Our choice: larger than the phase error of a good current clamp at 50/60 Hz (about 1°, common practice),
 * small enough that a motor at light load (θ1 of 30° or more) is never called resistive.
 */
export const RESISTIVE_BAND_DEG = 3;

/** Load character from the fundamental angle. */
export interface LoadCharacter {
	/** 'inductive' when Q1 > 0 (current lags), 'capacitive' when Q1 < 0 (current leads), 'resistive' within the band. */
	character: 'inductive' | 'capacitive' | 'resistive' | 'undetermined';
	/** True when P1 < 0 (|θ1| > 90°): power flows from the "load" side back to the source, or a clamp is reversed. */
	reverseFlow: boolean;
	/** θ1 = α1 − β1 (voltage angle minus current angle), degrees in (−180, 180]. */
	theta1Deg: number;
	/** Band used for 'resistive', degrees. */
	resistiveBandDeg: number;
	/** One sentence with the angle and the threshold. */
	sentence: string;
}

/**
 * Classifies a load from θ1, the angle by which the fundamental current lags the fundamental voltage.
 *
 * resistive  if |θ1| ≤ band (or |θ1| ≥ 180° − band with reverse flow)
 * inductive  if sin θ1 > 0 (Q1 > 0, current lags)
 * capacitive if sin θ1 < 0 (Q1 < 0, current leads)
 *
 * Ref: IEEE Std 1459-2010, 3.1.2.4 (Q1 = V1·I1·sin θ1, positive for an inductive load) (from memory).
 * @param theta1Deg  lag of current behind voltage at the fundamental, degrees (as fundamentalLagDeg(u, i))
 * @param resistiveBandDeg  |θ1| up to which the load is called resistive; default RESISTIVE_BAND_DEG (3°)
 * @returns 'undetermined' when θ1 is NaN
 * @example loadCharacterFromAngle(36.87).sentence // "inductive load: current lags voltage by 36.9 deg (displacement PF 0.800); resistive band is ±3.0 deg"
 */
export function loadCharacterFromAngle(theta1Deg: number, resistiveBandDeg = RESISTIVE_BAND_DEG): LoadCharacter {
	if (!(resistiveBandDeg >= 0 && resistiveBandDeg < 90))
		throw new RangeError(`resistiveBandDeg must be in [0, 90), got ${resistiveBandDeg}`);
	const band = `resistive band is ±${resistiveBandDeg.toFixed(1)} deg`;
	if (Number.isNaN(theta1Deg)) {
		return {
			character: 'undetermined',
			reverseFlow: false,
			theta1Deg,
			resistiveBandDeg,
			sentence: `load character undetermined: no fundamental angle (${band})`,
		};
	}
	const t = wrapAngleDeg(theta1Deg);
	const reverseFlow = Math.abs(t) > 90;
	const offResistive = reverseFlow ? 180 - Math.abs(t) : Math.abs(t);
	const dpf = Math.cos((t * Math.PI) / 180).toFixed(3);
	const flow = reverseFlow ? '; active power flows in reverse (generation, or a clamp/probe reversed)' : '';
	let character: LoadCharacter['character'];
	let what: string;
	if (offResistive <= resistiveBandDeg) {
		character = 'resistive';
		what = `resistive load: current within ${offResistive.toFixed(1)} deg of ${reverseFlow ? 'antiphase' : 'phase'} with voltage`;
	} else if (t > 0) {
		character = 'inductive';
		what = `inductive load: current lags voltage by ${t.toFixed(1)} deg`;
	} else {
		character = 'capacitive';
		what = `capacitive load: current leads voltage by ${(-t).toFixed(1)} deg`;
	}
	return {
		character,
		reverseFlow,
		theta1Deg: t,
		resistiveBandDeg,
		sentence: `${what} (displacement PF ${dpf})${flow}; ${band}`,
	};
}
