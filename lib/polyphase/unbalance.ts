/**
 * Voltage and current unbalance under the definitions users confuse, each named in the output:
 * IEC VUF (|V2|/|V1|), |V0|/|V1|, NEMA LVUR (line voltages), IEEE PVUR (phase voltages), and the
 * IEC β formula from line-voltage magnitudes alone.
 */
import { phasorAbs, phasorSub, type ComplexPhasor } from '../phasor/phasor.js';
import { symmetricalComponents } from '../phasor/sequence.js';

/** One unbalance figure with its name and definition, so a report never shows a bare "unbalance %". */
export interface UnbalanceFigure {
	/** Stable code: 'vuf-iec', 'zero-sequence-ratio', 'vuf-beta', 'lvur-nema', 'pvur-ieee', 'pvur-ieee-max-min', 'iuf-negative', 'iuf-zero', 'current-max-deviation'. */
	code: string;
	/** Short name as users know it. */
	name: string;
	/** The formula in words. */
	definition: string;
	/** Where it comes from (the provenance tag says how sure). */
	reference: string;
	percent: number;
}

const ROTATION_NOTE: Record<MeasuredRotation, string> = {
	positive: '',
	negative: ' (the phase labels run in negative rotation, so the dominant sequence is taken as the positive one)',
};

/** The dominant (major) and the other (minor) of |X1| and |X2|, and which one dominates. */
function dominantSequence(
	positiveRms: number,
	negativeRms: number,
): { major: number; minor: number; measuredRotation: MeasuredRotation } {
	return negativeRms > positiveRms
		? { major: negativeRms, minor: positiveRms, measuredRotation: 'negative' }
		: { major: positiveRms, minor: negativeRms, measuredRotation: 'positive' };
}

/** NEMA-style rate: max |x − mean| / mean × 100 over three magnitudes. NaN when the mean is 0. */
export function maxDeviationFromMeanPercent(a: number, b: number, c: number): number {
	const avg = (a + b + c) / 3;
	if (!(avg > 0)) return NaN;
	return (100 * Math.max(Math.abs(a - avg), Math.abs(b - avg), Math.abs(c - avg))) / avg;
}

/**
 * Voltage unbalance factor from the three line-to-line magnitudes only (no angles needed), IEC 61000-4-30.
 *
 * β = (U12⁴ + U23⁴ + U31⁴) / (U12² + U23² + U31²)²;   u2 = √((1 − √(3 − 6β)) / (1 + √(3 − 6β))) × 100 %
 *
 * Exact for the fundamental line voltages of a 3-wire set (they close a triangle, so they hold no zero
 * sequence); applied to true-RMS values it approximates. Also returns NEMA LVUR of the same magnitudes.
 * Ref: IEC 61000-4-30:2015, 5.7.2 (from memory; verified numerically in docs/methods.md §7 (computed by docs/check-vectors.py));
 * NEMA MG 1, 14.35 (LVUR) (from memory; published examples read, docs/methods.md §7).
 * @returns betaRatio in [1/3, 1/2]; vufPercent NaN when β is outside that range (magnitudes that cannot close a triangle)
 * @example lineMagnitudeUnbalance(460, 467, 450) // { betaRatio: 0.33364020, vufPercent: 2.1465, lvurPercent: 1.9608, ... }
 */
export function lineMagnitudeUnbalance(
	u12: number,
	u23: number,
	u31: number,
): { betaRatio: number; vufPercent: number; lvurPercent: number; figures: UnbalanceFigure[] } {
	const s2 = u12 * u12 + u23 * u23 + u31 * u31;
	const betaRatio = s2 > 0 ? (u12 ** 4 + u23 ** 4 + u31 ** 4) / (s2 * s2) : NaN;
	const root = 3 - 6 * betaRatio;
	const r = root >= 0 ? Math.sqrt(root) : NaN;
	// β slightly under 1/3 happens only through rounding of a perfectly balanced set: treat as 0 %.
	const vufPercent =
		betaRatio > 0.5 + 1e-12 ? NaN : Number.isNaN(r) ? NaN : 100 * Math.sqrt(Math.max(0, (1 - r) / (1 + r)));
	const lvurPercent = maxDeviationFromMeanPercent(u12, u23, u31);
	return {
		betaRatio,
		vufPercent,
		lvurPercent,
		figures: [
			{
				code: 'vuf-beta',
				name: 'VUF from line magnitudes (IEC β formula)',
				definition: '√((1 − √(3 − 6β)) / (1 + √(3 − 6β))), β = ΣU⁴/(ΣU²)² over the three line voltages',
				reference: 'IEC 61000-4-30:2015, 5.7.2 (from memory)',
				percent: vufPercent,
			},
			lvurFigure(lvurPercent),
		],
	};
}

function lvurFigure(percent: number): UnbalanceFigure {
	return {
		code: 'lvur-nema',
		name: 'LVUR (NEMA line-voltage unbalance rate)',
		definition: 'max deviation of the line-voltage magnitudes from their average / average',
		reference: 'NEMA MG 1, 14.35 (from memory)',
		percent,
	};
}

/**
 * Which sequence dominates a set as labelled: 'positive' normally; 'negative' when the phase labels run
 * against the actual rotation (two phases swapped). Unbalance ratios are then taken against the dominant
 * sequence, i.e. in the measured rotation, as the magnitude-only β formula (which cannot see rotation) does.
 */
export type MeasuredRotation = 'positive' | 'negative';

/** Voltage unbalance of a three-phase set of line-to-neutral fundamental phasors. */
export interface VoltageUnbalance {
	/** IEC VUF = |V2|/|V1| × 100 in the measured rotation (= minor/major sequence), %. */
	vufPercent: number;
	/** |V0|/|V1| × 100 in the measured rotation (|V0| over the dominant sequence), %. */
	zeroSequencePercent: number;
	/** Sequence that dominates as labelled; 'negative' means the labels run against the rotation. */
	measuredRotation: MeasuredRotation;
	/** NEMA LVUR of the line-voltage magnitudes |Va − Vb|, |Vb − Vc|, |Vc − Va|, %. */
	lvurPercent: number;
	/** IEEE PVUR = max deviation of the phase magnitudes from their average / average × 100, %. */
	pvurPercent: number;
	/** Older IEEE variant (max − min)/average of the phase magnitudes × 100, %. */
	pvurMaxMinPercent: number;
	/** All of the above, named, plus the β formula on the derived line magnitudes. */
	figures: UnbalanceFigure[];
}

/**
 * Every voltage-unbalance definition of a set of line-to-neutral fundamental phasors (Va, Vb, Vc).
 * Ratios are taken in the measured rotation: when the labels run in negative rotation (|V2| > |V1| as
 * labelled), the roles of V1 and V2 swap, so a mislabelled but healthy supply does not read 5000 %.
 * Ref: IEC 61000-4-30:2015, 5.7.1 (u2 = |U2|/|U1|, u0 = |U0|/|U1|) (from memory); NEMA MG 1, 14.35
 * (from memory); IEEE Std 141 / Pillay & Manyage, IEEE Power Eng. Review 21(5), 2001 (PVUR) (from memory).
 * @returns percentages; NaN when |V1| (or the average magnitude) is 0
 * @example voltageUnbalance(230∠0°, 220∠−118°, 235∠121°).vufPercent // 2.7699 (docs/methods.md §5.4, computed)
 */
export function voltageUnbalance(va: ComplexPhasor, vb: ComplexPhasor, vc: ComplexPhasor): VoltageUnbalance {
	const seq = symmetricalComponents(va, vb, vc);
	const { major: v1, minor: v2, measuredRotation } = dominantSequence(seq.positiveRms, seq.negativeRms);
	const vufPercent = v1 > 0 ? (100 * v2) / v1 : NaN;
	const zeroSequencePercent = v1 > 0 ? (100 * seq.zeroRms) / v1 : NaN;
	const ma = phasorAbs(va);
	const mb = phasorAbs(vb);
	const mc = phasorAbs(vc);
	const avg = (ma + mb + mc) / 3;
	const pvurPercent = maxDeviationFromMeanPercent(ma, mb, mc);
	const pvurMaxMinPercent = avg > 0 ? (100 * (Math.max(ma, mb, mc) - Math.min(ma, mb, mc))) / avg : NaN;
	const line = lineMagnitudeUnbalance(
		phasorAbs(phasorSub(va, vb)),
		phasorAbs(phasorSub(vb, vc)),
		phasorAbs(phasorSub(vc, va)),
	);
	return {
		vufPercent,
		zeroSequencePercent,
		measuredRotation,
		lvurPercent: line.lvurPercent,
		pvurPercent,
		pvurMaxMinPercent,
		figures: [
			{
				code: 'vuf-iec',
				name: 'VUF (IEC negative-sequence unbalance u2)',
				definition: `|V2| / |V1| of the fundamental phasors${ROTATION_NOTE[measuredRotation]}`,
				reference: 'IEC 61000-4-30:2015, 5.7.1; EN 50160 (from memory)',
				percent: vufPercent,
			},
			{
				code: 'zero-sequence-ratio',
				name: 'Zero-sequence unbalance u0',
				definition: `|V0| / |V1| of the fundamental phasors${ROTATION_NOTE[measuredRotation]}`,
				reference: 'IEC 61000-4-30:2015, 5.7.1 (from memory)',
				percent: zeroSequencePercent,
			},
			...line.figures,
			{
				code: 'pvur-ieee',
				name: 'PVUR (IEEE phase-voltage unbalance rate)',
				definition: 'max deviation of the phase-voltage magnitudes from their average / average',
				reference: 'IEEE Std 141 (from memory); Pillay & Manyage 2001 (from memory)',
				percent: pvurPercent,
			},
			{
				code: 'pvur-ieee-max-min',
				name: 'PVUR, older IEEE variant',
				definition: '(max − min) of the phase-voltage magnitudes / average',
				reference: 'older IEEE texts (from memory)',
				percent: pvurMaxMinPercent,
			},
		],
	};
}

/**
 * Voltage unbalance from line-to-line fundamental phasors (a 3-wire capture of U12, U23, U31).
 * Line voltages carry no zero sequence, so only VUF = |V2|/|V1| and NEMA LVUR are defined.
 * @example lineVoltageUnbalance(u12, u23, u31).vufPercent // 2.1465 for the 460/467/450 V triangle
 */
export function lineVoltageUnbalance(
	v12: ComplexPhasor,
	v23: ComplexPhasor,
	v31: ComplexPhasor,
): { vufPercent: number; lvurPercent: number; measuredRotation: MeasuredRotation; figures: UnbalanceFigure[] } {
	const seq = symmetricalComponents(v12, v23, v31);
	const { major, minor, measuredRotation } = dominantSequence(seq.positiveRms, seq.negativeRms);
	const vufPercent = major > 0 ? (100 * minor) / major : NaN;
	const lvurPercent = maxDeviationFromMeanPercent(phasorAbs(v12), phasorAbs(v23), phasorAbs(v31));
	return {
		vufPercent,
		lvurPercent,
		measuredRotation,
		figures: [
			{
				code: 'vuf-iec',
				name: 'VUF (IEC negative-sequence unbalance u2)',
				definition: `|V2| / |V1| of the fundamental line-voltage phasors${ROTATION_NOTE[measuredRotation]}`,
				reference: 'IEC 61000-4-30:2015, 5.7.1 (from memory)',
				percent: vufPercent,
			},
			lvurFigure(lvurPercent),
		],
	};
}

/**
 * Current unbalance of three line-current fundamental phasors, named like the voltage figures.
 * @returns negative- and zero-sequence ratios |I2|/|I1|, |I0|/|I1| and the max deviation of magnitudes, %
 * @example currentUnbalance(10∠−30°, 12∠−150°, 8∠90°).maxDeviationPercent // 20
 */
export function currentUnbalance(
	ia: ComplexPhasor,
	ib: ComplexPhasor,
	ic: ComplexPhasor,
): {
	negativeSequencePercent: number;
	zeroSequencePercent: number;
	maxDeviationPercent: number;
	measuredRotation: MeasuredRotation;
	figures: UnbalanceFigure[];
} {
	const seq = symmetricalComponents(ia, ib, ic);
	const { major: i1, minor: i2, measuredRotation } = dominantSequence(seq.positiveRms, seq.negativeRms);
	const negativeSequencePercent = i1 > 0 ? (100 * i2) / i1 : NaN;
	const zeroSequencePercent = i1 > 0 ? (100 * seq.zeroRms) / i1 : NaN;
	const maxDeviationPercent = maxDeviationFromMeanPercent(phasorAbs(ia), phasorAbs(ib), phasorAbs(ic));
	return {
		negativeSequencePercent,
		zeroSequencePercent,
		maxDeviationPercent,
		measuredRotation,
		figures: [
			{
				code: 'iuf-negative',
				name: 'Current unbalance, negative sequence',
				definition: `|I2| / |I1| of the fundamental phasors${ROTATION_NOTE[measuredRotation]}`,
				reference: 'by analogy with IEC 61000-4-30 u2 (common practice)',
				percent: negativeSequencePercent,
			},
			{
				code: 'iuf-zero',
				name: 'Current unbalance, zero sequence',
				definition: '|I0| / |I1| (|I0| = one third of the fundamental neutral current)',
				reference: 'common practice',
				percent: zeroSequencePercent,
			},
			{
				code: 'current-max-deviation',
				name: 'Current unbalance, max deviation from average',
				definition: 'max deviation of the line-current magnitudes from their average / average',
				reference: 'NEMA-style rate applied to currents (common practice)',
				percent: maxDeviationPercent,
			},
		],
	};
}
