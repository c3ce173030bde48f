/**
 * The result of a recording analysed in segments (one per stretch between gaps, recording.ts): each
 * segment's rows, events and flicker values moved to the recording's time (seconds from its first
 * sample) and listed one after another; nothing is averaged across a gap.
 */
import type { Diagnostic } from '../capture.js';
import type { TrendFlicker, TrendFlickerRow } from './flicker-tracker.js';
import type { RecordingGap, RecordingOverlap, RecordingPart, RecordingResult } from './recording-types.js';
import type { TrendEvent, TrendFrequencyRow, TrendResult, TrendRow } from './types.js';

/** One stretch of contiguous samples: its offset from the recording's first sample and its result. */
export interface Segment {
	offsetS: number;
	samples: number;
	result: TrendResult | undefined;
}

interface RecordingFacts {
	parts: RecordingPart[];
	gaps: RecordingGap[];
	overlaps: RecordingOverlap[];
	notes: Diagnostic[];
	clockStartS: number | undefined;
}

function shifted<T extends { startS: number }>(rows: T[], offsetS: number): T[] {
	return offsetS === 0 ? rows : rows.map((r) => ({ ...r, startS: r.startS + offsetS }));
}

/** Larger of two values, a NaN counting as missing. */
const larger = (a: number, b: number) => (Number.isNaN(a) ? b : Number.isNaN(b) ? a : Math.max(a, b));

function mergeFlicker(list: { f: TrendFlicker; offsetS: number }[]): TrendFlicker | undefined {
	if (list.length === 0) return undefined;
	const base = list[0].f;
	const rows = (pick: (f: TrendFlicker) => TrendFlickerRow[]) => list.flatMap((x) => shifted(pick(x.f), x.offsetS));
	const out: TrendFlicker = {
		...base,
		pst: rows((f) => f.pst),
		plt: rows((f) => f.plt),
		pinstMax: base.pinstMax.map((_, k) => list.reduce((m, x) => larger(m, x.f.pinstMax[k]), NaN)),
	};
	if (base.pinst)
		out.pinst = {
			startS: list.flatMap((x) => (x.f.pinst?.startS ?? []).map((t) => t + x.offsetS)),
			max: base.pinst.max.map((_, k) => list.flatMap((x) => x.f.pinst?.max[k] ?? [])),
		};
	if (base.changes)
		out.changes = base.changes.map((_, k) => {
			const cs = list.flatMap((x) => (x.f.changes?.[k] ? [x.f.changes[k]] : []));
			return {
				count: cs.reduce((s, c) => s + c.count, 0),
				dcMaxPercent: cs.reduce((m, c) => larger(m, c.dcMaxPercent), NaN),
				dmaxPercent: cs.reduce((m, c) => larger(m, c.dmaxPercent), NaN),
				tmaxS: cs.reduce((m, c) => larger(m, c.tmaxS), NaN),
			};
		});
	return out;
}

/** Diagnostics of every segment, each (code, message) once, then the recording's own notes. */
function mergeDiagnostics(segs: { r: TrendResult }[], facts: RecordingFacts): Diagnostic[] {
	const seen = new Set<string>();
	const out: Diagnostic[] = [];
	for (const { r } of segs)
		for (const d of r.diagnostics) {
			const key = `${d.code}\u0000${d.message}`;
			if (seen.has(key)) continue;
			seen.add(key);
			out.push(d);
		}
	for (const g of facts.gaps)
		out.push({
			code: 'recording-gap',
			severity: 'warning',
			message: `No data for ${g.durationS.toFixed(3)} s from ${g.startS.toFixed(3)} s (between ${g.after} and ${g.before}): intervals and events in progress end there, partial, and none spans the gap.`,
		});
	for (const o of facts.overlaps)
		out.push({
			code: 'recording-overlap',
			severity: 'warning',
			message: `${o.source} starts ${o.durationS.toFixed(3)} s before the file before it ends: its first ${o.droppedSamples} samples per channel were left out (the earlier file's are kept).`,
		});
	return [...out, ...facts.notes];
}

/** Events still in progress where a gap begins: ended there (`ended: false`), and said so. */
function eventsCutByGaps(segs: { r: TrendResult; offsetS: number }[], notes: Diagnostic[]): TrendEvent[] {
	return segs.flatMap(({ r, offsetS }, k) => {
		const evs = shifted(r.events, offsetS);
		if (k < segs.length - 1)
			for (const e of evs)
				if (!e.ended)
					notes.push({
						code: 'event-cut-by-gap',
						severity: 'warning',
						message: `A ${e.kind} on ${e.channels.join(', ')} from ${e.startS.toFixed(3)} s was still going when the data stopped (a gap): its duration of ${e.durationS.toFixed(3)} s is a lower bound.`,
					});
		return evs;
	});
}

/** One RecordingResult from the segments of a recording, in time order. */
export function mergeSegments(segments: Segment[], facts: RecordingFacts): RecordingResult {
	const segs = segments.map((s) => ({ r: s.result!, offsetS: s.offsetS, samples: s.samples }));
	const head = segs[0].r;
	const last = segs[segs.length - 1];
	const rows = (pick: (r: TrendResult) => TrendRow[]) => segs.flatMap((s) => shifted(pick(s.r), s.offsetS));
	const frequency: TrendFrequencyRow[] = segs.flatMap((s) => shifted(s.r.frequency, s.offsetS));
	const notes: Diagnostic[] = [];
	const events = eventsCutByGaps(segs, notes);
	const flicker = mergeFlicker(segs.flatMap((s) => (s.r.flicker ? [{ f: s.r.flicker, offsetS: s.offsetS }] : [])));
	return {
		...head,
		durationS: last.offsetS + last.r.durationS,
		clockStartS: facts.clockStartS,
		cycles10: rows((r) => r.cycles10),
		cycles150: rows((r) => r.cycles150),
		min10: rows((r) => r.min10),
		frequency,
		events,
		diagnostics: [...mergeDiagnostics(segs, facts), ...notes],
		...(flicker ? { flicker } : {}),
		parts: facts.parts,
		gaps: facts.gaps,
		overlaps: facts.overlaps,
	};
}
