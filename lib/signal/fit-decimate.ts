/**
 * Anti-alias decimation for the sine fit: two cascaded moving averages of M samples (a triangular kernel
 * of 2M − 1 taps), one output every M samples, each stamped at its kernel's centre. One pass, O(N).
 * Internal to lib/signal.
 */

/** Decimated record: values, and the original (fractional) sample index each value stands at. */
export interface DecimatedRecord {
	values: Float64Array;
	/** Kernel centre of each value, original sample index (j·M + M − 1). */
	centres: Float64Array;
	factor: number;
}

/**
 * y_j = (1/M²) Σ_{k=0}^{2M−2} tri(k) x[jM + k], tri the triangle 1, 2, …, M, …, 2, 1.
 *
 * Amplitude response at ω rad per original sample: D(ω) = [sin(Mω/2) / (M sin(ω/2))]², zero phase about
 * the kernel centre (the kernel is symmetric), so a tone A·cos(ωn + φ) comes out as D(ω)·A·cos(ω c_j + φ)
 * at the centres c_j: exact, and undone per harmonic by `decimationGain`. Images near multiples of the
 * output rate fold down attenuated by D(ω)² of a single moving average squared (the nulls of a moving
 * average sit on those multiples).
 * Ref: moving-average (boxcar) frequency response sin(Mω/2)/(M sin(ω/2)), Oppenheim & Schafer,
 * Discrete-Time Signal Processing (from memory).
 * @param samples  record, any unit; not modified
 * @param factor  M ≥ 1 (1 returns a copy stamped at 0, 1, 2, …)
 * @example decimateForFit(x at 1 MS/s, 31) // about 32 kS/s, values stamped at 30, 61, 92, …
 */
export function decimateForFit(samples: Float64Array, factor: number): DecimatedRecord {
	const m = Math.max(1, Math.floor(factor));
	const n = samples.length;
	const count = n >= 2 * m - 1 ? Math.floor((n - (2 * m - 1)) / m) + 1 : 0;
	const values = new Float64Array(count);
	const centres = new Float64Array(count);
	for (let j = 0; j < count; j++) {
		const start = j * m;
		// moving sums b[i] = Σ x[i … i+M−1] for i = start … start+M−1, summed: the triangle
		let box = 0;
		for (let k = 0; k < m; k++) box += samples[start + k];
		let acc = box;
		for (let i = start + 1; i < start + m; i++) {
			box += samples[i + m - 1] - samples[i - 1];
			acc += box;
		}
		values[j] = acc / (m * m);
		centres[j] = start + m - 1;
	}
	return { values, centres, factor: m };
}

/** D(ω) of `decimateForFit`: amplitude gain at ω rad per original sample (1 at DC and for M = 1). */
export function decimationGain(omega: number, factor: number): number {
	if (factor <= 1 || omega === 0) return 1;
	const g = Math.sin((factor * omega) / 2) / (factor * Math.sin(omega / 2));
	return g * g;
}

/**
 * Variance inflation of a least-squares estimate from decimated white noise: neighbouring outputs share
 * samples (the kernels overlap by M − 1), so they are correlated with ρ = Σ w_k w_{k+M} / Σ w_k²
 * (w the triangle); a slowly varying estimate then has variance × (1 + 2ρ). 1 for M = 1.
 * Ref: variance of the mean of an MA(1) sequence, 1 + 2ρ₁ (common practice).
 */
export function decimationNoiseInflation(factor: number): number {
	if (factor <= 1) return 1;
	const w = (k: number) => (k < 0 || k > 2 * factor - 2 ? 0 : Math.min(k + 1, 2 * factor - 1 - k));
	let s0 = 0;
	let s1 = 0;
	for (let k = 0; k <= 2 * factor - 2; k++) {
		s0 += w(k) * w(k);
		s1 += w(k) * w(k + factor);
	}
	return 1 + (2 * s1) / s0;
}
