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
	channels: { name: string; unit: string; quantity: string; expected: { recordRms: number } }[];
}
const truth = JSON.parse(readFileSync('sample-waves/ground-truth.json', 'utf8')) as { files: Truth[] };
const load = (name: string) => ({ name, bytes: new Uint8Array(readFileSync('sample-waves/' + name)) });

describe('sample-waves demo captures', () => {
	it('ground-truth.json lists at least five captures in at least four layouts', () => {
		expect(truth.files.length).toBeGreaterThanOrEqual(5);
		const kinds = new Set(truth.files.map((f) => f.file.split('.').pop()));
		expect([...kinds].sort()).toEqual(['cfg', 'csv', 'wav']);
	});

	for (const f of truth.files) {
		it(`openCaptures(${f.file}) opens without error with the channels, rate and length of its ground truth`, () => {
			const { captures, errors } = openCaptures([load(f.file), ...f.companions.map(load)]);
			expect(errors.map(String)).toEqual([]);
			expect(captures).toHaveLength(1);
			const c = captures[0];
			expect(c.channels).toHaveLength(f.channelCount);
			expect(c.digital?.length ?? 0).toBe(f.digitalCount);
			expect(c.sampleRateHz).toBeCloseTo(f.sampleRateHz, 6);
			expect(c.startS).toBeCloseTo(f.startS, 9);
			expect(c.channels.map((ch) => [ch.name, ch.unit, ch.quantity])).toEqual(f.channels.map((ch) => [ch.name, ch.unit, ch.quantity]));
			for (const ch of c.channels) expect(ch.samples.length).toBe(f.samples);
		});

		it(`openCaptures(${f.file}) gives each channel the RMS its construction implies (within 0.1 %)`, () => {
			const c = openCaptures([load(f.file), ...f.companions.map(load)]).captures[0];
			c.channels.forEach((ch, i) => {
				let sum = 0;
				for (let k = 0; k < ch.samples.length; k++) sum += ch.samples[k] * ch.samples[k];
				expect(Math.sqrt(sum / ch.samples.length) / f.channels[i].expected.recordRms).toBeCloseTo(1, 3);
			});
		});
	}
});
