/**
 * Streaming half-period RMS Uhp: the RMS of the voltage over each half period between consecutive zero
 * crossings. Ref: IEC 61000-4-15:2010, 3.1.2 (half period RMS value; from memory).
 *
 * A crossing is a sign change at least 0.6 nominal half periods after the previous one (so noise at a
 * crossing cannot split a half period); with no crossing for 1.5 nominal half periods (a dead or
 * distorted channel) the value so far is emitted, so time keeps moving.
 */
export interface HalfPeriodRms {
	/** Next samples (V); values are handed to the callback as they complete. */
	push(samples: Float64Array): void;
}

/**
 * @param sampleRateHz  samples per second
 * @param nominalHz     50 or 60
 * @param onValue       called with the window start (s from the first sample) and its RMS (V)
 * @example a 230 V RMS sine gives 230 V for every half period
 */
export function createHalfPeriodRms(
	sampleRateHz: number,
	nominalHz: number,
	onValue: (startS: number, rmsV: number) => void,
): HalfPeriodRms {
	const half = sampleRateHz / (2 * nominalHz);
	const minGap = Math.max(1, Math.floor(0.6 * half));
	const maxGap = Math.ceil(1.5 * half);
	// Window edges are the interpolated crossing instants (in samples); the mean square divides the sum of
	// the samples between them by that length, so a sample sitting at zero cannot shift the value.
	// The state lives in a Float64Array (n, edge, count, sumSq, prev, seenCrossing as 0/1), copied into
	// locals around each block: the optimiser then keeps every local an unboxed double (a closure's own
	// variables, or object fields that start as small integers, cost a heap number per sample).
	const st = new Float64Array(6);
	return {
		push(samples: Float64Array): void {
			const n0 = st[0],
				len = samples.length;
			let edge = st[1],
				count = st[2],
				sumSq = st[3],
				prev = st[4],
				seenCrossing = st[5] !== 0;
			for (let i = 0; i < len;) {
				// Fast run: finite samples on prev's side of zero that end nothing (no crossing, and no
				// timeout once a crossing was seen) only add to the sum. Same order of additions as one by one.
				const lim = seenCrossing ? Math.min(len, i + Math.max(0, maxGap - count)) : len;
				let j = i;
				if (prev < 0)
					for (; j < lim; j++) {
						const v = samples[j];
						if (!(v < 0 && v > -Infinity)) break;
						sumSq += v * v;
					}
				else
					for (; j < lim; j++) {
						const v = samples[j];
						if (!(v >= 0 && v < Infinity)) break;
						sumSq += v * v;
					}
				if (j > i) {
					count += j - i;
					prev = samples[j - 1];
					i = j;
					if (i === len) break;
				}
				// One sample that may end a window (or is not finite), as the definition reads.
				const v = samples[i],
					n = n0 + i;
				i++;
				if (!(v - v === 0)) continue; // not finite
				const crossed = (prev < 0 && v >= 0) || (prev >= 0 && v < 0);
				if (crossed && (count >= minGap || !seenCrossing)) {
					const at = n - 1 + prev / (prev - v);
					if (seenCrossing && at - edge > 0) onValue(edge / sampleRateHz, Math.sqrt(sumSq / (at - edge)));
					seenCrossing = true;
					edge = at;
					count = 0;
					sumSq = 0;
				} else if (seenCrossing && count >= maxGap) {
					if (n - edge > 0) onValue(edge / sampleRateHz, Math.sqrt(sumSq / (n - edge)));
					edge = n;
					count = 0;
					sumSq = 0;
				}
				prev = v;
				count++;
				sumSq += v * v;
			}
			st[0] = n0 + len;
			st[1] = edge;
			st[2] = count;
			st[3] = sumSq;
			st[4] = prev;
			st[5] = seenCrossing ? 1 : 0;
		},
	};
}
