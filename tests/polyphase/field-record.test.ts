import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { threePhaseFromSamples } from '../../lib/polyphase/index.js';
import { crossCorrelationLag } from '../../lib/power/index.js';

const dir = '../shared/data/feeder-sag-1999';
const present = existsSync(`${dir}/feeder-sag.cfg`) && existsSync(`${dir}/feeder-sag.dat`);
if (!present) console.warn(`skipping the field-record three-phase tests: ${dir} is absent`);

/** Minimal reader for this one ASCII record, written for the test (independent of lib/io): value = a·raw + b. */
function readRecord(): { fs: number; ch: Record<string, Float64Array> } {
	const cfg = readFileSync(`${dir}/feeder-sag.cfg`, 'utf8').split(/\r?\n/);
	const nA = Number(/(\d+)A/.exec(cfg[1])![1]);
	const chans = cfg.slice(2, 2 + nA).map((l) => {
		const f = l.split(',');
		return { name: f[1], a: Number(f[5]), b: Number(f[6]) };
	});
	const fs = Number(cfg[2 + nA + 2].split(',')[0]);
	const rows = readFileSync(`${dir}/feeder-sag.dat`, 'utf8')
		.split(/\r?\n/)
		.filter((l) => l.trim() !== '');
	const ch: Record<string, Float64Array> = {};
	chans.forEach((c, k) => {
		ch[c.name] = new Float64Array(rows.length);
		rows.forEach((r, n) => (ch[c.name][n] = c.a * Number(r.split(',')[2 + k]) + c.b));
	});
	return { fs, ch };
}

/** First rising zero crossing after sample `from`, linear interpolation, fractional index. */
function risingCrossing(x: Float64Array, from: number): number {
	for (let i = from; i + 1 < x.length; i++) if (x[i] < 0 && x[i + 1] >= 0) return i - x[i] / (x[i + 1] - x[i]);
	return NaN;
}

describe.skipIf(!present)('three-phase analysis of the feeder-sag-1999 field record (pre-dip cycles)', () => {
	const { fs, ch } = present ? readRecord() : { fs: 1, ch: {} as Record<string, Float64Array> };
	const r = present
		? threePhaseFromSamples(
				{ voltages: [ch.Va, ch.Vb, ch.Vc], currents: [ch.Ia, ch.Ib, ch.Ic], wiring: '4-wire' },
				fs,
				{ maxCycles: 3, nominalHz: 60 },
			)
		: undefined;

	it('finds the rotation that the order of the zero crossings shows (independent time-domain reading)', () => {
		if (!r?.ok) throw new Error('analysis failed');
		// period from the declared 60 Hz; each phase's first rising crossing after the first one of Va
		const periodSamples = fs / 60;
		const ta = risingCrossing(ch.Va, 0);
		const delay = (x: Float64Array) =>
			((((risingCrossing(x, Math.floor(ta)) - ta) % periodSamples) + periodSamples) % periodSamples) / periodSamples;
		const bThird = delay(ch.Vb);
		// positive rotation: Vb crosses a third of a period after Va; negative: two thirds
		const expected =
			Math.abs(bThird - 1 / 3) < 0.1 ? 'positive' : Math.abs(bThird - 2 / 3) < 0.1 ? 'negative' : 'undetermined';
		expect(expected).not.toBe('undetermined');
		expect(r.rotation.rotation).toBe(expected);
	});

	it('keeps the IEEE 1459 inequalities on real data: |P| ≤ Se, Ve ≥ Ve1, Ie ≥ Ie1, S1+ ≤ Se1 (invariants)', () => {
		if (!r?.ok) throw new Error('analysis failed');
		const p = r.power!;
		expect(Math.abs(p.activePowerW)).toBeLessThanOrEqual(p.effectiveApparentPowerVA);
		expect(p.effectiveVoltageV).toBeGreaterThanOrEqual(p.effectiveVoltage1V * (1 - 1e-9));
		expect(p.effectiveCurrentA).toBeGreaterThanOrEqual(p.effectiveCurrent1A * (1 - 1e-9));
		expect(p.positiveSequenceApparentPowerVA).toBeLessThanOrEqual(p.effectiveApparentPower1VA * (1 + 1e-9));
	});

	it('the cross-correlation lag of Vb behind Va matches their phasor angle within 0.5° (two independent methods)', () => {
		if (!r?.ok) throw new Error('analysis failed');
		const lag = crossCorrelationLag(ch.Va, ch.Vb, fs, r.window).lagDeg;
		const a = r.voltageSets[0].orders[1].phaseDeg;
		const b = r.voltageSets[1].orders[1].phaseDeg;
		const phasorLag = ((((a - b + 180) % 360) + 360) % 360) - 180;
		expect(Math.abs(lag - phasorLag)).toBeLessThan(0.5);
	});
});
