/**
 * Why a sine-calibrated average-responding meter misreads a distorted wave, told from its spectrum.
 */
import { wrapAngleDeg } from '../phasor/phasor.js';
import { dftPlan } from './dft.js';
import type { HarmonicSet } from './types.js';

/** π/(2√2): the sine's form factor, the scale an average-responding meter applies to the rectified mean. */
const SINE_FORM_FACTOR = Math.PI / (2 * Math.SQRT2);
const POINTS = 4096;

/** How one harmonic, alone with the fundamental, shapes the wave and moves the meter's reading. */
export interface AverageMeterReason {
	/** Harmonic order (0 = DC offset). */
	order: number;
	percentOfFundamental: number;
	/** Phase relative to the fundamental's positive peak, φ_h − h·φ_1, degrees (see harmonicWindow). */
	phaseRelDeg: number;
	/** 'peaked': adds to the crest; 'flattened': takes from it; 'asymmetric': even order, unequal half-cycles; 'shifted': moves the crest sideways; 'offset': DC. */
	shape: 'peaked' | 'flattened' | 'asymmetric' | 'shifted' | 'offset';
	/** Reading error this order would cause with the fundamental alone, percent of true RMS. */
	errorAlonePercent: number;
	/** One plain sentence. */
	text: string;
}

export interface AverageMeterExplanation {
	/** True RMS of orders 0…maxOrder (√Σ rms_h²), same unit as the set. */
	trueRms: number;
	/** What a DC-coupled average-responding meter shows: π/(2√2) · rectified mean. */
	averageReading: number;
	/** 100 · (averageReading / trueRms − 1): negative = the meter reads low. */
	readingErrorPercent: number;
	/** RMS / rectified mean (1.1107 for a sine). */
	formFactor: number;
	/** Peak / RMS of the rebuilt wave (1.414 for a sine). */
	crestFactor: number;
	/** One sentence verdict. */
	summary: string;
	/** Orders that move the reading, largest effect first (those ≥ 0.1 % alone, at most 5). */
	reasons: AverageMeterReason[];
}

interface Comp {
	order: number;
	amp: number; // peak
	phaseRad: number;
}

let buffers = {
	p: 0,
	re: new Float64Array(0),
	im: new Float64Array(0),
	outRe: new Float64Array(0),
	outIm: new Float64Array(0),
};

/**
 * RMS, rectified mean and peak of one period of Σ amp·cos(hθ + φ), rebuilt on P points by one DFT:
 * with z[h] = amp·e^{−jφ}, Re Σ_h z[h]·e^{−j2πhi/P} = Σ_h amp·cos(2πhi/P + φ).
 */
function shapeFigures(comps: Comp[]): { rms: number; mav: number; peak: number } {
	let top = 0;
	for (const c of comps) top = Math.max(top, c.order);
	let p = POINTS;
	while (p < 4 * top) p *= 2;
	const b =
		buffers.p === p
			? buffers
			: (buffers = {
					p,
					re: new Float64Array(p),
					im: new Float64Array(p),
					outRe: new Float64Array(p),
					outIm: new Float64Array(p),
				});
	const { re, im, outRe, outIm } = b;
	re.fill(0);
	im.fill(0);
	for (const c of comps) {
		re[c.order] += c.amp * Math.cos(c.phaseRad);
		im[c.order] -= c.amp * Math.sin(c.phaseRad);
	}
	dftPlan(p).forwardComplex(re, im, outRe, outIm);
	let sumSq = 0;
	let sumAbs = 0;
	let peak = 0;
	for (let i = 0; i < p; i++) {
		const v = outRe[i];
		sumSq += v * v;
		sumAbs += Math.abs(v);
		peak = Math.max(peak, Math.abs(v));
	}
	return { rms: Math.sqrt(sumSq / p), mav: sumAbs / p, peak };
}

function errorPercent(comps: Comp[]): number {
	const f = shapeFigures(comps);
	return 100 * ((SINE_FORM_FACTOR * f.mav) / f.rms - 1);
}

function ordinal(h: number): string {
	const s =
		h % 100 >= 11 && h % 100 <= 13 ? 'th' : h % 10 === 1 ? 'st' : h % 10 === 2 ? 'nd' : h % 10 === 3 ? 'rd' : 'th';
	return `${h}${s}`;
}

/**
 * Rebuilds one period from the harmonic set (orders 0…maxOrder, phases kept), computes what a DC-coupled,
 * sine-calibrated average-responding meter would read (π/(2√2) · rectified mean) against the true RMS,
 * and explains the error order by order: each harmonic is put alone beside the fundamental and its
 * effect on the reading measured. An odd harmonic whose peak coincides with the fundamental's
 * (phaseRelDeg ≈ 0°) makes the wave peaked: form factor above 1.1107, the meter reads low. One opposing
 * it (≈ 180°) flattens the top: form factor below 1.1107, the meter reads high. Even harmonics make the
 * half-cycles unequal. Error = K/FF − 1 with K = π/(2√2) (docs/methods.md §1.1, READ).
 *
 * @param set  harmonics of one channel (V or A); orders with NaN RMS are left out
 * @param unit  unit text for the sentences, e.g. 'V' or 'A'
 * @returns NaN figures and an empty reason list when the fundamental is 0 or missing
 * @example
 * // a current with a 60 % 3rd harmonic in phase with the fundamental's peak (rectifier input):
 * averageMeterExplanation(set, 'A').summary
 * // "An average-responding meter would read 14.9 % low (x A instead of y A true RMS)."
 */
export function averageMeterExplanation(set: HarmonicSet, unit = ''): AverageMeterExplanation {
	const comps: Comp[] = [];
	for (const o of set.orders) {
		if (!(o.rms > 0)) continue;
		const ph = Number.isNaN(o.phaseDeg) ? 0 : (o.phaseDeg * Math.PI) / 180;
		comps.push(
			o.order === 0
				? { order: 0, amp: o.phaseDeg === 180 ? -o.rms : o.rms, phaseRad: 0 }
				: { order: o.order, amp: Math.SQRT2 * o.rms, phaseRad: ph },
		);
	}
	const fund = comps.find((c) => c.order === 1);
	if (!fund) {
		return {
			trueRms: NaN,
			averageReading: NaN,
			readingErrorPercent: NaN,
			formFactor: NaN,
			crestFactor: NaN,
			summary: 'No fundamental: the average-responding reading cannot be explained from harmonics.',
			reasons: [],
		};
	}
	const f = shapeFigures(comps);
	const averageReading = SINE_FORM_FACTOR * f.mav;
	const readingErrorPercent = 100 * (averageReading / f.rms - 1);
	const u = unit ? ` ${unit}` : '';
	const reasons: AverageMeterReason[] = [];
	for (const c of comps) {
		if (c.order === 1) continue;
		// percent of the fundamental's RMS: amp is a peak for h ≥ 1, the DC value itself for h = 0
		const pct = c.order === 0 ? (100 * Math.SQRT2 * Math.abs(c.amp)) / fund.amp : (100 * c.amp) / fund.amp;
		if (pct < 0.1) continue;
		const e = errorPercent([fund, c]);
		if (Math.abs(e) < 0.1) continue;
		const rel = c.order === 0 ? 0 : wrapAngleDeg(((c.phaseRad - c.order * fund.phaseRad) * 180) / Math.PI);
		const reading = e < 0 ? `low by ${(-e).toFixed(1)} %` : `high by ${e.toFixed(1)} %`;
		let shape: AverageMeterReason['shape'];
		let text: string;
		if (c.order === 0) {
			shape = 'offset';
			text = `A DC offset of ${pct.toFixed(1)} % of the fundamental shifts the wave off zero; alone it would make a DC-coupled meter read ${reading} (an AC-coupled one ignores it).`;
		} else if (c.order % 2 === 0) {
			shape = 'asymmetric';
			text = `The ${ordinal(c.order)} harmonic (${pct.toFixed(1)} %) makes the positive and negative half-cycles unequal; alone it would make the meter read ${reading}.`;
		} else {
			const onPeak = Math.cos((rel * Math.PI) / 180); // the harmonic's value at the fundamental's crest, per unit
			shape = onPeak > 0.5 ? 'peaked' : onPeak < -0.5 ? 'flattened' : 'shifted';
			const how =
				shape === 'peaked'
					? "adds to the fundamental's crest (a pointed wave)"
					: shape === 'flattened'
						? "takes from the fundamental's crest (a flat-topped wave)"
						: "peaks beside the fundamental's crest (a tilted wave)";
			const why = e < 0 ? 'raises the RMS more than the rectified mean' : 'raises the rectified mean more than the RMS';
			text = `The ${ordinal(c.order)} harmonic (${pct.toFixed(1)} %, ${rel.toFixed(0).replace(/^-0$/, '0')}° from the crest) ${how} and ${why}; alone it would make the meter read ${reading}.`;
		}
		reasons.push({ order: c.order, percentOfFundamental: pct, phaseRelDeg: rel, shape, errorAlonePercent: e, text });
	}
	reasons.sort((a, b) => Math.abs(b.errorAlonePercent) - Math.abs(a.errorAlonePercent));
	reasons.length = Math.min(reasons.length, 5);
	const formFactor = f.rms / f.mav;
	const summary =
		Math.abs(readingErrorPercent) < 1
			? `An average-responding meter would read within 1 % of true RMS (${readingErrorPercent.toFixed(2)} %, form factor ${formFactor.toFixed(4)} against 1.1107 for a sine).`
			: `An average-responding meter would read ${Math.abs(readingErrorPercent).toFixed(1)} % ${readingErrorPercent < 0 ? 'low' : 'high'} (${averageReading.toPrecision(4)}${u} instead of ${f.rms.toPrecision(4)}${u} true RMS; form factor ${formFactor.toFixed(4)} against 1.1107 for a sine).`;
	return {
		trueRms: f.rms,
		averageReading,
		readingErrorPercent,
		formFactor,
		crestFactor: f.peak / f.rms,
		summary,
		reasons,
	};
}
