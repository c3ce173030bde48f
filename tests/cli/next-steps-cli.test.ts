/**
 * End-to-end: the BUILT command with the next-steps options. Expected figures are hand computations
 * (power triangle) or the library called in this process on the same file (JSON equality).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { ensureBuiltCli, mainJs } from './built-cli.js';
import { writeCsvCapture } from './fixtures.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-next-'));
function run(args: string[]) {
	const r = spawnSync(process.execPath, [mainJs, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
	return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(async () => {
	await ensureBuiltCli();
	// Tallowmere Joinery's dust extractor: 230 V, 10 A lagging 36.87° (DPF 0.8) with a 3 A 5th.
	writeCsvCapture(
		join(dir, 'extractor.csv'),
		[
			{ header: 'U1 (V)', tones: [{ order: 1, rms: 230 }] },
			{
				header: 'I1 (A)',
				tones: [
					{ order: 1, rms: 10, phaseDeg: -36.8699 },
					{ order: 5, rms: 3 },
				],
			},
		],
		{ frequencyHz: 50, sampleRateHz: 10_000, cycles: 20 },
	);
}, 120_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SITE = [
	'--target-pf',
	'0.95',
	'--transformer-kva',
	'100',
	'--transformer-z-pct',
	'4',
	'--transformer-pec-pu',
	'0.1',
	'--meter-crest',
	'3',
	'--meter-bandwidth-hz',
	'200',
];

describe('sinecheck analyse with next-steps options', () => {
	it('analyse --json with site options prints exactly what the library gives with the same site inputs', () => {
		const r = run(['analyse', 'extractor.csv', '--json', ...SITE]);
		expect(r.code).toBe(0);
		const doc = JSON.parse(r.stdout);
		const opened = openCaptures([{ name: 'extractor.csv', bytes: readFileSync(join(dir, 'extractor.csv')) }]);
		const site = {
			targetPowerFactor: 0.95,
			transformerKva: 100,
			transformerImpedancePercent: 4,
			transformerEddyLossPu: 0.1,
			meterCrestFactor: 3,
			meterBandwidthHz: 200,
		};
		expect(doc).toEqual(JSON.parse(JSON.stringify(reportToJson(analyseCapture(opened.captures[0], { site })))));
		expect(doc.nextSteps.site).toEqual(site);
	});

	it('analyse --json: Qc = 230·10·0.8 · (0.75 − tan(acos 0.95)) = 1840 · 0.421316 = 775.2 var (power triangle by hand); one phase recorded, so the resonance is for a three-phase bank of 3 × 0.7752 kvar: √((100/0.04)/2.3256) = 32.8', () => {
		const doc = JSON.parse(run(['analyse', 'extractor.csv', '--json', ...SITE]).stdout);
		const pf = doc.nextSteps.steps[0];
		expect(pf.result.totalReactiveToAddVar).toBeCloseTo(1840 * (0.75 - Math.sqrt(1 - 0.9025) / 0.95), -1);
		expect(pf.result.resonanceOrder).toBeCloseTo(Math.sqrt(2500 / (3 * 0.7752)), 1);
		expect(pf.assumptions.join(' ')).toMatch(/balanced three-phase bank/);
	});

	it('analyse prints the next steps in the table when a site value is given, with the caution', () => {
		const r = run(['analyse', 'extractor.csv', '--target-pf', '0.95']);
		expect(r.stdout).toMatch(/next steps/);
		expect(r.stdout).toMatch(/add 0\.78 kvar/);
		expect(r.stdout).toMatch(/competent person/);
		expect(r.stdout).toMatch(/needs: the short-circuit power at the board/);
		expect(run(['analyse', 'extractor.csv']).stdout).not.toMatch(/next steps/);
	});

	it('analyse --meter-response average with a 200 Hz bandwidth: the 10 A + 3 A 5th current (250 Hz, outside) reads its fundamental, 10 A of √(10² + 3²) = 10.44 A, 4.2 % low', () => {
		const doc = JSON.parse(run(['analyse', 'extractor.csv', '--json', ...SITE, '--meter-response', 'average']).stdout);
		const meter = doc.nextSteps.steps.find((s: { step: string }) => s.step === 'meter-reading');
		expect(doc.nextSteps.site.meterResponse).toBe('average');
		const i1 = meter.result.channels.find((c: { channel: string }) => c.channel === 'I1');
		expect(i1.inBandReading).toBeCloseTo(10, 2);
		expect(i1.bandErrorPercent).toBeCloseTo(100 * (10 / Math.hypot(10, 3) - 1), 1);
	});

	it('analyse --csv --next-steps prints the next-steps rows under their own header', () => {
		const r = run(['analyse', 'extractor.csv', '--csv', '--next-steps', ...SITE]);
		const lines = r.stdout.split('\r\n');
		expect(lines[0]).toBe('file,step,status,figure,value,text');
		expect(
			lines.some((l) => l.startsWith('extractor.csv,power-factor-correction,result,totalReactiveToAddVar,775.')),
		).toBe(true);
	});

	it('analyse --target-pf 1.2, --meter-response peak and --transformer-kva abc are usage errors (exit 2) naming the option', () => {
		const a = run(['analyse', 'extractor.csv', '--target-pf', '1.2']);
		expect(a.code).toBe(2);
		expect(a.stderr).toMatch(/--target-pf 1\.2: expected the target displacement power factor/);
		const c = run(['analyse', 'extractor.csv', '--meter-response', 'peak']);
		expect(c.code).toBe(2);
		expect(c.stderr).toMatch(/--meter-response peak: expected true-rms or average/);
		const b = run(['analyse', 'extractor.csv', '--transformer-kva', 'abc']);
		expect(b.code).toBe(2);
		expect(b.stderr).toMatch(/--transformer-kva abc: expected the transformer rating in kVA/);
	});
});
