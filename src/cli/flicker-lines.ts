/**
 * The flicker lines of the `analyse` table: per voltage channel, Pst and Plt (or the Pinst statistics of
 * a short record, said to be no Pst), the IEC 61000-3-3 voltage changes and the flicker limits.
 */
import type { ReportJson } from '../../lib/report/index.js';
import { maxOf } from '../../lib/signal/index.js';

function num(x: number | null | undefined, decimals: number): string {
	return x === null || x === undefined || !Number.isFinite(x) ? '-' : x.toFixed(decimals);
}

export function flickerLines(r: ReportJson): string[] {
	const f = r.flicker;
	if (!f || (f.channels.length === 0 && f.notes.length === 0)) return [];
	const nothing = f.channels.every((c) => c.pinst.max === null && (c.changes.count ?? 0) === 0);
	if (nothing)
		return ['', `  flicker: ${(f.notes[0] ?? 'not measured.').replace(/^Flicker not measured: /, 'not measured: ')}`];
	const out = ['', '  flicker (IEC 61000-4-15 flickermeter):'];
	for (const c of f.channels) {
		const lamp = `${c.lamp} lamp`;
		if (c.hasPst) {
			const pst = c.pst.map((p) => p.pst ?? NaN);
			const worst = maxOf(pst.filter(Number.isFinite));
			const plt = c.plt.length > 0 ? `; Plt ${c.plt.map((p) => num(p.plt, 2)).join(', ')}` : '; no Plt (needs 2 hours)';
			out.push(
				`    ${c.channel} (${lamp}): Pst ${pst.length === 1 ? num(pst[0], 2) : `highest ${num(worst, 2)} of ${pst.length}`}${plt}`,
			);
		} else if (c.pinst.max === null) {
			out.push(
				`    ${c.channel} (${lamp}): record too short for a flicker reading (the first 5 s settle the flickermeter)`,
			);
		} else {
			out.push(
				`    ${c.channel} (${lamp}): no Pst (record under 10 minutes); instantaneous flicker Pinst highest ${num(c.pinst.max, 2)}, exceeded 1 % of the time ${num(c.pinst.p1, 2)}, median ${num(c.pinst.p50, 3)}`,
			);
		}
		const ch = c.changes;
		if ((ch.count ?? 0) > 0) {
			out.push(
				`      voltage changes (IEC 61000-3-3, % of ${num(c.nominalV, 0)} V): ${ch.count}; largest dc ${num(ch.dcMaxPercent, 2)} %, dmax ${num(ch.dmaxPercent, 2)} %, longest time beyond 3.3 % ${num(ch.tmaxS, 2)} s`,
			);
		}
		for (const e of c.limits ?? []) {
			const bad = e.checks.filter((k) => k.pass === false);
			const verdict =
				e.pass === null
					? 'not enough data'
					: e.pass
						? 'within'
						: `over: ${bad.map((k) => `${k.figure} ${num(k.measured, 2)} > ${num(k.limit, 2)}`).join(', ')}`;
			out.push(`      ${e.tableName}: ${verdict}`);
		}
	}
	for (const n of f.notes) out.push(`    note: ${n}`);
	return out;
}
