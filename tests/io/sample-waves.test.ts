import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/index.js';

// Every demo capture opens through the format dispatch without error, with the channel count, rate, start
// and length that sample-waves/ground-truth.json records. The RMS check compares each channel's whole-record
// RMS, computed here, with the closed form of its construction (√(Σ rms_h²), envelope included).
interface Truth {
	file: string;
	companions: string[];
	sampleRateHz: number;
	samples: number;
	startS: number;
	channelCount: number;
	digitalCount: number;
	fundamentalHz: number;
	channels: {
		name: string;
		unit: string;
		quantity: string;
		envelope: { fromS: number; toS: number }[];
		expected: { recordRms: number };
	}[];
	power: { voltage: string; current: string; activePowerW: number; powerFactor: number }[];
	threePhase: { channels: string[]; unbalanceNegativePct: number; window?: string }[];
}

/** Fundamental phasor (rms, complex) by a single-bin DFT over samples [from, to) holding whole cycles: (√2/N)·Σ x[k]·e^(−jωk). */
function phasor(x: Float64Array, f: number, fs: number, from = 0, to = x.length): [number, number] {
	let re = 0;
	let im = 0;
	for (let k = from; k < to; k++) {
		const w = (2 * Math.PI * f * k) / fs;
		re += x[k] * Math.cos(w);
		im -= x[k] * Math.sin(w);
	}
	return [(Math.SQRT2 * re) / (to - from), (Math.SQRT2 * im) / (to - from)];
}

const truth = JSON.parse(readFileSync('sample-waves/ground-truth.json', 'utf8')) as { files: Truth[] };
const load = (name: string) => ({ name, bytes: new Uint8Array(readFileSync('sample-waves/' + name)) });
const opened = new Map<string, ReturnType<typeof openCaptures>>();
const openDemo = (f: Truth) => {
	if (!opened.has(f.file)) opened.set(f.file, openCaptures([load(f.file), ...f.companions.map(load)]));
	return opened.get(f.file)!;
};

describe('sample-waves demo captures', () => {
	it('ground-truth.json lists at least five captures in at least four layouts', () => {
		expect(truth.files.length).toBeGreaterThanOrEqual(5);
		const kinds = new Set(truth.files.map((f) => f.file.split('.').pop()));
		expect([...kinds].sort()).toEqual(['cfg', 'csv', 'wav']);
	});

	for (const f of truth.files) {
		it(`openCaptures(${f.file}) opens without error with the channels, rate and length of its ground truth`, () => {
			const { captures, errors } = openDemo(f);
			expect(errors.map(String)).toEqual([]);
			expect(captures).toHaveLength(1);
			const c = captures[0];
			expect(c.channels).toHaveLength(f.channelCount);
			expect(c.digital?.length ?? 0).toBe(f.digitalCount);
			expect(c.sampleRateHz).toBeCloseTo(f.sampleRateHz, 6);
			expect(c.startS).toBeCloseTo(f.startS, 9);
			expect(c.channels.map((ch) => [ch.name, ch.unit, ch.quantity])).toEqual(
				f.channels.map((ch) => [ch.name, ch.unit, ch.quantity]),
			);
			for (const ch of c.channels) expect(ch.samples.length).toBe(f.samples);
		});

		it(`openCaptures(${f.file}) gives each channel the RMS its construction implies (within 0.1 %)`, () => {
			const c = openDemo(f).captures[0];
			c.channels.forEach((ch, i) => {
				let sum = 0;
				for (let k = 0; k < ch.samples.length; k++) sum += ch.samples[k] * ch.samples[k];
				expect(Math.sqrt(sum / ch.samples.length) / f.channels[i].expected.recordRms).toBeCloseTo(1, 3);
			});
		});

		it(`${f.file}: mean(u·i) over the record equals the ground truth's active power (within 0.2 %)`, () => {
			// P = (1/N) Σ u[k]·i[k] over whole cycles (IEEE 1459-2010 active power, from memory), done here by sums
			const c = openDemo(f).captures[0];
			const byName = new Map(c.channels.map((ch) => [ch.name, ch.samples]));
			const steady = f.power.filter((p) => f.channels.find((ch) => ch.name === p.voltage)!.envelope.length === 0);
			for (const p of steady) {
				const u = byName.get(p.voltage)!;
				const i = byName.get(p.current)!;
				let sum = 0;
				for (let k = 0; k < u.length; k++) sum += u[k] * i[k];
				expect(sum / u.length / p.activePowerW).toBeCloseTo(1, 2);
			}
		});

		it(`${f.file}: unbalance from DFT phasors of the samples equals the ground truth (within 0.05 points)`, () => {
			// symmetrical components (Fortescue; docs/methods.md §7): X2 = (X1 + a²·X2 + a·X3)/3, X1 = (X1 + a·X2 + a²·X3)/3
			const c = openDemo(f).captures[0];
			const dip = f.channels.flatMap((ch) => ch.envelope)[0];
			for (const t of f.threePhase) {
				// whole record, or for a record with a dip: the cycles before it, or the dip's own cycles
				const [from, to] = !dip
					? [0, f.samples]
					: t.window?.startsWith('during')
						? [dip.fromS, dip.toS].map((s) => Math.round(s * f.sampleRateHz))
						: [0, Math.round(dip.fromS * f.sampleRateHz)];
				const ph = t.channels.map((n) =>
					phasor(c.channels.find((ch) => ch.name === n)!.samples, f.fundamentalHz, f.sampleRateHz, from, to),
				);
				const rot = (z: [number, number], deg: number): [number, number] => {
					const r = (deg * Math.PI) / 180;
					return [z[0] * Math.cos(r) - z[1] * Math.sin(r), z[0] * Math.sin(r) + z[1] * Math.cos(r)];
				};
				const sum = (zs: [number, number][]) => zs.reduce((s, z) => [s[0] + z[0], s[1] + z[1]], [0, 0]);
				const pos = sum([ph[0], rot(ph[1], 120), rot(ph[2], 240)]);
				const neg = sum([ph[0], rot(ph[1], 240), rot(ph[2], 120)]);
				expect((100 * Math.hypot(neg[0], neg[1])) / Math.hypot(pos[0], pos[1])).toBeCloseTo(t.unbalanceNegativePct, 1);
			}
		});
	}
});
