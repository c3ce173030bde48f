/**
 * Constants of the IEC 61000-4-15 flickermeter, each with its source. The standard is paywalled: every
 * value here is from memory of IEC 61000-4-15:2010 (Ed.2), cross-checked against the performance tables
 * by the tests in tests/flicker (see docs/flicker.md for the derivations).
 */

/** The lamp the weighting filter models: 230 V / 60 W or 120 V / 60 W incandescent. */
export type FlickerLamp = '230V' | '120V';

/**
 * Lamp-eye-brain weighting filter of block 3,
 *   F(s) = K ω1 s / (s² + 2λ s + ω1²) · (1 + s/ω2) / ((1 + s/ω3)(1 + s/ω4)),
 * with λ and ω given here as frequencies in Hz (λ = 2π·lambdaHz, ωi = 2π·fiHz).
 * Ref: IEC 61000-4-15:2010, 5.4 (block 3), constants for the 230 V and 120 V lamps (from memory).
 */
export interface WeightingConstants {
	k: number;
	lambdaHz: number;
	f1Hz: number;
	f2Hz: number;
	f3Hz: number;
	f4Hz: number;
}

export const FLICKER_WEIGHTING: Readonly<Record<FlickerLamp, WeightingConstants>> = {
	'230V': { k: 1.74802, lambdaHz: 4.05981, f1Hz: 9.15494, f2Hz: 2.27979, f3Hz: 1.22535, f4Hz: 21.9 },
	'120V': { k: 1.6357, lambdaHz: 4.167375, f1Hz: 9.077169, f2Hz: 2.939902, f3Hz: 1.394468, f4Hz: 17.31512 },
};

/**
 * Block 1: the input is normalised to its steady RMS, tracked by a first-order filter whose 10 %-90 %
 * step response takes 1 min; for a first-order lag that is τ·ln 9, so τ = 60 s / ln 9 ≈ 27.3 s.
 * Ref: IEC 61000-4-15:2010, 5.2 (block 1, input voltage adaptor; from memory).
 */
export const FLICKER_ADAPTOR_TIME_CONSTANT_S = 60 / Math.log(9);

/** Block 3 high-pass: first order, −3 dB at 0.05 Hz. Ref: IEC 61000-4-15:2010, 5.4 (from memory). */
export const FLICKER_HIGH_PASS_HZ = 0.05;

/**
 * Block 3 low-pass that removes the double-mains-frequency ripple of the squaring demodulator: 6th-order
 * Butterworth, −3 dB at 35 Hz in 50 Hz systems and 42 Hz in 60 Hz systems.
 * Ref: IEC 61000-4-15:2010, 5.4 (from memory).
 */
export const FLICKER_LOW_PASS_HZ: Readonly<Record<50 | 60, number>> = { 50: 35, 60: 42 };
export const FLICKER_LOW_PASS_ORDER = 6;

/** Block 4 smoothing: first-order low-pass, time constant 300 ms. Ref: IEC 61000-4-15:2010, 5.5 (from memory). */
export const FLICKER_SMOOTHING_TIME_CONSTANT_S = 0.3;

/**
 * Reference point for the Pinst scale: sinusoidal modulation at 8.8 Hz of relative amplitude
 * ΔV/V = 0.250 % (peak-to-peak of the RMS envelope over its mean) gives a maximum Pinst of 1.00 with the
 * 230 V lamp. The same block-4 gain serves the 120 V lamp, whose filter is less sensitive (its Table 1
 * column needs 0.321 % at 8.8 Hz for the same output).
 * Ref: IEC 61000-4-15:2010, 5.5 and Table 1 (from memory).
 */
export const FLICKER_REFERENCE = { frequencyHz: 8.8, deltaVOverV: 0.0025 } as const;

/** Length of the short-term observation interval, s. Ref: IEC 61000-4-15:2010, 5.7.2 (from memory). */
export const PST_INTERVAL_S = 600;
/** Number of Pst values in one Plt (2 h). Ref: IEC 61000-4-15:2010, 5.7.3 (from memory). */
export const PLT_PST_COUNT = 12;

/**
 * Multipliers of the Pst formula, Pst = √(0.0314 P0.1 + 0.0525 P1s + 0.0657 P3s + 0.28 P10s + 0.08 P50s).
 * Ref: IEC 61000-4-15:2010, 5.7.2 (from memory).
 */
export const PST_WEIGHTS = { p01: 0.0314, p1s: 0.0525, p3s: 0.0657, p10s: 0.28, p50s: 0.08 } as const;

/**
 * Percentiles (% of time exceeded) averaged into the smoothed levels:
 * P1s = (P0.7 + P1 + P1.5)/3, P3s = (P2.2 + P3 + P4)/3, P10s = (P6 + P8 + P10 + P13 + P17)/5,
 * P50s = (P30 + P50 + P80)/3; P0.1 is not smoothed. Ref: IEC 61000-4-15:2010, 5.7.2 (from memory).
 */
export const PST_SMOOTHING = {
	p1s: [0.7, 1, 1.5],
	p3s: [2.2, 3, 4],
	p10s: [6, 8, 10, 13, 17],
	p50s: [30, 50, 80],
} as const;

/** Lowest sample rate the flickermeter accepts, S/s (the range a recorder's flicker input covers). */
export const FLICKER_MIN_SAMPLE_RATE_HZ = 1600;
