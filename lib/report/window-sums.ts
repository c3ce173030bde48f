/**
 * RMS and mean product over the analysis's power window, each worked out once per channel (or channel pair):
 * a pair's power, the three-phase power and the neutral current read the same channels over the same window,
 * and each figure is one pass over a long record. The values are lib/power's (`powerWindowRms`,
 * `activePowerFromSamplesW`), only not computed twice.
 */
import { activePowerFromSamplesW, powerWindowRms, type PowerSampleWindow } from '../power/window.js';

export class PowerWindowSums {
	private readonly rmsOf = new Map<Float64Array, number>();
	private readonly powerOf = new Map<Float64Array, Map<Float64Array, number>>();

	/** `window`: the power window every figure is taken over. Arrays are told apart by identity: never pass a reused buffer. */
	constructor(readonly window: PowerSampleWindow) {}

	/** powerWindowRms(x, window), V or A. */
	rms(x: Float64Array): number {
		let r = this.rmsOf.get(x);
		if (r === undefined) this.rmsOf.set(x, (r = powerWindowRms(x, this.window)));
		return r;
	}

	/** activePowerFromSamplesW(v, i, window), W. */
	activePowerW(v: Float64Array, i: Float64Array): number {
		let byCurrent = this.powerOf.get(v);
		if (!byCurrent) this.powerOf.set(v, (byCurrent = new Map()));
		let p = byCurrent.get(i);
		if (p === undefined) byCurrent.set(i, (p = activePowerFromSamplesW(v, i, this.window)));
		return p;
	}
}
