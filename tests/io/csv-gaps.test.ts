/**
 * The CSV reader's "unreadable cells as gaps" option and gapFreeSpan. Expected values are closed form: the
 * file is a 230 V RMS (325.27 V peak) 50 Hz sine written here, with text cells put in at known lines and
 * columns; the stretch without gaps is counted by hand.
 */
import { describe, expect, it } from 'vitest';
import { parseCsv, CsvStreamReader } from '../../lib/io/csv/index.js';
import { gapFreeSpan, longestGapFreeRun } from '../../lib/io/gaps.js';
import { isImportError } from '../../lib/io/import-error.js';
import { analyseCapture } from '../../lib/report/analyse.js';

const FS = 10_000;
/** Rows of "t,U1,I1"; `bad` maps a 1-based file line to the cell text put in the U1 (or given) column. */
function csv(rows: number, bad: Record<number, { col: 1 | 2 | 0; text: string }> = {}, crlf = false): string {
	const out = ['t (s),U1 (V),I1 (A)'];
	for (let k = 0; k < rows; k++) {
		const t = k / FS;
		const cells = [
			t.toFixed(4),
			(325.27 * Math.sin(2 * Math.PI * 50 * t)).toFixed(3),
			(14.14 * Math.sin(2 * Math.PI * 50 * t - Math.PI / 6)).toFixed(4),
		];
		const b = bad[out.length + 1];
		if (b) cells[b.col] = b.text;
		out.push(cells.join(','));
	}
	return out.join(crlf ? '\r\n' : '\n') + (crlf ? '\r\n' : '\n');
}

describe('unreadableCells: gap', () => {
	it('without the option an "OVL" cell refuses the file at its line and column (the default stays)', () => {
		try {
			parseCsv(csv(10_000, { 5002: { col: 1, text: 'OVL' } }), 'ovl.csv');
			expect.unreachable();
		} catch (e) {
			expect(isImportError(e) && [e.line, e.column, e.code]).toEqual([5002, 8, 'bad-number']);
		}
	});

	it('with it the file is read: the cell is NaN, listed with line, column, channel and text, and warned about', () => {
		const c = parseCsv(csv(10_000, { 5002: { col: 1, text: 'OVL' } }), 'ovl.csv', { unreadableCells: 'gap' });
		expect(c.channels[0].samples.length).toBe(10_000);
		// line 5002 is data row 5000 (line 1 holds the names)
		expect(c.channels[0].samples[5000]).toBeNaN();
		expect(c.channels[1].samples[5000]).toBeCloseTo(14.14 * Math.sin(2 * Math.PI * 50 * 0.5 - Math.PI / 6), 4);
		expect(c.gaps).toEqual([{ channel: 'U1', sampleIndex: 5000, line: 5002, column: 8, text: 'OVL' }]);
		const d = c.diagnostics.find((x) => x.code === 'unreadable-cells-as-gaps')!;
		expect(d.message).toContain('line 5002, column 8');
		expect(c.diagnostics.some((x) => x.code === 'non-finite-values')).toBe(false);
	});

	it('several cells in one line, an empty cell, CRLF line ends and cells across chunk boundaries are all found', () => {
		const text = csv(
			30_000,
			{
				3: { col: 1, text: 'OVL' },
				40: { col: 2, text: '' },
				41: { col: 1, text: '--' },
				20_001: { col: 2, text: 'err' },
			},
			true,
		);
		const bytes = new TextEncoder().encode(text.replace('\r\n40', '\r\n40'));
		const line3 = text.split('\r\n')[2];
		const r = new CsvStreamReader('many.csv', { unreadableCells: 'gap' }, { totalBytes: bytes.length });
		for (let i = 0; i < bytes.length; i += 7777) r.push(bytes.subarray(i, Math.min(bytes.length, i + 7777)));
		const c = r.finish();
		expect(c.gaps!.map((g) => [g.line, g.channel, g.text])).toEqual([
			[3, 'U1', 'OVL'],
			[40, 'I1', ''],
			[41, 'U1', '--'],
			[20_001, 'I1', 'err'],
		]);
		expect(c.gaps![0].column).toBe(line3.indexOf('OVL') + 1);
		expect(c.channels[0].samples.length).toBe(30_000);
	});

	it('a bad time cell still refuses the file (a row without a time cannot be placed)', () => {
		expect(() => parseCsv(csv(100, { 50: { col: 0, text: 'x' } }), 't.csv', { unreadableCells: 'gap' })).toThrow(
			/t\.csv:50:1: bad-number/,
		);
	});
});

describe('gapFreeSpan', () => {
	it('longestGapFreeRun: NaN at 3 and 9 in 12 rows gives rows 4..8 (5 rows)', () => {
		const x = new Float64Array(12).fill(1);
		x[3] = NaN;
		x[9] = NaN;
		expect(longestGapFreeRun([x])).toEqual({ start: 4, end: 9 });
	});

	it('the figures of the longest stretch are those of the sine: RMS 325.27/√2 = 230.0 V, 25 whole cycles', () => {
		const c = parseCsv(csv(10_000, { 5002: { col: 1, text: 'OVL' } }), 'ovl.csv', { unreadableCells: 'gap' });
		const span = gapFreeSpan(c);
		expect([span.startIndex, span.endIndex]).toEqual([0, 5000]);
		const report = analyseCapture(span.capture);
		expect(report.channels[0].rms).toBeCloseTo(325.27 / Math.SQRT2, 2);
		// 5000 samples at 10 kS/s are exactly 25 cycles of 50 Hz
		expect(report.cyclesAnalysed).toBe(25);
		expect(report.assumptions.some((a) => a.includes('longest stretch without gaps'))).toBe(true);
	});

	it('a capture without gaps is returned as it is', () => {
		const c = parseCsv(csv(1000), 'ok.csv', { unreadableCells: 'gap' });
		expect(gapFreeSpan(c).capture).toBe(c);
	});
});
