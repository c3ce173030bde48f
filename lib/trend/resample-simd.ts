/**
 * window-thd.ts's 8-point Lagrange resampling of up to four channels at once in WebAssembly SIMD (f64x2):
 * the module of resample-simd-source.ts, about four times the speed of the JavaScript loops (4 channels
 * × 2048 points: ~9 µs against ~35 µs, copying the window's samples in included; tests/trend/
 * resample-simd.test.ts). Where WebAssembly or its SIMD is missing, `create` gives undefined and
 * window-thd.ts keeps its JavaScript loops.
 *
 * Memory (bytes): the weight table, the points' first taps and weight rows (int32), the output points
 * of 4 channels, then each channel's window samples (`reserve`). A longer window gets a new memory (and
 * instance), never a grown one: growing detaches a buffer, which slows every typed array in V8.
 */
import { RESAMPLE_SIMD_BASE64 } from './resample-simd-bytes.js';
import { SIMD_POINTS } from './resample-simd-source.js';

type Kernel = (tab: number, at: number, ph: number, src: number, stride: number, out: number, m: number) => void;

const LANES = 4;
const PAGE_BYTES = 65536;
let compiled: WebAssembly.Module | null | undefined;

/** Bytes of a base64 text (the platform's atob: browsers and Node alike). */
export function base64Bytes(text: string): Uint8Array<ArrayBuffer> {
	return Uint8Array.from(atob(text), (ch) => ch.charCodeAt(0));
}

/** The compiled module, once per thread; null where WebAssembly SIMD is not available. */
function moduleOnce(): WebAssembly.Module | null {
	if (compiled !== undefined) return compiled;
	let module: WebAssembly.Module | null = null;
	try {
		const bytes = base64Bytes(RESAMPLE_SIMD_BASE64);
		if (typeof WebAssembly === 'object' && WebAssembly.validate(bytes)) module = new WebAssembly.Module(bytes);
	} catch {
		module = null;
	}
	compiled = module;
	return module;
}

const roundUp16 = (bytes: number) => Math.ceil(bytes / 16) * 16;

export class SimdResampler {
	/** Per output point: its first tap (sample index from the window's first tap) and its weights' row. */
	tapAt!: Int32Array<ArrayBuffer>;
	tapPhase!: Int32Array<ArrayBuffer>;
	/** The output points of channels 0 … 3 of the last run. */
	points!: Float64Array<ArrayBuffer>[];
	private lanes!: Float64Array<ArrayBuffer>[];
	private kernels!: Kernel[];
	private readonly at: number;
	private readonly ph: number;
	private readonly out: number;
	private readonly src: number;
	private stride = 0;

	private constructor(
		private readonly module: WebAssembly.Module,
		private readonly weights: Float64Array,
	) {
		this.at = roundUp16(weights.length * 8);
		this.ph = this.at + SIMD_POINTS * 4;
		this.out = this.ph + SIMD_POINTS * 4;
		this.src = this.out + LANES * SIMD_POINTS * 8;
		this.reserve(4096);
	}

	/**
	 * A resampler with `weights` (8 per phase); undefined where WebAssembly SIMD is missing or its memory
	 * cannot be had (a WebAssembly memory reserves gigabytes of address space: under `ulimit -v` it fails).
	 */
	static create(weights: Float64Array): SimdResampler | undefined {
		const module = moduleOnce();
		if (!module) return undefined;
		try {
			return new SimdResampler(module, weights);
		} catch {
			return undefined;
		}
	}

	/**
	 * Room for `count` samples per channel; true when the views (`tapAt`, `tapPhase`, `points`) are new.
	 * More room is a new memory and instance, never a grown memory (see resample-simd-source.ts).
	 * @throws RangeError when the memory cannot be had (the caller goes on without this resampler)
	 */
	reserve(count: number): boolean {
		const stride = roundUp16(count * 8);
		if (stride <= this.stride) return false;
		this.stride = stride;
		const memory = new WebAssembly.Memory({ initial: Math.ceil((this.src + LANES * stride) / PAGE_BYTES) });
		const exports = new WebAssembly.Instance(this.module, { host: { mem: memory } }).exports;
		this.kernels = [1, 2, 3, 4].map((l) => exports[`resample${l}`] as Kernel);
		const buffer = memory.buffer;
		new Float64Array(buffer, 0, this.weights.length).set(this.weights);
		this.tapAt = new Int32Array(buffer, this.at, SIMD_POINTS);
		this.tapPhase = new Int32Array(buffer, this.ph, SIMD_POINTS);
		this.points = Array.from(
			{ length: LANES },
			(_, c) => new Float64Array(buffer, this.out + c * SIMD_POINTS * 8, SIMD_POINTS),
		);
		this.lanes = Array.from({ length: LANES }, (_, c) => new Float64Array(buffer, this.src + c * stride, stride / 8));
		return true;
	}

	/** Channel `c`'s window samples go here (from index 0: the window's first tap). */
	lane(c: number): Float64Array<ArrayBuffer> {
		return this.lanes[c];
	}

	/** Resamples channels 0 … lanes − 1 into `points`. */
	run(lanes: number): void {
		this.kernels[lanes - 1](0, this.at, this.ph, this.src, this.stride, this.out, SIMD_POINTS);
	}
}
