/**
 * IEEE 1459-2010 three-phase quantities (3- or 4-wire): effective voltage and current, effective apparent
 * power and its decomposition, positive-sequence powers, fundamental unbalance power.
 */
import type { HarmonicSet } from '../spectrum/types.js';
import { symmetricalComponents, type SequenceComponents } from '../phasor/sequence.js';
import {
	complexPower,
	phasorAbs,
	phasorAdd,
	phasorFromHarmonic,
	phasorSub,
	type ComplexPhasor,
} from '../phasor/phasor.js';
import {
	ieee1459FromComponents,
	activePowerFromHarmonicsW,
	rmsFromHarmonicSet,
	type SinglePhasePower,
	type TimeDomainTotals,
} from './single-phase.js';
import { phasorArgDeg, wrapAngleDeg } from '../phasor/phasor.js';
import { minOf } from '../signal/extremes.js';

/** '4-wire': three lines and a neutral (star); '3-wire': three lines, no neutral conductor. */
export type PowerWiring = '4-wire' | '3-wire';

type Three<T> = [T, T, T];

/** Plain numbers and fundamental phasors the three-phase quantities follow from. */
export interface ThreePhaseComponents {
	wiring: PowerWiring;
	/** True RMS line-to-neutral (4-wire) or line-to-reference (3-wire) voltages of phases 1, 2, 3, V. */
	voltageRmsV: Three<number>;
	/** True RMS line currents, A. */
	currentRmsA: Three<number>;
	/** True RMS line-to-line voltages |v12|, |v23|, |v31|, V. */
	lineVoltageRmsV: Three<number>;
	/** True RMS neutral current, A (4-wire; measured, or of the sum of the line currents). Ignored for 3-wire. */
	neutralCurrentRmsA: number;
	/** Fundamental voltage phasors (RMS, same window), V. */
	v1: Three<ComplexPhasor>;
	/** Fundamental current phasors, A. */
	i1: Three<ComplexPhasor>;
	/** Fundamental neutral current phasor; default −(sum of i1) in magnitude, i.e. |Σ I1|. */
	i1Neutral?: ComplexPhasor;
	/** Active power of each phase, W (time domain: mean of v·i). */
	activePowerW: Three<number>;
}

/** IEEE 1459-2010 three-phase quantities. */
export interface ThreePhasePower {
	wiring: PowerWiring;
	/** Each phase on its own (IEEE 1459 single-phase quantities). For 3-wire these are relative to the voltage reference used. */
	perPhase: Three<SinglePhasePower>;
	/** P = Σ Px, W. */
	activePowerW: number;
	/** Σ P1x, W. */
	fundamentalActivePowerW: number;
	/** Σ Q1x (arithmetic sum of phase fundamental reactive powers), var. */
	fundamentalReactivePowerVar: number;
	/** Effective voltage V_e and current I_e (RMS), V and A. */
	effectiveVoltageV: number;
	effectiveCurrentA: number;
	/** S_e = 3·V_e·I_e, VA. */
	effectiveApparentPowerVA: number;
	/** V_e1, I_e1 (same formulas on fundamental magnitudes), S_e1 = 3·V_e1·I_e1. */
	effectiveVoltage1V: number;
	effectiveCurrent1A: number;
	effectiveApparentPower1VA: number;
	/** V_eH = √(V_e² − V_e1²), I_eH = √(I_e² − I_e1²). */
	effectiveVoltageHV: number;
	effectiveCurrentHA: number;
	/** THD_eV = V_eH/V_e1 × 100, THD_eI = I_eH/I_e1 × 100, %. */
	thdEffectiveVoltagePercent: number;
	thdEffectiveCurrentPercent: number;
	/** S_eN = √(S_e² − S_e1²), VA. */
	effectiveNonFundamentalApparentPowerVA: number;
	/** D_eI = 3·V_e1·I_eH, D_eV = 3·V_eH·I_e1 (var), S_eH = 3·V_eH·I_eH (VA). */
	effectiveCurrentDistortionPowerVar: number;
	effectiveVoltageDistortionPowerVar: number;
	effectiveHarmonicApparentPowerVA: number;
	/** N_e = √(S_e² − P²), var. */
	effectiveNonActivePowerVar: number;
	/**
	 * 'as-labelled', or 'phases-2-3-swapped' when the voltage labels run in negative rotation (|V2| > |V1|):
	 * the positive sequence is then taken in the measured rotation, so P1+, S1+ and S_U1 stay meaningful.
	 */
	sequenceOrder: 'as-labelled' | 'phases-2-3-swapped';
	/** Positive-sequence fundamental phasors V1+, I1+ (RMS, per phase), in the measured rotation. */
	positiveSequenceVoltage: ComplexPhasor;
	positiveSequenceCurrent: ComplexPhasor;
	/** P1+ = 3·V1+·I1+·cos θ1+ (W), Q1+ = 3·V1+·I1+·sin θ1+ (var), S1+ = 3·V1+·I1+ (VA); θ1+ = ∠V1+ − ∠I1+. */
	positiveSequenceActivePowerW: number;
	positiveSequenceReactivePowerVar: number;
	positiveSequenceApparentPowerVA: number;
	positiveSequenceAngleDeg: number;
	/** S_U1 = √(S_e1² − (S1+)²), fundamental unbalance power, VA. */
	fundamentalUnbalancePowerVA: number;
	/** PF_e = P / S_e. */
	effectivePowerFactor: number;
	/** PF1+ = P1+ / S1+. */
	positiveSequencePowerFactor: number;
	/** S_eN / S_e1. */
	effectiveHarmonicPollutionRatio: number;
	/** For comparison only (not IEEE 1459 recommendations): S_A = Σ V_x·I_x and S_V = |P + j·ΣQ1x|, VA. */
	arithmeticApparentPowerVA: number;
	vectorApparentPowerVA: number;
}

/** Each phase on its own (IEEE 1459 single-phase), θ1 from its fundamental phasors. */
function singlePhaseParts(c: ThreePhaseComponents): Three<SinglePhasePower> {
	return [0, 1, 2].map((k) =>
		ieee1459FromComponents({
			voltageRmsV: c.voltageRmsV[k],
			currentRmsA: c.currentRmsA[k],
			v1RmsV: phasorAbs(c.v1[k]),
			i1RmsA: phasorAbs(c.i1[k]),
			theta1Deg: wrapAngleDeg(phasorArgDeg(c.v1[k]) - phasorArgDeg(c.i1[k])),
			activePowerW: c.activePowerW[k],
		}),
	) as Three<SinglePhasePower>;
}

/**
 * Effective voltage and current (total, fundamental, non-fundamental), IEEE 1459-2010 3.2:
 * 4-wire V_e = √((3·ΣV_x² + ΣV_xy²)/18), I_e = √((ΣI_x² + I_n²)/3); 3-wire V_e = √(ΣV_xy²/9), I_e = √(ΣI_x²/3).
 */
function effectiveValues(c: ThreePhaseComponents): {
	Ve: number;
	Ie: number;
	Ve1: number;
	Ie1: number;
	VeH: number;
	IeH: number;
} {
	const sq = (x: number) => x * x;
	const sum = (a: Three<number>) => a[0] + a[1] + a[2];
	const v1Mag = c.v1.map(phasorAbs) as Three<number>;
	const i1Mag = c.i1.map(phasorAbs) as Three<number>;
	const v1Line = [phasorSub(c.v1[0], c.v1[1]), phasorSub(c.v1[1], c.v1[2]), phasorSub(c.v1[2], c.v1[0])].map(
		phasorAbs,
	) as Three<number>;
	const in1 = c.i1Neutral ? phasorAbs(c.i1Neutral) : phasorAbs(phasorAdd(phasorAdd(c.i1[0], c.i1[1]), c.i1[2]));
	const fourWire = c.wiring === '4-wire';
	const ve = (ln: Three<number>, ll: Three<number>) =>
		Math.sqrt(
			fourWire
				? (3 * sum(ln.map(sq) as Three<number>) + sum(ll.map(sq) as Three<number>)) / 18
				: sum(ll.map(sq) as Three<number>) / 9,
		);
	const ie = (i: Three<number>, n: number) => Math.sqrt((sum(i.map(sq) as Three<number>) + (fourWire ? n * n : 0)) / 3);
	const Ve = ve(c.voltageRmsV, c.lineVoltageRmsV);
	const Ie = ie(c.currentRmsA, c.neutralCurrentRmsA);
	const Ve1 = ve(v1Mag, v1Line);
	const Ie1 = ie(i1Mag, in1);
	return { Ve, Ie, Ve1, Ie1, VeH: sqrtPos(Ve * Ve - Ve1 * Ve1), IeH: sqrtPos(Ie * Ie - Ie1 * Ie1) };
}

/** Sequence components in the measured rotation: phases 2 and 3 swapped when the labels run negative. */
function positiveSequenceInRotation(c: ThreePhaseComponents): {
	swap: boolean;
	vSeq: SequenceComponents;
	iSeq: SequenceComponents;
} {
	const asLabelled = symmetricalComponents(c.v1[0], c.v1[1], c.v1[2]);
	const swap = asLabelled.negativeRms > asLabelled.positiveRms;
	const vSeq = swap ? symmetricalComponents(c.v1[0], c.v1[2], c.v1[1]) : asLabelled;
	const iSeq = swap
		? symmetricalComponents(c.i1[0], c.i1[2], c.i1[1])
		: symmetricalComponents(c.i1[0], c.i1[1], c.i1[2]);
	return { swap, vSeq, iSeq };
}

/**
 * IEEE 1459-2010 three-phase quantities from RMS values, fundamental phasors and per-phase P.
 *
 * 4-wire (ρ = ξ = 1): I_e = √((I1² + I2² + I3² + I_n²)/3);  V_e = √((3·ΣV_x² + ΣV_xy²)/18)
 * 3-wire:             I_e = √((I1² + I2² + I3²)/3);          V_e = √(ΣV_xy²/9)
 * S_e = 3·V_e·I_e; S_e1 from the fundamentals; S_eN² = S_e² − S_e1²; D_eI = 3V_e1I_eH; D_eV = 3V_eHI_e1;
 * S_eH = 3V_eHI_eH; S1+ = 3·V1+·I1+; S_U1 = √(S_e1² − S1+²); PF_e = P/S_e.
 * The positive sequence is taken in the measured rotation (phases 2 and 3 swapped when the labels run in
 * negative rotation; see `sequenceOrder`).
 *
 * Ref: IEEE Std 1459-2010, 3.2 (three-phase, non-sinusoidal and unbalanced) (from memory; formulas as in
 * docs/methods.md §5.2).
 * @returns the quantities; ratios NaN when their denominator is 0
 * @example ieee1459ThreePhaseFromComponents(c).effectivePowerFactor // 0.82552 for docs/methods.md §5.4
 */
export function ieee1459ThreePhaseFromComponents(c: ThreePhaseComponents): ThreePhasePower {
	const perPhase = singlePhaseParts(c);
	const { Ve, Ie, Ve1, Ie1, VeH, IeH } = effectiveValues(c);
	const Se = 3 * Ve * Ie;
	const Se1 = 3 * Ve1 * Ie1;
	const P = c.activePowerW[0] + c.activePowerW[1] + c.activePowerW[2];
	const { swap, vSeq, iSeq } = positiveSequenceInRotation(c);
	const s1p = complexPower(vSeq.positive, iSeq.positive);
	const S1p = 3 * phasorAbs(s1p);
	const q1 =
		perPhase[0].fundamentalReactivePowerVar +
		perPhase[1].fundamentalReactivePowerVar +
		perPhase[2].fundamentalReactivePowerVar;
	return {
		wiring: c.wiring,
		perPhase,
		activePowerW: P,
		fundamentalActivePowerW:
			perPhase[0].fundamentalActivePowerW + perPhase[1].fundamentalActivePowerW + perPhase[2].fundamentalActivePowerW,
		fundamentalReactivePowerVar: q1,
		effectiveVoltageV: Ve,
		effectiveCurrentA: Ie,
		effectiveApparentPowerVA: Se,
		effectiveVoltage1V: Ve1,
		effectiveCurrent1A: Ie1,
		effectiveApparentPower1VA: Se1,
		effectiveVoltageHV: VeH,
		effectiveCurrentHA: IeH,
		thdEffectiveVoltagePercent: Ve1 > 0 ? (100 * VeH) / Ve1 : NaN,
		thdEffectiveCurrentPercent: Ie1 > 0 ? (100 * IeH) / Ie1 : NaN,
		effectiveNonFundamentalApparentPowerVA: sqrtPos(Se * Se - Se1 * Se1),
		effectiveCurrentDistortionPowerVar: 3 * Ve1 * IeH,
		effectiveVoltageDistortionPowerVar: 3 * VeH * Ie1,
		effectiveHarmonicApparentPowerVA: 3 * VeH * IeH,
		effectiveNonActivePowerVar: sqrtPos(Se * Se - P * P),
		sequenceOrder: swap ? 'phases-2-3-swapped' : 'as-labelled',
		positiveSequenceVoltage: vSeq.positive,
		positiveSequenceCurrent: iSeq.positive,
		positiveSequenceActivePowerW: 3 * s1p.re,
		positiveSequenceReactivePowerVar: 3 * s1p.im,
		positiveSequenceApparentPowerVA: S1p,
		positiveSequenceAngleDeg: phasorArgDeg(s1p),
		fundamentalUnbalancePowerVA: sqrtPos(Se1 * Se1 - S1p * S1p),
		effectivePowerFactor: Se > 0 ? P / Se : NaN,
		positiveSequencePowerFactor: S1p > 0 ? (3 * s1p.re) / S1p : NaN,
		effectiveHarmonicPollutionRatio: Se1 > 0 ? sqrtPos(Se * Se - Se1 * Se1) / Se1 : NaN,
		arithmeticApparentPowerVA:
			c.voltageRmsV[0] * c.currentRmsA[0] + c.voltageRmsV[1] * c.currentRmsA[1] + c.voltageRmsV[2] * c.currentRmsA[2],
		vectorApparentPowerVA: Math.hypot(P, q1),
	};
}

/** One phase for threePhasePowerFromHarmonics: harmonic sets on the shared window and optional time-domain totals. */
export interface ThreePhaseInputPhase {
	voltage: HarmonicSet;
	current: HarmonicSet;
	totals?: TimeDomainTotals;
}

/**
 * IEEE 1459-2010 three-phase quantities from the harmonic sets of three V/I pairs on one window.
 * Line-to-line and neutral RMS values are summed per order from the phasor differences and sums unless
 * given from the time domain (recommended: the sets miss interharmonics and orders above maxOrder).
 * @param phases  phases 1, 2, 3 in rotation order as labelled (pairPowerChannels)
 * @param opts.lineVoltageRmsV  time-domain RMS of v1−v2, v2−v3, v3−v1, V
 * @param opts.neutralCurrentRmsA  time-domain RMS of the measured neutral, or of i1+i2+i3, A
 * @param opts.neutralCurrent  harmonic set of a measured neutral channel (its fundamental is used for I_e1)
 * @throws RangeError when a set lacks order 1
 * @example threePhasePowerFromHarmonics('4-wire', [l1, l2, l3]).effectiveApparentPowerVA // 7076.97 for docs/methods.md §5.4
 */
export function threePhasePowerFromHarmonics(
	wiring: PowerWiring,
	phases: Three<ThreePhaseInputPhase>,
	opts: { lineVoltageRmsV?: Three<number>; neutralCurrentRmsA?: number; neutralCurrent?: HarmonicSet } = {},
): ThreePhasePower {
	for (const p of phases)
		if (!p.voltage.orders[1] || !p.current.orders[1])
			throw new RangeError('harmonic sets must hold order 1 (the fundamental)');
	const orders = minOf(phases.flatMap((p) => [p.voltage.orders.length, p.current.orders.length]));
	const perOrderRms = (f: (h: number) => ComplexPhasor) => {
		let s = 0;
		for (let h = 0; h < orders; h++) {
			const x = f(h);
			s += x.re * x.re + x.im * x.im;
		}
		return Math.sqrt(s);
	};
	const v = (k: number, h: number) => phasorFromHarmonic(phases[k].voltage.orders[h]);
	const i = (k: number, h: number) => phasorFromHarmonic(phases[k].current.orders[h]);
	const lineVoltageRmsV =
		opts.lineVoltageRmsV ??
		([0, 1, 2].map((k) => perOrderRms((h) => phasorSub(v(k, h), v((k + 1) % 3, h)))) as Three<number>);
	const neutralCurrentRmsA =
		opts.neutralCurrentRmsA ??
		(opts.neutralCurrent
			? rmsFromHarmonicSet(opts.neutralCurrent)
			: perOrderRms((h) => phasorAdd(phasorAdd(i(0, h), i(1, h)), i(2, h))));
	return ieee1459ThreePhaseFromComponents({
		wiring,
		voltageRmsV: phases.map((p) => p.totals?.voltageRmsV ?? rmsFromHarmonicSet(p.voltage)) as Three<number>,
		currentRmsA: phases.map((p) => p.totals?.currentRmsA ?? rmsFromHarmonicSet(p.current)) as Three<number>,
		lineVoltageRmsV,
		neutralCurrentRmsA,
		v1: [v(0, 1), v(1, 1), v(2, 1)],
		i1: [i(0, 1), i(1, 1), i(2, 1)],
		...(opts.neutralCurrent?.orders[1] ? { i1Neutral: phasorFromHarmonic(opts.neutralCurrent.orders[1]) } : {}),
		activePowerW: phases.map(
			(p) => p.totals?.activePowerW ?? activePowerFromHarmonicsW(p.voltage, p.current),
		) as Three<number>,
	});
}

function sqrtPos(x: number): number {
	return x > 0 ? Math.sqrt(x) : x <= 0 ? 0 : NaN;
}
