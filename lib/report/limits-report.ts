/**
 * Limit evaluation of a report's channels against one table (lib/limits), as report rows: per channel,
 * per order and for the total (THD, or TDD for IEEE 519 currents), measured %, limit %, margin, pass.
 */
import { evaluateLimits, LIMIT_TABLES } from '../limits/evaluate.js';
import { evaluateFlickerLimits, type FlickerLimitTableId, type FlickerMeasured } from '../limits/flicker.js';
import type { LimitEvaluation } from '../limits/types.js';
import { reportFindings } from './findings.js';
import { limitBasis, SHORT_RECORD_BASIS } from './limits-basis.js';
import type { ReportFlicker, ReportFlickerChannel } from './flicker-report.js';
import type {
	AnalysisOptions,
	AnalysisReport,
	ReportChannel,
	ReportLimitRow,
	ReportLimits,
	ReportLimitTableId,
} from './types.js';
import { maxOf } from '../signal/extremes.js';

function rowsOf(channel: string, e: LimitEvaluation): { rows: ReportLimitRow[]; unmeasured: string[] } {
	const rows: ReportLimitRow[] = [];
	const unmeasured: string[] = [];
	for (const c of [...e.checks, e.total]) {
		if (c.pass === null) {
			unmeasured.push(c.label);
			continue;
		}
		rows.push({
			channel,
			order: c.order ?? 0,
			figure: c.order === null ? c.label.toLowerCase() : 'harmonic',
			value: c.measuredPercent,
			limit: c.limitPercent,
			margin: c.marginPercent,
			pass: c.pass,
			// standard and table only: how a value was obtained (provenance) stays in lib/limits and its docs
			source: c.source,
		});
	}
	return { rows, unmeasured };
}

/** RMS per order on the chosen basis: harmonic subgroups (default) or the single DFT bins. */
function rmsByOrder(c: ReportChannel, singleBins: boolean): number[] {
	return !singleBins && c.groups ? c.groups.harmonicSubgroupRms : c.harmonics.map((h) => h.rms);
}

function percents(c: ReportChannel, singleBins: boolean): number[] {
	const rms = rmsByOrder(c, singleBins);
	return rms.map((x) => (rms[1] > 0 ? (100 * x) / rms[1] : NaN));
}

/** With no voltage channel, the IEEE 519 row is that of a 400 V low-voltage bus (IEC 60038 nominal, common practice). */
const ASSUMED_LOW_VOLTAGE_BUS_V = 400;

/** IEEE 519 Table 1's bus voltage: the nominal given, else √3 × the highest voltage RMS measured (said in the notes). */
function ieee519BusVoltage(
	id: string,
	measured: ReportChannel[],
	options: AnalysisOptions,
	notes: string[],
): number | undefined {
	let busVoltageV = options.nominalV;
	if (id === 'ieee519' && busVoltageV === undefined) {
		const vmax = Math.max(
			0,
			maxOf(
				measured
					.filter((c) => c.quantity === 'voltage')
					.map((c) => c.rms)
					.filter(Number.isFinite),
			),
		);
		busVoltageV = vmax > 0 ? Math.round(Math.sqrt(3) * vmax) : ASSUMED_LOW_VOLTAGE_BUS_V;
		notes.push(
			`Bus voltage for the IEEE 519 row taken as ${busVoltageV} V (${vmax > 0 ? '√3 × the highest measured voltage' : 'no voltage channel: a low-voltage bus assumed'}); set the nominal voltage to choose the row.`,
		);
	}
	return busVoltageV;
}

/** A current channel against IEEE 519 Tables 2–4: needs I_SC/I_L; I_L is the fundamental when not given (said). */
function ieee519CurrentEvaluation(
	c: ReportChannel,
	options: AnalysisOptions,
	singleBins: boolean,
	busVoltageV: number | undefined,
	notes: string[],
): LimitEvaluation | undefined {
	if (options.iscIl === undefined) {
		notes.push(
			`${c.name}: IEEE 519 current limits need the ratio of short-circuit current to maximum demand current (I_SC/I_L) at the point of common coupling; not evaluated.`,
		);
		return undefined;
	}
	const rms = rmsByOrder(c, singleBins);
	const i1 = rms[1];
	const ilA = options.ilA ?? i1;
	if (options.ilA === undefined)
		notes.push(
			`${c.name}: I_L taken as the measured fundamental ${i1.toPrecision(4)} A (give the maximum demand current to use it instead); TDD then equals THD.`,
		);
	const percentOfIl = rms.map((x) => (100 * x) / ilA);
	return evaluateLimits('ieee519', {
		quantity: 'current',
		percentOfIl,
		busVoltageV,
		iscIlRatio: options.iscIl,
		edition: options.ieee519Edition ?? '2022',
	});
}

/**
 * Evaluates every voltage channel (and, for IEEE 519, every current channel) of a report.
 *
 * EN 50160 and IEC 61000-2-2 are voltage tables: current channels are listed in `notes`, not judged.
 * IEEE 519 voltages use Table 1 by bus voltage (options.nominalV; when absent, √3 × the highest measured
 * voltage RMS, said in the notes); currents use Tables 2–4 by options.iscIl (required for them), in % of
 * I_L = options.ilA, or of the measured fundamental when I_L is not given (said in the notes: TDD then
 * equals THD, the worst case for a load running at its maximum demand).
 * Values per order on the basis the table's standard uses (limits-basis.ts), single DFT bins on request.
 * Ref: lib/limits tables (each row carries its source).
 */
export function limitsReport(report: AnalysisReport, options: AnalysisOptions): ReportLimits {
	const id = options.limits!;
	const table = LIMIT_TABLES[id];
	const basis = report.shortRecord ? SHORT_RECORD_BASIS : limitBasis(id, options.harmonicBasis ?? 'standard');
	const singleBins = basis.kind === 'single-bins';
	const notes: string[] = [];
	const rows: ReportLimitRow[] = [];
	const measured = report.channels.filter((c) => c.harmonics.length > 1);
	for (const c of report.channels)
		if (c.harmonics.length <= 1) notes.push(`${c.name}: no harmonics (no fundamental found); not evaluated.`);
	const busVoltageV = ieee519BusVoltage(id, measured, options, notes);
	let firstEvaluation: LimitEvaluation | undefined;
	const add = (name: string, e: LimitEvaluation) => {
		firstEvaluation ??= e;
		const r = rowsOf(name, e);
		rows.push(...r.rows);
		if (r.unmeasured.length > 0)
			notes.push(`${name}: ${r.unmeasured.join(', ')} not measured (above the Nyquist order or not analysed).`);
		if (e.selection !== 'all orders of the table') notes.push(`${name}: ${e.selection}.`);
	};
	for (const c of measured) {
		if (c.quantity === 'voltage') {
			const pct = percents(c, singleBins);
			add(
				c.name,
				evaluateLimits(
					id,
					id === 'ieee519'
						? { quantity: 'voltage', percentOfFundamental: pct, busVoltageV }
						: { percentOfFundamental: pct },
				),
			);
		} else if (c.quantity === 'current' && id === 'ieee519') {
			const e = ieee519CurrentEvaluation(c, options, singleBins, busVoltageV, notes);
			if (e) add(c.name, e);
		} else {
			notes.push(`${c.name}: ${table.name} sets no limits for a ${c.quantity} channel; not evaluated.`);
		}
	}
	if (rows.length === 0) notes.push('Nothing was evaluated against the table.');
	if (firstEvaluation) notes.push(...firstEvaluation.notes, firstEvaluation.complianceNote);
	return {
		table: id,
		title: `${table.name} (${table.source})`,
		basis,
		pass: rows.every((r) => r.pass),
		rows,
		notes: [...new Set(notes)],
	};
}

/** The analysis options only the limit step reads: changing them needs no new analysis (nominalV also sets flicker's Un: not here). */
export const LIMIT_STEP_OPTIONS = ['limits', 'iscIl', 'ieee519Edition'] as const;

/**
 * Flicker figures of one channel as the flicker tables take them: every Pst and Plt; dc, dmax and Tmax
 * per change when the report lists every change, else their highest values (the tables judge those
 * figures by their highest value, so the verdict is the same).
 */
function flickerMeasured(c: ReportFlickerChannel): FlickerMeasured {
	const all = c.changes.list.length === c.changes.count;
	return {
		pst: c.pst.map((p) => p.pst),
		plt: c.plt.map((p) => p.plt),
		dcPercent: all ? c.changes.list.map((v) => v.dcPercent) : [c.changes.dcMaxPercent],
		dmaxPercent: all ? c.changes.list.map((v) => v.dmaxPercent) : [c.changes.dmaxPercent],
		tmaxS: all ? c.changes.list.map((v) => v.tmaxS) : [c.changes.tmaxS],
	};
}

/** The flicker part of the limit step: a supply table (EN 50160, IEC 61000-2-2) with IEC 61000-3-3 beside it. */
function flickerWithLimits(f: ReportFlicker, id: ReportLimitTableId | undefined): ReportFlicker {
	const tables: FlickerLimitTableId[] = id === 'en50160' || id === 'iec61000-2-2' ? [id, 'iec61000-3-3'] : [];
	return {
		...f,
		channels: f.channels.map((c) => ({
			...c,
			limits: tables.map((t) => evaluateFlickerLimits(t, flickerMeasured(c))),
		})),
	};
}

/**
 * The limit step after the analysis: a pure function of the report and the limit options, so a front end
 * can switch tables on a report it already has (analyseCapture ends with it; the CLI and the UI call the same).
 * Returns a new report with `limits` for `options.limits`, or without `limits` when no table is chosen.
 * @example applyLimits(report, { limits: 'en50160' }).limits?.pass // true when every row is within its limit
 */
export function applyLimits(report: AnalysisReport, options: AnalysisOptions): AnalysisReport {
	const { limits: _previous, ...rest } = report;
	if (rest.flicker) rest.flicker = flickerWithLimits(rest.flicker, options.limits);
	const out: AnalysisReport = options.limits ? { ...rest, limits: limitsReport(report, options) } : rest;
	out.findings = reportFindings(out);
	return out;
}
