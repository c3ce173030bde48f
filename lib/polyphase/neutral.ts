/**
 * Neutral current: measured when a channel exists, otherwise the sum of the phase currents, with its
 * triplen-harmonic content and its size against the phase currents.
 */
import type { HarmonicSet } from '../spectrum/types.js';
import { phasorAbs, phasorAdd, phasorArgDeg, phasorFromHarmonic } from '../phasor/phasor.js';
import { maxOf } from '../signal/extremes.js';

/**
 * Neutral current samples of a 4-wire system from the line currents: i_N = i1 + i2 + i3 (new array).
 * Sign: the current returning in the neutral, when the line currents are measured towards the load.
 * Ref: Kirchhoff's current law.
 * @throws RangeError for arrays of unequal length
 */
export function sumPhaseCurrents(i1: Float64Array, i2: Float64Array, i3: Float64Array): Float64Array {
	if (i1.length !== i2.length || i1.length !== i3.length)
		throw new RangeError(`current channels differ in length: ${i1.length}, ${i2.length}, ${i3.length} samples`);
	const out = new Float64Array(i1.length);
	for (let n = 0; n < out.length; n++) out[n] = i1[n] + i2[n] + i3[n];
	return out;
}

/**
 * Harmonic set of the sum of three channels, order by order (phasor sum): the neutral current's spectrum
 * from the three phase-current sets of one window.
 * @throws RangeError when the sets come from different windows
 */
export function sumHarmonicSets(a: HarmonicSet, b: HarmonicSet, c: HarmonicSet): HarmonicSet {
	if (
		a.startS !== b.startS ||
		a.startS !== c.startS ||
		a.fundamentalHz !== b.fundamentalHz ||
		a.fundamentalHz !== c.fundamentalHz
	) {
		throw new RangeError('harmonic sets come from different windows: their phasors cannot be added');
	}
	const n = Math.min(a.orders.length, b.orders.length, c.orders.length);
	const orders = [];
	for (let h = 0; h < n; h++) {
		const s = phasorAdd(
			phasorAdd(phasorFromHarmonic(a.orders[h]), phasorFromHarmonic(b.orders[h])),
			phasorFromHarmonic(c.orders[h]),
		);
		const rms = phasorAbs(s);
		// order 0 keeps the DC convention of HarmonicPhasor: 0° for a positive mean, 180° for a negative one
		orders.push({ order: h, rms, phaseDeg: rms === 0 ? NaN : phasorArgDeg(s) });
	}
	return { fundamentalHz: a.fundamentalHz, startS: a.startS, cycles: a.cycles, orders };
}

/** Neutral-current figures. */
export interface NeutralCurrentFigures {
	/** 'measured' from a neutral channel, 'computed' as the sum of the phase currents. */
	source: 'measured' | 'computed';
	/** True RMS of the neutral current, A. */
	neutralRmsA: number;
	/** Neutral RMS as % of the mean and of the largest phase-current RMS. */
	percentOfMeanPhase: number;
	percentOfMaxPhase: number;
	/** Fundamental neutral current, A (from the set; NaN without one). */
	fundamentalRmsA: number;
	/** √Σ I_h² over triplen orders 3, 6, 9, … the set holds, A (NaN without a set). */
	triplenRmsA: number;
	/** Triplen RMS as % of the neutral RMS: near 100 % means the neutral carries mostly zero-sequence harmonics. */
	triplenPercentOfNeutral: number;
	/** Largest triplen order by RMS and its value, A (order 0 when there is none). */
	largestTriplenOrder: number;
	largestTriplenRmsA: number;
	sentence: string;
}

/**
 * Neutral-current figures from its RMS, the phase RMS values and (optionally) its harmonic set.
 *
 * Triplen harmonics (3, 9, 15 … and 6, 12 …) of a balanced set are zero sequence: they add in the
 * neutral instead of cancelling, so I_N can reach 3× the phase triplen current and exceed the phase
 * currents — the usual cause of overloaded neutrals under single-phase rectifier loads.
 * Ref: zero-sequence nature of triplen harmonics (docs/methods.md §7, from memory; textbook).
 * @param neutralRmsA  true RMS of the neutral over the window (measured channel or sumPhaseCurrents)
 * @param phaseRmsA  true RMS of the three line currents over the same window
 * @param neutralSet  harmonic set of the neutral current (lib/spectrum, or sumHarmonicSets)
 * @returns percentages NaN when the phase currents are all zero
 * @example neutralCurrentFigures('computed', 9.0, [10.44, 10.44, 10.44], set).triplenPercentOfNeutral // 100 for 3 A of 3rd per phase
 */
export function neutralCurrentFigures(
	source: 'measured' | 'computed',
	neutralRmsA: number,
	phaseRmsA: [number, number, number],
	neutralSet?: HarmonicSet,
): NeutralCurrentFigures {
	const mean = (phaseRmsA[0] + phaseRmsA[1] + phaseRmsA[2]) / 3;
	const max = maxOf(phaseRmsA);
	let triplenSq = 0;
	let largestTriplenOrder = 0;
	let largestTriplenRmsA = 0;
	if (neutralSet) {
		for (const h of neutralSet.orders) {
			if (h.order >= 3 && h.order % 3 === 0) {
				triplenSq += h.rms * h.rms;
				if (h.rms > largestTriplenRmsA) {
					largestTriplenRmsA = h.rms;
					largestTriplenOrder = h.order;
				}
			}
		}
	}
	const triplenRmsA = neutralSet ? Math.sqrt(triplenSq) : NaN;
	const fundamentalRmsA = neutralSet?.orders[1]?.rms ?? NaN;
	const percentOfMeanPhase = mean > 0 ? (100 * neutralRmsA) / mean : NaN;
	const percentOfMaxPhase = max > 0 ? (100 * neutralRmsA) / max : NaN;
	const triplenPercentOfNeutral = neutralRmsA > 0 ? (100 * triplenRmsA) / neutralRmsA : NaN;
	const what = source === 'measured' ? 'measured neutral current' : 'neutral current (sum of the phase currents)';
	let sentence = `${what} ${neutralRmsA.toFixed(2)} A RMS = ${percentOfMaxPhase.toFixed(0)} % of the largest phase current`;
	if (neutralSet && neutralRmsA > 0)
		sentence += `; triplen harmonics make up ${triplenPercentOfNeutral.toFixed(0)} % of it${largestTriplenOrder ? ` (largest: order ${largestTriplenOrder}, ${largestTriplenRmsA.toFixed(2)} A)` : ''}`;
	if (percentOfMaxPhase > 100) sentence += '; the neutral carries more than any phase: check its cross-section';
	return {
		source,
		neutralRmsA,
		percentOfMeanPhase,
		percentOfMaxPhase,
		fundamentalRmsA,
		triplenRmsA,
		triplenPercentOfNeutral,
		largestTriplenOrder,
		largestTriplenRmsA,
		sentence,
	};
}
