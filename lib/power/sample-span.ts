/**
 * Whole-cycle windows over sample arrays and the time integral used for mean values over them.
 * A window runs from a fractional sample index (a rising zero crossing, as lib/signal's findWholeCycles
 * returns) to another, spanning `cycles` whole periods of the fundamental.
 */

/** A whole-cycle window in fractional sample indices (sample n is at time n / fs). */
export interface PowerSampleWindow {
	/** Fractional sample index where the window starts (e.g. a rising zero crossing of the fundamental). */
	startIndex: number;
	/** Fractional sample index where it ends, `cycles` periods later. */
	endIndex: number;
	/** Number of whole fundamental cycles between them (≥ 1). */
	cycles: number;
}

/** RangeError unless 0 ≤ startIndex < endIndex ≤ length and cycles ≥ 1 (the record covers `length` sample intervals). */
export function checkPowerWindow(span: PowerSampleWindow, length: number): void {
	const { startIndex: s, endIndex: e, cycles } = span;
	if (!(s >= 0 && e > s && e <= length)) {
		throw new RangeError(`window ${s}..${e} must satisfy 0 <= startIndex < endIndex <= ${length} (samples available)`);
	}
	if (!(cycles >= 1) || !Number.isInteger(cycles))
		throw new RangeError(`window cycles must be a whole number >= 1, got ${cycles}`);
}

/**
 * Mean over [s, e] of f(n), integrating the piecewise-linear interpolant of f between samples
 * (trapezoid rule, with the fractional end pieces interpolated).
 *
 * mean = (1/(e − s)) · ∫_s^e f(t) dt
 *
 * Why trapezoid: for integer s, e over whole periods it equals the plain mean of the samples, exact for
 * any band-limited periodic product; fractional ends cost an error O(1/fs²) instead of O(1/fs).
 * The caller guarantees 0 ≤ s < e ≤ last index.
 */
export function windowMean(f: (n: number) => number, s: number, e: number): number {
	const n0 = Math.floor(s);
	const n1 = Math.floor(e);
	const at = (t: number): number => {
		const n = Math.floor(t);
		const frac = t - n;
		return frac === 0 ? f(n) : f(n) + frac * (f(n + 1) - f(n));
	};
	if (n0 === n1) return (at(s) + at(e)) / 2;
	let sum = ((n0 + 1 - s) * (at(s) + f(n0 + 1))) / 2;
	for (let n = n0 + 1; n < n1; n++) sum += (f(n) + f(n + 1)) / 2;
	if (e > n1) sum += ((e - n1) * (f(n1) + at(e))) / 2;
	return sum / (e - s);
}

/**
 * Weights of windowMean as a vector: mean = Σ_j weights[j]·f(firstIndex + j), Σ weights = 1.
 * Lets hot loops (cross-correlation) run over typed arrays instead of calling a closure per sample.
 * The caller guarantees 0 ≤ s < e ≤ last index.
 */
export function powerWindowWeights(s: number, e: number): { firstIndex: number; weights: Float64Array } {
	const n0 = Math.floor(s);
	const n1 = Math.floor(e);
	const a = s - n0;
	const b = e - n1;
	const w = new Float64Array(n1 - n0 + 2);
	if (n0 === n1) {
		// mean of the two interpolated end values, as windowMean
		const bb = e - n0;
		w[0] = (1 - a + (1 - bb)) / 2;
		w[1] = (a + bb) / 2;
	} else {
		const len = e - s;
		const l1 = 1 - a;
		w[0] += (l1 * (1 - a)) / 2 / len;
		w[1] += (l1 * (1 + a)) / 2 / len;
		for (let n = n0 + 1; n < n1; n++) {
			w[n - n0] += 0.5 / len;
			w[n + 1 - n0] += 0.5 / len;
		}
		if (b > 0) {
			w[n1 - n0] += (b * (2 - b)) / 2 / len;
			w[n1 + 1 - n0] += (b * b) / 2 / len;
		}
	}
	// drop a zero last weight so callers never read past the window's last sample
	return { firstIndex: n0, weights: w[w.length - 1] === 0 ? w.subarray(0, w.length - 1) : w };
}

/** f(n) for n < length; past the last sample (n = length) the value one period earlier, linear between samples. */
function continuedPastEnd(f: (n: number) => number, length: number, span: PowerSampleWindow): (n: number) => number {
	const period = (span.endIndex - span.startIndex) / span.cycles;
	return (n) => {
		if (n < length) return f(n);
		const t = n - period;
		const k = Math.floor(t);
		return t > k ? f(k) + (t - k) * (f(k + 1) - f(k)) : f(k);
	};
}

/**
 * windowMean of f(n) = a[n]·b[n] (continued past the record end as continuedPastEnd), term for term the
 * same sums, with the inner samples read from the arrays instead of through a closure per sample.
 */
function productWindowMean(a: Float64Array, b: Float64Array, span: PowerSampleWindow): number {
	const length = a.length;
	const f = continuedPastEnd((n) => a[n] * b[n], length, span);
	const s = span.startIndex;
	const e = span.endIndex;
	const n0 = Math.floor(s);
	const n1 = Math.floor(e);
	if (n0 === n1 || n1 - n0 < 2) return windowMean(f, s, e);
	const at = (t: number): number => {
		const n = Math.floor(t);
		const frac = t - n;
		return frac === 0 ? f(n) : f(n) + frac * (f(n + 1) - f(n));
	};
	let sum = ((n0 + 1 - s) * (at(s) + f(n0 + 1))) / 2;
	// inner trapezoids (f(n) + f(n + 1))/2 for n0 < n < n1; every index read here is below length but the last
	const direct = Math.max(n0 + 1, Math.min(n1, length - 1));
	sum = innerTrapezoids(a, b, n0 + 1, direct, sum);
	for (let n = direct; n < n1; n++) sum += (f(n) + f(n + 1)) / 2;
	if (e > n1) sum += ((e - n1) * (f(n1) + at(e))) / 2;
	return sum / (e - s);
}

/** sum + Σ (a[n]b[n] + a[n+1]b[n+1])/2 for from ≤ n < to, added in order (a small loop V8 optimises on its own). */
function innerTrapezoids(a: Float64Array, b: Float64Array, from: number, to: number, sum: number): number {
	let prev = a[from] * b[from];
	for (let n = from; n < to; n++) {
		const next = a[n + 1] * b[n + 1];
		sum += (prev + next) / 2;
		prev = next;
	}
	return sum;
}

/**
 * Active power P = (1/T)∫ v·i dt over a whole-cycle window, in W when v is in V and i in A.
 * Ref: IEEE Std 1459-2010, 3.1.2.1 (P = (1/kT)∫ p dt over k whole cycles) (from memory).
 * @param voltage, current  equal-length sample arrays on the same time base
 * @param span  whole-cycle window in fractional sample indices; see PowerSampleWindow
 * @returns P in W; NaN when a sample in the window is NaN
 * @throws RangeError for arrays of unequal length or a window outside the samples
 * @example activePowerFromSamplesW(v, i, { startIndex: 0, endIndex: 2000, cycles: 10 }) // 1991.86 for 230 V, 10 A, θ = 30°
 */
export function activePowerFromSamplesW(voltage: Float64Array, current: Float64Array, span: PowerSampleWindow): number {
	if (voltage.length !== current.length)
		throw new RangeError(`voltage has ${voltage.length} samples, current ${current.length}`);
	checkPowerWindow(span, voltage.length);
	return productWindowMean(voltage, current, span);
}

/**
 * RMS over a whole-cycle window, same unit as the samples: √((1/T)∫ x² dt), trapezoid rule as windowMean.
 * @returns NaN when a sample in the window is NaN
 * @example powerWindowRms(sine230, { startIndex: 0, endIndex: 2000, cycles: 10 }) // 230.0
 */
export function powerWindowRms(samples: Float64Array, span: PowerSampleWindow): number {
	checkPowerWindow(span, samples.length);
	return Math.sqrt(productWindowMean(samples, samples, span));
}
