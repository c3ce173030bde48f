/**
 * The load's character in words its displacement supports. Sign convention (one, everywhere): θ1 and
 * `lagDeg` are positive when the current lags the voltage (Q1 > 0, IEEE 1459-2010).
 *
 * - Displacement power factor at or above the near-unity threshold: "near unity" (a rectifier at DPF
 *   0.998 is not capacitive);
 * - otherwise the current "lags" or "leads" the voltage by θ1; the words inductive / capacitive only when
 *   a fundamental-only model describes the load, i.e. the current is close to a sine (THD under the
 *   threshold): a dimmer's firing delay moves the fundamental back without any inductance;
 * - |θ1| > 90°: active power flows back (generation, or a clamp turned round).
 */
import { threshold } from './thresholds.js';
import type { ReportLoadCharacter } from './types.js';
import { PLAIN_WORDS, type NumberWords } from './words.js';

export interface LoadWords {
	relation: 'near-unity' | 'lags' | 'leads' | null;
	character: ReportLoadCharacter | null;
	/** e.g. "inductive: current lags the voltage by 30.0°". */
	sentence: string;
}

/**
 * @param dpf  displacement power factor cos θ1 (negative with reverse flow)
 * @param reactiveVar  Q1, its sign tells lag (> 0) from lead
 * @param currentThdPercent  THD of the current, % of its fundamental
 * @example loadWords(0.866, 1150, 0.1).sentence // "inductive: current lags the voltage by 30.0°"
 */
export function loadWords(
	dpf: number,
	reactiveVar: number,
	currentThdPercent: number,
	words: NumberWords = PLAIN_WORDS,
): LoadWords {
	if (!Number.isFinite(dpf))
		return { relation: null, character: null, sentence: 'load character cannot be told (no fundamental)' };
	const reverse = dpf < 0 ? '; active power flows back (generation, or a clamp turned round)' : '';
	const thetaDeg = (Math.acos(Math.min(1, Math.abs(dpf))) * 180) / Math.PI;
	const sinusoidal = Number.isFinite(currentThdPercent) && currentThdPercent < threshold('sinusoidalCurrentThdPercent');
	if (Math.abs(dpf) >= threshold('nearUnityDisplacement')) {
		return {
			relation: 'near-unity',
			character: sinusoidal ? 'resistive' : null,
			sentence: `${sinusoidal ? 'resistive: ' : ''}displacement near unity (current within ${words.deg(thetaDeg)} of the voltage)${reverse}`,
		};
	}
	const lags = reactiveVar > 0;
	const how = `current lags the voltage by ${words.deg(thetaDeg)}`.replace('lags', lags ? 'lags' : 'leads');
	if (sinusoidal)
		return {
			relation: lags ? 'lags' : 'leads',
			character: lags ? 'inductive' : 'capacitive',
			sentence: `${lags ? 'inductive' : 'capacitive'}: ${how}${reverse}`,
		};
	return {
		relation: lags ? 'lags' : 'leads',
		character: null,
		sentence: `the fundamental of the ${how}; the current is not a sine (THD ${words.percent(currentThdPercent, 0)}), so this is not a plain ${lags ? 'inductive' : 'capacitive'} load${reverse}`,
	};
}
