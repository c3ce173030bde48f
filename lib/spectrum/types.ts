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

/**
 * IEC 61000-4-7 groupings of one window's DFT bins (RMS, same unit as the samples), index = order n.
 * With c cycles per window, harmonic n sits on bin k = c·n and bins are f1/c apart (5 Hz at 10 cycles of 50 Hz).
 * Index 0 of the harmonic group/subgroup arrays is the DC bin alone (the standard groups orders ≥ 1).
 */
export interface HarmonicGroups {
	/** G_g,n: bins k−c/2 … k+c/2, the two edge bins at half power (c even; c odd: k ± (c−1)/2, full). */
	harmonicGroupRms: Float64Array;
	/** G_sg,n: bins k−1, k, k+1. */
	harmonicSubgroupRms: Float64Array;
	/** C_ig,n, between orders n and n+1: bins k+1 … k+c−1 (n = 0 … maxOrder). */
	interharmonicGroupRms: Float64Array;
	/** C_isg,n, centred between n and n+1: bins k+2 … k+c−2 (n = 0 … maxOrder). */
	interharmonicSubgroupRms: Float64Array;
}

/**
 * Total harmonic distortion of one window, percent. F = relative to the fundamental, R = relative to the
 * RMS of orders 1…H (so R = F/√(1+F²)), G = from harmonic groups, S = from harmonic subgroups;
 * 40 / 50 = highest order H included (orders 2…H). NaN when the order range was not analysed or the
 * reference is 0.
 */
export interface HarmonicThd {
	thdF40Percent: number;
	thdF50Percent: number;
	thdR40Percent: number;
	thdR50Percent: number;
	thdG40Percent: number;
	thdG50Percent: number;
	thdS40Percent: number;
	thdS50Percent: number;
}

/** One synchronised window of whole fundamental cycles analysed by DFT (lib/spectrum/harmonics.ts). */
export interface HarmonicWindow {
	/** Orders 0…maxOrder: RMS and absolute phase (cosine reference, at the window start). */
	set: HarmonicSet;
	/** Phase of order h relative to the fundamental, φ_h − h·φ_1 wrapped to (−180, 180], degrees; index = order. */
	phaseRelDeg: Float64Array;
	/** 100 · rms_h / rms_1; index = order. */
	percentOfFundamental: Float64Array;
	/** RMS of each DFT bin C_k, k = 0 … c·(maxOrder+1); NaN at or above the capture's Nyquist frequency. */
	binRms: Float64Array;
	/** Bin spacing f1 / c, Hz. */
	binHz: number;
	groups: HarmonicGroups;
	thd: HarmonicThd;
	/** RMS of the whole window (every bin, DC and interharmonics included), same unit as the samples. */
	windowRms: number;
	/** Window start and end as fractional sample indices of the capture (end = start + c·fs/f1). */
	startIndex: number;
	endIndex: number;
	/** Number of points the DFT ran on. */
	dftLength: number;
	/** true when the window was resampled to dftLength points; false when it already held a whole number of samples. */
	resampled: boolean;
	/** Highest order below the capture's Nyquist frequency; orders above it are NaN. */
	highestValidOrder: number;
}
