/**
 * Flicker findings in plain words, from the report's flicker section: the worst Pst and Plt per voltage
 * channel (or, for a recording under 10 minutes, the instantaneous flicker, said not to be a Pst), and
 * large voltage steps. Thresholds decide the wording only.
 */
import type { AnalysisReport } from '../../lib/report/types.js';
import type { Verdict } from './verdicts.js';
import { maxOf } from '../../lib/signal/index.js';

/**
 * Pst or Plt of 1: the level at which half of observers find a 60 W filament lamp's flicker irritating
 * (the flickermeter's scale, IEC 61000-4-15; common practice).
 */
export const FLICKER_IRRITATION_LEVEL = 1;
/** IEC 61000-3-3:2013 appliance limits for voltage steps, % of nominal: dmax 4 %, dc 3.3 % (from memory). */
export const STEP_DMAX_PERCENT = 4;
export const STEP_DC_PERCENT = 3.3;

const f2 = (x: number) => (Number.isFinite(x) ? x.toFixed(2) : '–');
const f1 = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '–');

export function flickerVerdicts(report: AnalysisReport): Verdict[] {
	const out: Verdict[] = [];
	for (const c of report.flicker?.channels ?? []) {
		const target = { tab: 'trends' as const, channel: c.channel };
		if (c.hasPst) {
			const pst = maxOf(c.pst.map((p) => p.pst));
			const plt = c.plt.length > 0 ? maxOf(c.plt.map((p) => p.plt)) : NaN;
			const high = pst > FLICKER_IRRITATION_LEVEL || plt > FLICKER_IRRITATION_LEVEL;
			out.push({
				id: `flicker-${c.channel}`,
				topic: 'flicker',
				level: high ? 'attention' : 'ok',
				text: high ? `${c.channel}: lights on this supply may flicker enough to irritate people.` : `${c.channel}: flicker below the irritation level.`,
				figure: `highest short-term flicker Pst ${f2(pst)} over ${c.pst.length} period(s) of 10 minutes${Number.isFinite(plt) ? `, long-term Plt ${f2(plt)}` : ''} (1 = irritating for half of observers)`,
				target,
			});
		} else if (Number.isFinite(c.pinst.max)) {
			out.push({
				id: `flicker-${c.channel}`,
				topic: 'flicker',
				level: 'info',
				text: `${c.channel}: the recording is shorter than 10 minutes, so there is no flicker severity (Pst); only the instantaneous flicker is shown.`,
				figure: `highest instantaneous flicker ${f2(c.pinst.max)} (not a Pst)`,
				target,
			});
		}
		if (c.changes.count > 0) {
			const big = c.changes.dmaxPercent > STEP_DMAX_PERCENT || c.changes.dcMaxPercent > STEP_DC_PERCENT;
			out.push({
				id: `steps-${c.channel}`,
				topic: 'flicker',
				level: big ? 'attention' : 'info',
				text: `${c.channel}: ${c.changes.count} voltage step(s); the largest dip or rise was ${f1(c.changes.dmaxPercent)} % of ${c.nominalV} V.`,
				figure: `largest change ${f1(c.changes.dmaxPercent)} %, largest lasting change ${f1(c.changes.dcMaxPercent)} % (an appliance alone may cause at most ${STEP_DMAX_PERCENT} % and ${STEP_DC_PERCENT} %)`,
				target,
			});
		}
	}
	return out;
}
