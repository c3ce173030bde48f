import { beforeAll, describe, expect, it } from 'vitest';
import FFT from 'fft.js';
import { WindowThd, type WindowThdOut } from '../../lib/trend/window-thd.js';
import { harmonicSamples } from '../helpers/synth.js';

const FS = 10_000;
const F1 = 49.93; // off-nominal: the window is not a whole number of samples, so it is resampled
const RING = 1 << 13;
const CYCLES = 10;
const LENGTH_T = (CYCLES * FS) / F1;
/** DFT points of window-thd.ts: the fundamental's bin of a sine of peak A is (M/2)·A in magnitude. */
const M = 2048;

const U_TONES = [
	{ order: 1, rms: 230 },
	{ order: 3, rms: 4.6, phaseDeg: 40 },
	{ order: 5, rms: 11.5, phaseDeg: -75 },
	{ order: 7, rms: 6.9, phaseDeg: 120 },
];
const I_TONES = [
	{ order: 1, rms: 12, phaseDeg: -30 },
	{ order: 5, rms: 3.6, phaseDeg: 10 },
	{ order: 7, rms: 1.2, phaseDeg: 200 },
];
// closed form: THD = √Σ_{h≥2} V_h² / V_1 (every tone on a harmonic bin of the synchronised window)
const U_THD = (100 * Math.hypot(4.6, 11.5, 6.9)) / 230; // 6.16441 %
const I_THD = (100 * Math.hypot(3.6, 1.2)) / 12; // 31.6228 %
/** window-thd.ts accuracy statement: interpolation magnitude error < 0.003 % up to 0.1·fs (these tones reach 0.035·fs). */
const REL = 3e-5;
const near = (got: number, want: number) => expect(Math.abs(got - want)).toBeLessThan(REL * want);

/** First absolute sample index the rings hold: they hold samples HELD .. HELD + RING − 1, sample j at j & (RING − 1). */
const HELD = RING + 1000;

/** A ring buffer as the analyser keeps it, of `tones` scaled by `scale`. */
function ring(tones: typeof U_TONES, scale = 1): Float64Array {
	const x = harmonicSamples(
		tones.map((t) => ({ ...t, rms: t.rms * scale })),
		{ frequencyHz: F1, sampleRateHz: FS, samples: HELD + RING },
	);
	const r = new Float64Array(RING);
	for (let j = HELD; j < HELD + RING; j++) r[j & (RING - 1)] = x[j];
	return r;
}
const rmsOf = (tones: typeof U_TONES, scale = 1) => scale * Math.hypot(...tones.map((t) => t.rms));

/** Whether the windows below resample in WebAssembly SIMD (each describe block sets it). */
let useSimd = true;

function windowOf(rings: Float64Array[], startT: number, harmonics = false): WindowThdOut {
	const out: WindowThdOut = {
		thd: new Float64Array(rings.length),
		fundamentals: new Float64Array(2 * rings.length),
		harmonics: harmonics ? rings.map(() => new Float64Array(51)) : undefined,
	};
	new WindowThd(CYCLES, useSimd).thdWindow(rings, RING - 1, startT, startT + LENGTH_T, FS, out);
	return out;
}

// Window starts (absolute sample times): two lying in one run of the ring, and one whose taps wrap round
// the ring's end (at ring index 8192 − 1500.3, 2003 samples long).
const STARTS = [HELD + 123.4567, HELD + 3001.25, 2 * RING - 1500.3];

/** THDS in % by IEC 61000-4-7's subgroups from a DFT (re, im interleaved) of a window of `cycles` cycles, orders 2 … hMax. */
function thdFromBins(x: Float64Array, cycles: number, hMax: number): number {
	const p = (k: number) => x[2 * k] ** 2 + x[2 * k + 1] ** 2;
	const g = (h: number) => p(cycles * h - 1) + p(cycles * h) + p(cycles * h + 1);
	let sum = 0;
	for (let h = 2; h <= hMax; h++) sum += g(h);
	return 100 * Math.sqrt(sum / g(1));
}

for (const simd of [true, false])
	describe(`WindowThd.thdWindow (${simd ? 'resampled in WebAssembly SIMD' : 'resampled by the JavaScript loops'}): every channel of a window in one placement, real DFTs as half-length complex ones`, () => {
		beforeAll(() => {
			useSimd = simd;
		});
		it('a 230 V mix and a 12 A mix give their closed-form THDs 6.16441 % and 31.6228 %, and each order, wrapped window included', () => {
			const rings = [ring(U_TONES), ring(I_TONES)];
			for (const s of STARTS) {
				const out = windowOf(rings, s, true);
				near(out.thd[0], U_THD);
				near(out.thd[1], I_THD);
				// each order in % of the fundamental, closed form 100·V_h/V_1
				near(out.harmonics![0][5], (100 * 11.5) / 230);
				near(out.harmonics![1][5], 30);
				near(out.harmonics![1][7], 10);
				// an absent order holds no more than the interpolation error of the 30 % 5th
				expect(out.harmonics![1][3]).toBeLessThan(REL * 30);
			}
		});

		it('equals fft.js realTransform of the same 2048 points to 1e-9: a cubic, which 8-point Lagrange interpolation reproduces exactly', () => {
			// x(t) = cubic in t: the interpolated points are the cubic's values at the points' places, which are
			// the window's M even steps with the fraction rounded to 1/1024 (window-thd.ts's weight table).
			const cubic = (t: number) => {
				const u = (t - 5000) / 2000;
				return 300 + 120 * u - 80 * u * u + 45 * u * u * u;
			};
			const r = new Float64Array(RING);
			for (let j = HELD; j < HELD + RING; j++) r[j & (RING - 1)] = cubic(j);
			for (const s of STARTS) {
				const x = new Float64Array(M);
				for (let m = 0; m < M; m++) {
					const t = s + (m * LENGTH_T) / M;
					const i = Math.floor(t);
					x[m] = cubic(i + Math.round((t - i) * 1024) / 1024);
				}
				const spectrum = new Float64Array(2 * M);
				new FFT(M).realTransform(spectrum, x);
				const hMax = 50; // 50 · 49.93 Hz < 5 kHz
				const want = thdFromBins(spectrum, CYCLES, hMax);
				const out = windowOf([r], s);
				expect(Math.abs(out.thd[0] - want) / want).toBeLessThan(1e-9);
				const f = Math.hypot(spectrum[2 * CYCLES], spectrum[2 * CYCLES + 1]);
				expect(Math.abs(out.fundamentals![0] - spectrum[2 * CYCLES])).toBeLessThan(1e-9 * f);
				expect(Math.abs(out.fundamentals![1] - spectrum[2 * CYCLES + 1])).toBeLessThan(1e-9 * f);
			}
		});

		it('seven channels (four resampled together, then two, then one) give each channel what it gives alone (thdPercent), wrapped window included', () => {
			const scales = [1, 1, 1.01, 0.5, 0.98, 2, 1.02];
			const tones = [U_TONES, I_TONES, U_TONES, I_TONES, U_TONES, I_TONES, U_TONES];
			const rings = tones.map((t, c) => ring(t, scales[c]));
			const alone = new WindowThd(CYCLES, useSimd);
			for (const s of STARTS) {
				const out = windowOf(rings, s);
				for (let c = 0; c < 7; c++) {
					const fund = new Float64Array(2);
					const thd = alone.thdPercent(rings[c], RING - 1, s, s + LENGTH_T, FS, undefined, fund);
					expect(Math.abs(out.thd[c] - thd) / thd).toBeLessThan(1e-12);
					expect(Math.abs(out.fundamentals![2 * c] - fund[0])).toBeLessThan(1e-12 * Math.hypot(fund[0], fund[1]));
					expect(Math.abs(out.fundamentals![2 * c + 1] - fund[1])).toBeLessThan(1e-12 * Math.hypot(fund[0], fund[1]));
					near(out.thd[c], c % 2 ? I_THD : U_THD);
				}
			}
		});

		it('the fundamental bin is −i·(M/2)·A·e^{iθ0} (closed form: DFT of A·sin(θ0 + 2πcm/M) at bin c)', () => {
			const rings = [ring(U_TONES), ring(I_TONES)];
			const out = windowOf(rings, STARTS[1]);
			const w = (2 * Math.PI * F1) / FS;
			[U_TONES, I_TONES].forEach((tones, c) => {
				const a = Math.SQRT2 * tones[0].rms;
				const theta0 = w * STARTS[1] + ((tones[0].phaseDeg ?? 0) * Math.PI) / 180;
				// −i·e^{iθ} = sin θ − i cos θ
				expect(Math.abs(out.fundamentals![2 * c] / ((M / 2) * a) - Math.sin(theta0))).toBeLessThan(REL);
				expect(Math.abs(out.fundamentals![2 * c + 1] / ((M / 2) * a) + Math.cos(theta0))).toBeLessThan(REL);
			});
		});

		it('a dead channel has no THD (NaN) and does not disturb its neighbours, 230 V beside 10 mV neither', () => {
			const small = 1e-2 / rmsOf(I_TONES);
			const rings = [ring(U_TONES), new Float64Array(RING), ring(I_TONES, small), ring(I_TONES)];
			const out = windowOf(rings, STARTS[0]);
			expect(out.thd[1]).toBeNaN();
			near(out.thd[0], U_THD);
			near(out.thd[2], I_THD);
			near(out.thd[3], I_THD);
		});
	});
