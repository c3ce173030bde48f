// Clipping judged at the range a file states. Ground truth comes from the generator: an 8-bit converter
// on ±4 V gives codes k = −128 … 127 of 8 V / 256 = 0.03125 V each (common practice for a scope's ADC);
// a wave beyond the top code is held at it, so the clipped samples are exactly those the generator
// clamped. The analysis must count them, place the first, and leave a crest away from the range alone.
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../lib/io/csv/parse-csv.js';
import { parseComtrade } from '../../lib/io/comtrade/parse.js';
import { analyseCapture } from '../../lib/report/analyse.js';

const FS = 1e6;
const Q = 8 / 256; // one code of an 8-bit converter on ±4 V
const N = 20_000; // 20 ms at 1 MS/s, trigger in the middle: the first sample at −10 ms

/** 8-bit codes of a 50.1 Hz sine of `peakV` at the scope's input (before the x100 probe), clamped to −128 … 127. */
function codes(peakV: number): Int16Array {
	const out = new Int16Array(N);
	for (let i = 0; i < N; i++) {
		const k = Math.round((peakV * Math.sin(2 * Math.PI * 50.1 * (i / FS) + 0.3)) / Q);
		out[i] = Math.max(-128, Math.min(127, k));
	}
	return out;
}

function scopeCsv(k: Int16Array, rangeRow: string | null): string {
	const rows = ['Sample Interval,1e-06', 'Vertical Units,V', 'Probe Attenuation,100'];
	if (rangeRow) rows.push(rangeRow);
	rows.push('Time,CH1');
	for (let i = 0; i < N; i++) rows.push(`${((i - N / 2) / FS).toFixed(7)},${k[i] * Q}`);
	return rows.join('\n');
}

/** Runs of the clamped codes, as the generator knows them: samples on −128 or 127, the first one, how many runs. */
function truth(k: Int16Array): { samples: number; first: number; runs: number } {
	let samples = 0;
	let first = -1;
	let runs = 0;
	for (let i = 0; i < N; i++) {
		const at = k[i] === 127 || k[i] === -128;
		if (!at) continue;
		samples++;
		if (first < 0) first = i;
		if (i === 0 || k[i - 1] !== k[i]) runs++;
	}
	return { samples, first, runs };
}

const clipWarning = (warnings: string[]) => warnings.find((w) => /clipping/i.test(w));

describe('clipping at the range the file states', () => {
	// 1 % over the top code: the flanks bend over within ~1.3 codes of the flat top, so the wave's shape
	// alone cannot tell the clip from a slow crest; the stated range can.
	const clipped = codes(1.01 * 127 * Q);

	it('analyseCapture(8-bit x100 capture clipped at a stated ±4 V) says clipping with the runs, samples and the first place', () => {
		const c = parseCsv(scopeCsv(clipped, 'Vertical Range,±4'), 'clipped.csv');
		expect(c.channels[0].range).toEqual({ min: -400, max: 400, source: `the preamble's "Vertical Range"` });
		const r = analyseCapture(c);
		const w = clipWarning(r.channels[0].warnings);
		const t = truth(clipped);
		expect(t.runs).toBeGreaterThanOrEqual(2);
		expect(w).toBeDefined();
		expect(w).toContain(`${t.runs} flat run(s)`);
		expect(w).toContain(`${t.samples} samples in all`);
		expect(w).toContain(`(sample ${t.first + 1})`);
		const firstMs = Number((1000 * (-0.01 + t.first / FS)).toFixed(3));
		expect(w).toContain(`the first at ${firstMs} ms`);
		expect(w).toMatch(/-400 … 400/);
	});

	it('the same capture without a stated range is not flagged by the shape rule (so the check above needs the range)', () => {
		const r = analyseCapture(parseCsv(scopeCsv(clipped, null), 'clipped-no-range.csv'));
		expect(clipWarning(r.channels[0].warnings)).toBeUndefined();
	});

	it('analyseCapture(a slow 8-bit crest at 230 V, far inside the stated ±4 V) gives no clipping', () => {
		// 325 V peak through x100 = 3.25 V: the crest sits ~23 codes under the top code, flat for hundreds of samples
		const crest = codes((230 * Math.SQRT2) / 100);
		const r = analyseCapture(parseCsv(scopeCsv(crest, 'Vertical Range,-4..4'), 'crest.csv'));
		expect(r.channels[0].warnings.join('\n')).not.toMatch(/clipping/i);
	});

	it("analyseCapture(COMTRADE clipped at the .cfg's max) says clipping; a flat run below max is not", () => {
		// 16-bit channel, a = 0.01 V per code, min −1000 max 1000 codes (±10 V): 2 cycles at 50 Hz, 6.4 kS/s
		const fs = 6400;
		const n = 256;
		const make = (peakCodes: number, max: number) => {
			const rows: string[] = [];
			for (let i = 0; i < n; i++) {
				const k = Math.round(peakCodes * Math.sin((2 * Math.PI * 50 * i) / fs));
				rows.push(`${i + 1},${(i * 1e6) / fs},${Math.max(-max, Math.min(max, k))}`);
			}
			const cfg = [
				'Tallowmere Joinery test bay,bench,1999',
				'1,1A,0D',
				`1,U1,A,bay,V,0.01,0,0,-${max},${max},1,1,P`,
				'50',
				'1',
				`${fs},${n}`,
				'01/01/2026,00:00:00.000000',
				'01/01/2026,00:00:00.000000',
				'ASCII',
				'1',
			].join('\n');
			return parseComtrade(cfg, new TextEncoder().encode(rows.join('\n')), 'bay.cfg');
		};
		const over = analyseCapture(make(1200, 1000));
		const w = clipWarning(over.channels[0].warnings);
		expect(w).toBeDefined();
		expect(w).toMatch(/-10 … 10/);
		expect(w).toMatch(/the \.cfg's min and max/);
		// the same wave, clamped at 900 codes but with the .cfg's range at ±1000: flat tops inside the range
		const inside = make(1200, 1000);
		const k900 = inside.channels[0].samples.map((x) => Math.max(-9, Math.min(9, x)));
		const r = analyseCapture({ ...inside, channels: [{ ...inside.channels[0], samples: k900 }] });
		expect(clipWarning(r.channels[0].warnings)).toBeUndefined();
	});
});
