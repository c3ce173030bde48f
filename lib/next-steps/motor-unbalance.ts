/**
 * Induction motors on an unbalanced supply: the derating factor for the measured voltage unbalance
 * (NEMA MG 1 curve) and the extra winding heating rule of thumb.
 */
import { fmt, interpolate, recorded } from './common.js';
import { NEXT_STEP_CAUTION, type NextStep } from './types.js';

/**
 * Derating factor against percent voltage unbalance (NEMA definition, LVUR), points of the NEMA MG 1
 * derating curve (MG 1 Part 14.35 / Fig. 14-1, Fig. 20-2 in later editions): 1 % -> 1.00 from memory; the
 * rest as a public table of the curve gives them (0.5 1.00, 1.5 0.97, 2 0.95, 2.5 0.93, 3 0.89, 3.5 0.85,
 * 4 0.82, 4.5 0.78, 5 0.76). Values in between are interpolated linearly.
 */
export const NEMA_DERATING_CURVE: readonly (readonly [number, number])[] = [
	[0, 1.0],
	[1, 1.0],
	[1.5, 0.97],
	[2, 0.95],
	[2.5, 0.93],
	[3, 0.89],
	[3.5, 0.85],
	[4, 0.82],
	[4.5, 0.78],
	[5, 0.76],
];

/** Unbalance above which NEMA MG 1 calls for derating (percent). */
export const NEMA_DERATE_ABOVE_PERCENT = 1;
/** Unbalance above which NEMA MG 1 recommends not operating the motor (percent). */
export const NEMA_DO_NOT_OPERATE_ABOVE_PERCENT = 5;

/**
 * Derating factor for a voltage unbalance (percent, NEMA definition); NaN above 5 % (the curve ends and
 * operation is not recommended). Ref: NEMA MG 1, 14.35 (curve points: see NEMA_DERATING_CURVE).
 * @example motorDeratingFactor(2) // 0.95
 */
export function motorDeratingFactor(unbalancePercent: number): number {
	if (!(unbalancePercent >= 0)) return NaN;
	return interpolate(NEMA_DERATING_CURVE, unbalancePercent);
}

/**
 * Extra winding temperature rise, percent of the rise on a balanced supply: ≈ 2 · (unbalance %)².
 * Ref: NEMA MG 1, 14.35.1 rule of thumb (from memory; common practice).
 * @example extraHeatingPercent(3.5) // 24.5
 */
export function extraHeatingPercent(unbalancePercent: number): number {
	return unbalancePercent >= 0 ? 2 * unbalancePercent * unbalancePercent : NaN;
}

export interface MotorUnbalanceResult {
	unbalancePercent: number;
	deratingFactor: number;
	extraHeatingPercent: number;
	aboveDeratingThreshold: boolean;
	operationNotRecommended: boolean;
}

/** The motor step from the voltage set's NEMA line-voltage unbalance rate (LVUR). */
export function motorUnbalance(channels: string[], lvurPercent: number): NextStep<MotorUnbalanceResult> {
	const d = motorDeratingFactor(lvurPercent);
	const result: MotorUnbalanceResult = {
		unbalancePercent: lvurPercent,
		deratingFactor: d,
		extraHeatingPercent: extraHeatingPercent(lvurPercent),
		aboveDeratingThreshold: lvurPercent > NEMA_DERATE_ABOVE_PERCENT,
		operationNotRecommended: lvurPercent > NEMA_DO_NOT_OPERATE_ABOVE_PERCENT,
	};
	const conclusions = result.operationNotRecommended
		? [
				`Voltage unbalance ${fmt(lvurPercent, 2)} % is above 5 %: NEMA MG 1 recommends not running induction motors on it; find the cause first.`,
			]
		: [
				`Voltage unbalance ${fmt(lvurPercent, 2)} %: load induction motors to at most ${fmt(d * 100, 0)} % of their rating (derating factor ${fmt(d, 2)}, interpolated on the NEMA MG 1 curve).`,
			];
	conclusions.push(
		`The hottest winding runs about ${fmt(result.extraHeatingPercent, 0)} % hotter in temperature rise than on a balanced supply.`,
	);
	const warnings = result.aboveDeratingThreshold
		? [
				`Unbalance above ${NEMA_DERATE_ABOVE_PERCENT} %: motors need derating; look for unevenly shared single-phase loads or a poor connection.`,
			]
		: [];
	return {
		step: 'motor-unbalance',
		title: 'Motors on an unbalanced supply',
		status: 'result',
		finding: `${channels.join(', ')}: line-voltage unbalance (NEMA definition) ${fmt(lvurPercent, 2)} %.`,
		method: [
			'Percent unbalance = largest deviation of a line voltage from their mean ÷ the mean × 100 (NEMA MG 1, 14.35).',
			'Derating factor from the NEMA MG 1 derating curve (14.35 / Fig. 14-1; points 0.5 % 1.00 … 5 % 0.76 as a public table gives them, 1 % -> 1.00 from memory), interpolated linearly between points.',
			'Extra temperature rise ≈ 2 × (percent unbalance)² percent (NEMA MG 1, 14.35.1, from memory).',
		],
		inputs: [recorded('line-voltage unbalance (NEMA)', lvurPercent, '%')],
		needs: [],
		result,
		conclusions,
		assumptions: [
			'The unbalance of this recording is typical of the supply at the motor terminals; the curve is for polyphase induction motors at rated load.',
			'Derating interpolated between curve points (a straight line between them).',
		],
		warnings,
		caution: NEXT_STEP_CAUTION,
	};
}
