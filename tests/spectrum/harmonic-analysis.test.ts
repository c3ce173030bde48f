import { describe, expect, it } from 'vitest';
import { aggregateHarmonicWindows, harmonicAnalysis, harmonicWindow } from '../../lib/index.js';
import { harmonicSamples } from '../helpers/synth.js';

describe('harmonicAnalysis', () => {
	it('1 s of 50 Hz at 10 kS/s gives five gapless 10-cycle windows of 2000 samples', () => {
		const x = harmonicSamples([{ order: 1, rms: 230 }], { frequencyHz: 50, sampleRateHz: 10_000, cycles: 50 });
		const r = harmonicAnalysis(x, 10_000, { fundamentalHz: 50 });
		expect(r.windows.map((w) => w.startIndex)).toEqual([0, 2000, 4000, 6000, 8000]);
		expect(r.windows.map((w) => w.endIndex)).toEqual([2000, 4000, 6000, 8000, 10000]);
		expect(r.aggregate?.windowCount).toBe(5);
	});

	it('a fractional span holds floor((end − start)/L) windows, each starting where the last ended', () => {
		const fs = 7_800;
		const f1 = 49.93;
		const x = harmonicSamples([{ order: 1, rms: 1 }], { frequencyHz: f1, sampleRateHz: fs, cycles: 47 });
		const len = (10 * fs) / f1;
		const r = harmonicAnalysis(x, fs, { fundamentalHz: f1, startIndex: 12.6, endIndex: 12.6 + 3.7 * len });
		expect(r.windows.length).toBe(3);
		for (let i = 1; i < 3; i++) expect(r.windows[i].startIndex).toBeCloseTo(r.windows[i - 1].endIndex, 9);
	});

	it('aggregate RMS of each order is √(mean of the windows\u2019 squares) (IEC 61000-4-30 aggregation)', () => {
		// 5th harmonic 10 V for two windows, 20 V for three: windows hold whole cycles, so each is pure
		const fs = 10_000;
		const quiet = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 10, phaseDeg: 30 },
			],
			{ frequencyHz: 50, sampleRateHz: fs, cycles: 20 },
		);
		const loud = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 20, phaseDeg: 30 },
			],
			{ frequencyHz: 50, sampleRateHz: fs, cycles: 30 },
		);
		const x = new Float64Array(quiet.length + loud.length);
		x.set(quiet, 0);
		// loud starts at a whole number of cycles, so continuing its phase from 0 matches the quiet part
		x.set(loud, quiet.length);
		const r = harmonicAnalysis(x, fs, { fundamentalHz: 50 });
		const agg = r.aggregate!;
		expect(r.windows[0].set.orders[5].rms).toBeCloseTo(10, 9);
		expect(r.windows[4].set.orders[5].rms).toBeCloseTo(20, 9);
		expect(agg.set.orders[5].rms).toBeCloseTo(Math.sqrt((2 * 100 + 3 * 400) / 5), 9);
		expect(agg.percentOfFundamental[5]).toBeCloseTo((100 * Math.sqrt(280)) / 230, 9);
		// THD recomputed from the aggregated magnitudes (single harmonic: THD_F = rms5/rms1)
		expect(agg.thd.thdF40Percent).toBeCloseTo((100 * Math.sqrt(280)) / 230, 9);
		// the phase is unchanged across windows, so the vector mean keeps it: sine 30° → cosine −60°, relative −60 − 5·(−90) = 30
		expect(agg.set.orders[5].phaseDeg).toBeCloseTo(-60, 9);
		expect(agg.phaseRelDeg[5]).toBeCloseTo(30, 9);
		expect(agg.groups.harmonicGroupRms[5]).toBeCloseTo(Math.sqrt(280), 9);
		expect(agg.startIndex).toBe(0);
		expect(agg.endIndex).toBe(10_000);
	});

	it('aggregate is null and windows empty when not one whole window fits', () => {
		const x = harmonicSamples([{ order: 1, rms: 1 }], { frequencyHz: 50, sampleRateHz: 10_000, cycles: 9 });
		const r = harmonicAnalysis(x, 10_000, { fundamentalHz: 50 });
		expect(r.windows).toEqual([]);
		expect(r.aggregate).toBeNull();
	});

	it('aggregateHarmonicWindows rejects an empty list and windows of different lengths', () => {
		expect(() => aggregateHarmonicWindows([])).toThrow(RangeError);
		const x = harmonicSamples([{ order: 1, rms: 1 }], { frequencyHz: 60, sampleRateHz: 7_680, cycles: 24 });
		const a = harmonicWindow(x, 7_680, { fundamentalHz: 60, cycles: 12 });
		const b = harmonicWindow(x, 7_680, { fundamentalHz: 60, cycles: 10 });
		expect(() => aggregateHarmonicWindows([a, b])).toThrow(RangeError);
	});
});

describe('harmonicAnalysis with resampled windows', () => {
	it('five resampled windows at 7.8 kS/s, f1 = 50.13 Hz, each read a 5 % 5th as 5.0000 % and aggregate to it', () => {
		const fs = 7_800;
		const f1 = 50.13;
		const x = harmonicSamples(
			[
				{ order: 1, rms: 230, phaseDeg: 10 },
				{ order: 5, rms: 11.5, phaseDeg: 100 },
			],
			{ frequencyHz: f1, sampleRateHz: fs, cycles: 51 },
		);
		const r = harmonicAnalysis(x, fs, { fundamentalHz: f1, startIndex: 3.9 });
		expect(r.windows.length).toBe(5);
		for (const w of r.windows) {
			expect(w.resampled).toBe(true);
			expect(w.percentOfFundamental[5]).toBeCloseTo(5, 4);
		}
		const agg = r.aggregate!;
		expect(agg.percentOfFundamental[5]).toBeCloseTo(5, 4);
		// φ_rel(5) = (100 − 90) − 5·(10 − 90) = 410 → 50°, the same in every window, so in the vector mean too
		expect(agg.phaseRelDeg[5]).toBeCloseTo(50, 2);
		// windows are whole cycles apart: the absolute phase at the first window's start holds for all
		const abs1 = 10 - 90 + (360 * f1 * 3.9) / fs;
		expect(Math.cos(((agg.set.orders[1].phaseDeg - abs1) * Math.PI) / 180)).toBeCloseTo(1, 8);
	});
});
