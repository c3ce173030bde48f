/**
 * Which files make one recording, and in what order, decided from what each file says about itself before
 * its samples (its start time, sample rate, channels and, where the file states it, its length). The CLI
 * and the browser both call these, so the same files give the same recording in both.
 *
 * - `orderRecordingParts`: the order of the files of ONE recording. Every file states its start time: by
 *   start time, placed on the clock. None does: by name (numbers in names in numeric order: h2 before
 *   h10), one right after another, and that assumption is reported. Some do and some do not: the ones
 *   that do are placed on the clock and the others are refused (they cannot be placed on it), each named.
 * - `planRecording`: whether files given together (a folder) fit one recording: the same sample rate and
 *   channels, every start time stated, and each file starting where the one before ends, give or take
 *   the recorder's clock, or after a gap no longer than the longer of the two files (a logger that missed
 *   an hour of a week of hourly files still wrote one recording; relay records of separate faults, each
 *   a second long and hours apart, are not one).
 */
import type { Diagnostic } from '../capture.js';
import { fileList } from './file-list.js';
import type { TrendChannelSpec } from './types.js';

/** What a file of a recording says about itself before its samples. */
export interface RecordingPartInfo {
	source: string;
	/** Clock time of its first sample, s since 1970, when the file states it. */
	clockStartS?: number;
	sampleRateHz?: number;
	channels?: readonly TrendChannelSpec[];
	/** Its length in s, when known before reading it (exact or estimated: see `durationExact`). */
	durationS?: number;
	/** The length is exact (a COMTRADE sample count, a WAV data size), not estimated from the file size. */
	durationExact?: boolean;
}

const collator = new Intl.Collator('en', { numeric: true });

/** File names in the order a person reads them: numbers in numeric order (h2 before h10). */
export function byName(a: string, b: string): number {
	return collator.compare(a, b);
}

export interface RecordingOrder<T extends RecordingPartInfo> {
	ordered: T[];
	/** 'clock': placed at their start times; 'sequence': one after another (no file states a start time). */
	placement: 'clock' | 'sequence';
	/** Files that cannot be placed: they state no start time while the others do. */
	refused: { part: T; expected: string }[];
	notes: Diagnostic[];
}

/**
 * The files of one recording in order; see the module comment.
 * @example orderRecordingParts([{ source: 'h09.csv', clockStartS: 3600 }, { source: 'h08.csv', clockStartS: 0 }]).ordered
 *   // h08.csv, h09.csv ('clock')
 */
export function orderRecordingParts<T extends RecordingPartInfo>(parts: readonly T[]): RecordingOrder<T> {
	const stated = parts.filter((p) => p.clockStartS !== undefined);
	const unstated = parts.filter((p) => p.clockStartS === undefined);
	if (stated.length === 0) {
		const ordered = [...parts].sort((a, b) => byName(a.source, b.source));
		const notes: Diagnostic[] =
			parts.length > 1
				? [
						{
							code: 'recording-order-by-name',
							severity: 'assumption',
							message: `None of the ${parts.length} files states its start time: ${fileList(ordered.map((p) => p.source))}. They are taken as one recording without gaps, one right after another in the order of their names.`,
						},
					]
				: [];
		return { ordered, placement: 'sequence', refused: [], notes };
	}
	const ordered = [...stated].sort((a, b) => a.clockStartS! - b.clockStartS! || byName(a.source, b.source));
	const refused = unstated.map((part) => ({
		part,
		expected: `a start time, as the other files of this recording state (${ordered[0].source} starts at ${new Date(
			ordered[0].clockStartS! * 1000,
		)
			.toISOString()
			.replace('T', ' ')
			.replace(/\.\d+Z$/, '')}): a file without one cannot be placed on the recording's clock, so it is left out`,
	}));
	return { ordered, placement: 'clock', refused, notes: [] };
}

/** The stated lengths of two files may be off by this share when estimated from the file size (CSV). */
const ESTIMATE_TOLERANCE = 0.05;
/** Two files are consecutive when the clock says so within this, at least (recorder clocks stamp to the second or better; common practice). */
const CLOCK_TOLERANCE_S = 1;

const sameChannels = (a: readonly TrendChannelSpec[], b: readonly TrendChannelSpec[]) =>
	a.length === b.length &&
	a.every((c, i) => c.name === b[i].name && c.quantity === b[i].quantity && c.unit === b[i].unit);

export type RecordingPlan<T extends RecordingPartInfo> =
	{ one: true; ordered: T[]; summary: string } | { one: false; reason: string };

const fmtS = (s: number) =>
	s >= 3600 ? `${(s / 3600).toFixed(1)} h` : s >= 60 ? `${(s / 60).toFixed(1)} min` : `${s.toFixed(3)} s`;

/** Why `b` does not follow `a` in one recording, or undefined when it does. */
function notConsecutive(a: RecordingPartInfo, b: RecordingPartInfo): string | undefined {
	if (a.durationS === undefined || b.durationS === undefined)
		return `the length of ${a.durationS === undefined ? a.source : b.source} is not known before reading it`;
	const tol = (p: RecordingPartInfo) => (p.durationExact ? 0 : ESTIMATE_TOLERANCE * p.durationS!);
	const slack = CLOCK_TOLERANCE_S + tol(a);
	const delta = b.clockStartS! - (a.clockStartS! + a.durationS);
	if (delta < -slack) return `${b.source} starts ${fmtS(-delta)} before ${a.source} ends (they overlap)`;
	if (delta > Math.max(a.durationS, b.durationS) + slack)
		return `${b.source} starts ${fmtS(delta)} after ${a.source} ends, a gap longer than the files`;
	return undefined;
}

/**
 * Whether files given together fit one recording (see the module comment), and if so their order.
 * @returns `one: true` with the files in start-time order and a sentence saying what was assumed, or
 *   `one: false` with the reason in words
 */
export function planRecording<T extends RecordingPartInfo>(parts: readonly T[]): RecordingPlan<T> {
	if (parts.length < 2) return { one: false, reason: 'one file' };
	const unstated = parts.find((p) => p.clockStartS === undefined);
	if (unstated) return { one: false, reason: `${unstated.source} states no start time` };
	const ordered = [...parts].sort((a, b) => a.clockStartS! - b.clockStartS! || byName(a.source, b.source));
	const first = ordered[0];
	for (const p of ordered) {
		if (p.sampleRateHz === undefined || p.channels === undefined)
			return { one: false, reason: `the sample rate or channels of ${p.source} are not known before reading it` };
		if (Math.abs(p.sampleRateHz - first.sampleRateHz!) > 1e-9 * first.sampleRateHz!)
			return { one: false, reason: `${p.source} has another sample rate than ${first.source}` };
		if (!sameChannels(p.channels, first.channels!))
			return { one: false, reason: `${p.source} has other channels than ${first.source}` };
	}
	for (let k = 1; k < ordered.length; k++) {
		const why = notConsecutive(ordered[k - 1], ordered[k]);
		if (why) return { one: false, reason: why };
	}
	const last = ordered[ordered.length - 1];
	const span = last.clockStartS! + last.durationS! - first.clockStartS!;
	return {
		one: true,
		ordered,
		summary: `The ${ordered.length} files have the same sample rate and channels and follow one another on the clock (${first.source} to ${last.source}, about ${fmtS(span)}): they are read as one recording, in start-time order.`,
	};
}
