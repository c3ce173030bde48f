/**
 * Integral of g(x) over a window with fractional ends: the trapezoid rule on the values g(x[j]), with g
 * linearly interpolated between the two samples around each fractional end. Internal to lib/signal.
 *
 *   ∫ₛᵉ g(x(t)) dt ≈ ∫ₛᵉ G(t) dt,   G = the piecewise-linear curve through the points (j, g(x[j]))
 *
 * Why this rule: over k whole periods of a record with a whole number P of samples per period, the two
 * end pieces add up to exactly one interior trapezoid (e and s sit at the same place between samples),
 * so the result equals the plain sample mean Σ g(x[j]) / (kP) that meters and scopes compute, wherever
 * the ends fall, even for waveforms with jumps (square, sawtooth). For non-integer P the ends add an error
 * of order 1/P² of one sample's share, and a linear g (the mean) of a smooth signal is integrated almost
 * exactly. So a record of 9.37 cycles gives the same figures as one of 9.
 *
 * Ref: composite trapezoid rule; on periodic integrands over a whole period it equals the rectangle sum
 * (Trefethen & Weideman 2014, SIAM Review 56(3) 385–458; from memory).
 *
 * @param samples  signal; not modified
 * @param startIndex  window start, fractional sample index, 0 ≤ startIndex ≤ endIndex ≤ N − 1
 * @param endIndex  window end, fractional sample index
 * @param g  integrand applied to sample values (x², |x − m|, …)
 * @returns the integral in (unit of g) × samples; divide by (endIndex − startIndex) for the mean
 */
export function windowIntegral(
	samples: Float64Array,
	startIndex: number,
	endIndex: number,
	g: (x: number) => number,
): number {
	const last = samples.length - 1;
	const i0 = Math.min(Math.floor(startIndex), last);
	const i1 = Math.min(Math.floor(endIndex), last);
	const g0 = g(samples[i0]);
	const gStart = i0 < last ? g0 + (startIndex - i0) * (g(samples[i0 + 1]) - g0) : g0;
	const g1 = g(samples[i1]);
	const gEnd = i1 < last ? g1 + (endIndex - i1) * (g(samples[i1 + 1]) - g1) : g1;
	if (i0 === i1) return ((gStart + gEnd) / 2) * (endIndex - startIndex);
	const first = i0 + 1;
	const gFirst = g(samples[first]);
	let sum = ((gStart + gFirst) / 2) * (first - startIndex);
	if (i1 > first) {
		let inner = 0;
		for (let j = first + 1; j < i1; j++) inner += g(samples[j]);
		sum += inner + (gFirst + g1) / 2;
	}
	return sum + ((g1 + gEnd) / 2) * (endIndex - i1);
}

/** Largest and smallest sample with index in [ceil(startIndex), floor(endIndex)]. */
export function extremaIn(samples: Float64Array, startIndex: number, endIndex: number): { max: number; min: number } {
	let max = -Infinity;
	let min = Infinity;
	const last = Math.min(samples.length - 1, Math.floor(endIndex));
	for (let j = Math.max(0, Math.ceil(startIndex)); j <= last; j++) {
		const x = samples[j];
		if (x > max) max = x;
		if (x < min) min = x;
	}
	return { max, min };
}
