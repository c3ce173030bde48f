/** Result of `fitFundamental`. Internal to lib/signal. */
export interface FundamentalFit {
	/** Rising zero crossing of the fitted fundamental, fractional sample index (may lie outside the window). */
	crossingIndex: number;
	/** Peak amplitude R of the fitted fundamental, same unit as samples. */
	amplitude: number;
	/** Weighted RMS of what the fit leaves (harmonics, noise), same unit as samples. */
	residualRms: number;
}

/**
 * Local least-squares fit of the fundamental around one expected zero crossing: the building block of
 * the whole-cycle search. Internal to lib/signal.
 *
 * Over a Hann-weighted window two periods long, centred on the expected crossing where the record allows
 * (shifted inwards near its ends), the samples are fitted by
 *
 *   x[n] ≈ d + a·cos(ω(n − t)) + b·sin(ω(n − t)),   ω = 2π / periodSamples
 *
 * (weighted least squares, 3 × 3 normal equations). The fundamental R·sin(ω(n − t) + φ), with
 * R = √(a² + b²) and φ = atan2(a, b), rises through zero at n = t − φ/ω. Fitting d removes any DC offset
 * exactly; over two whole periods the Hann weights make every harmonic of ω orthogonal to the fit
 * (their frequencies fall on the window's spectral zeros), so harmonics and DC shift no crossing.
 *
 * Near the record's ends the window is shifted inwards, so the crossing is extrapolated from the fitted
 * phase at the given period; records shorter than two periods use all their samples.
 *
 * @param samples  signal, any unit; not modified
 * @param expectedIndex  fractional sample index near which a rising crossing is expected (the fit's phase reference)
 * @param periodSamples  period of the fundamental in samples (fs / f)
 * @param centreIndex  centre of the two-period window (default: expectedIndex); one period either side
 *   gives a fit from one side only, for a crossing next to a step in amplitude
 * @returns the crossing nearest `expectedIndex` (within half a period), the amplitude and residual;
 *   crossingIndex NaN when the window is degenerate
 * @example fitFundamental(sine 50 Hz at 10 kS/s starting at phase 0, 195, 200).crossingIndex // 200
 *
 * Ref: sine-wave fitting by least squares, IEEE Std 1057-2017, 3-parameter fit (from memory);
 * Hann window zeros, Harris 1978, Proc. IEEE 66(1) 51–83, doi:10.1109/PROC.1978.10837.
 */
export function fitFundamental(
	samples: Float64Array,
	expectedIndex: number,
	periodSamples: number,
	centreIndex = expectedIndex,
): FundamentalFit {
	const n = samples.length;
	let length = 2 * periodSamples;
	let start = centreIndex - periodSamples;
	if (length > n - 1) {
		length = n - 1;
		start = 0;
	} else {
		start = Math.min(Math.max(start, 0), n - 1 - length);
	}
	const first = Math.max(0, Math.ceil(start));
	const last = Math.min(n - 1, Math.floor(start + length));
	const omega = (2 * Math.PI) / periodSamples;
	const hannStep = Math.PI / length;

	// Rotations by recurrence: two cos/sin pairs per window instead of per sample.
	let c = Math.cos(omega * (first - expectedIndex));
	let s = Math.sin(omega * (first - expectedIndex));
	const cw = Math.cos(omega);
	const sw = Math.sin(omega);
	let hc = Math.cos(hannStep * (first - start));
	let hs = Math.sin(hannStep * (first - start));
	const hcw = Math.cos(hannStep);
	const hsw = Math.sin(hannStep);

	let sW = 0,
		sC = 0,
		sS = 0,
		sCC = 0,
		sSS = 0,
		sCS = 0,
		sX = 0,
		sXC = 0,
		sXS = 0,
		sXX = 0;
	for (let i = first; i <= last; i++) {
		const w = hs * hs;
		const x = samples[i];
		sW += w;
		sC += w * c;
		sS += w * s;
		sCC += w * c * c;
		sSS += w * s * s;
		sCS += w * c * s;
		sX += w * x;
		sXC += w * x * c;
		sXS += w * x * s;
		sXX += w * x * x;
		const c2 = c * cw - s * sw;
		s = s * cw + c * sw;
		c = c2;
		const h2 = hc * hcw - hs * hsw;
		hs = hs * hcw + hc * hsw;
		hc = h2;
	}
	// Solve [[sW sC sS][sC sCC sCS][sS sCS sSS]]·[d a b] = [sX sXC sXS] by Cramer's rule.
	const det = sW * (sCC * sSS - sCS * sCS) - sC * (sC * sSS - sCS * sS) + sS * (sC * sCS - sCC * sS);
	if (!(Math.abs(det) > 0)) return { crossingIndex: NaN, amplitude: 0, residualRms: NaN };
	const d = (sX * (sCC * sSS - sCS * sCS) - sC * (sXC * sSS - sCS * sXS) + sS * (sXC * sCS - sCC * sXS)) / det;
	const a = (sW * (sXC * sSS - sXS * sCS) - sX * (sC * sSS - sCS * sS) + sS * (sC * sXS - sXC * sS)) / det;
	const b = (sW * (sCC * sXS - sCS * sXC) - sC * (sC * sXS - sXC * sS) + sX * (sC * sCS - sCC * sS)) / det;
	const residual = Math.max(0, sXX - d * sX - a * sXC - b * sXS) / sW;
	const phi = Math.atan2(a, b);
	return {
		crossingIndex: expectedIndex - phi / omega,
		amplitude: Math.hypot(a, b),
		residualRms: Math.sqrt(residual),
	};
}
