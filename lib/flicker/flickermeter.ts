/**
 * Streaming digital flickermeter after IEC 61000-4-15:2010 (Ed.2): push voltage samples of one channel (or of
 * a group of channels of one recording) in chunks of any size, get Pst per 10-minute interval, Plt per
 * 2 hours and Pinst statistics. Memory is fixed (per channel two class tables of 128 KB and a 10-cycle
 * start buffer) besides the results kept.
 */
import { PINST_CLASSES, pltFromPst, pstFromHistogram, pinstLevelExceeded, type PstFigures } from './classifier.js';
import { BlockSquares } from './block-squares.js';
import { chainStretch, type ChainStretch } from './chain.js';
import { ChainGroup } from './chain-group.js';
import { PLT_PST_COUNT, PST_INTERVAL_S } from './constants.js';
import { designFlickermeter, type FlickerDesign, type FlickerSettings } from './design.js';

/** One 10-minute observation interval, times in s from the first sample. */
export interface PstInterval extends PstFigures {
	startS: number;
	durationS: number;
}

/** One 2-hour period: Plt from 12 consecutive Pst values. */
export interface PltInterval {
	startS: number;
	durationS: number;
	plt: number;
}

/**
 * Pinst over the whole record (every chain value, fs/D per second): NOT a Pst. Levels are those exceeded
 * the given % of the time. All NaN for an empty record.
 */
export interface PinstStatistics {
	durationS: number;
	max: number;
	mean: number;
	p1: number;
	p10: number;
	p50: number;
}

export interface FlickermeterOptions extends FlickerSettings {
	/** Length of the Pinst summary blocks (max and mean per block), s. Default 1. */
	pinstBlockS?: number;
	/** Keep the Pinst blocks in the result (memory grows by 16 bytes per block). Default false. */
	keepPinstBlocks?: boolean;
	/**
	 * Seconds past a 10-minute clock tick at the first sample (lib/trend/clock.ts). Pst intervals then end
	 * on the clock's ticks (IEC 61000-4-30:2015, 4.5.3; from memory) and the first, partial one gives no
	 * Pst. Default 0: intervals count from the first sample.
	 */
	intervalOffsetS?: number;
	/** Called with each Pst once its 10 minutes are complete. */
	onPst?: (interval: PstInterval) => void;
	/** Called with each finished Pinst block: start (s), max and mean Pinst. */
	onPinstBlock?: (startS: number, maxPinst: number, meanPinst: number) => void;
}

export interface FlickerResult {
	sampleRateHz: number;
	nominalHz: 50 | 60;
	lamp: FlickerDesign['lamp'];
	durationS: number;
	/** Complete 10-minute intervals only, counted from the first sample. */
	pst: PstInterval[];
	/** Complete 2-hour periods only (12 consecutive Pst from the start). */
	plt: PltInterval[];
	pinst: PinstStatistics;
	/** With keepPinstBlocks: per block, max and mean Pinst. */
	pinstBlocks?: { blockS: number; startS: number[]; max: number[]; mean: number[] };
	/** Samples that were NaN or infinite (each repeated the previous finite square). */
	nonFiniteSamples: number;
}

export interface Flickermeter {
	readonly design: FlickerDesign;
	/** Next samples of the channel, in the channel's unit (V); the array is not kept or changed. */
	push(samples: Float64Array): void;
	/** Ends the record and returns everything; the meter cannot be pushed to afterwards. */
	finish(): FlickerResult;
}

/** Fundamental cycles averaged for the adaptor's starting mean square. */
const START_CYCLES = 10;

/** Chain values per pass of the block squares: the size of the one buffer between them (64 KB). */
const CHAIN_BUFFER = 8192;

/**
 * Seconds at the start of a record whose Pinst is left out of every statistic: the band filters meet the
 * mains ripple abruptly at the first sample and the 300 ms smoothing carries that transient for ~3 s
 * (a Pinst of 0.7 decays below 1e-3 within 2.5 s). Our own choice, about 16 smoothing time constants;
 * the first 10-minute interval then classifies 595 s.
 */
export const FLICKER_SETTLING_S = 5;

/**
 * Creates a streaming flickermeter for one channel. Results do not depend on how the samples are
 * chunked. The chain starts in the steady state of the first 10 nominal cycles' mean square; the first
 * 5 s (FLICKER_SETTLING_S) settle the filters and are not classified.
 *
 * @throws RangeError for a sample rate below 1600 S/s or a nominal frequency other than 50/60 Hz
 * @example
 * const m = createFlickermeter({ sampleRateHz: 6400, nominalHz: 50 });
 * m.push(tenMinutesOf230VWith8_8HzModulationAt0_25Percent);
 * m.finish().pst[0].pst // ≈ 0.7 (Pinst ≈ 1 all the time)
 */
export function createFlickermeter(options: FlickermeterOptions): Flickermeter {
	const { onPst, onPinstBlock } = options;
	const group = new StreamingFlickerGroup(1, {
		...options,
		onPst: onPst && ((_, interval) => onPst(interval)),
		onPinstBlock: onPinstBlock && ((_, startS, max, mean) => onPinstBlock(startS, max, mean)),
	});
	return { design: group.design, push: (samples) => group.push([samples]), finish: () => group.finish()[0] };
}

/** Options of a group: those of one meter, the callbacks told which channel (0-based). */
export interface FlickermeterGroupOptions extends Omit<FlickermeterOptions, 'onPst' | 'onPinstBlock'> {
	onPst?: (channel: number, interval: PstInterval) => void;
	onPinstBlock?: (channel: number, startS: number, maxPinst: number, meanPinst: number) => void;
}

/** Flickermeters for the channels of one recording (same rate, same samples count), run together. */
export interface FlickermeterGroup {
	readonly design: FlickerDesign;
	readonly channels: number;
	/** Next samples of every channel (one array each, equal lengths); the arrays are not kept or changed. */
	push(samples: readonly Float64Array[]): void;
	/** Ends the record; one result per channel, each what a meter of its own gives. */
	finish(): FlickerResult[];
}

/**
 * Creates flickermeters for `channels` channels of one recording, run in one pass: the filter chains of
 * each three channels share one loop (lib/flicker/chain-group.ts), which is faster than a meter per
 * channel. Every result is bit-identical to the one a separate `createFlickermeter` gives.
 *
 * @throws RangeError as createFlickermeter, and for a channel count that is not a whole number ≥ 1
 */
export function createFlickermeterGroup(channels: number, options: FlickermeterGroupOptions): FlickermeterGroup {
	if (!(Number.isInteger(channels) && channels >= 1))
		throw new RangeError(`a flickermeter group needs 1 or more channels, got ${channels}`);
	return new StreamingFlickerGroup(channels, options);
}

/** What each channel of a group keeps: its block squares, Pinst classes and results. */
class ChannelTally {
	squares: BlockSquares | null = null;
	readonly squaresOut = new Float64Array(CHAIN_BUFFER + 1);
	readonly interval = new Uint32Array(PINST_CLASSES);
	readonly record = new Uint32Array(PINST_CLASSES);
	readonly stretch: ChainStretch = chainStretch();
	recordMax = 0;
	recordSum = 0;
	readonly pst: PstInterval[] = [];
	readonly blocks?: { blockS: number; startS: number[]; max: number[]; mean: number[] };

	constructor(
		readonly startBuffer: Float64Array,
		blockS: number,
		keepBlocks: boolean,
	) {
		if (keepBlocks) this.blocks = { blockS, startS: [], max: [], mean: [] };
	}

	/** Mean square of the finite samples in the start buffer's first `fill` values (0 for none). */
	startMeanSquare(fill: number): number {
		let sumSq = 0,
			finite = 0;
		for (const v of this.startBuffer.subarray(0, fill))
			if (Number.isFinite(v)) {
				sumSq += v * v;
				finite++;
			}
		return finite > 0 ? sumSq / finite : 0;
	}
}

class StreamingFlickerGroup implements FlickermeterGroup {
	readonly design: FlickerDesign;
	private chains: ChainGroup | null = null;
	private readonly tallies: ChannelTally[];
	private readonly squaresOut: Float64Array[];
	private readonly intervals: Uint32Array[];
	private readonly stretches: ChainStretch[];
	private startFill = 0;
	private intervalCount = 0;
	private recordCount = 0;
	private n = 0; // values through the chain (at the chain rate)
	private samplesIn = 0; // input samples taken, per channel
	private readonly intervalSamples: number;
	/** Chain values past a clock tick at the first sample (0 when intervals count from the first sample). */
	private readonly offsetSamples: number;
	private readonly settlingSamples: number;
	private settlingCounts?: Uint32Array;
	private readonly blockS: number;
	private block = 0;
	private blockStartN = 0;
	private finished = false;

	constructor(
		readonly channels: number,
		private readonly options: FlickermeterGroupOptions,
	) {
		this.design = designFlickermeter(options);
		const fs = this.design.chainRateHz;
		this.intervalSamples = Math.round(PST_INTERVAL_S * fs);
		const offsetS = options.intervalOffsetS ?? 0;
		if (!(offsetS >= 0 && offsetS < PST_INTERVAL_S))
			throw new RangeError(`intervalOffsetS must be in [0, ${PST_INTERVAL_S}) s, got ${options.intervalOffsetS}`);
		this.offsetSamples = Math.round(offsetS * fs) % this.intervalSamples;
		this.settlingSamples = Math.round(FLICKER_SETTLING_S * fs);
		this.blockS = options.pinstBlockS ?? 1;
		if (!(this.blockS > 0)) throw new RangeError(`pinstBlockS must be > 0, got ${options.pinstBlockS}`);
		const startLength = Math.round((START_CYCLES * this.design.sampleRateHz) / options.nominalHz);
		this.tallies = Array.from(
			{ length: channels },
			() => new ChannelTally(new Float64Array(startLength), this.blockS, options.keepPinstBlocks === true),
		);
		this.squaresOut = this.tallies.map((t) => t.squaresOut);
		this.intervals = this.tallies.map((t) => t.interval);
		this.stretches = this.tallies.map((t) => t.stretch);
	}

	push(samples: readonly Float64Array[]): void {
		if (this.finished) throw new Error('flickermeter already finished');
		const length = samples[0]?.length ?? 0;
		if (samples.length !== this.channels || samples.some((x) => x.length !== length))
			throw new RangeError(`flickermeter group: expected ${this.channels} arrays of equal length`);
		this.samplesIn += length;
		let from = 0;
		if (!this.chains) {
			const startLength = this.tallies[0].startBuffer.length;
			const take = Math.min(length, startLength - this.startFill);
			this.tallies.forEach((t, k) => t.startBuffer.set(samples[k].subarray(0, take), this.startFill));
			this.startFill += take;
			from = take;
			if (this.startFill < startLength) return;
			this.start();
		}
		if (from < length) this.feed(samples, from, length);
	}

	/** Builds the block squares and the chains from each start buffer's mean square; runs the buffers through them. */
	private start(): void {
		const meanSquares = this.tallies.map((t) => t.startMeanSquare(this.startFill));
		this.tallies.forEach((t, k) => (t.squares = new BlockSquares(this.design.decimation, meanSquares[k])));
		this.chains = new ChainGroup(this.design, meanSquares);
		if (this.startFill > 0)
			this.feed(
				this.tallies.map((t) => t.startBuffer),
				0,
				this.startFill,
			);
	}

	/** Input samples [from, to) through the block squares, a buffer at a time, and on through the chains. */
	private feed(x: readonly Float64Array[], from: number, to: number): void {
		const step = CHAIN_BUFFER * this.design.decimation;
		for (let i = from; i < to; i += step) {
			const end = Math.min(to, i + step);
			let count = 0;
			for (let k = 0; k < this.channels; k++)
				count = this.tallies[k].squares!.run(x[k], i, end, this.tallies[k].squaresOut);
			this.feedChain(this.squaresOut, 0, count);
		}
	}

	/** Splits chain values [from, to) at block and interval boundaries and runs each stretch. */
	private feedChain(x: readonly Float64Array[], from: number, to: number): void {
		const fs = this.design.chainRateHz;
		let i = from;
		while (i < to) {
			const blockEnd = Math.round((this.block + 1) * this.blockS * fs);
			const intervalEnd =
				(Math.floor((this.n + this.offsetSamples) / this.intervalSamples) + 1) * this.intervalSamples -
				this.offsetSamples;
			if (this.n < this.settlingSamples) {
				const stop = Math.min(to, i + (this.settlingSamples - this.n));
				this.settle(x, i, stop);
				i = stop;
				continue;
			}
			const stop = Math.min(to, i + (Math.min(blockEnd, intervalEnd) - this.n));
			this.chains!.run(x, i, stop, this.intervals, this.stretches);
			this.intervalCount += stop - i;
			this.n += stop - i;
			i = stop;
			if (this.n === blockEnd) this.closeBlock();
			if (this.n === intervalEnd) this.closeInterval();
		}
	}

	/** Runs the settling stretch: the chains' states move on, their Pinst is neither classified nor summarised. */
	private settle(x: readonly Float64Array[], from: number, to: number): void {
		const counts = (this.settlingCounts ??= new Uint32Array(PINST_CLASSES));
		const scratch = this.tallies.map(() => chainStretch());
		this.chains!.run(
			x,
			from,
			to,
			this.tallies.map(() => counts),
			scratch,
		);
		this.n += to - from;
		if (this.n >= this.settlingSamples) {
			this.settlingCounts = undefined;
			this.block = Math.floor(this.n / (this.blockS * this.design.chainRateHz));
			this.blockStartN = this.n;
		}
	}

	private closeBlock(): void {
		const startN = this.blockStartN;
		const count = this.n - startN;
		const startS = startN / this.design.chainRateHz;
		this.tallies.forEach((t, k) => {
			const st = t.stretch;
			if (count > 0) {
				const mean = st.sum / count;
				this.options.onPinstBlock?.(k, startS, st.max, mean);
				if (t.blocks) {
					t.blocks.startS.push(startS);
					t.blocks.max.push(st.max);
					t.blocks.mean.push(mean);
				}
				if (st.max > t.recordMax) t.recordMax = st.max;
				t.recordSum += st.sum;
			}
			st.max = 0;
			st.sum = 0;
		});
		this.block++;
		this.blockStartN = this.n;
	}

	private closeInterval(): void {
		const fs = this.design.chainRateHz;
		const startN = this.n - this.intervalSamples;
		// A first interval cut by a clock tick is partial: its Pinst counts in the record, it gives no Pst.
		if (startN >= 0) {
			this.tallies.forEach((t, k) => {
				const figures = pstFromHistogram(t.interval, this.intervalCount);
				const interval: PstInterval = { startS: startN / fs, durationS: this.intervalSamples / fs, ...figures };
				t.pst.push(interval);
				this.options.onPst?.(k, interval);
			});
		}
		this.mergeInterval();
	}

	private mergeInterval(): void {
		for (const t of this.tallies) {
			for (let k = 0; k < PINST_CLASSES; k++) t.record[k] += t.interval[k];
			t.interval.fill(0);
		}
		this.recordCount += this.intervalCount;
		this.intervalCount = 0;
	}

	finish(): FlickerResult[] {
		if (this.finished) throw new Error('flickermeter already finished');
		if (!this.chains && this.startFill > 0) this.start();
		if (this.n > this.blockStartN) this.closeBlock();
		this.mergeInterval();
		this.finished = true;
		const d = this.design;
		return this.tallies.map((t) => ({
			sampleRateHz: d.sampleRateHz,
			nominalHz: d.nominalHz,
			lamp: d.lamp,
			durationS: this.samplesIn / d.sampleRateHz,
			pst: t.pst,
			plt: pltIntervals(t.pst),
			pinst: this.statistics(t),
			pinstBlocks: t.blocks,
			nonFiniteSamples: t.squares?.nonFinite ?? 0,
		}));
	}

	private statistics(t: ChannelTally): PinstStatistics {
		const level = (p: number) => pinstLevelExceeded(t.record, this.recordCount, p);
		const empty = this.recordCount === 0;
		return {
			durationS: this.samplesIn / this.design.sampleRateHz,
			max: empty ? NaN : t.recordMax,
			mean: empty ? NaN : t.recordSum / this.recordCount,
			p1: level(1),
			p10: level(10),
			p50: level(50),
		};
	}
}

/**
 * Plt per 2-hour period from consecutive 10-minute values: groups of 12 from the first, incomplete
 * groups dropped. Ref: IEC 61000-4-15:2010, 5.7.3 (from memory).
 */
export function pltIntervals(pst: readonly PstInterval[]): PltInterval[] {
	const out: PltInterval[] = [];
	for (let k = 0; k + PLT_PST_COUNT <= pst.length; k += PLT_PST_COUNT) {
		const group = pst.slice(k, k + PLT_PST_COUNT);
		const last = group[group.length - 1];
		out.push({
			startS: group[0].startS,
			durationS: last.startS + last.durationS - group[0].startS,
			plt: pltFromPst(group.map((p) => p.pst)),
		});
	}
	return out;
}
