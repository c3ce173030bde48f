import { describe, expect, it } from 'vitest';
import {
	detectLineToLineVoltages,
	lineToLineSamples,
	lineVoltagePhasors,
	neutralCurrentFigures,
	sqrt3Check,
	starDeltaHints,
	sumHarmonicSets,
	sumPhaseCurrents,
} from '../../lib/polyphase/index.js';
import { phasorAbs, phasorArgDeg, phasorFromPolarDeg, powerWindowRms } from '../../lib/power/index.js';
import { harmonicSamples, sineSamples } from '../helpers/synth.js';
import { setFromSineTones } from '../power/harmonic-set.js';

const P = phasorFromPolarDeg;
const balanced = () =>
	[P(230, 0), P(230, -120), P(230, 120)] as [ReturnType<typeof P>, ReturnType<typeof P>, ReturnType<typeof P>];

describe('line-to-line voltages', () => {
	it('lineToLineSamples of two 230 V phases 120° apart has RMS 230·√3 (closed form)', () => {
		const o = { amplitude: 230 * Math.SQRT2, frequencyHz: 50, sampleRateHz: 10_000, samples: 2001 };
		const u12 = lineToLineSamples(sineSamples(o), sineSamples({ ...o, phaseDeg: -120 }));
		expect(powerWindowRms(u12, { startIndex: 0, endIndex: 2000, cycles: 10 })).toBeCloseTo(230 * Math.sqrt(3), 9);
	});

	it('lineVoltagePhasors of a balanced set gives V12 = √3·230∠30° (textbook star relation)', () => {
		const [v12, v23, v31] = lineVoltagePhasors(...balanced());
		expect(phasorAbs(v12)).toBeCloseTo(230 * Math.sqrt(3), 10);
		expect(phasorArgDeg(v12)).toBeCloseTo(30, 10);
		expect(phasorArgDeg(v23)).toBeCloseTo(-90, 10);
		expect(phasorArgDeg(v31)).toBeCloseTo(150, 10);
	});

	it('sqrt3Check passes a balanced star and fails the docs/methods.md §5.4 unbalanced set (computed vector from the shared reference script)', () => {
		const b = balanced();
		const ok = sqrt3Check(b, lineVoltagePhasors(...b));
		expect(ok.consistent).toBe(true);
		expect(ok.meanRatio).toBeCloseTo(Math.sqrt(3), 12);
		expect(ok.leadDeg.every((a) => Math.abs(a - 30) < 1e-9)).toBe(true);
		const u: typeof b = [P(230, 0), P(220, -118), P(235, 121)];
		expect(sqrt3Check(u, lineVoltagePhasors(...u)).consistent).toBe(false);
	});

	it('sqrt3Check of a negative-rotation balanced set sees the line voltages lag by 30°', () => {
		const n: ReturnType<typeof balanced> = [P(230, 0), P(230, 120), P(230, -120)];
		const c = sqrt3Check(n, lineVoltagePhasors(...n));
		expect(c.consistent).toBe(true);
		expect(c.leadDeg[0]).toBeCloseTo(-30, 10);
	});

	it('throws RangeError for channels of unequal length', () => {
		expect(() => lineToLineSamples(new Float64Array(3), new Float64Array(4))).toThrow(RangeError);
	});
});

describe('neutral current', () => {
	const fs = 10_000;
	const o = { frequencyHz: 50, sampleRateHz: fs, samples: 2001 };
	// balanced 10 A fundamentals plus 3 A of 3rd harmonic per phase; the 3rd is in phase on all lines (3·120° = 360°)
	const phases = [0, -120, 120].map((phi) =>
		harmonicSamples(
			[
				{ order: 1, rms: 10, phaseDeg: phi },
				{ order: 3, rms: 3, phaseDeg: 3 * phi + 25 },
			],
			o,
		),
	);
	const window = { startIndex: 0, endIndex: 2000, cycles: 10 };

	it('sumPhaseCurrents of balanced phases with 3 A of 3rd harmonic leaves 9 A of 3rd in the neutral (3·I3, closed form)', () => {
		const n = sumPhaseCurrents(phases[0], phases[1], phases[2]);
		expect(powerWindowRms(n, window)).toBeCloseTo(9, 9);
	});

	it('neutralCurrentFigures: 9 A is 86.2 % of a √109 A phase current, 100 % triplen (closed form)', () => {
		const sets = [0, -120, 120].map((phi) =>
			setFromSineTones(
				[
					{ order: 1, rms: 10, phaseDeg: phi },
					{ order: 3, rms: 3, phaseDeg: 3 * phi + 25 },
				],
				{ maxOrder: 9 },
			),
		);
		const nSet = sumHarmonicSets(sets[0], sets[1], sets[2]);
		expect(nSet.orders[1].rms).toBeCloseTo(0, 9);
		expect(nSet.orders[3].rms).toBeCloseTo(9, 9);
		const iPh = Math.sqrt(109);
		const f = neutralCurrentFigures('computed', 9, [iPh, iPh, iPh], nSet);
		expect(f.percentOfMaxPhase).toBeCloseTo((100 * 9) / iPh, 9);
		expect(f.triplenRmsA).toBeCloseTo(9, 9);
		expect(f.triplenPercentOfNeutral).toBeCloseTo(100, 6);
		expect(f.largestTriplenOrder).toBe(3);
		expect(f.sentence).toContain('triplen');
	});

	it('a neutral larger than every phase is called out (5th-free rectifier loads: 3 A of 3rd on 1 A fundamentals)', () => {
		const iPh = Math.sqrt(1 + 9);
		const f = neutralCurrentFigures('measured', 9, [iPh, iPh, iPh]);
		expect(f.percentOfMaxPhase).toBeGreaterThan(100);
		expect(f.sentence).toMatch(/more than any phase/);
		expect(f.triplenRmsA).toBeNaN();
	});

	it('sumHarmonicSets refuses sets from different windows', () => {
		const a = setFromSineTones([{ order: 1, rms: 1 }]);
		expect(() => sumHarmonicSets(a, a, { ...a, startS: 1 })).toThrow(RangeError);
	});
});

describe('detectLineToLineVoltages', () => {
	it('says a capture of U12/U23/U31 holds line-to-line voltages', () => {
		const r = detectLineToLineVoltages([
			{ name: 'U12', rmsV: 401 },
			{ name: 'U23', rmsV: 399 },
			{ name: 'U31', rmsV: 402 },
		]);
		expect(r.verdict).toBe('line-to-line');
		expect(r.diagnostics.some((d) => d.code === 'voltages-line-to-line')).toBe(true);
	});

	it('warns when channels named as phases read 400 V (the line voltage of 230/400 V, IEC 60038 from memory)', () => {
		const r = detectLineToLineVoltages([
			{ name: 'U1', rmsV: 400 },
			{ name: 'U2', rmsV: 398 },
			{ name: 'U3', rmsV: 402 },
		]);
		expect(r.verdict).toBe('line-to-neutral');
		expect(r.diagnostics.filter((d) => d.code === 'voltage-name-level-mismatch')).toHaveLength(3);
	});

	it('reads unnamed channels by level alone, and 220 V as ambiguous (127/220 vs 220/380)', () => {
		const r = detectLineToLineVoltages([
			{ name: 'CH1', rmsV: 415 },
			{ name: 'CH2', rmsV: 220 },
		]);
		expect(r.channels.map((c) => c.reading)).toEqual(['line-to-line', 'unknown']);
	});

	it('notes a voltage set that sums to zero exactly, as line voltages always do', () => {
		const b = balanced();
		const ll = lineVoltagePhasors(...b);
		const r = detectLineToLineVoltages(ll.map((p, k) => ({ name: `CH${k + 1}`, rmsV: 300, phasor: p })));
		expect(r.diagnostics.some((d) => d.code === 'voltages-sum-to-zero')).toBe(true);
	});
});

describe('starDeltaHints', () => {
	it('finds a measured line voltage that disagrees with the phase-voltage difference (a swapped channel)', () => {
		const b = balanced();
		const ll = lineVoltagePhasors(...b);
		const hints = starDeltaHints({ phaseVoltages: b, lineVoltages: [ll[0], ll[2], ll[1]] });
		expect(hints.find((d) => d.code === 'line-voltage-agreement')!.severity).toBe('warning');
		expect(
			starDeltaHints({ phaseVoltages: b, lineVoltages: ll }).find((d) => d.code === 'line-voltage-agreement')!.severity,
		).toBe('info');
	});

	it('line currents summing to zero suggest 3-wire; a residual in a declared 3-wire circuit is a warning, in a 4-wire one information', () => {
		const i3: ReturnType<typeof balanced> = [P(10, -20), P(10, -140), P(10, 100)];
		expect(starDeltaHints({ lineCurrents: i3 }).map((d) => d.code)).toEqual(['currents-sum-to-zero']);
		const unb: ReturnType<typeof balanced> = [P(10, -30), P(12, -150), P(8, 90)];
		const h = starDeltaHints({ lineCurrents: unb, wiring: '3-wire' });
		expect(h[0].code).toBe('currents-leave-neutral-current');
		expect(h[0].severity).toBe('warning');
		expect(starDeltaHints({ lineCurrents: unb, wiring: '4-wire' })[0].severity).toBe('info');
	});

	it('notes voltage/current angles all near 30° (line voltages taken for phase voltages on a resistive load)', () => {
		const b = balanced();
		const ll = lineVoltagePhasors(...b);
		const i: ReturnType<typeof balanced> = [P(10, 0), P(10, -120), P(10, 120)];
		expect(starDeltaHints({ phaseVoltages: ll, lineCurrents: i }).some((d) => d.code === 'angles-near-30')).toBe(true);
	});
});
