/**
 * One channel of a short record: the time-domain figures over the whole periods of the fitted frequency
 * (or withheld when the record holds less than one), harmonics and THD from the fit. And, for every
 * record, harmonics under the channel's rounding floor marked as below resolution.
 */
import { meterModel, shapeFigures } from './meter.js';
import type { ChannelRange } from '../capture.js';
import type { CycleWindow } from '../signal/cycles.js';
import type { ChannelResolution } from '../signal/code-step.js';
import { waveformFigures } from '../signal/levels.js';
import { ulKFactor } from '../spectrum/distortion.js';
import { thdFPercent, thdRPercent } from '../spectrum/thd.js';
import type { ShortRecordResult } from './short-record.js';
import type { ReportChannel } from './types.js';

/** Whole periods of the fitted frequency from the first sample, as a cycle window (undefined under one period). */
export function fittedPeriods(n: number, sampleRateHz: number, frequencyHz: number): CycleWindow | undefined {
	const period = sampleRateHz / frequencyHz;
	const cycles = Math.floor(n / period + 1e-9);
	if (cycles < 1) return undefined;
	const crossings = Float64Array.from({ length: cycles + 1 }, (_, k) => Math.min(n, k * period));
	return { startIndex: 0, endIndex: crossings[cycles], cycles, frequencyHz, crossings };
}

/**
 * The report channel of a short record, from the whole-record channel `base`: figures over whole fitted
 * periods (mean, RMS, rectified mean, form factor, meter error need whole periods); under one period the
 * mean and RMS come from the fit (dc and Σ A_h²/2) and rectified mean, form and crest factor and the meter
 * error are withheld (NaN). Harmonics 0…maxOrder, THD_F/THD_R and K-factor to the highest fitted order.
 * @param stated  the channel's stated range and the record's start time, for the clipping warning
 */
export function fittedChannel(
	base: ReportChannel,
	samples: Float64Array,
	sampleRateHz: number,
	r: ShortRecordResult,
	index: number,
	nominalHz: number | undefined,
	maxOrder: number,
	stated: { range?: ChannelRange; startS: number } = { startS: 0 },
): ReportChannel {
	const set = r.sets[index];
	const fitted = r.fit.channels[index];
	const window = fittedPeriods(samples.length, sampleRateHz, r.fit.frequencyHz);
	const figs = waveformFigures(samples, sampleRateHz, {
		...(window
			? { span: 'whole-cycles' as const, window, nominalHz, maxOrder }
			: { span: 'whole-record' as const, frequencyHz: r.fit.frequencyHz, nominalHz, maxOrder }),
		range: stated.range,
		startS: stated.startS,
	});
	const rmsByOrder = set.orders.map((o) => (Number.isNaN(o.rms) ? 0 : o.rms));
	const thdOrder = Math.min(maxOrder, 50, r.fit.highestOrder);
	const h1 = set.orders[1].rms;
	let modelSquares = fitted.dc * fitted.dc;
	for (let h = 1; h <= r.fit.highestOrder; h++) modelSquares += fitted.amplitude[h] ** 2 / 2;
	const whole = window !== undefined;
	const rms = whole ? figs.rms : Math.sqrt(modelSquares);
	return {
		...base,
		mean: whole ? figs.mean : fitted.dc,
		rms,
		acRms: whole ? figs.acRms : Math.sqrt(Math.max(0, modelSquares - fitted.dc * fitted.dc)),
		rectifiedMean: whole ? figs.rectifiedMean : NaN,
		crestFactor: whole ? shapeFigures(figs).crestFactor : NaN,
		formFactor: whole ? shapeFigures(figs).formFactor : NaN,
		frequencyHz: r.fit.frequencyHz,
		thdPercent: thdFPercent(rmsByOrder, thdOrder),
		thdRPercent: thdRPercent(rmsByOrder, thdOrder),
		thdMaxOrder: thdOrder,
		kFactor: ulKFactor(rmsByOrder, thdOrder),
		averageResponding: whole
			? meterModel(samples, figs, window)
			: {
					coupling: 'ac',
					reading: NaN,
					trueRms: NaN,
					errorPercent: NaN,
					dcCoupled: { reading: NaN, trueRms: NaN, errorPercent: NaN },
					dcMatters: false,
				},
		intervals: null,
		harmonics: set.orders.map((o) => ({
			order: o.order,
			rms: o.rms,
			percentOfFundamental: h1 > 0 ? (100 * o.rms) / h1 : NaN,
			phaseDeg: o.phaseDeg,
		})),
		groups: null,
		thdVariants: null,
		worstCycle: null,
		warnings: figs.warnings.map((d) => d.message),
		fit: r.fits[index],
	};
}

/**
 * Marks every harmonic (order ≥ 1) under the channel's rounding floor as below resolution, with the floor
 * as its upper bound. The figures stay in memory (THD, K-factor, limits and the next steps sum them as
 * measured); the JSON gives null in their place and every front end shows the words "below resolution".
 */
export function markBelowResolution(channel: ReportChannel, resolution: ChannelResolution | undefined): ReportChannel {
	if (!resolution) return { ...channel, resolution: null };
	const floor = resolution.harmonicFloorRms;
	const fundamental = channel.harmonics[1]?.rms ?? NaN;
	return {
		...channel,
		resolution: {
			codeStep: resolution.codeStep,
			codesUsed: resolution.codesUsed,
			bitsUsed: resolution.bitsUsed,
			noiseRms: resolution.noiseRms,
			harmonicFloorRms: floor,
		},
		harmonics: channel.harmonics.map((h) =>
			h.order >= 1 && h.rms < floor
				? {
						...h,
						belowResolution: true,
						rmsUpperBound: floor,
						percentOfFundamentalUpperBound: fundamental > 0 ? (100 * floor) / fundamental : NaN,
					}
				: h,
		),
	};
}
