import { describe, expect, it } from 'vitest';
import {
	currentUnbalance,
	lineMagnitudeUnbalance,
	lineVoltageUnbalance,
	phaseRotation,
	phasesFromSequence,
	symmetricalComponents,
	voltageUnbalance,
} from '../../lib/polyphase/index.js';
import { phasorAbs, phasorFromPolarDeg, phasorSub } from '../../lib/power/index.js';

const P = phasorFromPolarDeg;

describe('symmetricalComponents: constructed cases (closed form)', () => {
	it('a balanced positive set 230∠0°, 230∠−120°, 230∠120° gives V1 = 230∠0°, V2 = V0 = 0', () => {
		const s = symmetricalComponents(P(230, 0), P(230, -120), P(230, 120));
		expect(s.positiveRms).toBeCloseTo(230, 10);
		expect(s.positivePhaseDeg).toBeCloseTo(0, 10);
		expect(s.negativeRms).toBeCloseTo(0, 10);
		expect(s.zeroRms).toBeCloseTo(0, 10);
	});

	it('swapping phases 2 and 3 swaps |V1| and |V2| (and the angles) on an unbalanced set', () => {
		const a = P(230, 0);
		const b = P(220, -118);
		const c = P(235, 121);
		const s = symmetricalComponents(a, b, c);
		const t = symmetricalComponents(a, c, b);
		expect(t.positiveRms).toBeCloseTo(s.negativeRms, 10);
		expect(t.negativeRms).toBeCloseTo(s.positiveRms, 10);
		expect(t.zeroRms).toBeCloseTo(s.zeroRms, 10);
		expect(t.positivePhaseDeg).toBeCloseTo(s.negativePhaseDeg, 10);
	});

	it('equal in-phase phasors are pure zero sequence (V0 = V, V1 = V2 = 0)', () => {
		const s = symmetricalComponents(P(10, 30), P(10, 30), P(10, 30));
		expect(s.zeroRms).toBeCloseTo(10, 12);
		expect(s.positiveRms).toBeCloseTo(0, 12);
		expect(s.negativeRms).toBeCloseTo(0, 12);
	});

	it('one phase missing (1∠0°, 1∠−120°, 0) gives |V1| = 2/3, |V2| = |V0| = 1/3 (hand-derived)', () => {
		const s = symmetricalComponents(P(1, 0), P(1, -120), { re: 0, im: 0 });
		expect(s.positiveRms).toBeCloseTo(2 / 3, 12);
		expect(s.negativeRms).toBeCloseTo(1 / 3, 12);
		expect(s.zeroRms).toBeCloseTo(1 / 3, 12);
	});

	it('phasesFromSequence inverts symmetricalComponents (round trip, invariant)', () => {
		const a = P(230, 3);
		const b = P(198, -131);
		const c = P(241, 117);
		const s = symmetricalComponents(a, b, c);
		const [x, y, z] = phasesFromSequence(s.zero, s.positive, s.negative);
		for (const [got, want] of [
			[x, a],
			[y, b],
			[z, c],
		])
			expect(phasorAbs(phasorSub(got, want))).toBeLessThan(1e-9);
	});
});

describe('phase-voltage example of docs/methods.md §5.4/§7 [COMPUTED by reference-vectors.py, not published]', () => {
	const va = P(230, 0);
	const vb = P(220, -118);
	const vc = P(235, 121);

	it('gives |V0| 3.0537, |V1| 228.3105, |V2| 6.3240 V', () => {
		const s = symmetricalComponents(va, vb, vc);
		expect(s.zeroRms).toBeCloseTo(3.0537, 4);
		expect(s.positiveRms).toBeCloseTo(228.3105, 4);
		expect(s.negativeRms).toBeCloseTo(6.324, 4);
	});

	it('gives VUF 2.7699 %, V0/V1 1.3375 %, PVUR 3.6496 %, (max−min)/avg 6.5693 %, LVUR 2.4680 %, β-VUF 2.7699 %', () => {
		const u = voltageUnbalance(va, vb, vc);
		expect(u.vufPercent).toBeCloseTo(2.7699, 4);
		expect(u.zeroSequencePercent).toBeCloseTo(1.3375, 4);
		expect(u.pvurPercent).toBeCloseTo(3.6496, 4);
		expect(u.pvurMaxMinPercent).toBeCloseTo(6.5693, 4);
		expect(u.lvurPercent).toBeCloseTo(2.468, 4);
		expect(u.figures.find((f) => f.code === 'vuf-beta')!.percent).toBeCloseTo(2.7699, 4);
	});

	it('names every figure (code, name, definition, reference) so they cannot be confused', () => {
		const codes = voltageUnbalance(va, vb, vc).figures.map((f) => f.code);
		expect(codes).toEqual([
			'vuf-iec',
			'zero-sequence-ratio',
			'vuf-beta',
			'lvur-nema',
			'pvur-ieee',
			'pvur-ieee-max-min',
		]);
		for (const f of voltageUnbalance(va, vb, vc).figures)
			expect(f.name.length * f.definition.length * f.reference.length).toBeGreaterThan(0);
	});

	it('calls the rotation positive and clear (angle(Vb) − angle(Va) = −118°)', () => {
		const r = phaseRotation(va, vb, vc);
		expect(r.rotation).toBe('positive');
		expect(r.clarity).toBe('clear');
		expect(r.bMinusADeg).toBeCloseTo(-118, 10);
	});
});

describe('NEMA line-voltage unbalance, published examples (NEMA MG 1 LVUR; examples read in a secondary source, docs/methods.md §7)', () => {
	it('460/467/450 V gives LVUR 1.96 % (published); β 0.33364020 and VUF 2.1465 % (computed by docs/check-vectors.py)', () => {
		const u = lineMagnitudeUnbalance(460, 467, 450);
		expect(u.lvurPercent).toBeCloseTo(1.96, 2);
		expect(u.betaRatio).toBeCloseTo(0.3336402, 8);
		expect(u.vufPercent).toBeCloseTo(2.1465, 4);
	});
	it('462/463/455 V gives LVUR 1.1 % (published, one decimal)', () => {
		expect(lineMagnitudeUnbalance(462, 463, 455).lvurPercent).toBeCloseTo(1.1, 1);
	});
	it('480/476/472 V gives LVUR 0.84 % (published), not the (max − min)/avg 1.68 %', () => {
		expect(lineMagnitudeUnbalance(480, 476, 472).lvurPercent).toBeCloseTo(0.84, 2);
	});
	it('the β formula agrees with |V2|/|V1| of the closed line-voltage triangle (460/467/450 V, |V1| 458.947, |V2| 9.851 (computed by docs/check-vectors.py))', () => {
		// place U12 on the real axis, close the triangle by the law of cosines (closed form)
		const [a, b, c] = [460, 467, 450];
		const phi = Math.acos((c * c - a * a - b * b) / (2 * a * b));
		const u12 = { re: a, im: 0 };
		const u23 = { re: b * Math.cos(-phi), im: b * Math.sin(-phi) };
		const u31 = { re: -(u12.re + u23.re), im: -(u12.im + u23.im) };
		const s = symmetricalComponents(u12, u23, u31);
		expect(s.positiveRms).toBeCloseTo(458.947, 3);
		expect(s.negativeRms).toBeCloseTo(9.851, 3);
		expect(lineVoltageUnbalance(u12, u23, u31).vufPercent).toBeCloseTo(lineMagnitudeUnbalance(a, b, c).vufPercent, 10);
	});
	it('a balanced triangle gives β = 1/3 and VUF 0 %', () => {
		const u = lineMagnitudeUnbalance(400, 400, 400);
		expect(u.betaRatio).toBeCloseTo(1 / 3, 15);
		expect(u.vufPercent).toBeCloseTo(0, 6);
		expect(u.lvurPercent).toBe(0);
	});
	it('magnitudes that cannot close a triangle (β > 1/2) give NaN VUF', () => {
		expect(lineMagnitudeUnbalance(100, 100, 300).vufPercent).toBeNaN();
	});
});

describe('phaseRotation', () => {
	it('swapping two phases of a balanced set flips the rotation to negative, clearly', () => {
		const r = phaseRotation(P(230, 0), P(230, 120), P(230, -120));
		expect(r.rotation).toBe('negative');
		expect(r.clarity).toBe('clear');
		expect(r.sentence).toMatch(/swapped/);
	});
	it('one phase missing is still a probable positive rotation (|V2|/|V1| = 0.5)', () => {
		const r = phaseRotation(P(230, 0), P(230, -120), { re: 0, im: 0 });
		expect(r.rotation).toBe('positive');
		expect(r.clarity).toBe('probable');
		expect(r.minorToMajorRatio).toBeCloseTo(0.5, 12);
	});
	it('two phases in antiphase (split phase) cannot be told: |V1| = |V2|', () => {
		expect(phaseRotation(P(120, 0), P(120, 180), { re: 0, im: 0 }).rotation).toBe('undetermined');
	});
	it('an all-zero set is undetermined', () => {
		const z = { re: 0, im: 0 };
		expect(phaseRotation(z, z, z).rotation).toBe('undetermined');
	});
});

describe('currentUnbalance', () => {
	it('of the docs/methods.md §5.4 currents (computed vector from the shared reference script: 10∠−30°, 12∠−150°, 8∠90°) gives max deviation 20 % (closed form: avg 10, dev 2) and |I0|/|I1| = |In|/(3|I1|)', () => {
		const ia = P(10, -30);
		const ib = P(12, -150);
		const ic = P(8, 90);
		const u = currentUnbalance(ia, ib, ic);
		expect(u.maxDeviationPercent).toBeCloseTo(20, 12);
		const inMag = phasorAbs({ re: ia.re + ib.re + ic.re, im: ia.im + ib.im + ic.im });
		expect(inMag).toBeCloseTo(3.4641, 4); // docs/methods.md §5.4 (computed by docs/check-vectors.py)
		expect(u.zeroSequencePercent).toBeCloseTo((100 * inMag) / 3 / symmetricalComponents(ia, ib, ic).positiveRms, 10);
	});
});

describe('unbalance with phase labels in negative rotation', () => {
	it('swapping labels 2 and 3 of the §5.4 set keeps VUF 2.7699 % and V0/V1 1.3375 % (computed by docs/check-vectors.py) and reports the rotation', () => {
		const u = voltageUnbalance(P(230, 0), P(235, 121), P(220, -118));
		expect(u.measuredRotation).toBe('negative');
		expect(u.vufPercent).toBeCloseTo(2.7699, 4);
		expect(u.zeroSequencePercent).toBeCloseTo(1.3375, 4);
		expect(u.figures[0].definition).toMatch(/negative rotation/);
	});
	it('currentUnbalance of a balanced set in negative rotation is 0 %, not 100 %', () => {
		const c = currentUnbalance(P(10, 0), P(10, 120), P(10, -120));
		expect(c.negativeSequencePercent).toBeCloseTo(0, 9);
		expect(c.measuredRotation).toBe('negative');
	});
});

describe('edge cases: zero and NaN input', () => {
	const z = { re: 0, im: 0 };
	it('voltageUnbalance of an all-zero set gives NaN ratios, not 0 % or a throw', () => {
		const u = voltageUnbalance(z, z, z);
		expect(u.vufPercent).toBeNaN();
		expect(u.pvurPercent).toBeNaN();
		expect(u.lvurPercent).toBeNaN();
	});
	it('lineMagnitudeUnbalance(0, 0, 0) gives NaN β, VUF and LVUR', () => {
		const u = lineMagnitudeUnbalance(0, 0, 0);
		expect(u.betaRatio).toBeNaN();
		expect(u.vufPercent).toBeNaN();
		expect(u.lvurPercent).toBeNaN();
	});
	it('a NaN phasor propagates to NaN sequence components and an undetermined rotation', () => {
		const n = { re: NaN, im: 0 };
		expect(symmetricalComponents(n, P(1, -120), P(1, 120)).positiveRms).toBeNaN();
		expect(phaseRotation(n, P(1, -120), P(1, 120)).rotation).toBe('undetermined');
	});
});
