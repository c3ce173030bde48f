/**
 * Table lines for a short record's fit (every fitted figure with its one-standard-deviation uncertainty)
 * and for each channel's resolution.
 */
import type { ReportJson } from '../../lib/report/to-json.js';
import { cyclesText } from '../../lib/signal/index.js';

type Num = number | null | undefined;

/** x ± u, both to the decimals the uncertainty supports (two significant digits of u). */
export function withUncertainty(x: Num, u: Num, unit = ''): string {
	if (x === null || x === undefined) return 'n/a';
	const tail = unit ? ` ${unit}` : '';
	if (u === null || u === undefined || !(u > 0)) return `${Number(x.toPrecision(5))}${tail}`;
	const decimals = Math.max(0, Math.min(9, 1 - Math.floor(Math.log10(u))));
	return `${x.toFixed(decimals)} ± ${u.toFixed(decimals)}${tail}`;
}

/** Lines of the 'from a fit of a short record' block; none when the report has no fit. */
export function fitLines(r: ReportJson): string[] {
	const s = r.shortRecord;
	if (!s) return [];
	const out = ['', `  ${s.note} (± one standard deviation from the fit's residual):`];
	out.push(
		`    frequency ${withUncertainty(s.frequencyHz, s.frequencyUncertaintyHz, 'Hz')}; the record holds ${cyclesText(String(Number((s.cyclesHeld ?? 0).toFixed(3))))}; harmonics fitted to order ${s.highestOrder}`,
	);
	for (const c of r.channels) {
		if (!c.fit) continue;
		out.push(
			`    ${c.name}: fundamental ${withUncertainty(c.fit.fundamentalRms, c.fit.fundamentalRmsUncertainty, c.unit)} RMS, THD ${withUncertainty(c.thdPercent, c.fit.thdUncertaintyPercent, '%')}`,
		);
	}
	for (const p of r.pairs) {
		if (!p.fit || p.lagDeg === null || p.lagS === null) continue;
		out.push(
			`    ${p.other} ${p.lagDeg >= 0 ? 'lags' : 'leads'} ${p.ref} by ${withUncertainty(Math.abs(p.lagDeg), p.fit.lagDegUncertainty, 'deg')} (${withUncertainty(Math.abs(p.lagS) * 1000, (p.fit.lagSUncertainty ?? NaN) * 1000, 'ms')})`,
		);
	}
	for (const t of r.threePhaseSets) {
		if (!t.fit) continue;
		const sd = t.fit.sequenceUncertainty;
		const unit = t.quantity === 'voltage' ? 'V' : 'A';
		out.push(
			`    ${t.channels.join(', ')}: positive ${withUncertainty(t.sequence.positive, sd, unit)}, negative ${withUncertainty(t.sequence.negative, sd, unit)}, zero ${withUncertainty(t.sequence.zero, sd, unit)}; unbalance ${withUncertainty(t.unbalancePercent, t.fit.unbalanceUncertaintyPercent, '%')}; rotation ${t.rotation ?? 'not clear'}`,
		);
	}
	for (const p of r.power) {
		if (!p.fit) continue;
		out.push(
			`    ${p.voltage} x ${p.current}: P1 ${withUncertainty(p.ieee1459.fundamentalActivePowerW, p.fit.fundamentalActiveWUncertainty, 'W')}, Q1 ${withUncertainty(p.reactiveVar, p.fit.reactiveVarUncertainty, 'var')}, DPF ${withUncertainty(p.displacementPowerFactor, p.fit.displacementPowerFactorUncertainty)}`,
		);
	}
	return out;
}

/** One line per channel that shows a code step: the step, codes used and the floor under which harmonics read 'below resolution'. */
export function resolutionLines(r: ReportJson): string[] {
	const rows = r.channels.filter((c) => c.resolution);
	if (rows.length === 0) return [];
	const out = ['', '  resolution (spacing of the values in the file):'];
	for (const c of rows) {
		const x = c.resolution!;
		const below = c.harmonics.filter((h) => h.belowResolution).length;
		out.push(
			`    ${c.name}: step ${Number((x.codeStep ?? 0).toPrecision(3))} ${c.unit}, ${x.codesUsed} codes used (${Number((x.bitsUsed ?? 0).toFixed(1))} bits); ` +
				`harmonics under ${Number((x.harmonicFloorRms ?? 0).toPrecision(2))} ${c.unit} RMS are below resolution${below > 0 ? ` (${below} order(s) here)` : ''}`,
		);
	}
	return out;
}
