import FFT from 'fft.js';

/**
 * Coarse fundamental frequency from the peak of a Hann-windowed, zero-padded spectrum: the starting
 * point that `findWholeCycles` then refines on whole cycles. Accurate to roughly 0.1 % of f on a few
 * cycles; never reported to users on its own.
 *
 * The mean is removed first, so a DC offset does not mask the fundamental. Without a nominal frequency,
 * the largest peak between `minHz` and 0.45·fs is taken, then moved down to a subharmonic f/m (m = 2…6)
 * when the spectrum holds a clear peak there of at least 10 % of the largest: a neutral current whose
 * 3rd harmonic dominates still gives its 50/60 Hz fundamental. With `nominalHz`, only 0.7…1.3 × nominal
 * is searched (wide enough for the 42.5–57.5 / 51–69 Hz ranges of IEC 61000-4-30).
 *
 * Long records: only the first 8192 samples after block-averaging to about 20 kS/s are transformed
 * (at least 0.4 s, 20 cycles of 50 Hz), which is ample for a coarse figure.
 *
 * Ref: peak-picking and Hann windowing, Harris 1978, Proc. IEEE 66(1) 51–83, doi:10.1109/PROC.1978.10837;
 * parabolic interpolation of the log-magnitude peak is standard practice (from memory).
 *
 * @param samples  signal, any unit
 * @param sampleRateHz  samples per second
 * @param opts.nominalHz  nominal system frequency, narrows the search
 * @param opts.minHz  lowest frequency searched (default: the one giving 1.8 cycles in the record)
 * @returns frequency in Hz, never outside the range searched (NaN when the peak lies beyond its edge), or NaN when the record is too short to search (under 8 samples)
 * @example coarseFrequencyHz(sine 50 Hz at 10 kS/s, 10 000) // ≈ 50.0
 */
export function coarseFrequencyHz(
	samples: Float64Array,
	sampleRateHz: number,
	opts: { nominalHz?: number; minHz?: number } = {},
): number {
	const n = samples.length;
	if (n < 8) return NaN;
	// Block-average long, fast records down to about 20 kS/s (a sinc low-pass, harmless below ~2 kHz).
	const block = Math.max(1, Math.floor(sampleRateHz / 20_000));
	const rate = sampleRateHz / block;
	const m = Math.min(Math.floor(n / block), SEGMENT_SAMPLES);
	if (m < 8) return NaN;
	const seg = new Float64Array(m);
	let mean = 0;
	for (let i = 0; i < m; i++) {
		let s = 0;
		for (let j = 0; j < block; j++) s += samples[i * block + j];
		seg[i] = s / block;
		mean += seg[i];
	}
	mean /= m;
	for (let i = 0; i < m; i++) seg[i] = (seg[i] - mean) * (0.5 - 0.5 * Math.cos((2 * Math.PI * (i + 0.5)) / m));

	let size = 1;
	while (size < 4 * m) size *= 2;
	const padded = new Float64Array(size);
	padded.set(seg);
	let fft = transforms.get(size);
	if (!fft) transforms.set(size, (fft = new FFT(size)));
	const out = fft.createComplexArray();
	fft.realTransform(out, padded);
	const half = size / 2;
	const mag = new Float64Array(half + 1);
	for (let k = 0; k <= half; k++) mag[k] = Math.hypot(out[2 * k], out[2 * k + 1]);
	const binHz = rate / size;

	const lowestHz = opts.minHz ?? (1.8 * rate) / m;
	let loHz = lowestHz;
	let hiHz = 0.45 * rate;
	if (opts.nominalHz !== undefined) {
		loHz = Math.max(loHz, 0.7 * opts.nominalHz);
		hiHz = Math.min(hiHz, 1.3 * opts.nominalHz);
	}
	const loBin = Math.max(1, Math.ceil(loHz / binHz));
	const hiBin = Math.min(half - 1, Math.floor(hiHz / binHz));
	const peak = peakBin(mag, loBin, hiBin);
	if (peak < 0) return NaN;
	// a 'peak' on an edge of the range with the spectrum still rising beyond it is no peak: the fundamental lies outside
	if ((peak === loBin && mag[peak - 1] > mag[peak]) || (peak === hiBin && mag[peak + 1] > mag[peak])) return NaN;
	let best = peak;
	if (opts.nominalHz === undefined) {
		for (let div = 6; div >= 2; div--) {
			const centre = peak / div;
			if (centre * binHz < lowestHz) continue;
			const width = Math.max(2, Math.round(size / m)); // about one unpadded bin either side
			const k = peakBin(mag, Math.max(1, Math.floor(centre - width)), Math.min(half - 1, Math.ceil(centre + width)));
			if (k > 0 && mag[k] >= 0.1 * mag[peak] && mag[k] >= mag[k - 1] && mag[k] >= mag[k + 1]) {
				best = k;
				break;
			}
		}
	}
	// never report outside the range searched: a peak interpolated beyond its edge lies outside it
	const hz = interpolatedPeak(mag, best) * binHz;
	return hz >= loHz && hz <= hiHz ? hz : NaN;
}

/** Samples transformed at most: 8192 at ≥ 20 kS/s is ≥ 0.4 s, 20 cycles of 50 Hz, ample for a coarse peak. */
const SEGMENT_SAMPLES = 8192;
/** fft.js builds its twiddle tables in the constructor; reuse them (at most a few sizes ever occur). */
const transforms = new Map<number, FFT>();

function peakBin(mag: Float64Array, lo: number, hi: number): number {
	let best = -1;
	for (let k = lo; k <= hi; k++) if (best < 0 || mag[k] > mag[best]) best = k;
	return best;
}

function interpolatedPeak(mag: Float64Array, k: number): number {
	if (k <= 0 || k >= mag.length - 1) return k;
	const a = Math.log(mag[k - 1] + 1e-300);
	const b = Math.log(mag[k] + 1e-300);
	const c = Math.log(mag[k + 1] + 1e-300);
	const den = a - 2 * b + c;
	return den < 0 ? k + (0.5 * (a - c)) / den : k;
}
