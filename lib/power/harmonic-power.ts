/**
 * Active and reactive power per harmonic order: which harmonics carry power, and in which direction.
 */
import type { HarmonicSet } from '../spectrum/types.js';
import { complexPower, phasorFromHarmonic, phasorArgDeg } from '../phasor/phasor.js';

/** Power of one harmonic order of a V/I pair. */
export interface OrderPower {
	order: number;
	/** P_h = V_h·I_h·cos θ_h, W (order 0: V0·I0 with signs). Negative when that order flows back to the source. */
	activeW: number;
	/** Q_h = V_h·I_h·sin θ_h, var, positive when I_h lags V_h. Order 0: 0. */
	reactiveVar: number;
	/** θ_h = α_h − β_h, degrees in (−180, 180]; NaN when either component is zero. */
	thetaDeg: number;
}

/**
 * Active and reactive power of every order both sets hold.
 *
 * P_h = V_h·I_h·cos θ_h;  Q_h = V_h·I_h·sin θ_h;  θ_h = α_h − β_h
 *
 * A negative P_h at a harmonic usually means the load is the source of that harmonic (common practice;
 * a hint, not proof). Σ P_h over all orders is activePowerFromHarmonicsW.
 * Ref: IEEE Std 1459-2010, 3.1.2.3 (P_h, θ_h) (from memory); Q_h per order is Budeanu's component, shown for insight only.
 * @returns one entry per order 0..min(maxOrder)
 * @example powerPerOrder(uSet, iSet)[3].activeW // 10.35 for docs/methods.md §5.3 (V3 = 6.9 V, I3 = 3 A, θ3 = −60°: 20.7·cos 60°)
 */
export function powerPerOrder(voltage: HarmonicSet, current: HarmonicSet): OrderPower[] {
	const n = Math.min(voltage.orders.length, current.orders.length);
	const out: OrderPower[] = [];
	for (let h = 0; h < n; h++) {
		const s = complexPower(phasorFromHarmonic(voltage.orders[h]), phasorFromHarmonic(current.orders[h]));
		out.push({ order: h, activeW: s.re, reactiveVar: h === 0 ? 0 : s.im, thetaDeg: h === 0 ? NaN : phasorArgDeg(s) });
	}
	return out;
}
