import { describe, expect, it } from 'vitest';
import { EventPipeline, TREND_DEFAULT_THRESHOLDS } from '../../lib/trend/event-pipeline.js';

const FS = 10_000;
/** A Urms(1/2) value every half cycle of 50 Hz: 100 samples apart at 10 kS/s. */
const STEP = 100;

function pipeline(voltageCount: number): EventPipeline {
	return new EventPipeline({
		voltageCount,
		declaredV: 230,
		thresholds: TREND_DEFAULT_THRESHOLDS,
		rvc: undefined,
		inferenceEnd: 0,
		diagnostics: [],
	});
}

/** Channel `ch`'s values 0 … n − 1 (start k·STEP): 230 V, or 100 V while start is in [from, to). */
function values(n: number, from: number, to: number): number[] {
	return Array.from({ length: n }, (_, k) => (k * STEP >= from && k * STEP < to ? 100 : 230));
}

// IEC 61000-4-30:2015, 5.4.2 (from memory): on a polyphase system a dip begins when the Urms(1/2) of one
// channel falls below the dip threshold (90 % of 230 V) and ends when those of all channels are at or above
// the threshold plus the hysteresis (92 %). Values are fed in time order across channels.
describe('EventPipeline: Urms(1/2) values of several channels merged in time order', () => {
	it('L1 low 1.0-1.1 s, L2 low 1.05-1.2 s, each channel handed over whole (1000 values, past the queues first 256) -> one dip 1.0-1.2 s on both, residual 100 V', () => {
		const p = pipeline(2);
		const l1 = values(1000, 10_000, 11_000);
		const l2 = values(1000, 10_500, 12_000);
		l1.forEach((v, k) => p.halfCycle(0, k * STEP, v));
		l2.forEach((v, k) => p.halfCycle(1, k * STEP, v));
		expect(p.advance(Infinity, true, 50)).toBe(true);
		const ev = p.events(1000 * STEP, FS, ['L1', 'L2']);
		expect(ev).toHaveLength(1);
		expect(ev[0]).toMatchObject({ kind: 'dip', channels: ['L1', 'L2'], residualV: 100, ended: true });
		expect(ev[0].startS).toBeCloseTo(1.0, 9);
		expect(ev[0].durationS).toBeCloseTo(0.2, 9);
	});

	it('the same values in small, uneven batches with advances in between (queues emptied and refilled) give the same dip', () => {
		const p = pipeline(2);
		const l1 = values(1000, 10_000, 11_000);
		const l2 = values(1000, 10_500, 12_000);
		let a = 0;
		let b = 0;
		for (let round = 0; a < 1000 || b < 1000; round++) {
			for (let k = 0; k < 7 && a < 1000; k++, a++) p.halfCycle(0, a * STEP, l1[a]);
			for (let k = 0; k < 3 + (round % 9) && b < 1000; k++, b++) p.halfCycle(1, b * STEP, l2[b]);
			p.advance(Math.min(a, b) * STEP - 1, false, 50);
		}
		p.advance(Infinity, true, 50);
		const ev = p.events(1000 * STEP, FS, ['L1', 'L2']);
		expect(ev).toHaveLength(1);
		expect(ev[0]).toMatchObject({ kind: 'dip', channels: ['L1', 'L2'], residualV: 100, ended: true });
		expect(ev[0].startS).toBeCloseTo(1.0, 9);
		expect(ev[0].durationS).toBeCloseTo(0.2, 9);
	});

	it('a value whose start is not finite is dropped, and the values after it are still fed', () => {
		const p = pipeline(1);
		const l1 = values(300, 10_000, 11_000);
		l1.forEach((v, k) => p.halfCycle(0, k === 50 ? NaN : k * STEP, v));
		p.advance(Infinity, true, 50);
		const ev = p.events(300 * STEP, FS, ['L1']);
		expect(ev).toHaveLength(1);
		expect(ev[0].startS).toBeCloseTo(1.0, 9);
		expect(ev[0].durationS).toBeCloseTo(0.1, 9);
	});
});
