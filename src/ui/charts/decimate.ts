/**
 * Min/max decimation per pixel column, for drawing millions of samples on a few hundred pixel columns.
 *
 * The samples i0 … i1−1 are split into `columns` runs of (nearly) equal length. For each run two points are
 * emitted: its minimum and its maximum, in the order they occur in time, at the run's first time and at its
 * middle time. A line through those points covers exactly the vertical extent the full data covers in that
 * column, so peaks and spikes never disappear at any zoom. When the range holds no more than two samples per
 * column the samples themselves are emitted (full detail).
 *
 * Pure: inputs are never mutated; the output goes into caller-owned buffers (allocate once, reuse on every
 * zoom step: first touch of fresh memory is slow) and the number of points written is returned.
 *
 * Ref: min/max per pixel column is the common practice of sample-based plotting (uPlot's docs recommend it
 * when points exceed a few times the pixel count).
 */

/** A uniform time base: t(i) = startS + i / sampleRateHz; or explicit per-sample times. */
export type TimeBase = { startS: number; sampleRateHz: number; timeS?: Float64Array };

/** Time in s of sample i. */
export function timeAt(base: TimeBase, i: number): number {
	return base.timeS ? base.timeS[i] : base.startS + i / base.sampleRateHz;
}

/** First sample index whose time is >= tS (clamped to 0 … n). Binary search for explicit time bases. */
export function indexAtOrAfter(base: TimeBase, n: number, tS: number): number {
	if (!base.timeS) {
		const i = Math.ceil((tS - base.startS) * base.sampleRateHz - 1e-9);
		return Math.min(n, Math.max(0, i));
	}
	let lo = 0;
	let hi = n;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (base.timeS[mid] < tS) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/**
 * Per-block minima and maxima of one channel (block = a fixed run of samples), so a column spanning many
 * blocks reads one value pair per block instead of every sample: at 1e7 samples and blocks of 64, a view of
 * the whole record reads 156 250 pairs per channel instead of 10 million samples.
 */
export interface MinMaxBlocks {
	block: number;
	mins: Float64Array;
	maxs: Float64Array;
	/** 1 when the block's minimum comes before its maximum (keeps the drawn order of the extremes). */
	minFirst: Uint8Array;
}

/**
 * Block minima and maxima of `samples` (NaN skipped; an all-NaN block has min +∞ and max −∞).
 * @param block  samples per block, an integer >= 2 (RangeError otherwise)
 */
export function buildMinMaxBlocks(samples: Float64Array, block = 64): MinMaxBlocks {
	if (!Number.isInteger(block) || block < 2) throw new RangeError(`block must be an integer >= 2, got ${block}`);
	const count = Math.floor(samples.length / block);
	const mins = new Float64Array(count);
	const maxs = new Float64Array(count);
	const minFirst = new Uint8Array(count);
	for (let j = 0; j < count; j++) {
		let lo = Infinity;
		let hi = -Infinity;
		let iLo = 0;
		let iHi = 0;
		const s = j * block;
		for (let i = s; i < s + block; i++) {
			const v = samples[i];
			if (v < lo) {
				lo = v;
				iLo = i;
			}
			if (v > hi) {
				hi = v;
				iHi = i;
			}
		}
		mins[j] = lo;
		maxs[j] = hi;
		minFirst[j] = iLo <= iHi ? 1 : 0;
	}
	return { block, mins, maxs, minFirst };
}

/** Output buffers for `decimateMinMax`: x and one y buffer per channel, each of length >= 2 · maxColumns + 2. */
export interface DecimationBuffers {
	x: Float64Array;
	ys: Float64Array[];
}

/** Buffers for `channelCount` channels and up to `maxColumns` pixel columns (allocated once). */
export function makeDecimationBuffers(channelCount: number, maxColumns: number): DecimationBuffers {
	const len = 2 * maxColumns + 2;
	return { x: new Float64Array(len), ys: Array.from({ length: channelCount }, () => new Float64Array(len)) };
}

/**
 * Decimate samples i0 … i1−1 of every channel to at most 2 · columns points (shared x).
 *
 * @param channels  sample arrays of equal length (any unit; copied through unchanged)
 * @param base      time base giving each sample's time in s
 * @param i0        first sample index (inclusive); clamped to 0
 * @param i1        last sample index (exclusive); clamped to the length
 * @param columns   pixel columns available (>= 1); RangeError otherwise
 * @param out       buffers from `makeDecimationBuffers` with room for 2 · columns points
 * @param blocks    optional `buildMinMaxBlocks` of each channel: columns spanning four blocks or more read the
 *   block extremes for their whole blocks (same values, far fewer reads)
 * @returns number of points written to out.x and each out.ys[k]; `full` is true when samples were copied
 *   one for one (no decimation)
 * @example 10 s of 50 Hz at 1 MS/s (1e7 samples) on 1000 columns → 2000 points, each column's pair the
 *   ±325 V crests of the five cycles it spans.
 */
export function decimateMinMax(
	channels: readonly Float64Array[],
	base: TimeBase,
	i0: number,
	i1: number,
	columns: number,
	out: DecimationBuffers,
	blocks?: readonly (MinMaxBlocks | undefined)[],
): { count: number; full: boolean } {
	if (!(columns >= 1) || !Number.isFinite(columns)) throw new RangeError(`columns must be >= 1, got ${columns}`);
	const cols = Math.floor(columns);
	const n = channels[0]?.length ?? 0;
	const a0 = Math.max(0, Math.min(n, Math.floor(i0)));
	const a1 = Math.max(a0, Math.min(n, Math.ceil(i1)));
	const span = a1 - a0;
	if (out.x.length < Math.min(span, 2 * cols)) throw new RangeError('output buffers too small for the column count');
	if (span <= 2 * cols) {
		for (let j = 0; j < span; j++) out.x[j] = timeAt(base, a0 + j);
		for (let k = 0; k < channels.length; k++) {
			const src = channels[k];
			const dst = out.ys[k];
			for (let j = 0; j < span; j++) dst[j] = src[a0 + j];
		}
		return { count: span, full: true };
	}
	let p = 0;
	for (let c = 0; c < cols; c++) {
		const s = a0 + Math.floor((c * span) / cols);
		const e = a0 + Math.floor(((c + 1) * span) / cols);
		out.x[p] = timeAt(base, s);
		out.x[p + 1] = timeAt(base, (s + e - 1) >>> 1);
		for (let k = 0; k < channels.length; k++) {
			const src = channels[k];
			let lo = Infinity;
			let hi = -Infinity;
			let iLo = s;
			let iHi = s;
			const bl = blocks?.[k];
			// whole blocks inside [s, e) come from the block table; the ragged ends from the samples
			const b0 = bl && e - s >= 4 * bl.block ? Math.ceil(s / bl.block) : 0;
			const b1 = bl && e - s >= 4 * bl.block ? Math.min(bl.mins.length, Math.floor(e / bl.block)) : 0;
			const rawEnd = b1 > b0 ? b0 * bl!.block : e;
			for (let i = s; i < rawEnd; i++) {
				const v = src[i];
				// NaN compares false both ways and is skipped, so a gap does not hide the samples around it
				if (v < lo) {
					lo = v;
					iLo = i;
				}
				if (v > hi) {
					hi = v;
					iHi = i;
				}
			}
			if (b1 > b0) {
				const B = bl!.block;
				for (let j = b0; j < b1; j++) {
					if (bl!.mins[j] < lo) {
						lo = bl!.mins[j];
						iLo = j * B + (bl!.minFirst[j] ? 0 : B - 1);
					}
					if (bl!.maxs[j] > hi) {
						hi = bl!.maxs[j];
						iHi = j * B + (bl!.minFirst[j] ? B - 1 : 0);
					}
				}
				for (let i = b1 * B; i < e; i++) {
					const v = src[i];
					if (v < lo) {
						lo = v;
						iLo = i;
					}
					if (v > hi) {
						hi = v;
						iHi = i;
					}
				}
			}
			const dst = out.ys[k];
			if (lo > hi) {
				dst[p] = NaN; // the whole column is a gap
				dst[p + 1] = NaN;
			} else if (iLo <= iHi) {
				dst[p] = lo;
				dst[p + 1] = hi;
			} else {
				dst[p] = hi;
				dst[p + 1] = lo;
			}
		}
		p += 2;
	}
	return { count: p, full: false };
}
