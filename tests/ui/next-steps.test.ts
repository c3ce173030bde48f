// @vitest-environment jsdom
/**
 * The "next steps" part of findings: the steps of the report with their status, needs and the caution;
 * site-value fields that hand the typed value back; the printed form listing the values used.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, getByTestId, queryByTestId } from '@testing-library/dom';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';
import NextSteps from '../../src/ui/components/NextSteps.svelte';
import { harmonicSamples } from '../helpers/synth.js';
import { renderComponent } from './dom.js';

let cleanup: (() => void)[] = [];
afterEach(() => {
	for (const c of cleanup) c();
	cleanup = [];
});
const opts = { frequencyHz: 50, sampleRateHz: 10_000, cycles: 20 };
// 230 V; 10 A lagging 36.87° (DPF 0.8) with a 30 % 5th.
const capture: Capture = {
	source: 'extractor.csv',
	sampleRateHz: 10_000,
	startS: 0,
	metadata: {},
	diagnostics: [],
	channels: [
		{ name: 'U1', unit: 'V', quantity: 'voltage', samples: harmonicSamples([{ order: 1, rms: 230 }], opts) },
		{
			name: 'I1',
			unit: 'A',
			quantity: 'current',
			samples: harmonicSamples(
				[
					{ order: 1, rms: 10, phaseDeg: -36.8699 },
					{ order: 5, rms: 3 },
				],
				opts,
			),
		},
	],
};

describe('NextSteps', () => {
	it('NextSteps without site values shows every step, says what the power-factor step needs, and the caution', () => {
		const report = analyseCapture(capture);
		const onsite = vi.fn();
		const r = renderComponent(NextSteps, { report, site: {}, onsite });
		cleanup.push(r.unmount);
		const pf = getByTestId(r.container, 'step-power-factor-correction');
		expect(pf.textContent).toMatch(/needs site values/);
		expect(pf.textContent).toMatch(/Needs: the target power factor/);
		expect(getByTestId(r.container, 'step-neutral-conductor').textContent).toMatch(/does not apply to this recording/);
		expect(r.container.textContent).toContain(NEXT_STEP_CAUTION);
	});

	it('NextSteps hands a typed target power factor back with the other site values, leaves out a value above 1, and hands the meter response back', () => {
		const report = analyseCapture(capture);
		const onsite = vi.fn();
		const r = renderComponent(NextSteps, { report, site: { transformerKva: 100 }, onsite });
		cleanup.push(r.unmount);
		const input = getByTestId(r.container, 'site-targetPowerFactor') as HTMLInputElement;
		input.value = '0.95';
		fireEvent.change(input);
		expect(onsite).toHaveBeenLastCalledWith({ transformerKva: 100, targetPowerFactor: 0.95 });
		input.value = '1.3';
		fireEvent.change(input);
		expect(onsite).toHaveBeenLastCalledWith({ transformerKva: 100 });
		const response = getByTestId(r.container, 'site-meterResponse') as HTMLSelectElement;
		response.value = 'average';
		fireEvent.change(response);
		expect(onsite).toHaveBeenLastCalledWith({ transformerKva: 100, meterResponse: 'average' });
	});

	it('NextSteps in the printed report (no onsite) has no input fields, lists the site values used and prints each method with its source, with the kvar to add: 1840 W · (0.75 − 0.328684) = 0.78 kvar (power triangle)', () => {
		const site = { targetPowerFactor: 0.95 };
		const report = analyseCapture(capture, { site });
		const r = renderComponent(NextSteps, { report, site });
		cleanup.push(r.unmount);
		expect(queryByTestId(r.container, 'site-targetPowerFactor')).toBeNull();
		expect(r.container.textContent).toMatch(/Site values used: Power factor wanted 0\.95/);
		expect(getByTestId(r.container, 'step-power-factor-correction').textContent).toMatch(/add 0\.78 kvar/);
		// printed: the method with its source is on the page, not folded away
		expect(r.container.querySelector('details')).toBeNull();
		expect(getByTestId(r.container, 'step-power-factor-correction').textContent).toMatch(
			/Qc = P1 · \(tan φ1 − tan φ2\).*IEEE 1036/,
		);
	});
});
