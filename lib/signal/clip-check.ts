/**
 * Is a flat run at a record's extreme a clipped peak, or just a slow crest sitting on one code? Internal
 * to lib/signal (the clipping warning).
 */

/**
 * A flat run [first, last] at `level` (the record's highest value when `side` = 1, lowest when −1) is a
 * clipped peak when the wave on both sides, continued smoothly, would have gone past the level: a
 * parabola x = a + b·t + c·t² fitted by least squares to `flank` samples either side of the run
 * (flank = the run's length, at least 8) peaks beyond the level by more than 2 code steps plus three
 * times the fit's residual RMS. A slow crest (an 8-bit wave at 1 MS/s stays on its top code for hundreds
 * of samples) bends over smoothly: its parabola peaks within a code step of the run. A clipped wave meets
 * the run with a slope break: the parabola through its steep flanks peaks well above.
 *
 * Runs that touch either end of the record cannot be judged (one flank only): false.
 * Ref: clipping as a slope discontinuity at a flat top (common practice); least-squares parabola (closed form).
 * @param codeStep  the channel's code step (0 when unknown)
 */
export function runShowsSlopeBreak(
	samples: Float64Array,
	first: number,
	last: number,
	side: 1 | -1,
	level: number,
	codeStep: number,
): boolean {
	const run = last - first + 1;
	const flank = Math.max(8, run);
	if (first - flank < 0 || last + flank >= samples.length) return false;
	const centre = (first + last) / 2;
	const scale = (run + 2 * flank) / 2;
	// normal equations of a + b·u + c·u², u = (i − centre)/scale, over both flanks
	let s0 = 0,
		s1 = 0,
		s2 = 0,
		s3 = 0,
		s4 = 0,
		y0 = 0,
		y1 = 0,
		y2 = 0,
		yy = 0;
	const add = (i: number) => {
		const u = (i - centre) / scale;
		const y = side * (samples[i] - level);
		const u2 = u * u;
		s0 += 1;
		s1 += u;
		s2 += u2;
		s3 += u2 * u;
		s4 += u2 * u2;
		y0 += y;
		y1 += y * u;
		y2 += y * u2;
		yy += y * y;
	};
	for (let i = first - flank; i < first; i++) add(i);
	for (let i = last + 1; i <= last + flank; i++) add(i);
	const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
	if (!(Math.abs(det) > 0)) return false;
	const a = (y0 * (s2 * s4 - s3 * s3) - s1 * (y1 * s4 - s3 * y2) + s2 * (y1 * s3 - s2 * y2)) / det;
	const b = (s0 * (y1 * s4 - y2 * s3) - y0 * (s1 * s4 - s3 * s2) + s2 * (s1 * y2 - y1 * s2)) / det;
	const c = (s0 * (s2 * y2 - s3 * y1) - s1 * (s1 * y2 - s3 * y0) + y0 * (s1 * s3 - s2 * s2)) / det;
	const rss = Math.max(0, yy - a * y0 - b * y1 - c * y2);
	const residualRms = Math.sqrt(rss / s0);
	// flanks that do not bend back (c ≥ 0) meet the flat run at a corner: a break
	const overshoot = c < 0 ? a - (b * b) / (4 * c) : Infinity;
	return overshoot > 2 * codeStep + 3 * residualRms;
}
