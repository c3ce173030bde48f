/**
 * The analysis report: what `analyseCapture` returns and, through `reportToJson`, the JSON contract
 * shared by the CLI (`sinecheck analyse --json`) and the UI's JSON download. `report.schema.json` beside
 * this file documents the JSON form; a change here changes the schema in the same commit.
 *
 * Units are SI throughout: V, A, W, var, VA, Hz, s, degrees. In memory a figure the data cannot give is
 * NaN; in JSON it is `null` (JSON has no NaN).
 */
import type { ReportFlicker } from './flicker-report.js';
import type { NeutralCurrentFigures } from '../polyphase/neutral.js';
import type { Quantity } from '../capture.js';
import type { ReportNextSteps, SiteInputs } from '../next-steps/types.js';
import type { ReportEvents } from './events.js';
import type { ReportFinding } from './findings.js';
import type { ChannelIntervals, IntervalFigure } from './intervals.js';
import type { ReportHarmonicBasis, ReportLimitBasis } from './limits-basis.js';
import type { MeterModel } from './meter.js';
import type { VerdictThreshold } from './thresholds.js';

export type {
	ReportEvents,
	ReportFinding,
	ChannelIntervals,
	IntervalFigure,
	ReportLimitBasis,
	ReportHarmonicBasis,
	MeterModel,
	VerdictThreshold,
};

/** Schema version of the JSON report; bumped on any incompatible change. */
export const REPORT_SCHEMA_VERSION = 1;

/** Limit tables the report can evaluate (ids as the CLI's `--limits` takes them). */
export type ReportLimitTableId = 'en50160' | 'iec61000-2-2' | 'ieee519';

export const REPORT_LIMIT_TABLE_IDS: readonly ReportLimitTableId[] = ['en50160', 'iec61000-2-2', 'ieee519'];

/** A voltage/current pairing the user imposes (channel names without units). */
export interface ReportPairOverride {
	voltage: string;
	current: string;
}

/** Everything the analysis needs from a user; every field optional. */
export interface AnalysisOptions {
	/** Reference channel by name; default: the first voltage channel, else the first channel. */
	refChannel?: string;
	/**
	 * 'whole-cycles' (default): every figure over the whole fundamental cycles of the reference channel
	 * (zero-crossing boundaries); 'whole-record': time-domain figures over every sample (harmonics still
	 * use whole cycles, which a DFT needs).
	 */
	span?: 'whole-cycles' | 'whole-record';
	/** Harmonic window length in fundamental cycles; default 10 at 50 Hz, 12 at 60 Hz (IEC 61000-4-7). */
	windowCycles?: number;
	/** Nominal system voltage in V, line-to-line (400 for a 230/400 V supply); chooses the IEEE 519 bus-voltage row. */
	nominalV?: number;
	/** Nominal system frequency in Hz (50 or 60); default: what the capture declares, else the nearer of 50/60. */
	nominalHz?: number;
	/** Highest harmonic order reported; default 50. */
	maxOrder?: number;
	/** Limit table to evaluate harmonics against; omitted = no limit evaluation. */
	limits?: ReportLimitTableId;
	/** IEEE 519: ratio of the maximum short-circuit current to the maximum demand load current at the PCC. */
	iscIl?: number;
	/** Maximum demand load current I_L in A (IEEE 519 TDD); without it TDD uses the measured fundamental. */
	ilA?: number;
	/** IEEE 519 edition for the even-harmonic current rule: '2022' (default) or '2014'. */
	ieee519Edition?: '2014' | '2022';
	/** Voltage/current pairings that replace the automatic pairing by phase label. */
	pairs?: ReportPairOverride[];
	/** Site values for the next steps (target power factor, transformer, meter...); see lib/next-steps. */
	site?: SiteInputs;
	/**
	 * Harmonic values limits are judged on: 'standard' (default), the basis the table's standard uses
	 * (harmonic subgroups, see limits-basis.ts); 'single-bins', each order's own DFT bin, only on request.
	 */
	harmonicBasis?: ReportHarmonicBasis;
	/** Declared supply voltage for voltage events, V (line-to-neutral for phase channels); inferred when absent. */
	declaredV?: number;
	/**
	 * Hears the analysis advance (not part of the report; front ends show it): as each stage starts and
	 * ends, after every harmonic window and after every channel. Called synchronously from inside analyseCapture; keep it cheap.
	 */
	onProgress?: (progress: AnalysisProgress) => void;
}

/** The parts of analyseCapture, in the order they run. */
export type AnalysisStage = 'reference' | 'events' | 'harmonics' | 'channels' | 'relations' | 'flicker';

/** Where analyseCapture stands: the stage, its work done of its total (windows, channels), and the whole analysis's fraction. */
export interface AnalysisProgress {
	stage: AnalysisStage;
	done: number;
	total: number;
	/** 0…1 over the whole analysis, each stage weighted by its usual share of the time; never decreases. */
	fraction: number;
}

export interface ReportHarmonic {
	order: number;
	/** RMS of the order, channel's unit. Order 0 is DC (|mean|). */
	rms: number;
	/** 100 · rms / rms(order 1). */
	percentOfFundamental: number;
	/** Absolute phase, degrees, cosine reference, relative to the start of the analysis window; NaN when rms is 0. */
	phaseDeg: number;
	/**
	 * True when the order's RMS is under the channel's rounding floor (`ReportResolution`): front ends show
	 * "below resolution" instead of the number. In memory the figures stay (THD, K-factor, limits and the
	 * next steps sum them); in JSON `rms`, `percentOfFundamental` and `phaseDeg` are null (see `reportToJson`).
	 */
	belowResolution?: boolean;
	/** With `belowResolution`: the floor, an upper bound on the order's RMS (channel unit) and as % of the fundamental. */
	rmsUpperBound?: number;
	percentOfFundamentalUpperBound?: number;
}

/** A channel's code step and what it implies (absent when its values show no common step). */
export interface ReportResolution {
	/** Spacing of the values, channel unit. */
	codeStep: number;
	/** Codes the record spans and that in bits. */
	codesUsed: number;
	bitsUsed: number;
	/** RMS of the rounding error, q/√12, channel unit. */
	noiseRms: number;
	/** Harmonics under this RMS are reported as below resolution, channel unit. */
	harmonicFloorRms: number;
}

/** What the short-record fit gives one channel beyond the common fields (all one standard deviation). */
export interface ReportFitChannel {
	fundamentalRms: number;
	fundamentalRmsUncertainty: number;
	fundamentalPhaseUncertaintyDeg: number;
	thdUncertaintyPercent: number;
	/** RMS of what the fit leaves (noise, rounding, what the orders fitted do not hold). */
	residualRms: number;
	/** NaN when the channel shows no code step. */
	belowResolutionFloorRms: number;
	/** 'from a fit of a short record'. */
	note: string;
}

/** The short-record fit of a capture: present when the record holds under two whole cycles and a fit found a fundamental. */
export interface ReportShortRecord {
	note: string;
	method: string;
	frequencyHz: number;
	frequencyUncertaintyHz: number;
	/** Cycles the record holds at the fitted frequency (N·f/fs). */
	cyclesHeld: number;
	highestOrder: number;
	/** Rate the fit ran at after anti-alias decimation, Hz. */
	fitRateHz: number;
	searchedLowHz: number;
	searchedHighHz: number;
}

export interface ReportChannel {
	/** Name without unit (header `U1 (V)` gives `U1`). */
	name: string;
	unit: string;
	quantity: Quantity;
	/** Phase label when known ('L1', 'A', ...), else null. */
	phase: string | null;
	mean: number;
	/** True RMS including DC. */
	rms: number;
	/** RMS without DC: sqrt(rms² − mean²). */
	acRms: number;
	rectifiedMean: number;
	peak: number;
	peakNegative: number;
	peakToPeak: number;
	/** max|x − mean| / acRms: the AC part of the wave (the convention of lib/report/meter.ts); √2 for a sine. */
	crestFactor: number;
	/** acRms / rectifiedMean: the AC part of the wave; π/(2√2) ≈ 1.1107 for a sine. */
	formFactor: number;
	/** This channel's own fundamental frequency (Hz); NaN when it has no periodic fundamental. */
	frequencyHz: number;
	/** THD_F to the highest reported order (see `thdMaxOrder`), percent of the fundamental. */
	thdPercent: number;
	/** THD relative to the total RMS (THD_R), percent. */
	thdRPercent: number;
	/** Order up to which THD was summed. */
	thdMaxOrder: number;
	/** UL K-factor Σ I_h² h² / Σ I_h² (meaningful for currents). */
	kFactor: number;
	/** IEEE 519 TDD in percent of I_L (currents only, when I_L is given), else NaN. */
	tddPercent: number;
	/**
	 * A sine-calibrated average-responding meter: AC-coupled (the headline: reading, trueRms = AC RMS,
	 * errorPercent), the DC-coupled reading beside it, and why it misreads the wave (the same numbers).
	 */
	averageResponding: MeterModel & {
		explanation?: { summary: string; reasons: string[]; harmonicsErrorPercent: number; remainderPercent: number };
	};
	/** Meter error, crest factor and AC RMS judged per 10/12-cycle interval (typical and worst); null without harmonic windows. */
	intervals: ChannelIntervals | null;
	/** Orders 0..maxOrder. */
	harmonics: ReportHarmonic[];
	/**
	 * IEC 61000-4-7 groupings of the aggregated DFT bins (RMS, channel unit), index = order (interharmonic
	 * index n = between n and n+1); null without harmonics.
	 */
	groups: {
		harmonicGroupRms: number[];
		harmonicSubgroupRms: number[];
		interharmonicGroupRms: number[];
		interharmonicSubgroupRms: number[];
	} | null;
	/** The THD variants of lib/spectrum (F/R to order 40 and 50; G from groups, S from subgroups), percent; null without harmonics. */
	thdVariants: Record<string, number> | null;
	/** The worst whole cycle by RMS and by peak, null without whole cycles. */
	worstCycle: ReportWorstCycle | null;
	/** Warnings about this channel's data (clipping, DC offset, few cycles...). */
	warnings: string[];
	/** Code step and rounding floor, or null when the values show no common step. */
	resolution?: ReportResolution | null;
	/** Fit figures on a short record, else null. */
	fit?: ReportFitChannel | null;
}

/** Worst whole cycle of a channel (per-cycle RMS from one rising zero crossing of the reference to the next). */
export interface ReportWorstCycle {
	/** 0-based index of the cycle with the highest RMS, within the analysed cycles. */
	rmsCycle: number;
	rms: number;
	/** Start of that cycle, s from the first sample. */
	rmsStartS: number;
	/** Index of the cycle with the highest peak magnitude. */
	peakCycle: number;
	/** Its peak, signed (the larger in magnitude of its positive and negative peak). */
	peak: number;
	peakStartS: number;
	/** Lowest cycle RMS (a dip shows here). */
	lowestRms: number;
}

/** IEEE 1459-2010 three-phase quantities of three V/I pairs (effective V, I, S, positive-sequence powers...). */
export interface ReportThreePhasePower {
	/** [voltage, current] names of phases 1, 2, 3. */
	channels: string[][];
	wiring: string;
	/** 'as-labelled', or 'phases-2-3-swapped' when the set rotates negatively and lib/power took it in positive order. */
	sequenceOrder: string;
	/** Every scalar IEEE 1459 three-phase figure, names with unit suffixes (effectiveApparentPowerVA, ...). */
	figures: Record<string, number>;
	/** On a short record: 'from a fit of a short record' (the figures come from the fitted harmonic sets). */
	note?: string;
}

/** Neutral current of a three-phase current set: lib/polyphase's figures plus which channel measured it. */
export interface ReportNeutral extends NeutralCurrentFigures {
	/** The measured neutral channel, or null when computed as the sum of the phase currents. */
	channel: string | null;
}

/** A binary status channel in brief. */
export interface ReportDigital {
	name: string;
	/** Normal state as the source declares it, or null. */
	normalState: number | null;
	/** Number of state changes in the record. */
	changes: number;
	/** Time of the first sample off the normal state (or of the first change when none is declared), s from the first sample; NaN when never. */
	firstActiveS: number;
	/** Samples in the non-normal state (or in state 1 when none is declared), s. */
	activeS: number;
}

export interface ReportPair {
	ref: string;
	other: string;
	/** Fundamental phase of `other` behind `ref`, degrees in (−180, 180]; positive when `other` lags. */
	lagDeg: number;
	/** Time lag in s (cross-correlation, sub-sample; on a short record from the fitted fundamentals); positive when `other` lags. */
	lagS: number;
	/** On a short record: one standard deviation of each lag, and the 'from a fit' note. */
	fit?: { lagDegUncertainty: number; lagSUncertainty: number; note: string };
}

export type ReportLoadCharacter = 'inductive' | 'capacitive' | 'resistive';

export interface ReportPower {
	voltage: string;
	current: string;
	/** P, mean of v·i over the window, W. */
	activeW: number;
	/** S = V·I, VA. */
	apparentVA: number;
	/** Q1 = V1·I1·sin θ1, var; positive for an inductive load. */
	reactiveVar: number;
	/** PF = P / S. */
	powerFactor: number;
	/** cos θ1. */
	displacementPowerFactor: number;
	/** Phase label of the pair (1, 2, 3) when it was paired by label or given, else null. */
	phase: number | null;
	/**
	 * Inductive / capacitive / resistive only where a fundamental-only model fits (a current close to a
	 * sine); null otherwise or when it cannot be told. See `relation` for the displacement in words.
	 */
	character: ReportLoadCharacter | null;
	/** The current's fundamental against the voltage: 'near-unity', 'lags', 'leads'; null without a fundamental. */
	relation: 'near-unity' | 'lags' | 'leads' | null;
	/** The load in words, e.g. "inductive: current lags the voltage by 30.0°". */
	loadSentence: string;
	/** Power factor per 10/12-cycle interval (typical = median, worst = lowest); null without windows. */
	powerFactorIntervals: IntervalFigure | null;
	/** The full IEEE 1459-2010 single-phase set (extra detail). */
	ieee1459: Record<string, number>;
	/** How the pair was formed: 'phase-label', 'only-pair', 'order' or 'user'. */
	pairedBy: string;
	/** On a short record: one standard deviation of the fundamental figures, and the 'from a fit' note. */
	fit?: {
		fundamentalActiveWUncertainty: number;
		reactiveVarUncertainty: number;
		displacementPowerFactorUncertainty: number;
		theta1UncertaintyDeg: number;
		note: string;
	};
}

export interface ReportThreePhase {
	/** The three channels, in the order a, b, c. */
	channels: string[];
	quantity: 'voltage' | 'current';
	/** 'line-to-neutral' phase voltages, 'line-to-line' voltages (U12, U23, U31), or 'line' currents. */
	connection: 'line-to-neutral' | 'line-to-line' | 'line';
	rotation: 'positive' | 'negative' | null;
	/** How clear the rotation is: 'clear' (weaker sequence under 10 % of the stronger), 'probable', 'doubtful'. */
	rotationClarity: string;
	/** The rotation in words, with the numbers. */
	rotationSentence: string;
	/** IEC VUF: 100 · |X2| / |X1|. */
	unbalancePercent: number;
	/** NEMA line-voltage unbalance rate, percent (line values derived from the phase channels when they are phase values). */
	lvurPercent: number;
	/** IEEE phase-voltage unbalance rate: max deviation from the mean magnitude / mean, percent. */
	pvurPercent: number;
	/** Magnitudes of the symmetrical components (RMS, channel unit). */
	sequence: { zero: number; positive: number; negative: number };
	/** Angles of the symmetrical components, degrees (extra detail). */
	sequenceDeg: { zero: number; positive: number; negative: number };
	/**
	 * On a short record: one standard deviation of each sequence component's magnitude (an upper bound from
	 * the fitted fundamentals' amplitude and phase deviations, channel unit) and of the unbalance, and the
	 * 'from a fit' note.
	 */
	fit?: { sequenceUncertainty: number; unbalanceUncertaintyPercent: number; note: string };
}

export interface ReportLimitRow {
	channel: string;
	/** Harmonic order, or 0 for a total figure (THD or TDD; see `figure`). */
	order: number;
	/** 'harmonic', 'thd' or 'tdd'. */
	figure: string;
	/** Measured value, percent. */
	value: number;
	/** Limit, percent. */
	limit: number;
	/** limit − value, percent points; negative when over. */
	margin: number;
	pass: boolean;
	/** Where the limit comes from: standard, table and entry. */
	source: string;
}

export interface ReportLimits {
	table: ReportLimitTableId;
	/** Human title of the table with its source. */
	title: string;
	/** The harmonic values the table was judged on (harmonic subgroups, or single bins on request). */
	basis: ReportLimitBasis;
	pass: boolean;
	rows: ReportLimitRow[];
	/** Why some channels or orders were not evaluated. */
	notes: string[];
}

export interface AnalysisReport {
	schemaVersion: number;
	file: string;
	sampleRateHz: number;
	durationS: number;
	/** Whole fundamental cycles the figures were computed over (0 when none were found). */
	cyclesAnalysed: number;
	/** Fundamental frequency of the reference channel, Hz. */
	frequencyHz: number;
	referenceChannel: string | null;
	/** The span analysed, seconds from the first sample. */
	window: {
		startS: number;
		endS: number;
		span: 'whole-cycles' | 'whole-record';
		harmonicWindowCycles: number;
		harmonicWindows: number;
	};
	/** Every importer diagnostic and analysis assumption, as sentences. */
	assumptions: string[];
	/** Importer diagnostics with their codes and locations (structured form of part of `assumptions`). */
	diagnostics: { code: string; message: string; severity: string; line: number | null; column: number | null }[];
	/** Capture-wide warnings (reference channel has no fundamental, ...). */
	warnings: string[];
	channels: ReportChannel[];
	pairs: ReportPair[];
	power: ReportPower[];
	/** The first three-phase set (voltages before currents), or null. */
	threePhase: ReportThreePhase | null;
	/** Every three-phase set found (extra detail). */
	threePhaseSets: ReportThreePhase[];
	/** IEEE 1459 three-phase power when phases 1, 2, 3 each have a V/I pair; else null. */
	threePhasePower: ReportThreePhasePower | null;
	/** Neutral current when three phase currents form a set; else null. */
	neutral: ReportNeutral | null;
	/** Binary status channels (COMTRADE digital), summarised: when they left their normal state. */
	digital: ReportDigital[];
	/** Present only when a limit table was asked for. */
	limits?: ReportLimits;
	/** Flicker (IEC 61000-4-15) and voltage changes (IEC 61000-3-3) of the voltage channels. */
	flicker?: ReportFlicker;
	/** From the findings to the next engineering step (lib/next-steps); set by analyseCapture. */
	nextSteps?: ReportNextSteps;
	/** The short-record fit (records under two whole cycles), else null. */
	shortRecord?: ReportShortRecord | null;
	/** Voltage dips, swells and interruptions (each once) with their classification; null without a voltage channel. */
	events: ReportEvents | null;
	/** The findings in plain words (what the UI, the CLI table and the printed report show). */
	findings: ReportFinding[];
	/** The thresholds the findings were judged with, each with its source. */
	thresholds: VerdictThreshold[];
}
