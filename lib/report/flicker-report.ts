/**
 * The flicker section of the analysis report: per voltage channel, Pst per complete 10-minute interval
 * and Plt per 2 hours (lib/flicker), or for a shorter record only Pinst statistics, labelled as not a
 * Pst; the IEC 61000-3-3 voltage change parameters; and, with a supply limit table, the flicker limits.
 */
import type { Capture } from '../capture.js';
import {
	createFlickermeter,
	FLICKER_MIN_SAMPLE_RATE_HZ,
	FLICKER_SETTLING_S,
	PST_INTERVAL_S,
	type FlickerResult,
} from '../flicker/index.js';
import { createHalfPeriodRms, createVoltageChangeTracker, type VoltageChange } from '../flicker/index.js';
import { evaluateFlickerLimits, type FlickerLimitEvaluation, type FlickerLimitTableId } from '../limits/flicker.js';
import { declaredVoltageFromRms } from '../trend/declared-voltage.js';
import type { ReportLimitTableId } from './types.js';
import { maxOf } from '../signal/extremes.js';

/** One voltage channel's flicker figures. */
export interface ReportFlickerChannel {
	channel: string;
	/** Lamp model of the weighting filter: '230V' (50 Hz) or '120V' (60 Hz). */
	lamp: '230V' | '120V';
	/** True when the record holds at least one complete 10-minute interval, so `pst` holds real Pst values. */
	hasPst: boolean;
	/** Short-term flicker severity per complete 10-minute interval from the first sample. */
	pst: { startS: number; durationS: number; pst: number }[];
	/** Long-term flicker severity per 12 consecutive Pst (2 hours). */
	plt: { startS: number; durationS: number; plt: number }[];
	/**
	 * Instantaneous flicker sensation over the whole record after 5 s of filter settling: highest, mean
	 * and the levels exceeded 1 %, 10 %, 50 % of the time. NOT a Pst (a Pst needs 10 minutes).
	 */
	pinst: { durationS: number; max: number; mean: number; p1: number; p10: number; p50: number };
	/** Nominal voltage the change parameters are relative to, V. */
	nominalV: number;
	/** IEC 61000-3-3 voltage changes: count and the worst of each figure (NaN when none). */
	changes: { count: number; dcMaxPercent: number; dmaxPercent: number; tmaxS: number; list: VoltageChange[] };
	/** Flicker limits of the chosen supply table and of IEC 61000-3-3 (equipment context). */
	limits: FlickerLimitEvaluation[];
}

export interface ReportFlicker {
	channels: ReportFlickerChannel[];
	/** Why flicker was not measured, or what was assumed. */
	notes: string[];
}

/** Most changes listed per channel (the worst figures always cover all of them). */
const MAX_LISTED_CHANGES = 50;
const CHUNK = 65_536;

/**
 * One voltage channel's pass through the flickermeter and the half-period RMS as the report measured it,
 * kept so the trend view's flicker (trend-flicker.ts) comes from this same pass.
 */
export interface FlickerRun {
	channel: string;
	/** Samples measured. */
	samples: number;
	/** The meter's result; null for a record within the settling time (no meter is run then). */
	result: FlickerResult | null;
	/** Half-period RMS values (IEC 61000-4-15 U_hp, lib/flicker createHalfPeriodRms): window start s, value V. */
	halfPeriod: { t: number[]; v: number[] };
	/** Un the changes are relative to, V (NaN: changes not evaluated). */
	nominalV: number;
	/** Every IEC 61000-3-3 voltage change relative to `nominalV` (the report lists the first 50). */
	changes: VoltageChange[];
}

/**
 * Flicker of every voltage channel of a capture.
 * @param nominalHz 50 or 60 (anything else: not measured, with a note)
 * @param nominalV  Un for the change parameters; else a common nominal voltage matching the channel RMS
 * @param limits    the report's limit table, when one was asked for
 */
export function flickerReport(
	capture: Capture,
	nominalHz: number | undefined,
	nominalV: number | undefined,
	limits: ReportLimitTableId | undefined,
): ReportFlicker {
	return measureFlicker(capture, nominalHz, nominalV, limits).report;
}

/**
 * `flickerReport` with each voltage channel's run beside it (`runs`, in the order of `report.channels`;
 * empty when flicker was not measured). With `keepPinstBlocks` the meters also keep the highest Pinst of
 * every second for a plot; the report's figures are the same either way. `onChannel` hears channels done.
 */
export function measureFlicker(
	capture: Capture,
	nominalHz: number | undefined,
	nominalV: number | undefined,
	limits: ReportLimitTableId | undefined,
	keepPinstBlocks = false,
	onChannel?: (done: number, total: number) => void,
): { report: ReportFlicker; runs: FlickerRun[] } {
	const voltages = capture.channels.filter((c) => c.quantity === 'voltage');
	const why = notMeasured(capture, voltages, nominalHz);
	if (why !== undefined || (nominalHz !== 50 && nominalHz !== 60))
		return { report: { channels: [], notes: [why!] }, runs: [] };
	const notes: string[] = [];
	const durationS = (voltages[0].samples.length ?? 0) / capture.sampleRateHz;
	if (durationS <= FLICKER_SETTLING_S) {
		notes.push(
			`The record is ${durationS.toFixed(1)} s long: too short for a flicker reading (the flickermeter's filters settle over the first ${FLICKER_SETTLING_S} s).`,
		);
	} else if (durationS < PST_INTERVAL_S) {
		notes.push(
			`The record is ${durationS.toFixed(1)} s long: a Pst needs 10 minutes, so only instantaneous flicker (Pinst) statistics are given. They are not a Pst.`,
		);
	}
	let un = nominalV ?? NaN;
	if (nominalV === undefined) {
		un = declaredVoltageFromRms(voltages.map((c) => rms(c.samples))).declaredV;
		notes.push(
			Number.isFinite(un)
				? `Voltage changes are relative to ${un} V, the common nominal voltage nearest the measured RMS (give the nominal voltage to set it).`
				: 'No common nominal voltage matches the measured RMS: voltage changes not evaluated (give the nominal voltage).',
		);
	}
	const runs = voltages.map((c, k) => {
		const run = flickerRun(c.name, c.samples, capture.sampleRateHz, nominalHz, un, keepPinstBlocks);
		onChannel?.(k + 1, voltages.length);
		return run;
	});
	return {
		report: { channels: runs.map((r) => flickerChannel(r, nominalHz, capture.sampleRateHz, limits)), notes },
		runs,
	};
}

/** Why flicker cannot be measured on this capture (undefined: it can). */
function notMeasured(
	capture: Capture,
	voltages: Capture['channels'],
	nominalHz: number | undefined,
): string | undefined {
	if (voltages.length === 0) return 'No voltage channel: flicker not measured.';
	if (capture.sampleRateHz < FLICKER_MIN_SAMPLE_RATE_HZ)
		return `Flicker not measured: it needs at least ${FLICKER_MIN_SAMPLE_RATE_HZ} samples per second (this record has ${capture.sampleRateHz}).`;
	if (nominalHz === 50 || nominalHz === 60) return undefined;
	const durationS = (voltages[0].samples.length ?? 0) / capture.sampleRateHz;
	const why =
		durationS <= FLICKER_SETTLING_S
			? `the record is ${durationS < 1 ? `${(durationS * 1000).toFixed(0)} ms` : `${durationS.toFixed(1)} s`} long, too short for a flicker reading`
			: 'the mains frequency (50 or 60 Hz) is not known';
	return `Flicker not measured: ${why}.`;
}

function rms(x: Float64Array): number {
	let s = 0,
		n = 0;
	// indexed, not for…of: the iterator costs several times the sum on a record of 1e7 samples
	for (let i = 0; i < x.length; i++) {
		const v = x[i];
		if (Number.isFinite(v)) {
			s += v * v;
			n++;
		}
	}
	return n > 0 ? Math.sqrt(s / n) : NaN;
}

/** One channel through the flickermeter (when longer than its settling time) and the half-period RMS, in one pass. */
function flickerRun(
	name: string,
	x: Float64Array,
	fs: number,
	nominalHz: 50 | 60,
	un: number,
	keepPinstBlocks: boolean,
): FlickerRun {
	// a record within the settling time gives no Pinst at all: skip the meter (and its 256 KB of class tables)
	const meter =
		x.length / fs > FLICKER_SETTLING_S ? createFlickermeter({ sampleRateHz: fs, nominalHz, keepPinstBlocks }) : null;
	const uhp: number[] = [];
	const times: number[] = [];
	const half = createHalfPeriodRms(fs, nominalHz, (t, v) => (times.push(t), uhp.push(v)));
	for (let off = 0; off < x.length; off += CHUNK) {
		const chunk = x.subarray(off, Math.min(x.length, off + CHUNK));
		meter?.push(chunk);
		half.push(chunk);
	}
	const changes: VoltageChange[] = [];
	if (Number.isFinite(un) && un > 0) {
		const tracker = createVoltageChangeTracker(un, nominalHz);
		for (let k = 0; k < uhp.length; k++) tracker.push(times[k], uhp[k]);
		changes.push(...tracker.finish());
	}
	const result = meter?.finish() ?? null;
	return { channel: name, samples: x.length, result, halfPeriod: { t: times, v: uhp }, nominalV: un, changes };
}

/** The report's figures of one channel's run: Pst, Plt, Pinst statistics, changes and the flicker limits. */
function flickerChannel(
	run: FlickerRun,
	nominalHz: 50 | 60,
	fs: number,
	limits: ReportLimitTableId | undefined,
): ReportFlickerChannel {
	const r = run.result ?? {
		lamp: nominalHz === 50 ? ('230V' as const) : ('120V' as const),
		pst: [],
		plt: [],
		pinst: { durationS: run.samples / fs, max: NaN, mean: NaN, p1: NaN, p10: NaN, p50: NaN },
	};
	const list = run.changes;
	const worst = (f: (v: VoltageChange) => number) => {
		const v = list.map(f).filter(Number.isFinite);
		return v.length ? maxOf(v) : NaN;
	};
	const pst = r.pst.map((p) => ({ startS: p.startS, durationS: p.durationS, pst: p.pst }));
	const measured = {
		pst: pst.map((p) => p.pst),
		plt: r.plt.map((p) => p.plt),
		dcPercent: list.map((v) => v.dcPercent),
		dmaxPercent: list.map((v) => v.dmaxPercent),
		tmaxS: list.map((v) => v.tmaxS),
	};
	const tables: FlickerLimitTableId[] =
		limits === 'en50160' || limits === 'iec61000-2-2' ? [limits, 'iec61000-3-3'] : [];
	return {
		channel: run.channel,
		lamp: r.lamp,
		hasPst: pst.length > 0,
		pst,
		plt: r.plt,
		pinst: r.pinst,
		nominalV: run.nominalV,
		changes: {
			count: list.length,
			dcMaxPercent: worst((v) => v.dcPercent),
			dmaxPercent: worst((v) => v.dmaxPercent),
			tmaxS: worst((v) => v.tmaxS),
			list: list.slice(0, MAX_LISTED_CHANGES),
		},
		limits: tables.map((t) => evaluateFlickerLimits(t, measured)),
	};
}
