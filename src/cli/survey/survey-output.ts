/** Text forms of a survey: the readable table, the CSV rows and the JSON document (NaN as null). */
import { csvCell } from '../../../lib/report/index.js';
import { maxOf } from '../../../lib/signal/index.js';
import type { SurveyEventTable, SurveyLine, SurveyResult } from '../../../lib/survey/types.js';

function clock(s: number, clockAligned: boolean): string {
	return clockAligned
		? new Date(Math.floor(s) * 1000).toISOString().slice(0, 19).replace('T', ' ')
		: `${s.toFixed(0)} s from the first sample`;
}

function span(s: number): string {
	if (s >= 86_400) return `${(s / 86_400).toFixed(2)} days`;
	if (s >= 3600) return `${(s / 3600).toFixed(2)} h`;
	if (s >= 60) return `${(s / 60).toFixed(1)} min`;
	return `${s.toFixed(1)} s`;
}

const MARK: Record<SurveyLine['verdict'], string> = {
	meets: 'meets',
	'does not meet': 'DOES NOT MEET',
	'not measured': 'not measured',
};

function pad(cells: string[][]): string[] {
	const widths = cells[0].map((_, c) => maxOf(cells.map((r) => r[c].length)));
	return cells.map((r) =>
		r
			.map((v, c) => (c === r.length - 1 ? v : v.padEnd(widths[c])))
			.join('  ')
			.trimEnd(),
	);
}

function eventTable(t: SurveyEventTable, title: string): string[] {
	const rows = [[title, ...t.columns], ...t.rows.map((r, i) => [r, ...t.counts[i].map(String)])];
	const out = pad(rows);
	if (t.outside > 0)
		out.push(`(${t.outside} outside the table: shorter than its first duration band or beyond its last)`);
	out.push(`source: ${t.source}`);
	return out;
}

/**
 * Table rows: every rule line, except that each channel's harmonic orders are one row when they all meet
 * (or none was measured), naming the order closest to its limit; orders that do not meet get a row each.
 */
function tableRows(lines: SurveyLine[]): string[][] {
	const row = (l: SurveyLine) => [MARK[l.verdict], l.quantity, l.channel ?? 'all', l.rule, l.measured, l.source];
	const out = lines.filter((l) => !l.id.startsWith('harmonic-')).map(row);
	const harmonic = lines.filter((l) => l.id.startsWith('harmonic-'));
	for (const ch of [...new Set(harmonic.map((l) => l.channel))]) {
		const mine = harmonic.filter((l) => l.channel === ch);
		const failing = mine.filter((l) => l.verdict === 'does not meet');
		const measured = mine.filter((l) => l.verdict === 'meets');
		const orders = `orders ${mine[0].id.slice(9)}-${mine[mine.length - 1].id.slice(9)}`;
		const table = mine[0].source.replace(/,[^,]*,\s*h = \d+$/, '').replace(/, h = \d+.*$/, '');
		if (failing.length > 0) out.push(...failing.map(row));
		if (measured.length === 0 && failing.length === 0)
			out.push([
				'not measured',
				`Harmonic voltages, ${orders}`,
				ch ?? 'all',
				"95 % of 10-minute values ≤ each order's limit",
				'no usable values',
				table,
			]);
		else if (failing.length === 0) {
			const closest = measured.reduce((a, b) => (b.value / b.limit > a.value / a.limit ? b : a));
			out.push([
				'meets',
				`Harmonic voltages, ${orders}`,
				ch ?? 'all',
				"95 % of 10-minute values ≤ each order's limit",
				`closest to its limit: h${closest.id.slice(9)} ${closest.value.toFixed(2)} % of ${closest.limit} %`,
				table,
			]);
		}
	}
	return out;
}

/** The readable survey: coverage, one line per rule, the event tables, notes. */
export function surveyTable(r: SurveyResult, spanStartS: number, clockAligned: boolean, diagnostics: string[]): string {
	const c = r.coverage;
	const head = [
		`Voltage-characteristics survey: ${r.standardName}`,
		`Recording: ${clock(spanStartS, clockAligned)} for ${span(c.spanS)}; complete 10-minute intervals ${c.completeIntervals} of ${c.intervals} (${span(c.measuredS)} measured), ${c.flaggedIntervals} flagged by events and left out`,
		...(c.gaps.length
			? [
					`Gaps with no data: ${c.gaps.map((g) => `${clock(g.startS, clockAligned)} for ${span(g.endS - g.startS)}`).join('; ')}`,
				]
			: []),
		r.weekNote,
		'',
	];
	const lines = pad([['verdict', 'quantity', 'channel', 'rule', 'measured', 'source'], ...tableRows(r.lines)]);
	const verdict =
		r.meets === null
			? 'Nothing measured that the standard judges.'
			: r.meets
				? 'Every measured characteristic meets its rule.'
				: `${r.lines.filter((l) => l.verdict === 'does not meet').length} characteristic(s) do not meet their rule.`;
	return [
		...head,
		...lines,
		'',
		...eventTable(r.dips, 'dips (residual voltage)'),
		'',
		...eventTable(r.swells, 'swells (maximum voltage)'),
		'',
		`interruptions: ${r.interruptions.short} short (up to 3 min), ${r.interruptions.long} long; source: ${r.interruptions.source}`,
		'',
		verdict,
		...r.notes.map((n) => `note: ${n}`),
		...diagnostics.map((d) => `note: ${d}`),
		'',
	].join('\n');
}

/** JSON-safe copy: NaN and infinities as null. */
export function surveyJson(r: SurveyResult, extra: Record<string, unknown>): string {
	return JSON.stringify({ ...extra, ...r }, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 1);
}

/**
 * The survey as CSV for a spreadsheet: one row per rule line (every harmonic order, unlike the table),
 * then the dip and swell tables as rows of counts. Cells go through the shared formula guard.
 * Columns: section, id, quantity, channel, rule, measured, value, limit, unit, verdict, used,
 * excluded_flagged, excluded_partial, source.
 */
export function surveyCsv(r: SurveyResult): string {
	const num = (x: number) => (Number.isFinite(x) ? String(Number(x.toPrecision(6))) : '');
	const row = (cells: string[]) => `${cells.map((c) => csvCell(c)).join(',')}\n`;
	let out = row([
		'section',
		'id',
		'quantity',
		'channel',
		'rule',
		'measured',
		'value',
		'limit',
		'unit',
		'verdict',
		'used',
		'excluded_flagged',
		'excluded_partial',
		'source',
	]);
	for (const l of r.lines) {
		out += row([
			'rule',
			l.id,
			l.quantity,
			l.channel ?? 'all',
			l.rule,
			l.measured,
			num(l.value),
			num(l.limit),
			l.unit,
			l.verdict,
			String(l.used),
			String(l.excludedFlagged),
			String(l.excludedPartial),
			l.source,
		]);
	}
	for (const t of [r.dips, r.swells]) {
		t.rows.forEach((band, i) =>
			t.columns.forEach(
				(dur, j) =>
					(out += row([
						`${t.kind} table`,
						`${t.kind}-${i + 1}-${j + 1}`,
						band,
						'all',
						dur,
						`${t.counts[i][j]} event(s)`,
						String(t.counts[i][j]),
						'',
						'',
						'',
						'',
						'',
						'',
						t.source,
					])),
			),
		);
	}
	for (const [kind, span] of [
		['short', 'up to 3 min'],
		['long', 'over 3 min'],
	] as const) {
		const count = r.interruptions[kind];
		out += row([
			'interruptions',
			kind,
			span,
			'all',
			'',
			`${count} event(s)`,
			String(count),
			'',
			'',
			'',
			'',
			'',
			'',
			r.interruptions.source,
		]);
	}
	return out;
}
