/**
 * The short-record path: a capture shorter than two whole cycles (a scope's single shot of one cycle or
 * less) gets its frequency, fundamentals, harmonics, lag and power from one least-squares sine fit shared
 * by all its channels (lib/signal/sine-fit.ts), every figure marked as fitted with its uncertainty.
 */
import { loadWords } from './load-words.js';
import { thdFPercent } from '../spectrum/thd.js';
import type { Capture } from '../capture.js';
import type { ChannelResolution } from '../signal/code-step.js';
import { fitSharedSine, type SineFit } from '../signal/sine-fit.js';
import { loadCharacterFromAngle } from '../power/load-character.js';
import { wrapAngleDeg } from '../power/phasor.js';
import { singlePhasePowerFromHarmonics } from '../power/single-phase.js';
import type { HarmonicSet } from '../spectrum/types.js';
import { pairChannels } from './relations.js';
import type { ReportFitChannel, ReportPair, ReportPower, ReportShortRecord } from './types.js';

/** The words every fitted figure carries. */
export const FITTED_NOTE = 'from a fit of a short record';
/** Default frequency search without a nominal frequency: 0.7 × 50 Hz … 1.3 × 60 Hz (the coarse search's ±30 %). */
export const SHORT_RECORD_SEARCH_HZ = { lowHz: 35, highHz: 78 } as const;
/** Fewest cycles at the top of the search range a record must hold for a fit (about half a cycle). */
export const SHORT_RECORD_MIN_CYCLES = 0.45;
/** The reference fundamental must stand this many standard deviations above zero to be taken as found. */
const FOUND_STD = 5;

export interface ShortRecordResult {
	fit: SineFit;
	info: ReportShortRecord;
	/** Per channel: its fitted set (orders 0…maxOrder, RMS, cosine phase at the first sample) and fit figures. */
	sets: HarmonicSet[];
	fits: ReportFitChannel[];
}

/**
 * Fits every analogue channel of a short capture with one shared frequency (see `fitSharedSine`).
 * @param floors  per channel, its rounding floor (RMS) or 0 when it shows no code step
 * @returns the fit, or a sentence saying why none (too short, no fundamental on the reference)
 */
export function fitShortRecord(
	capture: Capture,
	refIndex: number,
	maxOrder: number,
	nominalHz: number | undefined,
	resolutions: (ChannelResolution | undefined)[],
): ShortRecordResult | string {
	const fs = capture.sampleRateHz;
	const n = capture.channels[0]?.samples.length ?? 0;
	const range = nominalHz !== undefined ? { lowHz: 0.7 * nominalHz, highHz: 1.3 * nominalHz } : SHORT_RECORD_SEARCH_HZ;
	if ((n * range.highHz) / fs < SHORT_RECORD_MIN_CYCLES) {
		return `The record lasts ${round((1000 * n) / fs)} ms, under ${SHORT_RECORD_MIN_CYCLES} cycle of anything up to ${round(range.highHz)} Hz: too short even for a fit.`;
	}
	if (capture.channels.some((c) => c.samples.some((x) => !Number.isFinite(x))))
		return 'Some samples are not numbers: no fit.';
	const floors = resolutions.map((r) => (r ? r.harmonicFloorRms * Math.SQRT2 : 0));
	const fit = fitSharedSine(
		capture.channels.map((c) => c.samples),
		fs,
		{ ...range, maxOrder, floors },
	);
	if (!fit.ok) return fit.message;
	const ref = fit.channels[refIndex];
	if (!(ref.amplitude[1] > FOUND_STD * ref.amplitudeStd[1] && ref.amplitude[1] > floors[refIndex])) {
		return `No clear fundamental on ${capture.channels[refIndex].name} between ${round(range.lowHz)} and ${round(range.highHz)} Hz.`;
	}
	const sets = fit.channels.map((c) => fittedSet(c, fit, maxOrder));
	const fits = fit.channels.map((c, i): ReportFitChannel => ({
		fundamentalRms: c.amplitude[1] / Math.SQRT2,
		fundamentalRmsUncertainty: c.amplitudeStd[1] / Math.SQRT2,
		fundamentalPhaseUncertaintyDeg: deg(c.phaseStdRad[1]),
		thdUncertaintyPercent: thdUncertaintyPercent(c.amplitude, c.amplitudeStd, Math.min(fit.highestOrder, 50)),
		residualRms: c.residualRms,
		note: FITTED_NOTE,
		belowResolutionFloorRms: resolutions[i]?.harmonicFloorRms ?? NaN,
	}));
	const info: ReportShortRecord = {
		note: FITTED_NOTE,
		method:
			'least-squares sine fit, one frequency shared by all channels, harmonics to the highest order the record resolves (IEEE Std 1057 four-parameter fit, extended)',
		frequencyHz: fit.frequencyHz,
		frequencyUncertaintyHz: fit.frequencyStdHz,
		cyclesHeld: fit.cycles,
		highestOrder: fit.highestOrder,
		fitRateHz: fit.fitRateHz,
		searchedLowHz: range.lowHz,
		searchedHighHz: range.highHz,
	};
	return { fit, info, sets, fits };
}

function fittedSet(c: SineFit['channels'][number], fit: SineFit, maxOrder: number): HarmonicSet {
	const orders = [{ order: 0, rms: Math.abs(c.dc), phaseDeg: c.dc > 0 ? 0 : c.dc < 0 ? 180 : NaN }];
	for (let h = 1; h <= maxOrder; h++) {
		orders.push(
			h <= fit.highestOrder
				? { order: h, rms: c.amplitude[h] / Math.SQRT2, phaseDeg: c.amplitude[h] > 0 ? deg(c.phaseRad[h]) : NaN }
				: { order: h, rms: NaN, phaseDeg: NaN },
		);
	}
	return { fundamentalHz: fit.frequencyHz, startS: 0, cycles: fit.cycles, orders };
}

/** One standard deviation of THD_F = √(Σ_{h≥2} A_h²)/A_1 by first-order propagation of the amplitude deviations. */
function thdUncertaintyPercent(a: Float64Array, sd: Float64Array, top: number): number {
	let s2 = 0;
	for (let h = 2; h <= top; h++) s2 += a[h] * a[h];
	const s = Math.sqrt(s2);
	let v = ((s / a[1]) * (sd[1] / a[1])) ** 2;
	for (let h = 2; h <= top; h++) v += (s > 0 ? ((a[h] / s) * sd[h]) / a[1] : sd[h] / a[1]) ** 2;
	return 100 * Math.sqrt(v);
}

/** Lag of each channel's fitted fundamental behind the reference's, in degrees and seconds, with uncertainties. */
export function fittedPairs(capture: Capture, refIndex: number, r: ShortRecordResult): ReportPair[] {
	const ref = r.fit.channels[refIndex];
	const out: ReportPair[] = [];
	r.fit.channels.forEach((c, i) => {
		if (i === refIndex) return;
		const ok = c.amplitude[1] > FOUND_STD * c.amplitudeStd[1];
		const lagDeg = ok ? wrapAngleDeg(deg(ref.phaseRad[1] - c.phaseRad[1])) : NaN;
		const sdDeg = deg(Math.hypot(ref.phaseStdRad[1], c.phaseStdRad[1]));
		out.push({
			ref: capture.channels[refIndex].name,
			other: capture.channels[i].name,
			lagDeg,
			lagS: lagDeg / (360 * r.fit.frequencyHz),
			fit: {
				lagDegUncertainty: ok ? sdDeg : NaN,
				lagSUncertainty: ok ? sdDeg / (360 * r.fit.frequencyHz) : NaN,
				note: FITTED_NOTE,
			},
		});
	});
	return out;
}

/** IEEE 1459 power of each voltage/current pair from the fitted harmonic sets, with first-order uncertainties. */
export function fittedPower(
	capture: Capture,
	r: ShortRecordResult,
	overrides: Parameters<typeof pairChannels>[1],
): { power: ReportPower[]; assumptions: string[] } {
	const pairing = pairChannels(capture.channels, overrides);
	const power = pairing.pairs.map((p): ReportPower => {
		const q = singlePhasePowerFromHarmonics(r.sets[p.voltage], r.sets[p.current]);
		const v = r.fit.channels[p.voltage];
		const i = r.fit.channels[p.current];
		const th = (q.theta1Deg * Math.PI) / 180;
		const dTh = Math.hypot(v.phaseStdRad[1], i.phaseStdRad[1]);
		const [dV, dI] = [v.amplitudeStd[1] / Math.SQRT2, i.amplitudeStd[1] / Math.SQRT2];
		const dP1 = Math.hypot(
			q.i1RmsA * dV * Math.cos(th),
			q.v1RmsV * dI * Math.cos(th),
			q.v1RmsV * q.i1RmsA * Math.sin(th) * dTh,
		);
		const dQ1 = Math.hypot(
			q.i1RmsA * dV * Math.sin(th),
			q.v1RmsV * dI * Math.sin(th),
			q.v1RmsV * q.i1RmsA * Math.cos(th) * dTh,
		);
		const all: Record<string, number> = {};
		for (const [k, x] of Object.entries(q)) if (typeof x === 'number') all[k] = x;
		const ch = loadCharacterFromAngle(q.theta1Deg);
		return {
			voltage: capture.channels[p.voltage].name,
			current: capture.channels[p.current].name,
			activeW: q.activePowerW,
			apparentVA: q.apparentPowerVA,
			reactiveVar: q.fundamentalReactivePowerVar,
			powerFactor: q.powerFactor,
			displacementPowerFactor: q.displacementPowerFactor,
			...(() => {
				const cur = r.sets[p.current].orders.map((o) => (Number.isNaN(o.rms) ? 0 : o.rms));
				const words = loadWords(
					q.displacementPowerFactor,
					q.fundamentalReactivePowerVar,
					thdFPercent(cur, Math.min(50, r.fit.highestOrder)),
				);
				return {
					character: ch.character === 'undetermined' ? null : words.character,
					relation: words.relation,
					loadSentence: words.sentence,
					powerFactorIntervals: null,
				};
			})(),
			ieee1459: all,
			pairedBy: p.pairedBy,
			phase: p.phase,
			fit: {
				fundamentalActiveWUncertainty: dP1,
				reactiveVarUncertainty: dQ1,
				displacementPowerFactorUncertainty: Math.abs(Math.sin(th)) * dTh,
				theta1UncertaintyDeg: deg(dTh),
				note: FITTED_NOTE,
			},
		};
	});
	return { power, assumptions: pairing.assumptions };
}

function deg(rad: number): number {
	return (rad * 180) / Math.PI;
}

function round(x: number): string {
	return Number(x.toPrecision(3)).toString();
}
