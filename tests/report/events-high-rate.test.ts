/**
 * Voltage events of a scope-rate record (above 400 kS/s) are looked for on the record averaged in blocks
 * (lib/report/events.ts). Checked against the closed form of the generated signal: a 230 V 50 Hz sine whose
 * amplitude drops to 40 % for exactly 100 ms. Urms(1/2) of a sine is peak/√2 (closed form); the IEC
 * 61000-4-30 5.4 (from memory) half-cycle method places the edges within one half cycle (10 ms at 50 Hz).
 */
import { describe, expect, it } from 'vitest';
import { analyseCapture } from '../../lib/report/index.js';
import type { Capture } from '../../lib/capture.js';

const F = 50;
const V = 230;

function dipRecord(fs: number): Capture {
	const n = Math.round(0.6 * fs);
	const u = new Float64Array(n);
	for (let k = 0; k < n; k++) {
		const t = k / fs;
		const inDip = t >= 0.2 && t < 0.3;
		u[k] = (inDip ? 0.4 : 1) * V * Math.SQRT2 * Math.sin(2 * Math.PI * F * t);
	}
	return {
		source: 'dip.csv',
		sampleRateHz: fs,
		startS: 0,
		channels: [{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u }],
		metadata: {},
		diagnostics: [],
	};
}

describe('voltage events of a record above 400 kS/s', () => {
	for (const fs of [2e6, 5e6]) {
		it(`at ${fs / 1e6} MS/s: one dip to 92 V (40 % of 230 V) lasting 100 ms, and the averaging is stated`, () => {
			const report = analyseCapture(dipRecord(fs), { declaredV: V });
			const events = report.events?.events ?? [];
			expect(events.map((e) => e.kind)).toEqual(['dip']);
			const dip = events[0];
			// the residual is the lowest Urms(1/2): 0.4 × 230 V = 92 V, within 0.5 % (a half-cycle window
			// that straddles the edge reads higher, never lower)
			expect(Math.abs(dip.extremeV - 0.4 * V) / (0.4 * V)).toBeLessThan(0.005);
			expect(Math.abs(dip.startS - 0.2)).toBeLessThan(0.0101);
			expect(Math.abs(dip.durationS - 0.1)).toBeLessThan(0.0201);
			expect(report.assumptions.join(' ')).toMatch(/averaged in blocks of \d+ samples/);
		});
	}
});
