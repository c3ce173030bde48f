/**
 * Declared supply voltage from measured RMS values, when the user gives none: the common nominal
 * voltage nearest (by ratio) to the median of the values, if one lies within ±15 %.
 */
import type { Diagnostic } from '../capture.js';

/**
 * Common low-voltage system nominal values in V, line-to-neutral and line-to-line (common practice: IEC 60038
 * 230/400 V, 120/208 V, 120/240 V split phase, 277/480 V, 347/600 V; from memory). Equipment ratings such
 * as 110 or 115 V are left out: they are not system nominals.
 */
export const COMMON_NOMINAL_VOLTAGES_V = [
	100, 120, 127, 208, 220, 230, 240, 277, 347, 380, 400, 415, 480, 600, 690,
] as const;

/**
 * Picks the declared voltage Udin for event detection from RMS values of the first seconds.
 *
 * @param rmsValuesV  Urms(1/2) or 10/12-cycle RMS values of the voltage channels, V (NaN ignored)
 * @returns declaredV and one diagnostic: 'assumption' when a common nominal matched; NaN and a 'warning'
 *   when there is no finite value or no common nominal lies within ±15 % (medium-voltage records, or a
 *   recording that starts inside an event): a guess there would invent dips or swells, so none is made.
 * @example declaredVoltageFromRms([231.2, 229.8, 230.5]) // { declaredV: 230, ... }
 */
export function declaredVoltageFromRms(rmsValuesV: ArrayLike<number>): { declaredV: number; diagnostic: Diagnostic } {
	const v: number[] = [];
	for (let i = 0; i < rmsValuesV.length; i++) if (Number.isFinite(rmsValuesV[i])) v.push(rmsValuesV[i]);
	if (v.length === 0) {
		return {
			declaredV: NaN,
			diagnostic: {
				code: 'declared-voltage-unknown',
				severity: 'warning',
				message:
					'No voltage RMS value to infer the declared voltage from; give it to detect dips, swells and interruptions.',
			},
		};
	}
	v.sort((a, b) => a - b);
	const median = v.length % 2 ? v[(v.length - 1) / 2] : (v[v.length / 2 - 1] + v[v.length / 2]) / 2;
	let best = NaN;
	let bestRatio = Infinity;
	for (const u of COMMON_NOMINAL_VOLTAGES_V) {
		const r = Math.abs(Math.log(median / u));
		if (r < bestRatio) {
			bestRatio = r;
			best = u;
		}
	}
	if (Math.exp(bestRatio) <= 1.15) {
		return {
			declaredV: best,
			diagnostic: {
				code: 'declared-voltage-inferred',
				severity: 'assumption',
				message: `Declared voltage taken as ${best} V, the common nominal nearest the measured ${median.toFixed(1)} V of the first seconds; give the declared voltage if it differs.`,
			},
		};
	}
	return {
		declaredV: NaN,
		diagnostic: {
			code: 'declared-voltage-unknown',
			severity: 'warning',
			message: `No common low-voltage nominal lies within 15 % of the measured ${median.toFixed(1)} V, so no declared voltage is assumed. Give it (for a medium-voltage record, the system's line-to-neutral value, e.g. 7200 V on a 12.47 kV feeder).`,
		},
	};
}
