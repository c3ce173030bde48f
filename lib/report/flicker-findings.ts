/**
 * Flicker findings in plain words, from the report's flicker section: the worst Pst and Plt per voltage
 * channel (or, for a recording under 10 minutes, the instantaneous flicker, said not to be a Pst), and
 * large voltage steps. Judged with VERDICT_THRESHOLDS (flicker irritation level, IEC 61000-3-3 steps).
 */
import type { ReportFinding } from './findings.js';
import { threshold } from './thresholds.js';
import type { AnalysisReport } from './types.js';
import { PLAIN_WORDS, type NumberWords } from './words.js';
import { maxOf } from '../signal/extremes.js';

/** Flicker and voltage-step findings of every voltage channel with a flicker section. */
export function flickerFindings(report: AnalysisReport, w: NumberWords = PLAIN_WORDS): ReportFinding[] {
	const out: ReportFinding[] = [];
	const irritation = threshold('flickerIrritation');
	for (const c of report.flicker?.channels ?? []) {
		const base = { topic: 'flicker' as const, channel: c.channel };
		if (c.hasPst) {
			const pst = maxOf(c.pst.map((p) => p.pst));
			const plt = c.plt.length > 0 ? maxOf(c.plt.map((p) => p.plt)) : NaN;
			const high = pst > irritation || plt > irritation;
			out.push({
				...base,
				id: `flicker-${c.channel}`,
				level: high ? 'attention' : 'ok',
				text: high
					? `${c.channel}: lights on this supply may flicker enough to irritate people.`
					: `${c.channel}: flicker below the irritation level.`,
				figure: `highest short-term flicker Pst ${w.ratio(pst)} over ${c.pst.length} period(s) of 10 minutes${Number.isFinite(plt) ? `, long-term Plt ${w.ratio(plt)}` : ''} (1 = irritating for half of observers)`,
			});
		} else if (Number.isFinite(c.pinst.max)) {
			out.push({
				...base,
				id: `flicker-${c.channel}`,
				level: 'info',
				text: `${c.channel}: the recording is shorter than 10 minutes, so there is no flicker severity (Pst); only the instantaneous flicker is shown.`,
				figure: `highest instantaneous flicker ${w.ratio(c.pinst.max)} (not a Pst)`,
			});
		}
		if (c.changes.count > 0) {
			const dmax = threshold('stepDmaxPercent');
			const dc = threshold('stepDcPercent');
			const big = c.changes.dmaxPercent > dmax || c.changes.dcMaxPercent > dc;
			out.push({
				...base,
				id: `steps-${c.channel}`,
				level: big ? 'attention' : 'info',
				text: `${c.channel}: ${c.changes.count} voltage step(s); the largest dip or rise was ${w.percent(c.changes.dmaxPercent)} of ${w.quantity(c.nominalV, 'V', 3)}.`,
				figure: `largest change ${w.percent(c.changes.dmaxPercent)}, largest lasting change ${w.percent(c.changes.dcMaxPercent)} (an appliance alone may cause at most ${dmax} % and ${dc} %)`,
			});
		}
	}
	return out;
}
