/**
 * Why an average-responding meter misreads a channel, told with the very numbers of the figures table:
 * the summary states the measured (time-domain) reading and error of the AC-coupled model; the reasons
 * name the harmonics behind it (lib/spectrum's account of orders 1…maxOrder, DC left out as an
 * AC-coupled meter leaves it out), and what the orders up to maxOrder do not explain is stated as a
 * remainder: content above the highest order and between harmonics. With a DC offset that moves a
 * DC-coupled meter, a last sentence gives that meter's reading too.
 */
import { averageMeterExplanation } from '../spectrum/average-meter.js';
import type { HarmonicSet } from '../spectrum/types.js';
import type { MeterModel } from './meter.js';
import { threshold } from './thresholds.js';
import { ordinal, PLAIN_WORDS, type NumberWords } from './words.js';

export interface MeterExplanation {
	summary: string;
	reasons: string[];
	/** Error of the wave rebuilt from orders 1…maxOrder, % (the part the harmonics account for). */
	harmonicsErrorPercent: number;
	/** errorPercent − harmonicsErrorPercent: the part from above maxOrder and between harmonics, %. */
	remainderPercent: number;
}

/**
 * @param set  the channel's aggregated harmonics (orders 0…maxOrder)
 * @param wholeRecordOnly  say that the figures are the whole record's (a record whose level changes)
 * @param model  the channel's meter model (the table's figures)
 * @example meterExplanation(dimmerSet, model, 'A').summary // "An AC-coupled average-responding meter would read 29.3 % low: …"
 */
export function meterExplanation(
	set: HarmonicSet,
	model: MeterModel,
	unit: string,
	words: NumberWords = PLAIN_WORDS,
	wholeRecordOnly = false,
): MeterExplanation {
	const w = words;
	// on a record whose level changes, this is the whole record's reading (the findings judge each interval)
	const an = wholeRecordOnly ? 'Over the whole record, which includes level changes, an' : 'An';
	const err = model.errorPercent;
	const maxOrder = set.orders.length - 1;
	const acSet: HarmonicSet = { ...set, orders: set.orders.map((o) => (o.order === 0 ? { ...o, rms: 0 } : o)) };
	const e = averageMeterExplanation(acSet, unit);
	const ok = Math.abs(err) <= threshold('meterErrorPercent');
	const summary = !Number.isFinite(err)
		? 'No AC signal: the average-responding reading cannot be judged.'
		: ok
			? `${an} AC-coupled average-responding meter would read within ${threshold('meterErrorPercent')} % of the true RMS (${w.percent(err)}: ${w.quantity(model.reading, unit)} against ${w.quantity(model.trueRms, unit)}).`
			: `${an} AC-coupled average-responding meter would read ${w.percent(Math.abs(err))} ${err < 0 ? 'low' : 'high'}: ${w.quantity(model.reading, unit)} instead of ${w.quantity(model.trueRms, unit)} true RMS.`;
	const reasons = ok ? [] : e.reasons.map((r) => r.text);
	const remainder = err - e.readingErrorPercent;
	if (!ok && Number.isFinite(remainder)) {
		reasons.push(
			Math.abs(remainder) < 0.05
				? `Harmonics 1 to ${maxOrder} account for the whole error.`
				: `Harmonics 1 to ${maxOrder} account for ${w.percent(e.readingErrorPercent)}; the remaining ${w.percent(remainder)} comes from the wave above the ${ordinal(maxOrder)} harmonic and between harmonics (level changes during the record show there too).`,
		);
	}
	if (model.dcMatters) {
		const dc = model.dcCoupled;
		reasons.push(
			`A DC-coupled average-responding meter would read ${w.quantity(dc.reading, unit)} against ${w.quantity(dc.trueRms, unit)} true RMS including the DC (${w.percent(dc.errorPercent)}).`,
		);
	}
	return { summary, reasons, harmonicsErrorPercent: e.readingErrorPercent, remainderPercent: remainder };
}
