/**
 * Closed-form test voltages for the flickermeter, generated chunk by chunk into one reused buffer so
 * 10-minute records never sit in memory whole.
 *
 * Modulation as the flickermeter standard defines its test signals: the RMS envelope is
 * U(t) = U (1 + (ΔV/V)/2 · m(t)), m = sin(2π fm t) (sinusoidal) or a ±1 square wave whose level changes
 * `cpm` times per minute (rectangular: period 120/cpm s, 50 % duty), so ΔV/V is the peak-to-peak relative
 * change of the envelope (Ref: IEC 61000-4-15:2010, 6 and Tables 1-2, from memory).
 */
import type { Capture } from '../../lib/capture.js';
import { captureOf } from './capture.js';

export type Modulation =
	| { shape: 'none' }
	| { shape: 'sine'; frequencyHz: number; deltaVOverV: number }
	| { shape: 'rectangular'; changesPerMinute: number; deltaVOverV: number };

export interface FlickerSignalSpec {
	sampleRateHz: number;
	/** Mains frequency, Hz (constant) or a function of time in s. */
	mainsHz: number | ((tS: number) => number);
	/** RMS of the unmodulated voltage, V. */
	rmsV: number;
	durationS: number;
	modulation: Modulation;
	/** Extra harmonics: order and RMS in % of the fundamental RMS (unmodulated). */
	harmonics?: { order: number; percent: number }[];
	/** Samples per chunk handed to the callback. Default 65536. */
	chunk?: number | (() => number);
}

function envelope(m: Modulation, t: number): number {
	switch (m.shape) {
		case 'none':
			return 1;
		case 'sine':
			return 1 + (m.deltaVOverV / 2) * Math.sin(2 * Math.PI * m.frequencyHz * t);
		case 'rectangular': {
			// level changes at t = k·60/cpm; the first half-period is high
			const k = Math.floor((t * m.changesPerMinute) / 60);
			return 1 + (m.deltaVOverV / 2) * (k % 2 === 0 ? 1 : -1);
		}
	}
}

/**
 * Calls `each` with consecutive chunks of the signal (the same buffer, overwritten: copy what you keep).
 * The mains phase is accumulated sample by sample, so a frequency that changes keeps the waveform
 * continuous.
 */
export function forEachChunk(spec: FlickerSignalSpec, each: (chunk: Float64Array) => void): void {
	const fs = spec.sampleRateHz;
	const total = Math.round(spec.durationS * fs);
	const nextSize = typeof spec.chunk === 'function' ? spec.chunk : () => (spec.chunk as number | undefined) ?? 65536;
	const buffer = new Float64Array(Math.max(65536, typeof spec.chunk === 'number' ? spec.chunk : 65536));
	const peak = spec.rmsV * Math.SQRT2;
	const harmonics = spec.harmonics ?? [];
	const hz = spec.mainsHz;
	const constantW = typeof hz === 'number' ? (2 * Math.PI * hz) / fs : 0;
	let phase = 0;
	let n = 0;
	while (n < total) {
		const size = Math.min(total - n, Math.max(1, nextSize()));
		const out = size <= buffer.length ? buffer.subarray(0, size) : new Float64Array(size);
		for (let i = 0; i < size; i++, n++) {
			const t = n / fs;
			let v = Math.sin(phase);
			for (const h of harmonics) v += (h.percent / 100) * Math.sin(h.order * phase);
			out[i] = peak * envelope(spec.modulation, t) * v;
			phase += typeof hz === 'number' ? constantW : (2 * Math.PI * hz(t)) / fs;
			if (phase > 2 * Math.PI * 1e6) phase -= 2 * Math.PI * 1e6;
		}
		each(out);
	}
}

/** A one-channel capture (L1, V) of the signal at 50 Hz mains: the whole record collected from the chunks. */
export function flickerCapture(
	sampleRateHz: number,
	durationS: number,
	modulation: Modulation,
	opts: { rmsV?: number; source?: string } = {},
): Capture {
	const x = new Float64Array(Math.round(sampleRateHz * durationS));
	let off = 0;
	forEachChunk({ sampleRateHz, mainsHz: 50, rmsV: opts.rmsV ?? 230, durationS, modulation }, (c) => {
		x.set(c, off);
		off += c.length;
	});
	return captureOf(
		[{ name: 'L1', unit: 'V', quantity: 'voltage', samples: x }],
		sampleRateHz,
		opts.source ?? 'flicker.csv',
	);
}
