/**
 * Shared spectrum types: the contract between lib/spectrum (which fills them) and lib/power,
 * lib/polyphase, lib/report (which read them).
 */

/**
 * One harmonic order of one channel over one synchronised window.
 * The component is x_h(t) = √2 · rms · cos(h · 2π f1 · (t − t0) + phaseDeg·π/180), with t0 the window's
 * start time: phase is absolute (cosine reference) and comparable between channels analysed on the same window.
 * Order 0 is DC: rms = |mean|, phaseDeg = 0 for a positive mean and 180 for a negative one.
 */
export interface HarmonicPhasor {
	order: number;
	/** RMS value, same unit as the samples. */
	rms: number;
	/** Absolute phase in degrees, cosine reference, in (−180, 180]. NaN when rms is 0. */
	phaseDeg: number;
}

/** The harmonic orders 0..maxOrder of one channel on one window (index i holds order i). */
export interface HarmonicSet {
	/** Fundamental frequency the window was synchronised to, Hz. */
	fundamentalHz: number;
	/** Window start, seconds from the capture's first sample. */
	startS: number;
	/** Window length in fundamental cycles. */
	cycles: number;
	orders: HarmonicPhasor[];
}
