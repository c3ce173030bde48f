import { describe, expect, it } from 'vitest';
import { createTrendAnalyser } from '../../lib/trend/analyser.js';

/** Three voltage channels, RMS and phase (deg) each, at 6.4 kS/s for `seconds`. */
function run(set: [number, number][], seconds: number) {
	const fs = 6400;
	const n = Math.round(seconds * fs);
	const ch = set.map(([rms, deg]) =>
		Float64Array.from(
			{ length: n },
			(_, i) => rms * Math.SQRT2 * Math.cos((2 * Math.PI * 50 * i) / fs + (deg * Math.PI) / 180),
		),
	);
	const a = createTrendAnalyser({
		sampleRateHz: fs,
		nominalHz: 50,
		declaredV: 230,
		channels: ['L1', 'L2', 'L3'].map((name) => ({ name, quantity: 'voltage' as const, unit: 'V' })),
	});
	a.push(ch);
	return a.finish();
}

describe('trend rows carry the voltage unbalance of three voltage channels', () => {
	it('230∠0°, 220∠−118°, 235∠121° V gives u2 = 2.7699 % in every 10-cycle row (docs/methods.md §5.4 / §7 check vector, computed by docs/check-vectors.py)', () => {
		const r = run(
			[
				[230, 0],
				[220, -118],
				[235, 121],
			],
			2,
		);
		expect(r.cycles10.length).toBeGreaterThan(5);
		for (const row of r.cycles10) expect(row.unbalancePercent).toBeCloseTo(2.7699, 3);
	});

	it('a balanced set gives u2 near 0, and the same unbalanced set in reversed channel order gives the same u2', () => {
		const balanced = run(
			[
				[230, 0],
				[230, -120],
				[230, 120],
			],
			1,
		);
		for (const row of balanced.cycles10) expect(row.unbalancePercent!).toBeLessThan(1e-3);
		const reversed = run(
			[
				[230, 0],
				[235, 121],
				[220, -118],
			],
			1,
		);
		for (const row of reversed.cycles10) expect(row.unbalancePercent).toBeCloseTo(2.7699, 3);
	});
});
