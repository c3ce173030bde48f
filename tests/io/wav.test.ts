import { readFileSync } from 'node:fs';
import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import { parseWav } from '../../lib/index.js';
import { importErrorOf } from '../helpers/import-error.js';

// wavefile (npm, an independent writer) makes the files; expected values come from the written integer
// codes and the full-scale rule x / 2^(bits−1) (common practice for PCM; float samples are ±1.0 at full scale).
const { WaveFile } = wavefile as unknown as {
	WaveFile: new () => {
		fromScratch(ch: number, rate: number, depth: string, s: number[] | number[][]): void;
		toBuffer(): Uint8Array;
		setTag(t: string, v: string): void;
	};
};

function write(depth: string, channels: number[][], rateHz = 8000, comment?: string): Uint8Array {
	const w = new WaveFile();
	w.fromScratch(channels.length, rateHz, depth, channels.length === 1 ? channels[0] : channels);
	if (comment) w.setTag('ICMT', comment);
	return w.toBuffer();
}

const thrown = importErrorOf;

const N = 400;
const signal = Array.from(
	{ length: N },
	(_, k) => 0.9 * Math.sin((2 * Math.PI * 50 * k) / 8000) + 0.05 * Math.sin((2 * Math.PI * 250 * k) / 8000),
);

describe('parseWav round trip with files written by wavefile', () => {
	for (const bits of [16, 24, 32]) {
		it(`parseWav(${bits}-bit PCM, 400 V full scale) returns the signal within half a quantisation step`, () => {
			const full = 2 ** (bits - 1);
			const codes = signal.map((x) => Math.round(x * full));
			const c = parseWav(write(String(bits), [codes]), `s${bits}.wav`, {
				channels: [{ fullScale: 400, unit: 'V', name: 'U1' }],
			});
			expect(c.sampleRateHz).toBe(8000);
			expect(c.channels[0].samples.length).toBe(N);
			const step = 400 / full;
			for (let k = 0; k < N; k++)
				expect(Math.abs(c.channels[0].samples[k] - 400 * signal[k])).toBeLessThanOrEqual(step / 2 + 1e-12);
			expect(c.channels[0].unit).toBe('V');
			expect(c.channels[0].quantity).toBe('voltage');
		});
	}

	it('parseWav(32-bit float, 200 A full scale) returns the signal within float32 rounding', () => {
		const c = parseWav(write('32f', [signal]), 'f.wav', { channels: [{ fullScale: 200, unit: 'A', name: 'I1' }] });
		// float32 keeps 24 significant bits: relative error below 2^-24
		for (let k = 0; k < N; k++)
			expect(Math.abs(c.channels[0].samples[k] - 200 * signal[k])).toBeLessThanOrEqual(200 * 2 ** -24);
		expect(c.channels[0].quantity).toBe('current');
	});

	it('parseWav(3 channels) keeps channel order, calibrations per channel and kV -> V', () => {
		const a = [1000, -2000, 3000];
		const b = [-1, -2, -3];
		const d = [16384, 0, -16384];
		const c = parseWav(write('16', [a, b, d]), 'three.wav', {
			channels: [
				{ fullScale: 0.65, unit: 'kV', name: 'U L1' },
				{ fullScale: 100, unit: 'A', name: 'I1' },
			],
		});
		expect(c.channels.map((x) => x.name)).toEqual(['U L1', 'I1', 'ch3']);
		// 0.65 kV = 650 V at full scale: 1000/32768 × 650 V
		expect(Array.from(c.channels[0].samples)).toEqual(a.map((v) => expect.closeTo((v / 32768) * 650, 9)));
		expect(Array.from(c.channels[1].samples)).toEqual(b.map((v) => expect.closeTo((v / 32768) * 100, 9)));
		expect(Array.from(c.channels[2].samples)).toEqual([0.5, 0, -0.5]);
		expect(c.channels[0].phase).toBe('L1');
		expect(c.channels[2].unit).toBe('');
		expect(c.channels[2].quantity).toBe('other');
		const d3 = c.diagnostics.find((x) => x.code === 'wav-uncalibrated');
		expect(d3?.severity).toBe('assumption');
		expect(d3?.message).toContain('ch3');
	});

	it('parseWav without calibration leaves fractions of full scale and says so', () => {
		const c = parseWav(write('24', [[4194304, -8388608]]), 'raw.wav');
		expect(Array.from(c.channels[0].samples)).toEqual([0.5, -1]);
		expect(c.channels[0].unit).toBe('');
		expect(c.diagnostics.some((d) => d.code === 'wav-uncalibrated' && d.severity === 'assumption')).toBe(true);
	});

	it('parseWav reads a calibration written in the INFO comment when no options are given', () => {
		const c = parseWav(
			write('16', [[16384], [-16384]], 8000, 'clamp log\nsinecheck-calibration: 1=U1 V 650; 2=I1 A 200'),
			'cal.wav',
		);
		expect(c.channels.map((x) => [x.name, x.unit, x.samples[0]])).toEqual([
			['U1', 'V', 325],
			['I1', 'A', -100],
		]);
		expect(c.diagnostics.some((d) => d.code === 'wav-calibration-from-file')).toBe(true);
	});

	it('parseWav of a file cut inside the data chunk reads the whole frames and warns', () => {
		const bytes = write('16', [
			[1, 2, 3, 4],
			[5, 6, 7, 8],
		]);
		const c = parseWav(bytes.subarray(0, bytes.length - 3), 'cut.wav');
		// 4 frames of 4 bytes; 3 bytes missing leaves 3 whole frames
		expect(c.channels[0].samples.length).toBe(3);
		expect(c.diagnostics.find((d) => d.code === 'wav-truncated')?.severity).toBe('warning');
	});
});

describe('parseWav errors: bad-wav at line 0, column = byte offset + 1', () => {
	const good = write('16', [[1, 2, 3]]);
	const edit = (f: (v: DataView, b: Uint8Array) => void) => {
		const b = good.slice();
		f(new DataView(b.buffer), b);
		return b;
	};
	// Canonical 44-byte header as wavefile writes it: RIFF@0, WAVE@8, 'fmt '@12 (format@20, channels@22,
	// rate@24, bits@34), 'data'@36. Ref: RIFF WAVE canonical header layout (common practice).
	it('wavefile writes the canonical header this block relies on', () => {
		expect(String.fromCharCode(...good.subarray(12, 16))).toBe('fmt ');
		expect(String.fromCharCode(...good.subarray(36, 40))).toBe('data');
	});
	const cases: [string, Uint8Array, number][] = [
		[
			'a text file named .wav (tests/fixtures/wav/csv-named-wav.wav)',
			new Uint8Array(readFileSync('tests/fixtures/wav/csv-named-wav.wav')),
			1,
		],
		['no WAVE after RIFF', edit((_, b) => b.set([65, 86, 73, 32], 8)), 9],
		['a compressed format code (2, ADPCM)', edit((v) => v.setUint16(20, 2, true)), 21],
		['12 bits per sample', edit((v) => v.setUint16(34, 12, true)), 35],
		['a header only 10 bytes long', good.slice(0, 10), 11],
		// with the data chunk renamed, the walk skips it as an unknown chunk and misses 'data' at the end of the file
		['no data chunk (renamed)', edit((_, b) => b.set([120, 120, 120, 120], 36)), good.length + 1],
	];
	for (const [what, bytes, column] of cases) {
		it(`parseWav(${what}) throws bad-wav at column ${column}`, () => {
			const e = thrown(() => parseWav(bytes, 'bad.wav'));
			expect([e.code, e.line, e.column]).toEqual(['bad-wav', 0, column]);
		});
	}

	it('parseWav with more calibrations than channels throws bad-option', () => {
		const e = thrown(() => parseWav(good, 'x.wav', { channels: [{ fullScale: 1 }, { fullScale: 2 }] }));
		expect(e.code).toBe('bad-option');
	});
});
