/**
 * Least-squares sine fit of a short record: one frequency shared by every channel of a capture, each
 * channel with its own DC and harmonics 1…H. What a record of half a cycle to two cycles can give when
 * whole cycles (and a DFT over them) cannot.
 */
import { decimateForFit, decimationGain, decimationNoiseInflation } from './fit-decimate.js';
import {
	harmonicBasis,
	inverseGramDiagonal,
	orthonormalise,
	projectOut,
	solveOnBasis,
	type QrBasis,
} from './linear-fit.js';

/** Fitted figures of one channel. Amplitudes are peak values; phases cosine reference at the first sample. */
export interface SineFitChannel {
	dc: number;
	/** Index h = order (index 0 unused, 0): x ≈ dc + Σ amplitude[h]·cos(h·2πf·n/fs + phaseRad[h]). */
	amplitude: Float64Array;
	phaseRad: Float64Array;
	/** One standard deviation of each amplitude, from the fit residual. */
	amplitudeStd: Float64Array;
	/** One standard deviation of each phase, rad, at the record's centre (frequency error excluded). */
	phaseStdRad: Float64Array;
	/** RMS of what the fit leaves, at the fit's sample rate. */
	residualRms: number;
}

export interface SineFit {
	ok: true;
	frequencyHz: number;
	/** One standard deviation of the frequency, from the residuals of all channels. */
	frequencyStdHz: number;
	/** Cycles the record holds at the fitted frequency: N·f/fs. */
	cycles: number;
	/** Highest order fitted (capped by maxOrder, the fit rate's Nyquist limit and what the record resolves). */
	highestOrder: number;
	/** Decimation factor M before the fit, and the resulting rate. */
	decimation: number;
	fitRateHz: number;
	/** The frequency range searched, Hz. */
	lowHz: number;
	highHz: number;
	channels: SineFitChannel[];
}

export type SineFitFailure = { ok: false; message: string };

/** Output rate of the decimator per fitted order per Hz of the highest frequency searched (8 samples per period of the order above the top one). */
const FIT_SAMPLES_PER_TOP_PERIOD = 8;
/** Decimation never leaves fewer samples than this in the record. */
const MIN_FIT_SAMPLES = 256;
/** A harmonic column whose part independent of the lower orders is under this fraction cannot be resolved by the record. */
const MIN_INDEPENDENCE = 1e-2;
/** Grid step of the frequency search: this fraction of a cycle of phase drift across the record. */
const GRID_CYCLES = 0.05;
/**
 * The frequency is fitted with orders up to the highest that stands out of the residual (at most 15): over
 * about one cycle a long harmonic series can mimic a small change of frequency (it fits the jump where the
 * wave would join its own start), so orders that are only noise would make the frequency needlessly loose.
 */
const MAX_FREQUENCY_ORDERS = 15;
/** Orders under this fraction of the fundamental never count as present (double-precision rounding of the fit itself). */
const RELATIVE_FLOOR = 1e-7;
/** An order 'stands out' when its amplitude exceeds this many standard deviations (common practice). */
const SIGNIFICANT_STD = 4;
/** Gauss–Newton stops when a step in ω is under this fraction of ω (far below any uncertainty a record gives). */
const STEP_TOLERANCE = 1e-11;
/** Orders used while searching the frequency (the full set is fitted at the end). */
const SEARCH_ORDERS = 1;

/**
 * Fits x_c[n] ≈ d_c + Σ_{h=1}^{H} A_ch·cos(h·ω·n + φ_ch) to every channel c with one ω.
 *
 * 1. Records faster than 8·(maxOrder + 1)·highHz samples/s are decimated (`decimateForFit`, O(N)); each
 *    fitted amplitude is divided by the decimator's known gain at its frequency, so nothing is biased.
 * 2. ω: a grid over lowHz…highHz (steps of 0.05 cycle across the record) of the summed, per-channel
 *    normalised residual of a fit of the fundamental alone (a short record fits a sine nearly as well with a few harmonics of a wrong frequency), then Gauss–Newton on ω with the linear parameters
 *    projected out (variable projection; IEEE Std 1057 four-parameter fit, here with harmonics and
 *    several channels) until the step is under 1e-11·ω, with the fundamental alone, then orders 1…3, then with the orders that stand out of the
 *    residual (see MAX_FREQUENCY_ORDERS), and finally every resolvable order 1…H at that ω.
 * 3. Uncertainty: σ_c² = RSS_c/(m − K − 1), times the decimator's noise correlation (1 + 2ρ); var(β) = σ_c²·diag((AᵀA)⁻¹); var(ω) = 1 / Σ_c |P⊥g_c|²/σ_c²
 *    with g_c = ∂(model_c)/∂ω. Amplitude std = √((var a + var b)/2); phase std = that / amplitude.
 *
 * Orders that the record cannot tell apart from lower ones (a record of half a cycle cannot separate many
 * harmonics) are dropped: `highestOrder` says where the fit stopped.
 *
 * Ref: IEEE Std 1057-2017, 4-parameter sine fit (from memory); variable projection, Golub & Pereyra 1973,
 * SIAM J. Numer. Anal. 10(2) 413–432 (from memory).
 * @param channels  equal-length records on one time base (any units); not modified
 * @param sampleRateHz  samples per second
 * @param opts.lowHz, opts.highHz  frequency range searched (the result never leaves it)
 * @param opts.maxOrder  highest order wanted
 * @param opts.floors  per channel, a peak amplitude below which an order does not count as present when
 *   choosing the orders the frequency is fitted with (the quantisation floor: an 8-bit record's own
 *   rounding makes harmonics that stand out of a white-noise residual but are not in the signal)
 * @returns the fit, or a failure with a sentence (too few samples, no fundamental in the range)
 * @example fitSharedSine([u, i], 1e6, { lowHz: 35, highHz: 65, maxOrder: 50 }).frequencyHz // 50.2 for a 20 ms scope capture
 */
export function fitSharedSine(
	channels: Float64Array[],
	sampleRateHz: number,
	opts: { lowHz: number; highHz: number; maxOrder: number; floors?: number[] },
): SineFit | SineFitFailure {
	if (!(sampleRateHz > 0) || !(opts.lowHz > 0 && opts.highHz > opts.lowHz))
		throw new RangeError('sampleRateHz and 0 < lowHz < highHz required');
	const n = channels[0]?.length ?? 0;
	const byRate = Math.floor(sampleRateHz / (FIT_SAMPLES_PER_TOP_PERIOD * (opts.maxOrder + 1) * opts.highHz));
	const m = Math.max(1, Math.min(byRate, Math.floor(n / MIN_FIT_SAMPLES)));
	const dec = channels.map((c) => decimateForFit(c, m));
	const count = dec[0]?.values.length ?? 0;
	if (count < 8) return { ok: false, message: `The record has ${n} samples: too few to fit a sine.` };
	const centre = (dec[0].centres[0] + dec[0].centres[count - 1]) / 2;
	const tau = dec[0].centres.map((c) => c - centre);
	const ys = dec.map((d) => d.values);
	const weights = ys.map((y) => 1 / Math.max(variance(y), 1e-300));
	const fitRate = sampleRateHz / m;
	const rateOrders = Math.max(1, Math.floor((0.45 * fitRate) / opts.highHz));
	const omegaOf = (hz: number) => (2 * Math.PI * hz) / sampleRateHz;

	let omega = gridSearch(
		ys,
		tau,
		weights,
		omegaOf(opts.lowHz),
		omegaOf(opts.highHz),
		n,
		Math.min(SEARCH_ORDERS, rateOrders),
	);
	omega = gaussNewton(ys, tau, weights, omega, Math.min(SEARCH_ORDERS, rateOrders));
	omega = gaussNewton(ys, tau, weights, omega, Math.min(3, rateOrders));
	const orders = resolvableOrders(tau, omega, Math.min(opts.maxOrder, rateOrders));
	const full = finalFit(ys, tau, omega, orders, centre, m);
	const frequencyOrders = significantOrders(full.channels, Math.min(orders, MAX_FREQUENCY_ORDERS), opts.floors);
	// weight each channel by its noise (residual, or the quantisation floor where that is larger): 1/σ²
	const noiseWeights = ys.map(
		(y, c) =>
			1 / Math.max(full.channels[c].residualRms ** 2, (opts.floors?.[c] ?? 0) ** 2 / 2, 1e-30 * variance(y), 1e-300),
	);
	omega = gaussNewton(ys, tau, noiseWeights, omega, frequencyOrders);
	const hz = (omega * sampleRateHz) / (2 * Math.PI);
	if (!(hz >= opts.lowHz && hz <= opts.highHz)) {
		return {
			ok: false,
			message: `No fundamental between ${opts.lowHz} and ${opts.highHz} Hz: the fit left that range.`,
		};
	}
	const fit = finalFit(ys, tau, omega, orders, centre, m);
	const omegaStd = finalFit(ys, tau, omega, frequencyOrders, centre, m).omegaStd;
	return {
		ok: true,
		frequencyHz: hz,
		frequencyStdHz: (omegaStd * sampleRateHz) / (2 * Math.PI),
		cycles: (n * hz) / sampleRateHz,
		highestOrder: orders,
		decimation: m,
		fitRateHz: fitRate,
		lowHz: opts.lowHz,
		highHz: opts.highHz,
		channels: fit.channels,
	};
}

function variance(y: Float64Array): number {
	let mean = 0;
	for (const v of y) mean += v;
	mean /= y.length;
	let s = 0;
	for (const v of y) s += (v - mean) ** 2;
	return s / y.length;
}

function cost(ys: Float64Array[], tau: Float64Array, weights: number[], omega: number, orders: number): number {
	const qr = orthonormalise(harmonicBasis(tau, omega, orders));
	let total = 0;
	ys.forEach((y, c) => (total += weights[c] * solveOnBasis(qr, y).rss));
	return total;
}

/** Best grid point, then golden-section refinement between its neighbours. */
function gridSearch(
	ys: Float64Array[],
	tau: Float64Array,
	weights: number[],
	lo: number,
	hi: number,
	n: number,
	orders: number,
): number {
	const step = (2 * Math.PI * GRID_CYCLES) / n;
	const points = Math.max(16, Math.ceil((hi - lo) / step) + 1);
	const at = (k: number) => lo + ((hi - lo) * k) / (points - 1);
	let best = 0;
	let bestCost = Infinity;
	for (let k = 0; k < points; k++) {
		const c = cost(ys, tau, weights, at(k), orders);
		if (c < bestCost) {
			bestCost = c;
			best = k;
		}
	}
	let a = at(Math.max(0, best - 1));
	let b = at(Math.min(points - 1, best + 1));
	const g = (Math.sqrt(5) - 1) / 2;
	for (let it = 0; it < 40 && b - a > 1e-9 * b; it++) {
		const x1 = b - g * (b - a);
		const x2 = a + g * (b - a);
		if (cost(ys, tau, weights, x1, orders) < cost(ys, tau, weights, x2, orders)) b = x2;
		else a = x1;
	}
	return (a + b) / 2;
}

/** Highest order (≤ cap) that stands above 4 standard deviations of its own fit and the channel's floor in some channel; at least 1. */
function significantOrders(channels: SineFitChannel[], cap: number, floors: number[] | undefined): number {
	let top = 1;
	channels.forEach((c, i) => {
		// an order under 1e-7 of the channel's fundamental is rounding of the arithmetic, not signal
		const floor = Math.max(floors?.[i] ?? 0, RELATIVE_FLOOR * c.amplitude[1]);
		for (let h = 2; h <= cap; h++)
			if (c.amplitude[h] > Math.max(SIGNIFICANT_STD * c.amplitudeStd[h], floor)) top = Math.max(top, h);
	});
	return top;
}

/** Highest order whose cos/sin columns stay independent of the lower orders over this record. */
function resolvableOrders(tau: Float64Array, omega: number, maxOrders: number): number {
	const qr = orthonormalise(harmonicBasis(tau, omega, maxOrders));
	for (let h = 1; h <= maxOrders; h++) {
		if (qr.independence[2 * h - 1] < MIN_INDEPENDENCE || qr.independence[2 * h] < MIN_INDEPENDENCE)
			return Math.max(1, h - 1);
	}
	return maxOrders;
}

/** ∂model/∂ω for coefficients β on the basis at ω: Σ_h h·τ·(−a_h sin hωτ + b_h cos hωτ). */
function omegaDerivative(basis: Float64Array[], tau: Float64Array, beta: Float64Array, orders: number): Float64Array {
	const g = new Float64Array(tau.length);
	for (let h = 1; h <= orders; h++) {
		const a = beta[2 * h - 1];
		const b = beta[2 * h];
		const cc = basis[2 * h - 1];
		const ss = basis[2 * h];
		for (let j = 0; j < tau.length; j++) g[j] += h * tau[j] * (b * cc[j] - a * ss[j]);
	}
	return g;
}

interface Projection {
	qr: QrBasis;
	solved: ReturnType<typeof solveOnBasis>[];
	/** |P⊥ g_c|² and ⟨P⊥ g_c, r_c⟩ per channel. */
	gg: number[];
	gr: number[];
}

function project(ys: Float64Array[], tau: Float64Array, omega: number, orders: number): Projection {
	const basis = harmonicBasis(tau, omega, orders);
	const qr = orthonormalise(harmonicBasis(tau, omega, orders));
	const solved = ys.map((y) => solveOnBasis(qr, y));
	const gg: number[] = [];
	const gr: number[] = [];
	solved.forEach((s) => {
		const g = omegaDerivative(basis, tau, s.beta, orders);
		gg.push(projectOut(qr, g));
		let d = 0;
		for (let j = 0; j < g.length; j++) d += g[j] * s.residual[j];
		gr.push(d);
	});
	return { qr, solved, gg, gr };
}

function gaussNewton(ys: Float64Array[], tau: Float64Array, weights: number[], omega0: number, orders: number): number {
	let omega = omega0;
	let p = project(ys, tau, omega, orders);
	let current = p.solved.reduce((s, x, c) => s + weights[c] * x.rss, 0);
	for (let it = 0; it < 30; it++) {
		let num = 0;
		let den = 0;
		p.gg.forEach((gg, c) => ((num += weights[c] * p.gr[c]), (den += weights[c] * gg)));
		if (!(den > 0)) break;
		let step = num / den;
		if (Math.abs(step) < STEP_TOLERANCE * omega) break;
		let accepted = false;
		for (let halve = 0; halve < 8 && !accepted; halve++, step /= 2) {
			const q = project(ys, tau, omega + step, orders);
			const next = q.solved.reduce((s, x, c) => s + weights[c] * x.rss, 0);
			if (next <= current) {
				omega += step;
				p = q;
				current = next;
				accepted = true;
			}
		}
		if (!accepted) break;
	}
	return omega;
}

function finalFit(ys: Float64Array[], tau: Float64Array, omega: number, orders: number, centre: number, m: number) {
	const p = project(ys, tau, omega, orders);
	const k = 2 * orders + 1;
	const dof = Math.max(1, tau.length - k - 1);
	const varFactors = inverseGramDiagonal(p.qr);
	const inflation = decimationNoiseInflation(m);
	let info = 0;
	const channels: SineFitChannel[] = p.solved.map((s, c) => {
		const sigma2 = inflation * Math.max(s.rss / dof, 1e-30 * (variance(ys[c]) + 1e-300));
		info += p.gg[c] / sigma2;
		const amplitude = new Float64Array(orders + 1);
		const phaseRad = new Float64Array(orders + 1);
		const amplitudeStd = new Float64Array(orders + 1);
		const phaseStdRad = new Float64Array(orders + 1);
		for (let h = 1; h <= orders; h++) {
			const a = s.beta[2 * h - 1];
			const b = s.beta[2 * h];
			const gain = decimationGain(h * omega, m);
			amplitude[h] = Math.hypot(a, b) / gain;
			phaseRad[h] = wrapRad(-Math.atan2(b, a) - h * omega * centre);
			amplitudeStd[h] = Math.sqrt((sigma2 * (varFactors[2 * h - 1] + varFactors[2 * h])) / 2) / gain;
			phaseStdRad[h] = amplitude[h] > 0 ? amplitudeStd[h] / amplitude[h] : NaN;
		}
		return {
			dc: s.beta[0],
			amplitude,
			phaseRad,
			amplitudeStd,
			phaseStdRad,
			residualRms: Math.sqrt(s.rss / tau.length),
		};
	});
	return { channels, omegaStd: info > 0 ? 1 / Math.sqrt(info) : NaN };
}

function wrapRad(x: number): number {
	const y = x - 2 * Math.PI * Math.round(x / (2 * Math.PI));
	return y <= -Math.PI ? y + 2 * Math.PI : y;
}
