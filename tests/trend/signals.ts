/**
 * Closed-form test recordings for lib/trend: sines whose RMS follows a piecewise-constant envelope, with a
 * chosen (possibly varying) frequency. Each channel: x(t) = √2 · Urms(t) · sin(2π·φ(t) + phase), where
 * φ(t) is the integral of the frequency. Nothing here calls the code under test.
 */

/** A step of the RMS envelope: from `fromS` (inclusive) to `toS` (exclusive) the RMS is `rms`. */
export interface Step {
	fromS: number;
	toS: number;
	rms: number;
}

export interface ChannelSpec {
	/** RMS outside every step. */
	rms: number;
	phaseDeg: number;
	steps?: Step[];
}

/** Frequency as a function of time: constant, or linear ramp f0 + rate·t. */
export interface FrequencySpec {
	f0Hz: number;
	rateHzPerS?: number;
}

export function makeChannels(
	specs: ChannelSpec[],
	freq: FrequencySpec,
	sampleRateHz: number,
	durationS: number,
): Float64Array[] {
	const n = Math.round(durationS * sampleRateHz);
	const k = freq.rateHzPerS ?? 0;
	return specs.map((s) => {
		const out = new Float64Array(n);
		const ph = (s.phaseDeg * Math.PI) / 180;
		for (let i = 0; i < n; i++) {
			const t = i / sampleRateHz;
			let u = s.rms;
			for (const st of s.steps ?? []) if (t >= st.fromS && t < st.toS) u = st.rms;
			const cycles = freq.f0Hz * t + 0.5 * k * t * t;
			out[i] = Math.SQRT2 * u * Math.sin(2 * Math.PI * cycles + ph);
		}
		return out;
	});
}
