/**
 * The WebAssembly SIMD resampler of the trend THD (lib/trend/resample-simd.ts): the committed bytes are
 * the committed text compiled by wabt (the reference assembler); Node runs it; a window longer than its
 * first memory gets a new memory without detaching any buffer; a long window's THD is the closed form.
 * (The closed-form THD and fft.js checks of every window run on both resampling paths in window-thd.test.ts.)
 */
import fc from 'fast-check';
import wabtInit from 'wabt';
import { describe, expect, it } from 'vitest';
import { RESAMPLE_SIMD_BASE64 } from '../../lib/trend/resample-simd-bytes.js';
import { resampleSimdWat, SIMD_POINTS } from '../../lib/trend/resample-simd-source.js';
import { base64Bytes, SimdResampler } from '../../lib/trend/resample-simd.js';
import { WindowThd, type WindowThdOut } from '../../lib/trend/window-thd.js';
import { harmonicSamples } from '../helpers/synth.js';

const weights = () => new Float64Array(1025 * 8).fill(0.125);

describe('the SIMD resampler module', () => {
	it('its committed bytes are resample-simd-source.ts compiled by wabt (run `npm run build:wasm` after editing the text)', async () => {
		const wabt = await wabtInit();
		const bytes = wabt.parseWat('resample-simd.wat', resampleSimdWat(), { simd: true }).toBinary({}).buffer;
		expect(RESAMPLE_SIMD_BASE64).toBe(Buffer.from(bytes).toString('base64'));
	});

	it("decodes base64 as Node's Buffer does (any bytes, any length)", () => {
		fc.assert(
			fc.property(fc.uint8Array({ maxLength: 200 }), (bytes) => {
				expect(Array.from(base64Bytes(Buffer.from(bytes).toString('base64')))).toEqual(Array.from(bytes));
			}),
		);
	});

	it('runs on this Node (WebAssembly SIMD is there since Node 16.4), so the SIMD block of window-thd.test.ts tests it', () => {
		expect(SimdResampler.create(weights())).toBeDefined();
	});

	it('a longer window gets a new memory, and no buffer is detached (an old view keeps its length)', () => {
		const r = SimdResampler.create(weights())!;
		const old = r.tapAt;
		const oldLane = r.lane(0);
		expect(r.reserve(1000)).toBe(false);
		expect(r.reserve(100_000)).toBe(true);
		expect(r.lane(0).length).toBeGreaterThanOrEqual(100_000);
		// a detached view reads as length 0: V8 then checks every typed-array access for detachment
		expect(old.length).toBe(SIMD_POINTS);
		expect(oldLane.length).toBeGreaterThan(0);
		expect(old.buffer.byteLength).toBeGreaterThan(0);
	});
});

describe('a window longer than the first memory (10 cycles at 100 kS/s, 20 000 samples)', () => {
	it('gives the closed-form THD √(4.6² + 11.5² + 6.9²)/230 = 6.16441 % on SIMD and on the JavaScript loops', () => {
		const fs = 100_000;
		const f1 = 49.97;
		const ringLength = 1 << 16;
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 3, rms: 4.6, phaseDeg: 40 },
				{ order: 5, rms: 11.5, phaseDeg: -75 },
				{ order: 7, rms: 6.9, phaseDeg: 120 },
			],
			{ frequencyHz: f1, sampleRateHz: fs, samples: ringLength },
		);
		const want = (100 * Math.hypot(4.6, 11.5, 6.9)) / 230;
		const startT = 1000.25;
		const endT = startT + (10 * fs) / f1;
		for (const simd of [true, false]) {
			const out: WindowThdOut = { thd: new Float64Array(1) };
			new WindowThd(10, simd).thdWindow([x], ringLength - 1, startT, endT, fs, out);
			// window-thd.ts accuracy: interpolation error < 0.003 % up to 0.1·fs (these tones reach 0.0035·fs)
			expect(Math.abs(out.thd[0] - want)).toBeLessThan(3e-5 * want);
		}
	});
});

describe('where a WebAssembly memory cannot be had (a capped address space: each reserves gigabytes)', () => {
	const realMemory = WebAssembly.Memory;
	const failing = class {
		constructor() {
			throw new RangeError('WebAssembly.Memory(): could not allocate memory');
		}
	};
	const mix = (fs: number, samples: number) =>
		harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 11.5, phaseDeg: -75 },
			],
			{ frequencyHz: 49.97, sampleRateHz: fs, samples },
		);
	const want = (100 * 11.5) / 230; // closed form: V5 / V1

	it('there is no SIMD resampler, and the THD comes from the JavaScript loops, 5 % as the closed form', () => {
		(WebAssembly as { Memory: unknown }).Memory = failing;
		try {
			expect(SimdResampler.create(weights())).toBeUndefined();
			const out: WindowThdOut = { thd: new Float64Array(1) };
			new WindowThd(10).thdWindow([mix(10_000, 1 << 13)], (1 << 13) - 1, 100.5, 100.5 + 100_000 / 49.97, 10_000, out);
			expect(Math.abs(out.thd[0] - want)).toBeLessThan(3e-5 * want);
		} finally {
			(WebAssembly as { Memory: unknown }).Memory = realMemory;
		}
	});

	it('a window that needs a new memory part-way falls back to the loops, the THD still the closed form', () => {
		const thd = new WindowThd(10);
		const out: WindowThdOut = { thd: new Float64Array(1) };
		thd.thdWindow([mix(10_000, 1 << 13)], (1 << 13) - 1, 100.5, 100.5 + 100_000 / 49.97, 10_000, out);
		expect(Math.abs(out.thd[0] - want)).toBeLessThan(3e-5 * want);
		(WebAssembly as { Memory: unknown }).Memory = failing;
		try {
			// 10 cycles at 100 kS/s: 20 000 samples, more than the first memory holds
			thd.thdWindow([mix(100_000, 1 << 16)], (1 << 16) - 1, 1000.25, 1000.25 + 1_000_000 / 49.97, 100_000, out);
			expect(Math.abs(out.thd[0] - want)).toBeLessThan(3e-5 * want);
		} finally {
			(WebAssembly as { Memory: unknown }).Memory = realMemory;
		}
	});
});
