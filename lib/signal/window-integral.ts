/**
 * Integral of g(x) over a window with fractional ends, each sample standing for the 1/fs of time centred
 * on it (its cell [j − ½, j + ½]) and weighted by how much of that cell lies in the window. Internal to
 * lib/signal.
 *
 *   ∫ₛᵉ g(x(t)) dt ≈ Σⱼ |[j − ½, j + ½] ∩ [s, e]| · g(x[j])      (t in samples)
 *
 * Why: over a window of P·k samples (k whole periods) this is exactly the plain sample mean Σ g(x[j]) / N
 * that meters and scopes compute, wherever the fractional ends fall, also for waveforms with jumps
 * (square, sawtooth), because the partial cells at the two ends add up to one whole period's worth of
 * samples. For smooth waveforms the ends add an error of order 1/P² of one sample's contribution, so a
 * record of 9.37 cycles gives the same figures as one of 9.
 *
 * Ref: composite midpoint rule; the 1/fs-per-sample convention is the one `durationS` in lib/capture.ts uses.
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
	const lo = Math.floor(startIndex + 0.5);
	const hi = Math.min(samples.length - 1, Math.floor(endIndex + 0.5));
	if (lo >= hi) return g(samples[lo]) * (endIndex - startIndex);
	let inner = 0;
	for (let j = lo + 1; j < hi; j++) inner += g(samples[j]);
	return g(samples[lo]) * (lo + 0.5 - startIndex) + inner + g(samples[hi]) * (endIndex - (hi - 0.5));
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
