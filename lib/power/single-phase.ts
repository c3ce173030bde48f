/**
 * IEEE 1459-2010 power quantities of one phase (a voltage/current pair) under non-sinusoidal conditions.
 */
import type { HarmonicSet } from '../spectrum/types.js';
import { complexPower, phasorFromHarmonic, wrapAngleDeg } from '../phasor/phasor.js';

/** The six numbers every single-phase IEEE 1459 quantity follows from. */
export interface SinglePhaseComponents {
	/** True RMS voltage V over the whole-cycle window, V. */
	voltageRmsV: number;
	/** True RMS current I, A. */
	currentRmsA: number;
	/** Fundamental RMS voltage V1, V. */
	v1RmsV: number;
	/** Fundamental RMS current I1, A. */
	i1RmsA: number;
	/** θ1 = α1 − β1: angle by which the fundamental current lags the fundamental voltage, degrees. */
	theta1Deg: number;
	/** Active power P = (1/kT)∫v·i dt over the window, W. */
	activePowerW: number;
}

/** IEEE 1459-2010 single-phase quantities. Q-type values in var, S-type in VA. */
export interface SinglePhasePower {
	voltageRmsV: number;
	currentRmsA: number;
	v1RmsV: number;
	i1RmsA: number;
	/** V_H = √(V² − V1²), all non-fundamental content including DC, V. */
	vHRmsV: number;
	/** I_H = √(I² − I1²), A. */
	iHRmsA: number;
	/** θ1, degrees in (−180, 180], positive when the current lags (inductive). */
	theta1Deg: number;
	/** P, W. */
	activePowerW: number;
	/** P1 = V1·I1·cos θ1, W. */
	fundamentalActivePowerW: number;
	/** P_H = P − P1, W. */
	harmonicActivePowerW: number;
	/** Q1 = V1·I1·sin θ1, var; positive for an inductive load. */
	fundamentalReactivePowerVar: number;
	/** S = V·I, VA. */
	apparentPowerVA: number;
	/** S1 = V1·I1, VA. */
	fundamentalApparentPowerVA: number;
	/** S_N = √(S² − S1²), VA. */
	nonFundamentalApparentPowerVA: number;
	/** D_I = V1·I_H, var. */
	currentDistortionPowerVar: number;
	/** D_V = V_H·I1, var. */
	voltageDistortionPowerVar: number;
	/** S_H = V_H·I_H, VA. */
	harmonicApparentPowerVA: number;
	/** D_H = √(S_H² − P_H²), var (0 when rounding makes the radicand negative). */
	harmonicDistortionPowerVar: number;
	/** N = √(S² − P²), var. */
	nonActivePowerVar: number;
	/** PF = P/S, signed like P. */
	powerFactor: number;
	/** PF1 = cos θ1 = P1/S1, signed like P1. */
	displacementPowerFactor: number;
	/** THD_V = V_H/V1 × 100, %. */
	thdVoltagePercent: number;
	/** THD_I = I_H/I1 × 100, %. */
	thdCurrentPercent: number;
	/** S_N/S1 (harmonic pollution), ratio. */
	harmonicPollutionRatio: number;
}

/**
 * Every IEEE 1459-2010 single-phase quantity from V, I, V1, I1, θ1 and P.
 *
 * V_H = √(V² − V1²), I_H = √(I² − I1²); P1 = V1·I1·cos θ1; Q1 = V1·I1·sin θ1; P_H = P − P1; S = V·I;
 * S1 = V1·I1; S_N = √(S² − S1²); D_I = V1·I_H; D_V = V_H·I1; S_H = V_H·I_H; D_H = √(S_H² − P_H²);
 * N = √(S² − P²); PF = P/S; PF1 = cos θ1; THD_V = V_H/V1; THD_I = I_H/I1.
 *
 * Ref: IEEE Std 1459-2010, 3.1.2 (single-phase non-sinusoidal) (from memory; definitions as in docs/methods.md §5.1).
 * @returns the quantities; ratios are NaN when their denominator is 0 (e.g. THD with V1 = 0, PF with S = 0)
 * @example ieee1459FromComponents({ voltageRmsV: 230, currentRmsA: 10, v1RmsV: 230, i1RmsA: 10, theta1Deg: 30, activePowerW: 1991.86 }).fundamentalReactivePowerVar // 1150
 */
export function ieee1459FromComponents(c: SinglePhaseComponents): SinglePhasePower {
	const { voltageRmsV: V, currentRmsA: I, v1RmsV: V1, i1RmsA: I1, activePowerW: P } = c;
	const th = (wrapAngleDeg(c.theta1Deg) * Math.PI) / 180;
	const VH = sqrtPos(V * V - V1 * V1);
	const IH = sqrtPos(I * I - I1 * I1);
	const S = V * I;
	const S1 = V1 * I1;
	// With no fundamental on one side θ1 is undefined but P1 and Q1 are plainly zero.
	const P1 = S1 === 0 ? 0 : S1 * Math.cos(th);
	const Q1 = S1 === 0 ? 0 : S1 * Math.sin(th);
	const PH = P - P1;
	const SH = VH * IH;
	return {
		voltageRmsV: V,
		currentRmsA: I,
		v1RmsV: V1,
		i1RmsA: I1,
		vHRmsV: VH,
		iHRmsA: IH,
		theta1Deg: wrapAngleDeg(c.theta1Deg),
		activePowerW: P,
		fundamentalActivePowerW: P1,
		harmonicActivePowerW: PH,
		fundamentalReactivePowerVar: Q1,
		apparentPowerVA: S,
		fundamentalApparentPowerVA: S1,
		nonFundamentalApparentPowerVA: sqrtPos(S * S - S1 * S1),
		currentDistortionPowerVar: V1 * IH,
		voltageDistortionPowerVar: VH * I1,
		harmonicApparentPowerVA: SH,
		harmonicDistortionPowerVar: sqrtPos(SH * SH - PH * PH),
		nonActivePowerVar: sqrtPos(S * S - P * P),
		powerFactor: S > 0 ? P / S : NaN,
		displacementPowerFactor: S1 > 0 ? Math.cos(th) : NaN, // NaN θ1 gives NaN
		thdVoltagePercent: V1 > 0 ? (100 * VH) / V1 : NaN,
		thdCurrentPercent: I1 > 0 ? (100 * IH) / I1 : NaN,
		harmonicPollutionRatio: S1 > 0 ? sqrtPos(S * S - S1 * S1) / S1 : NaN,
	};
}

/** Time-domain values over the same window as the harmonic sets; each overrides the value summed from the sets. */
export interface TimeDomainTotals {
	/** True RMS voltage over the window, V (includes interharmonics and orders above the set's maxOrder). */
	voltageRmsV?: number;
	/** True RMS current over the window, A. */
	currentRmsA?: number;
	/** P = mean(v·i) over the window, W (activePowerFromSamplesW). */
	activePowerW?: number;
}

/**
 * Active power summed over harmonic orders, W: P = Σ_h V_h·I_h·cos θ_h, order 0 (DC) as V0·I0 with signs.
 * Ref: IEEE Std 1459-2010, 3.1.2.3 (P = P1 + P_H, P_H = V0·I0 + Σ_{h≠1} V_h·I_h·cos θ_h) (from memory).
 * @returns NaN when an order is NaN
 * @example activePowerFromHarmonicsW(uSet, iSet) // 2018.47 for docs/methods.md §5.3
 */
export function activePowerFromHarmonicsW(voltage: HarmonicSet, current: HarmonicSet): number {
	const n = Math.min(voltage.orders.length, current.orders.length);
	let p = 0;
	for (let h = 0; h < n; h++)
		p += complexPower(phasorFromHarmonic(voltage.orders[h]), phasorFromHarmonic(current.orders[h])).re;
	return p;
}

/** RMS from a harmonic set: √Σ rms_h² over all orders it holds (DC included). */
export function rmsFromHarmonicSet(set: HarmonicSet): number {
	let s = 0;
	for (const h of set.orders) s += h.rms * h.rms;
	return Math.sqrt(s);
}

/**
 * IEEE 1459-2010 single-phase quantities of a voltage/current pair from their harmonic sets on the same
 * window, with time-domain totals when given (recommended: the sets stop at maxOrder and hold no
 * interharmonics, so V, I and P summed from them miss that content).
 * @param voltage, current  harmonic sets of one window (lib/spectrum harmonicWindow(...).set)
 * @returns see ieee1459FromComponents; θ1 and PF1 NaN (P1 = Q1 = 0) when a fundamental is zero
 * @throws RangeError when a set lacks order 1
 * @example singlePhasePowerFromHarmonics(u, i, { activePowerW: p }).powerFactor // 0.824173 for docs/methods.md §5.3
 */
export function singlePhasePowerFromHarmonics(
	voltage: HarmonicSet,
	current: HarmonicSet,
	totals: TimeDomainTotals = {},
): SinglePhasePower {
	const v1 = voltage.orders[1];
	const i1 = current.orders[1];
	if (!v1 || !i1) throw new RangeError('harmonic sets must hold order 1 (the fundamental)');
	const theta1Deg = v1.rms > 0 && i1.rms > 0 ? wrapAngleDeg(v1.phaseDeg - i1.phaseDeg) : NaN;
	return ieee1459FromComponents({
		voltageRmsV: totals.voltageRmsV ?? rmsFromHarmonicSet(voltage),
		currentRmsA: totals.currentRmsA ?? rmsFromHarmonicSet(current),
		v1RmsV: v1.rms,
		i1RmsA: i1.rms,
		theta1Deg,
		activePowerW: totals.activePowerW ?? activePowerFromHarmonicsW(voltage, current),
	});
}

function sqrtPos(x: number): number {
	return x > 0 ? Math.sqrt(x) : x <= 0 ? 0 : NaN;
}
