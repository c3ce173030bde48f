/**
 * Figures the report carries beyond the listed contract, each from its library area: the worst cycle of
 * a channel, IEEE 1459 three-phase power and the neutral
 * current of a three-phase current set.
 */
import type { Capture } from '../capture.js';
import { neutralCurrentFigures } from '../polyphase/neutral.js';
import { threePhasePowerFromHarmonics, type ThreePhaseInputPhase } from '../power/three-phase.js';
import { powerWindowRms, type PowerSampleWindow } from '../power/window.js';
import { PowerWindowSums } from './window-sums.js';
import type { CycleWindow } from '../signal/cycles.js';
import { perCycleFigures } from '../signal/per-cycle.js';
import { channelSpectrum, type ChannelSpectrum, type WindowSlot } from './spectra.js';
import type { ReportDigital, ReportNeutral, ReportThreePhasePower, ReportWorstCycle } from './types.js';
import { minOf } from '../signal/extremes.js';

/** The cycle with the highest RMS and the one with the highest peak magnitude (UPS and generator sizing). */
export function worstCycle(samples: Float64Array, window: CycleWindow, sampleRateHz: number): ReportWorstCycle {
	const p = perCycleFigures(samples, window);
	const peakOf = (k: number) =>
		k < 0 ? NaN : Math.abs(p.peak[k]) >= Math.abs(p.peakNegative[k]) ? p.peak[k] : p.peakNegative[k];
	return {
		rmsCycle: p.worstRmsCycle,
		rms: p.worstRmsCycle >= 0 ? p.rms[p.worstRmsCycle] : NaN,
		rmsStartS: p.worstRmsCycle >= 0 ? p.startIndex[p.worstRmsCycle] / sampleRateHz : NaN,
		peakCycle: p.worstPeakCycle,
		peak: peakOf(p.worstPeakCycle),
		peakStartS: p.worstPeakCycle >= 0 ? p.startIndex[p.worstPeakCycle] / sampleRateHz : NaN,
		lowestRms: p.rms.length > 0 ? minOf(p.rms) : NaN,
	};
}

/**
 * One buffer for the sample series derived here (line-to-line voltages, the sum of the phase currents),
 * shared by the calls of one analysis: each series is used and dropped before the next is written, and
 * a fresh array per series would cost its first touch of memory every time.
 */
export interface DerivedScratch {
	buffer?: Float64Array;
}

function scratch(owner: DerivedScratch, length: number): Float64Array {
	if (owner.buffer?.length !== length) owner.buffer = new Float64Array(length);
	return owner.buffer;
}

function checkLengths(...xs: Float64Array[]): void {
	if (xs.some((x) => x.length !== xs[0].length))
		throw new RangeError(`channels differ in length: ${xs.map((x) => x.length).join(', ')} samples`);
}

/** v_xy[n] = v_x[n] − v_y[n] written into `out` (as lib/polyphase lineToLineSamples, without a new array). */
function lineToLineInto(out: Float64Array, from: Float64Array, to: Float64Array): Float64Array {
	checkLengths(out, from, to);
	for (let n = 0; n < out.length; n++) out[n] = from[n] - to[n];
	return out;
}

/** i_N[n] = i1[n] + i2[n] + i3[n] written into `out` (as lib/polyphase sumPhaseCurrents, without a new array). */
function sumPhaseCurrentsInto(out: Float64Array, i1: Float64Array, i2: Float64Array, i3: Float64Array): Float64Array {
	checkLengths(out, i1, i2, i3);
	for (let n = 0; n < out.length; n++) out[n] = i1[n] + i2[n] + i3[n];
	return out;
}

/**
 * IEEE 1459 three-phase quantities of three V/I pairs labelled phases 1, 2, 3 (pairing by label), per
 * window of the shared harmonic windows, time-domain P and RMS over the whole cycles. 4-wire when the
 * capture has phase-to-neutral voltages (the only kind paired here).
 */
export function threePhasePower(
	capture: Capture,
	pairs: { voltage: number; current: number; phase: number | null }[],
	spectra: (ChannelSpectrum | undefined)[],
	window: PowerSampleWindow,
	scratchOwner: DerivedScratch = {},
	sums = new PowerWindowSums(window),
): ReportThreePhasePower | undefined {
	const byPhase = [1, 2, 3].map((ph) => pairs.find((p) => p.phase === ph));
	if (byPhase.some((p) => p === undefined)) return undefined;
	const phases = byPhase.map((p): ThreePhaseInputPhase => {
		const v = capture.channels[p!.voltage];
		const i = capture.channels[p!.current];
		return {
			voltage: spectra[p!.voltage]!.aggregate.set,
			current: spectra[p!.current]!.aggregate.set,
			totals: {
				voltageRmsV: sums.rms(v.samples),
				currentRmsA: sums.rms(i.samples),
				activePowerW: sums.activePowerW(v.samples, i.samples),
			},
		};
	}) as [ThreePhaseInputPhase, ThreePhaseInputPhase, ThreePhaseInputPhase];
	// Line voltages and the neutral from the time domain, as lib/power recommends: summing them per order
	// from the sets would also stumble on orders whose phase is undefined (RMS at rounding level).
	const v = byPhase.map((p) => capture.channels[p!.voltage].samples);
	const i = byPhase.map((p) => capture.channels[p!.current].samples);
	const derived = scratch(scratchOwner, v[0].length);
	const lineVoltageRmsV = [0, 1, 2].map((k) =>
		powerWindowRms(lineToLineInto(derived, v[k], v[(k + 1) % 3]), window),
	) as [number, number, number];
	const neutralCurrentRmsA = powerWindowRms(sumPhaseCurrentsInto(derived, i[0], i[1], i[2]), window);
	const q = threePhasePowerFromHarmonics('4-wire', phases, { lineVoltageRmsV, neutralCurrentRmsA });
	// Scalar figures only: lib/power's result also holds phasors, per-phase sets and words.
	const figures: Record<string, number> = {};
	for (const [k, x] of Object.entries(q)) if (typeof x === 'number') figures[k] = x;
	return {
		channels: byPhase.map((p) => [capture.channels[p!.voltage].name, capture.channels[p!.current].name]),
		wiring: q.wiring,
		sequenceOrder: q.sequenceOrder,
		figures,
	};
}

/** Neutral current of a three-phase current set: measured when a neutral channel exists, else the sum of the phases. */
export function neutralCurrent(
	capture: Capture,
	currents: number[],
	neutralIndex: number | undefined,
	spectra: (ChannelSpectrum | undefined)[],
	slots: WindowSlot[],
	window: PowerSampleWindow,
	maxOrder: number,
	scratchOwner: DerivedScratch = {},
	sums = new PowerWindowSums(window),
): ReportNeutral {
	const phaseRms = currents.map((k) => sums.rms(capture.channels[k].samples)) as [number, number, number];
	if (neutralIndex !== undefined) {
		const f = neutralCurrentFigures(
			'measured',
			sums.rms(capture.channels[neutralIndex].samples),
			phaseRms,
			spectra[neutralIndex]?.aggregate.set,
		);
		return { channel: capture.channels[neutralIndex].name, ...f };
	}
	const i1 = capture.channels[currents[0]].samples;
	const sum = sumPhaseCurrentsInto(
		scratch(scratchOwner, i1.length),
		i1,
		capture.channels[currents[1]].samples,
		capture.channels[currents[2]].samples,
	);
	const set = slots.length > 0 ? channelSpectrum(sum, capture.sampleRateHz, slots, maxOrder).aggregate.set : undefined;
	const f = neutralCurrentFigures('computed', powerWindowRms(sum, window), phaseRms, set);
	return { channel: null, ...f };
}

/**
 * Each digital channel in brief: changes, when it first left its normal state, how long it was off it.
 * Without a declared normal state, state 1 counts as active. Times assume uniform sampling at fs.
 */
export function digitalSummary(capture: Capture): ReportDigital[] {
	const fs = capture.sampleRateHz;
	return (capture.digital ?? []).map((d) => {
		const active = d.normalState === undefined ? 1 : 1 - d.normalState;
		let changes = 0;
		let first = -1;
		let count = 0;
		for (let n = 0; n < d.states.length; n++) {
			if (n > 0 && d.states[n] !== d.states[n - 1]) changes++;
			if (d.states[n] === active) {
				count++;
				if (first < 0) first = n;
			}
		}
		return {
			name: d.name,
			normalState: d.normalState ?? null,
			changes,
			firstActiveS: first < 0 ? NaN : first / fs,
			activeS: count / fs,
		};
	});
}
