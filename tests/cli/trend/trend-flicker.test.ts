/**
 * `sinecheck trend` flicker output on a float WAV of 601 s at 1600 S/s: 7 changes/min at ΔV/V = 1.459 %,
 * which gives Pst = 1.00 ± 5 % (IEC 61000-4-15:2010 Table 2 and class F1 tolerance, from memory).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { FloatWavWriter } from '../../trend/float-wav.js';
import { forEachChunk } from '../../helpers/flicker-signals.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-flicker-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const sink = textSink;

const FS = 1600;
const DURATION_S = 601;
const wavPath = join(dir, 'flicker.wav');
{
	const w = new FloatWavWriter(wavPath, [{ name: 'L1', unit: 'V' }], FS, FS * DURATION_S);
	forEachChunk(
		{
			sampleRateHz: FS,
			mainsHz: 50,
			rmsV: 230,
			durationS: DURATION_S,
			modulation: { shape: 'rectangular', changesPerMinute: 7, deltaVOverV: 0.01459 },
		},
		(c) => w.write([c]),
	);
	w.close();
}

describe('trendCommand: flicker', () => {
	it('--interval flicker writes one Pst row of 1.00 ± 5 % for L1, not flagged', async () => {
		const out = sink();
		const err = sink();
		expect(
			await trendCommand([wavPath], { interval: 'flicker', nominal: 230, thd: false, stdout: out, stderr: err }),
		).toBe(0);
		const lines = out.text().trim().split('\n');
		expect(lines[0]).toBe('interval,start_s,duration_s,flagged,L1 flicker');
		expect(lines).toHaveLength(2);
		const cells = lines[1].split(',');
		expect(cells.slice(0, 4)).toEqual(['Pst 10-min', '0.000', '600.000', '0']);
		expect(Math.abs(Number(cells[4]) - 1)).toBeLessThan(0.05);
	});

	it('--json carries flicker.pst with the same value; CSV mode prints the highest Pst on stderr', async () => {
		const out = sink();
		expect(await trendCommand([wavPath], { json: true, nominal: 230, thd: false, stdout: out, stderr: sink() })).toBe(
			0,
		);
		const doc = JSON.parse(out.text());
		expect(doc.flicker.channels).toEqual(['L1']);
		expect(Math.abs(doc.flicker.pst[0].values[0] - 1)).toBeLessThan(0.05);
		const err = sink();
		expect(
			await trendCommand([wavPath], { interval: '10-min', nominal: 230, thd: false, stdout: sink(), stderr: err }),
		).toBe(0);
		expect(err.text()).toMatch(/highest Pst over 1 interval\(s\) L1 (0\.9[5-9]|1\.0[0-4])/);
	});
});
