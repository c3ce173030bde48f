/**
 * The window clock of the trend analyser: from the rising zero crossings of the timing reference it cuts
 * the gapless 10/12-cycle windows (edges at interpolated crossings), infers the nominal frequency when
 * none is given, and restarts the window series at each 10-minute tick (on the wall clock when the
 * recording's start time is known, else counted from the first sample): the window holding the tick
 * completes, and the next one starts at the first cycle at or after the tick, so the two overlap.
 *
 * Ref: IEC 61000-4-30:2015, 4.4 (10/12-cycle basic window), 4.5.2-4.5.3 (resynchronisation at the
 * 10-minute tick) (from memory); docs/methods.md §3.2.
 */
import type { Diagnostic } from '../capture.js';
import { basicWindowCycles } from '../spectrum/harmonics.js';
import { FREQUENCY_INTERVAL_S, secondsPastTick, TEN_MIN_S } from './clock.js';

/** Rising boundaries remembered: more than the 12 cycles of a window, for the restart at a tick. */
const BOUNDARY_LOG = 64;

/**
 * Rising crossings measured to tell 50 from 60 Hz: 5 crossings span 4 cycles, 80 or 67 ms (common
 * practice: a few cycles are enough to tell the two mains frequencies apart).
 */
const NOMINAL_CROSSINGS = 5;

/** A closed window of whole cycles: samples [start, end), crossing times startT..endT (samples, interpolated). */
export interface WindowSpan {
	start: number;
	end: number;
	startT: number;
	endT: number;
}

/** Length and place of a clock's ticks in samples: `offset` is how far past a tick sample 0 lies. */
export interface TickGrid {
	length: number;
	offset: number;
}

/**
 * The tick grid of `periodS` at `sampleRateHz`, aligned to the clock when `clockStartS` (clock time of
 * the first sample) is given, else starting at sample 0.
 * @example tickGrid(600, 10_000, 1777884261.051) // { length: 6e6, offset: 2_610_510 } (08:44:21.051 is 261.051 s past 08:40)
 */
export function tickGrid(periodS: number, sampleRateHz: number, clockStartS: number | undefined): TickGrid {
	const length = Math.round(periodS * sampleRateHz);
	const offset =
		clockStartS === undefined ? 0 : Math.round(secondsPastTick(clockStartS, periodS) * sampleRateHz) % length;
	return { length, offset };
}

/** The 10-minute and 10-s grids of a recording. Ref: IEC 61000-4-30:2015, 4.5.3 and 5.1.2 (from memory). */
export function recordingTicks(
	sampleRateHz: number,
	clockStartS: number | undefined,
): { tenMinutes: TickGrid; frequency: TickGrid } {
	return {
		tenMinutes: tickGrid(TEN_MIN_S, sampleRateHz, clockStartS),
		frequency: tickGrid(FREQUENCY_INTERVAL_S, sampleRateHz, clockStartS),
	};
}

export class WindowClock {
	/** Windows cut and not yet measured, oldest first (the analyser measures them once their samples are in). */
	readonly windows: WindowSpan[] = [];
	nominalHz: 50 | 60 | undefined;
	cyclesPerWindow: number;
	private readonly logIdx = new Float64Array(BOUNDARY_LOG);
	private readonly logT = new Float64Array(BOUNDARY_LOG);
	/** Index of the newest rising boundary (−1: none yet) and of the first boundary of the open window. */
	private seq = -1;
	private ws = 0;
	private nextTick: number;
	private readonly nomTimes: number[] = [];

	constructor(
		private readonly sampleRateHz: number,
		nominalHz: 50 | 60 | undefined,
		private readonly ticks: TickGrid,
		private readonly diagnostics: Diagnostic[],
	) {
		this.nominalHz = nominalHz;
		this.cyclesPerWindow = basicWindowCycles(nominalHz);
		this.nextTick = ticks.length - ticks.offset;
	}

	/** Whether any rising boundary was seen. */
	get anyBoundary(): boolean {
		return this.seq >= 0;
	}

	/** Cycles since the last window closed (they do not fill a window at the end of the recording). */
	get cyclesOpen(): number {
		return this.seq >= this.ws ? this.seq - this.ws : 0;
	}

	/** Number of the 10-minute tick interval holding sample `start` (0 for the first, partial or not). */
	tickOf(start: number): number {
		return Math.floor((start + this.ticks.offset) / this.ticks.length);
	}

	/** A rising boundary at sample `index`, crossing time `t` (samples, interpolated); forced = free-run. */
	rising(index: number, t: number, forced: boolean): void {
		this.seq++;
		const seq = this.seq;
		this.logIdx[seq % BOUNDARY_LOG] = index;
		this.logT[seq % BOUNDARY_LOG] = t;
		if (this.nominalHz === undefined && !this.inferNominal(t, forced)) return;
		if (seq - this.ws < this.cyclesPerWindow) return;
		const start = this.logIdx[this.ws % BOUNDARY_LOG];
		this.windows.push({ start, end: index, startT: this.logT[this.ws % BOUNDARY_LOG], endT: t });
		this.ws = seq;
		const len = this.ticks.length;
		while (this.nextTick <= start) this.nextTick += len;
		if (start < this.nextTick && this.nextTick <= index) {
			// 10-min tick inside this window: restart the series at the first cycle at or after the tick
			let k = seq;
			while (k - 1 > seq - BOUNDARY_LOG && k - 1 >= 0 && this.logIdx[(k - 1) % BOUNDARY_LOG] >= this.nextTick) k--;
			this.ws = k;
			this.nextTick += len;
		}
	}

	/** Collects crossings until 50 or 60 Hz can be told; true once known (windows start then). */
	private inferNominal(t: number, forced: boolean): boolean {
		const times = this.nomTimes;
		if (forced) times.length = 0;
		else times.push(t);
		if (times.length < NOMINAL_CROSSINGS) return false;
		const cycles = NOMINAL_CROSSINGS - 1;
		const f = (cycles * this.sampleRateHz) / (times[cycles] - times[0]);
		const nominalHz = Math.abs(f - 50) <= Math.abs(f - 60) ? 50 : 60;
		this.nominalHz = nominalHz;
		this.cyclesPerWindow = basicWindowCycles(nominalHz);
		this.diagnostics.push({
			code: 'nominal-frequency-inferred',
			severity: 'assumption',
			message: `Nominal frequency taken as ${nominalHz} Hz from the first cycles (${f.toFixed(2)} Hz measured); 10/12-cycle windows use ${this.cyclesPerWindow} cycles.`,
		});
		this.ws = Math.max(0, this.seq - BOUNDARY_LOG + 1);
		return true;
	}

	/** At the end: the nominal frequency, 50 Hz (with a warning) when it could not be told. */
	finishNominal(): 50 | 60 {
		if (this.nominalHz === undefined) {
			this.nominalHz = 50;
			this.diagnostics.push({
				code: 'nominal-frequency-unknown',
				severity: 'warning',
				message: 'Too few zero crossings to tell 50 from 60 Hz; 50 Hz assumed.',
			});
		}
		return this.nominalHz;
	}
}
