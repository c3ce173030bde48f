import { describe, expect, it } from 'vitest';
import { createTrendAnalyser, type TrendOptions, type TrendResult } from '../../lib/trend/index.js';
import { makeChannels, type ChannelSpec } from './signals.js';

// Rapid voltage changes: IEC 61000-4-30:2015 5.11 as secondary sources describe it (read in a secondary
// source; not in the shared reference notes): steady state = 100 Urms(1/2) values at 50 Hz within the threshold of their mean.
// Expected values are closed forms of the constructed steps.
const V3 = ['L1', 'L2', 'L3'].map((name) => ({ name, quantity: 'voltage' as const, unit: 'V' }));

function run(specs: ChannelSpec[], durationS: number, extra: Partial<TrendOptions> = {}): TrendResult {
	const xs = makeChannels(specs, { f0Hz: 50 }, 10_000, durationS);
	const a = createTrendAnalyser({
		sampleRateHz: 10_000,
		nominalHz: 50,
		declaredV: 230,
		channels: V3.slice(0, xs.length),
		...extra,
	});
	a.push(xs);
	return a.finish();
}

describe('rapid voltage changes (option rvc)', () => {
	it('a step 230 V -> 220.8 V (−4 %) at a zero crossing with a 3 % threshold is one RVC at 2.00 s: ΔUmax = ΔUss = 9.2 V, transition within a cycle', () => {
		const r = run([{ rms: 230, phaseDeg: 0, steps: [{ fromS: 2, toS: 99, rms: 220.8 }] }], 4.5, {
			rvc: { thresholdPercent: 3 },
		});
		expect(r.events.map((e) => e.kind)).toEqual(['rvc']);
		const e = r.events[0];
		// Urms(1/2) windows 1.99-2.01 (half old, half new: 225.45 V, −1.98 %) stays within 3 %; 2.00-2.02 reads 220.8 V (−4 %).
		expect(e.startS).toBeCloseTo(2.0, 3);
		expect(e.durationS).toBeLessThanOrEqual(0.02);
		expect(Math.abs(e.deltaUmaxV! - 9.2)).toBeLessThanOrEqual(0.46); // closed form 230 − 220.8, class A ±0.2 % Udin
		expect(Math.abs(e.deltaUssV! - 9.2)).toBeLessThanOrEqual(0.46);
		expect(e.channels).toEqual(['L1']);
	});

	it('a change that crosses the dip threshold (230 V -> 200 V) is a dip, not an RVC', () => {
		const r = run([{ rms: 230, phaseDeg: 0, steps: [{ fromS: 2, toS: 99, rms: 200 }] }], 4.5, {
			rvc: { thresholdPercent: 3 },
		});
		expect(r.events.map((e) => e.kind)).toEqual(['dip']);
	});

	it('a 2 % step stays under a 3 % threshold; without the option no RVC is looked for', () => {
		expect(
			run([{ rms: 230, phaseDeg: 0, steps: [{ fromS: 2, toS: 99, rms: 225.4 }] }], 4.5, {
				rvc: { thresholdPercent: 3 },
			}).events,
		).toEqual([]);
		expect(run([{ rms: 230, phaseDeg: 0, steps: [{ fromS: 2, toS: 99, rms: 220.8 }] }], 4.5).events).toEqual([]);
	});

	it('on three phases, a step on L2 alone is an RVC on L2; a step back after 2 s is a second RVC', () => {
		const r = run(
			[
				{ rms: 230, phaseDeg: 0 },
				{ rms: 230, phaseDeg: -120, steps: [{ fromS: 1.5063, toS: 3.5063, rms: 239.2 }] },
				{ rms: 230, phaseDeg: 120 },
			],
			6,
			{ rvc: { thresholdPercent: 3 } },
		);
		expect(r.events.map((e) => e.kind)).toEqual(['rvc', 'rvc']);
		for (const [i, t] of [1.5063, 3.5063].entries()) {
			const e = r.events[i];
			expect(e.channels).toEqual(['L2']);
			expect(Math.abs(e.startS - t)).toBeLessThanOrEqual(0.01);
			expect(Math.abs(e.deltaUssV! - 9.2)).toBeLessThanOrEqual(0.46);
		}
	});

	it('rejects a hysteresis not below the threshold', () => {
		expect(() =>
			createTrendAnalyser({ sampleRateHz: 1000, channels: V3, rvc: { thresholdPercent: 3, hysteresisPercent: 3 } }),
		).toThrow(RangeError);
	});
});
