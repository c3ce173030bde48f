/**
 * Test signal synthesis: closed-form waveforms sampled exactly, so expected values come from formulas,
 * never from the code under test. Every amplitude is a peak value unless the name says rms.
 */

export interface SineSpec {
	/** Peak amplitude (same unit as the samples produced). */
	amplitude: number;
	frequencyHz: number;
	sampleRateHz: number;
	/** Length in fundamental cycles (may be fractional); or give `samples`. */
	cycles?: number;
	samples?: number;
	/** Phase at t = 0 in degrees, sine reference: x = A sin(2 pi f t + phaseDeg). */
	phaseDeg?: number;
	/** DC offset added. */
	offset?: number;
}

function count(spec: { cycles?: number; samples?: number; frequencyHz: number; sampleRateHz: number }): number {
	if (spec.samples !== undefined) return spec.samples;
	if (spec.cycles === undefined) throw new RangeError('give cycles or samples');
	return Math.round((spec.cycles * spec.sampleRateHz) / spec.frequencyHz);
}

/** x[n] = offset + A sin(2 pi f n/fs + phase) */
export function sineSamples(spec: SineSpec): Float64Array {
	const n = count(spec);
	const out = new Float64Array(n);
	const w = (2 * Math.PI * spec.frequencyHz) / spec.sampleRateHz;
	const ph = ((spec.phaseDeg ?? 0) * Math.PI) / 180;
	for (let i = 0; i < n; i++) out[i] = (spec.offset ?? 0) + spec.amplitude * Math.sin(w * i + ph);
	return out;
}

/** One tone of a harmonic mixture: order h of the fundamental, RMS value, phase (deg, sine reference). */
export interface Tone {
	order: number;
	rms: number;
	phaseDeg?: number;
}

/** Sum of harmonics: x[n] = Σ √2·rms_h·sin(h·2π f n/fs + phase_h). */
export function harmonicSamples(
	tones: Tone[],
	opts: { frequencyHz: number; sampleRateHz: number; cycles?: number; samples?: number; offset?: number },
): Float64Array {
	const n = count(opts);
	const out = new Float64Array(n).fill(opts.offset ?? 0);
	const w = (2 * Math.PI * opts.frequencyHz) / opts.sampleRateHz;
	for (const t of tones) {
		const a = Math.SQRT2 * t.rms;
		const ph = ((t.phaseDeg ?? 0) * Math.PI) / 180;
		for (let i = 0; i < n; i++) out[i] += a * Math.sin(t.order * w * i + ph);
	}
	return out;
}

export type Shape = 'square' | 'triangle' | 'sawtooth' | 'half-wave' | 'full-wave';

/**
 * Ideal periodic shapes of peak `amplitude`, sampled at n/fs. Phase 0 = the rising zero crossing of the
 * fundamental (for the rectified shapes: the start of a positive half-cycle).
 */
export function shapeSamples(
	shape: Shape,
	opts: { amplitude: number; frequencyHz: number; sampleRateHz: number; cycles?: number; samples?: number },
): Float64Array {
	const n = count(opts);
	const out = new Float64Array(n);
	const a = opts.amplitude;
	for (let i = 0; i < n; i++) {
		const u = ((((i * opts.frequencyHz) / opts.sampleRateHz) % 1) + 1) % 1; // position in the cycle, 0..1
		switch (shape) {
			case 'square':
				out[i] = u < 0.5 ? a : -a;
				break;
			case 'triangle':
				// rises 0 -> A over the first quarter, falls to -A at 3/4, back to 0
				out[i] = u < 0.25 ? 4 * a * u : u < 0.75 ? a * (2 - 4 * u) : a * (4 * u - 4);
				break;
			case 'sawtooth':
				// rises from 0 to A, jumps to -A at half cycle, rises to 0: a sawtooth with a rising zero at u = 0
				out[i] = u < 0.5 ? 2 * a * u : 2 * a * u - 2 * a;
				break;
			case 'half-wave':
				out[i] = Math.max(0, a * Math.sin(2 * Math.PI * u));
				break;
			case 'full-wave':
				out[i] = Math.abs(a * Math.sin(2 * Math.PI * u));
				break;
		}
	}
	return out;
}

/** Deterministic Gaussian noise (mulberry32 + Box-Muller), so failures reproduce. */
export function gaussianNoise(n: number, sigma: number, seed = 1): Float64Array {
	let s = seed >>> 0;
	const rand = () => {
		s = (s + 0x6d2b79f5) >>> 0;
		let t = s;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const u1 = Math.max(rand(), 1e-300);
		const u2 = rand();
		out[i] = sigma * Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
	}
	return out;
}

/** Element-wise sum of equal-length arrays (new array). */
export function addSignals(...xs: Float64Array[]): Float64Array {
	const out = new Float64Array(xs[0].length);
	for (const x of xs) for (let i = 0; i < out.length; i++) out[i] += x[i];
	return out;
}
