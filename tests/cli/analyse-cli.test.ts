/**
 * End-to-end: the BUILT command (node dist/bin/sinecheck.js, the bundle of dist/src/cli) run as a child process on capture files
 * written here from closed-form signals. Expected figures come from formulas (named beside each check),
 * from docs/methods.md's computed vectors, or from the library called in this process on the same file.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { ensureBuiltCli, mainJs, root } from './built-cli.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { reportToJson } from '../../lib/report/to-json.js';
import { writeCsvCapture } from './fixtures.js';

const main = mainJs;
const dir = mkdtempSync(join(tmpdir(), 'sinecheck-cli-'));
const schema = JSON.parse(readFileSync(join(root, 'lib', 'report', 'report.schema.json'), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: false });
const validate = ajv.compile(schema);

// Several checks read the same run: run each command line once.
const runs = new Map<string, { code: number; stdout: string; stderr: string }>();
function run(args: string[]): { code: number; stdout: string; stderr: string } {
	const key = JSON.stringify(args);
	if (!runs.has(key)) runs.set(key, spawnOnce(args));
	return runs.get(key)!;
}

function spawnOnce(args: string[]): { code: number; stdout: string; stderr: string } {
	const r = spawnSync(process.execPath, [main, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
	return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

const FS = 10_000;
const F = 50;
// 230 V rms fundamental with a 5 % 5th harmonic (11.5 V rms); 10 A rms current lagging 30 degrees.
const U1 = {
	header: 'U1 (V)',
	tones: [
		{ order: 1, rms: 230 },
		{ order: 5, rms: 11.5 },
	],
};
const I1 = { header: 'I1 (A)', tones: [{ order: 1, rms: 10, phaseDeg: -30 }] };

beforeAll(async () => {
	await ensureBuiltCli();
	writeCsvCapture(join(dir, 'feeder.csv'), [U1, I1], { frequencyHz: F, sampleRateHz: FS, cycles: 20 });
	// docs/methods.md section 5.4 / 7 set: 230 V at 0 deg, 220 V at -118 deg, 235 V at +121 deg.
	writeCsvCapture(
		join(dir, 'board.csv'),
		[
			{ header: 'L1 (V)', tones: [{ order: 1, rms: 230, phaseDeg: 0 }] },
			{ header: 'L2 (V)', tones: [{ order: 1, rms: 220, phaseDeg: -118 }] },
			{ header: 'L3 (V)', tones: [{ order: 1, rms: 235, phaseDeg: 121 }] },
		],
		{ frequencyHz: F, sampleRateHz: FS, cycles: 20 },
	);
	writeCsvCapture(
		join(dir, 'distorted.csv'),
		[
			{
				header: 'U1 (V)',
				tones: [
					{ order: 1, rms: 230 },
					{ order: 5, rms: 16.1 },
				],
			},
		],
		{ frequencyHz: F, sampleRateHz: FS, cycles: 20 },
	);
	writeCsvCapture(
		join(dir, 'formula.csv'),
		[{ header: '=HYPERLINK("http://example.invalid") (V)', tones: [{ order: 1, rms: 230 }] }],
		{ frequencyHz: F, sampleRateHz: FS, cycles: 12 },
	);
	mkdirSync(join(dir, 'survey'));
	writeCsvCapture(join(dir, 'survey', 'a-good.csv'), [U1, I1], { frequencyHz: F, sampleRateHz: FS, cycles: 12 });
	writeFileSync(join(dir, 'survey', 'b-bad.csv'), 't (s),U1 (V)\n0,1\n0.0001,2\n0.0002,abc\n0.0003,4\n');
	writeCsvCapture(join(dir, 'survey', 'c-good.csv'), [U1], { frequencyHz: F, sampleRateHz: FS, cycles: 12 });
	// RIFF layout: 'RIFF' size 'WAVE' (bytes 0-11), then the 'fmt ' chunk id (12-15) and its size field
	// (16-19) saying 16 bytes, of which only 4 follow: the size field at byte 16 is what is wrong.
	writeFileSync(
		join(dir, 'truncated.wav'),
		Buffer.concat([
			Buffer.from('RIFF'),
			Buffer.alloc(4),
			Buffer.from('WAVEfmt '),
			Buffer.from([16, 0, 0, 0, 1, 0, 1, 0]),
		]),
	);
	// 5th harmonic at 6.004 % of the fundamental: 0.004 percent points over EN 50160's 6 % (docs/methods.md 4.1).
	writeCsvCapture(
		join(dir, 'at-limit.csv'),
		[
			{
				header: 'U1 (V)',
				tones: [
					{ order: 1, rms: 230 },
					{ order: 5, rms: 230 * 0.06004 },
				],
			},
		],
		{ frequencyHz: F, sampleRateHz: FS, cycles: 20 },
	);
}, 120_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('sinecheck analyse --json', () => {
	it('analyse --json prints one document that validates against report.schema.json', () => {
		const r = run(['analyse', 'feeder.csv', '--json']);
		expect(r.stderr).not.toMatch(/at .*\.js:\d+/); // no stack trace
		expect(r.code).toBe(0);
		const doc = JSON.parse(r.stdout);
		expect(validate(doc), JSON.stringify(validate.errors)).toBe(true);
		expect(doc.file).toBe('feeder.csv');
		expect(doc.sampleRateHz).toBe(FS);
		expect(doc.durationS).toBeCloseTo(20 / F, 9); // N / fs
	});

	it('analyse --json gives true RMS sqrt(230^2 + 11.5^2) and THD 5.00 % on a sine with a 5 % 5th (RMS of a sum of harmonics, docs/methods.md 1.3)', () => {
		const doc = JSON.parse(run(['analyse', 'feeder.csv', '--json']).stdout);
		const u = doc.channels.find((c: { name: string }) => c.name === 'U1');
		expect(u.unit).toBe('V');
		expect(u.quantity).toBe('voltage');
		expect(u.rms).toBeCloseTo(Math.hypot(230, 11.5), 2);
		expect(u.acRms).toBeCloseTo(Math.hypot(230, 11.5), 2);
		expect(u.mean).toBeCloseTo(0, 6);
		expect(u.thdPercent).toBeCloseTo(5, 2);
		expect(u.frequencyHz).toBeCloseTo(50, 3);
		expect(u.harmonics).toHaveLength(51); // orders 0..50
		expect(u.harmonics[1].rms).toBeCloseTo(230, 2);
		expect(u.harmonics[5].percentOfFundamental).toBeCloseTo(5, 2);
		// 20 cycles recorded: whole cycles crossing to crossing are at most 20 (lib/signal may drop one at each end)
		expect(doc.cyclesAnalysed).toBeGreaterThanOrEqual(18);
		expect(doc.cyclesAnalysed).toBeLessThanOrEqual(20);
	});

	it('analyse --json gives lag 30 deg = 1.667 ms and P = 230·10·cos 30°, Q1 = 230·10·sin 30° for a current lagging 30° (IEEE 1459 definitions, docs/methods.md 5.1)', () => {
		const doc = JSON.parse(run(['analyse', 'feeder.csv', '--json']).stdout);
		const pair = doc.pairs.find((p: { other: string }) => p.other === 'I1');
		expect(pair.ref).toBe('U1');
		expect(pair.lagDeg).toBeCloseTo(30, 1);
		expect(pair.lagS).toBeCloseTo(30 / 360 / F, 5);
		expect(doc.power).toHaveLength(1);
		const p = doc.power[0];
		expect(p.voltage).toBe('U1');
		expect(p.current).toBe('I1');
		const cos30 = Math.cos(Math.PI / 6);
		expect(p.activeW).toBeCloseTo(230 * 10 * cos30, 0); // the 5th has no current partner: P = P1
		expect(p.reactiveVar).toBeCloseTo(230 * 10 * 0.5, 0);
		expect(p.apparentVA).toBeCloseTo(Math.hypot(230, 11.5) * 10, 0);
		expect(p.powerFactor).toBeCloseTo((230 * cos30) / Math.hypot(230, 11.5), 3);
		expect(p.displacementPowerFactor).toBeCloseTo(cos30, 3);
		expect(p.character).toBe('inductive');
	});

	it('analyse --json prints exactly what the library gives for the same file (one analysis code for CLI and UI)', () => {
		const doc = JSON.parse(run(['analyse', 'feeder.csv', '--json', '--limits', 'ieee519', '--isc-il', '35']).stdout);
		const opened = openCaptures([{ name: 'feeder.csv', bytes: readFileSync(join(dir, 'feeder.csv')) }]);
		expect(opened.errors).toEqual([]);
		const lib = reportToJson(analyseCapture(opened.captures[0], { limits: 'ieee519', iscIl: 35 }));
		expect(doc).toEqual(JSON.parse(JSON.stringify(lib)));
	});

	it('analyse --json on an unbalanced three-phase set gives VUF 2.7699 %, PVUR 3.6496 %, LVUR 2.4680 % (docs/methods.md section 7 computed vectors)', () => {
		const r = run(['analyse', 'board.csv', '--json']);
		expect(r.code).toBe(0);
		const doc = JSON.parse(r.stdout);
		expect(validate(doc), JSON.stringify(validate.errors)).toBe(true);
		const t = doc.threePhase;
		expect(t.channels).toEqual(['L1', 'L2', 'L3']);
		expect(t.rotation).toBe('positive');
		expect(t.unbalancePercent).toBeCloseTo(2.7699, 2);
		expect(t.pvurPercent).toBeCloseTo(3.6496, 2);
		expect(t.lvurPercent).toBeCloseTo(2.468, 2);
		expect(t.sequence.zero).toBeCloseTo(3.0537, 1);
		expect(t.sequence.positive).toBeCloseTo(228.3105, 1);
		expect(t.sequence.negative).toBeCloseTo(6.324, 1);
	});
});

describe('sinecheck analyse exit codes', () => {
	it('analyse --limits en50160 exits 0 with a 5 % 5th (EN 50160 limit 6 %, docs/methods.md 4.1)', () => {
		const r = run(['analyse', 'feeder.csv', '--limits', 'en50160', '--json']);
		expect(r.code).toBe(0);
		const doc = JSON.parse(r.stdout);
		expect(validate(doc), JSON.stringify(validate.errors)).toBe(true);
		expect(doc.limits.table).toBe('en50160');
		expect(doc.limits.pass).toBe(true);
		const h5 = doc.limits.rows.find(
			(x: { channel: string; order: number; figure: string }) =>
				x.channel === 'U1' && x.order === 5 && x.figure === 'harmonic',
		);
		expect(h5.limit).toBe(6);
		expect(h5.value).toBeCloseTo(5, 2);
		expect(h5.margin).toBeCloseTo(1, 2);
		expect(h5.pass).toBe(true);
	});

	it('analyse --limits en50160 exits 1 with a 7 % 5th (over the 6 % limit, docs/methods.md 4.1)', () => {
		const r = run(['analyse', 'distorted.csv', '--limits', 'en50160']);
		expect(r.code).toBe(1);
		expect(r.stdout).toMatch(/FAIL/);
	});

	it('analyse on a folder with a bad file reports it with line and column, still analyses the others, and exits 2', () => {
		const r = run(['analyse', 'survey', '--json']);
		expect(r.code).toBe(2);
		expect(r.stderr).toMatch(/b-bad\.csv:4:\d+/);
		expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
		const docs = r.stdout
			.trim()
			.split('\n')
			.map((l) => JSON.parse(l));
		expect(docs.map((d) => d.file)).toEqual([join('survey', 'a-good.csv'), join('survey', 'c-good.csv')]);
		for (const d of docs) expect(validate(d), JSON.stringify(validate.errors)).toBe(true);
	});

	it('analyse prints a bad CSV cell as `sinecheck: <path as given>:<line>:<column>: <code>: expected …, got "<cell>"` (the shape trend uses)', () => {
		const r = run(['analyse', 'survey', '--json']);
		const bad = join('survey', 'b-bad.csv');
		const lines = r.stderr.split('\n').filter((l) => l.includes(bad));
		expect(lines).toHaveLength(1);
		// the file written above: line 4 is `0.0002,abc`, the cell "abc" starts at character 8
		const place = `sinecheck: ${bad}:4:8: bad-number: expected `.replace(/[.\\]/g, (c) => `\\${c}`);
		expect(lines[0]).toMatch(new RegExp(`^${place}.+, got "abc"$`));
	});

	it('analyse names an offset in a binary file as `byte N` with no line or column: a WAV whose fmt chunk size field (byte 16, RIFF layout) promises more than the file holds', () => {
		const r = run(['analyse', 'truncated.wav']);
		expect(r.code).toBe(2);
		const lines = r.stderr.trim().split('\n');
		expect(lines).toHaveLength(1);
		expect(lines[0].startsWith('sinecheck: truncated.wav: byte 16: bad-wav: expected ')).toBe(true);
		expect(lines[0]).not.toMatch(/truncated\.wav:\d/);
	});

	it('analyse --time-column counts from 1: 5 on a 3-column file is an error in those terms, 1 reads the time column', () => {
		const bad = run(['analyse', 'feeder.csv', '--time-column', '5']);
		expect(bad.code).toBe(2);
		expect(bad.stderr).toBe(
			'sinecheck: feeder.csv: bad-option: --time-column 5: expected a column number from 1 to 3 (the file has 3 columns)\n',
		);
		// feeder.csv: `t (s),U1 (V),I1 (A)`; column 1 is the time in s, at 1 / 10 kS/s steps
		const good = run(['analyse', 'feeder.csv', '--time-column', '1', '--json']);
		expect(good.code).toBe(0);
		expect(JSON.parse(good.stdout).sampleRateHz).toBeCloseTo(FS, 6);
	});

	it('analyse with an unknown limit table, a missing file or an unknown option exits 2 with one line and no stack trace', () => {
		for (const args of [
			['analyse', 'feeder.csv', '--limits', 'nope'],
			['analyse', 'missing.csv'],
			['analyse', 'feeder.csv', '--frobnicate'],
			['analyse', 'feeder.csv', '--scale', 'U1'],
		]) {
			const r = run(args);
			expect(r.code, args.join(' ')).toBe(2);
			expect(r.stderr.trim().split('\n')).toHaveLength(1);
			expect(r.stderr).not.toMatch(/\n\s+at /);
		}
	});

	it('no command, an unknown command or analyse without a path exits 2 with a hint', () => {
		const none = run([]);
		expect(none.code).toBe(2);
		expect(none.stdout).toMatch(/Usage/);
		const unknown = run(['analyze-all', 'x.csv']);
		expect(unknown.code).toBe(2);
		expect(unknown.stderr).toMatch(/unknown command "analyze-all"/);
		const empty = run(['analyse']);
		expect(empty.code).toBe(2);
		expect(empty.stderr).toMatch(/name at least one capture file or folder/);
	});

	it('analyse --ref with a channel the file does not have exits 2 naming the channel', () => {
		const r = run(['analyse', 'feeder.csv', '--ref', 'U9']);
		expect(r.code).toBe(2);
		expect(r.stderr).toMatch(/feeder\.csv.*U9/);
	});
});

describe('sinecheck analyse output forms', () => {
	it('analyse --csv guards a channel named =HYPERLINK(...) so a spreadsheet shows text (OWASP CSV injection, from memory)', () => {
		const r = run(['analyse', 'formula.csv', '--csv']);
		expect(r.code).toBe(0);
		const lines = r.stdout.trim().split(/\r?\n/);
		expect(lines[0].startsWith('file,channel,unit,quantity')).toBe(true);
		expect(lines).toHaveLength(2);
		expect(lines[1]).toContain(`"'=HYPERLINK(""http://example.invalid"")"`);
		expect(lines[1]).not.toMatch(/,=HYPERLINK/);
	});

	it('analyse --csv on several files gives one header and one row per channel per file', () => {
		const r = run(['analyse', 'feeder.csv', 'board.csv', '--csv']);
		expect(r.code).toBe(0);
		const lines = r.stdout.trim().split(/\r?\n/);
		expect(lines).toHaveLength(1 + 2 + 3);
		expect(lines.filter((l) => l.startsWith('file,'))).toHaveLength(1);
	});

	it('analyse --limits en50160 prints a 5th 0.004 points over 6 % with enough decimals to show it, the limit source as standard + table (no provenance words) and the basis it was judged on (docs/methods.md 4.1)', () => {
		const r = run(['analyse', 'at-limit.csv', '--limits', 'en50160']);
		expect(r.code).toBe(1);
		// 6.004 - 6 = 0.004: 2 decimals read -0.00, 3 show it
		const line = r.stdout.split('\n').find((l) => l.includes(' h5: '));
		expect(line).toBeDefined();
		expect(line!.trim().startsWith('U1 h5: 6.004 % over limit 6.000 % (margin -0.004) [')).toBe(true);
		expect(line).toMatch(/\[EN 50160:2010, Table 1 \(LV\)[^\]]*h = 5\]$/);
		expect(r.stdout).not.toMatch(/from memory|secondary source|need(s)? checking/);
		expect(r.stdout).toMatch(
			/judged on harmonic subgroups of 10\/12-cycle windows \(IEC 61000-4-30 class A with IEC 61000-4-7\)/,
		);
		expect(r.stdout).not.toMatch(/-0\.0+\)/);
	});

	it('analyse prints a readable table with the figures, the pair in words and the assumptions', () => {
		const r = run(['analyse', 'feeder.csv']);
		expect(r.code).toBe(0);
		expect(r.stdout).toMatch(/true RMS/);
		expect(r.stdout).toMatch(/I1 lags U1 by 30\.0 deg \(1\.667 ms\)/);
		expect(r.stdout).toMatch(/inductive/);
	});

	it('--help shows examples for the common tasks, the exit codes and the safety caution, and exits 0', () => {
		const r = run(['analyse', '--help']);
		expect(r.code).toBe(0);
		expect(r.stdout).toMatch(/--limits en50160/);
		expect(r.stdout).toMatch(/--csv/);
		expect(r.stdout).toMatch(/Exit codes/);
		expect(r.stdout).toMatch(/recorded data only/);
		expect(r.stdout).toMatch(/never a scope floated/);
		const top = run(['--help']);
		expect(top.code).toBe(0);
		expect(top.stdout).toMatch(/analyse/);
	});

	it('--help does not call a negated option on by default, and says trend walks folders', () => {
		const r = run(['analyse', '--help']);
		const progress = r.stdout.split('\n').find((l) => l.includes('--no-progress'));
		expect(progress).toBeDefined();
		expect(progress).not.toMatch(/default/);
		const trend = run(['trend', '--help']);
		expect(trend.code).toBe(0);
		expect(trend.stdout.split('\n').find((l) => l.includes('--no-thd'))).not.toMatch(/default/);
		expect(trend.stdout).toMatch(/folders are walked/);
	});

	it('the built entry file starts with a node shebang (needed for the bin link)', () => {
		expect(readFileSync(main, 'utf8').split('\n')[0]).toBe('#!/usr/bin/env node');
	});
});
