/**
 * Second-order IIR sections from s-domain transfer functions by the bilinear transform, and their
 * frequency response. Used by the flickermeter's filter design.
 */

/**
 * A digital second-order section, a0 normalised to 1:
 *   H(z) = (b0 + b1 z⁻¹ + b2 z⁻²) / (1 + a1 z⁻¹ + a2 z⁻²).
 * A first-order section has b2 = a2 = 0.
 */
export interface Biquad {
	b0: number;
	b1: number;
	b2: number;
	a1: number;
	a2: number;
}

/**
 * Bilinear transform of H(s) = (B2 s² + B1 s + B0) / (A2 s² + A1 s + A0), s = c (1 − z⁻¹)/(1 + z⁻¹).
 * A first-order H(s) (A2 = B2 = 0) gives a first-order section. With c = 2 fs the transform is the plain trapezoidal rule; pre-warping at ωp uses
 * c = ωp / tan(ωp / (2 fs)) so that the digital response equals the analogue one exactly at ωp.
 *
 * Ref: A. V. Oppenheim, R. W. Schafer, Discrete-Time Signal Processing, 3rd ed. (2010), 7.2.2
 * (bilinear transformation and frequency pre-warping; from memory).
 *
 * @param num  [B2, B1, B0] (s-domain numerator, highest power first)
 * @param den  [A2, A1, A0]
 * @param sampleRateHz  fs in S/s
 * @param prewarpHz  frequency in Hz matched exactly; omit for c = 2 fs
 * @example bilinear([0, 0, 1], [0, 1, 2 * Math.PI * 10], 1000) // first-order low-pass at 10 Hz
 */
export function bilinear(
	num: readonly number[],
	den: readonly number[],
	sampleRateHz: number,
	prewarpHz?: number,
): Biquad {
	const c =
		prewarpHz === undefined
			? 2 * sampleRateHz
			: (2 * Math.PI * prewarpHz) / Math.tan((Math.PI * prewarpHz) / sampleRateHz);
	const c2 = c * c;
	const [B2, B1, B0] = num;
	const [A2, A1, A0] = den;
	if (A2 === 0 && B2 === 0) {
		// first order: (B1 s + B0)/(A1 s + A0) -> (b0 + b1 z⁻¹)/(1 + a1 z⁻¹), no pole-zero pair at z = −1
		const d0 = A1 * c + A0;
		return { b0: (B1 * c + B0) / d0, b1: (B0 - B1 * c) / d0, b2: 0, a1: (A0 - A1 * c) / d0, a2: 0 };
	}
	const a0 = A2 * c2 + A1 * c + A0;
	return {
		b0: (B2 * c2 + B1 * c + B0) / a0,
		b1: (2 * (B0 - B2 * c2)) / a0,
		b2: (B2 * c2 - B1 * c + B0) / a0,
		a1: (2 * (A0 - A2 * c2)) / a0,
		a2: (A2 * c2 - A1 * c + A0) / a0,
	};
}

/**
 * |H(e^{jω})| of a section at `frequencyHz`, ω = 2π f / fs.
 * @returns the gain (dimensionless)
 */
export function biquadGain(q: Biquad, frequencyHz: number, sampleRateHz: number): number {
	const w = (2 * Math.PI * frequencyHz) / sampleRateHz;
	const c1 = Math.cos(w),
		s1 = -Math.sin(w);
	const c2 = Math.cos(2 * w),
		s2 = -Math.sin(2 * w);
	const nr = q.b0 + q.b1 * c1 + q.b2 * c2,
		ni = q.b1 * s1 + q.b2 * s2;
	const dr = 1 + q.a1 * c1 + q.a2 * c2,
		di = q.a1 * s1 + q.a2 * s2;
	return Math.sqrt((nr * nr + ni * ni) / (dr * dr + di * di));
}

/**
 * Butterworth low-pass of even order n as n/2 analogue sections
 *   ωc² / (s² + 2 cos φk ωc s + ωc²),  φk = (2k − 1)π / (2n),  k = 1 … n/2,
 * each bilinear-transformed with pre-warping at the cut-off (so −3 dB falls exactly at `cutoffHz`).
 * Ref: S. Butterworth, "On the theory of filter amplifiers", Wireless Engineer 7 (1930) 536-541 (pole
 * positions on the circle); pole pairing as in any filter-design text (common practice).
 */
export function butterworthLowPass(order: number, cutoffHz: number, sampleRateHz: number): Biquad[] {
	if (order < 2 || order % 2 !== 0) throw new RangeError(`Butterworth order must be even and >= 2, got ${order}`);
	const wc = 2 * Math.PI * cutoffHz;
	const sections: Biquad[] = [];
	for (let k = 1; k <= order / 2; k++) {
		const phi = ((2 * k - 1) * Math.PI) / (2 * order);
		sections.push(bilinear([0, 0, wc * wc], [1, 2 * Math.cos(phi) * wc, wc * wc], sampleRateHz, cutoffHz));
	}
	return sections;
}
