import { describe, expect, it } from 'vitest';
import {
	artificialNeutralPhasors,
	artificialNeutralVoltages,
	lineToLineSamples,
	thirdLineVoltage,
	threePhaseFromSamples,
} from '../../lib/polyphase/index.js';
import { phasorAbs, phasorArgDeg, phasorFromPolarDeg, powerWindowRms } from '../../lib/power/index.js';
import { sineSamples } from '../helpers/synth.js';

const fs = 10_000;
const sine = (rms: number, deg: number) =>
	sineSamples({ amplitude: rms * Math.SQRT2, frequencyHz: 50, sampleRateHz: fs, cycles: 10.4, phaseDeg: deg });
const window = { startIndex: 0, endIndex: 2000, cycles: 10 };

describe('artificialNeutralVoltages', () => {
	it('turns a balanced 400 V line set into 400/√3 V phase voltages (closed form)', () => {
		const u = [sine(400, 30), sine(400, -90), sine(400, 150)];
		const [v1] = artificialNeutralVoltages(u[0], u[1], u[2]);
		expect(powerWindowRms(v1, window)).toBeCloseTo(400 / Math.sqrt(3), 6);
		const p = artificialNeutralPhasors(
			phasorFromPolarDeg(400, 30),
			phasorFromPolarDeg(400, -90),
			phasorFromPolarDeg(400, 150),
		);
		expect(phasorAbs(p[0])).toBeCloseTo(400 / Math.sqrt(3), 10);
		expect(phasorArgDeg(p[0])).toBeCloseTo(0, 10);
	});

	it('gives the true total power of an unbalanced 3-wire load whatever the real neutral voltage (Blondel, invariant)', () => {
		// supply with a 20 V zero-sequence offset in its line-to-neutral voltages: line voltages do not see it
		const vDeg = [0, -120, 120];
		const vn = [0, 1, 2].map((k) => addOffset(sine(230, vDeg[k]), sine(20, 40)));
		const uLine = [0, 1, 2].map((k) => lineToLineSamples(vn[k], vn[(k + 1) % 3]));
		// currents of a 3-wire load sum to zero: I3 = −(I1 + I2)
		const i1 = sine(10, -30);
		const i2 = sine(6, -170);
		const i3 = new Float64Array(i1.length).map((_, n) => -(i1[n] + i2[n]));
		const star = artificialNeutralVoltages(uLine[0], uLine[1], uLine[2]);
		const r = threePhaseFromSamples({ voltages: star, currents: [i1, i2, i3], wiring: '3-wire' }, fs);
		if (!r.ok) throw new Error(r.message);
		// closed form with the true line-to-neutral voltages: P = Σ Re(Vx·Ix*); the offset's power cancels since Σi = 0
		const I1 = phasorFromPolarDeg(10, -30);
		const I2 = phasorFromPolarDeg(6, -170);
		const I3 = { re: -(I1.re + I2.re), im: -(I1.im + I2.im) };
		const p = [I1, I2, I3].reduce((acc, I, k) => {
			const V = phasorFromPolarDeg(230, vDeg[k]);
			return acc + V.re * I.re + V.im * I.im;
		}, 0);
		expect(r.power!.activePowerW / p).toBeCloseTo(1, 6);
		expect(r.voltageSequence.zeroRms).toBeLessThan(1e-6);
	});

	it('thirdLineVoltage closes the triangle: u31 = −(u12 + u23)', () => {
		const u12 = sine(400, 30);
		const u23 = sine(400, -90);
		expect(powerWindowRms(thirdLineVoltage(u12, u23), window)).toBeCloseTo(400, 6);
	});
});

function addOffset(a: Float64Array, b: Float64Array): Float64Array {
	return a.map((x, n) => x + b[n]);
}
