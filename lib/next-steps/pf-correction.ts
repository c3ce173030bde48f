/**
 * Power-factor correction from the recorded power: the reactive power a capacitor bank must supply to
 * raise the displacement power factor to a target, the parallel resonance the bank forms with the supply,
 * detuned-reactor choices, and the plain statement when a low true power factor is harmonic.
 */
import { fmt, given, recorded, statusOf } from './common.js';
import { NEXT_STEP_CAUTION, type NextStep, type SiteInputs } from './types.js';

/** Reactor ratings of detuned capacitor banks, percent of the capacitor reactance (common practice; from memory). */
export const DETUNING_REACTOR_PERCENT = [5.67, 7, 14] as const;

/** A resonance within this fraction of a recorded order is "near" it (common practice; from memory). */
export const RESONANCE_NEAR_FRACTION = 0.1;

/** A displacement power factor within this of the target meets it (power factors are read to 3 decimals). */
export const POWER_FACTOR_TOLERANCE = 0.0005;

/** An order counts as present in a current when at least this % of its fundamental (our threshold). */
export const PRESENT_ORDER_PERCENT = 1;

/** One voltage/current pair's recorded power. */
export interface PhasePowerFigures {
	label: string;
	/** P, W. */
	activeW: number;
	/** P1 = V1·I1·cos θ1, W (NaN: P is used). */
	fundamentalActiveW: number;
	/** cos θ1. */
	displacementPowerFactor: number;
	/** P / S. */
	powerFactor: number;
	character: 'inductive' | 'capacitive' | 'resistive' | null;
}

/** A current channel's harmonics, percent of its fundamental, index = order. */
export interface CurrentSpectrum {
	channel: string;
	percentByOrder: number[];
}

/**
 * Reactive power to add to raise the displacement power factor from `dpf` to `target`:
 * Qc = P1 · (tan φ1 − tan φ2), φ = arccos(PF). 0 when dpf >= target − POWER_FACTOR_TOLERANCE.
 * Ref: the power triangle (textbook; e.g. IEEE 1036-2010 clause on sizing shunt capacitors, from memory).
 * @example reactivePowerToAdd(100e3, 0.75, 0.95) // 55.3e3 var (100 kW from 0.75 to 0.95)
 */
export function reactivePowerToAdd(p1W: number, dpf: number, target: number): number {
	if (!(target > 0 && target <= 1)) throw new RangeError(`target power factor must be in (0, 1], got ${target}`);
	if (!(dpf > 0 && dpf <= 1) || !(p1W >= 0)) return NaN;
	if (dpf >= target - POWER_FACTOR_TOLERANCE) return 0;
	return p1W * (Math.tan(Math.acos(dpf)) - Math.tan(Math.acos(target)));
}

/**
 * Short-circuit power of a transformer-limited supply: Ssc ≈ S_T / z_T (upstream impedance neglected,
 * so Ssc is overstated and the resonance order with it). Ref: IEC 60909-0 (impedance of a transformer, from memory).
 * @example transformerShortCircuitKva(1000, 6) // 16 667 kVA
 */
export function transformerShortCircuitKva(ratingKva: number, impedancePercent: number): number {
	return ratingKva / (impedancePercent / 100);
}

/**
 * Order of the parallel resonance of a capacitor bank with the supply inductance: h = √(Ssc / Qc).
 * Ref: IEEE 519-2014 / IEEE 1531-2020 (from memory); textbook LC resonance.
 * @example resonanceOrder(16667, 350) // 6.90
 */
export function resonanceOrder(shortCircuitKva: number, bankKvar: number): number {
	return bankKvar > 0 && shortCircuitKva > 0 ? Math.sqrt(shortCircuitKva / bankKvar) : NaN;
}

/** Tuning order of a detuned bank with a reactor of p % of the capacitor reactance: h = 1/√p. */
export function detunedTuningOrder(reactorPercent: number): number {
	return 1 / Math.sqrt(reactorPercent / 100);
}

/**
 * Estimated true PF after correction when the harmonic current stays as recorded. With a sinusoidal
 * voltage P = V·I1·DPF and PF = DPF·DF, DF = I1/I; the harmonic current I_H = I1·√(1/DF² − 1) stays,
 * the fundamental current falls to I1·DPF/target, so PF' = DPF / √((DPF/target)² + 1/DF² − 1).
 * Ref: IEEE 1459-2010 definitions (PF = P/S, DPF = cos θ1) and the power triangle; derivation in docs/methods.md §12.
 * @example truePowerFactorAfter(0.7, 0.8, 0.95) // 0.794 (DF 0.875)
 */
export function truePowerFactorAfter(pf: number, dpf: number, target: number): number {
	const df = pf / dpf;
	if (!(df > 0 && df <= 1 + 1e-9) || !(dpf > 0)) return NaN;
	const i1 = dpf / Math.max(dpf, target);
	return dpf / Math.sqrt(i1 * i1 + Math.max(0, 1 / (df * df) - 1));
}

/** Orders 2…N present (≥ PRESENT_ORDER_PERCENT of the fundamental) in any of the currents, ascending. */
export function ordersPresent(currents: CurrentSpectrum[]): number[] {
	const out = new Set<number>();
	for (const c of currents) c.percentByOrder.forEach((p, h) => h >= 2 && p >= PRESENT_ORDER_PERCENT && out.add(h));
	return [...out].sort((a, b) => a - b);
}

export interface PfCorrectionResult {
	perPhase: {
		label: string;
		fundamentalActiveW: number;
		displacementPowerFactor: number;
		powerFactor: number;
		reactiveToAddVar: number;
	}[];
	totalReactiveToAddVar: number;
	/** The three-phase bank the resonance is worked out for: the total, or 3/n × it when n < 3 phases were recorded, var. */
	bankForResonanceVar: number;
	shortCircuitKva: number;
	shortCircuitFrom: 'supply' | 'transformer' | null;
	resonanceOrder: number;
	ordersPresent: number[];
	resonanceNearOrders: number[];
	detuned: { reactorPercent: number; tuningOrder: number; belowLowestOrderPresent: boolean }[];
	/** Estimated true PF of each phase after correction with the harmonic current as recorded. */
	truePowerFactorAfter: number[];
	/** True when the displacement PF already meets the target but the true PF does not. */
	lowPowerFactorIsHarmonic: boolean;
}

const TITLE = 'Power-factor correction';
const METHOD = [
	'Reactive power to add per phase: Qc = P1 · (tan φ1 − tan φ2), cos φ1 = measured displacement power factor, cos φ2 = target (power triangle; IEEE 1036-2010, from memory).',
	'Parallel resonance of the bank with the supply: h = √(Ssc / Qc); for a transformer-limited supply Ssc ≈ S_T / z_T (IEEE 1531-2020 / IEEE 519-2014 guidance, from memory).',
	'Detuned bank: a series reactor of p % of the capacitor reactance tunes the branch to h = 1/√p: 5.67 % -> 4.2, 7 % -> 3.78, 14 % -> 2.67 (common practice).',
	'True PF after correction with the harmonic current unchanged: PF = DPF × distortion factor, distortion factor = I1/I (IEEE 1459-2010 definitions).',
];

/** The power-factor correction step (see the file header). */
export function powerFactorCorrection(
	phases: PhasePowerFigures[],
	currents: CurrentSpectrum[],
	site: SiteInputs,
): NextStep<PfCorrectionResult> {
	const target = site.targetPowerFactor;
	const finding = phases
		.map(
			(p) =>
				`${p.label}: displacement PF ${fmt(p.displacementPowerFactor, 3)} (${p.character ?? 'unknown'}), true PF ${fmt(p.powerFactor, 3)}, P ${fmt(p.activeW / 1000, 2)} kW`,
		)
		.join('; ');
	const inputs = [
		...phases.flatMap((p) => [
			recorded(`${p.label} fundamental active power`, p.fundamentalActiveW, 'W'),
			recorded(`${p.label} displacement power factor`, p.displacementPowerFactor, ''),
		]),
		given('target displacement power factor', target, ''),
		given('short-circuit power of the supply', site.supplyShortCircuitKva, 'kVA'),
		given('transformer rating', site.transformerKva, 'kVA'),
		given('transformer impedance', site.transformerImpedancePercent, '%'),
	];
	const needs: string[] = [];
	if (target === undefined) needs.push('the target power factor');
	const ssc = shortCircuitOf(site);
	// The resonance needs the supply only when there is a bank to resonate.
	const bankNeeded =
		target === undefined ||
		phases.some((p) => p.character !== 'capacitive' && reactivePowerToAdd(1, p.displacementPowerFactor, target) > 0);
	if (ssc.kva === undefined && bankNeeded)
		needs.push('the short-circuit power at the board, or the transformer kVA and impedance');
	const step = {
		step: 'power-factor-correction' as const,
		title: TITLE,
		finding,
		method: METHOD,
		inputs,
		needs,
		caution: NEXT_STEP_CAUTION,
	};
	if (target === undefined)
		return { ...step, status: 'needs-input', result: null, conclusions: [], assumptions: [], warnings: [] };
	return { ...step, status: statusOf(true, needs), ...correctionResult(phases, currents, target, ssc) };
}

function shortCircuitOf(site: SiteInputs): { kva: number | undefined; from: 'supply' | 'transformer' | null } {
	if (site.supplyShortCircuitKva !== undefined) return { kva: site.supplyShortCircuitKva, from: 'supply' };
	if (site.transformerKva !== undefined && site.transformerImpedancePercent !== undefined)
		return {
			kva: transformerShortCircuitKva(site.transformerKva, site.transformerImpedancePercent),
			from: 'transformer',
		};
	return { kva: undefined, from: null };
}

type ShortCircuit = { kva: number | undefined; from: 'supply' | 'transformer' | null };
type PhaseNeed = PfCorrectionResult['perPhase'][number];

/** A true PF after correction more than this below the target is worth saying (0.01: two-decimal rounding, our choice). */
const TRUE_PF_SHORTFALL = 0.01;

/** kvar to add per phase (none for a leading phase) and the sentence for each. */
function perPhaseNeeds(
	phases: PhasePowerFigures[],
	target: number,
	conclusions: string[],
	warnings: string[],
): PhaseNeed[] {
	const perPhase = phases.map((p) => {
		const p1 = Number.isFinite(p.fundamentalActiveW) ? p.fundamentalActiveW : p.activeW;
		const q = p.character === 'capacitive' ? 0 : reactivePowerToAdd(p1, p.displacementPowerFactor, target);
		if (p.character === 'capacitive')
			warnings.push(
				`${p.label} draws leading (capacitive) current already: capacitors would lower its power factor further.`,
			);
		return {
			label: p.label,
			fundamentalActiveW: p1,
			displacementPowerFactor: p.displacementPowerFactor,
			powerFactor: p.powerFactor,
			reactiveToAddVar: q,
		};
	});
	phases.forEach((ph, k) => {
		const p = perPhase[k];
		const dpf = fmt(p.displacementPowerFactor, 3);
		if (p.reactiveToAddVar > 0)
			conclusions.push(
				`${p.label}: add ${fmt(p.reactiveToAddVar / 1000, 2)} kvar to raise the displacement PF from ${dpf} to ${fmt(target, 2)}.`,
			);
		else if (ph.character === 'capacitive' && p.displacementPowerFactor < target - POWER_FACTOR_TOLERANCE)
			conclusions.push(
				`${p.label}: the displacement PF ${dpf} is leading: capacitors cannot raise it; removing capacitance (or adding reactors) does.`,
			);
		else
			conclusions.push(
				`${p.label}: no capacitors needed (displacement PF ${dpf}${ph.character === 'capacitive' ? ', leading' : ''}; target ${fmt(target, 2)}).`,
			);
	});
	return perPhase;
}

/** Resonance order of the whole bank with the supply, and the orders present in the current near it. */
function resonanceNotes(
	ssc: ShortCircuit,
	total: number,
	bankVar: number,
	present: number[],
	out: { conclusions: string[]; assumptions: string[]; warnings: string[] },
): { h: number; near: number[] } {
	const h = ssc.kva === undefined || !(total > 0) ? NaN : resonanceOrder(ssc.kva, bankVar / 1000);
	if (ssc.from === 'transformer')
		out.assumptions.push(
			'Short-circuit power taken as transformer kVA ÷ per-unit impedance (the network upstream neglected): the true Ssc is lower, and so is the resonance order.',
		);
	const near = present.filter((n) => Math.abs(h - n) <= RESONANCE_NEAR_FRACTION * n);
	if (Number.isFinite(h)) {
		out.conclusions.push(
			`With the whole bank in, it would resonate with the supply near harmonic order ${fmt(h, 1)}; with fewer steps switched in, the order rises.`,
		);
		if (near.length > 0)
			out.warnings.push(
				`The resonance falls near order ${near.join(', ')}, present in the recorded current: a plain (undetuned) bank risks amplifying it. Consider a detuned bank.`,
			);
		const above = present.filter((n) => n >= h * (1 - RESONANCE_NEAR_FRACTION));
		if (near.length === 0 && above.length > 0)
			out.warnings.push(
				`Orders ${above.slice(0, 6).join(', ')} present in the current lie above the resonance: a partly switched bank can resonate with them.`,
			);
	}
	return { h, near };
}

/** The usual detuning reactors and whether each tunes safely below the lowest order present. */
function detunedOptions(present: number[], conclusions: string[]): PfCorrectionResult['detuned'] {
	const lowest = present[0] ?? NaN;
	const detuned = DETUNING_REACTOR_PERCENT.map((p) => ({
		reactorPercent: p,
		tuningOrder: detunedTuningOrder(p),
		belowLowestOrderPresent: !(detunedTuningOrder(p) >= lowest * (1 - RESONANCE_NEAR_FRACTION)),
	}));
	const fit = detuned
		.filter((d) => d.belowLowestOrderPresent)
		.map((d) => `${d.reactorPercent} % (tuned to ${fmt(d.tuningOrder, 2)})`);
	if (present.length > 0)
		conclusions.push(
			`Detuned reactors tuned safely below the lowest order present (${lowest}): ${fit.length ? fit.join(', ') : 'none of 5.67, 7, 14 %'}.`,
		);
	return detuned;
}

/** True PF after correction per phase, and whether the shortfall is harmonic (DPF meets the target, PF does not). */
function afterCorrection(
	phases: PhasePowerFigures[],
	target: number,
	conclusions: string[],
): { after: number[]; harmonic: boolean } {
	const after = phases.map((p) =>
		p.character === 'capacitive' ? NaN : truePowerFactorAfter(p.powerFactor, p.displacementPowerFactor, target),
	);
	const harmonic = phases.some((p) => p.displacementPowerFactor >= target && p.powerFactor < target);
	if (harmonic)
		conclusions.push(
			'The displacement power factor already meets the target but the true power factor does not: the shortfall is harmonic current, and capacitors will not fix it (harmonic filters or lower-distortion equipment do).',
		);
	else if (after.some((x) => x < target - TRUE_PF_SHORTFALL))
		conclusions.push(
			`With the harmonic current as recorded the true PF after correction would be about ${after.map((x) => fmt(x, 2)).join(', ')}: capacitors fix only the displacement part.`,
		);
	return { after, harmonic };
}

function correctionResult(phases: PhasePowerFigures[], currents: CurrentSpectrum[], target: number, ssc: ShortCircuit) {
	const conclusions: string[] = [];
	const assumptions = [
		'P1 and the displacement power factor are those of the recording; size the bank on the maximum demand, not on one recording.',
		`An order counts as present in the current at ${PRESENT_ORDER_PERCENT} % of the fundamental or more; a resonance within ${RESONANCE_NEAR_FRACTION * 100} % of such an order counts as near it.`,
	];
	const warnings: string[] = [];
	const perPhase = perPhaseNeeds(phases, target, conclusions, warnings);
	const total = perPhase.reduce((s, p) => s + p.reactiveToAddVar, 0);
	if (phases.length > 1 && total > 0) conclusions.push(`All phases recorded: ${fmt(total / 1000, 2)} kvar.`);
	// Ssc is a three-phase figure: the resonance is worked out for the three-phase bank.
	const bankVar = (total * 3) / Math.min(3, phases.length);
	if (phases.length < 3)
		assumptions.push(
			`Only ${phases.length} phase(s) recorded: the resonance is worked out for a balanced three-phase bank of ${fmt(bankVar / 1000, 2)} kvar (${3 / phases.length} × the recorded phases) on a three-phase supply; on a single-phase supply use its own short-circuit power and the kvar as recorded.`,
		);
	const present = ordersPresent(currents);
	const { h, near } = resonanceNotes(ssc, total, bankVar, present, { conclusions, assumptions, warnings });
	const detuned = detunedOptions(present, conclusions);
	const { after, harmonic } = afterCorrection(phases, target, conclusions);
	const result: PfCorrectionResult = {
		perPhase,
		totalReactiveToAddVar: total,
		bankForResonanceVar: bankVar,
		shortCircuitKva: ssc.kva ?? NaN,
		shortCircuitFrom: ssc.from,
		resonanceOrder: h,
		ordersPresent: present,
		resonanceNearOrders: near,
		detuned,
		truePowerFactorAfter: after,
		lowPowerFactorIsHarmonic: harmonic,
	};
	return { result, conclusions, assumptions, warnings };
}
