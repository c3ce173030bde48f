/**
 * Digital design of the flickermeter's blocks 1-4 for one sample rate, mains frequency and lamp.
 */
import {
	FLICKER_ADAPTOR_TIME_CONSTANT_S,
	FLICKER_HIGH_PASS_HZ,
	FLICKER_LOW_PASS_HZ,
	FLICKER_LOW_PASS_ORDER,
	FLICKER_MIN_SAMPLE_RATE_HZ,
	FLICKER_REFERENCE,
	FLICKER_SMOOTHING_TIME_CONSTANT_S,
	FLICKER_WEIGHTING,
	PST_INTERVAL_S,
	type FlickerLamp,
} from './constants.js';
import { blockSquaresGain } from './block-squares.js';
import { bilinear, biquadGain, butterworthLowPass, type Biquad } from './iir.js';

/** What a flickermeter is built for. */
export interface FlickerSettings {
	/** Samples per second of the voltage record, ≥ 1600. */
	sampleRateHz: number;
	/** Nominal mains frequency: selects the 35 Hz (50 Hz) or 42 Hz (60 Hz) ripple low-pass. */
	nominalHz: 50 | 60;
	/** Lamp model of the weighting filter. Default '230V' for 50 Hz, '120V' for 60 Hz. */
	lamp?: FlickerLamp;
}

/** Coefficients of every block; all sections are direct-form, a0 = 1. */
export interface FlickerDesign {
	/** Input samples per second. */
	sampleRateHz: number;
	/** D: input samples per value of the block squares (lib/flicker/block-squares.ts); 1 = none. */
	decimation: number;
	/** Rate blocks 1-5 run at, sampleRateHz / decimation; every filter below is designed for it. */
	chainRateHz: number;
	nominalHz: 50 | 60;
	lamp: FlickerLamp;
	/** Block 1: y += α (x² − y), the running mean square (τ ≈ 27.3 s). */
	adaptorAlpha: number;
	/** Block 3: first-order high-pass at 0.05 Hz. */
	highPass: Biquad;
	/** Block 3: 6th-order Butterworth low-pass, 3 sections. */
	lowPass: Biquad[];
	/** Block 3: weighting filter as (K ω1 s / (s² + 2λs + ω1²)) then ((1 + s/ω2)/((1 + s/ω3)(1 + s/ω4))). */
	weighting: [Biquad, Biquad];
	/** Block 4: y += α (x − y), the 300 ms first-order smoothing. */
	smoothingAlpha: number;
	/** Block 4 gain: Pinst = scale · smoothed(w²). */
	scale: number;
}

/**
 * D for an input rate: the largest integer that keeps the chain at or above 1600 S/s (the rate every
 * IEC 61000-4-15 table check in tests/flicker runs the chain at, so the filters' accuracy there is measured)
 * and divides the rate, so the chain rate is a whole number and every 1 s block, the 5 s settling and every
 * 10-minute interval end on a chain value. When no such D keeps the chain below 3200 S/s (a rate with few
 * divisors, or not a whole number), D divides the samples of 10 minutes instead (intervals stay exact,
 * 1 s blocks round to a chain value). Our own choice; the aliasing it allows is bounded in docs/flicker.md,
 * "Block squares".
 */
export function flickerDecimation(sampleRateHz: number): number {
	const most = Math.floor(sampleRateHz / FLICKER_MIN_SAMPLE_RATE_HZ);
	const largestDividing = (n: number) => {
		for (let d = most; d > 1; d--) if (n % d === 0) return d;
		return 1;
	};
	const d = Number.isInteger(sampleRateHz) ? largestDividing(sampleRateHz) : 1;
	return 2 * d > most ? d : Math.max(d, largestDividing(Math.round(PST_INTERVAL_S * sampleRateHz)));
}

/** α of a first-order lag y[n] = y[n−1] + α (x[n] − y[n−1]) whose step response matches e^(−t/τ) at every sample. */
function lagAlpha(timeConstantS: number, sampleRateHz: number): number {
	return -Math.expm1(-1 / (timeConstantS * sampleRateHz));
}

/**
 * The weighting filter of one lamp as two sections, bilinear with pre-warping at the 8.8 Hz reference
 * frequency (where the scale is fixed). Ref: IEC 61000-4-15:2010, 5.4, block 3 (from memory).
 */
export function weightingSections(lamp: FlickerLamp, sampleRateHz: number): [Biquad, Biquad] {
	const c = FLICKER_WEIGHTING[lamp];
	const tau = 2 * Math.PI;
	const w1 = tau * c.f1Hz,
		w2 = tau * c.f2Hz,
		w3 = tau * c.f3Hz,
		w4 = tau * c.f4Hz,
		lambda = tau * c.lambdaHz;
	const f = FLICKER_REFERENCE.frequencyHz;
	return [
		bilinear([0, c.k * w1, 0], [1, 2 * lambda, w1 * w1], sampleRateHz, f),
		bilinear([0, 1 / w2, 1], [1 / (w3 * w4), 1 / w3 + 1 / w4, 1], sampleRateHz, f),
	];
}

/**
 * Designs the block squares and blocks 1-4 (the filters at the chain rate fs/D). The Pinst scale follows
 * from the digital responses at the reference point: a modulation of relative depth d at fm leaves the
 * demodulator as d·sin(2π fm t); after the band filters of gain g it is squared to
 * (g d)²/2 · (1 − cos 4π fm t), and the smoothing (gain h at 2 fm) keeps a ripple, so
 * max Pinst = scale · (g d)²/2 · (1 + h). Setting that to 1 at 8.8 Hz, d = 0.25 % with the 230 V lamp's
 * filter fixes the block-4 gain, used for both lamps; g includes the block squares' kernel gain at 8.8 Hz.
 * Ref: IEC 61000-4-15:2010, 5.5 and Table 1 (reference point; from memory).
 *
 * @throws RangeError when the sample rate is below 1600 S/s or not finite
 */
export function designFlickermeter(settings: FlickerSettings): FlickerDesign {
	const inputHz = settings.sampleRateHz;
	if (!Number.isFinite(inputHz) || inputHz < FLICKER_MIN_SAMPLE_RATE_HZ) {
		throw new RangeError(
			`flickermeter needs at least ${FLICKER_MIN_SAMPLE_RATE_HZ} samples per second, got ${inputHz}`,
		);
	}
	if (settings.nominalHz !== 50 && settings.nominalHz !== 60)
		throw new RangeError(`nominal frequency must be 50 or 60 Hz, got ${settings.nominalHz}`);
	const lamp = settings.lamp ?? (settings.nominalHz === 50 ? '230V' : '120V');
	const decimation = flickerDecimation(settings.sampleRateHz);
	const fs = settings.sampleRateHz / decimation;
	const wc = 2 * Math.PI * FLICKER_HIGH_PASS_HZ;
	const highPass = bilinear([0, 1, 0], [0, 1, wc], fs, FLICKER_HIGH_PASS_HZ);
	const lowPass = butterworthLowPass(FLICKER_LOW_PASS_ORDER, FLICKER_LOW_PASS_HZ[settings.nominalHz], fs);
	const weighting = weightingSections(lamp, fs);
	const smoothingAlpha = lagAlpha(FLICKER_SMOOTHING_TIME_CONSTANT_S, fs);
	const kernelGain = blockSquaresGain(FLICKER_REFERENCE.frequencyHz, decimation, inputHz);
	const scale =
		referenceScale(fs, highPass, lowPass, weightingSections('230V', fs), smoothingAlpha) / (kernelGain * kernelGain);
	return {
		sampleRateHz: inputHz,
		decimation,
		chainRateHz: fs,
		nominalHz: settings.nominalHz,
		lamp,
		adaptorAlpha: lagAlpha(FLICKER_ADAPTOR_TIME_CONSTANT_S, fs),
		highPass,
		lowPass,
		weighting,
		smoothingAlpha,
		scale,
	};
}

function referenceScale(
	fs: number,
	highPass: Biquad,
	lowPass: Biquad[],
	weighting: Biquad[],
	smoothingAlpha: number,
): number {
	const f = FLICKER_REFERENCE.frequencyHz;
	let g = biquadGain(highPass, f, fs);
	for (const q of [...lowPass, ...weighting]) g *= biquadGain(q, f, fs);
	const smoothing: Biquad = { b0: smoothingAlpha, b1: 0, b2: 0, a1: smoothingAlpha - 1, a2: 0 };
	const h = biquadGain(smoothing, 2 * f, fs);
	const gd = g * FLICKER_REFERENCE.deltaVOverV;
	return 2 / (gd * gd * (1 + h));
}
