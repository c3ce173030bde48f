/**
 * `trend` streams every format: the same three-phase 230 V recording as CSV, COMTRADE .cfg + .dat
 * (ASCII, BINARY, BINARY32, FLOAT32) and .cff gives 10/12-cycle RMS of 230 V on each phase
 * (peak 230·√2, closed form) within the quantisation of the format.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trendCommand } from '../../../src/cli/trend/index.js';
import {
	comtradeCffBytes,
	comtradeCfgText,
	comtradeDatBytes,
	type WriterSpec,
} from '../../../sample-waves/writers/comtrade.js';
import { textSink } from './text-sink.js';

const dir = mkdtempSync(join(tmpdir(), 'sinecheck-trend-stream-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const sink = textSink;

const FS = 5000;
const N = 3 * FS; // 3 s: more than the 4096 rows a CSV's rate is taken from
const phase = (k: number, c: number) =>
	230 * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * k) / FS - (2 * Math.PI * c) / 3);
const spec = (fileType: WriterSpec['fileType']): WriterSpec => ({
	station: 'Tallowmere Joinery',
	device: 'rec-1',
	revYear: 2013,
	lineFrequencyHz: 50,
	rates: [{ sampleRateHz: FS, endSample: N }],
	firstData: '01/02/2026,10:00:00.000000',
	trigger: '01/02/2026,10:00:00.000000',
	fileType,
	analog: [0, 1, 2].map((c) => ({
		name: `U${c + 1}`,
		phase: `L${c + 1}`,
		unit: 'V',
		values: Array.from({ length: N }, (_, k) => phase(k, c)),
	})),
});

let lastDiagnostics: { code: string; message: string }[] = [];

async function rmsRows(file: string): Promise<number[][]> {
	const out = sink();
	const err = sink();
	const code = await trendCommand([join(dir, file)], { json: true, nominal: 230, stdout: out, stderr: err });
	expect(err.text()).not.toMatch(/sinecheck:/);
	expect(code).toBe(0);
	const doc = JSON.parse(out.text());
	lastDiagnostics = doc.diagnostics;
	return doc.aggregates
		.filter((r: { interval: string }) => r.interval === '10/12-cycle')
		.map((r: { rms: number[] }) => r.rms);
}

describe('trend streams every format', () => {
	it('CSV: 10/12-cycle RMS of 230 V on each phase (printed to 3 decimals: within 0.01 V)', async () => {
		const lines = [
			't (s),U1 (V),U2 (V),U3 (V)',
			...Array.from(
				{ length: N },
				(_, k) => `${(k / FS).toFixed(4)},${[0, 1, 2].map((c) => phase(k, c).toFixed(3)).join(',')}`,
			),
		];
		writeFileSync(join(dir, 'board.csv'), lines.join('\n'));
		const rows = await rmsRows('board.csv');
		expect(rows.length).toBe(14); // 150 cycles from the first rising crossing past 8 samples: 14 whole windows of 10
		for (const r of rows) for (const v of r) expect(Math.abs(v - 230)).toBeLessThan(0.01);
	});

	for (const type of ['ASCII', 'BINARY', 'BINARY32', 'FLOAT32'] as const) {
		it(`COMTRADE .cfg + .dat ${type}: 230 V on each phase within 0.05 %`, async () => {
			writeFileSync(join(dir, `rec-${type}.cfg`), comtradeCfgText(spec(type)));
			writeFileSync(join(dir, `rec-${type}.dat`), comtradeDatBytes(spec(type)));
			const rows = await rmsRows(`rec-${type}.cfg`);
			expect(rows.length).toBe(14);
			for (const r of rows) for (const v of r) expect(Math.abs(v - 230)).toBeLessThan(0.115);
		});
	}

	for (const type of ['ASCII', 'BINARY'] as const) {
		it(`COMTRADE .cff ${type}: its data section streamed, 230 V on each phase within 0.05 %`, async () => {
			writeFileSync(join(dir, `one-${type}.cff`), comtradeCffBytes(spec(type)));
			const rows = await rmsRows(`one-${type}.cff`);
			expect(lastDiagnostics.some((d) => d.code === 'comtrade-cff' && /streamed/.test(d.message))).toBe(true);
			expect(rows.length).toBe(14);
			for (const r of rows) for (const v of r) expect(Math.abs(v - 230)).toBeLessThan(0.115);
		});
	}
});
