/**
 * How the survey's lines are shown: the short verdict list (one line per rule, phases together) and the
 * rule table (each channel's harmonic orders in one row when none fails). Presentation only: every value,
 * limit and verdict is lib/survey's.
 */
import type { SurveyStandard } from '../../lib/survey/index.js';
import type { SurveyLine, SurveyResult, SurveyVerdict } from '../../lib/survey/types.js';

/** One rule over all phases: the worst verdict of its lines and the phases that fail it. */
export interface VerdictGroup {
	quantity: string;
	rule: string;
	verdict: SurveyVerdict;
	failing: string[];
	source: string;
}

const isHarmonic = (l: SurveyLine) => l.id.startsWith('harmonic-');

/** A harmonic order's source without its order and order group: the table it comes from. */
const tableSource = (s: string) => s.replace(/,\s*h = \d+.*$/, '').replace(/,\s*(even|odd) [^,]*$/, '');

function worst(lines: SurveyLine[]): SurveyVerdict {
	if (lines.some((l) => l.verdict === 'does not meet')) return 'does not meet';
	return lines.some((l) => l.verdict === 'meets') ? 'meets' : 'not measured';
}

/** The verdict list: each rule once (its phases together), the harmonic orders as one line. */
export function verdictGroups(lines: readonly SurveyLine[]): VerdictGroup[] {
	const groups = new Map<string, SurveyLine[]>();
	for (const l of lines) {
		const key = isHarmonic(l) ? 'harmonic' : `${l.quantity}\u0000${l.rule}`;
		groups.set(key, [...(groups.get(key) ?? []), l]);
	}
	return [...groups.entries()].map(([key, ls]) => ({
		quantity: key === 'harmonic' ? 'Harmonic voltages, each order' : ls[0].quantity,
		rule: key === 'harmonic' ? "95 % of 10-minute values within each order's limit" : ls[0].rule,
		verdict: worst(ls),
		failing: [
			...new Set(
				ls
					.filter((l) => l.verdict === 'does not meet')
					.map((l) => (isHarmonic(l) ? `${l.channel ?? 'all'} h${l.id.slice(9)}` : (l.channel ?? 'all'))),
			),
		],
		source: key === 'harmonic' ? tableSource(ls[0].source) : ls[0].source,
	}));
}

/** One row of the rule table. */
export interface RuleRow {
	verdict: SurveyVerdict;
	quantity: string;
	channel: string;
	rule: string;
	measured: string;
	source: string;
}

/**
 * The rule table: every line, except that a channel's harmonic orders are one row when none fails (naming
 * the order nearest its limit); an order that fails gets its own row.
 */
export function ruleRows(lines: readonly SurveyLine[]): RuleRow[] {
	const row = (l: SurveyLine): RuleRow => ({
		verdict: l.verdict,
		quantity: l.quantity,
		channel: l.channel ?? 'all',
		rule: l.rule,
		measured: l.measured,
		source: l.source,
	});
	const out = lines.filter((l) => !isHarmonic(l)).map(row);
	const harmonic = lines.filter(isHarmonic);
	for (const ch of [...new Set(harmonic.map((l) => l.channel))]) {
		const mine = harmonic.filter((l) => l.channel === ch);
		const failing = mine.filter((l) => l.verdict === 'does not meet');
		const measured = mine.filter((l) => l.verdict === 'meets');
		const orders = `Harmonic voltages, orders ${mine[0].id.slice(9)} to ${mine[mine.length - 1].id.slice(9)}`;
		const source = tableSource(mine[0].source);
		const rule = "95 % of 10-minute values within each order's limit";
		out.push(...failing.map(row));
		if (failing.length > 0) continue;
		if (measured.length === 0)
			out.push({
				verdict: 'not measured',
				quantity: orders,
				channel: ch ?? 'all',
				rule,
				measured: 'no usable values',
				source,
			});
		else {
			const near = measured.reduce((a, b) => (b.value / b.limit > a.value / a.limit ? b : a));
			out.push({
				verdict: 'meets',
				quantity: orders,
				channel: ch ?? 'all',
				rule,
				measured: `nearest its limit: order ${near.id.slice(9)} at ${near.value.toFixed(2)} % (limit ${near.limit} %)`,
				source,
			});
		}
	}
	return out;
}

/** Every source the survey cites, once each: the rules', the event tables' and the interruptions'. */
export function surveySources(r: SurveyResult): string[] {
	const all = [
		...r.lines.map((l) => (isHarmonic(l) ? tableSource(l.source) : l.source)),
		r.dips.source,
		r.swells.source,
		r.interruptions.source,
	];
	return [...new Set(all)];
}

/** Verdict words for an electrician, with a mark so colour is never the only cue. */
export const VERDICT_WORDS: Record<SurveyVerdict, { mark: string; text: string }> = {
	meets: { mark: '✓', text: 'Meets' },
	'does not meet': { mark: '✗', text: 'Does not meet' },
	'not measured': { mark: '–', text: 'Not measured' },
};

/** A limit drawn on a trend chart: its value and its label. */
export interface LimitLine {
	value: number;
	label: string;
}

/** The band edges of a standard's voltage or frequency rules, once each: '207 V (−10 %)'. */
export function bandLimitLines(
	std: SurveyStandard,
	series: 'voltage' | 'frequency',
	nominal: number,
	unit: string,
	fmt: (x: number, decimals: number) => string,
): LimitLine[] {
	const out: LimitLine[] = [];
	for (const rule of std.rules) {
		if (rule.kind !== 'band' || rule.series !== series) continue;
		for (const f of [rule.lowFactor, rule.highFactor]) {
			const value = f * nominal;
			if (out.some((l) => Math.abs(l.value - value) < 1e-9 * nominal)) continue;
			const pct = Math.round((f - 1) * 1000) / 10;
			out.push({
				value,
				label: `${fmt(value, unit === 'Hz' ? 1 : 0)} ${unit} (${pct > 0 ? '+' : '−'}${Math.abs(pct)} %)`,
			});
		}
	}
	return out;
}

/** The limit of a standard's percentile rule for a series, labelled 'limit 8 %'. */
export function percentileLimitLines(
	std: SurveyStandard,
	series: 'thd' | 'unbalance' | 'plt',
	unit: string,
): LimitLine[] {
	return std.rules.flatMap((rule) =>
		rule.kind === 'percentile' && rule.series === series
			? [{ value: rule.limit, label: `limit ${rule.limit}${unit ? ` ${unit}` : ''}` }]
			: [],
	);
}
