/**
 * The streamed time-column check (stream-time.ts): steps are first bounded a block at a time and read one
 * by one only in a block with a step out of band, so every step that is off or a gap must still be found
 * and located, wherever it falls against the blocks and the chunks. The time stamps are built here from
 * known steps (1/1024 s is exact in binary), so the expected counts and lines are worked by hand.
 */
import { describe, expect, it } from 'vitest';
import { StreamTimeCheck } from '../../lib/io/csv/stream-time.js';

const DT = 1 / 1024;
const ROWS = 12_000;
const PROBE = 4096;
/** Row (0-based) -> its step from the row before, in sample intervals; every other step is one interval. */
const SPECIAL: Record<number, number> = {
	5000: 1.5, // off by 50 %; not a gap (a gap is longer than 1.5 intervals)
	6144: 1024, // a gap of 1 s, on a multiple of 1024 rows
	7000: 0, // a repeated time: neither off nor a gap
	9000: 0.995, // off by 0.5 %: within the 1 % tolerance
	9500: 1.02, // off by 2 %
	11_999: 2, // a gap of two intervals, on the last row
};

function times(): Float64Array {
	const t = new Float64Array(ROWS);
	for (let k = 1; k < ROWS; k++) t[k] = t[k - 1] + (SPECIAL[k] ?? 1) * DT;
	return t;
}

describe('StreamTimeCheck', () => {
	for (const chunk of [1, 7, 1000, 1024, 3000, ROWS]) {
		it(`finds 2 gaps and 2 off steps at their rows, the rows handed on in chunks of ${chunk}`, () => {
			const t = times();
			const c = new StreamTimeCheck(t.subarray(0, PROBE), { name: 't', bodyLine: 2, jitterTolerance: 0.01 });
			expect(c.sampleRateHz).toBe(1024);
			for (let a = PROBE; a < ROWS; a += chunk) {
				const part = t.slice(a, Math.min(ROWS, a + chunk));
				c.rows(part, 0, part.length);
			}
			const notes = c.finish(true);
			const gaps = notes.find((d) => d.code === 'time-gaps');
			// row k is on line bodyLine + k
			expect(gaps?.line).toBe(2 + 6144);
			expect(gaps?.message).toContain('has 2 gap(s)');
			expect(gaps?.message).toContain('the longest 1 s');
			const off = notes.find((d) => d.code === 'irregular-time');
			expect(off?.line).toBe(2 + 5000);
			expect(off?.message).toContain('2 step(s) differ');
			expect(off?.message).toContain('the worst by 50');
		});
	}

	it('even steps with a repeated time only: nothing to say', () => {
		const t = Float64Array.from({ length: 9000 }, (_, k) => (k < 8000 ? k : k - 1) * DT);
		const c = new StreamTimeCheck(t.subarray(0, PROBE), { name: 't', bodyLine: 2, jitterTolerance: 0.01 });
		c.rows(t, PROBE, t.length);
		expect(c.finish(true)).toEqual([]);
	});
});
