/**
 * Complex phasors: the base of lib/spectrum's phases, lib/power and lib/polyphase (it imports nothing).
 * Same convention as lib/spectrum's HarmonicPhasor: magnitude = RMS value, angle = phase in degrees with
 * a cosine reference, so x(t) = √2·|X|·cos(ωt + ∠X).
 */

/** A phasor in polar form as lib/spectrum gives one per harmonic order: RMS and phase in degrees. */
export interface PolarPhasor {
	rms: number;
	/** Degrees, cosine reference; NaN when rms is 0. */
	phaseDeg: number;
}

/** A phasor in rectangular form: re = rms·cos(phase), im = rms·sin(phase). Same unit as the signal. */
export interface ComplexPhasor {
	re: number;
	im: number;
}

const DEG = Math.PI / 180;

/**
 * Phasor from RMS magnitude and phase angle in degrees.
 * @example phasorFromPolarDeg(230, -120) // { re: -115, im: -199.19 } (phase L2 of a 230 V set)
 */
export function phasorFromPolarDeg(rms: number, phaseDeg: number): ComplexPhasor {
	return { re: rms * Math.cos(phaseDeg * DEG), im: rms * Math.sin(phaseDeg * DEG) };
}

/** Phasor of one harmonic order; an order with rms 0 (phase NaN) gives 0 + j0, NaN rms gives NaN. */
export function phasorFromHarmonic(h: PolarPhasor | undefined): ComplexPhasor {
	if (!h) return { re: NaN, im: NaN };
	if (h.rms === 0) return { re: 0, im: 0 };
	return phasorFromPolarDeg(h.rms, h.phaseDeg);
}

/** Magnitude |X| (RMS, same unit as the phasor). */
export function phasorAbs(x: ComplexPhasor): number {
	return Math.hypot(x.re, x.im);
}

/** Angle of X in degrees, in (−180, 180]; NaN for a zero or NaN phasor. */
export function phasorArgDeg(x: ComplexPhasor): number {
	if ((x.re === 0 && x.im === 0) || Number.isNaN(x.re) || Number.isNaN(x.im)) return NaN;
	return wrapAngleDeg(Math.atan2(x.im, x.re) / DEG);
}

/**
 * Wraps an angle into (−180, 180] degrees. NaN stays NaN.
 * @example wrapAngleDeg(-180) // 180; wrapAngleDeg(270) // -90
 */
export function wrapAngleDeg(angleDeg: number): number {
	let a = angleDeg % 360;
	if (a <= -180) a += 360;
	else if (a > 180) a -= 360;
	return a;
}

/** X + Y. */
export function phasorAdd(x: ComplexPhasor, y: ComplexPhasor): ComplexPhasor {
	return { re: x.re + y.re, im: x.im + y.im };
}

/** X − Y (e.g. a line-to-line voltage from two line-to-neutral phasors). */
export function phasorSub(x: ComplexPhasor, y: ComplexPhasor): ComplexPhasor {
	return { re: x.re - y.re, im: x.im - y.im };
}

/** X · Y. */
export function phasorMul(x: ComplexPhasor, y: ComplexPhasor): ComplexPhasor {
	return { re: x.re * y.re - x.im * y.im, im: x.re * y.im + x.im * y.re };
}

/** X · k for a real k. */
export function phasorScale(x: ComplexPhasor, k: number): ComplexPhasor {
	return { re: x.re * k, im: x.im * k };
}

/**
 * Complex power V · I* of one phase, from RMS phasors: re = P (W), im = Q (var), positive Q when the
 * current lags the voltage (inductive load). Units: V·A when V is in volts and I in amperes.
 * Ref: IEEE Std 1459-2010, 3.1.2 (P1 = V1·I1·cos θ1, Q1 = V1·I1·sin θ1, θ1 = α1 − β1) (from memory).
 */
export function complexPower(voltage: ComplexPhasor, current: ComplexPhasor): ComplexPhasor {
	return {
		re: voltage.re * current.re + voltage.im * current.im,
		im: voltage.im * current.re - voltage.re * current.im,
	};
}
