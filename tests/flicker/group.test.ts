/**
 * A flickermeter group (the chains of three channels run in one loop) against separate single-channel
 * meters on the same samples: every figure must be bit-identical (Object.is), since the group only
 * reorders independent work and keeps each channel's arithmetic in the same order. The single-channel
 * meter is the one checked against IEC 61000-4-15 Tables 1-2 in performance.test.ts and decimated.test.ts;
 * one channel here is also held to Table 2 (Pst = 1.00 ± 5 %, class F1; Ed.2, from memory).
 */
import { describe, expect, it } from 'vitest';
import {
	createFlickermeter,
	createFlickermeterGroup,
	type FlickerResult,
	type FlickermeterOptions,
} from '../../lib/flicker/index.js';

const FS = 10_000;
const DURATION_S = 605;

/** One channel's test voltage: 230 V RMS, 50 Hz, RMS envelope modulated rectangularly (IEC 61000-4-15, 6). */
interface Channel {
	cpm: number;
	deltaVOverV: number;
	/** Seconds of 0 V at the start (a channel that starts dead). */
	deadS?: number;
	/** Sample indices set to NaN / Infinity. */
	nonFinite?: number[];
}

const CHANNELS: Channel[] = [
	{ cpm: 39, deltaVOverV: 0.00906 }, // Ed.2 Table 2, 230 V lamp, 50 Hz: Pst = 1 (from memory)
	{ cpm: 110, deltaVOverV: 0.012, nonFinite: [123_456, 123_457, 4_000_001] },
	{ cpm: 7, deltaVOverV: 0.02, deadS: 2 },
	{ cpm: 1620, deltaVOverV: 0.005 },
];

function fill(ch: Channel, from: number, out: Float64Array): void {
	const peak = 230 * Math.SQRT2,
		w = (2 * Math.PI * 50) / FS;
	for (let k = 0; k < out.length; k++) {
		const i = from + k,
			t = i / FS;
		const level = Math.floor((t * ch.cpm) / 60) % 2 === 0 ? 1 + ch.deltaVOverV / 2 : 1 - ch.deltaVOverV / 2;
		out[k] = t < (ch.deadS ?? 0) ? 0 : peak * level * Math.sin(w * i);
	}
	for (const j of ch.nonFinite ?? []) if (j >= from && j < from + out.length) out[j - from] = j % 2 ? Infinity : NaN;
}

/** Runs a group of the given channels and one meter per channel on the same chunks (of changing sizes). */
function runBoth(
	channels: Channel[],
	options: Omit<FlickermeterOptions, 'onPst' | 'onPinstBlock'>,
): { group: FlickerResult[]; alone: FlickerResult[] } {
	const group = createFlickermeterGroup(channels.length, options);
	const alone = channels.map(() => createFlickermeter(options));
	const sizes = [65_536, 3001, 40_000, 1];
	const buffers = channels.map(() => new Float64Array(65_536));
	const total = DURATION_S * FS;
	for (let i = 0, c = 0; i < total; c++) {
		const n = Math.min(sizes[c % sizes.length], total - i);
		const chunk = buffers.map((b, k) => {
			fill(channels[k], i, b.subarray(0, n));
			return b.subarray(0, n);
		});
		group.push(chunk);
		chunk.forEach((x, k) => alone[k].push(x));
		i += n;
	}
	return { group: group.finish(), alone: alone.map((m) => m.finish()) };
}

/** Every number of a result, by path, for a bit-for-bit comparison. */
function numbers(r: FlickerResult): Map<string, number> {
	const out = new Map<string, number>();
	const walk = (v: unknown, path: string): void => {
		if (typeof v === 'number') out.set(path, v);
		else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, `${path}.${k}`);
	};
	walk(r, 'r');
	return out;
}

function differences(a: FlickerResult, b: FlickerResult): string[] {
	const x = numbers(a),
		y = numbers(b);
	const diff = [...x].filter(([k, v]) => !Object.is(v, y.get(k))).map(([k, v]) => `${k}: ${v} vs ${y.get(k)}`);
	if (x.size !== y.size) diff.push(`${x.size} numbers vs ${y.size}`);
	return diff;
}

describe('createFlickermeterGroup: bit-identical to one meter per channel', () => {
	const three = runBoth(CHANNELS.slice(0, 3), { sampleRateHz: FS, nominalHz: 50, keepPinstBlocks: true });

	it('three channels (one loop): every Pst, percentile, Pinst statistic and block, Plt and count identical', () => {
		for (let k = 0; k < 3; k++) {
			expect(differences(three.group[k], three.alone[k])).toEqual([]);
			expect(three.group[k].pst).toHaveLength(1);
			expect(three.group[k].pinstBlocks!.max).toHaveLength(DURATION_S - 5);
			expect(three.group[k].plt).toEqual(three.alone[k].plt);
		}
	});

	it('the channels stay apart: non-finite samples counted on their own channel, a dead start on its own', () => {
		expect(three.group.map((r) => r.nonFiniteSamples)).toEqual([0, 3, 0]);
		expect(three.group.map((r) => Number.isFinite(r.pst[0].pst))).toEqual([true, true, true]);
		expect(three.group[2].pinst.max).toBe(three.alone[2].pinst.max);
	});

	it('the Table 2 channel (39 changes/min at 0.906 %) still gives Pst = 1.00 ± 5 % (IEC 61000-4-15 Ed.2, from memory)', () => {
		expect(Math.abs(three.group[0].pst[0].pst - 1)).toBeLessThan(0.05);
	});

	it('four channels (three in one loop, one alone) with a clock tick 2.5 s in: identical as well', () => {
		const four = runBoth(CHANNELS, { sampleRateHz: FS, nominalHz: 50, intervalOffsetS: 597.5 });
		for (let k = 0; k < 4; k++) expect(differences(four.group[k], four.alone[k])).toEqual([]);
		expect(four.group[3].pst).toHaveLength(1);
	});

	it('calls onPst and onPinstBlock with the channel and what a meter of its own passes', () => {
		const seen = (): unknown[][] => [[], [], []];
		const fromGroup = { pst: seen(), blocks: seen() },
			alone = { pst: seen(), blocks: seen() };
		const options = { sampleRateHz: 1600, nominalHz: 50 as const };
		const g = createFlickermeterGroup(3, {
			...options,
			onPst: (k, p) => fromGroup.pst[k].push(p),
			onPinstBlock: (k, ...b) => fromGroup.blocks[k].push(b),
		});
		const meters = [0, 1, 2].map((k) =>
			createFlickermeter({
				...options,
				onPst: (p) => alone.pst[k].push(p),
				onPinstBlock: (...b) => alone.blocks[k].push(b),
			}),
		);
		const buffers = [0, 1, 2].map(() => new Float64Array(32_000));
		for (let i = 0; i < 620 * 1600; i += 32_000) {
			// 1600 S/s: the same envelopes as above, each sample i/1600 s apart
			buffers.forEach((b, k) => {
				for (let j = 0; j < b.length; j++) {
					const t = (i + j) / 1600;
					const up = Math.floor((t * CHANNELS[k].cpm) / 60) % 2 === 0;
					b[j] = 325 * (up ? 1.005 : 0.995) * Math.sin(2 * Math.PI * 50 * t);
				}
			});
			g.push(buffers);
			buffers.forEach((b, k) => meters[k].push(b));
		}
		g.finish();
		meters.forEach((m) => m.finish());
		expect(fromGroup.pst.map((l) => l.length)).toEqual([1, 1, 1]);
		expect(fromGroup.blocks[2]).toHaveLength(620 - 5);
		expect(fromGroup).toEqual(alone);
	});

	it('refuses a channel count below 1 and arrays of unequal length (RangeError)', () => {
		expect(() => createFlickermeterGroup(0, { sampleRateHz: FS, nominalHz: 50 })).toThrow(RangeError);
		const g = createFlickermeterGroup(2, { sampleRateHz: FS, nominalHz: 50 });
		expect(() => g.push([new Float64Array(3), new Float64Array(4)])).toThrow(RangeError);
	});
});
