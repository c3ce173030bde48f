/**
 * Sharing one recording's analysis with a second thread. The analyser (analyser.ts) keeps the zero
 * crossings, RMS, events and rows; a helper thread runs the flickermeters and as many of the 10/12-cycle
 * harmonic windows as it keeps up with. Both read the same samples: the analyser's ring buffers live in
 * a SharedArrayBuffer, and commands go the other way through a queue in a second one. Every figure is
 * computed by the same code as without a helper, on the same samples in the same order, so the result is
 * identical to the last bit (tests/cli/trend/helper-thread.test.ts).
 *
 * This file uses only SharedArrayBuffer and Atomics (a browser worker or a Node worker thread alike);
 * the front end starts the thread and hands over a `TrendHelperChannel` (src/cli/trend/helper-thread.ts).
 *
 * Protocol: the analyser writes commands (a flicker block, a harmonic window, the end) into a ring of
 * CMD_CAP slots and counts them in SUBMITTED; the helper runs them in order and counts them in DONE.
 * Before the analyser overwrites ring samples it waits until every command still reading them is done.
 * Harmonic results land in one of SLOTS result slots; the analyser copies them into the row before the
 * row goes out. A side that finds nothing to do sleeps on the other's counter (Atomics.wait) after
 * raising its WAITING flag; the other wakes it only when the flag is up.
 */
import type { Diagnostic } from '../capture.js';
import { TrendFlickerTracker, type TrendFlicker } from './flicker-tracker.js';
import type { TrendChannelSpec } from './types.js';
import { TREND_MAX_ORDER, WindowThd, type WindowThdOut } from './window-thd.js';

/** What the front end provides: a thread that runs `runTrendHelperSession` on demand. */
export interface TrendHelperChannel {
	/** True while a session runs (one analyser at a time; a second one then works alone). */
	readonly busy: boolean;
	/** Starts `runTrendHelperSession(init, send)` on the helper thread. */
	begin(init: TrendHelperInit): void;
	/**
	 * The value the session handed to `send`, once it has (the analyser waits on DONE first);
	 * @throws Error with the helper's message when the session failed
	 */
	result(): TrendHelperResult;
}

/** What a session needs, all structured-cloneable (the buffers are shared, not copied). */
export interface TrendHelperInit {
	control: SharedArrayBuffer;
	rings: SharedArrayBuffer;
	ringLength: number;
	channelCount: number;
	sampleRateHz: number;
	/** Harmonic windows: with each order (the `harmonics` option) and the fundamentals (for the unbalance). */
	thd: { harmonics: boolean } | null;
	flicker: {
		channels: TrendChannelSpec[];
		voltage: number[];
		keepPinst: boolean;
		intervalOffsetS: number;
	} | null;
}

/** A session's end: the flicker result without event flags (the analyser sets them) and its notes. */
export interface TrendHelperResult {
	flicker?: TrendFlicker;
	diagnostics: Diagnostic[];
	/** Harmonic windows the helper measured (for benches and tests: how the work was shared). */
	windows: number;
	/** Set instead when the session failed. */
	error?: string;
}

/** Control words (Int32 indices). */
const SUBMITTED = 0,
	DONE = 1,
	FAILED = 2,
	HELPER_WAITING = 3,
	ANALYSER_WAITING = 4,
	/** Set by the helper as its session starts. */
	STARTED = 5,
	CONTROL_WORDS = 16;

/** Command kinds and the queue's shape: each command is [kind, a, b, c, d]. */
const FLICKER = 1,
	HARMONICS = 2,
	END = 3,
	CMD_WIDTH = 5,
	CMD_CAP = 4096;

/** Result slots: the most harmonic windows handed over and not yet taken back. */
const SLOTS = 64;
/**
 * How far behind the analyser the helper may be, s of recording, and still be handed a harmonic window:
 * beyond, the analyser measures the window itself rather than wait. The helper also runs the
 * flickermeters, so its share of the windows finds its own level.
 */
const HELPER_LAG_S = 2.5;

/** How long one wait sleeps before it looks for a failed helper again, ms. */
const WAIT_SLICE_MS = 2000;
/** How long the analyser waits for a session that has not started (a thread that could not start), ms. */
const START_WAIT_MS = 30_000;

/** Doubles per result slot: THD, fundamentals (re, im) and with `harmonics` each order, per channel. */
function slotLength(channelCount: number, harmonics: boolean): number {
	return channelCount * (3 + (harmonics ? TREND_MAX_ORDER + 1 : 0));
}

/** The views of a session's shared buffers (the same on both sides). */
function views(init: TrendHelperInit) {
	const slot = slotLength(init.channelCount, init.thd?.harmonics === true);
	const control = new Int32Array(init.control, 0, CONTROL_WORDS);
	const commands = new Float64Array(init.control, CONTROL_WORDS * 4, CMD_CAP * CMD_WIDTH);
	const results = new Float64Array(init.control, CONTROL_WORDS * 4 + CMD_CAP * CMD_WIDTH * 8, SLOTS * slot);
	const rings = Array.from(
		{ length: init.channelCount },
		(_, c) => new Float64Array(init.rings, c * init.ringLength * 8, init.ringLength),
	);
	return { control, commands, results, rings, slot };
}

/** The analyser's end of a session. */
export class TrendHelperLink {
	/** The ring buffers, shared with the helper. */
	readonly rings: Float64Array[];
	private readonly v: ReturnType<typeof views>;
	/** Commands submitted; the lowest ring sample each reads, per queue slot. */
	private submitted = 0;
	private done = 0;
	private readonly lowest = new Float64Array(CMD_CAP);
	/** Per queue slot, the newest sample the command needs (how far the helper has come). */
	private readonly upTo = new Float64Array(CMD_CAP);
	private readonly lagLimit: number;
	/** Tickets of the harmonic windows submitted and not yet taken back, oldest first, and their result slots. */
	private readonly windowTickets: number[] = [];
	private readonly windowSlots: number[] = [];
	private readonly freeSlots = Array.from({ length: SLOTS }, (_, k) => SLOTS - 1 - k);

	/**
	 * Starts a session on `channel`; `ringLength` a power of two.
	 * @returns undefined when the channel is busy with another analyser
	 */
	static open(
		channel: TrendHelperChannel | undefined,
		spec: Omit<TrendHelperInit, 'control' | 'rings'>,
	): TrendHelperLink | undefined {
		if (!channel || channel.busy || (!spec.thd && !spec.flicker)) return undefined;
		const slot = slotLength(spec.channelCount, spec.thd?.harmonics === true);
		const init: TrendHelperInit = {
			...spec,
			control: new SharedArrayBuffer(CONTROL_WORDS * 4 + (CMD_CAP * CMD_WIDTH + SLOTS * slot) * 8),
			rings: new SharedArrayBuffer(spec.channelCount * spec.ringLength * 8),
		};
		channel.begin(init);
		return new TrendHelperLink(channel, init);
	}

	private constructor(
		private readonly channel: TrendHelperChannel,
		init: TrendHelperInit,
	) {
		this.v = views(init);
		this.rings = this.v.rings;
		this.lagLimit = HELPER_LAG_S * init.sampleRateHz;
	}

	/** Waits until every command still reading ring samples below `sample` is done (before they are overwritten). */
	beforeWrite(sample: number): void {
		let need = -1;
		this.poll();
		for (let s = this.done; s < this.submitted; s++) if (this.lowest[s % CMD_CAP] < sample) need = s;
		if (need >= 0) this.waitDone(need);
	}

	/** Samples [start, start + n) (in the rings) to the flickermeters, with what the analyser knows now. */
	flicker(start: number, n: number, nominalHz: number | undefined, declaredV: number): void {
		this.submit(FLICKER, start, n, nominalHz ?? NaN, declaredV, start, start + n);
	}

	/** Whether the helper should take another harmonic window now (not far behind, a result slot free). */
	get takesWindow(): boolean {
		if (this.windowTickets.length >= SLOTS) return false;
		const done = this.poll();
		if (done === this.submitted) return true;
		const newest = this.upTo[(this.submitted - 1) % CMD_CAP];
		return newest - this.upTo[done % CMD_CAP] < this.lagLimit;
	}

	/** The harmonic window startT..endT (sample indices) of `cycles` cycles; returns its ticket. */
	window(startT: number, endT: number, cycles: number): number {
		const slot = this.freeSlots.pop()!;
		const ticket = this.submit(HARMONICS, startT, endT, cycles, slot, Math.floor(startT) - 4, endT);
		this.windowTickets.push(ticket);
		this.windowSlots.push(slot);
		return ticket;
	}

	/** Whether window `ticket` is done. */
	ready(ticket: number): boolean {
		return ticket < this.done || ticket < this.poll();
	}

	/**
	 * The result of window `ticket` (waits for it): THD, fundamentals, orders per channel (see slotLength).
	 * Read it before the next window is handed over (its slot is free again).
	 */
	take(ticket: number): Float64Array {
		if (ticket >= this.done) this.waitDone(ticket);
		const k = this.windowTickets.indexOf(ticket);
		const slot = this.windowSlots[k];
		this.windowTickets.splice(k, 1);
		this.windowSlots.splice(k, 1);
		this.freeSlots.push(slot);
		const at = slot * this.v.slot;
		return this.v.results.subarray(at, at + this.v.slot);
	}

	/** Ends the session: the flicker result (flags not set) and the helper's notes. */
	end(nominalHz: number, declaredV: number): TrendHelperResult {
		const ticket = this.submit(END, nominalHz, declaredV, 0, 0, Infinity, Infinity);
		this.waitDone(ticket);
		return this.channel.result();
	}

	private poll(): number {
		return (this.done = Atomics.load(this.v.control, DONE));
	}

	private submit(kind: number, a: number, b: number, c: number, d: number, lowest: number, upTo: number): number {
		const ticket = this.submitted;
		if (ticket - this.poll() >= CMD_CAP) this.waitDone(ticket - CMD_CAP);
		const at = (ticket % CMD_CAP) * CMD_WIDTH;
		const q = this.v.commands;
		q[at] = kind;
		q[at + 1] = a;
		q[at + 2] = b;
		q[at + 3] = c;
		q[at + 4] = d;
		this.lowest[ticket % CMD_CAP] = lowest;
		this.upTo[ticket % CMD_CAP] = upTo;
		const ctl = this.v.control;
		Atomics.store(ctl, SUBMITTED, ++this.submitted);
		if (Atomics.load(ctl, HELPER_WAITING) === 1) Atomics.notify(ctl, SUBMITTED);
		return ticket;
	}

	/** Sleeps until command `ticket` is done; @throws Error when the helper failed. */
	private waitDone(ticket: number): void {
		const ctl = this.v.control;
		let waitedMs = 0;
		while (this.poll() <= ticket) {
			if (Atomics.load(ctl, FAILED) === 1) this.channel.result();
			if (Atomics.load(ctl, STARTED) === 0 && waitedMs >= START_WAIT_MS)
				throw new Error(`the second analysis thread did not start within ${START_WAIT_MS / 1000} s`);
			waitedMs += WAIT_SLICE_MS;
			Atomics.store(ctl, ANALYSER_WAITING, 1);
			const d = Atomics.load(ctl, DONE);
			if (d <= ticket) Atomics.wait(ctl, DONE, d, WAIT_SLICE_MS);
			Atomics.store(ctl, ANALYSER_WAITING, 0);
		}
	}
}

/**
 * The helper's side: runs the session's commands until the end, hands the result to `send` and returns.
 * An error is caught, marked in the control words and sent as `{ error }` (the analyser then throws it).
 */
export function runTrendHelperSession(init: TrendHelperInit, send: (r: TrendHelperResult) => void): void {
	const v = views(init);
	Atomics.store(v.control, STARTED, 1);
	try {
		new HelperSession(init, v).run(send);
	} catch (error) {
		send({ diagnostics: [], windows: 0, error: error instanceof Error ? error.message : String(error) });
		Atomics.store(v.control, FAILED, 1);
		Atomics.notify(v.control, DONE);
	}
}

class HelperSession {
	private readonly diagnostics: Diagnostic[] = [];
	private readonly tracker: TrendFlickerTracker | undefined;
	private readonly mask: number;
	private thd: WindowThd | undefined;
	private readonly out: WindowThdOut;
	private readonly chunk: Float64Array[];
	private windows = 0;

	constructor(
		private readonly init: TrendHelperInit,
		private readonly v: ReturnType<typeof views>,
	) {
		const f = init.flicker;
		this.tracker = f
			? new TrendFlickerTracker(
					init.sampleRateHz,
					f.channels,
					f.voltage,
					this.diagnostics,
					f.keepPinst,
					f.intervalOffsetS,
				)
			: undefined;
		this.mask = init.ringLength - 1;
		const n = init.channelCount;
		this.out = {
			thd: new Float64Array(n),
			harmonics: init.thd?.harmonics
				? Array.from({ length: n }, () => new Float64Array(TREND_MAX_ORDER + 1))
				: undefined,
			fundamentals: new Float64Array(2 * n),
		};
		this.chunk = new Array<Float64Array>(n);
	}

	run(send: (r: TrendHelperResult) => void): void {
		const { control: ctl, commands: q } = this.v;
		for (let done = 0; ;) {
			if (Atomics.load(ctl, SUBMITTED) === done) {
				Atomics.store(ctl, HELPER_WAITING, 1);
				if (Atomics.load(ctl, SUBMITTED) === done) Atomics.wait(ctl, SUBMITTED, done);
				Atomics.store(ctl, HELPER_WAITING, 0);
				continue;
			}
			const at = (done % CMD_CAP) * CMD_WIDTH;
			const kind = q[at];
			if (kind === FLICKER) this.flicker(q[at + 1], q[at + 2], q[at + 3], q[at + 4]);
			else if (kind === HARMONICS) this.window(q[at + 1], q[at + 2], q[at + 3], q[at + 4]);
			else if (kind === END) {
				const flicker = this.tracker?.finish(q[at + 1], [], q[at + 2]);
				send({ ...(flicker ? { flicker } : {}), diagnostics: this.diagnostics, windows: this.windows });
			}
			Atomics.store(ctl, DONE, ++done);
			if (Atomics.load(ctl, ANALYSER_WAITING) === 1) Atomics.notify(ctl, DONE);
			if (kind === END) return;
		}
	}

	/** Samples [start, start + n) of the rings to the flicker tracker, split where the ring wraps. */
	private flicker(start: number, n: number, nominalHz: number, declaredV: number): void {
		if (!this.tracker) return;
		const len = this.init.ringLength;
		const pos = start & this.mask;
		const first = Math.min(n, len - pos);
		const nominal = Number.isNaN(nominalHz) ? undefined : nominalHz;
		this.tracker.push(this.ringViews(pos, pos + first), nominal, declaredV);
		if (first < n) this.tracker.push(this.ringViews(0, n - first), nominal, declaredV);
	}

	private ringViews(from: number, to: number): Float64Array[] {
		const rings = this.v.rings;
		for (let c = 0; c < rings.length; c++) this.chunk[c] = rings[c].subarray(from, to);
		return this.chunk;
	}

	/** One harmonic window of every channel into result slot `slot` (the layout of slotLength). */
	private window(startT: number, endT: number, cycles: number, slot: number): void {
		if (!this.thd || this.thd.cycles !== cycles) this.thd = new WindowThd(cycles);
		const out = this.out;
		this.thd.thdWindow(this.v.rings, this.mask, startT, endT, this.init.sampleRateHz, out);
		packWindow(out, this.v.results, slot * this.v.slot, this.init.channelCount);
		this.windows++;
	}
}

/** `out` (window-thd.ts) into `dest` from `at`: THD per channel, then fundamentals, then each channel's orders. */
export function packWindow(out: WindowThdOut, dest: Float64Array, at: number, channelCount: number): void {
	dest.set(out.thd.subarray(0, channelCount), at);
	if (out.fundamentals) dest.set(out.fundamentals.subarray(0, 2 * channelCount), at + channelCount);
	const h = out.harmonics;
	if (h) for (let c = 0; c < channelCount; c++) dest.set(h[c], at + 3 * channelCount + c * (TREND_MAX_ORDER + 1));
}

/** The inverse of packWindow, into `out`. */
export function unpackWindow(src: Float64Array, out: WindowThdOut, channelCount: number): void {
	out.thd.set(src.subarray(0, channelCount));
	if (out.fundamentals) out.fundamentals.set(src.subarray(channelCount, 3 * channelCount));
	const h = out.harmonics;
	const w = TREND_MAX_ORDER + 1;
	if (h)
		for (let c = 0; c < channelCount; c++)
			h[c].set(src.subarray(3 * channelCount + c * w, 3 * channelCount + (c + 1) * w));
}
