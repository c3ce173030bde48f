/**
 * The time column of a streamed CSV, checked as it passes: the sample rate from the first rows (as
 * `timeBaseFromColumn` finds it for a whole file), then every later step against that rate. Only counts
 * and the first places are kept, so memory does not grow with the file. Each block of rows is first
 * bounded (its smallest and largest step) and read step by step only when a bound is out of band, which
 * gives the same counts and places as reading every step.
 */
import type { Diagnostic } from '../../capture.js';
import { timeBaseFromColumn } from './timebase.js';

export interface StreamTimeFacts {
	/** Column name for messages. */
	name: string;
	/** 1-based line of the first data row. */
	bodyLine: number;
	/** Largest step error taken as even sampling, as a fraction of the sample interval. */
	jitterTolerance: number;
	/** Resolution of the printed stamps in s. */
	resolutionS?: number;
	statedSampleRateHz?: number;
}

/**
 * Rows whose steps are bounded first (the smallest and largest step, a loop without branches) and read
 * one by one only when a bound is out of band: a loop that tests each step is several times slower.
 */
const CHECK_BLOCK_ROWS = 1024;

/** The smallest and largest step t[i] − t[i − 1] into t[a, b), t[a − 1] being `prev` (NaN steps left out). */
function stepRange(t: Float64Array, a: number, b: number, prev: number): { lo: number; hi: number } {
	let lo = Infinity;
	let hi = -Infinity;
	for (let i = a; i < b; i++) {
		const step = t[i] - prev;
		lo = step < lo ? step : lo;
		hi = step > hi ? step : hi;
		prev = t[i];
	}
	return { lo, hi };
}

export class StreamTimeCheck {
	/** The rate the samples are handed on at, Hz. */
	readonly sampleRateHz: number;
	/** What the first rows showed (uniform, irregular, gaps), and how the rate was chosen. */
	readonly startDiagnostics: Diagnostic[];
	private readonly dt: number;
	private readonly slack: number;
	private readonly firstT: number;
	private prevT: number;
	private seen: number;
	private gaps = 0;
	private firstGapRow = -1;
	private firstGapAtS = 0;
	private largestGapS = 0;
	private offSteps = 0;
	private firstOffRow = -1;
	private worstOff = 0;
	private readonly probeGaps: boolean;

	/** @param probe  the first rows' times in s (non-decreasing, checked by the scanner) */
	constructor(
		probe: Float64Array,
		private readonly facts: StreamTimeFacts,
	) {
		const n = probe.length;
		const tb = timeBaseFromColumn(probe, { ...facts, rowsAreLines: true, repeatedTimes: 0, firstRepeatLine: 0 });
		this.startDiagnostics = [...tb.diagnostics];
		this.probeGaps = tb.diagnostics.some((d) => d.code === 'time-gaps');
		let rate = tb.sampleRateHz;
		if (tb.timeS) {
			rate = 1 / medianStep(probe);
			this.startDiagnostics.push({
				code: 'time-base-treated-uniform',
				severity: 'warning',
				message: `The samples are handed on as evenly spaced at ${round(rate)} Hz, the median step of the first ${n} rows; the time stamps are checked, not followed.`,
			});
		}
		this.startDiagnostics.push({
			code: 'rate-from-first-rows',
			severity: 'info',
			message: `The sample rate (${round(rate)} Hz) was taken from the first ${n} rows; every later time step is checked against it.`,
		});
		this.sampleRateHz = rate;
		this.dt = 1 / rate;
		this.slack = facts.jitterTolerance * this.dt + (facts.resolutionS ?? 0);
		this.firstT = n > 0 ? probe[0] : NaN;
		this.prevT = n > 0 ? probe[n - 1] : NaN;
		this.seen = n;
	}

	/** Checks the steps into t[from, to) (seconds, same origin as the probe). */
	rows(t: Float64Array, from: number, to: number): void {
		const dt = this.dt;
		const gapAbove = 1.5 * dt;
		for (let a = from; a < to; a += CHECK_BLOCK_ROWS) {
			const b = Math.min(to, a + CHECK_BLOCK_ROWS);
			const { lo, hi } = stepRange(t, a, b, this.prevT);
			// Rounding is monotone, so every step s of the block has lo − dt <= s − dt <= hi − dt: when these
			// bounds are within the slack and hi is no gap, no step of the block is off or a gap.
			if (hi > gapAbove || hi - dt > this.slack || lo - dt < -this.slack) this.checkSteps(t, a, b, from);
			this.prevT = t[b - 1];
		}
		this.seen += to - from;
	}

	/** The steps into t[a, b) one by one (a block with a step out of band); `from` is row `seen` of the file. */
	private checkSteps(t: Float64Array, a: number, b: number, from: number): void {
		const dt = this.dt;
		const gapAbove = 1.5 * dt;
		let prev = this.prevT;
		for (let i = a; i < b; i++) {
			const step = t[i] - prev;
			if (step > gapAbove) {
				if (this.gaps++ === 0) {
					this.firstGapRow = this.seen + i - from;
					this.firstGapAtS = prev;
				}
				if (step > this.largestGapS) this.largestGapS = step;
			} else if (step !== 0 && Math.abs(step - dt) > this.slack) {
				if (this.offSteps++ === 0) this.firstOffRow = this.seen + i - from;
				const off = Math.abs(step - dt) / dt;
				if (off > this.worstOff) this.worstOff = off;
			}
			prev = t[i];
		}
	}

	/** What the later rows showed; `rowsAreLines` when row k sits on line bodyLine + k (no blank lines). */
	finish(rowsAreLines: boolean): Diagnostic[] {
		const f = this.facts;
		const out: Diagnostic[] = [];
		const place = (row: number) => (rowsAreLines ? `line ${f.bodyLine + row}` : `data row ${row + 1}`);
		const line = (row: number) => (rowsAreLines ? { line: f.bodyLine + row } : {});
		if (this.gaps > 0) {
			out.push({
				code: 'time-gaps',
				severity: 'warning',
				...line(this.firstGapRow),
				message: `Time column "${f.name}" has ${this.gaps} gap(s) longer than 1.5 sample intervals, the first before ${place(this.firstGapRow)} after ${round(this.firstGapAtS)} s, the longest ${round(this.largestGapS)} s; the samples on either side are joined as if evenly spaced (times after a gap are early by its length).`,
			});
		}
		if (this.offSteps > 0) {
			out.push({
				code: 'irregular-time',
				severity: 'warning',
				...line(this.firstOffRow),
				message: `Time column "${f.name}": ${this.offSteps} step(s) differ from the ${round(this.dt * 1e3)} ms sample interval by more than ${pct(f.jitterTolerance)} of it (the worst by ${pct(this.worstOff)}), the first at ${place(this.firstOffRow)}; the samples are taken as evenly spaced.`,
			});
		}
		const span = this.prevT - this.firstT;
		if (this.seen > 1 && span > 0 && this.gaps === 0 && !this.probeGaps) {
			const meanHz = (this.seen - 1) / span;
			if (Math.abs(meanHz * this.dt - 1) > 1e-3)
				out.push({
					code: 'rate-mismatch',
					severity: 'warning',
					message: `Over the whole file the time stamps give ${round(meanHz)} Hz; the samples were taken at ${round(this.sampleRateHz)} Hz from the first rows, so times late in the file are off by up to ${round(Math.abs(span - (this.seen - 1) * this.dt))} s.`,
				});
		}
		return out;
	}
}

function medianStep(t: Float64Array): number {
	const steps: number[] = [];
	for (let i = 1; i < t.length; i++) if (t[i] > t[i - 1]) steps.push(t[i] - t[i - 1]);
	steps.sort((a, b) => a - b);
	return steps.length > 0 ? steps[steps.length >> 1] : NaN;
}

function round(x: number): string {
	return Number(x.toPrecision(6)).toString();
}

function pct(x: number): string {
	return `${Number((x * 100).toPrecision(3))}%`;
}
