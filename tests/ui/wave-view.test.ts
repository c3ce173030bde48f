import { describe, expect, it } from 'vitest';
import { WaveView } from '../../src/ui/charts/wave-view.js';

describe('WaveView', () => {
	const n = 1_000_001; // 1 s at 1 MS/s
	const x = new Float64Array(n);
	const view = () => new WaveView([x], { startS: 0, sampleRateHz: 1e6 });

	it('zoom(0.5, at) halves the span and keeps `at` at the same fraction of the view', () => {
		const v = view();
		v.zoom(0.5, 0.25);
		expect(v.maxS - v.minS).toBeCloseTo(0.5, 12);
		expect((0.25 - v.minS) / (v.maxS - v.minS)).toBeCloseTo(0.25, 12);
	});

	it('set() clamps to the record and never shows fewer than 8 sample intervals', () => {
		const v = view();
		v.set(-5, 0.1);
		expect(v.minS).toBe(0);
		v.set(0.5, 0.5);
		expect(v.maxS - v.minS).toBeCloseTo(8e-6, 12);
		v.set(0.9, 3);
		expect(v.maxS).toBe(1);
	});

	it('data(columns) decimates a wide view and gives every sample of a narrow one', () => {
		const v = view();
		expect(v.data(1000)[0].length).toBe(2000);
		expect(v.fullDetail).toBe(false);
		v.set(0.5, 0.5 + 100e-6); // 100 samples
		const d = v.data(1000);
		expect(v.fullDetail).toBe(true);
		expect(d[0].length).toBeGreaterThanOrEqual(101);
		expect(d[0].length).toBeLessThanOrEqual(103);
	});

	it('indexAt(t) is the nearest sample', () => {
		const v = view();
		expect(v.indexAt(0.1234564)).toBe(123456);
		expect(v.indexAt(0.1234566)).toBe(123457);
	});
});
