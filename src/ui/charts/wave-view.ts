/**
 * The visible time range of a wave plot and the decimated data for it. Buffers are allocated once per
 * capture and reused on every zoom step. No DOM, no uPlot: the chart component and the bench drive it.
 */
import {
	buildMinMaxBlocks,
	decimateMinMax,
	indexAtOrAfter,
	makeDecimationBuffers,
	timeAt,
	type DecimationBuffers,
	type MinMaxBlocks,
	type TimeBase,
} from './decimate.js';

/** Largest plot width in device pixels the buffers are sized for. */
export const MAX_COLUMNS = 8192;
/** Records longer than this get block min/max tables (built once, on the first wide view). */
export const BLOCKS_FROM_SAMPLES = 1 << 18;
const BLOCK = 64;

export class WaveView {
	readonly n: number;
	readonly t0: number;
	readonly t1: number;
	minS: number;
	maxS: number;
	#buf: DecimationBuffers;
	#blocks: MinMaxBlocks[] | undefined;
	/** True when the last `data` call copied samples one for one (no decimation). */
	fullDetail = false;

	constructor(
		readonly channels: readonly Float64Array[],
		readonly base: TimeBase,
	) {
		this.n = channels[0]?.length ?? 0;
		this.t0 = this.n ? timeAt(base, 0) : 0;
		this.t1 = this.n ? timeAt(base, this.n - 1) : 1;
		if (this.t1 <= this.t0) this.t1 = this.t0 + 1 / (base.sampleRateHz || 1);
		this.minS = this.t0;
		this.maxS = this.t1;
		this.#buf = makeDecimationBuffers(channels.length, MAX_COLUMNS);
	}

	/** Shortest range shown: 8 sample intervals. */
	get minSpanS(): number {
		return 8 / (this.base.sampleRateHz || 1);
	}

	/** Sets the visible range, clamped to the record and to at least `minSpanS`. */
	set(minS: number, maxS: number): void {
		let lo = Math.min(minS, maxS);
		let hi = Math.max(minS, maxS);
		const span = Math.min(this.t1 - this.t0, Math.max(hi - lo, this.minSpanS));
		const mid = (lo + hi) / 2;
		lo = mid - span / 2;
		hi = mid + span / 2;
		if (lo < this.t0) {
			hi += this.t0 - lo;
			lo = this.t0;
		}
		if (hi > this.t1) {
			lo -= hi - this.t1;
			hi = this.t1;
		}
		this.minS = Math.max(this.t0, lo);
		this.maxS = hi;
	}

	/** Zooms by `factor` (< 1 zooms in) keeping time `atS` where it is on screen. */
	zoom(factor: number, atS = (this.minS + this.maxS) / 2): void {
		const f = Math.max(0.01, factor);
		this.set(atS - (atS - this.minS) * f, atS + (this.maxS - atS) * f);
	}

	/** Moves the range by `fraction` of its span (positive = later). */
	pan(fraction: number): void {
		const d = (this.maxS - this.minS) * fraction;
		this.set(this.minS + d, this.maxS + d);
	}

	reset(): void {
		this.minS = this.t0;
		this.maxS = this.t1;
	}

	/** Sample index nearest to time tS. */
	indexAt(tS: number): number {
		const i = indexAtOrAfter(this.base, this.n, tS);
		if (i > 0 && (i >= this.n || Math.abs(timeAt(this.base, i - 1) - tS) < Math.abs(timeAt(this.base, i) - tS)))
			return i - 1;
		return Math.min(i, this.n - 1);
	}

	/**
	 * Data for the visible range at `columns` pixel columns: [x, ...channels], views into the reused buffers
	 * (valid until the next call). One sample either side of the range is included so lines reach the edges.
	 */
	data(columns: number): [Float64Array, ...Float64Array[]] {
		const cols = Math.max(1, Math.min(MAX_COLUMNS, Math.floor(columns)));
		const i0 = Math.max(0, indexAtOrAfter(this.base, this.n, this.minS) - 1);
		const i1 = Math.min(this.n, indexAtOrAfter(this.base, this.n, this.maxS) + 1);
		// block tables pay off only when a column spans several blocks; build them the first time one does
		if (!this.#blocks && this.n >= BLOCKS_FROM_SAMPLES && (i1 - i0) / cols >= 4 * BLOCK) {
			this.#blocks = this.channels.map((c) => buildMinMaxBlocks(c, BLOCK));
		}
		const r = decimateMinMax(this.channels, this.base, i0, i1, cols, this.#buf, this.#blocks);
		this.fullDetail = r.full;
		return [this.#buf.x.subarray(0, r.count), ...this.#buf.ys.map((y) => y.subarray(0, r.count))];
	}
}
