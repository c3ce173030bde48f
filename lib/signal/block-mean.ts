/**
 * The mean of each block of `m` samples: an O(N) anti-alias decimation by m (a boxcar, whose nulls fall on
 * every multiple of the new rate fs/m). Block j stands at sample jM + (M − 1)/2. A trailing part block is
 * dropped.
 * @example blockMeans(Float64Array.of(1, 3, 5, 7, 9), 2) // Float64Array [2, 6]
 */
export function blockMeans(samples: Float64Array, m: number): Float64Array {
	if (!(m >= 1 && Number.isInteger(m))) throw new RangeError(`block length must be a whole number >= 1, got ${m}`);
	const count = Math.floor(samples.length / m);
	const y = new Float64Array(count);
	for (let j = 0; j < count; j++) {
		let acc = 0;
		for (let k = j * m, end = k + m; k < end; k++) acc += samples[k];
		y[j] = acc / m;
	}
	return y;
}
