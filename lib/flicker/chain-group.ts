/**
 * Blocks 1-5 of three channels at once (three voltages of one recording): the same arithmetic, in the same
 * order, as FlickerChain (chain.ts) per channel, so every Pinst is bit-identical to one chain per channel,
 * only scheduled differently.
 *
 * Why: one chain runs ~60 floating-point operations per value in one long dependent line (adaptor,
 * division, six sections, smoothing, class count); the processor cannot look far enough ahead to overlap
 * consecutive values, so it waits on latencies. Here a stretch is cut into sub-blocks of SUB values and
 * run section by section (a pass holds one or two sections) with the three channels side by side in each
 * pass: every pass is a short loop with three independent recurrences in flight. The values between
 * passes go through two small buffers, the channels interleaved (value k of channel j at 3k + j).
 */
import { FlickerChain, MAX_NORMALISED_SQUARE, chainCoefficients, type ChainStretch } from './chain.js';
import { PINST_CLASS_SHIFT, PINST_CLASS_VIEWS } from './classifier.js';
import type { FlickerDesign } from './design.js';

/** Chain values per pass: three channels' interleaved values fit 12 KB, within the first-level cache. */
const SUB = 512;

/** Per-channel state block in `FlickerTriple.state` (channel j from LANE · j). */
const LANE = 16;

/** Offsets in a channel's block: running mean square, high-pass, five sections (2 each), smoothing. */
const ADAPTOR = 0,
	HP = 1,
	SECTIONS = 2,
	SMOOTH = 12;

/** Index of the first section's b0 in the coefficients (chainCoefficients); 5 per section. */
const SECTION_COEFFICIENTS = 4;

/**
 * The chains of a group of channels sharing one design: each three together (FlickerTriple), the one or
 * two left over by FlickerChain, so every channel's Pinst is the one a chain of its own gives.
 */
export class ChainGroup {
	private readonly triples: { chains: FlickerTriple; lanes: number[] }[] = [];
	private readonly singles: { chain: FlickerChain; lane: number }[] = [];

	/** One chain per channel, starting at the steady state of `initialMeanSquares[k]`. */
	constructor(design: FlickerDesign, initialMeanSquares: readonly number[]) {
		const n = initialMeanSquares.length;
		let k = 0;
		for (; k + 3 <= n; k += 3) {
			const [a, b, c] = initialMeanSquares.slice(k, k + 3);
			this.triples.push({ chains: new FlickerTriple(design, [a, b, c]), lanes: [k, k + 1, k + 2] });
		}
		for (; k < n; k++) this.singles.push({ chain: new FlickerChain(design, initialMeanSquares[k]), lane: k });
	}

	/** Values [from, to) of each channel's mean squares `sq[k]` through its chain (FlickerChain.run's contract). */
	run(
		sq: readonly Float64Array[],
		from: number,
		to: number,
		counts: readonly Uint32Array[],
		out: readonly ChainStretch[],
	): void {
		for (const t of this.triples) {
			const [a, b, c] = t.lanes;
			t.chains.run([sq[a], sq[b], sq[c]], from, to, [counts[a], counts[b], counts[c]], [out[a], out[b], out[c]]);
		}
		for (const s of this.singles) s.chain.run(sq[s.lane], from, to, counts[s.lane], out[s.lane]);
	}
}

/** Three flicker chains run together; each channel's values are bit-identical to FlickerChain's. */
export class FlickerTriple {
	/** Filter states, LANE values per channel. */
	readonly state = new Float64Array(3 * LANE);
	private readonly c: Float64Array;
	private readonly a = new Float64Array(3 * SUB);
	private readonly b = new Float64Array(3 * SUB);

	/** `initialMeanSquares`: the steady mean square each channel starts at (as FlickerChain's). */
	constructor(design: FlickerDesign, initialMeanSquares: readonly [number, number, number]) {
		this.c = chainCoefficients(design);
		for (let j = 0; j < 3; j++) {
			this.state[LANE * j + ADAPTOR] = initialMeanSquares[j];
			this.state[LANE * j + HP] = design.highPass.b1;
		}
	}

	/**
	 * Runs values [from, to) of the three channels' mean squares through the chains; Pinst classes to each
	 * channel's `counts`, each stretch's max and sum to `out[j]` (added to what they hold, as FlickerChain).
	 */
	run(
		sq: readonly Float64Array[],
		from: number,
		to: number,
		counts: readonly Uint32Array[],
		out: readonly ChainStretch[],
	): void {
		const c = this.c,
			s = this.state;
		const stats = Float64Array.of(out[0].max, out[0].sum, out[1].max, out[1].sum, out[2].max, out[2].sum);
		for (let i = from; i < to; i += SUB) {
			const n = Math.min(SUB, to - i),
				n3 = 3 * n;
			demodulate(c, s, sq[0], sq[1], sq[2], i, n, this.a);
			sectionPair(c, SECTION_COEFFICIENTS, s, SECTIONS, n3, this.a, this.b);
			sectionPair(c, SECTION_COEFFICIENTS + 10, s, SECTIONS + 4, n3, this.b, this.a);
			weightSmoothCount(c, s, n3, this.a, counts[0], counts[1], counts[2], stats);
		}
		for (let j = 0; j < 3; j++) {
			out[j].max = stats[2 * j];
			out[j].sum = stats[2 * j + 1];
		}
	}
}

/** Blocks 1-2 and the high-pass: values [from, from + n) of x0, x1, x2 to y (interleaved from 0). */
function demodulate(
	c: Float64Array,
	s: Float64Array,
	x0: Float64Array,
	x1: Float64Array,
	x2: Float64Array,
	from: number,
	n: number,
	y: Float64Array,
): void {
	const aA = c[0],
		hb0 = c[1],
		hb1 = c[2],
		ha1 = c[3],
		top = MAX_NORMALISED_SQUARE;
	// prettier-ignore
	let m0 = s[ADAPTOR], h0 = s[HP], m1 = s[LANE + ADAPTOR], h1 = s[LANE + HP],
		m2 = s[2 * LANE + ADAPTOR], h2 = s[2 * LANE + HP];
	for (let k = 0, j = 0; k < n; k++, j += 3) {
		const v0 = x0[from + k];
		m0 += aA * (v0 - m0);
		const u0 = v0 < top * m0 ? v0 / m0 : v0 > 0 ? top : 0;
		const z0 = hb0 * u0 + h0;
		h0 = hb1 * u0 - ha1 * z0;
		y[j] = z0;
		const v1 = x1[from + k];
		m1 += aA * (v1 - m1);
		const u1 = v1 < top * m1 ? v1 / m1 : v1 > 0 ? top : 0;
		const z1 = hb0 * u1 + h1;
		h1 = hb1 * u1 - ha1 * z1;
		y[j + 1] = z1;
		const v2 = x2[from + k];
		m2 += aA * (v2 - m2);
		const u2 = v2 < top * m2 ? v2 / m2 : v2 > 0 ? top : 0;
		const z2 = hb0 * u2 + h2;
		h2 = hb1 * u2 - ha1 * z2;
		y[j + 2] = z2;
	}
	s[ADAPTOR] = m0;
	s[HP] = h0;
	s[LANE + ADAPTOR] = m1;
	s[LANE + HP] = h1;
	s[2 * LANE + ADAPTOR] = m2;
	s[2 * LANE + HP] = h2;
}

/**
 * Two sections in series (direct form II transposed, as FlickerChain): coefficients from c[o] (5 each),
 * states from s[so] in each channel's block (2 each); n3 interleaved values of x to y.
 */
function sectionPair(
	c: Float64Array,
	o: number,
	s: Float64Array,
	so: number,
	n3: number,
	x: Float64Array,
	y: Float64Array,
): void {
	// prettier-ignore
	const p0 = c[o], p1 = c[o + 1], p2 = c[o + 2], p3 = c[o + 3], p4 = c[o + 4],
		q0 = c[o + 5], q1 = c[o + 6], q2 = c[o + 7], q3 = c[o + 8], q4 = c[o + 9];
	const i0 = so,
		i1 = so + LANE,
		i2 = so + 2 * LANE;
	// prettier-ignore
	let a0 = s[i0], b0 = s[i0 + 1], e0 = s[i0 + 2], f0 = s[i0 + 3],
		a1 = s[i1], b1 = s[i1 + 1], e1 = s[i1 + 2], f1 = s[i1 + 3],
		a2 = s[i2], b2 = s[i2 + 1], e2 = s[i2 + 2], f2 = s[i2 + 3];
	for (let j = 0; j < n3; j += 3) {
		const v0 = x[j],
			v1 = x[j + 1],
			v2 = x[j + 2];
		const w0 = p0 * v0 + a0;
		a0 = p1 * v0 - p3 * w0 + b0;
		b0 = p2 * v0 - p4 * w0;
		const w1 = p0 * v1 + a1;
		a1 = p1 * v1 - p3 * w1 + b1;
		b1 = p2 * v1 - p4 * w1;
		const w2 = p0 * v2 + a2;
		a2 = p1 * v2 - p3 * w2 + b2;
		b2 = p2 * v2 - p4 * w2;
		const z0 = q0 * w0 + e0;
		e0 = q1 * w0 - q3 * z0 + f0;
		f0 = q2 * w0 - q4 * z0;
		y[j] = z0;
		const z1 = q0 * w1 + e1;
		e1 = q1 * w1 - q3 * z1 + f1;
		f1 = q2 * w1 - q4 * z1;
		y[j + 1] = z1;
		const z2 = q0 * w2 + e2;
		e2 = q1 * w2 - q3 * z2 + f2;
		f2 = q2 * w2 - q4 * z2;
		y[j + 2] = z2;
	}
	s.set([a0, b0, e0, f0], i0);
	s.set([a1, b1, e1, f1], i1);
	s.set([a2, b2, e2, f2], i2);
}

/**
 * The last weighting section, squaring, smoothing and block 5's class count; running max and sum per
 * channel in stats (max0, sum0, max1, ...).
 */
function weightSmoothCount(
	c: Float64Array,
	s: Float64Array,
	n3: number,
	x: Float64Array,
	k0: Uint32Array,
	k1: Uint32Array,
	k2: Uint32Array,
	stats: Float64Array,
): void {
	const o = SECTION_COEFFICIENTS + 20,
		so = SECTIONS + 8;
	// prettier-ignore
	const v0 = c[o], v1 = c[o + 1], v2 = c[o + 2], v3 = c[o + 3], v4 = c[o + 4], aS = c[29], scale = c[30];
	// Pinst classified inline (classifier.ts pinstClass): no call per value
	const { f32: f, u32: w } = PINST_CLASS_VIEWS,
		shift = PINST_CLASS_SHIFT;
	// prettier-ignore
	let a0 = s[so], b0 = s[so + 1], m0 = s[SMOOTH], a1 = s[LANE + so], b1 = s[LANE + so + 1], m1 = s[LANE + SMOOTH],
		a2 = s[2 * LANE + so], b2 = s[2 * LANE + so + 1], m2 = s[2 * LANE + SMOOTH];
	// prettier-ignore
	let max0 = stats[0], sum0 = stats[1], max1 = stats[2], sum1 = stats[3], max2 = stats[4], sum2 = stats[5];
	for (let j = 0; j < n3; j += 3) {
		const x0 = x[j];
		const y0 = v0 * x0 + a0;
		a0 = v1 * x0 - v3 * y0 + b0;
		b0 = v2 * x0 - v4 * y0;
		m0 += aS * (y0 * y0 - m0);
		const p0 = scale * m0;
		f[0] = p0;
		k0[w[0] >>> shift]++;
		if (p0 > max0) max0 = p0;
		sum0 += p0;
		const x1 = x[j + 1];
		const y1 = v0 * x1 + a1;
		a1 = v1 * x1 - v3 * y1 + b1;
		b1 = v2 * x1 - v4 * y1;
		m1 += aS * (y1 * y1 - m1);
		const p1 = scale * m1;
		f[0] = p1;
		k1[w[0] >>> shift]++;
		if (p1 > max1) max1 = p1;
		sum1 += p1;
		const x2 = x[j + 2];
		const y2 = v0 * x2 + a2;
		a2 = v1 * x2 - v3 * y2 + b2;
		b2 = v2 * x2 - v4 * y2;
		m2 += aS * (y2 * y2 - m2);
		const p2 = scale * m2;
		f[0] = p2;
		k2[w[0] >>> shift]++;
		if (p2 > max2) max2 = p2;
		sum2 += p2;
	}
	s.set([a0, b0], so);
	s.set([a1, b1], LANE + so);
	s.set([a2, b2], 2 * LANE + so);
	s[SMOOTH] = m0;
	s[LANE + SMOOTH] = m1;
	s[2 * LANE + SMOOTH] = m2;
	stats.set([max0, sum0, max1, sum1, max2, sum2]);
}
