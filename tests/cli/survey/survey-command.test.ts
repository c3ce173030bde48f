/**
 * The built CLI's `survey`: on a recording (the demo incomer record, whose dip the demo script built) and
 * as the merge step over JSON documents in the shape `trend --json` writes.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuiltCli, mainJs, root } from '../built-cli.js';

const run = (...args: string[]) =>
	spawnSync(process.execPath, [mainJs, 'survey', ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });
let dir = '';

beforeAll(async () => {
	await ensureBuiltCli();
	dir = mkdtempSync(join(tmpdir(), 'survey-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A trend document of one hour from `startTime`: six 10-minute values of 230 V with the given THD. */
function hour(source: string, startTime: string, thd: (k: number) => number) {
	return {
		source,
		startTime,
		declaredV: 230,
		nominalHz: 50,
		durationS: 3600,
		channels: [{ name: 'L1', quantity: 'voltage', unit: 'V' }],
		aggregates: Array.from({ length: 6 }, (_, k) => ({
			interval: '10-min',
			startS: 600 * k,
			durationS: 600,
			complete: true,
			flagged: false,
			rms: [230],
			thdPercent: [thd(k)],
		})),
		frequency: Array.from({ length: 360 }, (_, k) => ({
			startS: 10 * k,
			durationS: 10,
			frequencyHz: 50,
			complete: true,
			flagged: false,
		})),
		events: [],
	};
}

/**
 * A CSV of `seconds` of a 230 V, 50 Hz sine at 1000 S/s with no start time (no preamble, the time column
 * in seconds from 0): what a scope or a logger without a clock writes.
 */
function unstatedCsv(seconds: number): string {
	const rows = Array.from({ length: seconds * 1000 }, (_, i) => {
		const t = i / 1000;
		return `${t.toFixed(3)},${(230 * Math.SQRT2 * Math.sin(2 * Math.PI * 50 * t)).toFixed(2)}`;
	});
	return `time (s),V1 (V)\n${rows.join('\n')}\n`;
}

describe('sinecheck survey', () => {
	it('a folder of files without start times: the note names each file (h2 before h10), never the folder', () => {
		mkdirSync(join(dir, 'hx'));
		for (const name of ['h10.csv', 'h2.csv', 'h1.csv']) writeFileSync(join(dir, 'hx', name), unstatedCsv(3));
		const r = spawnSync(process.execPath, [mainJs, 'survey', 'hx', '--nominal', '230'], {
			cwd: dir,
			encoding: 'utf8',
			timeout: 120_000,
		});
		const notes = `${r.stdout}\n${r.stderr}`.split('\n').filter((l) => l.includes('start'));
		expect(r.status).toBe(0);
		// numbered files in numeric order, the folder said once (common practice for a logger's numbered files)
		expect(notes.filter((l) => l.includes('h1.csv, h2.csv and h10.csv (in hx)'))).toHaveLength(1);
		expect(notes.filter((l) => /\bhx states\b/.test(l))).toEqual([]);
	});

	it('on the demo incomer record: its one dip (phase B to 55 % for 6 cycles, sample-waves ground truth) is counted once in the 70-40 % x 10-200 ms cell of EN 50160 Table 5', () => {
		const r = run('sample-waves/incomer-dip.cfg', '--json');
		expect(r.stderr).not.toMatch(/\n\s+at /);
		const doc = JSON.parse(r.stdout);
		expect(doc.clockAligned).toBe(true);
		expect(doc.dips.rows[2]).toContain('70 %');
		expect(doc.dips.counts[2][0]).toBe(1);
		expect(doc.dips.counts.flat().reduce((a: number, b: number) => a + b, 0)).toBe(1);
		expect(doc.weekNote).toContain('only');
	});

	it('merges trend documents of consecutive hours: THD 9 % in 2 of 12 intervals puts the 95th percentile over 8 % and exits 1 (EN 50160:2010, 4.2.5)', () => {
		// Nearest rank ceil(0.95 x 12) = 12: the largest of the 12 values, 9 %.
		const a = join(dir, 'h08.json');
		const b = join(dir, 'h09.json');
		writeFileSync(a, JSON.stringify(hour('h08.cfg', '2026-05-04T08:00:00Z', () => 3)));
		writeFileSync(b, JSON.stringify(hour('h09.cfg', '2026-05-04T09:00:00Z', (k) => (k < 2 ? 9 : 3))));
		const r = run(b, a, '--json');
		expect(r.status).toBe(1);
		const doc = JSON.parse(r.stdout);
		expect(doc.coverage.completeIntervals).toBe(12);
		expect(doc.coverage.gaps).toEqual([]);
		const thd = doc.lines.find((l: { id: string }) => l.id === 'thd');
		expect(thd.value).toBe(9);
		expect(thd.verdict).toBe('does not meet');
		const table = run(a, b);
		expect(table.stdout).toContain('DOES NOT MEET');
		expect(table.stdout).toContain('2026-05-04 08:00:00');
	});

	it('--csv gives one row per rule line (every harmonic order) that papaparse reads back to the JSON figures, and the dip table cells', () => {
		const a = join(dir, 'c08.json');
		writeFileSync(a, JSON.stringify(hour('c08.cfg', '2026-05-04T08:00:00Z', (k) => (k < 2 ? 9 : 3))));
		const json = JSON.parse(run(a, '--json').stdout);
		const r = run(a, '--csv');
		expect(r.status).toBe(1);
		const rows = Papa.parse<Record<string, string>>(r.stdout, { header: true, skipEmptyLines: true }).data;
		const rules = rows.filter((x) => x.section === 'rule');
		expect(rules.map((x) => x.id)).toEqual(json.lines.map((l: { id: string }) => l.id));
		const thd = rules.find((x) => x.id === 'thd')!;
		expect(Number(thd.value)).toBe(9); // nearest rank ceil(0.95 x 6) = 6: the largest of 3, 3, 3, 3, 9, 9
		expect(thd.verdict).toBe('does not meet');
		expect(rows.filter((x) => x.section === 'dip table')).toHaveLength(
			json.dips.rows.length * json.dips.columns.length,
		);
	});

	it('a JSON file that is not a trend document is refused with its name, exit 2, no stack trace', () => {
		const bad = join(dir, 'other.json');
		writeFileSync(bad, '{"hello": 1}');
		const r = run(bad);
		expect(r.status).toBe(2);
		expect(r.stderr).toContain('other.json');
		expect(r.stderr).toContain('trend --json');
		expect(r.stderr).not.toMatch(/\n\s+at /);
	});

	it('names a FIFO and a dangling link in a folder it surveys, and still surveys the recording', () => {
		const f = join(dir, 'with-oddities');
		mkdirSync(f, { recursive: true });
		const rows = ['time (s),L1 (V)'];
		for (let i = 0; i < 2000; i++)
			rows.push(`${(i / 1000).toFixed(3)},${(325 * Math.sin((2 * Math.PI * 50 * i) / 1000)).toFixed(2)}`);
		writeFileSync(join(f, 'a.csv'), rows.join('\n') + '\n');
		spawnSync('mkfifo', [join(f, 'pipe.csv')]);
		symlinkSync(join(f, 'nowhere.csv'), join(f, 'dangling.csv'));
		const r = run(f);
		expect(r.stderr).toMatch(/pipe\.csv: a named pipe/);
		expect(r.stderr).toMatch(/dangling\.csv: a symbolic link to something that does not exist/);
		expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
		expect(r.stdout).toMatch(/\S/);
	});
});
