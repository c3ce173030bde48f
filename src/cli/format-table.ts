/**
 * The readable report of one file for a terminal: figures as rows, channels as columns, then the
 * relations between channels, power, three-phase, limits and every assumption made.
 */
import { fitLines, resolutionLines } from './format-fit.js';
import { eventLine } from '../../lib/report/index.js';
import { intervalsDiffer } from '../../lib/report/index.js';
import type { ReportJson } from '../../lib/report/to-json.js';
import { flickerLines } from './flicker-lines.js';

type Channel = ReportJson['channels'][number];

/** A number with about `digits` significant figures, no exponent for everyday magnitudes; 'n/a' for null. */
export function formatNumber(x: number | null | undefined, digits = 5): string {
	if (x === null || x === undefined || !Number.isFinite(x)) return 'n/a';
	if (x === 0) return '0';
	const ax = Math.abs(x);
	if (ax >= 1e7 || ax < 1e-4) return x.toExponential(digits - 1);
	const decimals = Math.max(0, Math.min(6, digits - 1 - Math.floor(Math.log10(ax))));
	return x.toFixed(decimals);
}

function fixed(x: number | null | undefined, decimals: number): string {
	return x === null || x === undefined || !Number.isFinite(x) ? 'n/a' : x.toFixed(decimals);
}

function table(rows: string[][], indent = '  '): string[] {
	const widths: number[] = [];
	for (const r of rows) r.forEach((c, i) => (widths[i] = Math.max(widths[i] ?? 0, c.length)));
	return rows.map(
		(r) =>
			indent +
			r
				.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i])))
				.join('  ')
				.trimEnd(),
	);
}

/** Levels of a channel with as many decimals as 5 significant figures of its RMS need (so -1e-14 V reads 0.00). */
function level(c: Channel, x: number | null): string {
	if (x === null || !Number.isFinite(x)) return 'n/a';
	const scale = c.rms !== null && c.rms > 0 ? c.rms : Math.abs(x);
	if (!(scale > 0)) return '0';
	const decimals = Math.max(0, Math.min(9, 4 - Math.floor(Math.log10(scale))));
	const text = x.toFixed(decimals);
	return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
}

const FIGURES: [string, (c: Channel) => string][] = [
	['true RMS (AC+DC)', (c) => level(c, c.rms)],
	['AC RMS', (c) => level(c, c.acRms)],
	['mean (DC)', (c) => level(c, c.mean)],
	['rectified mean', (c) => level(c, c.rectifiedMean)],
	['peak +', (c) => level(c, c.peak)],
	['peak -', (c) => level(c, c.peakNegative)],
	['peak-to-peak', (c) => level(c, c.peakToPeak)],
	['crest factor (AC part)', (c) => fixed(c.crestFactor, 3)],
	['form factor (AC part)', (c) => fixed(c.formFactor, 4)],
	['frequency Hz', (c) => fixed(c.frequencyHz, 3)],
	['fundamental RMS', (c) => level(c, c.harmonics[1]?.rms ?? null)],
	['THD % of fund.', (c) => fixed(c.thdPercent, 2)],
	['K-factor', (c) => fixed(c.kFactor, 2)],
	['avg-responding (AC-coupled) reads', (c) => level(c, c.averageResponding.reading)],
	['  against AC RMS, error %', (c) => fixed(c.averageResponding.errorPercent, 1)],
];

/** Rows shown only when they say something: the DC-coupled meter where DC moves it, per-interval figures of a long record. */
const EXTRA_FIGURES: [string, (c: Channel) => string, (r: ReportJson) => boolean][] = [
	[
		'  DC-coupled, with DC, error %',
		(c) => fixed(c.averageResponding.dcCoupled?.errorPercent, 1),
		(r) => r.channels.some((c) => c.averageResponding.dcMatters),
	],
	['meter error %, typical interval', (c) => fixed(c.intervals?.meterErrorPercent.typical, 1), long],
	['meter error %, worst interval', (c) => fixed(c.intervals?.meterErrorPercent.worst, 1), long],
	['crest factor, typical interval', (c) => fixed(c.intervals?.crestFactor.typical, 3), long],
	['crest factor, worst interval', (c) => fixed(c.intervals?.crestFactor.worst, 3), long],
];

function long(r: ReportJson): boolean {
	return r.channels.some((c) => intervalsDiffer(c as Parameters<typeof intervalsDiffer>[0]));
}

const MARK = { ok: 'ok  ', attention: '!!  ', fail: 'FAIL', info: 'i   ' } as const;

function topHarmonics(c: Channel, count: number): string {
	const hs = c.harmonics
		.filter(
			(h) =>
				(h.order ?? 0) >= 2 && !h.belowResolution && h.percentOfFundamental !== null && h.percentOfFundamental >= 0.5,
		)
		.sort((a, b) => (b.percentOfFundamental ?? 0) - (a.percentOfFundamental ?? 0))
		.slice(0, count);
	return hs.length ? hs.map((h) => `h${h.order ?? 0} ${fixed(h.percentOfFundamental, 1)}%`).join(', ') : 'none >= 0.5%';
}

type LimitRow = NonNullable<ReportJson['limits']>['rows'][number];

/** A margin that reads as zero at `decimals` (including "-0.00"). */
function roundsToZero(x: number, decimals: number): boolean {
	return /^-?0(\.0*)?$/.test(x.toFixed(decimals));
}

/**
 * One limit row: `U1 h5: 6.03 % over limit 6.00 % (margin -0.03) [source]`. Value, limit and margin share
 * one number of decimals, 2 or as many more (up to 6) as the margin needs to show a non-zero digit, so a
 * row never reads "8.00 % over limit 8.00 % (margin -0.00)"; a margin still 0 at 6 decimals reads
 * "at the limit". Never prints -0.
 */
export function limitRowText(x: LimitRow): string {
	const what = x.figure === 'harmonic' ? `h${x.order}` : x.figure.toUpperCase();
	const source = x.source ? ` [${x.source}]` : '';
	const margin = x.margin;
	if (typeof margin !== 'number' || !Number.isFinite(margin)) {
		return `${x.channel} ${what}: ${fixed(x.value, 2)} % against limit ${fixed(x.limit, 2)} % (margin n/a)${source}`;
	}
	let decimals = 2;
	while (decimals < 6 && roundsToZero(margin, decimals)) decimals++;
	if (roundsToZero(margin, decimals))
		return `${x.channel} ${what}: ${fixed(x.value, 2)} % at the limit of ${fixed(x.limit, 2)} %${source}`;
	const relation = margin < 0 ? 'over limit' : 'within limit';
	return `${x.channel} ${what}: ${fixed(x.value, decimals)} % ${relation} ${fixed(x.limit, decimals)} % (margin ${margin.toFixed(decimals)})${source}`;
}

/** Voltage events: each once, then the residual-voltage × duration counts (only cells with events). */
function eventBlock(r: ReportJson): string[] {
	const ev = r.events;
	if (!ev) return [];
	const t = ev.thresholdsPercent;
	const out = [
		'',
		`  voltage events (declared ${ev.declaredV === null ? 'n/a' : +ev.declaredV.toPrecision(4)} V, ${ev.declaredVSource}; dip < ${t.dip} %, swell > ${t.swell} %, interruption < ${t.interruption} %): ${ev.events.length === 0 ? 'none' : ev.events.length}`,
	];
	for (const e of ev.events) out.push(`    ${eventLine(e as Parameters<typeof eventLine>[0])}`);
	for (const tab of [ev.dipTable, ev.swellTable]) {
		const cells = tab.rows
			.flatMap((row, i) => tab.columns.map((col, j) => ({ row, col, n: tab.counts[i][j] })))
			.filter((c) => (c.n ?? 0) > 0);
		const outside = tab.outside ?? 0;
		if (cells.length > 0 || outside > 0)
			out.push(
				`    ${tab.source}: ${[...cells.map((c) => `${c.row} %, ${c.col}: ${c.n}`), ...(outside > 0 ? [`outside the table: ${outside}`] : [])].join('; ')}`,
			);
	}
	return out;
}

/** The text block for one report (lines without a trailing newline). */
export function formatReport(r: ReportJson): string[] {
	const out: string[] = [];
	out.push(r.file);
	const ref = r.referenceChannel ?? 'n/a';
	// a short record: every fitted figure below says so; its uncertainties are in the block 'from a fit of a short record'
	const fitted = r.shortRecord ? ` (${r.shortRecord.note}; ± in the block below)` : '';
	out.push(
		`  ${fixed(r.frequencyHz, 3)} Hz${r.shortRecord ? ' (fitted)' : ''} on ${ref}; ${r.cyclesAnalysed} whole cycle${r.cyclesAnalysed === 1 ? '' : 's'} analysed ` +
			`(${fixed(r.window.startS, 4)}-${fixed(r.window.endS, 4)} s of ${formatNumber(r.durationS)} s) at ${formatNumber(r.sampleRateHz)} samples/s`,
	);
	if ((r.findings ?? []).length > 0) {
		out.push('', '  findings:');
		for (const f of r.findings) {
			out.push(`    ${MARK[f.level]} ${f.text}`);
			if (f.figure) out.push(`          ${f.figure}`);
		}
	}
	if (r.channels.length > 0) {
		const head = ['', ...r.channels.map((c) => `${c.name}${c.unit ? ` (${c.unit})` : ''}`)];
		const extra = EXTRA_FIGURES.filter(([, , show]) => show(r)).map(([label, f]) => [label, ...r.channels.map(f)]);
		const rows = [head, ...FIGURES.map(([label, f]) => [label, ...r.channels.map(f)]), ...extra];
		const iv = long(r) ? r.channels.find((c) => (c.intervals?.count ?? 0) >= 2)?.intervals : undefined;
		out.push(
			'',
			`  figures over the whole analysed span${iv ? ` (whole record; per-interval rows: ${iv.count} intervals of ${iv.intervalCycles} cycles)` : ''}:`,
			...table(rows),
		);
		if (r.shortRecord)
			out.push(`  frequency, fundamental RMS, THD and K-factor above are ${r.shortRecord.note} (± in the block below)`);
		out.push('', `  largest harmonics${fitted}:`);
		for (const c of r.channels) out.push(`    ${c.name}: ${topHarmonics(c, 5)}`);
		// Only channels whose cycles differ by more than 2 %: on a steady wave the "worst" cycle is rounding.
		const worst = r.channels.filter((c) => {
			const w = c.worstCycle;
			return (
				w &&
				w.rmsCycle !== null &&
				w.rmsCycle >= 0 &&
				w.rms !== null &&
				w.lowestRms !== null &&
				w.rms > 1.02 * w.lowestRms
			);
		});
		if (worst.length > 0) {
			out.push('', '  worst cycle (one-cycle RMS):');
			for (const c of worst) {
				const w = c.worstCycle!;
				out.push(
					`    ${c.name}: highest ${level(c, w.rms)} ${c.unit} at ${fixed(w.rmsStartS, 4)} s, lowest ${level(c, w.lowestRms)} ${c.unit}; largest peak ${level(c, w.peak)} ${c.unit} at ${fixed(w.peakStartS, 4)} s`,
				);
			}
		}
		// the explanation beside each meter finding that advises a true-RMS meter
		const advised = new Set(
			(r.findings ?? []).filter((f) => f.topic === 'meter' && f.level === 'attention').map((f) => f.channel),
		);
		const meters = r.channels.filter((c) => advised.has(c.name) && c.averageResponding.explanation);
		if (meters.length > 0) {
			out.push('', '  average-responding meters:');
			for (const c of meters) {
				out.push(`    ${c.name}: ${c.averageResponding.explanation!.summary}`);
				for (const why of c.averageResponding.explanation!.reasons) out.push(`      ${why}`);
			}
		}
	}
	if (r.pairs.length > 0) {
		out.push('', `  phase against the reference${fitted}:`);
		for (const p of r.pairs) {
			if (p.lagDeg === null) {
				out.push(`    ${p.other} vs ${p.ref}: no common fundamental`);
				continue;
			}
			const verb = p.lagDeg >= 0 ? 'lags' : 'leads';
			const ms = p.lagS === null ? 'n/a' : `${fixed(Math.abs(p.lagS) * 1000, 3)} ms`;
			out.push(`    ${p.other} ${verb} ${p.ref} by ${fixed(Math.abs(p.lagDeg), 1)} deg (${ms})`);
		}
	}
	if (r.power.length > 0) {
		out.push('', `  power (IEEE 1459)${fitted}:`);
		const rows = [['pair', 'P W', 'S VA', 'Q1 var', 'PF', 'DPF']];
		for (const p of r.power) {
			rows.push([
				`${p.voltage} x ${p.current}`,
				formatNumber(p.activeW),
				formatNumber(p.apparentVA),
				formatNumber(p.reactiveVar),
				fixed(p.powerFactor, 3),
				fixed(p.displacementPowerFactor, 3),
			]);
		}
		out.push(...table(rows, '    '));
		for (const p of r.power) out.push(`    ${p.current} on ${p.voltage}: ${p.loadSentence}`);
	}
	out.push(...fitLines(r), ...resolutionLines(r));
	if (r.threePhasePower) {
		const f = r.threePhasePower.figures;
		out.push(
			'',
			`  three-phase power (IEEE 1459, ${r.threePhasePower.wiring}${r.threePhasePower.note ? `, ${r.threePhasePower.note}` : ''}): P ${formatNumber(f.activePowerW)} W, S_e ${formatNumber(f.effectiveApparentPowerVA)} VA, ` +
				`PF_e ${fixed(f.effectivePowerFactor, 3)}; positive sequence P1+ ${formatNumber(f.positiveSequenceActivePowerW)} W, Q1+ ${formatNumber(f.positiveSequenceReactivePowerVar)} var, PF1+ ${fixed(f.positiveSequencePowerFactor, 3)}`,
		);
	}
	if (r.neutral) out.push('', `  neutral${r.shortRecord ? ` (${r.shortRecord.note})` : ''}: ${r.neutral.sentence}`);
	for (const t of r.threePhaseSets) {
		const kind = t.connection === 'line-to-line' ? 'line-to-line voltages' : `${t.quantity}s`;
		out.push(
			'',
			`  three-phase ${kind} ${t.channels.join(', ')}${t.fit ? ` (${t.fit.note}; ± in the block above)` : ''}: ${t.rotationSentence ?? `${t.rotation ?? 'unknown'} rotation`}`,
		);
		out.push(
			t.quantity === 'voltage'
				? `    unbalance: VUF (IEC, |V2|/|V1|) ${fixed(t.unbalancePercent, 2)} %; LVUR (NEMA, line voltages) ${fixed(t.lvurPercent, 2)} %; PVUR (IEEE, phase voltages) ${fixed(t.pvurPercent, 2)} %`
				: `    unbalance: |I2|/|I1| ${fixed(t.unbalancePercent, 2)} %; max deviation from the mean current ${fixed(t.pvurPercent, 2)} %`,
		);
		const seq = (x: number | null) =>
			x !== null && t.sequence.positive !== null && Math.abs(x) < 1e-9 * Math.abs(t.sequence.positive)
				? '0'
				: formatNumber(x);
		out.push(
			`    sequence components (RMS): zero ${seq(t.sequence.zero)}, positive ${seq(t.sequence.positive)}, negative ${seq(t.sequence.negative)}`,
		);
	}
	for (const d of r.digital ?? []) {
		const when =
			d.firstActiveS === null
				? 'never active'
				: `active from ${fixed(d.firstActiveS, 4)} s for ${fixed(d.activeS, 4)} s`;
		out.push('', `  status ${d.name}: ${when}; ${d.changes} change(s)`);
	}
	out.push(...flickerLines(r));
	out.push(...eventBlock(r));
	if (r.limits) {
		const failed = r.limits.rows.filter((x) => !x.pass);
		out.push(
			'',
			`  limits ${r.limits.table} (${r.limits.title}): ${r.limits.pass ? 'PASS' : `FAIL (${failed.length} over)`}`,
			`    judged on ${r.limits.basis.text}`,
		);
		for (const x of failed) out.push(`    ${limitRowText(x)}`);
		for (const n of r.limits.notes) out.push(`    note: ${n}`);
	}
	const warnings = [...r.warnings, ...r.channels.flatMap((c) => c.warnings.map((w) => `${c.name}: ${w}`))];
	if (warnings.length > 0) {
		out.push('', '  warnings:');
		for (const w of warnings) out.push(`    ${w}`);
	}
	if (r.assumptions.length > 0) {
		out.push('', '  assumptions and what the importer detected:');
		for (const a of r.assumptions) out.push(`    ${a}`);
	}
	return out;
}
