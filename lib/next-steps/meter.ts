/**
 * Will a given meter read this waveform right? The reading a true-RMS meter of a given bandwidth gives
 * from the harmonics inside its bandwidth, and the waveform's crest factor against the meter's crest-factor
 * capability at the range used.
 */
import { fmt, given, recorded } from './common.js';
import { NEXT_STEP_CAUTION, type NextStep, type SiteInputs } from './types.js';

/** A reading within this % of the true RMS counts as "reads it right" for bandwidth (our threshold). */
export const METER_READS_RIGHT_PERCENT = 1;

/**
 * RMS of the orders a meter of bandwidth B passes: √(Σ_{h ≥ 1, h·f1 ≤ B} V_h²) (DC left out: an AC-coupled
 * meter). When B covers every order given, `beyondRms` (what the orders do not hold: above the last order,
 * interharmonics) is added, taken as inside the band. Ref: RMS of a sum of harmonics, Parseval (closed form).
 * @example bandLimitedRms([0, 230, 0, 0, 0, 11.5], 50, 200) // 230 (the 5th at 250 Hz is outside)
 */
export function bandLimitedRms(
	rmsByOrder: ArrayLike<number>,
	fundamentalHz: number,
	bandwidthHz: number,
	beyondRms = 0,
): number {
	if (!(fundamentalHz > 0) || !(bandwidthHz > 0)) return NaN;
	let s = 0;
	let all = true;
	for (let h = 1; h < rmsByOrder.length; h++) {
		if (h * fundamentalHz <= bandwidthHz) s += rmsByOrder[h] * rmsByOrder[h];
		else all = false;
	}
	if (all) s += beyondRms * beyondRms;
	return Math.sqrt(s);
}

/** Points per fundamental cycle when a band-limited wave is rebuilt from its harmonics. */
const REBUILD_POINTS = 4096;

/**
 * What a sine-calibrated average-responding meter of bandwidth B reads: (π / 2√2) · mean |x_B|, x_B the
 * wave rebuilt over one cycle from the orders 1…N with h·f1 ≤ B (x = Σ √2·V_h·cos(hθ + φ_h), DC left out).
 * Ref: form factor of a sine π/(2√2) = 1.1107 (closed form); the meters' sine calibration (common practice).
 * @param phaseDegByOrder  absolute phases of the orders (cosine reference), degrees; NaN counts as 0 for a zero order
 * @example averageRespondingRms([0, 230, 0, 46], [0, -90, 0, -90], 50, Infinity) // 245.33 = 230 + 46/3
 */
export function averageRespondingRms(
	rmsByOrder: ArrayLike<number>,
	phaseDegByOrder: ArrayLike<number>,
	fundamentalHz: number,
	bandwidthHz: number,
): number {
	if (!(fundamentalHz > 0) || !(bandwidthHz > 0)) return NaN;
	let sumAbs = 0;
	for (let k = 0; k < REBUILD_POINTS; k++) {
		const theta = (2 * Math.PI * (k + 0.5)) / REBUILD_POINTS;
		let x = 0;
		for (let h = 1; h < rmsByOrder.length && h * fundamentalHz <= bandwidthHz; h++) {
			if (rmsByOrder[h] === 0) continue;
			const phase = Number.isFinite(phaseDegByOrder[h]) ? (phaseDegByOrder[h] * Math.PI) / 180 : 0;
			x += Math.SQRT2 * rmsByOrder[h] * Math.cos(h * theta + phase);
		}
		sumAbs += Math.abs(x);
	}
	return (Math.PI / (2 * Math.SQRT2)) * (sumAbs / REBUILD_POINTS);
}

/**
 * Crest factor a meter can take at a reading below full scale: CF = CF_rated · range / reading (the peak
 * it handles is CF_rated × full scale). Ref: meter makers' crest-factor specifications (common practice).
 * @example crestFactorAvailable(3, 600, 230) // 7.83
 */
export function crestFactorAvailable(ratedCrestFactor: number, rangeFullScale: number, readingRms: number): number {
	return readingRms > 0 ? (ratedCrestFactor * rangeFullScale) / readingRms : NaN;
}

export interface MeterChannelFigures {
	channel: string;
	unit: string;
	quantity: 'voltage' | 'current';
	acRms: number;
	crestFactor: number;
	fundamentalHz: number;
	rmsByOrder: number[];
	/** Absolute phase of each order, degrees, cosine reference (NaN where the order is 0). */
	phaseDegByOrder: number[];
	averageReading: number;
	averageErrorPercent: number;
}

export interface MeterChannelResult {
	channel: string;
	unit: string;
	trueRms: number;
	/** What the meter reads from the orders inside its bandwidth (true-RMS, or average-responding when so given). */
	inBandReading: number;
	bandErrorPercent: number;
	/** What a sine-calibrated average-responding meter of that bandwidth would read (also when the meter is true-RMS). */
	averageRespondingInBand: number;
	crestFactor: number;
	/** At the range used; the rated CF when no range was given. */
	crestFactorAvailable: number;
	rangeUsed: number;
	/** true: within; false: beyond; null: cannot tell without the range. */
	crestFactorWithin: boolean | null;
}

/** The meter step for every voltage and current channel. */
export function meterReading(
	channels: MeterChannelFigures[],
	site: SiteInputs,
): NextStep<{ channels: MeterChannelResult[] }> {
	const bw = site.meterBandwidthHz;
	const cf = site.meterCrestFactor;
	const needs: string[] = [];
	if (bw === undefined) needs.push("the meter's bandwidth (Hz)");
	if (cf === undefined) needs.push("the meter's rated crest factor");
	if (site.meterResponse === undefined && bw !== undefined)
		needs.push('whether the meter is true-RMS or average-responding (both readings are given meanwhile)');
	const conclusions: string[] = [];
	const results = channels.map((c) => {
		const range = c.quantity === 'voltage' ? site.meterRangeV : site.meterRangeA;
		const r = meterChannel(c, bw, cf, range, site.meterResponse);
		conclusions.push(...r.sentences);
		if (r.needsRange)
			needs.push(
				`the ${c.quantity} range used on the meter (${c.channel} peaks above the rated crest factor at full scale)`,
			);
		return r.result;
	});
	const nothing = bw === undefined && cf === undefined;
	return {
		step: 'meter-reading',
		title: 'Will a meter read this right?',
		status: nothing ? 'needs-input' : needs.length === 0 ? 'result' : 'partial',
		finding: channels
			.map(
				(c) =>
					`${c.channel}: true RMS ${fmt(c.acRms, 2)} ${c.unit}, crest factor ${fmt(c.crestFactor, 2)}; a sine-calibrated average-responding meter reads ${fmt(c.averageReading, 2)} ${c.unit} (${fmt(c.averageErrorPercent, 1)} %)`,
			)
			.join('; '),
		method: [
			'Reading of a true-RMS meter of bandwidth B: √(Σ V_h²) over the orders h with h·f1 ≤ B, against the true RMS (RMS of a sum of harmonics; closed form).',
			'Reading of an average-responding meter: 1.1107 × the mean of |x| of the wave rebuilt from the orders within B with their phases (sine calibration π/(2√2); common practice).',
			'Crest factor the meter takes at the range used: CF_rated × full scale ÷ reading; the waveform is within when its crest factor is not above it (meter crest-factor specifications, common practice).',
		],
		inputs: [
			{ name: 'how the meter responds', value: site.meterResponse ?? null, unit: '', from: 'site' },
			given("meter's bandwidth", bw, 'Hz'),
			given("meter's rated crest factor", cf, ''),
			given('voltage range used', site.meterRangeV, 'V'),
			given('current range used', site.meterRangeA, 'A'),
			...channels.map((c) => recorded(`${c.channel} crest factor`, c.crestFactor, '')),
		],
		needs,
		result: nothing ? null : { channels: results },
		conclusions,
		assumptions: [
			'The meter is AC-coupled (DC left out); its own accuracy is not included.',
			'Harmonics are those of the report (to its highest order); what lies between and above them is counted inside the band only when the bandwidth covers every order given.',
		],
		warnings: [],
		caution: NEXT_STEP_CAUTION,
	};
}

function readingSentence(c: MeterChannelFigures, what: string, reading: number, why: string): string {
	const e = (100 * (reading - c.acRms)) / c.acRms;
	if (Math.abs(e) <= METER_READS_RIGHT_PERCENT)
		return `${c.channel}: ${what} reads it right (${fmt(reading, 2)} ${c.unit}, ${fmt(e, 1)} %).`;
	return `${c.channel}: ${what} reads about ${fmt(reading, 2)} ${c.unit}, ${fmt(Math.abs(e), 1)} % ${e < 0 ? 'low' : 'high'}${why}.`;
}

function meterChannel(
	c: MeterChannelFigures,
	bw: number | undefined,
	cf: number | undefined,
	range: number | undefined,
	response: SiteInputs['meterResponse'],
) {
	const sentences: string[] = [];
	const sumSq = c.rmsByOrder.reduce((s, x, h) => (h >= 1 ? s + x * x : s), 0);
	const beyond = Math.sqrt(Math.max(0, c.acRms * c.acRms - sumSq));
	const trueRmsInBand = bw === undefined ? NaN : bandLimitedRms(c.rmsByOrder, c.fundamentalHz, bw, beyond);
	const averageInBand =
		bw === undefined ? NaN : averageRespondingRms(c.rmsByOrder, c.phaseDegByOrder, c.fundamentalHz, bw);
	const inBand = response === 'average' ? averageInBand : trueRmsInBand;
	const errorPercent = (100 * (inBand - c.acRms)) / c.acRms;
	if (Number.isFinite(inBand)) {
		const band = `${fmt(bw!, 0)} Hz`;
		const missed =
			trueRmsInBand < c.acRms * (1 - METER_READS_RIGHT_PERCENT / 100) ? ` (harmonics above ${band} are missed)` : '';
		if (response !== 'average')
			sentences.push(
				readingSentence(
					c,
					`a true-RMS ${band} meter`,
					trueRmsInBand,
					missed ? `: harmonics above ${band} are missed` : '',
				),
			);
		if (response !== 'true-rms')
			sentences.push(
				readingSentence(
					c,
					`an average-responding ${band} meter`,
					averageInBand,
					`: it is calibrated for a sine${missed}`,
				),
			);
	}
	let available = NaN;
	let within: boolean | null = null;
	let needsRange = false;
	if (cf !== undefined) {
		available = range === undefined ? cf : crestFactorAvailable(cf, range, c.acRms);
		if (range !== undefined && c.acRms > range) {
			within = false;
			sentences.push(`${c.channel}: ${fmt(c.acRms, 1)} ${c.unit} is above the ${fmt(range, 0)} ${c.unit} range.`);
		} else if (c.crestFactor <= available) {
			within = true;
			sentences.push(
				`${c.channel}: crest factor ${fmt(c.crestFactor, 2)} is within the meter's ${fmt(available, 2)}${range === undefined ? ' (rated at full scale, so on any range that holds the reading)' : ` on the ${fmt(range, 0)} ${c.unit} range`}.`,
			);
		} else if (range === undefined) {
			needsRange = true;
			sentences.push(
				`${c.channel}: crest factor ${fmt(c.crestFactor, 2)} is above the rated ${fmt(cf, 2)} at full scale: whether the meter copes depends on the range used.`,
			);
		} else {
			within = false;
			sentences.push(
				`${c.channel}: crest factor ${fmt(c.crestFactor, 2)} is above the ${fmt(available, 2)} the meter takes on the ${fmt(range, 0)} ${c.unit} range: its peaks are clipped and it reads low; use a higher range.`,
			);
		}
	}
	const result: MeterChannelResult = {
		channel: c.channel,
		unit: c.unit,
		trueRms: c.acRms,
		inBandReading: inBand,
		bandErrorPercent: errorPercent,
		averageRespondingInBand: averageInBand,
		crestFactor: c.crestFactor,
		crestFactorAvailable: available,
		rangeUsed: range ?? NaN,
		crestFactorWithin: within,
	};
	return { result, sentences, needsRange };
}
