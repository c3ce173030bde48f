/**
 * Smallest and largest of any number of values by a plain loop. `Math.min(...values)` passes every value
 * as a call argument, and V8 overflows the stack at some 10^5 arguments (a per-cycle series of a
 * 42-minute record): never spread data into arguments, call these.
 */

/**
 * Smallest value, as Math.min would give for the same values: NaN if any value is NaN, Infinity when
 * there are none.
 * Ref: common practice (the argument limit of JavaScript engines; ECMA-262 sets none, V8 throws RangeError)
 * @example minOf(new Float64Array([229.1, 231.4, 228.7])) // 228.7
 */
export function minOf(values: ArrayLike<number>): number {
	let m = Infinity;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (v < m) m = v;
		else if (v !== v) return NaN;
	}
	return m;
}

/**
 * Largest value, as Math.max would give for the same values: NaN if any value is NaN, -Infinity when
 * there are none.
 * Ref: common practice
 * @example maxOf([4.9, 5.2, 5.0]) // 5.2
 */
export function maxOf(values: ArrayLike<number>): number {
	let m = -Infinity;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (v > m) m = v;
		else if (v !== v) return NaN;
	}
	return m;
}
