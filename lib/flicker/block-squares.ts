/**
 * The full-rate stage of the flickermeter: squares the input and low-passes the squares down to the rate the
 * rest of the chain runs at (fs/D). The squaring demodulator and everything after it only need the squares'
 * content below ~35-42 Hz plus the 2f0 ripple the band filters remove, so after this stage blocks 1-5 run
 * on one value per D input samples. Derivation and aliasing bound: docs/flicker.md, "Block squares".
 *
 * Kernel for D ≥ 2: a triangle of 2D taps, the convolution of two D-sample boxcars and a 2-tap mean,
 *   H(f) = (sin(π f D/fs) / (D sin(π f/fs)))² · cos(π f/fs),
 * with double zeros at every multiple of fs/D, the frequencies whose neighbourhood folds into the flicker
 * band (the moving average's Dirichlet kernel, closed form; Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 2, from memory). For D = 1 the squares pass unchanged (the chain as it ran at
 * the full rate).
 */

/**
 * State indices: the block's sum of squares and rising part so far, the position in the block, the previous
 * block's rising part, the last finite square.
 */
const SUM = 0,
	RISING_SO_FAR = 1,
	POSITION = 2,
	RISING = 3,
	LAST = 4,
	STATE_LENGTH = 5;

/** Gain of the kernel at `frequencyHz` for decimation `d` at input rate `sampleRateHz` (the module note's H). */
export function blockSquaresGain(frequencyHz: number, d: number, sampleRateHz: number): number {
	if (d === 1) return 1;
	const x = (Math.PI * frequencyHz) / sampleRateHz;
	const s = Math.sin(x);
	const box = s === 0 ? 1 : Math.sin(d * x) / (d * s);
	return box * box * Math.cos(x);
}

/**
 * Streaming block squares of one channel: state carried between calls, so the output does not depend on
 * how the input is chunked.
 * @example D = 4 on a 230 V, 50 Hz sine at 6400 S/s: 1600 values per second averaging 52 900 V² (the mean
 * square), the 100 Hz ripple of v² still in them (|H(100 Hz)| = 0.99) for the band filters to remove
 */
export class BlockSquares {
	readonly state = new Float64Array(STATE_LENGTH);
	/** Samples that were NaN or infinite (each repeated the previous finite square). */
	nonFinite = 0;

	/**
	 * @param factor             D, input samples per output value (integer ≥ 1)
	 * @param initialMeanSquare  the steady mean square the record starts at (the kernel's history)
	 */
	constructor(
		readonly factor: number,
		initialMeanSquare: number,
	) {
		this.state[RISING] = ((factor * factor) / 2) * initialMeanSquare;
		this.state[LAST] = initialMeanSquare;
	}

	/**
	 * Squares samples [from, to) of `x` and writes each completed block's filtered mean square (unit: the
	 * samples' unit squared) to `out` from index 0; returns how many. `out` must hold
	 * ceil((to − from)/D) + 1 values. A non-finite sample repeats the previous finite square.
	 *
	 * Per block of squares sq_p (p = 0 … D−1): S = Σ sq_p and the rising part R = Σ (p + ½) sq_p; the
	 * falling part is Σ (D − p − ½) sq_p = D·S − R, and the output is
	 * (R of the previous block + D·S − R) / D².
	 */
	run(x: Float64Array, from: number, to: number, out: Float64Array): number {
		if (this.factor === 1) return this.copy(x, from, to, out);
		const st = this.state,
			d = this.factor,
			norm = 1 / (d * d);
		let last = st[LAST],
			s = st[SUM],
			r = st[RISING_SO_FAR],
			p = st[POSITION],
			rising = st[RISING],
			bad = 0,
			k = 0,
			i = from;
		// Whole blocks in the inner loop; the samples of a block cut by a call's start or end one at a time,
		// by the same code at either end (so the optimised code has seen that path on the first cut).
		while (i < to) {
			if (p === 0 && i + d <= to) {
				// Finite samples (the rule): each square added as it is. A block whose sum is not finite (a NaN
				// or infinite sample, or a square past the largest double) goes through the per-sample code
				// below instead, which for finite samples adds exactly the same terms in the same order.
				let bs = 0,
					br = 0,
					h = 0.5;
				for (let q = 0; q < d; q++, h++) {
					const v = x[i + q];
					const sq = v * v;
					bs += sq;
					br += h * sq;
				}
				if (bs - bs === 0) {
					last = x[i + d - 1] * x[i + d - 1];
					out[k++] = (rising + d * bs - br) * norm;
					rising = br;
					i += d;
					continue;
				}
			}
			const v = x[i++];
			if (v - v === 0) last = v * v;
			else bad++;
			s += last;
			r += (p + 0.5) * last;
			if (++p === d) {
				out[k++] = (rising + d * s - r) * norm;
				rising = r;
				s = r = p = 0;
			}
		}
		st.set([s, r, p, rising, last]);
		this.nonFinite += bad;
		return k;
	}

	/** D = 1: the squares themselves. */
	private copy(x: Float64Array, from: number, to: number, out: Float64Array): number {
		let last = this.state[LAST],
			bad = 0,
			k = 0;
		for (let i = from; i < to; i++) {
			const v = x[i];
			if (v - v === 0) last = v * v;
			else bad++;
			out[k++] = last;
		}
		this.state[LAST] = last;
		this.nonFinite += bad;
		return k;
	}
}
