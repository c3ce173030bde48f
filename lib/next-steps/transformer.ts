/**
 * Transformer loading under harmonic current: the harmonic loss factor for winding eddy-current loss and
 * the maximum load current of a standard transformer (IEEE C57.110), the UL K-factor and the K-rated
 * class that covers it, and the BS 7821-4 factor K derating.
 */
import { factorK, ulKFactor } from '../spectrum/distortion.js';
import { fmt, given, recorded, statusOf } from './common.js';
import { NEXT_STEP_CAUTION, type NextStep, type SiteInputs } from './types.js';

/** K-rated transformer classes (UL 1561/1562; list READ on a public calculator page, classes are common practice). */
export const K_RATED_CLASSES = [4, 9, 13, 20, 30, 40, 50] as const;

/** Exponent q of the factor K for round or rectangular conductors (BS 7821-4 / HD 538.3, from memory). */
export const FACTOR_K_EXPONENT_Q = 1.7;

/**
 * Harmonic loss factor for winding eddy-current loss: F_HL = Σ (I_h/I_1)² h² / Σ (I_h/I_1)², h = 1…H.
 * Equal to the UL K-factor on the same orders (both are ratios of the same sums).
 * Ref: IEEE C57.110-2008, 5.2 (from memory).
 * @param rmsByOrder  current RMS by order (index = order; index 0, DC, is ignored)
 */
export function harmonicLossFactor(rmsByOrder: ArrayLike<number>, maxOrder?: number): number {
	return ulKFactor(rmsByOrder, maxOrder);
}

/**
 * Maximum permissible non-sinusoidal load current of a transformer, per unit of its rated current:
 * I_max(pu) = √( P_LL-R(pu) / (1 + F_HL · P_EC-R(pu)) ), with losses in per unit of the rated I²R loss
 * and P_LL-R(pu) = 1 + P_EC-R(pu) (other stray loss neglected: the winding hot-spot criterion of a
 * dry-type transformer).
 * Ref: IEEE C57.110-2008, 5.2.3 (from memory).
 * @example maxLoadCurrentPu(0.08, 4) // √(1.08 / 1.32) = 0.9045
 */
export function maxLoadCurrentPu(eddyLossPu: number, fhl: number): number {
	if (!(eddyLossPu >= 0) || !(fhl >= 1 - 1e-9)) return NaN;
	return Math.sqrt((1 + eddyLossPu) / (1 + fhl * eddyLossPu));
}

/** The smallest K-rated class at or above K; 1 when K ≤ 1 (a standard transformer); NaN above K-50. */
export function kRatedClass(k: number): number {
	if (!Number.isFinite(k)) return NaN;
	if (k <= 1 + 1e-9) return 1;
	return K_RATED_CLASSES.find((c) => c >= k - 1e-9) ?? NaN;
}

export interface TransformerResult {
	channel: string;
	harmonicLossFactor: number;
	kFactor: number;
	kRatedClass: number;
	/** NaN without P_EC-R. */
	maxLoadCurrentPu: number;
	/** BS 7821-4 factor K with e = P_EC-R and q = 1.7; NaN without P_EC-R. */
	factorK: number;
	/** Rated kVA × I_max(pu); NaN without the rating. */
	maxLoadKva: number;
	/** Rated current per phase S / (3 · V_phase) at the recorded phase voltage, A; NaN without the rating or a paired voltage. */
	ratedCurrentA: number;
	/** The recorded current of that channel per unit of the rated current; NaN as above. */
	loadPu: number;
}

const TITLE = 'Transformer loading under harmonic current';
const METHOD = [
	'Harmonic loss factor for winding eddy-current loss: F_HL = Σ (I_h/I_1)² h² / Σ (I_h/I_1)² (IEEE C57.110-2008, 5.2, from memory); the UL K-factor is the same ratio (UL 1561).',
	'Maximum load current: I_max(pu) = √(P_LL-R(pu) / (1 + F_HL · P_EC-R(pu))), P_LL-R(pu) = 1 + P_EC-R(pu) (IEEE C57.110-2008, 5.2.3, from memory).',
	'K-rated classes K-4, 9, 13, 20, 30, 40, 50: the class at or above the K-factor (UL 1561/1562, common practice).',
	'Factor K = √(1 + e/(1+e) · (I_1/I)² · Σ_{n≥2} n^q (I_n/I_1)²), e = P_EC-R, q = 1.7; derate to 1/K (BS 7821-4 / HD 538.3 S1, from memory).',
];

/** What the figures mean for the worst channel: its class, the load a standard transformer carries, the load recorded. */
function loadingSentences(
	w: { channel: string; rmsA?: number; phaseVoltageV?: number },
	r: TransformerResult,
	site: SiteInputs,
	several: boolean,
): { conclusions: string[]; warnings: string[] } {
	const conclusions = [
		`Harmonic loss factor F_HL (= K-factor) ${fmt(r.harmonicLossFactor, 2)} on ${w.channel}${several ? ' (the highest of the current channels)' : ''}.`,
	];
	conclusions.push(
		r.kRatedClass === 1
			? 'A standard (K-1) transformer carries this current spectrum without a K-rating.'
			: Number.isFinite(r.kRatedClass)
				? `If a K-rated transformer is chosen, K-${r.kRatedClass} or above covers this load.`
				: 'The K-factor is above the K-50 class: ask the maker.',
	);
	if (Number.isFinite(r.maxLoadCurrentPu))
		conclusions.push(
			`A standard transformer may carry at most ${fmt(r.maxLoadCurrentPu * 100, 0)} % of its rated current with this spectrum${Number.isFinite(r.maxLoadKva) ? ` (${fmt(r.maxLoadKva, 0)} kVA of ${fmt(site.transformerKva!, 0)} kVA)` : ''}; BS 7821 factor K ${fmt(r.factorK, 3)} derates it to ${fmt(100 / r.factorK, 0)} %.`,
		);
	const warnings: string[] = [];
	if (Number.isFinite(r.loadPu)) {
		conclusions.push(
			`${w.channel} carries ${fmt(w.rmsA!, 1)} A, ${fmt(r.loadPu * 100, 0)} % of the rated ${fmt(r.ratedCurrentA, 0)} A per phase at ${fmt(w.phaseVoltageV!, 0)} V (if this recording is the transformer's whole load).`,
		);
		if (r.loadPu > r.maxLoadCurrentPu)
			warnings.push(
				`${w.channel} at ${fmt(r.loadPu * 100, 0)} % of rated current is above the ${fmt(r.maxLoadCurrentPu * 100, 0)} % a standard transformer carries with this spectrum.`,
			);
	}
	return { conclusions, warnings };
}

/**
 * The transformer step for the current channel with the highest K-factor.
 * @throws RangeError when no channel has a K-factor (no harmonics)
 * @param currents  each current channel's RMS by order (index = order) up to `maxOrder`; with its true RMS
 *   and the phase voltage it is paired with, the recorded load is also set against the rated current
 */
export function transformerLoading(
	currents: { channel: string; rmsByOrder: number[]; rmsA?: number; phaseVoltageV?: number }[],
	maxOrder: number,
	site: SiteInputs,
): NextStep<TransformerResult> {
	const scored = currents
		.map((c) => ({ ...c, k: ulKFactor(c.rmsByOrder, Math.min(maxOrder, c.rmsByOrder.length - 1)) }))
		.filter((c) => Number.isFinite(c.k));
	const worst = scored.sort((a, b) => b.k - a.k)[0];
	if (!worst) throw new RangeError('transformerLoading needs at least one current channel with harmonics');
	const pec = site.transformerEddyLossPu;
	const needs: string[] = [];
	if (pec === undefined)
		needs.push(
			"the transformer's winding eddy-current loss as a fraction of its I²R loss (P_EC-R, from its test report or maker)",
		);
	if (site.transformerKva === undefined) needs.push('the transformer kVA');
	const top = Math.min(maxOrder, worst.rmsByOrder.length - 1);
	const fhl = harmonicLossFactor(worst.rmsByOrder, top);
	const imax = pec === undefined ? NaN : maxLoadCurrentPu(pec, fhl);
	const fk = pec === undefined ? NaN : factorK(worst.rmsByOrder, pec, FACTOR_K_EXPONENT_Q, top);
	const ratedA =
		site.transformerKva !== undefined && worst.phaseVoltageV !== undefined && worst.phaseVoltageV > 0
			? (site.transformerKva * 1000) / (3 * worst.phaseVoltageV)
			: NaN;
	const loadPu = (worst.rmsA ?? NaN) / ratedA;
	const result: TransformerResult = {
		channel: worst.channel,
		harmonicLossFactor: fhl,
		kFactor: worst.k,
		kRatedClass: kRatedClass(worst.k),
		maxLoadCurrentPu: imax,
		factorK: fk,
		maxLoadKva: site.transformerKva === undefined ? NaN : site.transformerKva * imax,
		ratedCurrentA: ratedA,
		loadPu,
	};
	const { conclusions, warnings } = loadingSentences(worst, result, site, scored.length > 1);
	return {
		step: 'transformer-loading',
		title: TITLE,
		status: statusOf(true, needs),
		finding: `${worst.channel}: K-factor ${fmt(worst.k, 2)} from harmonics to order ${top}.`,
		method: METHOD,
		inputs: [
			recorded(`${worst.channel} current harmonics to order`, top, ''),
			recorded(`${worst.channel} RMS current`, worst.rmsA ?? NaN, 'A'),
			recorded('phase voltage it is paired with', worst.phaseVoltageV ?? NaN, 'V'),
			given('transformer winding eddy-current loss P_EC-R', pec, 'pu of I²R loss'),
			given('transformer rating', site.transformerKva, 'kVA'),
		],
		needs,
		result,
		conclusions,
		assumptions: [
			'The spectrum recorded is the one at full load; other stray loss neglected (dry-type winding hot spot); for liquid-filled units the top-oil criterion of IEEE C57.110 also applies.',
			`Factor K with q = ${FACTOR_K_EXPONENT_Q} (round or rectangular conductors; 1.5 for foil windings).`,
		],
		warnings,
		caution: NEXT_STEP_CAUTION,
	};
}
