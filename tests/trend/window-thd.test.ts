import { describe, expect, it } from 'vitest';
import { PAIR_MAX_RATIO, pairable, WindowThd, type WindowThdOut } from '../../lib/trend/window-thd.js';
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

function windowOf(rings: Float64Array[], startT: number, rms: number[], harmonics = false): WindowThdOut {
	const out: WindowThdOut = {
		thd: new Float64Array(rings.length),
		fundamentals: new Float64Array(2 * rings.length),
		harmonics: harmonics ? rings.map(() => new Float64Array(51)) : undefined,
	};
	new WindowThd(CYCLES).thdWindow(rings, RING - 1, startT, startT + LENGTH_T, FS, rms, out);
	return out;
}

// Window starts (absolute sample times): two lying in one run of the ring, and one whose taps wrap round
// the ring's end (at ring index 8192 − 1500.3, 2003 samples long).
const STARTS = [HELD + 123.4567, HELD + 3001.25, 2 * RING - 1500.3];

describe('WindowThd.thdWindow: two channels in one complex FFT, split by conjugate symmetry', () => {
	it('a 230 V mix and a 12 A mix sharing one FFT give their closed-form THDs 6.16441 % and 31.6228 %, and each order', () => {
		const rings = [ring(U_TONES), ring(I_TONES)];
		const rms = [rmsOf(U_TONES), rmsOf(I_TONES)];
		expect(pairable(rms[0], rms[1])).toBe(true);
		for (const s of STARTS) {
			const out = windowOf(rings, s, rms, true);
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

	it('the split equals each channel alone through fft.js realTransform (thdPercent) to 1e-9: 6 channels (two pairs together, one pair alone), wrapped window included', () => {
		const scales = [1, 1, 1.01, 0.5, 0.98, 2];
		const tones = [U_TONES, I_TONES, U_TONES, I_TONES, U_TONES, I_TONES];
		const rings = tones.map((t, c) => ring(t, scales[c]));
		const rms = tones.map((t, c) => rmsOf(t, scales[c]));
		const alone = new WindowThd(CYCLES);
		for (const s of STARTS) {
			const out = windowOf(rings, s, rms);
			for (let c = 0; c < 6; c++) {
				const fund = new Float64Array(2);
				const thd = alone.thdPercent(rings[c], RING - 1, s, s + LENGTH_T, FS, undefined, fund);
				expect(Math.abs(out.thd[c] - thd) / thd).toBeLessThan(1e-9);
				expect(Math.abs(out.fundamentals![2 * c] - fund[0])).toBeLessThan(1e-9 * Math.hypot(fund[0], fund[1]));
				expect(Math.abs(out.fundamentals![2 * c + 1] - fund[1])).toBeLessThan(1e-9 * Math.hypot(fund[0], fund[1]));
			}
		}
	});

	it('the fundamental bin of a paired channel is −i·(M/2)·A·e^{iθ0} (closed form: DFT of A·sin(θ0 + 2πcm/M) at bin c)', () => {
		const rings = [ring(U_TONES), ring(I_TONES)];
		const out = windowOf(rings, STARTS[1], [rmsOf(U_TONES), rmsOf(I_TONES)]);
		const w = (2 * Math.PI * F1) / FS;
		[U_TONES, I_TONES].forEach((tones, c) => {
			const a = Math.SQRT2 * tones[0].rms;
			const theta0 = w * STARTS[1] + ((tones[0].phaseDeg ?? 0) * Math.PI) / 180;
			// −i·e^{iθ} = sin θ − i cos θ
			expect(Math.abs(out.fundamentals![2 * c] / ((M / 2) * a) - Math.sin(theta0))).toBeLessThan(REL);
			expect(Math.abs(out.fundamentals![2 * c + 1] / ((M / 2) * a) + Math.cos(theta0))).toBeLessThan(REL);
		});
	});

	it('a dead channel is not paired (THD NaN, as alone) and its neighbour keeps its closed-form THD', () => {
		const rings = [ring(U_TONES), new Float64Array(RING), ring(I_TONES)];
		const out = windowOf(rings, STARTS[0], [rmsOf(U_TONES), 0, rmsOf(I_TONES)]);
		expect(out.thd[1]).toBeNaN();
		near(out.thd[0], U_THD);
		near(out.thd[2], I_THD);
	});

	it('channels further apart than PAIR_MAX_RATIO (230 V beside a 10 mV signal) each go alone and keep their closed-form THDs', () => {
		const small = 1e-2 / rmsOf(I_TONES);
		expect(pairable(rmsOf(U_TONES), rmsOf(I_TONES, small))).toBe(false);
		const rings = [ring(U_TONES), ring(I_TONES, small)];
		const out = windowOf(rings, STARTS[2], [rmsOf(U_TONES), rmsOf(I_TONES, small)]);
		near(out.thd[0], U_THD);
		near(out.thd[1], I_THD);
	});

	it('pairable: finite, non-zero RMS within PAIR_MAX_RATIO of each other', () => {
		expect(pairable(230, 12)).toBe(true);
		expect(pairable(230, 230 / PAIR_MAX_RATIO)).toBe(true);
		expect(pairable(230, 230 / PAIR_MAX_RATIO / 1.01)).toBe(false);
		expect(pairable(230, 0)).toBe(false);
		expect(pairable(NaN, 230)).toBe(false);
		expect(pairable(230, Infinity)).toBe(false);
	});
});
