/**
 * The per-file step of a survey without a detour through text: one file's TrendResult (lib/trend) as the
 * TrendDocument the merge step (`surveyInputFromTrend`) reads. The browser runs the trend analyser over
 * each picked file and hands these documents to the merge; the CLI writes the same fields as JSON.
 * A recording of several files (lib/trend's recording analyser) also gives its files and gaps.
 * Flicker rides along: each 10-minute row gets its Pst and the document its 2-hour Plt values, in the
 * order of every channel (null for a channel that is not a voltage).
 */
import type { Diagnostic } from '../capture.js';
import type { RecordingResult } from '../trend/recording-types.js';
import type { TrendResult } from '../trend/types.js';
import type { TrendDocument } from './from-trend.js';

/**
 * A 10-minute row and a Pst interval closer than this (s) are the same interval: both start at the same
 * clock tick, the row at the first whole cycle from it (a cycle or two later), the Pst at the tick itself.
 * Intervals are 600 s apart, so 1 s cannot pair two different ones.
 */
const SAME_START_S = 1;

/** Per-channel values of a flicker row spread over every channel of the file, null where none was measured. */
function perChannel(result: TrendResult, voltageNames: string[], values: number[]): (number | null)[] {
	return result.channels.map((c) => {
		const k = voltageNames.indexOf(c.name);
		return k < 0 || !Number.isFinite(values[k]) ? null : values[k];
	});
}

const orNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

/**
 * The TrendDocument of one analysed file: its 10-minute rows (with Pst), 10-s frequency values, voltage
 * events (rapid voltage changes are not survey events and are left out), Plt, and where it sits on the clock.
 * @param source  the file's name as the user knows it (shown in merge messages)
 * @example surveyInputFromTrend(files.map((f) => trendDocumentOf(f.name, analyseTrend(f.capture)))).input
 */
export function trendDocumentOf(source: string, result: TrendResult | RecordingResult): TrendDocument {
	const flicker = result.flicker;
	const names = flicker?.channels ?? [];
	const pstAt = (startS: number) => flicker?.pst.find((p) => Math.abs(p.startS - startS) < SAME_START_S);
	return {
		source,
		startTime: result.clockStartS === undefined ? null : new Date(result.clockStartS * 1000).toISOString(),
		clockStartS: result.clockStartS ?? null,
		declaredV: orNull(result.declaredV),
		nominalHz: result.nominalHz,
		durationS: result.durationS,
		channels: result.channels.map((c) => ({ name: c.name, quantity: c.quantity, unit: c.unit })),
		aggregates: result.min10.map((r) => {
			// the flickermeter's Pst of the interval, when it measured the whole 10 minutes (a row can be partial
			// only because the 10/12-cycle window at a file's end was cut: the merge may complete it)
			const pst = pstAt(r.startS);
			return {
				interval: r.interval,
				startS: r.startS,
				durationS: r.durationS,
				complete: r.complete,
				flagged: r.flagged,
				rms: r.rms.map(orNull),
				thdPercent: r.thdPercent.map(orNull),
				harmonicsPercent: r.harmonicsPercent?.map((h) => h.map(orNull)),
				unbalancePercent: r.unbalancePercent === undefined ? undefined : orNull(r.unbalancePercent),
				pst: pst ? perChannel(result, names, pst.values) : undefined,
			};
		}),
		frequency: result.frequency.map((f) => ({
			startS: f.startS,
			durationS: f.durationS,
			frequencyHz: orNull(f.frequencyHz),
			complete: f.complete,
			flagged: f.flagged,
		})),
		events: result.events
			.filter((e) => e.kind !== 'rvc')
			.map((e) => ({
				kind: e.kind,
				startS: e.startS,
				durationS: e.durationS,
				percentOfDeclared: e.percentOfDeclared,
				channels: [...e.channels],
				ended: e.ended,
			})),
		plt: flicker?.plt.map((p) => ({
			startS: p.startS,
			plt: perChannel(result, names, p.values),
			flagged: p.flagged,
		})),
		// a recording of several files read through one analyser: its files and the gaps between them
		...('parts' in result
			? {
					parts: result.parts.map((p) => ({ ...p })),
					gaps: result.gaps.map((g) => ({ ...g })),
				}
			: {}),
	};
}

/**
 * What the survey says beside its figures about a recording read through lib/trend: what each file's
 * reader detected or assumed, overlaps, events cut by a gap. Left out, because the merge
 * (`surveyInputFromTrend`) reports them from the document's `gaps` and `parts`: the gaps themselves, and
 * the files taken one after another in name order (the merge names each of them).
 */
export function recordingNotesOf(result: TrendResult | RecordingResult): Diagnostic[] {
	return result.diagnostics.filter((d) => d.code !== 'recording-gap' && d.code !== 'recording-order-by-name');
}
