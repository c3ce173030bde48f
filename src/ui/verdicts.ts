/**
 * Findings in plain words, each with the number behind it and where it shows on the plots. Built from the
 * analysis report only: the thresholds here decide the wording (ok / look at this), never a figure.
 */
import type { AnalysisReport, ReportChannel, ReportPair } from '../../lib/report/types.js';
import { formatDeg, formatDuration, formatPercent, formatQuantity, formatRatio } from './format.js';
import { flickerVerdicts } from './flicker-verdicts.js';

export type VerdictLevel = 'ok' | 'attention' | 'fail' | 'info';
export type ViewTab = 'waves' | 'harmonics' | 'phasors' | 'trends' | 'check' | 'report';

export interface Verdict {
	id: string;
	topic: 'distortion' | 'meter' | 'load' | 'three-phase' | 'flicker' | 'data';
	level: VerdictLevel;
	/** The finding in plain words. */
	text: string;
	/** The number(s) behind it. */
	figure: string;
	/** Where it shows: a tab and optionally a channel to select there. */
	target: { tab: ViewTab; channel?: string };
}

/**
 * An average-responding meter's error within ±1 % is taken as reading right: about the basic accuracy of a
 * general-purpose digital multimeter on AC volts (common practice; from memory).
 */
export const METER_OK_PERCENT = 1;
/** Power factor below 0.9 flagged: a threshold many supply contracts charge reactive energy at (common practice). */
export const LOW_POWER_FACTOR = 0.9;
/** Displacement power factor taken as "near 1" when explaining a low power factor (common practice). */
export const DISPLACEMENT_NEAR_ONE = 0.95;
/** Voltage unbalance above 2 %: the EN 50160 limit for 95 % of 10-minute values (from memory). */
export const UNBALANCE_LIMIT_PERCENT = 2;

/** Short names of the limit tables for sentences (the report carries the full title with its source). */
export const LIMIT_TABLE_NAMES: Record<string, string> = { en50160: 'EN 50160', 'iec61000-2-2': 'IEC 61000-2-2', ieee519: 'IEEE 519' };

/** "I1 lags U1 by 32.0°, 1.78 ms" (or "leads"); "in phase" within ±0.05°. */
export function lagSentence(pair: Pick<ReportPair, 'ref' | 'other' | 'lagDeg' | 'lagS'>): string {
	if (!Number.isFinite(pair.lagDeg)) return `${pair.other} has no fundamental to compare with ${pair.ref}`;
	if (Math.abs(pair.lagDeg) < 0.05) return `${pair.other} is in phase with ${pair.ref}`;
	const verb = pair.lagDeg > 0 ? 'lags' : 'leads';
	return `${pair.other} ${verb} ${pair.ref} by ${formatDeg(Math.abs(pair.lagDeg))}, ${formatDuration(Math.abs(pair.lagS))}`;
}

function ordinal(n: number): string {
	const s = n % 100 >= 11 && n % 100 <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th';
	return `${n}${s}`;
}

function distortion(report: AnalysisReport, ch: ReportChannel): Verdict {
	const id = `distortion-${ch.name}`;
	const target = { tab: 'harmonics' as const, channel: ch.name };
	const thd = `THD ${formatPercent(ch.thdPercent)}`;
	const rows = report.limits?.rows.filter((r) => r.channel === ch.name) ?? [];
	if (!report.limits || rows.length === 0) {
		return { id, topic: 'distortion', level: 'info', text: `${ch.name}: distortion ${thd}${report.limits ? ` (the ${LIMIT_TABLE_NAMES[report.limits.table] ?? report.limits.table} table has no limits for a ${ch.quantity})` : ' (no limit table chosen)'}.`, figure: thd, target };
	}
	const over = rows.filter((r) => !r.pass).sort((a, b) => a.margin - b.margin);
	const table = `the ${LIMIT_TABLE_NAMES[report.limits.table] ?? report.limits.table} limits`;
	if (over.length === 0) {
		// the figure using the largest share of its own limit: the one to watch
		const share = (r: (typeof rows)[number]) => (r.limit > 0 ? r.value / r.limit : -Infinity);
		const tightest = [...rows].sort((a, b) => share(b) - share(a))[0];
		const what = tightest.figure === 'harmonic' ? `${ordinal(tightest.order)} harmonic` : tightest.figure.toUpperCase();
		return {
			id,
			topic: 'distortion',
			level: 'ok',
			text: `${ch.name}: harmonics within ${table}.`,
			figure: `${thd}; nearest its limit: ${what} at ${formatPercent(tightest.value)} of ${formatPercent(tightest.limit)} allowed`,
			target,
		};
	}
	const what = (r: (typeof over)[number]) => (r.figure === 'harmonic' ? `${ordinal(r.order)} harmonic` : r.figure.toUpperCase());
	return {
		id,
		topic: 'distortion',
		level: 'fail',
		text: `${ch.name}: ${over.length === 1 ? 'one figure is' : `${over.length} figures are`} over ${table}.`,
		figure: over
			.slice(0, 4)
			.map((r) => `${what(r)} ${formatPercent(r.value)} (limit ${formatPercent(r.limit)})`)
			.join('; ') + (over.length > 4 ? `; and ${over.length - 4} more` : ''),
		target,
	};
}

function meter(ch: ReportChannel): Verdict {
	const { reading, errorPercent } = ch.averageResponding;
	const id = `meter-${ch.name}`;
	const target = { tab: 'waves' as const, channel: ch.name };
	const trueRms = formatQuantity(ch.rms, ch.unit);
	if (!Number.isFinite(errorPercent)) {
		return { id, topic: 'meter', level: 'info', text: `${ch.name}: cannot tell how an average-responding meter would read.`, figure: `true RMS ${trueRms}`, target };
	}
	const ok = Math.abs(errorPercent) <= METER_OK_PERCENT;
	const direction = errorPercent < 0 ? 'low' : 'high';
	return {
		id,
		topic: 'meter',
		level: ok ? 'ok' : 'attention',
		text: ok
			? `${ch.name}: an average-responding meter would read right (within ${METER_OK_PERCENT} %).`
			: `${ch.name}: an average-responding meter would read ${formatPercent(Math.abs(errorPercent), 1)} ${direction}; use a true-RMS meter.`,
		figure: `it would show ${formatQuantity(reading, ch.unit)}; true RMS is ${trueRms} (error ${formatPercent(errorPercent, 1)})`,
		target,
	};
}

/** Every finding for a report, in reading order: distortion, meters, load, three-phase, flicker, data warnings. */
export function verdictsFor(report: AnalysisReport): Verdict[] {
	const out: Verdict[] = [];
	for (const ch of report.channels) if (ch.quantity !== 'other') out.push(distortion(report, ch));
	for (const ch of report.channels) if (ch.quantity !== 'other') out.push(meter(ch));
	for (const p of report.power) {
		const low = Number.isFinite(p.powerFactor) && Math.abs(p.powerFactor) < LOW_POWER_FACTOR;
		// PF = DPF × distortion factor (IEEE 1459): a low PF with a DPF near 1 comes from the current's harmonics
		const fromDistortion = low && Math.abs(p.displacementPowerFactor) >= DISPLACEMENT_NEAR_ONE;
		const character = p.character ? `${p.character} load` : 'load character unknown';
		out.push({
			id: `load-${p.voltage}-${p.current}`,
			topic: 'load',
			level: low ? 'attention' : 'ok',
			text: `${p.current} on ${p.voltage}: ${character}, power factor ${formatRatio(p.powerFactor, 2)}${low ? ` (below ${LOW_POWER_FACTOR})` : ''}.${fromDistortion ? ' The shortfall comes from harmonic current, not phase shift: capacitors will not correct it.' : ''}`,
			figure: `P ${formatQuantity(p.activeW, 'W')}, S ${formatQuantity(p.apparentVA, 'VA')}, Q₁ ${formatQuantity(p.reactiveVar, 'var')}; displacement PF ${formatRatio(p.displacementPowerFactor)}`,
			target: { tab: 'phasors', channel: p.current },
		});
	}
	const tp = report.threePhase;
	if (tp) {
		const seq = tp.channels.join(' → ');
		out.push({
			id: 'rotation',
			topic: 'three-phase',
			level: tp.rotation === 'positive' ? 'ok' : tp.rotation === 'negative' ? 'attention' : 'info',
			text:
				tp.rotation === 'positive'
					? `Rotation ${seq} is positive (the phases follow each other in that order).`
					: tp.rotation === 'negative'
						? `Rotation ${seq} is reversed: two phases are swapped (a motor would run backwards).`
						: `Rotation of ${seq} cannot be told.`,
			figure: `positive-sequence ${formatQuantity(tp.sequence.positive, tp.quantity === 'voltage' ? 'V' : 'A')}, negative-sequence ${formatQuantity(tp.sequence.negative, tp.quantity === 'voltage' ? 'V' : 'A')}`,
			target: { tab: 'phasors' },
		});
		const high = tp.quantity === 'voltage' && tp.unbalancePercent > UNBALANCE_LIMIT_PERCENT;
		out.push({
			id: 'unbalance',
			topic: 'three-phase',
			level: tp.quantity === 'voltage' ? (high ? 'attention' : 'ok') : 'info',
			text:
				tp.quantity === 'voltage'
					? `${tp.channels.join(', ')}: ${high ? `unbalanced beyond ${UNBALANCE_LIMIT_PERCENT} %` : `balanced within ${UNBALANCE_LIMIT_PERCENT} %`}.`
					: `${tp.channels.join(', ')}: current unbalance ${formatPercent(tp.unbalancePercent)}.`,
			figure: `unbalance (negative/positive sequence) ${formatPercent(tp.unbalancePercent)}; LVUR ${formatPercent(tp.lvurPercent)}; PVUR ${formatPercent(tp.pvurPercent)}`,
			target: { tab: 'phasors' },
		});
	}
	out.push(...flickerVerdicts(report));
	for (const [i, w] of report.warnings.entries()) {
		out.push({ id: `warning-${i}`, topic: 'data', level: 'attention', text: w, figure: '', target: { tab: 'waves' } });
	}
	for (const ch of report.channels) {
		for (const [i, w] of ch.warnings.entries()) {
			out.push({ id: `warning-${ch.name}-${i}`, topic: 'data', level: 'attention', text: `${ch.name}: ${w}`, figure: '', target: { tab: 'waves', channel: ch.name } });
		}
	}
	return out;
}
