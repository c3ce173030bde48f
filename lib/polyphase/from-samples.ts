/**
 * Three-phase analysis from samples: one whole-cycle window (phase-1 voltage), every channel's harmonic
 * set on it, then rotation, sequence components, unbalance, line voltages, IEEE 1459 power and the neutral.
 */
import type { Diagnostic } from '../capture.js';
import {
	harmonicSetsOnReferenceWindow,
	type AnalysedWindow,
	type FromSamplesOptions,
	type PowerSampleFailure,
} from '../power/from-samples.js';
import { phasorAbs, phasorAdd, phasorFromHarmonic, phasorSub, type ComplexPhasor } from '../phasor/phasor.js';
import {
	threePhasePowerFromHarmonics,
	type PowerWiring,
	type ThreePhaseInputPhase,
	type ThreePhasePower,
} from '../power/three-phase.js';
import { activePowerFromSamplesW, powerWindowRms } from '../power/sample-span.js';
import type { HarmonicSet } from '../spectrum/types.js';
import { starDeltaHints } from './connection.js';
import { lineToLineSamples, lineVoltagePhasors, sqrt3Check, type Sqrt3Check } from './line-voltages.js';
import { neutralCurrentFigures, sumHarmonicSets, sumPhaseCurrents, type NeutralCurrentFigures } from './neutral.js';
import { phaseRotation, type PhaseRotation } from './rotation.js';
import { symmetricalComponents, type SequenceComponents } from '../phasor/sequence.js';
import { currentUnbalance, voltageUnbalance, type VoltageUnbalance } from './unbalance.js';
import { maxOf } from '../signal/extremes.js';

type Three<T> = [T, T, T];

/** A measured neutral may differ from the sum of the line currents by 5 % of the largest line current (our choice). */
export const NEUTRAL_MISMATCH_RATIO = 0.05;

/** Channels of one three-phase set, phases in label order 1, 2, 3 (pairPowerChannels). */
export interface ThreePhaseSamples {
	/** Line-to-neutral voltages (4-wire), or line-to-reference voltages of a 3-wire set. */
	voltages: Three<Float64Array>;
	/** Line currents, same phase order (optional: without them, no power and no neutral). */
	currents?: Three<Float64Array>;
	/** Measured neutral current, when a channel exists. */
	neutralCurrent?: Float64Array;
	/** Wiring for IEEE 1459 effective values; default '4-wire', reported as an assumption. */
	wiring?: PowerWiring;
}

/** Everything three-phase about a capture's set. */
export interface ThreePhaseAnalysis {
	ok: true;
	window: AnalysedWindow;
	voltageSets: Three<HarmonicSet>;
	currentSets?: Three<HarmonicSet>;
	rotation: PhaseRotation;
	voltageSequence: SequenceComponents;
	voltageUnbalance: VoltageUnbalance;
	/** Line-to-line voltages derived from the phase channels: true RMS over the window and fundamental phasors. */
	lineVoltageRmsV: Three<number>;
	lineVoltagePhasors: Three<ComplexPhasor>;
	sqrt3: Sqrt3Check;
	currentSequence?: SequenceComponents;
	currentUnbalance?: ReturnType<typeof currentUnbalance>;
	power?: ThreePhasePower;
	neutral?: NeutralCurrentFigures;
	diagnostics: Diagnostic[];
}

/**
 * Three-phase analysis of a set of channels from samples.
 * Not a second route to the report's figures alone: it also checks a measured neutral against the sum of the
 * line currents, gives the star/delta hints and takes 3-wire sets, which the report (lib/report/relations.ts,
 * extras.ts) does not yet do; tests reach those checks here.
 * The window is the whole cycles of the phase-1 voltage; all channels are analysed on it (same phase
 * reference). Neutral: the measured channel when given, else the sum of the line currents (4-wire only).
 * @returns the analysis, or a failure when the phase-1 voltage has no whole cycles
 * @throws RangeError for channels of unequal length
 * @example threePhaseFromSamples({ voltages: [u1, u2, u3], currents: [i1, i2, i3] }, 10_000).voltageUnbalance.vufPercent // 2.7699 for docs/methods.md §5.4
 */
export function threePhaseFromSamples(
	input: ThreePhaseSamples,
	sampleRateHz: number,
	opts: FromSamplesOptions = {},
): ThreePhaseAnalysis | PowerSampleFailure {
	const diagnostics: Diagnostic[] = [];
	const wiring = input.wiring ?? '4-wire';
	if (!input.wiring)
		diagnostics.push({
			code: 'wiring-assumed',
			severity: 'assumption',
			message: 'wiring not given: taken as 4-wire (three lines and neutral) for the IEEE 1459 effective values.',
		});
	const currents = input.currents;
	const computeNeutral = currents && !input.neutralCurrent && wiring === '4-wire';
	const neutral =
		input.neutralCurrent ?? (computeNeutral ? sumPhaseCurrents(currents[0], currents[1], currents[2]) : undefined);
	const all = [...input.voltages, ...(currents ?? []), ...(neutral ? [neutral] : [])];
	const r = harmonicSetsOnReferenceWindow(input.voltages[0], all, sampleRateHz, opts);
	if (!r.ok) return r;
	const w = r.window;
	const vSets = r.sets.slice(0, 3) as Three<HarmonicSet>;
	const v1 = vSets.map((s) => phasorFromHarmonic(s.orders[1])) as Three<ComplexPhasor>;
	const ll = lineVoltagePhasors(v1[0], v1[1], v1[2]);
	const lineVoltageRmsV = [0, 1, 2].map((k) =>
		powerWindowRms(lineToLineSamples(input.voltages[k], input.voltages[(k + 1) % 3]), w),
	) as Three<number>;
	const out: ThreePhaseAnalysis = {
		ok: true,
		window: w,
		voltageSets: vSets,
		rotation: phaseRotation(v1[0], v1[1], v1[2]),
		voltageSequence: symmetricalComponents(v1[0], v1[1], v1[2]),
		voltageUnbalance: voltageUnbalance(v1[0], v1[1], v1[2]),
		lineVoltageRmsV,
		lineVoltagePhasors: ll,
		sqrt3: sqrt3Check(v1, ll),
		diagnostics,
	};
	if (currents) addCurrentFigures(out, { input, currents, neutral, sets: r.sets, wiring, v1, lineVoltageRmsV });
	else diagnostics.push(...starDeltaHints({ phaseVoltages: v1 }));
	return out;
}

/** What the current figures are computed from: the inputs and the sets of the shared window. */
interface CurrentInputs {
	input: ThreePhaseSamples;
	currents: Three<Float64Array>;
	/** The measured neutral, or the sum of the line currents (4-wire), or none. */
	neutral: Float64Array | undefined;
	/** Sets of the voltages, the currents and (last) the neutral, on the shared window. */
	sets: HarmonicSet[];
	wiring: PowerWiring;
	v1: Three<ComplexPhasor>;
	lineVoltageRmsV: Three<number>;
}

/** Current sets, sequence and unbalance, IEEE 1459 power, the neutral, and the checks on them, into `out`. */
function addCurrentFigures(out: ThreePhaseAnalysis, c: CurrentInputs): void {
	const { input, currents, neutral, wiring } = c;
	const w = out.window;
	const vSets = out.voltageSets;
	const iSets = c.sets.slice(3, 6) as Three<HarmonicSet>;
	const nSet = neutral ? c.sets[c.sets.length - 1] : undefined;
	const i1 = iSets.map((s) => phasorFromHarmonic(s.orders[1])) as Three<ComplexPhasor>;
	out.currentSets = iSets;
	out.currentSequence = symmetricalComponents(i1[0], i1[1], i1[2]);
	out.currentUnbalance = currentUnbalance(i1[0], i1[1], i1[2]);
	const iRms = currents.map((x) => powerWindowRms(x, w)) as Three<number>;
	const neutralRmsA = neutral ? powerWindowRms(neutral, w) : 0;
	out.power = threePhasePowerFromHarmonics(
		wiring,
		[0, 1, 2].map((k) => ({
			voltage: vSets[k],
			current: iSets[k],
			totals: {
				voltageRmsV: powerWindowRms(input.voltages[k], w),
				currentRmsA: iRms[k],
				activePowerW: activePowerFromSamplesW(input.voltages[k], currents[k], w),
			},
		})) as Three<ThreePhaseInputPhase>,
		{
			lineVoltageRmsV: c.lineVoltageRmsV,
			neutralCurrentRmsA: neutralRmsA,
			...(input.neutralCurrent && nSet ? { neutralCurrent: nSet } : {}),
		},
	);
	if (neutral && nSet)
		out.neutral = neutralCurrentFigures(input.neutralCurrent ? 'measured' : 'computed', neutralRmsA, iRms, nSet);
	if (input.neutralCurrent && nSet) {
		const mismatch = neutralMismatch(iSets, nSet);
		if (mismatch) out.diagnostics.push(mismatch);
	}
	out.diagnostics.push(
		...starDeltaHints({ phaseVoltages: c.v1, lineCurrents: i1, ...(input.wiring ? { wiring: input.wiring } : {}) }),
	);
}

/**
 * A measured neutral should match the sum of the line currents (fundamental phasors, same window); either
 * clamp orientation is accepted, since the neutral's reference direction varies between setups.
 */
function neutralMismatch(iSets: Three<HarmonicSet>, nSet: HarmonicSet): Diagnostic | undefined {
	const sum = phasorFromHarmonic(sumHarmonicSets(iSets[0], iSets[1], iSets[2]).orders[1]);
	const meas = phasorFromHarmonic(nSet.orders[1]);
	const diff = Math.min(phasorAbs(phasorSub(meas, sum)), phasorAbs(phasorAdd(meas, sum)));
	const ref = maxOf(iSets.map((s) => s.orders[1].rms));
	if (!(ref > 0 && diff / ref > NEUTRAL_MISMATCH_RATIO)) return undefined;
	return {
		code: 'neutral-mismatch',
		severity: 'warning',
		message: `measured neutral fundamental (${phasorAbs(meas).toFixed(2)} A) differs from the sum of the line currents (${phasorAbs(sum).toFixed(2)} A) by ${diff.toFixed(2)} A, more than ${100 * NEUTRAL_MISMATCH_RATIO} % of the largest line current: a clamp on the wrong conductor, a ratio, or current returning through earth.`,
	};
}
