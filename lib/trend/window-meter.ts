/**
 * Measures one 10/12-cycle window on every channel, straight from the channels' ring buffers: RMS over
 * exactly the crossing times startT..endT (the two edge samples count by the part of them inside the
 * window), THD (window-thd.ts, or lib/spectrum's exact resampler with thdMethod 'sinc'), optionally each
 * harmonic order, and with exactly three voltage channels the unbalance of their fundamentals.
 *
 * Ref: IEC 61000-4-30:2015, 4.4 (10/12-cycle value), 5.7.2 (unbalance), IEC 61000-4-7:2002 (harmonic
 * subgroups) (from memory); docs/methods.md §2.2, §3.2, §7.
 */
import { harmonicWindow, MAX_HARMONIC_ORDER } from '../spectrum/harmonics.js';
import { addSquares } from './crossing-tracker.js';
import { TREND_MAX_ORDER, WindowThd, type WindowThdOut } from './window-thd.js';
import { windowUnbalancePercent } from './window-unbalance.js';
import { unpackWindow } from './helper-link.js';
import type { TrendOptions, TrendRow } from './types.js';
import type { WindowSpan } from './window-clock.js';

/** Samples beyond each end of a window kept for the resampling kernels (8-point Lagrange, 24-tap sinc). */
export const WINDOW_PAD = 16;

export interface WindowMeterOptions {
	sampleRateHz: number;
	/** One ring buffer per channel (power-of-two length; sample j at j & (length − 1)). */
	rings: Float64Array[];
	/** Channel indices of the voltage channels, in order. */
	voltage: number[];
	thd?: TrendOptions['thd'];
	thdMethod?: TrendOptions['thdMethod'];
	harmonics?: TrendOptions['harmonics'];
}

export class WindowMeter {
	readonly wantThd: boolean;
	/** Channel windows whose RMS was not finite, and where the first was. */
	nonFiniteWindows = 0;
	firstNonFinite = { channel: 0, startS: 0 };
	private readonly sinc: boolean;
	private readonly lagrange: boolean;
	private readonly scratch: Float64Array | undefined;
	/** What window-thd.ts fills per window (THD, orders, fundamentals), reused. */
	private readonly fastOut: WindowThdOut;
	/** Fundamental bins (re, im) of the three voltage channels, for the unbalance. */
	private readonly phasors: Float64Array | undefined;
	private fastThd: WindowThd | undefined;
	private readonly mask: number;

	/** @throws RangeError for an unknown thdMethod */
	constructor(private readonly o: WindowMeterOptions) {
		const method = o.thdMethod ?? 'lagrange';
		if (method !== 'lagrange' && method !== 'sinc')
			throw new RangeError(`thdMethod must be 'lagrange' or 'sinc', got ${method}`);
		const ringLen = o.rings[0].length;
		this.mask = ringLen - 1;
		this.wantThd = o.thd ?? true;
		this.sinc = this.wantThd && method === 'sinc';
		const lagrange = (this.lagrange = this.wantThd && method === 'lagrange');
		this.scratch = this.sinc ? new Float64Array(ringLen) : undefined;
		const nCh = o.rings.length;
		// Unbalance per window from the fundamentals of exactly three voltage channels (IEC 61000-4-30:2015,
		// 5.7.2; from memory): u2 = |U2| / |U1| in the channels' order, the smaller over the larger sequence.
		this.phasors = lagrange && o.voltage.length === 3 ? new Float64Array(6) : undefined;
		this.fastOut = {
			thd: new Float64Array(nCh).fill(NaN),
			harmonics:
				lagrange && o.harmonics === true ? o.rings.map(() => new Float64Array(TREND_MAX_ORDER + 1)) : undefined,
			fundamentals: this.phasors ? new Float64Array(2 * nCh) : undefined,
		};
	}

	/**
	 * The row of window `w` (`samples` pushed so far) of `cycles` cycles, unflagged. With `later`, the
	 * harmonic figures are left out (THD NaN) for `complete` to add from a helper's result.
	 */
	measure(w: WindowSpan, cycles: number, samples: number, later = false): TrendRow {
		const nCh = this.o.rings.length;
		const fs = this.o.sampleRateHz;
		const lengthT = w.endT - w.startT;
		const rms: number[] = new Array(nCh);
		const thd: number[] = new Array(nCh);
		for (let c = 0; c < nCh; c++) {
			rms[c] = this.rms(c, w.startT, w.endT);
			if (!Number.isFinite(rms[c]) && this.nonFiniteWindows++ === 0)
				this.firstNonFinite = { channel: c, startS: w.startT / fs };
		}
		for (let c = 0; c < nCh; c++) thd[c] = this.sinc ? this.sincThd(c, w, cycles, samples) : NaN;
		const row: TrendRow = {
			interval: '10/12-cycle',
			startS: w.startT / fs,
			durationS: lengthT / fs,
			cycles,
			frequencyHz: (cycles * fs) / lengthT,
			complete: true,
			flagged: false,
			rms,
			thdPercent: thd,
		};
		if (!this.lagrange || later) return row;
		this.fastThdOf(w, cycles);
		this.addFast(row);
		return row;
	}

	/** Whether windows may be measured `later` (the fast THD method is on). */
	get sharesWindows(): boolean {
		return this.lagrange;
	}

	/** Adds to a row measured `later` the harmonic figures of `packed` (helper-link.ts's packWindow layout). */
	complete(row: TrendRow, packed: Float64Array): void {
		unpackWindow(packed, this.fastOut, this.o.rings.length);
		this.copyPhasors();
		this.addFast(row);
	}

	/** THD, orders and unbalance from `fastOut` into the row. */
	private addFast(row: TrendRow): void {
		const fast = this.fastOut;
		for (let c = 0; c < row.thdPercent.length; c++) row.thdPercent[c] = fast.thd[c];
		const harm = fast.harmonics?.map((h) => Array.from(h));
		if (harm) row.harmonicsPercent = harm;
		if (this.phasors) row.unbalancePercent = windowUnbalancePercent(this.phasors);
	}

	/** RMS of channel `c` over exactly startT..endT: sample j stands for [j − ½, j + ½). */
	private rms(c: number, startT: number, endT: number): number {
		const ring = this.o.rings[c];
		const mask = this.mask;
		// The two edge samples count by the part inside the window, so the window is exactly startT..endT on
		// every channel, not only on the reference (whose edge samples are near zero anyway).
		const ja = Math.round(startT);
		const jb = Math.round(endT);
		const va = ring[ja & mask];
		const vb = ring[jb & mask];
		let s = (ja + 0.5 - startT) * va * va + (endT - jb + 0.5) * vb * vb;
		// Samples ja + 1 … jb − 1 in order, in one or two runs of the ring (no masking per sample).
		const a = (ja + 1) & mask;
		const n = jb - ja - 1;
		const first = Math.min(n, ring.length - a);
		s = addSquares(ring, 0, n - first, addSquares(ring, a, a + first, s));
		return Math.sqrt(s / (endT - startT));
	}

	/** THD (and orders, fundamentals) of every channel's window into `fastOut`; the voltage fundamentals into `phasors`. */
	private fastThdOf(w: WindowSpan, cycles: number): void {
		if (!this.fastThd || this.fastThd.cycles !== cycles) this.fastThd = new WindowThd(cycles);
		const out = this.fastOut;
		this.fastThd.thdWindow(this.o.rings, this.mask, w.startT, w.endT, this.o.sampleRateHz, out);
		this.copyPhasors();
	}

	/** The voltage channels' fundamentals from `fastOut` into `phasors`. */
	private copyPhasors(): void {
		const ph = this.phasors;
		const f = this.fastOut.fundamentals;
		if (!ph || !f) return;
		for (let k = 0; k < 3; k++) {
			const c = this.o.voltage[k];
			ph[2 * k] = f[2 * c];
			ph[2 * k + 1] = f[2 * c + 1];
		}
	}

	private sincThd(c: number, w: WindowSpan, cycles: number, samples: number): number {
		const fs = this.o.sampleRateHz;
		const ring = this.o.rings[c];
		const s0 = Math.max(0, samples - ring.length + 1, Math.floor(w.startT) - WINDOW_PAD);
		const e0 = Math.min(samples, Math.ceil(w.endT) + WINDOW_PAD);
		const x = this.scratch!.subarray(0, e0 - s0);
		for (let j = s0; j < e0; j++) x[j - s0] = ring[j & this.mask];
		const f1 = (cycles * fs) / (w.endT - w.startT);
		if (!(f1 < fs / 2)) return NaN;
		return harmonicWindow(x, fs, { fundamentalHz: f1, startIndex: w.startT - s0, cycles, maxOrder: MAX_HARMONIC_ORDER })
			.thd.thdS50Percent;
	}
}
