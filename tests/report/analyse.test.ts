/**
 * analyseCapture on captures built from closed-form signals (tests/helpers/synth.ts). Expected values come
 * from formulas written out here, docs/methods.md's tables and computed vectors, or independent sums over the
 * samples; never from the code under test.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import type { Capture, Channel, Quantity } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { harmonicSamples, sineSamples, type Tone } from '../helpers/synth.js';

const schema = JSON.parse(
	readFileSync(join(import.meta.dirname, '..', '..', 'lib', 'report', 'report.schema.json'), 'utf8'),
);
const validate = new Ajv2020({ allErrors: true, strict: false }).compile(schema);

const FS = 10_000;

function channel(name: string, unit: string, quantity: Quantity, samples: Float64Array): Channel {
	return { name, unit, quantity, samples };
}

function capture(channels: Channel[], sampleRateHz = FS): Capture {
	return {
		source: 'test.csv',
		sampleRateHz,
		startS: 0,
		channels,
		metadata: {},
		diagnostics: [{ code: 'test-note', message: 'Made by the test.', severity: 'info' }],
	};
}

function tones(list: Tone[], cycles: number, frequencyHz = 50, offset?: number): Float64Array {
	return harmonicSamples(list, { frequencyHz, sampleRateHz: FS, cycles, offset });
}

describe('analyseCapture: one channel', () => {
	// 230 V rms fundamental, 11.5 V rms 5th (5 %), 10 V DC.
	const u = tones(
		[
			{ order: 1, rms: 230 },
			{ order: 5, rms: 11.5 },
		],
		20.4,
		50,
		10,
	);
	const report = analyseCapture(capture([channel('U1', 'V', 'voltage', u)]));
	const c = report.channels[0];

	it('analyseCapture(capture) separates DC: mean 10, acRms √(230² + 11.5²), rms √(acRms² + 10²) (RMS of a sum of harmonics, docs/methods.md 1.3, read in a secondary source)', () => {
		const ac = Math.hypot(230, 11.5);
		expect(c.mean).toBeCloseTo(10, 6);
		expect(c.acRms).toBeCloseTo(ac, 6);
		expect(c.rms).toBeCloseTo(Math.hypot(ac, 10), 6);
		expect(c.harmonics[0].rms).toBeCloseTo(10, 6); // order 0 is |DC|
	});

	it('analyseCapture(capture) gives THD_F 5 % and THD_R 5/√(1+0.05²) % for a 5 % 5th (THD definitions, docs/methods.md 2.2: IEC terms database definition read in a secondary source, equations from memory)', () => {
		expect(c.thdPercent).toBeCloseTo(5, 6);
		expect(c.thdRPercent).toBeCloseTo(5 / Math.sqrt(1 + 0.05 ** 2), 6);
		expect(c.harmonics[5].percentOfFundamental).toBeCloseTo(5, 6);
		expect(c.harmonics).toHaveLength(51);
	});

	it('analyseCapture(capture) gives K-factor (230² + 11.5²·25)/(230² + 11.5²) (UL K-factor, docs/methods.md 6, read in a secondary source)', () => {
		expect(c.kFactor).toBeCloseTo((230 ** 2 + 11.5 ** 2 * 25) / (230 ** 2 + 11.5 ** 2), 6);
	});

	it('analyseCapture(capture) measures 50 Hz and analyses whole cycles only', () => {
		expect(report.frequencyHz).toBeCloseTo(50, 6);
		expect(c.frequencyHz).toBeCloseTo(50, 6);
		expect(Number.isInteger(report.cyclesAnalysed)).toBe(true);
		expect(report.cyclesAnalysed).toBeLessThanOrEqual(20);
		expect(report.window.endS - report.window.startS).toBeCloseTo(report.cyclesAnalysed / 50, 6);
	});

	it('analyseCapture(capture) lists the importer diagnostics among the assumptions and names the reference', () => {
		expect(report.assumptions).toContain('Made by the test.');
		expect(report.assumptions.some((a) => a.includes('Reference channel U1'))).toBe(true);
		expect(report.referenceChannel).toBe('U1');
	});

	it('reportToJson(analyseCapture(capture)) validates against report.schema.json', () => {
		const json = reportToJson(report);
		expect(validate(json), JSON.stringify(validate.errors)).toBe(true);
	});
});

describe('analyseCapture: windows and span', () => {
	it('analyseCapture(capture) cuts 10-cycle harmonic windows at 50 Hz and 12-cycle ones at 60 Hz (IEC 61000-4-7 4.4.1, docs/methods.md 2.1, read in a secondary source)', () => {
		const r50 = analyseCapture(
			capture([
				channel('U1', 'V', 'voltage', sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 52 })),
			]),
		);
		expect(r50.window.harmonicWindowCycles).toBe(10);
		expect(r50.window.harmonicWindows).toBe(Math.floor(r50.cyclesAnalysed / 10));
		const r60 = analyseCapture(
			capture([
				channel('U1', 'V', 'voltage', sineSamples({ amplitude: 170, frequencyHz: 60, sampleRateHz: FS, cycles: 52 })),
			]),
		);
		expect(r60.window.harmonicWindowCycles).toBe(12);
		expect(r60.channels[0].harmonics[1].rms).toBeCloseTo(170 / Math.SQRT2, 6);
	});

	it("analyseCapture(capture, { span: 'whole-record' }) gives the plain RMS of every sample", () => {
		const x = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 9.3, phaseDeg: 45 });
		let s = 0;
		for (const v of x) s += v * v;
		const plain = Math.sqrt(s / x.length);
		const r = analyseCapture(capture([channel('U1', 'V', 'voltage', x)]), { span: 'whole-record' });
		expect(r.window.span).toBe('whole-record');
		expect(r.channels[0].rms).toBeCloseTo(plain, 9);
		const cycles = analyseCapture(capture([channel('U1', 'V', 'voltage', x)]));
		expect(cycles.channels[0].rms).toBeCloseTo(325 / Math.SQRT2, 3); // whole cycles: A/√2
	});

	it('analyseCapture(capture) of a DC-only capture gives figures over the whole record, no harmonics, and null-safe JSON', () => {
		const x = new Float64Array(2000).fill(12);
		const r = analyseCapture(capture([channel('Udc', 'V', 'voltage', x)]));
		expect(r.cyclesAnalysed).toBe(0);
		expect(r.channels[0].mean).toBe(12);
		expect(r.channels[0].harmonics).toEqual([]);
		expect(r.channels[0].thdPercent).toBeNaN();
		expect(r.warnings.join(' ')).toMatch(/No periodic fundamental/);
		const json = reportToJson(r);
		expect(json.channels[0].thdPercent).toBeNull();
		expect(validate(json), JSON.stringify(validate.errors)).toBe(true);
	});
});

describe('analyseCapture: reference and relations', () => {
	const cycles = 20;
	const i = tones([{ order: 1, rms: 5, phaseDeg: 20 }], cycles); // leads the voltage by 20°
	const u = tones([{ order: 1, rms: 230 }], cycles);

	it('analyseCapture(capture) takes the first voltage channel as reference even when a current comes first', () => {
		const r = analyseCapture(capture([channel('I1', 'A', 'current', i), channel('U1', 'V', 'voltage', u)]));
		expect(r.referenceChannel).toBe('U1');
		expect(r.pairs).toHaveLength(1);
		expect(r.pairs[0].other).toBe('I1');
		expect(r.pairs[0].lagDeg).toBeCloseTo(-20, 6); // leads: negative lag
		expect(r.pairs[0].lagS).toBeCloseTo(-20 / 360 / 50, 6);
	});

	it('analyseCapture(capture) pairs the only voltage with the only current and calls a leading current capacitive (Q1 = V1·I1·sin θ1 < 0, IEEE 1459)', () => {
		const r = analyseCapture(capture([channel('V', 'V', 'voltage', u), channel('I', 'A', 'current', i)]));
		expect(r.power).toHaveLength(1);
		expect(r.power[0].pairedBy).toBe('only-pair');
		expect(r.power[0].reactiveVar).toBeCloseTo(230 * 5 * Math.sin((-20 * Math.PI) / 180), 4);
		expect(r.power[0].activeW).toBeCloseTo(230 * 5 * Math.cos((20 * Math.PI) / 180), 4);
		expect(r.power[0].character).toBe('capacitive');
	});

	it('analyseCapture(capture, { refChannel }) measures phase against that channel', () => {
		const r = analyseCapture(capture([channel('U1', 'V', 'voltage', u), channel('I1', 'A', 'current', i)]), {
			refChannel: 'I1',
		});
		expect(r.referenceChannel).toBe('I1');
		expect(r.pairs[0].other).toBe('U1');
		expect(r.pairs[0].lagDeg).toBeCloseTo(20, 6);
	});

	it('analyseCapture(capture, { refChannel }) throws a RangeError naming the missing channel and the ones there are', () => {
		expect(() => analyseCapture(capture([channel('U1', 'V', 'voltage', u)]), { refChannel: 'U9' })).toThrow(
			/"U9" not found; the channels are U1/,
		);
	});

	it('analyseCapture(capture, { pairs }) uses the pairing the user gives', () => {
		const r = analyseCapture(capture([channel('Ua', 'V', 'voltage', u), channel('Ib', 'A', 'current', i)]), {
			pairs: [{ voltage: 'Ua', current: 'Ib' }],
		});
		expect(r.power.map((p) => [p.voltage, p.current, p.pairedBy])).toEqual([['Ua', 'Ib', 'user']]);
	});

	it('analyseCapture(capture) finds rotation of a balanced set positive, VUF 0, and swapping two phases makes it negative (Fortescue, docs/methods.md 7, read in a secondary source)', () => {
		const set = (b: number, c: number) =>
			capture([
				channel('L1', 'V', 'voltage', tones([{ order: 1, rms: 230, phaseDeg: 0 }], cycles)),
				channel('L2', 'V', 'voltage', tones([{ order: 1, rms: 230, phaseDeg: b }], cycles)),
				channel('L3', 'V', 'voltage', tones([{ order: 1, rms: 230, phaseDeg: c }], cycles)),
			]);
		const pos = analyseCapture(set(-120, 120)).threePhase!;
		expect(pos.rotation).toBe('positive');
		expect(pos.unbalancePercent).toBeCloseTo(0, 6);
		expect(pos.sequence.positive).toBeCloseTo(230, 6);
		expect(pos.sequence.zero).toBeCloseTo(0, 6);
		const neg = analyseCapture(set(120, -120)).threePhase!;
		expect(neg.rotation).toBe('negative');
		expect(neg.sequence.negative).toBeCloseTo(230, 6);
		expect(neg.sequence.positive).toBeCloseTo(0, 6);
	});
});

describe('analyseCapture: limits', () => {
	const cycles = 20;
	const u = tones(
		[
			{ order: 1, rms: 230 },
			{ order: 3, rms: 230 * 0.045 },
		],
		cycles,
	);
	const i = tones(
		[
			{ order: 1, rms: 100, phaseDeg: -10 },
			{ order: 5, rms: 10 },
		],
		cycles,
	);

	it("analyseCapture(capture, { limits: 'iec61000-2-2' }) passes a 4.5 % 3rd against the 5 % level (IEC 61000-2-2 Table 1, docs/methods.md 4.2, from memory)", () => {
		const r = analyseCapture(capture([channel('U1', 'V', 'voltage', u)]), { limits: 'iec61000-2-2' });
		const h3 = r.limits!.rows.find((x) => x.order === 3 && x.figure === 'harmonic')!;
		expect(h3.limit).toBe(5);
		expect(h3.value).toBeCloseTo(4.5, 6);
		expect(h3.margin).toBeCloseTo(0.5, 6);
		expect(r.limits!.pass).toBe(true);
	});

	it("analyseCapture(capture, { limits: 'ieee519', iscIl: 30 }) fails a 10 % 5th current against 7 % of I_L (IEEE 519 Table 2, 20 < ISC/IL < 50, docs/methods.md 4.3, read in a secondary source)", () => {
		const r = analyseCapture(capture([channel('U1', 'V', 'voltage', u), channel('I1', 'A', 'current', i)]), {
			limits: 'ieee519',
			iscIl: 30,
			nominalV: 400,
		});
		const h5 = r.limits!.rows.find((x) => x.channel === 'I1' && x.order === 5)!;
		expect(h5.limit).toBe(7);
		expect(h5.value).toBeCloseTo(10, 6); // I_L not given: the measured fundamental
		expect(h5.pass).toBe(false);
		expect(r.limits!.pass).toBe(false);
		expect(r.limits!.notes.join(' ')).toMatch(/I_L taken as the measured fundamental/);
	});

	it("analyseCapture(capture, { limits: 'ieee519', iscIl: 30, ilA: 200 }) passes the same current as 5 % of I_L, TDD 5 % under 8 % (IEEE 519 Table 2, docs/methods.md 4.3, read in a secondary source)", () => {
		const r = analyseCapture(capture([channel('I1', 'A', 'current', i)]), {
			limits: 'ieee519',
			iscIl: 30,
			ilA: 200,
			nominalV: 400,
		});
		const h5 = r.limits!.rows.find((x) => x.order === 5)!;
		expect(h5.value).toBeCloseTo(5, 6);
		const tdd = r.limits!.rows.find((x) => x.figure === 'tdd')!;
		expect(tdd.value).toBeCloseTo(5, 6);
		expect(tdd.limit).toBe(8);
		expect(r.limits!.pass).toBe(true);
		expect(r.channels[0].tddPercent).toBeCloseTo(5, 6);
	});

	it("analyseCapture(capture, { ieee519Edition }) limits a 2nd-harmonic current to 50 % (2022) or 25 % (2014) of the 3rd-10th band's 7 % (IEEE 519 Table 2 note, docs/methods.md 4.3)", () => {
		const i2 = tones(
			[
				{ order: 1, rms: 100 },
				{ order: 2, rms: 2 },
			],
			cycles,
		);
		const limitOf = (edition: '2014' | '2022') =>
			analyseCapture(capture([channel('I1', 'A', 'current', i2)]), {
				limits: 'ieee519',
				iscIl: 30,
				ilA: 100,
				nominalV: 400,
				ieee519Edition: edition,
			}).limits!.rows.find((x) => x.order === 2)!;
		expect(limitOf('2022').limit).toBeCloseTo(3.5, 9);
		expect(limitOf('2022').pass).toBe(true);
		expect(limitOf('2014').limit).toBeCloseTo(1.75, 9);
		expect(limitOf('2014').pass).toBe(false);
	});

	it("analyseCapture(capture, { limits: 'en50160' }) does not judge current channels and says so", () => {
		const r = analyseCapture(capture([channel('I1', 'A', 'current', i)]), { limits: 'en50160' });
		expect(r.limits!.rows).toEqual([]);
		expect(r.limits!.notes.join(' ')).toMatch(/I1: .* no limits for a current channel/);
	});
});

describe('analyseCapture: three-phase power and neutral', () => {
	const cycles = 20;
	// Balanced 230 V set; each line current 10 A lagging 30° plus 3 A of 3rd harmonic. The 3rd of phase k has
	// phase 3·(−120°·k) ≡ 0°: zero sequence, so the three add in the neutral (docs/methods.md §7, triplens, from memory).
	const make = () =>
		capture(
			[0, 1, 2].flatMap((k) => [
				channel(`L${k + 1}`, 'V', 'voltage', tones([{ order: 1, rms: 230, phaseDeg: -120 * k }], cycles)),
				channel(
					`I${k + 1}`,
					'A',
					'current',
					tones(
						[
							{ order: 1, rms: 10, phaseDeg: -120 * k - 30 },
							{ order: 3, rms: 3, phaseDeg: -360 * k },
						],
						cycles,
					),
				),
			]),
		);
	const r = analyseCapture(make());

	it('analyseCapture(capture) gives a computed neutral of 3 × 3 A = 9 A, all triplen (Kirchhoff; zero-sequence triplens, docs/methods.md 7)', () => {
		expect(r.neutral).not.toBeNull();
		expect(r.neutral!.source).toBe('computed');
		expect(r.neutral!.neutralRmsA).toBeCloseTo(9, 6);
		expect(r.neutral!.triplenRmsA).toBeCloseTo(9, 6);
		expect(r.neutral!.percentOfMaxPhase).toBeCloseTo((100 * 9) / Math.hypot(10, 3), 4);
	});

	it('analyseCapture(capture) gives P = 3·230·10·cos 30° and S_e = 3·V_e·I_e with I_e = √((ΣI² + I_N²)/3) (IEEE 1459-2010 4-wire, docs/methods.md 5.2, from memory)', () => {
		const t = r.threePhasePower!;
		expect(t.channels).toEqual([
			['L1', 'I1'],
			['L2', 'I2'],
			['L3', 'I3'],
		]);
		expect(t.figures.activePowerW).toBeCloseTo(3 * 230 * 10 * Math.cos(Math.PI / 6), 3);
		const ie = Math.sqrt((3 * (100 + 9) + 81) / 3);
		expect(t.figures.effectiveCurrentA).toBeCloseTo(ie, 4);
		expect(t.figures.effectiveVoltageV).toBeCloseTo(230, 4);
		expect(t.figures.effectiveApparentPowerVA).toBeCloseTo(3 * 230 * ie, 2);
		expect(r.power.map((p) => p.phase)).toEqual([1, 2, 3]);
	});

	it('reportToJson(analyseCapture(capture)) with three-phase power and neutral validates against report.schema.json', () => {
		const json = reportToJson(r);
		expect(validate(json), JSON.stringify(validate.errors)).toBe(true);
	});

	it('analyseCapture(capture) reports both the voltage and the current set, voltages first', () => {
		expect(r.threePhaseSets.map((t) => t.quantity)).toEqual(['voltage', 'current']);
		expect(r.threePhase!.channels).toEqual(['L1', 'L2', 'L3']);
		expect(r.threePhaseSets[1].rotation).toBe('positive');
	});

	it('analyseCapture(capture) names the worst cycle of a current with one cycle at double amplitude (per-cycle RMS, IEC 61000-4-30 Urms(1))', () => {
		const x = sineSamples({ amplitude: 14.142, frequencyHz: 50, sampleRateHz: FS, cycles: 12 });
		for (let n = 5 * 200; n < 6 * 200; n++) x[n] *= 2; // cycle 5 (0-based), whole cycle from a zero crossing
		const w = analyseCapture(capture([channel('I1', 'A', 'current', x)])).channels[0].worstCycle!;
		// lib/signal places the crossings beside an amplitude step within about 2 samples, so the cycle RMS
		// is within 1 % of 2 × 14.142/√2 = 20 A and its start within 0.3 ms of 0.1 s.
		expect(w.rmsCycle).toBe(5);
		expect(Math.abs(w.rms - 20)).toBeLessThan(0.2);
		expect(Math.abs(w.rmsStartS - 0.1)).toBeLessThan(3e-4);
		expect(w.lowestRms).toBeCloseTo(10, 2);
	});
});

describe('analyseCapture: line-to-line voltages', () => {
	it('analyseCapture(capture) of U12, U23, U31 gives the phase-voltage VUF 2.7699 % and LVUR 2.4680 % (line voltages hold no zero sequence; docs/methods.md 7 computed vectors)', () => {
		const cycles = 20;
		const va = tones([{ order: 1, rms: 230, phaseDeg: 0 }], cycles);
		const vb = tones([{ order: 1, rms: 220, phaseDeg: -118 }], cycles);
		const vc = tones([{ order: 1, rms: 235, phaseDeg: 121 }], cycles);
		const diff = (x: Float64Array, y: Float64Array) => x.map((v, k) => v - y[k]);
		const r = analyseCapture(
			capture([
				channel('U12', 'V', 'voltage', diff(va, vb)),
				channel('U23', 'V', 'voltage', diff(vb, vc)),
				channel('U31', 'V', 'voltage', diff(vc, va)),
			]),
		);
		const t = r.threePhase!;
		expect(t.connection).toBe('line-to-line');
		expect(t.channels).toEqual(['U12', 'U23', 'U31']);
		expect(t.rotation).toBe('positive');
		expect(t.unbalancePercent).toBeCloseTo(2.7699, 3);
		expect(t.lvurPercent).toBeCloseTo(2.468, 3);
		expect(t.pvurPercent).toBeNaN();
		expect(t.sequence.zero).toBeCloseTo(0, 6);
	});
});

describe('analyseCapture: IEC 61000-4-7 groups', () => {
	it('analyseCapture(capture) puts a tone two 5 Hz bins above h5 into the harmonic group of h5 but not its subgroup (docs/methods.md 2.2 grouping)', () => {
		// 230 V at 50 Hz, 10 V at 250 Hz (h5) and 3 V at 260 Hz (two 5 Hz bins above h5), 10-cycle windows.
		const n = 2 * 10_000; // 2 s
		const x = new Float64Array(n);
		for (let k = 0; k < n; k++) {
			const t = k / FS;
			x[k] =
				Math.SQRT2 *
				(230 * Math.sin(2 * Math.PI * 50 * t) +
					10 * Math.sin(2 * Math.PI * 250 * t) +
					3 * Math.sin(2 * Math.PI * 260 * t));
		}
		const c = analyseCapture(capture([channel('U1', 'V', 'voltage', x)])).channels[0];
		expect(c.groups!.harmonicGroupRms[5]).toBeCloseTo(Math.hypot(10, 3), 2); // G_g,5² = C²(250) + C²(260): bins k−5..k+5
		expect(c.groups!.harmonicSubgroupRms[5]).toBeCloseTo(10, 2); // G_sg,5: bins k−1..k+1 only
		expect(c.groups!.interharmonicGroupRms[5]).toBeCloseTo(3, 2); // C_ig,5: bins k+1..k+9
		expect(c.harmonics[5].rms).toBeCloseTo(10, 2);
		expect(c.thdVariants!.thdG50Percent).toBeCloseTo((100 * Math.hypot(10, 3)) / 230, 2);
	});
});

describe('analyseCapture: digital channels', () => {
	it('analyseCapture(capture) counts the changes of a status channel and times its active span from its normal state', () => {
		const states = new Uint8Array(2000);
		states.fill(1, 500, 740); // active (off the normal 0) from sample 500 for 240 samples
		const c = capture([
			channel('U1', 'V', 'voltage', sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 10 })),
		]);
		c.digital = [{ name: 'trip', normalState: 0, states }];
		const d = analyseCapture(c).digital;
		expect(d).toEqual([{ name: 'trip', normalState: 0, changes: 2, firstActiveS: 500 / FS, activeS: 240 / FS }]);
	});
});
