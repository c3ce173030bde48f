/**
 * The analysis report as a plain JSON value: the contract `report.schema.json` documents.
 */
import type { AnalysisReport } from './types.js';

/** The JSON form of a report type: every number may be null (NaN in memory), the rest as it is. */
export type Jsonified<T> = T extends number
	? number | null
	: T extends string | boolean | null
		? T
		: T extends readonly (infer U)[]
			? Jsonified<U>[]
			: T extends object
				? { [K in keyof T]: Jsonified<T[K]> }
				: T;

/** The analysis report as JSON (the contract of report.schema.json). */
export type ReportJson = Jsonified<AnalysisReport>;

/** A JSON value: what `JSON.parse` can give back. */
export type ReportJsonValue = null | boolean | number | string | ReportJsonValue[] | { [key: string]: ReportJsonValue };

/**
 * Plain-object copy of an analysis report for JSON: every non-finite number (NaN, ±Infinity) becomes
 * `null`, typed arrays become arrays, `undefined` fields are dropped; a harmonic below the channel's
 * resolution carries null instead of figures, and its upper bound. The input is not mutated.
 *
 * Why null: JSON has no NaN; `null` is what `JSON.stringify` writes for it anyway, and the schema
 * declares each figure as `number | null` so a reader knows "the data could not give this".
 *
 * @example reportToJson(analyseCapture(capture)).channels[0].rms // 230.43 (V), or null
 */
export function reportToJson(report: AnalysisReport): ReportJson {
	const json = reportValueToJson(report) as unknown as ReportJson;
	for (const c of json.channels) c.harmonics = c.harmonics.map(unmeasuredBelowResolution);
	return json;
}

/**
 * A harmonic under the channel's rounding floor is not a measurement: its RMS, percentage and phase become
 * null and `rmsUpperBound` / `percentOfFundamentalUpperBound` (the floor) say how large it can be at most.
 */
function unmeasuredBelowResolution(h: ReportJson['channels'][number]['harmonics'][number]) {
	return h.belowResolution === true ? { ...h, rms: null, percentOfFundamental: null, phaseDeg: null } : h;
}

/** Recursive worker of `reportToJson`, exported for the other plain objects a front end serialises. */
export function reportValueToJson(value: unknown): ReportJsonValue {
	if (value === null || value === undefined) return null;
	if (typeof value === 'number') return Number.isFinite(value) ? value : null;
	if (typeof value === 'string' || typeof value === 'boolean') return value;
	if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
		return Array.from(value as unknown as ArrayLike<number>, (x) => (Number.isFinite(x) ? x : null));
	}
	if (Array.isArray(value)) return value.map(reportValueToJson);
	if (typeof value === 'object') {
		const out: { [key: string]: ReportJsonValue } = {};
		for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
			if (v === undefined || typeof v === 'function') continue;
			out[k] = reportValueToJson(v);
		}
		return out;
	}
	return null;
}
