import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { overlayFor, scaleKey } from '../../src/ui/charts/wave-overlay.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { analyseSpan } from '../../src/ui/worker-core.js';
import { setDisplayLocale } from '../../src/ui/format.js';
import { sineSamples } from '../helpers/synth.js';
import { captureOf } from '../helpers/capture.js';

setDisplayLocale('en-US');
const FS = 10_000;

function capture(): Capture {
	const u = sineSamples({ amplitude: 325.27, frequencyHz: 50, sampleRateHz: FS, cycles: 30 });
	// a 50 % dip for 5 cycles in the middle of the record (a scenario of our own)
	for (let i = 1000; i < 2000; i++) u[i] *= 0.5;
	const i1 = sineSamples({ amplitude: 10, frequencyHz: 50, sampleRateHz: FS, cycles: 30, phaseDeg: -45 });
	return captureOf(
		[
			{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u },
			{ name: 'I1', unit: 'A', quantity: 'current', samples: i1 },
		],
		FS,
		'dip.csv',
	);
}

describe('overlayFor', () => {
	const c = capture();
	// the worker's one pass: the report, its plot extras and the trend view from the same analysis
	const { report, extras: plot, trend } = analyseSpan(c, {}, true);
	const extras = { ...plot, trend: trend ?? null };
	const chans = c.channels.map((ch) => ({
		name: ch.name,
		unit: ch.unit,
		scale: scaleKey(ch.quantity, ch.unit),
		colour: '#000',
	}));
	const items = overlayFor(report, extras, chans, ['U1', 'I1'], 'I1', (i) => i / FS);

	it("overlayFor draws the RMS and rectified-mean levels at the values of the report, on the channel's own scale", () => {
		const levels = items.filter((x) => x.kind === 'level');
		expect(levels).toHaveLength(4);
		const u1 = report.channels.find((x) => x.name === 'U1')!;
		expect(levels.find((x) => x.kind === 'level' && x.label.startsWith('U1 RMS'))).toMatchObject({
			value: u1.rms,
			scale: 'V',
		});
		expect(levels.find((x) => x.kind === 'level' && x.label.startsWith('U1 rectified'))).toMatchObject({
			value: u1.rectifiedMean,
			scale: 'V',
		});
	});

	it('overlayFor marks each peak at a sample whose value is the reported peak', () => {
		const u1 = report.channels.find((x) => x.name === 'U1')!;
		const peaks = items.filter((x) => x.kind === 'peak' && x.label.startsWith('U1'));
		expect(peaks).toHaveLength(2);
		for (const p of peaks) {
			if (p.kind !== 'peak') continue;
			const sample = c.channels[0].samples[Math.round(p.tS * FS)];
			expect(sample).toBe(p.below ? u1.peakNegative : u1.peak);
		}
	});

	it('overlayFor spans the lag from a reference crossing by lagS, and words it (45° at 50 Hz = 2.50 ms)', () => {
		const lag = items.find((x) => x.kind === 'lag');
		expect(lag?.kind).toBe('lag');
		if (lag?.kind !== 'lag') return;
		expect(lag.toS - lag.fromS).toBeCloseTo(report.pairs.find((p) => p.other === 'I1')!.lagS, 12);
		expect(lag.text).toBe('I1 lags U1 by 45.0°, 2.50 ms');
	});

	it('overlayFor marks the whole cycles used (one tick per reference crossing) and the dip lib/trend found', () => {
		const ticks = items.find((x) => x.kind === 'cycle-ticks');
		expect(ticks?.kind === 'cycle-ticks' && ticks.timesS.length).toBe(report.cyclesAnalysed + 1);
		const ev = items.filter((x) => x.kind === 'event');
		expect(ev).toHaveLength(extras.trend?.result?.events.length ?? -1);
		expect(ev.length).toBeGreaterThan(0);
		// the dip runs from 0.1 s to 0.2 s: the event must start within half a cycle (10 ms) of 0.1 s (IEC 61000-4-30 timing)
		if (ev[0].kind === 'event') expect(Math.abs(ev[0].startS - 0.1)).toBeLessThanOrEqual(0.01 + 1e-9);
	});
});

describe('report groups (the UI takes them from the report)', () => {
	it('analyseCapture gives IEC harmonic groups that equal the DFT component for a pure harmonic on the grid (all its power in bin k = c·h)', async () => {
		const { harmonicSamples } = await import('../helpers/synth.js');
		// 230 V fundamental + 11.5 V 5th: synchronised windows put each tone in one bin, so group = subgroup = component
		const u = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 11.5 },
			],
			{ frequencyHz: 50, sampleRateHz: FS, cycles: 30 },
		);
		const c = captureOf([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u }], FS, 'g.csv');
		const report = analyseCapture(c);
		const g = report.channels[0].groups!;
		expect(g.harmonicGroupRms[5]).toBeCloseTo(11.5, 6);
		expect(g.harmonicSubgroupRms[5]).toBeCloseTo(11.5, 6);
		expect(g.harmonicGroupRms[1]).toBeCloseTo(230, 6);
		expect(g.interharmonicGroupRms[5]).toBeLessThan(1e-6);
		// THDG = 11.5 / 230 = 5 % (closed form)
		expect(report.channels[0].thdVariants!.thdG50Percent).toBeCloseTo(5, 6);
	});
});
