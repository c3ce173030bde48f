import { describe, expect, it } from 'vitest';
import type { Capture, Channel } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { setDisplayLocale } from '../../src/ui/format.js';
import { lagSentence, verdictsFor } from '../../src/ui/verdicts.js';
import { harmonicSamples, shapeSamples, sineSamples } from '../helpers/synth.js';

setDisplayLocale('en-US');
const FS = 10_000;

function capture(channels: Channel[]): Capture {
	return { source: 'synthetic.csv', sampleRateHz: FS, startS: 0, channels, metadata: {}, diagnostics: [] };
}
const volts = (name: string, samples: Float64Array): Channel => ({ name, unit: 'V', quantity: 'voltage', samples });
const amps = (name: string, samples: Float64Array): Channel => ({ name, unit: 'A', quantity: 'current', samples });

describe('lagSentence', () => {
	it('lagSentence words a positive lag as "lags" with degrees and milliseconds', () => {
		expect(lagSentence({ ref: 'U1', other: 'I1', lagDeg: 32, lagS: 0.00178 })).toBe('I1 lags U1 by 32.0°, 1.78 ms');
	});

	it('lagSentence words a negative lag as "leads"', () => {
		expect(lagSentence({ ref: 'U1', other: 'I1', lagDeg: -10, lagS: -0.000556 })).toBe('I1 leads U1 by 10.0°, 0.56 ms');
	});

	it('lagSentence of a current 30° behind its 50 Hz voltage says 30.0° and 1.67 ms (closed form: 30/360 × 20 ms)', () => {
		const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const i = sineSamples({ amplitude: 10, frequencyHz: 50, sampleRateHz: FS, cycles: 20, phaseDeg: -30 });
		const report = analyseCapture(capture([volts('U1', u), amps('I1', i)]));
		const pair = report.pairs.find((p) => p.other === 'I1');
		expect(pair).toBeDefined();
		expect(lagSentence(pair!)).toBe('I1 lags U1 by 30.0°, 1.67 ms');
	});
});

describe('verdictsFor', () => {
	it('verdictsFor a square wave says an average-responding meter reads 11.1 % high (closed form: π/(2√2) − 1 = +11.07 %)', () => {
		const sq = shapeSamples('square', { amplitude: 100, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const v = verdictsFor(analyseCapture(capture([volts('U1', sq)]))).find((x) => x.id === 'meter-U1');
		expect(v?.level).toBe('attention');
		expect(v?.text).toContain('11.1 % high');
	});

	it('verdictsFor a pure sine says an average-responding meter reads right (form factor of a sine is what it is calibrated for)', () => {
		const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const v = verdictsFor(analyseCapture(capture([volts('U1', u)]))).find((x) => x.id === 'meter-U1');
		expect(v?.level).toBe('ok');
		expect(v?.text).toContain('would read right');
	});

	it('verdictsFor a current 30° behind its voltage reports an inductive load (current lags by 30.0°) at power factor 0.87 (cos 30° = 0.866) and flags it below 0.9', () => {
		const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const i = sineSamples({ amplitude: 10, frequencyHz: 50, sampleRateHz: FS, cycles: 20, phaseDeg: -30 });
		const v = verdictsFor(analyseCapture(capture([volts('U1', u), amps('I1', i)]))).find((x) => x.topic === 'load');
		expect(v?.text).toBe('I1 on U1: inductive: current lags the voltage by 30.0°; power factor 0.87 (below 0.9).');
		expect(v?.level).toBe('attention');
		expect(v?.target.tab).toBe('phasors');
	});

	it('verdictsFor a 5th harmonic of 7 % fails EN 50160 (limit 6 %, EN 50160:2010 Table 1; from memory) and names the order', () => {
		const u = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 230 * 0.07 },
			],
			{ frequencyHz: 50, sampleRateHz: FS, cycles: 20 },
		);
		const v = verdictsFor(analyseCapture(capture([volts('U1', u)]), { limits: 'en50160' })).find(
			(x) => x.id === 'distortion-U1',
		);
		expect(v?.level).toBe('fail');
		expect(v?.figure).toContain('5th harmonic 7.00 % (limit 6.00 %)');
		expect(v?.target).toEqual({ tab: 'harmonics', channel: 'U1' });
	});

	it('verdictsFor a 5th harmonic of 3 % passes EN 50160 (limit 6 %)', () => {
		const u = harmonicSamples(
			[
				{ order: 1, rms: 230 },
				{ order: 5, rms: 230 * 0.03 },
			],
			{ frequencyHz: 50, sampleRateHz: FS, cycles: 20 },
		);
		const v = verdictsFor(analyseCapture(capture([volts('U1', u)]), { limits: 'en50160' })).find(
			(x) => x.id === 'distortion-U1',
		);
		expect(v?.level).toBe('ok');
		expect(v?.figure).toContain('5th harmonic at 3.00 % of 6.00 % allowed');
	});

	it('verdictsFor a low power factor with the current in phase says the shortfall comes from harmonics (PF = DPF × I1/I, IEEE 1459)', () => {
		// in-phase current with a 100 % 3rd harmonic: DPF = 1, distortion factor 1/√2, so PF = 0.707
		const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20.5 });
		const i = harmonicSamples(
			[
				{ order: 1, rms: 10 },
				{ order: 3, rms: 10 },
			],
			{ frequencyHz: 50, sampleRateHz: FS, cycles: 20.5 },
		);
		const v = verdictsFor(analyseCapture(capture([volts('U1', u), amps('I1', i)]))).find((x) => x.topic === 'load');
		expect(v?.text).toContain('power factor 0.71 (below 0.9)');
		expect(v?.text).toContain('comes from harmonic current');
	});

	const threePhase = (bDeg: number, cDeg: number, cScale = 1) =>
		capture([
			volts('U1', sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20 })),
			volts('U2', sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20, phaseDeg: bDeg })),
			volts(
				'U3',
				sineSamples({ amplitude: 325 * cScale, frequencyHz: 50, sampleRateHz: FS, cycles: 20, phaseDeg: cDeg }),
			),
		]);

	it('verdictsFor a balanced a-b-c set (b 120° behind a) says the rotation is positive and the set balanced', () => {
		const vs = verdictsFor(analyseCapture(threePhase(-120, 120)));
		expect(vs.find((v) => v.id === 'rotation')?.level).toBe('ok');
		expect(vs.find((v) => v.id === 'rotation')?.text).toContain('positive');
		expect(vs.find((v) => v.id === 'unbalance')?.level).toBe('ok');
	});

	it('verdictsFor a set with two phases swapped says the rotation is reversed', () => {
		const v = verdictsFor(analyseCapture(threePhase(120, -120))).find((x) => x.id === 'rotation');
		expect(v?.level).toBe('attention');
		expect(v?.text).toContain('reversed');
	});

	it('verdictsFor one phase 10 % low flags unbalance above 2 % (VUF of (1,1,0.9) ≈ 3.4 %: |V2|/|V1| = 0.1/2.9)', () => {
		const v = verdictsFor(analyseCapture(threePhase(-120, 120, 0.9))).find((x) => x.id === 'unbalance');
		expect(v?.level).toBe('attention');
		expect(v?.figure).toContain('3.45 %');
	});
});
