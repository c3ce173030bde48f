/**
 * The contract of lib/trend: options of the streaming analyser and the plain objects it returns.
 * Every time is in seconds from the first sample of the recording (not the record's trigger zero).
 */
import type { Diagnostic, Quantity } from '../capture.js';
import type { TrendFlicker } from './flicker-tracker.js';
import type { TrendHelperChannel } from './helper-link.js';

/** One channel as the analyser sees it: samples arrive through `push`, in this order. */
export interface TrendChannelSpec {
	name: string;
	quantity: Quantity;
	/** 'V', 'A' or the source's own unit text. */
	unit: string;
}

/** Event thresholds in % of the declared voltage Udin. Ref: docs/methods.md §3.4 (typical settings). */
export interface TrendThresholds {
	/** A dip starts when Urms(1/2) falls below this. Default 90. */
	dipPercent: number;
	/** A swell starts when Urms(1/2) rises above this. Default 110. */
	swellPercent: number;
	/** An interruption starts when Urms(1/2) of every voltage channel is below this. Default 5 (10 also used). */
	interruptionPercent: number;
	/** Hysteresis added to (dip, interruption) or taken from (swell) the threshold to end an event. Default 2. */
	hysteresisPercent: number;
}

export interface TrendOptions {
	sampleRateHz: number;
	channels: TrendChannelSpec[];
	/** Nominal power frequency; when absent it is taken from the first cycles (reported as an assumption). */
	nominalHz?: 50 | 60;
	/** Declared supply voltage Udin in V (line-to-neutral when the voltage channels are). Inferred if absent. */
	declaredV?: number;
	/** Where the declared voltage came from, for the report (e.g. '12.47 kV system, line-to-neutral'). */
	declaredVNote?: string;
	thresholds?: Partial<TrendThresholds>;
	/**
	 * Detect rapid voltage changes (IEC 61000-4-30 5.11) with this threshold, % of Udin (1-6 % is usual;
	 * 3.3-6 % for LV), and hysteresis (default half the threshold). Off when absent.
	 */
	rvc?: { thresholdPercent: number; hysteresisPercent?: number };
	/**
	 * Clock time of the first sample, s since 1970 (lib/trend/clock.ts reads it from the file's start
	 * time). When given, 10-min intervals and 10-s frequency values start at the clock's ticks
	 * (IEC 61000-4-30:2015, 4.5.3; from memory) and the first and last are partial; row times stay
	 * relative to the first sample. When absent, intervals count from the first sample.
	 */
	clockStartS?: number;
	/** Index of the channel whose zero crossings time the 10/12-cycle windows and frequency. Default: first voltage channel, else 0. */
	referenceChannel?: number;
	/** Seconds of the recording's start used to infer the declared voltage when none is given. Default 1. */
	inferenceS?: number;
	/** Called with every aggregate row once final (its event flag known), in time order per interval kind. */
	onRow?: (row: TrendRow) => void;
	/**
	 * Called with every Urms(1/2) value of every voltage channel as it is measured (channel index in the
	 * options' order; window start in s; value in V). For plots of a short stretch or for checks.
	 */
	onHalfCycle?: (channel: number, startS: number, rmsV: number) => void;
	/** Which rows the result keeps (memory grows with length only through these). Default: all kept. */
	keep?: { cycles10?: boolean; cycles150?: boolean; min10?: boolean };
	/**
	 * THD per channel and 10/12-cycle window (IEC 61000-4-7 synchronised DFT, lib/spectrum). Default true;
	 * false leaves thdPercent NaN and saves the DFTs.
	 */
	thd?: boolean;
	/**
	 * How each window is resampled onto the DFT grid: 'lagrange' (default; 8-point Lagrange, fast, orders
	 * up to 0.15·fs within 0.06 %, see window-thd.ts) or 'sinc' (lib/spectrum's harmonicWindow, 24-tap
	 * Kaiser sinc, exact to ~1e-6 but several times slower).
	 */
	thdMethod?: 'lagrange' | 'sinc';
	/**
	 * Also report each harmonic order 0-50 per channel and row (`harmonicsPercent`), with the 'lagrange'
	 * method. Default false (the rows stay small).
	 */
	harmonics?: boolean;
	/**
	 * Flicker per voltage channel (IEC 61000-4-15, lib/flicker): Pst per 10 minutes, Plt per 2 hours,
	 * flagged like the other aggregates. Default true; needs ≥ 1600 S/s.
	 */
	flicker?: boolean;
	/** Keep the highest Pinst of every second per voltage channel in `flicker.pinst` (for plots). Default false. */
	flickerPinst?: boolean;
	/**
	 * A second thread to share the work with (lib/trend/helper-link.ts; the front end makes it): the
	 * flickermeters and some harmonic windows run there. The result is the same to the last bit.
	 */
	helper?: TrendHelperChannel;
}

/** Aggregation interval kinds of IEC 61000-4-30 (docs/methods.md §3.2). */
export type TrendInterval = '10/12-cycle' | '150/180-cycle' | '10-min';

/** One aggregate: a value per channel (same order as the options' channels). */
export interface TrendRow {
	interval: TrendInterval;
	startS: number;
	durationS: number;
	/** Fundamental cycles of the timing reference covered (10/12 for a basic row; 150/180 for a full 3 s row). */
	cycles: number;
	/** Mean fundamental frequency over the interval: cycles / summed window durations, Hz. */
	frequencyHz: number;
	/** False for a group cut short by the end of the recording (or, for 150/180-cycle, by a 10-min tick). */
	complete: boolean;
	/** True when any part of the interval overlaps a dip, swell or interruption (docs/methods.md §3.5). */
	flagged: boolean;
	/** RMS per channel, channel's unit. Longer intervals: √(mean of the squared 10/12-cycle values). */
	rms: number[];
	/**
	 * THD per channel in % of the fundamental: harmonic subgroups 2-50 over the 10/12-cycle window (THDS,
	 * IEC 61000-4-7 as used by IEC 61000-4-30 class A, docs/methods.md §2.2; orders above fs/2 left out).
	 * NaN when not computed; longer intervals aggregate it like rms.
	 */
	thdPercent: number[];
	/**
	 * With the `harmonics` option: per channel, index = order 0-50, the harmonic subgroup in % of the
	 * fundamental's (NaN for order 0 and above fs/2); longer intervals aggregate each order like rms.
	 */
	harmonicsPercent?: number[][];
	/**
	 * With exactly three voltage channels: voltage unbalance u2 = |U2|/|U1| in % from their fundamentals
	 * (IEC 61000-4-30:2015, 5.7.2; from memory), the smaller sequence over the larger, so a reversed channel
	 * order gives the same figure; longer intervals aggregate it like rms.
	 */
	unbalancePercent?: number;
}

/** Power frequency over one 10 s interval: whole cycles / their duration (docs/methods.md §3.3). */
export interface TrendFrequencyRow {
	startS: number;
	durationS: number;
	/** NaN when the interval held no whole measured cycle (e.g. during an interruption). */
	frequencyHz: number;
	/** Whole cycles counted. */
	cycles: number;
	complete: boolean;
	flagged: boolean;
}

/** 'rvc' (rapid voltage change) only when the `rvc` option is given. */
export type TrendEventKind = 'dip' | 'swell' | 'interruption' | 'rvc';

export interface TrendEvent {
	kind: TrendEventKind;
	/** Channels that crossed the threshold during the event (all voltage channels for an interruption). */
	channels: string[];
	startS: number;
	durationS: number;
	/** Dips and interruptions: lowest Urms(1/2) on any channel during the event, V. */
	residualV?: number;
	/** Swells: highest Urms(1/2) on any channel during the event, V. */
	maximumV?: number;
	/** Rapid voltage changes: largest |Urms(1/2) − mean of the 100/120 values before| on any channel, V. */
	deltaUmaxV?: number;
	/** Rapid voltage changes: largest |steady mean after − steady mean before| on any channel, V. */
	deltaUssV?: number;
	/** residualV, maximumV or (rvc) deltaUmaxV in % of the declared voltage. */
	percentOfDeclared: number;
	/** False when the recording ended during the event (then the duration is a lower bound). */
	ended: boolean;
}

export interface TrendResult {
	sampleRateHz: number;
	nominalHz: number;
	/** Udin in V; NaN when there is no voltage channel. */
	declaredV: number;
	declaredVSource: 'given' | 'inferred' | 'none';
	thresholds: TrendThresholds;
	channels: TrendChannelSpec[];
	referenceChannel: string;
	/** Samples pushed / sample rate. */
	durationS: number;
	/** The clock time of the first sample the intervals were aligned to (the `clockStartS` option). */
	clockStartS?: number;
	cycles10: TrendRow[];
	cycles150: TrendRow[];
	min10: TrendRow[];
	frequency: TrendFrequencyRow[];
	events: TrendEvent[];
	diagnostics: Diagnostic[];
	/** With a voltage channel at ≥ 1600 S/s (and the `flicker` option not false). */
	flicker?: TrendFlicker;
}
