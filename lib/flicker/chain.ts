/**
 * The kernel of blocks 1-4 (adaptor, squaring demodulator, band filters, weighting, squaring, smoothing)
 * over one stretch of the block squares (lib/flicker/block-squares.ts: mean squares at the chain rate),
 * with the Pinst classification of block 5 folded in. One loop over local variables.
 */
import type { FlickerDesign } from './design.js';
import { PINST_CLASS_SHIFT, PINST_CLASS_VIEWS } from './classifier.js';

/**
 * Largest normalised square the demodulator passes: (v/Vrms)² above 10⁴ (a voltage 100 times its running
 * RMS) only arises when the running RMS is near zero (a record starting dead), and is clipped there so
 * the filters stay finite.
 */
export const MAX_NORMALISED_SQUARE = 1e4;

/** Filter states, indices into FlickerChain.state. */
const ADAPTOR = 0,
	HP = 1,
	LP = 2,
	W = 8,
	SMOOTH = 12,
	LAST_U = 13,
	STATE_LENGTH = 14;

/**
 * Every coefficient of blocks 1-4 in one array, in the order the kernels read them: adaptor α; high-pass
 * b0, b1, a1; the three low-pass and two weighting sections as b0, b1, b2, a1, a2 (from index 4, 5 per
 * section); smoothing α (29); Pinst scale (30).
 */
export function chainCoefficients(d: FlickerDesign): Float64Array {
	const sections = [...d.lowPass, ...d.weighting].flatMap((q) => [q.b0, q.b1, q.b2, q.a1, q.a2]);
	return Float64Array.from([
		d.adaptorAlpha,
		d.highPass.b0,
		d.highPass.b1,
		d.highPass.a1,
		...sections,
		d.smoothingAlpha,
		d.scale,
	]);
}

/** Running statistics of one stretch: written by `run`. Make them with `chainStretch`. */
export interface ChainStretch {
	max: number;
	sum: number;
}

/**
 * A zeroed ChainStretch whose fields hold doubles from the start. Objects that start with small-integer
 * fields change their hidden class when a double is first stored: the chain's optimised `run` then
 * meets a class it was not made for and falls back to slower code for the rest of the process (seen as
 * a 2-3x slower flickermeter in some runs).
 */
export function chainStretch(): ChainStretch {
	const s = { max: 0.5, sum: 0.5 };
	s.max = 0;
	s.sum = 0;
	return s;
}

export class FlickerChain {
	readonly state = new Float64Array(STATE_LENGTH);
	private readonly c: Float64Array;

	constructor(
		readonly design: FlickerDesign,
		initialMeanSquare: number,
	) {
		const d = design;
		this.c = chainCoefficients(d);
		// Start in the steady state of an unmodulated supply: running mean square known, demodulator
		// output 1 already blocked by the high-pass (its state holds −b0), every later filter at rest.
		this.state[ADAPTOR] = initialMeanSquare;
		this.state[HP] = d.highPass.b1;
		this.state[LAST_U] = 1;
	}

	/**
	 * Runs the mean squares [from, to) of `sq` (finite, ≥ 0) through the chain, adds each Pinst to `counts`
	 * and returns the stretch's max and sum of Pinst in `out`.
	 */
	run(sq: Float64Array, from: number, to: number, counts: Uint32Array, out: ChainStretch): void {
		const c = this.c,
			s = this.state;
		// Coefficients and states into locals, one row per filter section (the order of the constructor):
		// the loop below then touches no array but its input and the Pinst classes.
		// prettier-ignore
		const aA = c[0], hb0 = c[1], hb1 = c[2], ha1 = c[3],
			p0 = c[4], p1 = c[5], p2 = c[6], p3 = c[7], p4 = c[8],
			q0 = c[9], q1 = c[10], q2 = c[11], q3 = c[12], q4 = c[13],
			r0 = c[14], r1 = c[15], r2 = c[16], r3 = c[17], r4 = c[18],
			u0 = c[19], u1 = c[20], u2 = c[21], u3 = c[22], u4 = c[23],
			v0 = c[24], v1 = c[25], v2 = c[26], v3 = c[27], v4 = c[28],
			aS = c[29], scale = c[30];
		// prettier-ignore
		let ms = s[ADAPTOR], h1 = s[HP],
			pa = s[LP], pb = s[LP + 1], qa = s[LP + 2], qb = s[LP + 3], ra = s[LP + 4], rb = s[LP + 5],
			ua = s[W], ub = s[W + 1], va = s[W + 2], vb = s[W + 3],
			sm = s[SMOOTH], u = s[LAST_U];
		let max = out.max,
			sum = out.sum;
		// Pinst classified inline (classifier.ts pinstClass): no call per value
		const { f32, u32 } = PINST_CLASS_VIEWS;
		for (let i = from; i < to; i++) {
			const m = sq[i];
			ms += aA * (m - ms);
			u = m < MAX_NORMALISED_SQUARE * ms ? m / ms : m > 0 ? MAX_NORMALISED_SQUARE : 0;
			const y = hb0 * u + h1;
			h1 = hb1 * u - ha1 * y;
			const yp = p0 * y + pa;
			pa = p1 * y - p3 * yp + pb;
			pb = p2 * y - p4 * yp;
			const yq = q0 * yp + qa;
			qa = q1 * yp - q3 * yq + qb;
			qb = q2 * yp - q4 * yq;
			const yr = r0 * yq + ra;
			ra = r1 * yq - r3 * yr + rb;
			rb = r2 * yq - r4 * yr;
			const yu = u0 * yr + ua;
			ua = u1 * yr - u3 * yu + ub;
			ub = u2 * yr - u4 * yu;
			const yv = v0 * yu + va;
			va = v1 * yu - v3 * yv + vb;
			vb = v2 * yu - v4 * yv;
			sm += aS * (yv * yv - sm);
			const pinst = scale * sm;
			f32[0] = pinst;
			counts[u32[0] >>> PINST_CLASS_SHIFT]++;
			if (pinst > max) max = pinst;
			sum += pinst;
		}
		this.store(ms, h1, pa, pb, qa, qb, ra, rb, ua, ub, va, vb, sm, u);
		out.max = max;
		out.sum = sum;
	}

	/** Keeps the filter states for the next stretch (the order of the locals in `run`). */
	private store(...states: number[]): void {
		this.state.set(states);
	}
}
