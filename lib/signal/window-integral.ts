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
 * Where the record ends: sample n stands for the interval [n, n + 1) (in sample units), so a record of N
 * samples covers [0, N) and a window may end anywhere up to N (one sample interval after the last sample;
 * a scope export of exactly 10 cycles ends its 10th cycle there). The trapezoid then needs G at N, one
 * point past the samples; it is taken one period earlier, G(N) := G(N − periodSamples) (linear between
 * samples): the periodic continuation of the signal over less than one sample interval, exact for a
 * stationary periodic signal. With a whole number P of samples per period and the window [a, a + kP]
 * ending at N, G(N) = g(x[N − P]) and the result is still the plain sum of g over the kP samples
 * x[a] … x[a + kP − 1] (for a periodic signal x[N − P] = x[a]).
 *
 * Ref: composite trapezoid rule; on periodic integrands over a whole period it equals the rectangle sum
 * (Trefethen & Weideman 2014, SIAM Review 56(3) 385–458; from memory).
 *
 * @param samples  signal; not modified
 * @param startIndex  window start, fractional sample index, 0 ≤ startIndex ≤ endIndex ≤ N
 * @param endIndex  window end, fractional sample index (≤ N = samples.length)
 * @param g  integrand applied to sample values (x², |x − m|, …)
 * @param periodSamples  period of the signal in samples, used only when endIndex > N − 1 (the value at N
 *   is taken this far back); default endIndex − startIndex (the window holds whole periods); held at the
 *   last sample when under 1
 * @param inner  the same g named as a kind, so the long inner sum runs without a call per sample (a
 *   record of 1e7 samples: several times faster); must describe g exactly
 * @returns the integral in (unit of g) × samples; divide by (endIndex − startIndex) for the mean
 * @throws RangeError when the window does not lie in [0, N]
 */
export function windowIntegral(
	samples: Float64Array,
	startIndex: number,
	endIndex: number,
	g: (x: number) => number,
	periodSamples: number = endIndex - startIndex,
	inner?: InnerSum | GivenInnerSum,
): number {
	const n = samples.length;
	const last = n - 1;
	if (!(startIndex >= 0 && endIndex >= startIndex && endIndex <= n)) {
		throw new RangeError(`window ${startIndex}…${endIndex} does not lie inside the record's 0…${n}`);
	}
	let endValue: number | undefined;
	/** G(j) at whole j in [0, N]; G(N) by periodic continuation (see above). */
	const at = (j: number): number => {
		if (j <= last) return g(samples[j]);
		if (endValue === undefined) {
			const t = periodSamples >= 1 ? n - periodSamples : last;
			const k = Math.floor(t);
			const gk = g(samples[k]);
			endValue = t > k ? gk + (t - k) * (g(samples[k + 1]) - gk) : gk;
		}
		return endValue;
	};
	/** G(t) at fractional t whose floor is i. */
	const between = (t: number, i: number): number => (t > i ? at(i) + (t - i) * (at(i + 1) - at(i)) : at(i));
	const i0 = Math.floor(startIndex);
	const i1 = Math.floor(endIndex);
	const gStart = between(startIndex, i0);
	const gEnd = between(endIndex, i1);
	if (i0 === i1) return ((gStart + gEnd) / 2) * (endIndex - startIndex);
	const first = i0 + 1;
	const gFirst = at(first);
	let sum = ((gStart + gFirst) / 2) * (first - startIndex);
	const g1 = at(i1);
	if (i1 > first) {
		sum +=
			(inner === undefined
				? innerGeneric(samples, first + 1, i1, g)
				: inner.kind === 'given'
					? inner.sum
					: innerSum(samples, first + 1, i1, inner)) +
			(gFirst + g1) / 2;
	}
	return sum + ((g1 + gEnd) / 2) * (endIndex - i1);
}

/** g named for the inner sum: x, (x − about)², |x − about|. */
export type InnerSum = { kind: 'x' } | { kind: 'square'; about: number } | { kind: 'abs'; about: number };

/**
 * The inner sum already taken over `innerSumRange(startIndex, endIndex)` (e.g. two integrands in one pass,
 * `sumAndSquares`, `squaresAndAbsAbout`): windowIntegral then only adds the end pieces.
 */
export type GivenInnerSum = { kind: 'given'; sum: number };

/** The samples [from, to) windowIntegral sums in its inner loop for a window (empty when to ≤ from). */
export function innerSumRange(startIndex: number, endIndex: number): { from: number; to: number } {
	return { from: Math.floor(startIndex) + 2, to: Math.floor(endIndex) };
}

/** Σ x and Σ x² over [from, to) in one pass, each added in index order (as innerSum 'x' and 'square' about 0). */
export function sumAndSquares(samples: Float64Array, from: number, to: number): { sum: number; squares: number } {
	let sum = 0;
	let squares = 0;
	for (let j = from; j < to; j++) {
		const x = samples[j];
		sum += x;
		squares += x * x;
	}
	return { sum, squares };
}

/** Σ (x − m)² and Σ |x − m| over [from, to) in one pass, each added in index order (as innerSum). */
export function squaresAndAbsAbout(
	samples: Float64Array,
	from: number,
	to: number,
	m: number,
): { squares: number; abs: number } {
	let squares = 0;
	let abs = 0;
	for (let j = from; j < to; j++) {
		const d = samples[j] - m;
		squares += d * d;
		abs += Math.abs(d);
	}
	return { squares, abs };
}

function innerGeneric(samples: Float64Array, from: number, to: number, g: (x: number) => number): number {
	let s = 0;
	for (let j = from; j < to; j++) s += g(samples[j]);
	return s;
}

function innerSum(samples: Float64Array, from: number, to: number, k: InnerSum): number {
	let s = 0;
	if (k.kind === 'x') for (let j = from; j < to; j++) s += samples[j];
	else if (k.kind === 'square') {
		const m = k.about;
		for (let j = from; j < to; j++) {
			const d = samples[j] - m;
			s += d * d;
		}
	} else {
		const m = k.about;
		for (let j = from; j < to; j++) s += Math.abs(samples[j] - m);
	}
	return s;
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
