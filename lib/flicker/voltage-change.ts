/**
 * IEC 61000-3-3 voltage change parameters from half-cycle RMS values: the relative steady-state voltage
 * change dc, the maximum relative voltage change dmax, and the time the relative voltage change d(t)
 * stays beyond 3.3 % during one change (Tmax). Streaming: push one Urms(1/2) at a time.
 *
 * Definitions (Ref: IEC 61000-4-15:2010, 3.1 and IEC 61000-3-3:2013, 3 and 5; from memory):
 * - steady state: at least one second of consecutive half-cycle RMS values (100 at 50 Hz, 120 at 60 Hz)
 *   that all stay within a band of ±0.2 % of the nominal voltage Un (max − min ≤ 0.4 % of Un);
 *   its voltage Uss is the mean of those values;
 * - a voltage change characteristic: the half-cycle values between two steady states;
 * - d(t) = (Uss,before − Urms(1/2)(t)) / Un during the change characteristic (positive for a drop);
 * - dmax = max |d(t)|; dc = |Uss,after − Uss,before| / Un; Tmax = time with |d(t)| > 3.3 %.
 */
import { maxOf, minOf } from '../signal/extremes.js';

/** Band and duration of a steady state. Ref: IEC 61000-4-15:2010, 3.1 (from memory). */
export const STEADY_STATE_BAND_PERCENT = 0.2;
export const STEADY_STATE_S = 1;
/** The d(t) level whose exceedance time is limited. Ref: IEC 61000-3-3:2013, 5.2 (from memory). */
export const D_T_LEVEL_PERCENT = 3.3;

/** One voltage change characteristic, times in s (as given with the half-cycle values). */
export interface VoltageChange {
	startS: number;
	durationS: number;
	/** Steady voltage before the change, V. */
	ussBeforeV: number;
	/** Steady voltage after it, V; NaN when the record ended before a new steady state. */
	ussAfterV: number;
	/** |Uss,after − Uss,before| / Un, %; NaN when no steady state followed. */
	dcPercent: number;
	/** max |d(t)|, % of Un. */
	dmaxPercent: number;
	/** Time with |d(t)| > 3.3 % during this change, s. */
	tmaxS: number;
	/** False when the record ended during the change. */
	ended: boolean;
}

export interface VoltageChangeTracker {
	/** One half-cycle RMS value (V) whose window starts at `startS`. */
	push(startS: number, rmsV: number): void;
	/** Ends the record; returns every change found. */
	finish(): VoltageChange[];
}

/**
 * Tracks voltage changes of one channel from its half-cycle RMS values.
 *
 * @param nominalV  Un, V (> 0)
 * @param nominalHz 50 or 60: sets the half-cycle length and the 100/120-value steady-state run
 * @throws RangeError for a non-positive nominal voltage
 * @example a 230 V supply stepping to 222 V and staying there gives one change with dc ≈ 3.48 %.
 */
export function createVoltageChangeTracker(nominalV: number, nominalHz: 50 | 60): VoltageChangeTracker {
	if (!(nominalV > 0) || !Number.isFinite(nominalV))
		throw new RangeError(`nominal voltage must be > 0 V, got ${nominalV}`);
	return new Tracker(nominalV, nominalHz);
}

interface Pending {
	startS: number;
	ussBeforeV: number;
	dmaxV: number;
	overS: number;
	lastS: number;
}

class Tracker implements VoltageChangeTracker {
	private readonly need: number;
	private readonly bandV: number;
	private readonly halfS: number;
	private readonly runV: number[] = [];
	private readonly runT: number[] = [];
	private steady: { sum: number; count: number; min: number; max: number; startS: number } | null = null;
	private lastUss = NaN;
	private change: Pending | null = null;
	/** A change whose following steady state is still running (its dc needs that state's mean). */
	private awaitingAfter: Pending | null = null;
	private readonly out: VoltageChange[] = [];

	constructor(
		private readonly un: number,
		nominalHz: 50 | 60,
	) {
		this.need = Math.round(2 * nominalHz * STEADY_STATE_S);
		this.bandV = (2 * STEADY_STATE_BAND_PERCENT * un) / 100;
		this.halfS = 1 / (2 * nominalHz);
	}

	push(startS: number, rmsV: number): void {
		if (!Number.isFinite(rmsV)) return;
		const s = this.steady;
		if (s) {
			if (Math.max(s.max, rmsV) - Math.min(s.min, rmsV) <= this.bandV) {
				s.sum += rmsV;
				s.count++;
				s.min = Math.min(s.min, rmsV);
				s.max = Math.max(s.max, rmsV);
				return;
			}
			this.endSteady();
			this.change = { startS, ussBeforeV: this.lastUss, dmaxV: 0, overS: 0, lastS: startS };
		}
		this.runV.push(rmsV);
		this.runT.push(startS);
		this.trimRun();
		if (this.runV.length >= this.need) this.beginSteady();
	}

	/** Drops values from the front of the candidate run until it fits the band; dropped values belong to the change. */
	private trimRun(): void {
		let lo = minOf(this.runV),
			hi = maxOf(this.runV);
		while (hi - lo > this.bandV) {
			const v = this.runV.shift()!,
				t = this.runT.shift()!;
			this.account(t, v);
			lo = minOf(this.runV);
			hi = maxOf(this.runV);
		}
	}

	private account(t: number, v: number): void {
		const c = this.change;
		if (!c) return; // before the first steady state there is no reference
		const dev = Math.abs(c.ussBeforeV - v);
		if (dev > c.dmaxV) c.dmaxV = dev;
		if ((100 * dev) / this.un > D_T_LEVEL_PERCENT) c.overS += this.halfS;
		c.lastS = t + this.halfS;
	}

	private beginSteady(): void {
		let sum = 0;
		for (const v of this.runV) sum += v;
		this.steady = { sum, count: this.runV.length, min: minOf(this.runV), max: maxOf(this.runV), startS: this.runT[0] };
		if (this.change) {
			this.change.lastS = this.runT[0];
			this.awaitingAfter = this.change;
			this.change = null;
		}
		this.runV.length = 0;
		this.runT.length = 0;
	}

	private endSteady(): void {
		const s = this.steady!;
		this.lastUss = s.sum / s.count;
		if (this.awaitingAfter) this.emit(this.awaitingAfter, this.lastUss, true);
		this.awaitingAfter = null;
		this.steady = null;
	}

	private emit(c: Pending, ussAfterV: number, ended: boolean): void {
		const u = this.un;
		this.out.push({
			startS: c.startS,
			durationS: c.lastS - c.startS,
			ussBeforeV: c.ussBeforeV,
			ussAfterV,
			dcPercent: (100 * Math.abs(ussAfterV - c.ussBeforeV)) / u,
			dmaxPercent: (100 * c.dmaxV) / u,
			tmaxS: c.overS,
			ended,
		});
	}

	finish(): VoltageChange[] {
		if (this.steady) this.endSteady();
		else if (this.change) {
			for (let k = 0; k < this.runV.length; k++) this.account(this.runT[k], this.runV[k]);
			this.emit(this.change, NaN, false);
			this.change = null;
		}
		return this.out;
	}
}
