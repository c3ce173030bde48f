// The worker's CSV reading from a picked file (a Blob), streamed in slices: every cell must arrive as
// written across slice boundaries: each sample equals Number(cell text) (ECMA-262 StringToNumber).
import { describe, expect, it } from 'vitest';
import { readCaptures, READ_SLICE_BYTES } from '../../src/ui/worker-open.js';

/** A two-channel CSV a little over two read slices long, and the cell texts of channel U1. */
function bigCsv(): { text: string; u1: string[] } {
	const lines = ['t (s),U1 (V),I1 (A)'];
	const u1: string[] = [];
	for (let i = 0; lines.length * 30 < 2 * READ_SLICE_BYTES + 100_000; i++) {
		const u = (325 * Math.sin(2 * Math.PI * 50 * (i / 10_000))).toFixed(4);
		u1.push(u);
		lines.push(`${(i / 10_000).toFixed(5)},${u},${(i % 97) / 8}`);
	}
	return { text: lines.join('\n') + '\n', u1 };
}

describe('worker-open: a CSV picked as a file', () => {
	it('readCaptures(Blob of a CSV over two read slices) gives every U1 sample as Number(its cell)', async () => {
		const { text, u1 } = bigCsv();
		const r = await readCaptures(
			[{ name: 'board.csv', blob: new Blob([text]) }],
			{},
			() => {},
			(e) => ({ message: String(e) }) as never,
		);
		expect(r.problems).toEqual([]);
		const s = r.captures[0].channels[0].samples;
		expect(s.length).toBe(u1.length);
		for (let i = 0; i < u1.length; i++) if (s[i] !== Number(u1[i])) expect(`${i}: ${s[i]}`).toBe(u1[i]);
	});
});
