import fc from 'fast-check';
import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import { isImportError, parseWav } from '../../lib/index.js';

// Property: whatever bytes arrive as a .wav, parseWav returns a capture or throws the typed ImportError.
const { WaveFile } = wavefile as unknown as {
	WaveFile: new () => {
		fromScratch(ch: number, rate: number, depth: string, s: number[][]): void;
		toBuffer(): Uint8Array;
	};
};

function readsOrRefuses(
	bytes: Uint8Array,
	read: (b: Uint8Array) => { channels: unknown[] } = (b) => parseWav(b, 'f.wav'),
): boolean {
	try {
		return Array.isArray(read(bytes).channels);
	} catch (e) {
		if (isImportError(e)) return true;
		throw e;
	}
}

describe('parseWav under fuzzing (fast-check)', () => {
	const valid = (() => {
		const w = new WaveFile();
		w.fromScratch(2, 8000, '24', [
			[1, 2, 3, 4, 5],
			[-1, -2, -3, -4, -5],
		]);
		return w.toBuffer();
	})();

	it('parseWav(random bytes, with and without a RIFF/WAVE header) returns a capture or throws ImportError', () => {
		const head = new TextEncoder().encode('RIFF\0\0\0\0WAVE');
		fc.assert(
			fc.property(fc.uint8Array({ maxLength: 300 }), fc.boolean(), (b, withHead) => {
				const bytes = withHead ? new Uint8Array([...head, ...b]) : b;
				return readsOrRefuses(bytes);
			}),
			{ numRuns: 300 },
		);
	});

	it('parseWav(truncated or byte-flipped valid file) returns a capture or throws ImportError', () => {
		fc.assert(
			fc.property(
				fc.nat({ max: valid.length }),
				fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 6 }),
				(cut, flips) => {
					const b = valid.slice(0, cut);
					for (const [at, v] of flips) if (b.length > 0) b[at % b.length] = v;
					return readsOrRefuses(b);
				},
			),
			{ numRuns: 500 },
		);
	});

	it('the property fails on an error that is not an ImportError (guards against a check that cannot fail)', () => {
		expect(readsOrRefuses(valid)).toBe(true);
		expect(readsOrRefuses(new Uint8Array(3))).toBe(true);
		expect(() =>
			readsOrRefuses(valid, () => {
				throw new TypeError('boom');
			}),
		).toThrow(TypeError);
	});
});
