/**
 * The next-steps section through analyseCapture: a balanced three-phase load with a 3rd harmonic on a
 * slightly unbalanced supply, built from closed-form signals. Expected values are written out by hand.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import type { Capture, Channel, ChannelPhase } from '../../lib/capture.js';
import { nextStepsCsv } from '../../lib/next-steps/csv.js';
import { checkSiteInputs } from '../../lib/next-steps/report-section.js';
import { NEXT_STEP_CAUTION } from '../../lib/next-steps/types.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { harmonicSamples } from '../helpers/synth.js';

const schema = JSON.parse(
	readFileSync(join(import.meta.dirname, '..', '..', 'lib', 'report', 'report.schema.json'), 'utf8'),
);
const validate = new Ajv2020({ allErrors: true, strict: false }).compile(schema);
const FS = 10_000;
const opts = { frequencyHz: 50, sampleRateHz: FS, cycles: 20 };
const VOLTS = [230, 230, 220];

function threePhase(): Capture {
	const channels: Channel[] = [];
	for (let k = 0; k < 3; k++)
		channels.push({
			name: `U${k + 1}`,
			unit: 'V',
			quantity: 'voltage',
			phase: `L${k + 1}` as ChannelPhase,
			samples: harmonicSamples([{ order: 1, rms: VOLTS[k], phaseDeg: -120 * k }], opts),
		});
	// 20 A lagging 30° plus an 8 A 3rd (40 %) in phase in all three lines (zero sequence).
	for (let k = 0; k < 3; k++)
		channels.push({
			name: `I${k + 1}`,
			unit: 'A',
			quantity: 'current',
			phase: `L${k + 1}` as ChannelPhase,
			samples: harmonicSamples(
				[
					{ order: 1, rms: 20, phaseDeg: -120 * k - 30 },
					{ order: 3, rms: 8 },
				],
				opts,
			),
		});
	return { source: 'tallowmere-board.csv', sampleRateHz: FS, startS: 0, channels, metadata: {}, diagnostics: [] };
}

describe('nextStepsSection through analyseCapture', () => {
	const site = {
		targetPowerFactor: 0.95,
		transformerKva: 250,
		transformerImpedancePercent: 4,
		meterBandwidthHz: 100,
		meterCrestFactor: 3,
	};
	const report = analyseCapture(threePhase(), { site });
	const steps = Object.fromEntries(report.nextSteps!.steps.map((s) => [s.step, s]));

	it('every step carries its inputs, its method with sources and the caution', () => {
		expect(report.nextSteps!.steps.map((s) => s.step)).toEqual([
			'power-factor-correction',
			'transformer-loading',
			'neutral-conductor',
			'motor-unbalance',
			'meter-reading',
		]);
		for (const s of report.nextSteps!.steps) {
			expect(s.caution).toBe(NEXT_STEP_CAUTION);
			expect(s.inputs.length).toBeGreaterThan(0);
			expect(s.method.length).toBeGreaterThan(0);
		}
	});

	it('power-factor correction: P1 = 230·20·cos 30° = 3983.7 W per phase (220 V on phase 3: 3810.5 W), Qc = P1 (tan 30° − tan(acos 0.95)) (power triangle, by hand)', () => {
		const per = (steps['power-factor-correction'].result as { perPhase: { reactiveToAddVar: number }[] }).perPhase;
		const k = Math.tan(Math.PI / 6) - Math.sqrt(1 - 0.95 ** 2) / 0.95;
		expect(per[0].reactiveToAddVar).toBeCloseTo(230 * 20 * Math.cos(Math.PI / 6) * k, 0);
		expect(per[2].reactiveToAddVar).toBeCloseTo(220 * 20 * Math.cos(Math.PI / 6) * k, 0);
	});

	it('neutral conductor: 3rd at 40 % -> sized on the neutral current 3 × 0.40 × √(20² + 8²) = 25.85 A, ÷ 0.86 = 30.06 A (IEC 60364-5-52 Annex E, from memory); recorded neutral 3 × 8 = 24 A', () => {
		const r = steps['neutral-conductor'].result as { basis: string; designCurrentA: number; recordedNeutralA: number };
		expect(r.basis).toBe('neutral');
		expect(r.designCurrentA).toBeCloseTo((3 * 0.4 * Math.hypot(20, 8)) / 0.86, 2);
		expect(r.recordedNeutralA).toBeCloseTo(24, 2);
	});

	it('motor unbalance: LVUR of the line voltages of 230∠0°, 230∠−120°, 220∠120° by hand, and the derating from the curve', () => {
		const ph = VOLTS.map((v, k) => [
			v * Math.cos((-120 * k * Math.PI) / 180),
			v * Math.sin((-120 * k * Math.PI) / 180),
		]);
		const line = [0, 1, 2].map((k) => Math.hypot(ph[k][0] - ph[(k + 1) % 3][0], ph[k][1] - ph[(k + 1) % 3][1]));
		const mean = (line[0] + line[1] + line[2]) / 3;
		const lvur = (100 * Math.max(...line.map((x) => Math.abs(x - mean)))) / mean;
		const r = steps['motor-unbalance'].result as { unbalancePercent: number; deratingFactor: number };
		expect(r.unbalancePercent).toBeCloseTo(lvur, 2);
		expect(lvur).toBeLessThan(1.5);
		expect(lvur).toBeGreaterThan(1);
		// between the 1 % (1.00) and 1.5 % (0.97) points of the NEMA MG 1 curve
		expect(r.deratingFactor).toBeCloseTo(1 - ((lvur - 1) / 0.5) * 0.03, 3);
	});

	it('meter: a 100 Hz meter misses the 150 Hz 3rd: reads √(20²) of √(20² + 8²) = 21.54 A, 7.2 % low', () => {
		const r = steps['meter-reading'].result as { channels: { channel: string; bandErrorPercent: number }[] };
		expect(r.channels.find((c) => c.channel === 'I1')!.bandErrorPercent).toBeCloseTo(
			100 * (20 / Math.hypot(20, 8) - 1),
			1,
		);
	});

	it('reportToJson validates against report.schema.json, and a figure without its input is null with the input named in needs', () => {
		const json = reportToJson(report);
		expect(validate(json), JSON.stringify(validate.errors)).toBe(true);
		const t = json.nextSteps!.steps.find((s) => s.step === 'transformer-loading')!;
		expect((t.result as Record<string, unknown>).maxLoadCurrentPu).toBeNull();
		expect(t.needs.join(' ')).toMatch(/eddy-current loss/);
	});

	it('nextStepsCsv gives a header and rows naming the file, step and figure', () => {
		const csv = nextStepsCsv([reportToJson(report)]);
		const lines = csv.split('\r\n');
		expect(lines[0]).toBe('file,step,status,figure,value,text');
		expect(lines.some((l) => l.startsWith('tallowmere-board.csv,neutral-conductor,result,designCurrentA,30.0'))).toBe(
			true,
		);
	});

	it('analyseCapture with no site inputs still gives every step, asking for what it needs', () => {
		const bare = analyseCapture(threePhase());
		const pf = bare.nextSteps!.steps[0];
		expect(pf.status).toBe('needs-input');
		expect(pf.needs.join(' ')).toMatch(/target power factor/);
	});
});

describe('checkSiteInputs', () => {
	it('checkSiteInputs throws RangeError naming the input for a target PF above 1, a negative kVA or NaN', () => {
		expect(() => checkSiteInputs({ targetPowerFactor: 1.2 })).toThrow(
			/target displacement power factor must be at most 1/,
		);
		expect(() => checkSiteInputs({ transformerKva: -5 })).toThrow(/transformer rating must be a number above 0/);
		expect(() => checkSiteInputs({ meterBandwidthHz: NaN })).toThrow(RangeError);
		expect(() => analyseCapture(threePhase(), { site: { targetPowerFactor: 0 } })).toThrow(RangeError);
	});
});
