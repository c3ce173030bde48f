/**
 * Neutral conductor of a four- or five-core cable carrying triplen harmonic current: the neutral current
 * the recording implies and the IEC 60364-5-52 Annex E reduction factors, saying which current the
 * cable must be chosen for.
 */
import { fmt, recorded } from './common.js';
import { NEXT_STEP_CAUTION, type NextStep } from './types.js';
import { maxOf } from '../signal/extremes.js';

/**
 * IEC 60364-5-52:2009 Annex E, Table E.52.1 (from memory): third-harmonic content of the phase current
 * (upper bound of the band, percent) -> which current the size is chosen on, and the reduction factor.
 */
export const NEUTRAL_REDUCTION_BANDS = [
	{ upToPercent: 15, basis: 'phase', factor: 1.0 },
	{ upToPercent: 33, basis: 'phase', factor: 0.86 },
	{ upToPercent: 45, basis: 'neutral', factor: 0.86 },
	{ upToPercent: Infinity, basis: 'neutral', factor: 1.0 },
] as const;

export interface NeutralSizing {
	basis: 'phase' | 'neutral';
	factor: number;
	/** The neutral current the Annex assumes: 3 × third-harmonic fraction × phase current, A. */
	annexNeutralA: number;
	/** Current the cable's current-carrying capacity must reach: basis current ÷ factor, A. */
	designCurrentA: number;
}

/**
 * The Annex E rule for a balanced three-phase load: band from the third-harmonic content, neutral current
 * I_N = 3 · (h3/100) · I_phase, design current = (I_phase or I_N) / factor.
 * Ref: IEC 60364-5-52:2009, Annex E, Table E.52.1 and its example (from memory).
 * @example neutralSizing(39, 40) // { basis: 'neutral', factor: 0.86, annexNeutralA: 46.8, designCurrentA: 54.4 }
 */
export function neutralSizing(phaseCurrentA: number, thirdHarmonicPercent: number): NeutralSizing {
	if (!(phaseCurrentA >= 0) || !(thirdHarmonicPercent >= 0))
		throw new RangeError(
			`phase current and third-harmonic content must be >= 0, got ${phaseCurrentA} A, ${thirdHarmonicPercent} %`,
		);
	const band = NEUTRAL_REDUCTION_BANDS.find((b) => thirdHarmonicPercent <= b.upToPercent)!;
	const annexNeutralA = (3 * thirdHarmonicPercent * phaseCurrentA) / 100;
	const basisA = band.basis === 'phase' ? phaseCurrentA : annexNeutralA;
	return { basis: band.basis, factor: band.factor, annexNeutralA, designCurrentA: basisA / band.factor };
}

export interface NeutralConductorResult extends NeutralSizing {
	phaseCurrentA: number;
	thirdHarmonicPercent: number;
	recordedNeutralA: number;
	/** Design current with the recorded neutral current when that is larger than the Annex's, A. */
	designCurrentRecordedA: number;
}

const METHOD = [
	'Third-harmonic content of the phase current (3rd as % of the fundamental, the largest phase): 0-15 % -> size on the phase current, factor 1.0; 15-33 % -> phase current, 0.86; 33-45 % -> neutral current, 0.86; above 45 % -> neutral current, 1.0 (IEC 60364-5-52:2009 Annex E, Table E.52.1, from memory).',
	'Neutral current as the Annex takes it: I_N = 3 × third-harmonic fraction × phase current; design current = chosen current ÷ factor (IEC 60364-5-52:2009 Annex E example, from memory).',
];

/**
 * The neutral-conductor step from a three-phase current set and its neutral (measured or summed).
 * @param phases  the three phase currents: RMS, A, and third harmonic, % of the fundamental
 */
export function neutralConductor(
	phases: { channel: string; rmsA: number; thirdPercent: number }[],
	neutral: { rmsA: number; measured: boolean },
): NextStep<NeutralConductorResult> {
	const phaseA = maxOf(phases.map((p) => p.rmsA));
	const h3 = maxOf(phases.map((p) => p.thirdPercent));
	const s = neutralSizing(phaseA, h3);
	const designRecorded =
		s.basis === 'neutral' && neutral.rmsA > s.annexNeutralA ? neutral.rmsA / s.factor : s.designCurrentA;
	const result: NeutralConductorResult = {
		...s,
		phaseCurrentA: phaseA,
		thirdHarmonicPercent: h3,
		recordedNeutralA: neutral.rmsA,
		designCurrentRecordedA: designRecorded,
	};
	const basisA = s.basis === 'phase' ? phaseA : s.annexNeutralA;
	const which = `the ${s.basis} current${s.basis === 'neutral' ? ` (3 × ${fmt(h3 / 100, 2)} × ${fmt(phaseA, 1)} A = ${fmt(basisA, 1)} A)` : ''}: ${s.factor === 1 ? `${fmt(basisA, 1)} A, no reduction factor` : `${fmt(basisA, 1)} A ÷ ${s.factor} = ${fmt(s.designCurrentA, 1)} A`}`;
	const conclusions = [`Third harmonic ${fmt(h3, 1)} % of the phase current: choose the cable for ${which}.`];
	if (designRecorded > s.designCurrentA)
		conclusions.push(
			`The recorded neutral current (${fmt(neutral.rmsA, 1)} A) is above the Annex's estimate: chosen on it, the cable needs ${fmt(designRecorded, 1)} A.`,
		);
	const warnings =
		neutral.rmsA > phaseA
			? [
					`The neutral carries ${fmt(neutral.rmsA, 1)} A, more than the largest phase (${fmt(phaseA, 1)} A): check the neutral's cross-section and its terminations.`,
				]
			: [];
	return {
		step: 'neutral-conductor',
		title: 'Neutral conductor',
		status: 'result',
		finding: `${neutral.measured ? 'Measured' : 'Computed (sum of the phases)'} neutral current ${fmt(neutral.rmsA, 1)} A with phase currents up to ${fmt(phaseA, 1)} A; third harmonic up to ${fmt(h3, 1)} % of the fundamental.`,
		method: METHOD,
		inputs: [
			...phases.flatMap((p) => [
				recorded(`${p.channel} RMS current`, p.rmsA, 'A'),
				recorded(`${p.channel} third harmonic`, p.thirdPercent, '% of fundamental'),
			]),
			recorded('neutral RMS current', neutral.rmsA, 'A'),
		],
		needs: [],
		result,
		conclusions,
		assumptions: [
			'Applies to balanced three-phase circuits in four- or five-core cables whose neutral is of the same material and cross-section as the phases.',
			'The currents are those of this recording; size on the circuit design current (maximum demand), scaling these figures to it.',
			'Other rating factors (grouping, ambient temperature, installation method) still apply.',
		],
		warnings,
		caution: NEXT_STEP_CAUTION,
	};
}
