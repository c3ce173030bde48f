// Import settings for every format (lib/io/import-settings.ts through openCaptures). Expected values are
// closed forms: value = factor · x for a factor the test states; a W-bit PCM code c stands for c / 2^(W−1)
// of full scale and a float sample x for x (common practice for WAV); clamp: A = V / (mV/A · 10⁻³).
import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import { analyseTrend } from '../../lib/trend/analyse-capture.js';
import { openCapture, openCaptures } from '../../lib/io/open.js';
import { ImportError } from '../../lib/io/import-error.js';
import { comtradeCffBytes } from '../../sample-waves/writers/comtrade.js';
import { makeChannels } from '../trend/signals.js';

type WaveFileLike = {
	fromScratch(ch: number, rate: number, depth: string, s: number[] | number[][]): void;
	toBuffer(): Uint8Array;
};
const { WaveFile } = wavefile as unknown as { WaveFile: new () => WaveFileLike };

function wav(depth: string, channels: number[][], rateHz = 8000): Uint8Array {
	const w = new WaveFile();
	w.fromScratch(channels.length, rateHz, depth, channels.length === 1 ? channels[0] : channels);
	return w.toBuffer();
}

const codes = [1000, -2000, 3000, 16384];

describe('import settings apply to every format', () => {
	it('a WAV named .csv is read as WAV (said in a diagnostic) and its scale applies', () => {
		const c = openCapture({ name: 'scope.csv', bytes: wav('16', [codes]) }, [], {
			settings: { channels: { ch1: { scale: 400, unit: 'V' } } },
		});
		expect(c.format).toBe('wav');
		expect(c.diagnostics.some((d) => d.code === 'format-from-content')).toBe(true);
		// 16-bit code c at 400 (scale) = c / 32768 · 400 V
		expect(Array.from(c.channels[0].samples)).toEqual(codes.map((v) => expect.closeTo((v / 32768) * 400, 9)));
		expect([c.channels[0].unit, c.channels[0].quantity]).toEqual(['V', 'voltage']);
		const d = c.diagnostics.find((x) => x.code === 'channel-from-user');
		expect(d?.message).toContain('ch1');
	});

	it('a float WAV given scale, unit and quantity becomes volts and gives the dip it holds', () => {
		// 230 V, 50 Hz with a 70 % dip for 100 ms from 0.5 s, stored as fractions of 400 V
		const fs = 6400;
		const [u] = makeChannels(
			[{ rms: 230, phaseDeg: 0, steps: [{ fromS: 0.5, toS: 0.6, rms: 161 }] }],
			{ f0Hz: 50 },
			fs,
			1.5,
		);
		const c = openCapture({ name: 'logger.wav', bytes: wav('32f', [Array.from(u, (v) => v / 400)], fs) }, [], {
			settings: { channels: { ch1: { scale: 400, unit: 'V', quantity: 'voltage' } } },
		});
		expect([c.channels[0].unit, c.channels[0].quantity]).toEqual(['V', 'voltage']);
		for (const k of [100, 2000, 5000]) expect(c.channels[0].samples[k]).toBeCloseTo(u[k], 3); // float32 keeps ~7 digits
		const t = analyseTrend(c, { declaredV: 230 });
		expect(t.events.map((e) => e.kind)).toEqual(['dip']);
		expect(Math.abs(t.events[0].startS - 0.5)).toBeLessThanOrEqual(0.01);
		expect(Math.abs(t.events[0].residualV! - 161)).toBeLessThanOrEqual(2);
	});

	it('COMTRADE takes a clamp setting: 100 mV/A turns 0.5 V into 5 A', () => {
		const spec = {
			station: 'Tallowmere Joinery',
			device: 'clamp',
			revYear: 1999 as const,
			lineFrequencyHz: 50,
			rates: [{ sampleRateHz: 1000, endSample: 3 }],
			firstData: '01/02/2026,10:00:00.000000',
			trigger: '01/02/2026,10:00:00.000000',
			fileType: 'ASCII' as const,
			analog: [{ name: 'Clamp out', unit: 'V', values: [0.5, -0.25, 0], a: 0.0001 }],
		};
		const c = openCapture({ name: 'clamp.cff', bytes: comtradeCffBytes(spec) }, [], {
			settings: { channels: { 'Clamp out': { clampMvPerA: 100 } } },
		});
		expect(c.format).toBe('comtrade');
		expect(Array.from(c.channels[0].samples)).toEqual([5, -2.5, 0].map((v) => expect.closeTo(v, 9)));
		expect([c.channels[0].unit, c.channels[0].quantity]).toEqual(['A', 'current']);
		expect(c.diagnostics.some((d) => d.code === 'channel-from-user')).toBe(true);
	});

	it('CSV reports the settings it applied in the same way', () => {
		const c = openCapture({ name: 'a.csv', bytes: new TextEncoder().encode('t (s);P1\n0;1\n0.001;2\n') }, [], {
			settings: { channels: { P1: { scale: 10, quantity: 'voltage' } } },
		});
		expect(c.format).toBe('csv');
		expect(Array.from(c.channels[0].samples)).toEqual([10, 20]);
		expect(c.diagnostics.find((d) => d.code === 'channel-from-user')?.message).toContain('P1');
	});

	it('a rate setting replaces a WAV rate and says so', () => {
		const c = openCapture({ name: 'a.wav', bytes: wav('16', [codes]) }, [], { settings: { sampleRateHz: 10_000 } });
		expect(c.sampleRateHz).toBe(10_000);
		expect(c.diagnostics.find((d) => d.code === 'rate-from-user')?.severity).toBe('assumption');
	});

	it('a setting naming a channel the file does not have is an ImportError, never ignored', () => {
		const r = openCaptures([{ name: 'a.wav', bytes: wav('16', [codes]) }], {
			settings: { channels: { U9: { scale: 2 } } },
		});
		expect(r.captures).toEqual([]);
		expect(r.errors[0]).toBeInstanceOf(ImportError);
		expect(r.errors[0].code).toBe('bad-option');
		expect(r.errors[0].expected).toContain('ch1');
	});
});
