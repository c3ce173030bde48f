/**
 * The findings of a report in plain words, each with the numbers behind it: distortion against the
 * chosen limits, meter readings, load and power factor, three-phase, voltage events and the data's
 * warnings. Built from the report only, judged with VERDICT_THRESHOLDS; every front end shows these
 * (JSON `findings`, the CLI table, the UI and its printed report), so a figure reads the same everywhere.
 *
 * Long records: the meter and the crest factor are judged on the worst 10/12-cycle interval, the power
 * factor on the typical one; when those differ from the whole-record figure, both are given and the
 * whole-record one is labelled as such (level changes over time are not waveform shape).
 */
import { eventFindings } from './event-findings.js';
import { flickerFindings } from './flicker-findings.js';
import { threshold } from './thresholds.js';
import type { AnalysisReport, ReportChannel, ReportPair, ReportPower } from './types.js';
import { ordinal, PLAIN_WORDS, type NumberWords } from './words.js';

export type FindingLevel = 'ok' | 'attention' | 'fail' | 'info';

export interface ReportFinding {
	id: string;
	topic: 'distortion' | 'meter' | 'load' | 'three-phase' | 'events' | 'flicker' | 'data';
	level: FindingLevel;
	/** The channel it is about (for a pair, the current), or null. */
	channel: string | null;
	text: string;
	/** The number(s) behind it ('' when none). */
	figure: string;
}

/** Short names of the limit tables for sentences. */
export const LIMIT_TABLE_NAMES: Record<string, string> = {
	en50160: 'EN 50160',
	'iec61000-2-2': 'IEC 61000-2-2',
	ieee519: 'IEEE 519',
};

/** "I1 lags U1 by 32.0°, 1.78 ms" (or "leads"; "is in phase with" within ±0.05°): positive lagDeg = lags. */
export function lagSentence(
	pair: Pick<ReportPair, 'ref' | 'other' | 'lagDeg' | 'lagS'>,
	w: NumberWords = PLAIN_WORDS,
): string {
	if (!Number.isFinite(pair.lagDeg)) return `${pair.other} has no fundamental to compare with ${pair.ref}`;
	if (Math.abs(pair.lagDeg) < 0.05) return `${pair.other} is in phase with ${pair.ref}`;
	return `${pair.other} ${pair.lagDeg > 0 ? 'lags' : 'leads'} ${pair.ref} by ${w.deg(Math.abs(pair.lagDeg))}, ${w.duration(Math.abs(pair.lagS))}`;
}

function distortion(report: AnalysisReport, ch: ReportChannel, w: NumberWords): ReportFinding {
	const base = { id: `distortion-${ch.name}`, topic: 'distortion' as const, channel: ch.name };
	const thd = `THD ${w.percent(ch.thdPercent, 2)}`;
	const limits = report.limits;
	const rows = limits?.rows.filter((r) => r.channel === ch.name) ?? [];
	if (!limits || rows.length === 0) {
		return {
			...base,
			level: 'info',
			text: `${ch.name}: distortion ${thd}${limits ? ` (the ${LIMIT_TABLE_NAMES[limits.table]} table has no limits for a ${ch.quantity})` : ' (no limit table chosen)'}.`,
			figure: thd,
		};
	}
	const table = `the ${LIMIT_TABLE_NAMES[limits.table]} limits`;
	const what = (r: (typeof rows)[number]) =>
		r.figure === 'harmonic' ? `${ordinal(r.order)} harmonic` : r.figure.toUpperCase();
	const on = ` (on ${limits.basis.kind === 'single-bins' ? 'single DFT bins' : limits.basis.kind === 'short-record-fit' ? 'harmonics fitted over a short record' : 'harmonic subgroups'})`;
	const over = rows.filter((r) => !r.pass).sort((a, b) => a.margin - b.margin);
	if (over.length === 0) {
		const share = (r: (typeof rows)[number]) => (r.limit > 0 ? r.value / r.limit : -Infinity);
		const tightest = [...rows].sort((a, b) => share(b) - share(a))[0];
		return {
			...base,
			level: 'ok',
			text: `${ch.name}: harmonics within ${table}${on}.`,
			figure: `${thd}; nearest its limit: ${what(tightest)} at ${w.percent(tightest.value, 2)} of ${w.percent(tightest.limit, 2)} allowed`,
		};
	}
	const list = over.slice(0, 4).map((r) => `${what(r)} ${w.percent(r.value, 2)} (limit ${w.percent(r.limit, 2)})`);
	return {
		...base,
		level: 'fail',
		text: `${ch.name}: ${over.length === 1 ? 'one figure is' : `${over.length} figures are`} over ${table}${on}.`,
		figure: list.join('; ') + (over.length > 4 ? `; and ${over.length - 4} more` : ''),
	};
}

/** The interval wording of a long record, or '' when the whole-record figure says the same. */
function intervalNote(ch: ReportChannel, w: NumberWords): string {
	const iv = ch.intervals;
	if (!iv || iv.count < 2) return '';
	const e = iv.meterErrorPercent;
	if (w.percent(e.worst) === w.percent(ch.averageResponding.errorPercent)) return '';
	return `per ${iv.intervalCycles}-cycle interval: typical ${w.percent(e.typical)}, worst ${w.percent(e.worst)} at ${w.at(e.worstStartS)}; whole record ${w.percent(ch.averageResponding.errorPercent)} (it includes level changes over time)`;
}

function meter(ch: ReportChannel, w: NumberWords): ReportFinding[] {
	const m = ch.averageResponding;
	const base = { id: `meter-${ch.name}`, topic: 'meter' as const, channel: ch.name };
	const iv = ch.intervals && ch.intervals.count >= 2 ? ch.intervals : null;
	const error = iv ? iv.meterErrorPercent.worst : m.errorPercent;
	if (!Number.isFinite(error))
		return [
			{
				...base,
				level: 'info',
				text: `${ch.name}: cannot tell how an average-responding meter would read.`,
				figure: `true RMS ${w.quantity(ch.rms, ch.unit)}`,
			},
		];
	const limit = threshold('meterErrorPercent');
	const ok = Math.abs(error) <= limit;
	const note = intervalNote(ch, w);
	const whole = `an AC-coupled meter would show ${w.quantity(m.reading, ch.unit)} against ${w.quantity(m.trueRms, ch.unit)} true RMS (${w.percent(m.errorPercent)})`;
	const dc = m.dcMatters
		? `; a DC-coupled one ${w.quantity(m.dcCoupled.reading, ch.unit)} against ${w.quantity(m.dcCoupled.trueRms, ch.unit)} with the DC (${w.percent(m.dcCoupled.errorPercent)})`
		: '';
	const out: ReportFinding[] = [
		{
			...base,
			level: ok ? 'ok' : 'attention',
			text: ok
				? `${ch.name}: an average-responding meter would read right (within ${limit} %).`
				: `${ch.name}: an average-responding meter would read ${w.percent(Math.abs(error))} ${error < 0 ? 'low' : 'high'}${note ? ' in the worst interval' : ''}; use a true-RMS meter.`,
			figure: note || `${whole}${dc}`,
		},
	];
	const cf = iv ? iv.crestFactor.worst : ch.crestFactor;
	if (Number.isFinite(cf) && cf > threshold('meterCrestFactor')) {
		out.push({
			id: `crest-${ch.name}`,
			topic: 'meter',
			channel: ch.name,
			level: 'attention',
			text: `${ch.name}: crest factor ${w.ratio(cf)}${iv ? ` (worst ${iv.intervalCycles}-cycle interval, at ${w.at(iv.crestFactor.worstStartS)})` : ''}: a true-RMS meter specified to ${threshold('meterCrestFactor')} may read low.`,
			figure: iv ? `typical interval ${w.ratio(iv.crestFactor.typical)}; whole record ${w.ratio(ch.crestFactor)}` : '',
		});
	}
	return out;
}

function load(p: ReportPower, w: NumberWords): ReportFinding {
	const iv = p.powerFactorIntervals;
	const long = iv && Number.isFinite(iv.typical) && w.ratio(iv.typical) !== w.ratio(p.powerFactor);
	const pf = long ? iv.typical : p.powerFactor;
	// a millionth of S is below any recorder's resolution: P or Q smaller than that reads 0
	const tiny = Number.isFinite(p.apparentVA) ? 1e-6 * p.apparentVA : 0;
	const low = Number.isFinite(pf) && Math.abs(pf) < threshold('lowPowerFactor');
	const fromDistortion = low && Math.abs(p.displacementPowerFactor) >= threshold('displacementExplainsPowerFactor');
	const pfText = long
		? `power factor ${w.ratio(pf)} in a typical interval (lowest ${w.ratio(iv.worst)} at ${w.at(iv.worstStartS)}; whole record ${w.ratio(p.powerFactor)}, which includes load changes over time)`
		: `power factor ${w.ratio(pf)}`;
	return {
		id: `load-${p.voltage}-${p.current}`,
		topic: 'load',
		channel: p.current,
		level: low ? 'attention' : 'ok',
		text: `${p.current} on ${p.voltage}: ${p.loadSentence}; ${pfText}${low ? ` (below ${threshold('lowPowerFactor')})` : ''}.${fromDistortion ? ' The shortfall comes from harmonic current, not phase shift: capacitors will not correct it.' : ''}`,
		figure: `P ${w.quantity(p.activeW, 'W', 4, tiny)}, S ${w.quantity(p.apparentVA, 'VA')}, Q₁ ${w.quantity(p.reactiveVar, 'var', 4, tiny)}; displacement power factor ${w.ratio(p.displacementPowerFactor, 3)}`,
	};
}

function threePhase(report: AnalysisReport, w: NumberWords): ReportFinding[] {
	const tp = report.threePhase;
	if (!tp) return [];
	const seq = tp.channels.join(' → ');
	const unit = tp.quantity === 'voltage' ? 'V' : 'A';
	const limit = threshold('voltageUnbalancePercent');
	const high = tp.quantity === 'voltage' && tp.unbalancePercent > limit;
	const rotation =
		tp.rotation === 'positive'
			? `Rotation ${seq} is positive (the phases follow each other in that order).`
			: tp.rotation === 'negative'
				? `Rotation ${seq} is reversed: two phases are swapped (a motor would run backwards).`
				: `Rotation of ${seq} cannot be told.`;
	return [
		{
			id: 'rotation',
			topic: 'three-phase',
			channel: null,
			level: tp.rotation === 'positive' ? 'ok' : tp.rotation === 'negative' ? 'attention' : 'info',
			text: rotation,
			figure: `positive sequence ${w.quantity(tp.sequence.positive, unit)}, negative sequence ${w.quantity(tp.sequence.negative, unit, 4, 1e-6 * tp.sequence.positive)}`,
		},
		{
			id: 'unbalance',
			topic: 'three-phase',
			channel: null,
			level: tp.quantity === 'voltage' ? (high ? 'attention' : 'ok') : 'info',
			text:
				tp.quantity === 'voltage'
					? `${tp.channels.join(', ')}: ${high ? `unbalanced beyond ${limit} %` : `balanced within ${limit} %`}.`
					: `${tp.channels.join(', ')}: current unbalance ${w.percent(tp.unbalancePercent, 2)}.`,
			figure: `unbalance (negative / positive sequence) ${w.percent(tp.unbalancePercent, 2)}; LVUR ${w.percent(tp.lvurPercent, 2)}; PVUR ${w.percent(tp.pvurPercent, 2)}`,
		},
	];
}

/** Every finding of a report, in reading order. `words` sets the decimal mark (the UI passes its locale's). */
export function reportFindings(report: AnalysisReport, words: NumberWords = PLAIN_WORDS): ReportFinding[] {
	const chs = report.channels.filter((c) => c.quantity !== 'other');
	const out: ReportFinding[] = [
		...chs.map((c) => distortion(report, c, words)),
		...chs.flatMap((c) => meter(c, words)),
		...report.power.map((p) => load(p, words)),
		...threePhase(report, words),
		...eventFindings(report.events, words),
		...flickerFindings(report, words),
	];
	report.warnings.forEach((t, i) =>
		out.push({ id: `warning-${i}`, topic: 'data', level: 'attention', channel: null, text: t, figure: '' }),
	);
	for (const ch of report.channels)
		ch.warnings.forEach((t, i) =>
			out.push({
				id: `warning-${ch.name}-${i}`,
				topic: 'data',
				level: 'attention',
				channel: ch.name,
				text: `${ch.name}: ${t}`,
				figure: '',
			}),
		);
	return out;
}
