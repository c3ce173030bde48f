/**
 * The built CLI on the demo captures in sample-waves/, checked against ground-truth.json: the closed-form
 * figures of the signals the demo script built (true RMS, THD, IEEE 1459 power, sequence components).
 * Tolerances allow for the rounding of each file format (printed decimals, COMTRADE int16 steps, float32).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { ensureBuiltCli, mainJs, root } from './built-cli.js';
import { beforeAll, describe, expect, it } from 'vitest';

const main = mainJs;
const truthPath = join(root, 'sample-waves', 'ground-truth.json');
const present = existsSync(truthPath);
if (!present) console.warn('sample-waves/ground-truth.json is absent: the CLI sample-waves checks are skipped');

interface Truth {
	files: {
		file: string;
		channels: {
			name: string;
			envelope: unknown[];
			expected: { steadyRms: number; fundamentalRms: number; thdFPct: number };
		}[];
		power: {
			voltage: string;
			current: string;
			activePowerW: number;
			fundamentalReactivePowerVar: number;
			apparentPowerVA: number;
			powerFactor: number;
			displacementPowerFactor: number;
		}[];
		threePhase: {
			channels: string[];
			rotation: string;
			positiveRms: number;
			negativeRms: number;
			zeroRms: number;
			unbalanceNegativePct: number;
			window?: string;
		}[];
	}[];
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- parsed JSON documents, checked against the schema below
const docs = new Map<string, any>();
let code = -1;
let stderr = '';

beforeAll(async () => {
	await ensureBuiltCli();
	if (!present) return;
	const r = spawnSync(process.execPath, [main, 'analyse', 'sample-waves', '--json', '--quiet'], {
		cwd: root,
		encoding: 'utf8',
		timeout: 120_000,
	});
	code = r.status ?? -1;
	stderr = r.stderr;
	for (const line of r.stdout.trim().split('\n')) {
		const d = JSON.parse(line);
		docs.set(d.file.replace(/^sample-waves[\\/]/, ''), d);
	}
}, 180_000);

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe.skipIf(!present)('sinecheck analyse sample-waves', () => {
	const truth: Truth = present ? JSON.parse(readFileSync(truthPath, 'utf8')) : { files: [] };
	const schema = JSON.parse(readFileSync(join(root, 'lib', 'report', 'report.schema.json'), 'utf8'));
	const validate = new Ajv2020({ allErrors: true, strict: false }).compile(schema);

	it('analyse sample-waves exits 0, reports every demo capture and each validates against the schema', () => {
		expect(code, stderr).toBe(0);
		expect([...docs.keys()].sort()).toEqual(truth.files.map((f) => f.file).sort());
		for (const d of docs.values()) expect(validate(d), JSON.stringify(validate.errors)).toBe(true);
	});

	for (const f of truth.files) {
		const steady = f.channels.every((c) => c.envelope.length === 0);
		// A record with a dip (an envelope) has no single steady value to compare: its events are checked below.
		if (!steady) continue;
		it(`${f.file}: true RMS, fundamental and THD of every channel match the ground truth (closed form)`, () => {
			const d = docs.get(f.file);
			for (const c of f.channels) {
				const got = d.channels.find((x: { name: string }) => x.name === c.name);
				expect(rel(got.rms, c.expected.steadyRms), `${c.name} rms`).toBeLessThan(2e-3);
				expect(rel(got.harmonics[1].rms, c.expected.fundamentalRms), `${c.name} h1`).toBeLessThan(2e-3);
				expect(Math.abs(got.thdPercent - c.expected.thdFPct), `${c.name} thd`).toBeLessThan(0.05);
			}
		});

		if (f.power.length > 0)
			it(`${f.file}: P, Q1, S, PF and DPF of every pair match IEEE 1459 computed from the construction`, () => {
				const d = docs.get(f.file);
				for (const p of f.power) {
					const got = d.power.find(
						(x: { voltage: string; current: string }) => x.voltage === p.voltage && x.current === p.current,
					);
					expect(got, `${p.voltage}/${p.current} paired`).toBeDefined();
					expect(rel(got.activeW, p.activePowerW)).toBeLessThan(3e-3);
					expect(Math.abs(got.reactiveVar - p.fundamentalReactivePowerVar)).toBeLessThan(3e-3 * p.apparentPowerVA);
					expect(rel(got.apparentVA, p.apparentPowerVA)).toBeLessThan(3e-3);
					expect(Math.abs(got.powerFactor - p.powerFactor)).toBeLessThan(3e-3);
					expect(Math.abs(got.displacementPowerFactor - p.displacementPowerFactor)).toBeLessThan(3e-3);
				}
			});

		const sets = f.threePhase.filter((t) => t.window === undefined);
		if (sets.length > 0)
			it(`${f.file}: rotation, sequence components and VUF match the Fortescue transform of the construction`, () => {
				const d = docs.get(f.file);
				for (const t of sets) {
					const got = d.threePhaseSets.find((x: { channels: string[] }) => x.channels.join() === t.channels.join());
					expect(got, t.channels.join()).toBeDefined();
					expect(t.rotation.startsWith(got.rotation)).toBe(true);
					expect(rel(got.sequence.positive, t.positiveRms)).toBeLessThan(2e-3);
					expect(Math.abs(got.sequence.negative - t.negativeRms)).toBeLessThan(2e-3 * t.positiveRms);
					expect(Math.abs(got.sequence.zero - t.zeroRms)).toBeLessThan(2e-3 * t.positiveRms);
					expect(Math.abs(got.unbalancePercent - t.unbalanceNegativePct)).toBeLessThan(0.05);
				}
			});
	}

	it('analyse --json incomer-dip.cfg carries the dip on Ub as one event (residual 55 % of 230 V within 0.5 %, 0.12 s within one cycle: ground truth; IEC 61000-4-30 class A duration uncertainty, docs/methods.md §3.4), classified once and named in the findings', () => {
		const d = docs.get('incomer-dip.cfg');
		const truth = JSON.parse(readFileSync(truthPath, 'utf8')).files.find(
			(f: { file: string }) => f.file === 'incomer-dip.cfg',
		);
		const env = truth.channels.find((c: { name: string }) => c.name === 'Ub').envelope[0];
		expect(d.events.events).toHaveLength(1);
		const e = d.events.events[0];
		expect(e.kind).toBe('dip');
		expect(e.channels).toEqual(['Ub']);
		expect(Math.abs(e.percentOfDeclared - 100 * env.factor)).toBeLessThan(0.5);
		expect(Math.abs(e.durationS - (env.toS - env.fromS))).toBeLessThanOrEqual(0.02);
		expect(d.events.dipTable.counts.flat().reduce((a: number, b: number) => a + b, 0)).toBe(1);
		expect(d.findings.find((f: { id: string }) => f.id === 'events').text).toContain('1 dip');
		const csv = spawnSync(process.execPath, [main, 'analyse', join('sample-waves', 'incomer-dip.cfg'), '--csv'], {
			cwd: root,
			encoding: 'utf8',
			timeout: 120_000,
		});
		const [head, ...rows] = csv.stdout
			.trim()
			.split(/\r?\n/)
			.map((l) => l.split(','));
		const ub = rows.find((r) => r[1] === 'Ub')!;
		expect(ub[head.indexOf('dips')]).toBe('1');
		const table = spawnSync(process.execPath, [main, 'analyse', join('sample-waves', 'incomer-dip.cfg')], {
			cwd: root,
			encoding: 'utf8',
			timeout: 120_000,
		});
		expect(table.stdout).toMatch(/voltage events .*: 1\n\s+dip to 55\.\d % .* on Ub/);
		expect(table.stdout).toMatch(/EN 50160:2010, Table 5: 70 > u ≥ 40 %, 10-200 ms: 1/);
	});

	it('trend incomer-dip.cfg (wired as sinecheck trend) reports the dip on Ub: residual 55 % of 230 V, 0.12 s within one cycle (ground truth; IEC 61000-4-30 duration uncertainty, docs/methods.md 3.4)', () => {
		const r = spawnSync(process.execPath, [main, 'trend', join('sample-waves', 'incomer-dip.cfg')], {
			cwd: root,
			encoding: 'utf8',
			timeout: 120_000,
		});
		expect(r.status, r.stderr).toBe(0);
		expect(r.stdout.split('\n')[0]).toMatch(/^interval,start_s/);
		const m = /dip on Ub at [-\d.]+ s for ([\d.]+) s, residual ([\d.]+) V/.exec(r.stderr);
		expect(m, r.stderr).not.toBeNull();
		expect(Math.abs(Number(m![1]) - 0.12)).toBeLessThanOrEqual(0.02 + 1e-9);
		expect(Math.abs(Number(m![2]) - 126.525)).toBeLessThan(0.5);
	});
});
