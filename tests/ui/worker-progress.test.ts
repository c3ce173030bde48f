/**
 * The analysis worker's progress (src/ui/worker-core.ts): it passes on lib/report's own stages and window
 * counts, each message with a fraction, so the progress bar follows the analysis itself.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import type { FromWorker } from '../../src/ui/protocol.js';
import { handleMessage } from '../../src/ui/worker-core.js';
import { sineSamples } from '../helpers/synth.js';

const FS = 10_000;

function capture(): Capture {
	// 4 s of 50 Hz: 200 cycles = 20 harmonic windows of 10 cycles (IEC 61000-4-7 at 50 Hz) per channel
	const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 200 });
	const i = sineSamples({ amplitude: 14, frequencyHz: 50, sampleRateHz: FS, cycles: 200, phaseDeg: -30 });
	return {
		source: 'progress.csv',
		sampleRateHz: FS,
		startS: 0,
		channels: [
			{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u },
			{ name: 'I1', unit: 'A', quantity: 'current', samples: i },
		],
		metadata: {},
		diagnostics: [],
	};
}

describe("worker 'analyse': progress from the analysis itself", () => {
	const messages: FromWorker[] = [];
	handleMessage({ type: 'seed', captureKey: 'k', capture: capture() }, () => {});
	handleMessage({ type: 'analyse', jobId: 7, captureKey: 'k', analysis: {} }, (m) => messages.push(m));
	const progress = messages.filter((m) => m.type === 'progress');

	it('ends with the report', () => {
		expect(messages.at(-1)?.type).toBe('analysed');
	});

	it('names the harmonic windows done of all 40 (20 per channel × 2) and never loses its fraction', () => {
		expect(progress.every((m) => m.fraction !== null && m.fraction >= 0 && m.fraction <= 1)).toBe(true);
		expect(progress.some((m) => /harmonics \(\d+ of 40\)/.test(m.stage))).toBe(true);
		expect(progress.some((m) => m.stage.includes('harmonics (40 of 40)'))).toBe(true);
		const fractions = progress.map((m) => m.fraction ?? NaN);
		for (let k = 1; k < fractions.length; k++) expect(fractions[k]).toBeGreaterThanOrEqual(fractions[k - 1]);
		expect(fractions.at(-1)).toBe(1);
	});
});
