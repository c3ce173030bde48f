/**
 * The average-responding meter, stated as a model, and the waveform-shape figures on one convention.
 *
 * Model: a sine-calibrated average-responding meter shows K × rectified mean, K = π/(2√2). Most are
 * AC-coupled (a capacitor blocks DC before the rectifier): they rectify x − mean and are compared here
 * with the AC RMS, what an AC-coupled true-RMS meter shows. A DC-coupled one rectifies x itself and is
 * compared with the true RMS including DC. Each reading is compared with its like-for-like true RMS, so
 * a sine on a clamp offset reads right on an AC-coupled meter (error 0), as it does in practice.
 *
 * Convention for the shape figures (docs/meter-model.md): form factor and crest factor describe the AC
 * part of the wave, the same part an AC-coupled meter sees:
 *   formFactor = acRms / mean|x − mean|,   crestFactor = max|x − mean| / acRms.
 * Without DC (mains voltages, most currents) both are the textbook RMS/MAV and peak/RMS.
 *
 * Ref: average-responding scale factor and error = K/FF − 1 (instrument makers' notes, common practice);
 * AC- and DC-coupled rows of the closed-form table: docs/methods.md §1.2; the model in words: docs/meter-model.md.
 */
import type { CycleWindow } from '../signal/cycles.js';
import type { WaveformFigures } from '../signal/levels.js';
import { windowIntegral } from '../signal/window-integral.js';

/** π/(2√2): the form factor of a sine, the scale of a sine-calibrated average-responding meter. */
export const SINE_FORM_FACTOR = Math.PI / (2 * Math.SQRT2);

/** One meter reading beside the true RMS it is compared with. */
export interface MeterReading {
	/** What the meter shows, channel unit. */
	reading: number;
	/** The like-for-like true RMS (AC RMS for AC coupling, RMS including DC for DC coupling). */
	trueRms: number;
	/** 100 · (reading / trueRms − 1); negative = reads low. */
	errorPercent: number;
}

/** The AC-coupled reading (the headline) with the DC-coupled one beside it. */
export interface MeterModel extends MeterReading {
	coupling: 'ac';
	/** The DC-coupled meter: K · mean|x| against the RMS including DC. */
	dcCoupled: MeterReading;
	/** True when the DC-coupled error differs from the AC-coupled one by 0.05 percentage points or more (it shows at 0.1 %). */
	dcMatters: boolean;
}

/** Waveform shape on the AC-part convention. */
export interface ShapeFigures {
	formFactor: number;
	crestFactor: number;
}

function ratio(a: number, b: number): number {
	return b === 0 ? NaN : a / b;
}

/** Mean of |x| over the same span the waveform figures used (trapezoid over whole cycles, or every sample). */
function dcRectifiedMean(samples: Float64Array, figs: WaveformFigures, window: CycleWindow | undefined): number {
	if (figs.span === 'whole-cycles' && window) {
		const period =
			window.cycles >= 1 ? (figs.endIndex - figs.startIndex) / window.cycles : figs.endIndex - figs.startIndex;
		return (
			windowIntegral(samples, figs.startIndex, figs.endIndex, Math.abs, period) / (figs.endIndex - figs.startIndex)
		);
	}
	let s = 0;
	for (let i = 0; i < samples.length; i++) s += Math.abs(samples[i]);
	return s / samples.length;
}

/**
 * The meter model of one channel from its waveform figures (lib/signal) and samples.
 * @example meterModel(sinePlusOffset, figs, window).errorPercent // 0 (AC-coupled), .dcCoupled.errorPercent < 0
 */
export function meterModel(samples: Float64Array, figs: WaveformFigures, window: CycleWindow | undefined): MeterModel {
	const acReading = SINE_FORM_FACTOR * figs.rectifiedMean;
	const dcReading = SINE_FORM_FACTOR * (Number.isFinite(figs.rms) ? dcRectifiedMean(samples, figs, window) : NaN);
	const ac = 100 * (ratio(acReading, figs.acRms) - 1);
	const dc = 100 * (ratio(dcReading, figs.rms) - 1);
	return {
		coupling: 'ac',
		reading: acReading,
		trueRms: figs.acRms,
		errorPercent: ac,
		dcCoupled: { reading: dcReading, trueRms: figs.rms, errorPercent: dc },
		dcMatters: Number.isFinite(ac) && Number.isFinite(dc) && Math.abs(dc - ac) >= 0.05,
	};
}

/** Form and crest factor of the AC part of the wave (see the file comment). */
export function shapeFigures(figs: WaveformFigures): ShapeFigures {
	const crest = Math.max(Math.abs(figs.peak - figs.mean), Math.abs(figs.peakNegative - figs.mean));
	return { formFactor: ratio(figs.acRms, figs.rectifiedMean), crestFactor: ratio(crest, figs.acRms) };
}
