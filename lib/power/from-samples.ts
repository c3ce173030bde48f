/**
 * Sample-level entry points: find the whole cycles of the reference channel (lib/signal), analyse each
 * channel on that same window (lib/spectrum), then apply the phasor-level functions of this area.
 */
import { MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import { findWholeCycles } from '../signal/cycles.js';
import { harmonicWindow } from '../spectrum/harmonics.js';
import type { HarmonicSet } from '../spectrum/types.js';
import { loadCharacterFromAngle, type LoadCharacter } from './load-character.js';
import { describePhaseLag, fundamentalLagDeg, harmonicLagsDeg, type OrderLag } from './phase-angle.js';
import { singlePhasePowerFromHarmonics, type SinglePhasePower } from './single-phase.js';
import { crossCorrelationLag, type ChannelTimeLag } from './time-lag.js';
import { activePowerFromSamplesW, powerWindowRms, type PowerSampleWindow } from './sample-span.js';

/** Why a sample-level analysis could not run (no whole cycles in the reference channel, ...). */
export interface PowerSampleFailure {
	ok: false;
	code: string;
	message: string;
}

/** The window every channel was analysed on: whole cycles of the reference channel's fundamental. */
export interface AnalysedWindow extends PowerSampleWindow {
	frequencyHz: number;
}

/** Options shared by the sample-level entry points. */
export interface FromSamplesOptions {
	/** Nominal system frequency, Hz (narrows the fundamental search). */
	nominalHz?: number;
	/** Use at most this many whole cycles from the start (default: all of them). */
	maxCycles?: number;
	/** Highest harmonic order analysed (default 50). */
	maxOrder?: number;
}

/**
 * Whole-cycle window of `reference`, and each channel's harmonic set on exactly that window.
 * @returns the window and sets, or a failure from findWholeCycles (code and message passed through)
 */
export function harmonicSetsOnReferenceWindow(
	reference: Float64Array,
	channels: readonly Float64Array[],
	sampleRateHz: number,
	opts: FromSamplesOptions = {},
): { ok: true; window: AnalysedWindow; sets: HarmonicSet[] } | PowerSampleFailure {
	for (const c of channels)
		if (c.length !== reference.length)
			throw new RangeError(`channels differ in length: ${c.length} vs ${reference.length} samples`);
	const w = findWholeCycles(reference, sampleRateHz, {
		...(opts.nominalHz ? { nominalHz: opts.nominalHz } : {}),
		...(opts.maxCycles ? { maxCycles: opts.maxCycles } : {}),
	});
	if (!w.ok) return { ok: false, code: w.code, message: w.message };
	const span: AnalysedWindow = {
		startIndex: w.startIndex,
		endIndex: w.endIndex,
		cycles: w.cycles,
		frequencyHz: w.frequencyHz,
	};
	const sets = channels.map(
		(c) =>
			harmonicWindow(c, sampleRateHz, {
				fundamentalHz: span.frequencyHz,
				startIndex: span.startIndex,
				cycles: span.cycles,
				maxOrder: opts.maxOrder ?? MAX_HARMONIC_ORDER,
			}).set,
	);
	return { ok: true, window: span, sets };
}

/** Phase relation of two channels from samples. */
export interface ChannelRelation {
	ok: true;
	window: AnalysedWindow;
	/** Fundamental lag of `other` behind `ref`, degrees in (−180, 180], positive when `other` lags. */
	fundamentalLagDeg: number;
	/** Lag per harmonic order, degrees of that order. */
	harmonicLags: OrderLag[];
	/** Cross-correlation time lag (what a scope shows). */
	timeLag: ChannelTimeLag;
	/** "I1 lags U1 by 32.0 deg". */
	sentence: string;
}

/**
 * Phase angle (fundamental and per order), time lag and the sentence for two channels of a capture.
 * The window is the whole cycles of `ref`'s fundamental (findWholeCycles); both channels are analysed on it.
 * @param refName, otherName  channel names for the sentence
 * @returns the relation, or a failure when `ref` has no whole cycles
 * @throws RangeError for channels of unequal length
 * @example channelRelationFromSamples(u1, i1, 10_000, 'U1', 'I1').sentence // "I1 lags U1 by 32.0 deg"
 */
export function channelRelationFromSamples(
	ref: Float64Array,
	other: Float64Array,
	sampleRateHz: number,
	refName: string,
	otherName: string,
	opts: FromSamplesOptions & { inPhaseToleranceDeg?: number } = {},
): ChannelRelation | PowerSampleFailure {
	const r = harmonicSetsOnReferenceWindow(ref, [ref, other], sampleRateHz, opts);
	if (!r.ok) return r;
	const lag = fundamentalLagDeg(r.sets[0], r.sets[1]);
	return {
		ok: true,
		window: r.window,
		fundamentalLagDeg: lag,
		harmonicLags: harmonicLagsDeg(r.sets[0], r.sets[1]),
		timeLag: crossCorrelationLag(ref, other, sampleRateHz, r.window),
		sentence: describePhaseLag(refName, otherName, lag, opts.inPhaseToleranceDeg),
	};
}

/** IEEE 1459 single-phase analysis of a V/I pair from samples. */
export interface SinglePhasePowerAnalysis {
	ok: true;
	window: AnalysedWindow;
	power: SinglePhasePower;
	loadCharacter: LoadCharacter;
	voltageSet: HarmonicSet;
	currentSet: HarmonicSet;
}

/**
 * IEEE 1459-2010 single-phase quantities of a voltage/current pair from samples: the window is the whole
 * cycles of the voltage; P = mean(v·i), V and I true RMS over it (time domain); V1, I1, θ1 and THD from the
 * harmonic sets on the same window.
 * @returns the analysis, or a failure when the voltage has no whole cycles
 * @throws RangeError for channels of unequal length
 * @example singlePhasePowerFromSamples(v, i, 12_800).power.powerFactor // 0.824173 for docs/methods.md §5.3
 */
export function singlePhasePowerFromSamples(
	voltage: Float64Array,
	current: Float64Array,
	sampleRateHz: number,
	opts: FromSamplesOptions & { resistiveBandDeg?: number } = {},
): SinglePhasePowerAnalysis | PowerSampleFailure {
	const r = harmonicSetsOnReferenceWindow(voltage, [voltage, current], sampleRateHz, opts);
	if (!r.ok) return r;
	const power = singlePhasePowerFromHarmonics(r.sets[0], r.sets[1], {
		voltageRmsV: powerWindowRms(voltage, r.window),
		currentRmsA: powerWindowRms(current, r.window),
		activePowerW: activePowerFromSamplesW(voltage, current, r.window),
	});
	return {
		ok: true,
		window: r.window,
		power,
		loadCharacter: loadCharacterFromAngle(power.theta1Deg, opts.resistiveBandDeg),
		voltageSet: r.sets[0],
		currentSet: r.sets[1],
	};
}
