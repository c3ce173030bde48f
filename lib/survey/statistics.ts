/**
 * The statistics the voltage-characteristics standards ask for: the share of values inside a band and
 * the value not exceeded by a given share of values (a percentile), over values that are finite.
 */

/**
 * Share of the values within [low, high], in % (both ends inclusive). NaN when no value is finite.
 * @example shareWithinPercent([229, 231, 260], 207, 253) // 66.67
 */
export function shareWithinPercent(values: ArrayLike<number>, low: number, high: number): number {
	let n = 0;
	let inside = 0;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (!Number.isFinite(v)) continue;
		n++;
		if (v >= low && v <= high) inside++;
	}
	return n === 0 ? NaN : (100 * inside) / n;
}

/**
 * Nearest-rank percentile: the smallest value such that at least `percent` % of the finite values are at
 * or below it (the value "not exceeded for 95 % of the time" of EN 50160 statistics). NaN when no value is
 * finite. Ref: nearest-rank definition (common practice); the standards state the share, not the method.
 * @example percentileNearestRank([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 95) // 10
 */
export function percentileNearestRank(values: ArrayLike<number>, percent: number): number {
	if (!(percent > 0 && percent <= 100)) throw new RangeError('percent must be in (0, 100]');
	const finite: number[] = [];
	for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite.push(values[i]);
	if (finite.length === 0) return NaN;
	finite.sort((a, b) => a - b);
	const rank = Math.ceil((percent / 100) * finite.length);
	return finite[Math.max(0, rank - 1)];
}

/** Smallest and largest finite value; NaN for both when none is finite. No spreading of arrays into arguments. */
export function finiteRange(values: ArrayLike<number>): { min: number; max: number } {
	let min = Infinity;
	let max = -Infinity;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (!Number.isFinite(v)) continue;
		if (v < min) min = v;
		if (v > max) max = v;
	}
	return min <= max ? { min, max } : { min: NaN, max: NaN };
}
