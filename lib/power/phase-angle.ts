/**
 * Phase angle between two channels from their phasors (fundamental and per harmonic order), and the
 * sentence an electrician reads: "I1 lags U1 by 32.0 deg".
 */
import type { HarmonicSet } from '../spectrum/types.js';
import { wrapAngleDeg } from '../phasor/phasor.js';

/**
 * Angle by which `other` lags `ref`, degrees in (−180, 180]; positive when `other` lags.
 *
 * lagDeg = wrap(φ_ref − φ_other)
 *
 * Both phases must be absolute phases on the same window (cosine or sine reference, as long as both use
 * the same one). For harmonic order h the result is in degrees of that harmonic.
 * @returns the lag, or NaN when either phase is NaN (a zero or missing component)
 * @example phaseLagDeg(0, -32) // 32: a current at −32° lags a voltage at 0° by 32°
 */
export function phaseLagDeg(refPhaseDeg: number, otherPhaseDeg: number): number {
	if (Number.isNaN(refPhaseDeg) || Number.isNaN(otherPhaseDeg)) return NaN;
	return wrapAngleDeg(refPhaseDeg - otherPhaseDeg);
}

/**
 * Fundamental (order 1) phase lag of `other` behind `ref`, degrees in (−180, 180], positive when `other` lags.
 * Both sets must come from the same window (same `startS` and `fundamentalHz`).
 * @returns NaN when either fundamental is missing or zero
 * @throws RangeError when the two sets were not taken on the same window
 * @example fundamentalLagDeg(u1Set, i1Set) // 30 for a current lagging 30° behind the voltage (θ1 = 30°)
 */
export function fundamentalLagDeg(ref: HarmonicSet, other: HarmonicSet): number {
	assertSameWindow(ref, other);
	const a = ref.orders[1];
	const b = other.orders[1];
	if (!a || !b) return NaN;
	return phaseLagDeg(a.phaseDeg, b.phaseDeg);
}

/** Lag of one harmonic order. */
export interface OrderLag {
	order: number;
	/** Lag of `other` behind `ref` in degrees of this order, (−180, 180]; NaN when either component is zero. */
	lagDeg: number;
}

/**
 * Phase lag of `other` behind `ref` for every harmonic order 1..min(maxOrder) both sets hold.
 * Ref: the angle θ_h = α_h − β_h of IEEE Std 1459-2010, 3.1.2.3 (from memory).
 * @throws RangeError when the two sets were not taken on the same window
 * @example harmonicLagsDeg(uSet, iSet)[2] // { order: 3, lagDeg: -60 }: 3rd-harmonic current leading by 60°
 */
export function harmonicLagsDeg(ref: HarmonicSet, other: HarmonicSet): OrderLag[] {
	assertSameWindow(ref, other);
	const n = Math.min(ref.orders.length, other.orders.length);
	const out: OrderLag[] = [];
	for (let h = 1; h < n; h++)
		out.push({ order: h, lagDeg: phaseLagDeg(ref.orders[h].phaseDeg, other.orders[h].phaseDeg) });
	return out;
}

/** Default tolerance within which two channels are called "in phase": ±1.0°. Our choice; see describePhaseLag. */
export const IN_PHASE_TOLERANCE_DEG = 1;

/**
 * The relation in words, one decimal: "I1 lags U1 by 32.0 deg", "I1 leads U1 by 10.0 deg",
 * "I1 is in phase with U1" when |lag| ≤ toleranceDeg, "I1 is in antiphase with U1" when within
 * toleranceDeg of 180°, "the angle between U1 and I1 is undefined" for NaN.
 * @param lagDeg  lag of `otherName` behind `refName`, as from phaseLagDeg
 * @param toleranceDeg  in-phase band, default IN_PHASE_TOLERANCE_DEG (1°, a typical current-clamp phase error; our choice)
 * @example describePhaseLag('U1', 'I1', 32) // "I1 lags U1 by 32.0 deg"
 */
export function describePhaseLag(
	refName: string,
	otherName: string,
	lagDeg: number,
	toleranceDeg = IN_PHASE_TOLERANCE_DEG,
): string {
	if (!(toleranceDeg >= 0)) throw new RangeError(`toleranceDeg must be >= 0, got ${toleranceDeg}`);
	if (Number.isNaN(lagDeg))
		return `the angle between ${refName} and ${otherName} is undefined (one of them has no component at this order)`;
	const a = wrapAngleDeg(lagDeg);
	if (Math.abs(a) <= toleranceDeg) return `${otherName} is in phase with ${refName}`;
	if (180 - Math.abs(a) <= toleranceDeg) return `${otherName} is in antiphase with ${refName}`;
	return a > 0
		? `${otherName} lags ${refName} by ${a.toFixed(1)} deg`
		: `${otherName} leads ${refName} by ${(-a).toFixed(1)} deg`;
}

function assertSameWindow(a: HarmonicSet, b: HarmonicSet): void {
	const tolS = 1e-9 + 1e-6 / Math.max(a.fundamentalHz, 1e-9);
	if (Math.abs(a.startS - b.startS) > tolS || Math.abs(a.fundamentalHz - b.fundamentalHz) > 1e-9 * a.fundamentalHz) {
		throw new RangeError(
			`harmonic sets come from different windows (start ${a.startS} s vs ${b.startS} s, ${a.fundamentalHz} Hz vs ${b.fundamentalHz} Hz): phases are not comparable`,
		);
	}
}
