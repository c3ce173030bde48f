// @vitest-environment jsdom
/**
 * Flicker in the UI: findings from the report's flicker section and the trend view's flicker block.
 * Expected figures: the 8.8 Hz, 0.25 % reference modulation gives a maximum Pinst of 1.00 (IEC 61000-4-15
 * Ed.2 Table 1, from memory); a 230 V -> 220 V step is a 4.35 % change (arithmetic).
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import type { TrendFlicker } from '../../lib/trend/flicker-tracker.js';
import { flickerVerdicts } from '../../src/ui/flicker-verdicts.js';
import FlickerTrend from '../../src/ui/components/FlickerTrend.svelte';
import { flickerCapture } from '../helpers/flicker-signals.js';
import { renderComponent } from './dom.js';

let cleanup: (() => void)[] = [];
afterEach(() => {
	for (const c of cleanup) c();
	cleanup = [];
});

function modulated(fs: number, durationS: number): Capture {
	const modulation = { shape: 'sine', frequencyHz: 8.8, deltaVOverV: 0.0025 } as const;
	return flickerCapture(fs, durationS, modulation, { source: 'lamp.csv' });
}

describe('flickerVerdicts', () => {
	it('a 20 s record: an information finding that there is no Pst, with the highest instantaneous flicker ≈ 1.00', () => {
		const v = flickerVerdicts(analyseCapture(modulated(3200, 20)));
		const f = v.find((x) => x.id === 'flicker-L1')!;
		expect(f.level).toBe('info');
		expect(f.text).toMatch(/no flicker severity \(Pst\)/);
		expect(f.figure).toMatch(/highest instantaneous flicker (0\.9[5-9]|1\.0[0-4]) \(not a Pst\)/);
	});

	it('a 4.35 % voltage step is worth a look (over the 3.3 % lasting-change guide)', () => {
		const fs = 3200;
		const x = new Float64Array(fs * 6).map(
			(_, i) => (i < 3 * fs ? 230 : 220) * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * i) / fs),
		);
		const c: Capture = {
			source: 'step.csv',
			sampleRateHz: fs,
			startS: 0,
			channels: [{ name: 'L1', unit: 'V', quantity: 'voltage', samples: x }],
			metadata: {},
			diagnostics: [],
		};
		const s = flickerVerdicts(analyseCapture(c, { nominalV: 230 })).find((v) => v.id === 'steps-L1')!;
		expect(s.level).toBe('attention');
		expect(s.figure).toMatch(/lasting change 4\.3 %/);
	});
});

describe('FlickerTrend', () => {
	const base: TrendFlicker = {
		channels: ['L1', 'L2'],
		lamp: '230V',
		pst: [],
		plt: [],
		pinstMax: [0.8, 0.3],
		pinst: {
			startS: [5, 6, 7],
			max: [
				[0.1, 0.8, 0.2],
				[0.1, 0.3, 0.2],
			],
		},
	};

	it('without a Pst says it needs 10 minutes and that the plot is not a Pst', () => {
		const r = renderComponent(FlickerTrend, { flicker: base, colours: {} });
		cleanup.push(r.unmount);
		expect(r.container.querySelector('[data-testid="no-pst"]')!.textContent).toMatch(
			/needs a full 10 minutes.*not a Pst.*L1 0\.80, L2 0\.30/s,
		);
	});

	it('a recording within the settling time says it is too short', () => {
		const r = renderComponent(FlickerTrend, {
			flicker: { ...base, pinstMax: [NaN, NaN], pinst: { startS: [], max: [[], []] } },
			colours: {},
		});
		cleanup.push(r.unmount);
		expect(r.container.querySelector('[data-testid="flicker-too-short"]')).not.toBeNull();
		expect(r.container.querySelector('[data-testid="no-pst"]')).toBeNull();
	});

	it('lists each Pst and Plt with the flag in words', () => {
		const rows = Array.from({ length: 12 }, (_, k) => ({
			startS: 600 * k,
			durationS: 600,
			values: [0.5, 1.2],
			flagged: k === 3,
		}));
		const r = renderComponent(FlickerTrend, {
			flicker: { ...base, pst: rows, plt: [{ startS: 0, durationS: 7200, values: [0.5, 1.2], flagged: true }] },
			colours: {},
		});
		cleanup.push(r.unmount);
		const trs = r.container.querySelectorAll('tbody tr');
		expect(trs).toHaveLength(13);
		expect(trs[3].textContent).toMatch(/dip, swell or interruption/);
		expect(trs[12].textContent).toMatch(/Plt, 2 h/);
	});
});
