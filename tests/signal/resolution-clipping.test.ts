import { describe, expect, it } from 'vitest';
import { channelResolution } from '../../lib/signal/code-step.js';
import { signalWarnings } from '../../lib/signal/warnings.js';

/** An 8-bit scope channel: ±4 V in 256 codes (q = 31.25 mV), then × probe ratio. */
function eightBit(
	n: number,
	fs: number,
	f: number,
	peakV: number,
	opts: { clipAtV?: number; probe?: number; startS?: number } = {},
): Float64Array {
	const q = 8 / 256;
	const x = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		let v = peakV * Math.sin(2 * Math.PI * f * ((opts.startS ?? 0) + i / fs));
		if (opts.clipAtV !== undefined) v = Math.max(-opts.clipAtV, Math.min(opts.clipAtV, v));
		x[i] = q * Math.round(v / q) * (opts.probe ?? 1);
	}
	return x;
}

describe('channelResolution', () => {
	it('channelResolution(8-bit ±4 V through a x100 probe) gives the code step 3.125 V and floor q/√12 (uniform rounding error, Widrow; common practice)', () => {
		const x = eightBit(20_000, 1e6, 50.2, 3.2527, { probe: 100, startS: -0.01 });
		const r = channelResolution(x);
		expect(r).toBeDefined();
		expect(r!.codeStep).toBeCloseTo(3.125, 9);
		expect(r!.noiseRms).toBeCloseTo(3.125 / Math.sqrt(12), 9);
		// 3.2527 V peak is 104.09 codes: the record spans codes −104…104, 209 of them
		expect(r!.codesUsed).toBe(209);
		expect(r!.bitsUsed).toBeCloseTo(Math.log2(209), 9);
	});

	it('channelResolution(a float record with noise) gives no code step', () => {
		let s = 1;
		const x = Float64Array.from(
			{ length: 5000 },
			(_, i) => Math.sin(i / 30) + ((s = (s * 16807) % 2147483647) / 2147483647 - 0.5) * 1e-3,
		);
		expect(channelResolution(x)).toBeUndefined();
	});
});

describe('signalWarnings clipping rule', () => {
	it('signalWarnings(slow 8-bit crest at 1 MS/s, frequency unknown) raises no clipping: the top code lasts ~880 samples (2·acos(1 − q/A)/(2π) of 19 920, closed form)', () => {
		const x = eightBit(20_000, 1e6, 50.2, 3.2527, { startS: -0.01 });
		// the crest really does sit on one code for hundreds of samples
		let run = 0;
		let longest = 0;
		let max = -Infinity;
		for (const v of x) max = Math.max(max, v);
		for (const v of x) {
			run = v === max ? run + 1 : 0;
			longest = Math.max(longest, run);
		}
		expect(longest).toBeGreaterThan(300);
		const w = signalWarnings(x, 1e6, {});
		expect(w.find((d) => d.code === 'clipping')).toBeUndefined();
	});

	it('signalWarnings(8-bit sine clipped at 2.9 V of a 3.25 V peak) raises clipping (flanks meet the flat top at a slope break)', () => {
		const x = eightBit(20_000, 1e6, 50.2, 3.2527, { clipAtV: 2.9, startS: -0.01 });
		const w = signalWarnings(x, 1e6, {});
		expect(w.find((d) => d.code === 'clipping')?.message).toMatch(/flat run/);
	});

	it('signalWarnings(float sine clipped at 90 % of its peak, 10 kS/s, 50 Hz known) raises clipping', () => {
		const x = Float64Array.from({ length: 2000 }, (_, i) =>
			Math.max(-292.7, Math.min(292.7, 325.27 * Math.sin((2 * Math.PI * 50 * i) / 10_000))),
		);
		const w = signalWarnings(x, 10_000, { frequencyHz: 50 });
		expect(w.find((d) => d.code === 'clipping')).toBeDefined();
	});
});
