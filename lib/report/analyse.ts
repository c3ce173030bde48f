/**
 * The one analysis entry point of Sinecheck: a Capture in, an AnalysisReport out. The CLI and the UI both
 * call it, so every figure a user sees comes from this code.
 */
import { basicWindowCycles, MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import { durationS, type Capture, type Diagnostic } from '../capture.js';
import { findWholeCycles } from '../signal/cycles.js';
import { waveformFigures } from '../signal/levels.js';
import { tddPercent, ulKFactor } from '../spectrum/distortion.js';
import { thdFPercent, thdRPercent } from '../spectrum/thd.js';
import { captureEvents } from './events.js';
import { digitalSummary, neutralCurrent, threePhasePower, worstCycle } from './extras.js';
import { channelIntervals, flaggedSlots, powerFactorIntervals } from './intervals.js';
import { applyLimits } from './limits-report.js';
import { flickerReport } from './flicker-report.js';
import { checkSiteInputs, nextStepsSection } from '../next-steps/report-section.js';
import { loadWords } from './load-words.js';
import { meterExplanation } from './meter-explanation.js';
import { meterModel, shapeFigures } from './meter.js';
import { VERDICT_THRESHOLDS } from './thresholds.js';
import { chooseReference } from './reference.js';
import { channelResolution } from '../signal/code-step.js';
import { fittedPairs, fittedPower, fitShortRecord, FITTED_NOTE } from './short-record.js';
import { fittedChannel, fittedPeriods, markBelowResolution } from './short-record-channel.js';
import { fittedThreePhase } from './short-record-three-phase.js';
import { alignedFundamentals, pairChannels, pairPower, pairsAgainstReference, threePhaseSets } from './relations.js';
import { channelSpectrum, planWindows, type ChannelSpectrum } from './spectra.js';
import { REPORT_SCHEMA_VERSION, type AnalysisOptions, type AnalysisReport, type ReportChannel } from './types.js';

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
	checkOptions(options);
	const fs = capture.sampleRateHz;
	const maxOrder = options.maxOrder ?? REPORT_DEFAULT_MAX_ORDER;
	const span = options.span ?? 'whole-cycles';
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
	const windowCycles = options.windowCycles ?? basicWindowCycles(nominalHz);
	if (timeBaseIrregular(capture)) warnings.push('The time base is not uniform; figures assume the mean sample rate.');
	const periods = fitted ? fittedPeriods(n, fs, fitted.fit.frequencyHz) : undefined;
	if (fitted) warnings.push(shortRecordSentence(fitted.fit, n, fs, periods?.cycles ?? 0));
	else if (!window) {
		warnings.push(
			`No periodic fundamental found (${ref.failure ?? 'no channels'}${typeof short === 'string' ? `; ${short}` : ''}): figures cover the whole record; harmonics, phase and power are not given.`,
		);
	}
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
	const ev = captureEvents(capture, nominalHz, options.declaredV);
	const flagged = flaggedSlots(slots, fs, ev.events?.events ?? []);
	const spectra: (ChannelSpectrum | undefined)[] = capture.channels.map((c) =>
		slots.length > 0 ? channelSpectrum(c.samples, fs, slots, maxOrder) : undefined,
	);

	const wholeRecord: ReportChannel[] = capture.channels.map((c, i) => {
		const figs = waveformFigures(c.samples, fs, {
			...(window && span === 'whole-cycles'
				? { span, window, nominalHz, maxOrder }
				: { span: 'whole-record' as const, frequencyHz: window ? frequencyHz : undefined, nominalHz, maxOrder }),
			range: c.range,
			startS: capture.startS,
		});
		const own =
			i === ref.index && window
				? { ok: true as const, frequencyHz: window.frequencyHz }
				: findWholeCycles(
						c.samples,
						fs,
						window ? { frequencyHz } : searchHz !== undefined ? { nominalHz: searchHz } : {},
					);
		const channelHz = own.ok ? own.frequencyHz : NaN;
		const agg = spectra[i]?.aggregate;
		const set = agg?.set;
		const rmsByOrder = set ? set.orders.map((o) => o.rms) : [];
		const h1 = rmsByOrder[1] ?? NaN;
		const thdOrder = Math.min(maxOrder, MAX_HARMONIC_ORDER, agg?.highestValidOrder ?? MAX_HARMONIC_ORDER);
		const chWarnings = figs.warnings.map((d) => d.message);
		const meter = meterModel(c.samples, figs, window && span === 'whole-cycles' ? window : undefined);
		const shape = shapeFigures(figs);
		const intervals = channelIntervals(c.samples, fs, slots, flagged);
		// the whole-record error differs from every interval's: levels changed over the record
		const levelChanges =
			intervals !== null &&
			intervals.count >= 2 &&
			Math.abs(intervals.meterErrorPercent.worst - meter.errorPercent) >= 0.05;
		return {
			name: c.name,
			unit: c.unit,
			quantity: c.quantity,
			phase: c.phase ?? null,
			mean: figs.mean,
			rms: figs.rms,
			acRms: figs.acRms,
			rectifiedMean: figs.rectifiedMean,
			peak: figs.peak,
			peakNegative: figs.peakNegative,
			peakToPeak: figs.peakToPeak,
			crestFactor: shape.crestFactor,
			formFactor: shape.formFactor,
			frequencyHz: channelHz,
			thdPercent: set ? thdFPercent(rmsByOrder, thdOrder) : NaN,
			thdRPercent: set ? thdRPercent(rmsByOrder, thdOrder) : NaN,
			thdMaxOrder: thdOrder,
			kFactor: set ? ulKFactor(rmsByOrder, thdOrder) : NaN,
			tddPercent:
				set && c.quantity === 'current' && options.ilA !== undefined
					? tddPercent(rmsByOrder, options.ilA, thdOrder)
					: NaN,
			averageResponding: {
				...meter,
				...(set ? { explanation: meterExplanation(set, meter, c.unit, undefined, levelChanges) } : {}),
			},
			intervals,
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
			worstCycle: window ? worstCycle(c.samples, window, fs) : null,
			warnings: chWarnings,
		};
	});
	const channels = wholeRecord.map((c, i) =>
		markBelowResolution(
			fitted
				? fittedChannel(c, capture.channels[i].samples, fs, fitted, i, nominalHz, maxOrder, {
						range: capture.channels[i].range,
						startS: capture.startS,
					})
				: c,
			resolutions[i],
		),
	);

	const report: AnalysisReport = {
		schemaVersion: REPORT_SCHEMA_VERSION,
		file: capture.source,
		sampleRateHz: fs,
		durationS: durationS(capture),
		cyclesAnalysed: window?.cycles ?? periods?.cycles ?? 0,
		frequencyHz,
		referenceChannel: ref.index >= 0 ? capture.channels[ref.index].name : null,
		window: {
			startS: window && span === 'whole-cycles' ? window.startIndex / fs : 0,
			endS: window && span === 'whole-cycles' ? window.endIndex / fs : periods ? periods.endIndex / fs : n / fs,
			span: window ? span : periods ? 'whole-cycles' : 'whole-record',
			harmonicWindowCycles: slots[0]?.cycles ?? NaN,
			harmonicWindows: slots.length,
		},
		assumptions,
		diagnostics: capture.diagnostics.map((d) => ({
			code: d.code,
			message: d.message,
			severity: d.severity,
			line: d.line ?? null,
			column: d.column ?? null,
		})),
		warnings,
		channels,
		pairs: [],
		power: [],
		threePhase: null,
		threePhaseSets: [],
		threePhasePower: null,
		neutral: null,
		digital: digitalSummary(capture),
		shortRecord: fitted?.info ?? null,
		events: null,
		findings: [],
		thresholds: Object.values(VERDICT_THRESHOLDS),
	};
	if (window && ref.index >= 0) {
		const phasors = alignedFundamentals(spectra, ref.index);
		const powerWindow = { startIndex: window.startIndex, endIndex: window.endIndex, cycles: window.cycles };
		report.pairs = pairsAgainstReference(capture, ref.index, phasors, powerWindow);
		const pairing = pairChannels(capture.channels, options.pairs);
		assumptions.push(...pairing.assumptions);
		report.power = pairing.pairs.map((p) => {
			const pw = pairPower(capture, p, spectra, powerWindow);
			const words = loadWords(pw.displacementPowerFactor, pw.reactiveVar, channels[p.current].thdPercent);
			const pfIntervals = powerFactorIntervals(
				capture.channels[p.voltage].samples,
				capture.channels[p.current].samples,
				fs,
				slots,
				flagged,
			);
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
		report.threePhasePower = threePhasePower(capture, pairing.pairs, spectra, powerWindow) ?? null;
		const currentSet = three.sets.findIndex((t) => t.quantity === 'current');
		if (currentSet >= 0) {
			const neutralName = pairing.pairing.neutralCurrent;
			const neutralIndex =
				neutralName === undefined ? undefined : capture.channels.findIndex((c) => c.name === neutralName);
			report.neutral = neutralCurrent(
				capture,
				three.members[currentSet],
				neutralIndex,
				spectra,
				slots,
				powerWindow,
				maxOrder,
			);
		}
	} else if (fitted && ref.index >= 0) {
		report.pairs = fittedPairs(capture, ref.index, fitted);
		const fp = fittedPower(capture, fitted, options.pairs);
		report.power = fp.power;
		assumptions.push(...fp.assumptions);
		const three = fittedThreePhase(capture, ref.index, fitted, options.pairs);
		report.threePhaseSets = three.sets;
		report.threePhase = three.sets[0] ?? null;
		report.neutral = three.neutral;
		report.threePhasePower = three.power;
		assumptions.push(...three.assumptions);
	} else if (options.pairs && options.pairs.length > 0) {
		warnings.push('Pairs were given but no fundamental was found: no power figures.');
	}
	report.flicker = flickerReport(capture, nominalHz, options.nominalV, undefined);
	report.nextSteps = nextStepsSection(report, options.site);
	report.events = ev.events;
	assumptions.push(...ev.notes);
	// the limit step after the analysis (a pure function of the report; the UI re-runs it alone), then the
	// findings, which read the limits (applyLimits rebuilds them)
	return applyLimits(report, options);
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
		`Short record: ${r((1000 * n) / fs, 3)} ms holds ${r(fit.cycles, 3)} cycles at the fitted ${r(fit.frequencyHz, 3)} Hz (± ${Number(fit.frequencyStdHz.toPrecision(2))} Hz). ` +
		`Frequency, harmonics (to order ${fit.highestOrder}), THD, lag and power are ${FITTED_NOTE}, each with its uncertainty; ${span}.`
	);
}
