/**
 * The one analysis entry point of Sinecheck: a Capture in, an AnalysisReport out. The CLI and the UI both
 * call it, so every figure a user sees comes from this code.
 */
import { basicWindowCycles, MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import { durationS, type Capture, type Diagnostic } from '../capture.js';
import { findWholeCycles, type CycleWindow } from '../signal/cycles.js';
import { cyclesText } from '../signal/format.js';
import { waveformFigures } from '../signal/levels.js';
import { tddPercent, ulKFactor } from '../spectrum/distortion.js';
import { thdFPercent, thdRPercent } from '../spectrum/thd.js';
import { captureEvents, eventsReadEverySample } from './events.js';
import type { CaptureTrend, TrendViewRequest } from './trend-view.js';
import { digitalSummary, neutralCurrent, threePhasePower, worstCycle, type DerivedScratch } from './extras.js';
import { channelIntervals, flaggedSlots, powerFactorIntervals } from './intervals.js';
import { applyLimits } from './limits-report.js';
import { measureFlicker } from './flicker-report.js';
import { flickerShareable, withRunsFlicker } from './trend-flicker.js';
import { checkSiteInputs, nextStepsSection } from '../next-steps/report-section.js';
import { loadWords } from './load-words.js';
import { meterExplanation } from './meter-explanation.js';
import { meterModel, shapeFigures } from './meter.js';
import { VERDICT_THRESHOLDS } from './thresholds.js';
import { chooseReference } from './reference.js';
import { channelResolution } from '../signal/code-step.js';
import { fittedPairs, fittedPower, fitShortRecord, FITTED_NOTE, type ShortRecordResult } from './short-record.js';
import { fittedChannel, fittedPeriods, markBelowResolution } from './short-record-channel.js';
import { fittedThreePhase } from './short-record-three-phase.js';
import { alignedFundamentals, pairChannels, pairPower, pairsAgainstReference, threePhaseSets } from './relations.js';
import { channelSpectrum, planWindows, type ChannelSpectrum, type WindowSlot } from './spectra.js';
import { PowerWindowSums } from './window-sums.js';
import {
	REPORT_SCHEMA_VERSION,
	type AnalysisOptions,
	type AnalysisReport,
	type AnalysisStage,
	type ReportChannel,
} from './types.js';

/** Highest harmonic order reported by default: lib/spectrum's MAX_HARMONIC_ORDER. */
export const REPORT_DEFAULT_MAX_ORDER = MAX_HARMONIC_ORDER;

function diagnosticText(d: Diagnostic): string {
	const at = d.line ? ` (line ${d.line}${d.column ? `, column ${d.column}` : ''})` : '';
	return `${d.message}${at}`;
}

function checkOptions(o: AnalysisOptions): void {
	const positive = (name: string, x: number | undefined) => {
		if (x !== undefined && !(Number.isFinite(x) && x > 0))
			throw new RangeError(`${name} must be a positive number, got ${x}`);
	};
	positive('nominalV', o.nominalV);
	positive('nominalHz', o.nominalHz);
	positive('iscIl', o.iscIl);
	positive('ilA', o.ilA);
	if (o.windowCycles !== undefined && !(Number.isInteger(o.windowCycles) && o.windowCycles >= 1))
		throw new RangeError(`windowCycles must be a whole number >= 1, got ${o.windowCycles}`);
	if (o.ieee519Edition !== undefined && o.ieee519Edition !== '2014' && o.ieee519Edition !== '2022')
		throw new RangeError(`ieee519Edition must be '2014' or '2022', got ${String(o.ieee519Edition)}`);
	if (o.site !== undefined) checkSiteInputs(o.site);
	if (o.maxOrder !== undefined && !(Number.isInteger(o.maxOrder) && o.maxOrder >= 1))
		throw new RangeError(`maxOrder must be a whole number >= 1, got ${o.maxOrder}`);
	if (o.harmonicBasis !== undefined && o.harmonicBasis !== 'standard' && o.harmonicBasis !== 'single-bins')
		throw new RangeError(`harmonicBasis must be 'standard' or 'single-bins', got ${String(o.harmonicBasis)}`);
	positive('declaredV', o.declaredV);
}

/**
 * Analyses every channel of a capture on the reference channel's whole cycles.
 *
 * 1. Reference: `options.refChannel`, else the first voltage channel (then current, then any) with a
 *    periodic fundamental; its whole cycles (interpolated zero crossings of the fundamental) and frequency
 *    are measured once.
 * 2. Every channel: time-domain figures over those cycles (or the whole record), its own frequency,
 *    harmonics 0…maxOrder on consecutive windows of `windowCycles` cycles (10 at 50 Hz, 12 at 60 Hz,
 *    IEC 61000-4-7) aggregated as RMS over the windows, THD_F and THD_R, K-factor, TDD (given I_L).
 * 3. Relations: phase and time lag of each channel against the reference; IEEE 1459 power for each
 *    voltage/current pair; three-phase sets (rotation, sequence components, VUF/LVUR/PVUR).
 * 4. Limits, when a table is named.
 *
 * Every importer diagnostic and every choice made here is listed in `assumptions`.
 * @throws RangeError for bad options (including a reference channel the capture does not have)
 * @returns the report; figures the data cannot give are NaN (null in JSON)
 * @example analyseCapture(capture).channels[0].thdPercent // 5.00 for a 230 V sine with an 11.5 V 5th
 */
export function analyseCapture(capture: Capture, options: AnalysisOptions = {}): AnalysisReport {
	return analyseCaptureParts(capture, options).report;
}

/** What a front end draws beside the report, from the analysis's own passes (never in the JSON report). */
export interface AnalysisParts {
	report: AnalysisReport;
	/**
	 * Rising zero crossings of the reference channel's fundamental bounding the analysed whole cycles, as
	 * fractional sample indices (null without whole cycles, e.g. a short record's fit).
	 */
	referenceCrossings: Float64Array | null;
	/** The trend view from the event step's lib/trend pass, when asked for (null: no voltage or current channel). */
	trend?: CaptureTrend | null;
}

/**
 * `analyseCapture` with the reference crossings it found and, with `want.trend`, the trend view from the
 * same lib/trend pass its event step makes (Urms(1/2) series, 10/12-cycle THD and frequency, flicker with
 * Pinst, events), so a front end runs neither again. The report is the same with or without `want`.
 * @example analyseCaptureParts(capture, {}, { trend: {} }).trend?.result?.events // the dips lib/trend found
 */
export function analyseCaptureParts(
	capture: Capture,
	options: AnalysisOptions = {},
	want: { trend?: TrendViewRequest } = {},
): AnalysisParts {
	checkOptions(options);
	const progress = progressReporter(options.onProgress, want.trend !== undefined);
	progress('reference', 0, 1);
	const plan = planAnalysis(capture, options);
	progress('reference', 1, 1);
	const { window, slots } = plan;
	const fs = capture.sampleRateHz;
	progress('events', 0, 1);
	const trendProgress = want.trend && {
		onFraction: (f: number) => {
			progress('events', f, 1);
			want.trend?.onFraction?.(f);
		},
	};
	// one flickermeter pass: with the view asked for, the report's flicker runs serve its trend too
	const shareFlicker = !!want.trend && flickerShareable(capture, plan.nominalHz, eventsReadEverySample(capture));
	const ev = captureEvents(capture, plan.nominalHz, options.declaredV, trendProgress || undefined, !shareFlicker);
	progress('events', 1, 1);
	const spectra = harmonicSpectra(capture, slots, plan.maxOrder, (done, total) => progress('harmonics', done, total));
	progress('channels', 0, capture.channels.length);
	const ctx: ChannelContext = { ...plan, fs, span: options.span ?? 'whole-cycles', options, ev, spectra };
	ctx.flagged = flaggedSlots(slots, fs, ev.events?.events ?? []);
	const channels = capture.channels.map((c, i) => {
		const figures = channelFigures(capture, i, ctx);
		progress('channels', i + 1, capture.channels.length);
		return markBelowResolution(
			plan.fitted
				? fittedChannel(figures, c.samples, fs, plan.fitted, i, plan.nominalHz, plan.maxOrder, {
						range: c.range,
						startS: capture.startS,
					})
				: figures,
			plan.resolutions[i],
		);
	});
	const report = reportShell(capture, plan, channels, options.span ?? 'whole-cycles');
	progress('relations', 0, 1);
	if (window && plan.ref.index >= 0) addRelations(report, capture, ctx);
	else if (plan.fitted && plan.ref.index >= 0) {
		report.pairs = fittedPairs(capture, plan.ref.index, plan.fitted);
		const fp = fittedPower(capture, plan.fitted, options.pairs);
		report.power = fp.power;
		plan.assumptions.push(...fp.assumptions);
		const three = fittedThreePhase(capture, plan.ref.index, plan.fitted, options.pairs);
		report.threePhaseSets = three.sets;
		report.threePhase = three.sets[0] ?? null;
		report.neutral = three.neutral;
		report.threePhasePower = three.power;
		plan.assumptions.push(...three.assumptions);
	} else if (options.pairs && options.pairs.length > 0) {
		plan.warnings.push('Pairs were given but no fundamental was found: no power figures.');
	}
	progress('relations', 1, 1);
	report.flicker = flickerStep(capture, plan.nominalHz, options.nominalV, ev, shareFlicker, progress);
	report.nextSteps = nextStepsSection(report, options.site);
	report.events = ev.events;
	plan.assumptions.push(...ev.notes);
	// the limit step after the analysis (a pure function of the report; the UI re-runs it alone), then the
	// findings, which read the limits (applyLimits rebuilds them)
	return {
		report: applyLimits(report, options),
		referenceCrossings: window?.crossings ?? null,
		...(want.trend ? { trend: ev.trend ?? null } : {}),
	};
}

/**
 * The report's flicker section; with `share`, its flickermeter runs also become the trend view's flicker
 * (`ev.trend`, whose lib/trend pass ran without one). Progress by voltage channel.
 */
function flickerStep(
	capture: Capture,
	nominalHz: number | undefined,
	nominalV: number | undefined,
	ev: ReturnType<typeof captureEvents>,
	share: boolean,
	progress: (stage: AnalysisStage, done: number, total: number) => void,
): AnalysisReport['flicker'] {
	progress('flicker', 0, 1);
	const { report, runs } = measureFlicker(capture, nominalHz, nominalV, undefined, share, (done, total) =>
		progress('flicker', done, total),
	);
	const view = ev.trend?.result;
	if (share && view && ev.trendEvents) {
		const result = withRunsFlicker(view, runs, ev.trendEvents);
		if (result) ev.trend = { ...ev.trend!, result };
	}
	progress('flicker', 1, 1);
	return report;
}

/**
 * Share of the analysis time each stage takes, in the order they run (CPU time measured on a 400 s
 * three-phase record of 6 channels at 10 kS/s; the harmonic windows report their own count inside their
 * share). With the trend view the event step's lib/trend pass also makes the 10/12-cycle THD rows, and
 * takes a quarter of the time.
 */
const STAGE_WEIGHTS: Record<AnalysisStage, number> = {
	reference: 0.08,
	events: 0.07,
	harmonics: 0.26,
	channels: 0.34,
	relations: 0.13,
	flicker: 0.12,
};
const STAGE_WEIGHTS_WITH_VIEW: Record<AnalysisStage, number> = {
	reference: 0.07,
	events: 0.26,
	harmonics: 0.18,
	channels: 0.27,
	relations: 0.12,
	flicker: 0.1,
};
const STAGE_ORDER = Object.keys(STAGE_WEIGHTS) as AnalysisStage[];

/** The progress callback with the overall fraction filled in (stages in STAGE_ORDER, each by its weight). */
function progressReporter(
	onProgress: AnalysisOptions['onProgress'],
	withView: boolean,
): (stage: AnalysisStage, done: number, total: number) => void {
	if (!onProgress) return () => {};
	const weights = withView ? STAGE_WEIGHTS_WITH_VIEW : STAGE_WEIGHTS;
	return (stage, done, total) => {
		let before = 0;
		for (const s of STAGE_ORDER) {
			if (s === stage) break;
			before += weights[s];
		}
		const within = total > 0 ? Math.min(1, done / total) : 1;
		onProgress({ stage, done, total, fraction: Math.min(1, before + weights[stage] * within) });
	};
}

/** What every part of the analysis shares: the reference, its window and harmonic slots, the fit of a short record. */
interface AnalysisPlan {
	ref: ReturnType<typeof chooseReference>;
	window: CycleWindow | undefined;
	fitted: ShortRecordResult | undefined;
	frequencyHz: number;
	nominalHz: number | undefined;
	searchHz: number | undefined;
	maxOrder: number;
	slots: WindowSlot[];
	periods: CycleWindow | undefined;
	resolutions: ReturnType<typeof channelResolution>[];
	assumptions: string[];
	warnings: string[];
}

/** Reference channel, its whole cycles (or the short-record fit), nominal frequency and harmonic windows. */
function planAnalysis(capture: Capture, options: AnalysisOptions): AnalysisPlan {
	const fs = capture.sampleRateHz;
	const maxOrder = options.maxOrder ?? REPORT_DEFAULT_MAX_ORDER;
	const assumptions = capture.diagnostics.map(diagnosticText);
	const warnings: string[] = [];
	const n = capture.channels[0]?.samples.length ?? 0;
	const searchHz = options.nominalHz ?? capture.nominalFrequencyHz;
	const ref = chooseReference(capture, options.refChannel, searchHz);
	assumptions.push(...ref.assumptions);
	const window = ref.window;
	const resolutions = capture.channels.map((c) => channelResolution(c.samples));
	// Under two whole cycles: one least-squares fit of every channel (lib/report/short-record.ts)
	const short =
		!window && ref.index >= 0
			? fitShortRecord(capture, ref.index, maxOrder, options.nominalHz ?? capture.nominalFrequencyHz, resolutions)
			: undefined;
	const fitted = typeof short === 'object' ? short : undefined;
	const frequencyHz = window?.frequencyHz ?? fitted?.fit.frequencyHz ?? NaN;
	const nominalHz =
		options.nominalHz ??
		capture.nominalFrequencyHz ??
		(window ? (Math.abs(frequencyHz - 60) < Math.abs(frequencyHz - 50) ? 60 : 50) : undefined);
	if (options.nominalHz === undefined && capture.nominalFrequencyHz === undefined && nominalHz !== undefined) {
		assumptions.push(
			`Nominal frequency taken as ${nominalHz} Hz (nearest to the measured ${frequencyHz.toFixed(3)} Hz).`,
		);
	}
	if (timeBaseIrregular(capture)) warnings.push('The time base is not uniform; figures assume the mean sample rate.');
	const periods = fitted ? fittedPeriods(n, fs, fitted.fit.frequencyHz) : undefined;
	if (fitted) warnings.push(shortRecordSentence(fitted.fit, n, fs, periods?.cycles ?? 0));
	else if (!window) {
		warnings.push(
			`No periodic fundamental found (${ref.failure ?? 'no channels'}${typeof short === 'string' ? `; ${short}` : ''}): figures cover the whole record; harmonics, phase and power are not given.`,
		);
	}
	const slots = harmonicSlots(window, fs, options.windowCycles ?? basicWindowCycles(nominalHz), assumptions, warnings);
	return {
		...{ ref, window, fitted, frequencyHz, nominalHz, searchHz, maxOrder, slots, periods, resolutions },
		...{ assumptions, warnings },
	};
}

/** The harmonic windows on the reference cycles, with a sentence when they do not cover every cycle. */
function harmonicSlots(
	window: CycleWindow | undefined,
	fs: number,
	windowCycles: number,
	assumptions: string[],
	warnings: string[],
): WindowSlot[] {
	const slots = window ? planWindows(window, fs, windowCycles) : [];
	if (window && window.cycles < windowCycles) {
		warnings.push(
			`Only ${window.cycles} whole cycles: harmonics come from one ${window.cycles}-cycle window (IEC 61000-4-7 uses ${windowCycles}).`,
		);
	} else if (window && slots.length * windowCycles < window.cycles) {
		assumptions.push(
			`Harmonics from ${slots.length} window(s) of ${windowCycles} cycles; the last ${window.cycles - slots.length * windowCycles} cycle(s) are not in a full window.`,
		);
	}
	return slots;
}

/** Every channel's harmonic windows and their aggregate; `onWindows` hears windows done of the total. */
function harmonicSpectra(
	capture: Capture,
	slots: WindowSlot[],
	maxOrder: number,
	onWindows: (done: number, total: number) => void,
): (ChannelSpectrum | undefined)[] {
	if (slots.length === 0) return capture.channels.map(() => undefined);
	const total = slots.length * capture.channels.length;
	let done = 0;
	return capture.channels.map((c) =>
		channelSpectrum(c.samples, capture.sampleRateHz, slots, maxOrder, () => onWindows(++done, total)),
	);
}

/** The plan and what the per-channel and relation parts read from the analysis so far. */
interface ChannelContext extends AnalysisPlan {
	fs: number;
	span: 'whole-cycles' | 'whole-record';
	options: AnalysisOptions;
	ev: ReturnType<typeof captureEvents>;
	spectra: (ChannelSpectrum | undefined)[];
	flagged?: ReturnType<typeof flaggedSlots>;
}

/** One channel's time-domain figures, own frequency, meter model, intervals and harmonic fields. */
function channelFigures(capture: Capture, i: number, ctx: ChannelContext): ReportChannel {
	const c = capture.channels[i];
	const { window, fs, span, maxOrder, nominalHz, frequencyHz } = ctx;
	const onCycles = window && span === 'whole-cycles' ? window : undefined;
	const figs = waveformFigures(c.samples, fs, {
		...(onCycles
			? { span, window: onCycles, nominalHz, maxOrder }
			: { span: 'whole-record' as const, frequencyHz: window ? frequencyHz : undefined, nominalHz, maxOrder }),
		range: c.range,
		startS: capture.startS,
	});
	const own =
		i === ctx.ref.index && window
			? { ok: true as const, frequencyHz: window.frequencyHz }
			: findWholeCycles(
					c.samples,
					fs,
					window ? { frequencyHz } : ctx.searchHz !== undefined ? { nominalHz: ctx.searchHz } : {},
				);
	const meter = meterModel(c.samples, figs, onCycles);
	const shape = shapeFigures(figs);
	const intervals = channelIntervals(c.samples, fs, ctx.slots, ctx.flagged ?? []);
	const harmonic = harmonicFields(ctx.spectra[i], c, maxOrder, ctx.options);
	// the whole-record error differs from every interval's: levels changed over the record
	const levelChanges =
		intervals !== null &&
		intervals.count >= 2 &&
		Math.abs(intervals.meterErrorPercent.worst - meter.errorPercent) >= 0.05;
	const set = ctx.spectra[i]?.aggregate.set;
	return {
		...{ name: c.name, unit: c.unit, quantity: c.quantity, phase: c.phase ?? null },
		...{ mean: figs.mean, rms: figs.rms, acRms: figs.acRms, rectifiedMean: figs.rectifiedMean },
		...{ peak: figs.peak, peakNegative: figs.peakNegative, peakToPeak: figs.peakToPeak },
		crestFactor: shape.crestFactor,
		formFactor: shape.formFactor,
		frequencyHz: own.ok ? own.frequencyHz : NaN,
		...harmonic.figures,
		averageResponding: {
			...meter,
			...(set ? { explanation: meterExplanation(set, meter, c.unit, undefined, levelChanges) } : {}),
		},
		intervals,
		harmonics: harmonic.harmonics,
		groups: harmonic.groups,
		thdVariants: harmonic.thdVariants,
		worstCycle: window ? worstCycle(c.samples, window, fs) : null,
		warnings: figs.warnings.map((d) => d.message),
	};
}

/** A channel's THD, K-factor, TDD, harmonic list, groups and THD variants from its aggregate (NaN/empty without). */
function harmonicFields(
	spectrum: ChannelSpectrum | undefined,
	c: Capture['channels'][number],
	maxOrder: number,
	options: AnalysisOptions,
): Pick<ReportChannel, 'harmonics' | 'groups' | 'thdVariants'> & {
	figures: Pick<ReportChannel, 'thdPercent' | 'thdRPercent' | 'thdMaxOrder' | 'kFactor' | 'tddPercent'>;
} {
	const agg = spectrum?.aggregate;
	const set = agg?.set;
	const rmsByOrder = set ? set.orders.map((o) => o.rms) : [];
	const h1 = rmsByOrder[1] ?? NaN;
	const thdOrder = Math.min(maxOrder, MAX_HARMONIC_ORDER, agg?.highestValidOrder ?? MAX_HARMONIC_ORDER);
	return {
		figures: {
			thdPercent: set ? thdFPercent(rmsByOrder, thdOrder) : NaN,
			thdRPercent: set ? thdRPercent(rmsByOrder, thdOrder) : NaN,
			thdMaxOrder: thdOrder,
			kFactor: set ? ulKFactor(rmsByOrder, thdOrder) : NaN,
			tddPercent:
				set && c.quantity === 'current' && options.ilA !== undefined
					? tddPercent(rmsByOrder, options.ilA, thdOrder)
					: NaN,
		},
		harmonics: set
			? set.orders.map((o) => ({
					order: o.order,
					rms: o.rms,
					percentOfFundamental: h1 > 0 ? (100 * o.rms) / h1 : NaN,
					phaseDeg: o.phaseDeg,
				}))
			: [],
		groups: agg
			? {
					harmonicGroupRms: Array.from(agg.groups.harmonicGroupRms),
					harmonicSubgroupRms: Array.from(agg.groups.harmonicSubgroupRms),
					interharmonicGroupRms: Array.from(agg.groups.interharmonicGroupRms),
					interharmonicSubgroupRms: Array.from(agg.groups.interharmonicSubgroupRms),
				}
			: null,
		thdVariants: agg ? { ...agg.thd } : null,
	};
}

/** The report with its capture-wide fields and channels; relations, flicker and events are filled in after. */
function reportShell(
	capture: Capture,
	plan: AnalysisPlan,
	channels: ReportChannel[],
	span: 'whole-cycles' | 'whole-record',
): AnalysisReport {
	const fs = capture.sampleRateHz;
	const n = capture.channels[0]?.samples.length ?? 0;
	const { window, periods, slots, ref } = plan;
	const onCycles = window && span === 'whole-cycles';
	return {
		schemaVersion: REPORT_SCHEMA_VERSION,
		file: capture.source,
		sampleRateHz: fs,
		durationS: durationS(capture),
		cyclesAnalysed: window?.cycles ?? periods?.cycles ?? 0,
		frequencyHz: plan.frequencyHz,
		referenceChannel: ref.index >= 0 ? capture.channels[ref.index].name : null,
		window: {
			startS: onCycles ? window.startIndex / fs : 0,
			endS: onCycles ? window.endIndex / fs : periods ? periods.endIndex / fs : n / fs,
			span: window ? span : periods ? 'whole-cycles' : 'whole-record',
			harmonicWindowCycles: slots[0]?.cycles ?? NaN,
			harmonicWindows: slots.length,
		},
		assumptions: plan.assumptions,
		diagnostics: capture.diagnostics.map((d) => ({
			code: d.code,
			message: d.message,
			severity: d.severity,
			line: d.line ?? null,
			column: d.column ?? null,
		})),
		warnings: plan.warnings,
		channels,
		...{ pairs: [], power: [], threePhase: null, threePhaseSets: [], threePhasePower: null, neutral: null },
		digital: digitalSummary(capture),
		shortRecord: plan.fitted?.info ?? null,
		events: null,
		findings: [],
		thresholds: Object.values(VERDICT_THRESHOLDS),
	};
}

/** Lag against the reference, power of each V/I pair, three-phase sets and power, the neutral current. */
function addRelations(report: AnalysisReport, capture: Capture, ctx: ChannelContext): void {
	const window = ctx.window!;
	const { spectra, slots, fs, assumptions } = ctx;
	const phasors = alignedFundamentals(spectra, ctx.ref.index);
	const powerWindow = { startIndex: window.startIndex, endIndex: window.endIndex, cycles: window.cycles };
	const sums = new PowerWindowSums(powerWindow);
	report.pairs = pairsAgainstReference(capture, ctx.ref.index, phasors, powerWindow);
	const pairing = pairChannels(capture.channels, ctx.options.pairs);
	assumptions.push(...pairing.assumptions);
	report.power = pairing.pairs.map((p) => {
		const pw = pairPower(capture, p, spectra, powerWindow, sums);
		const words = loadWords(pw.displacementPowerFactor, pw.reactiveVar, report.channels[p.current].thdPercent);
		const v = capture.channels[p.voltage].samples;
		const i = capture.channels[p.current].samples;
		const pfIntervals = powerFactorIntervals(v, i, fs, slots, ctx.flagged ?? []);
		return {
			...pw,
			character: words.character,
			relation: words.relation,
			loadSentence: words.sentence,
			powerFactorIntervals: pfIntervals,
		};
	});
	const three = threePhaseSets(capture.channels, pairing.pairing, phasors);
	assumptions.push(...three.assumptions);
	report.threePhaseSets = three.sets;
	report.threePhase = three.sets[0] ?? null;
	const derived: DerivedScratch = {};
	report.threePhasePower = threePhasePower(capture, pairing.pairs, spectra, powerWindow, derived, sums) ?? null;
	const currentSet = three.sets.findIndex((t) => t.quantity === 'current');
	if (currentSet < 0) return;
	const neutralName = pairing.pairing.neutralCurrent;
	const neutralIndex =
		neutralName === undefined ? undefined : capture.channels.findIndex((c) => c.name === neutralName);
	const members = three.members[currentSet];
	const maxOrder = ctx.maxOrder;
	report.neutral = neutralCurrent(capture, members, neutralIndex, spectra, slots, powerWindow, maxOrder, derived, sums);
}

function timeBaseIrregular(capture: Capture): boolean {
	return capture.timeS !== undefined;
}

/** The capture-wide warning of a short record: cycles held at the fitted frequency and what covers what. */
function shortRecordSentence(
	fit: { frequencyHz: number; frequencyStdHz: number; cycles: number; highestOrder: number },
	n: number,
	fs: number,
	periods: number,
): string {
	const r = (x: number, d: number) => Number(x.toFixed(d)).toString();
	const span =
		periods >= 1
			? `RMS, rectified mean, form factor and meter error cover its first ${periods} whole period(s) of the fitted frequency`
			: 'it holds no whole period, so mean and RMS come from the fit and rectified mean, form factor and meter error are not given';
	return (
		`Short record: ${r((1000 * n) / fs, 3)} ms holds ${cyclesText(r(fit.cycles, 3))} at the fitted ${r(fit.frequencyHz, 3)} Hz (± ${Number(fit.frequencyStdHz.toPrecision(2))} Hz). ` +
		`Frequency, harmonics (to order ${fit.highestOrder}), THD, lag and power are ${FITTED_NOTE}, each with its uncertainty; ${span}.`
	);
}
