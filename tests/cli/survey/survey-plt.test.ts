/**
 * `sinecheck survey` over a 2-hour recording cut into four binary COMTRADE files: the long-term flicker
 * severity Plt of the 2 hours is the cubic mean of its twelve 10-minute Pst values,
 *   Plt = ∛( Σ Pst_i³ / 12 )   (IEC 61000-4-15:2010, 5.7.3; from memory),
 * computed here by hand, and the Pst values it is made of run on across the file boundaries.
 *
 * The signal: one 230 V, 50 Hz phase at 1600 S/s from 07:59:50 UTC to 10:00:05, so the twelve intervals
 * 08:00-10:00 are whole. Its RMS is modulated by a rectangular wave of 110 changes per minute: from
 * 08:00 to 09:00 with ΔV/V = 0.725 %, which gives Pst = 1.00 (IEC 61000-4-15:2010, Table 2, 230 V lamp,
 * 50 Hz; from memory), then with half of that, 0.3625 %, which gives Pst = 0.50: Pinst follows the square
 * of ΔV/V and Pst the square root of Pinst percentiles, so Pst is proportional to ΔV/V (the
 * flickermeter's square-law demodulator and the Pst formula of 5.7.2; closed form). Hand value:
 *   Plt = ∛( (6 · 1.00³ + 6 · 0.50³) / 12 ) = ∛0.5625 = 0.8255.
 * A flickermeter of class F1 reads these test points to 5 % (IEC 61000-4-15:2010, performance tests; from
 * memory), so each Pst, and Plt, is checked to 5 %.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { surveyCommand } from '../../../src/cli/survey/index.js';
import { trendCommand } from '../../../src/cli/trend/index.js';
import { LEAD_S, writePltRecording } from '../../helpers/plt-recording.js';
import { textSink } from '../trend/text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-plt-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const CUTS_S = [1234.5, 3610.25, 5000]; // four files; none on a 10-minute tick

function writeFiles(): string {
	const folder = join(dir, 'week');
	writePltRecording(folder, CUTS_S);
	return folder;
}

describe('survey: Plt over a 2-hour recording in four files', () => {
	it('is the cubic mean of its 12 Pst (hand value 0.8255 from Pst 1.00 and 0.50), the Pst running on across the files', async () => {
		const folder = writeFiles();
		const out = textSink();
		const err = textSink();
		const code = await surveyCommand([folder], { json: true, nominal: 230, stdout: out, stderr: err });
		expect(err.text()).not.toMatch(/sinecheck:/);
		expect(code).toBeLessThan(2);
		const survey = JSON.parse(out.text()) as { lines: { id: string; value: number; used: number }[] };
		const plt = survey.lines.find((l) => l.id === 'flicker-plt')!;
		expect(plt.used).toBe(1);
		const hand = Math.cbrt((6 * 1 ** 3 + 6 * 0.5 ** 3) / 12);
		expect(hand).toBeCloseTo(0.8255, 4);
		expect(Math.abs(plt.value - hand)).toBeLessThanOrEqual(0.05 * hand);

		// the twelve Pst of the same files (trend reads them as one recording), each within class F1's 5 %
		const tOut = textSink();
		await trendCommand([folder], { json: true, nominal: 230, inProcess: true, stdout: tOut, stderr: textSink() });
		const doc = JSON.parse(tOut.text()) as { flicker: { pst: { startS: number; values: number[] }[] } };
		const whole = doc.flicker.pst.filter((p) => p.startS >= LEAD_S - 0.1 && p.startS < LEAD_S + 7200 - 1);
		expect(whole).toHaveLength(12);
		const pst = whole.map((p) => p.values[0]);
		pst.forEach((v, i) => expect(Math.abs(v - (i < 6 ? 1 : 0.5))).toBeLessThanOrEqual(0.05 * (i < 6 ? 1 : 0.5)));
		// the cubic mean of those twelve, by hand, is the survey's Plt
		expect(plt.value).toBeCloseTo(Math.cbrt(pst.reduce((s, v) => s + v ** 3, 0) / 12), 9);
	}, 600_000);
});
