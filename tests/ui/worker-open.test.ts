// The worker's CSV reading from a picked file (a Blob): through a BYOB reader into one reused buffer where
// the Blob stream is a byte stream, else in fresh slices. Either way every cell must arrive as written:
// each sample equals Number(cell text) (ECMA-262 StringToNumber), across piece boundaries.
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

async function read(blob: Blob) {
	const r = await readCaptures(
		[{ name: 'board.csv', blob }],
		{},
		() => {},
		(e) => ({ message: String(e) }) as never,
	);
	expect(r.problems).toEqual([]);
	return r.captures[0];
}

describe('worker-open: a CSV picked as a file', () => {
	const { text, u1 } = bigCsv();

	it('readCaptures(Blob of a CSV over two read slices) gives every U1 sample as Number(its cell)', async () => {
		const c = await read(new Blob([text]));
		const s = c.channels[0].samples;
		expect(s.length).toBe(u1.length);
		for (let i = 0; i < u1.length; i++) if (s[i] !== Number(u1[i])) expect(`${i}: ${s[i]}`).toBe(u1[i]);
	});

	it('readCaptures(a Blob whose stream is not a byte stream) reads it in slices, every U1 sample as Number(its cell)', async () => {
		const real = new Blob([text]);
		const plain = {
			size: real.size,
			slice: (a: number, b: number) => real.slice(a, b),
			// a default (non-byte) stream: getReader({ mode: 'byob' }) throws a TypeError
			stream: () => new ReadableStream<Uint8Array>({ pull: (c) => c.close() }),
		} as unknown as Blob;
		const c = await read(plain);
		const s = c.channels[0].samples;
		expect(s.length).toBe(u1.length);
		for (let i = 0; i < u1.length; i++) if (s[i] !== Number(u1[i])) expect(`${i}: ${s[i]}`).toBe(u1[i]);
	});
});
