/**
 * analyseCapture's onProgress option: real progress from inside the analysis (every harmonic window, every
 * channel, every stage), checked on a closed-form capture whose window count follows from its length.
 */
import { describe, expect, it } from 'vitest';
import type { Capture } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import type { AnalysisProgress } from '../../lib/report/types.js';
import { sineSamples } from '../helpers/synth.js';

const FS = 10_000;

function twoChannels(cycles: number): Capture {
	const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles });
	const i = sineSamples({ amplitude: 14, frequencyHz: 50, sampleRateHz: FS, cycles, phaseDeg: -30 });
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

describe('analyseCapture(capture, { onProgress })', () => {
	const seen: AnalysisProgress[] = [];
	// 2 s of 50 Hz = 100 cycles = 10 windows of 10 cycles (IEC 61000-4-7 at 50 Hz) per channel
	const report = analyseCapture(twoChannels(100), { onProgress: (p) => seen.push({ ...p }) });

	it('counts every harmonic window of every channel: 10 windows × 2 channels', () => {
		const windows = seen.filter((p) => p.stage === 'harmonics');
		expect(windows.map((p) => p.done)).toEqual(Array.from({ length: 20 }, (_, k) => k + 1));
		expect(windows.every((p) => p.total === 20)).toBe(true);
		expect(report.window.harmonicWindows).toBe(10);
	});

	it('announces each stage as it starts, counts the channels, then the later stages, with a fraction that never decreases and ends at 1', () => {
		expect(seen.filter((p) => p.stage === 'channels').map((p) => `${p.done}/${p.total}`)).toEqual([
			'0/2',
			'1/2',
			'2/2',
		]);
		const stages = [...new Set(seen.map((p) => p.stage))];
		expect(stages).toEqual(['reference', 'events', 'harmonics', 'channels', 'relations', 'flicker']);
		for (let k = 1; k < seen.length; k++) expect(seen[k].fraction).toBeGreaterThanOrEqual(seen[k - 1].fraction);
		expect(seen[0]).toMatchObject({ stage: 'reference', done: 0, fraction: 0 });
		expect(seen.at(-1)!.fraction).toBe(1);
	});

	it('changes no figure: the report equals one made without the option', () => {
		const plain = analyseCapture(twoChannels(100));
		expect(JSON.stringify(report)).toBe(JSON.stringify(plain));
	});
});
