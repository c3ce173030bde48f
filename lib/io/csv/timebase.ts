/**
 * The time base from a time (or sample-number) column: uniform sampling when every stamp lies within
 * `jitterTolerance` sample intervals of a straight-line grid, else an explicit time base with the
 * irregular steps and gaps reported. Nothing is resampled. Rates stated in the preamble are compared
 * with the column: an integer ratio means a decimated export.
 */
import type { Diagnostic } from '../../capture.js';

export interface TimeBase {
	sampleRateHz: number;
	startS: number;
	timeS?: Float64Array;
	diagnostics: Diagnostic[];
}

export interface TimeFacts {
	/** Column name for messages. */
	name: string;
	/** 1-based line of the first data row, and whether rows map to lines one to one (no blank lines). */
	bodyLine: number;
	rowsAreLines: boolean;
	jitterTolerance: number;
	/** Resolution of the printed stamps in s: rounding to it moves a stamp by up to half of it. */
	resolutionS?: number;
	statedSampleRateHz?: number;
	repeatedTimes: number;
	firstRepeatLine: number;
}

/**
 * @param t  time stamps in s, non-decreasing (checked by the scanner); used as `timeS` when irregular
 */
export function timeBaseFromColumn(t: Float64Array, facts: TimeFacts): TimeBase {
	const n = t.length;
	const diagnostics: Diagnostic[] = [];
	const say = (code: string, message: string, severity: Diagnostic['severity'], line?: number) =>
		diagnostics.push(line === undefined ? { code, message, severity } : { code, message, severity, line });
	const lineOf = (row: number) => (facts.rowsAreLines ? facts.bodyLine + row : undefined);
	const span = t[n - 1] - t[0];
	const stated = facts.statedSampleRateHz;
	if (n < 2 || !(span > 0)) {
		const fs = stated ?? NaN;
		if (!(fs > 0)) return { sampleRateHz: NaN, startS: t[0] ?? 0, diagnostics };
		return { sampleRateHz: fs, startS: t[0] ?? 0, diagnostics };
	}
	const dtMed = medianStep(t);
	const { gaps, firstGap, largestGap } = gapsOf(t, dtMed);
	if (facts.repeatedTimes > 0) diagnostics.push(repeatNote(facts.repeatedTimes, facts.firstRepeatLine, n));
	// a step that is a whole number of printed digits within rounding error is taken as exactly that
	// (1e-3 s rather than 1.0000000034e-3 s from summing clock readings)
	const res = facts.resolutionS ?? 0;
	const dtRaw = span / (n - 1);
	const dtSnap = res > 0 ? Math.round(dtRaw / res) * res : dtRaw;
	const dtFit = dtSnap > 0 && Math.abs(dtSnap - dtRaw) <= 1e-6 * dtRaw ? dtSnap : dtRaw;
	const tol = facts.jitterTolerance;
	const halfRes = (facts.resolutionS ?? 0) / 2;
	// deviation from the grid beyond what printing the stamps to their resolution explains, per interval
	const gridDeviation = (dt: number) => {
		let worst = 0;
		for (let i = 0; i < n; i++) {
			const d = Math.abs(t[i] - (t[0] + i * dt));
			if (d > worst) worst = d;
		}
		return Math.max(0, worst - halfRes * (1 + 1e-9)) / dt;
	};
	if (gaps === 0 && facts.repeatedTimes === 0) {
		const devStated = stated ? gridDeviation(1 / stated) : Infinity;
		const devFit = devStated <= tol ? devStated : gridDeviation(dtFit);
		if (devStated <= tol || devFit <= tol) {
			const fs = devStated <= tol ? stated! : 1 / dtFit;
			say(
				'uniform-time',
				`Time column "${facts.name}": ${n} samples evenly spaced at ${round(fs)} Hz${devStated <= tol ? ' (as the preamble/options state)' : ''}, every stamp within ${pct(Math.min(devStated, devFit))} of a sample interval of the grid${halfRes > 0 ? ' beyond the rounding of the printed digits' : ''} (tolerance ${pct(tol)}).`,
				'info',
			);
			if (devStated > tol && stated) compareStated(stated, fs, say);
			return { sampleRateHz: fs, startS: t[0], diagnostics };
		}
		say(
			'irregular-time',
			`Time column "${facts.name}" is not evenly spaced: a stamp lies ${pct(gridDeviation(dtFit))} of a sample interval off the uniform grid (tolerance ${pct(tol)}); the time stamps are kept as they are, not resampled.`,
			'warning',
		);
	}
	if (gaps > 0) {
		say(
			'time-gaps',
			`Time column "${facts.name}" has ${gaps} gap(s) longer than ${GAP_STEPS} sample intervals (${round(dtMed * 1e3)} ms); the first before line ${lineOf(firstGap) ?? `row ${firstGap + 1}`} at ${round(t[firstGap - 1])} s, the longest ${round(largestGap * 1e3)} ms. The time stamps are kept as they are, not resampled.`,
			'warning',
			lineOf(firstGap),
		);
	}
	const fs = (n - 1) / span;
	if (stated) compareStated(stated, 1 / dtMed, say);
	return { sampleRateHz: fs, startS: t[0], timeS: t, diagnostics };
}

/** Steps probed for the median step (evenly spread; enough for a stable median, bounded work). */
const MEDIAN_PROBE_STEPS = 4096;
/** A step longer than this many median steps is a gap (a missing sample makes 2). */
const GAP_STEPS = 1.5;

/** Median step over (up to) MEDIAN_PROBE_STEPS evenly spread steps, ignoring repeats (min/max row pairs). */
function medianStep(t: Float64Array): number {
	const n = t.length;
	const probe: number[] = [];
	const stride = Math.max(1, Math.floor((n - 1) / MEDIAN_PROBE_STEPS));
	for (let i = 1; i < n; i += stride) if (t[i] > t[i - 1]) probe.push(t[i] - t[i - 1]);
	probe.sort((a, b) => a - b);
	return probe[probe.length >> 1];
}

/** Steps longer than GAP_STEPS median steps: how many, the row after the first, the longest. */
function gapsOf(t: Float64Array, dtMed: number): { gaps: number; firstGap: number; largestGap: number } {
	let gaps = 0;
	let firstGap = -1;
	let largestGap = 0;
	for (let i = 1; i < t.length; i++) {
		const step = t[i] - t[i - 1];
		if (step > GAP_STEPS * dtMed) {
			if (gaps++ === 0) firstGap = i;
			if (step > largestGap) largestGap = step;
		}
	}
	return { gaps, firstGap, largestGap };
}

/** Rows repeating the previous stamp: min/max row pairs when about every other row repeats, else a count. */
function repeatNote(repeatedTimes: number, firstRepeatLine: number, n: number): Diagnostic {
	const pairs = repeatedTimes * 2 >= n - 1;
	return {
		code: pairs ? 'min-max-rows' : 'repeated-times',
		message: pairs
			? `Time stamps come in pairs (${repeatedTimes} repeats): the export holds a min and a max row per time step (peak detect), not single samples.`
			: `${repeatedTimes} row(s) repeat the previous time stamp, first at line ${firstRepeatLine}.`,
		severity: 'warning',
		line: firstRepeatLine,
	};
}

function compareStated(
	stated: number,
	measured: number,
	say: (code: string, message: string, severity: Diagnostic['severity']) => void,
): void {
	const r = stated / measured;
	if (Math.abs(r - 1) < 0.01) return;
	const k = Math.round(r);
	if (k >= 2 && Math.abs(r - k) < 0.01 * k)
		say(
			'decimated',
			`The time steps are ${k} times the stated sample interval (${round(stated)} Hz stated, ${round(measured)} Hz in the data): the export was decimated (every ${k}th sample kept). The data's own rate is used.`,
			'warning',
		);
	else
		say(
			'rate-mismatch',
			`The stated sample rate (${round(stated)} Hz) disagrees with the time column (${round(measured)} Hz); the time column is used.`,
			'warning',
		);
}

function round(x: number): string {
	return Number(x.toPrecision(6)).toString();
}

/** A fraction as a percentage rounded to its meaning: 3 significant digits, and "under 0.01%" for rounding-level values. */
function pct(x: number): string {
	const p = x * 100;
	if (p === 0) return '0%';
	if (Math.abs(p) < 0.01) return 'under 0.01%';
	return `${Number(p.toPrecision(3))}%`;
}
