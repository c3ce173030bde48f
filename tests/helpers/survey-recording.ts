/**
 * A small multi-file survey recording in closed form: three consecutive files of a 3-phase 50 Hz supply
 * (L1 and L2 at 230 V RMS, L3 at 220 V RMS, 120° apart) with one dip of L1 to 60 % for 300 ms in the last
 * file. The values the survey must find follow from these numbers alone:
 * - 10-minute means: L1, L2 230 V, L3 220 V (RMS of a sine = peak/√2);
 * - negative-sequence unbalance with one phase off by δ at balanced angles: |U2|/|U1| = δ/(Ua+Ub+Uc)
 *   = 10/680 = 1.4706 % (symmetrical components, Fortescue; closed form);
 * - the dip: residual 138 V = 60 % of 230 V, 300 ms: EN 50160:2010 Table 5 cell 70 % > u ≥ 40 %, > 200 ms to 500 ms.
 * The files start on the clock at 08:00:00, 08:04:00 and 08:08:00 UTC, so the 08:00-08:10 interval is
 * complete only once the three parts are joined; the dip (08:10:50) lies after it and flags no complete interval.
 */
export const SURVEY_RATE_HZ = 1000;
export const SURVEY_FILE_S = 240;
export const SURVEY_FILES = 3;
export const SURVEY_START_ISO = '2026-05-04T08:00:00Z';
export const SURVEY_RMS_V = [230, 230, 220];
export const SURVEY_DIP = { startS: 650, durationS: 0.3, factor: 0.6, channel: 0 };
/** |U2|/|U1| in % for phases 230, 230, 220 V at balanced angles: δ / (Ua + Ub + Uc) × 100. */
export const SURVEY_UNBALANCE_PERCENT = (100 * 10) / (230 + 230 + 220);

/** Samples of file k (0-based): one Float64Array per phase. */
export function surveyFileSamples(k: number): Float64Array[] {
	const n = SURVEY_FILE_S * SURVEY_RATE_HZ;
	const t0 = k * SURVEY_FILE_S;
	return SURVEY_RMS_V.map((rms, p) => {
		const out = new Float64Array(n);
		const ph = (-2 * Math.PI * p) / 3;
		for (let i = 0; i < n; i++) {
			const t = t0 + i / SURVEY_RATE_HZ;
			const inDip = p === SURVEY_DIP.channel && t >= SURVEY_DIP.startS && t < SURVEY_DIP.startS + SURVEY_DIP.durationS;
			out[i] = (inDip ? SURVEY_DIP.factor : 1) * rms * Math.SQRT2 * Math.sin(2 * Math.PI * 50 * t + ph);
		}
		return out;
	});
}

/** Start time of file k as ISO 8601 UTC. */
export function surveyFileStart(k: number): string {
	return new Date(Date.parse(SURVEY_START_ISO) + k * SURVEY_FILE_S * 1000).toISOString();
}

/** File k as CSV text: a start-time preamble line, then time and the three phases. */
export function surveyFileCsv(k: number): string {
	const s = surveyFileSamples(k);
	const rows = [`Start time,${surveyFileStart(k)}`, 'time (s),L1 (V),L2 (V),L3 (V)'];
	for (let i = 0; i < s[0].length; i++)
		rows.push(`${(i / SURVEY_RATE_HZ).toFixed(3)},${s[0][i].toFixed(2)},${s[1][i].toFixed(2)},${s[2][i].toFixed(2)}`);
	return rows.join('\n') + '\n';
}
