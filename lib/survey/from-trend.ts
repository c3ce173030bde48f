/**
 * The merge step of a survey: the per-file outputs of `trend` (its JSON documents, one per recording
 * file, produced on one machine or many) put on one clock, ordered, checked for gaps and overlaps, and
 * turned into one SurveyInput. Partial 10-minute intervals cut by a file boundary are joined when both
 * parts are on the clock; an event cut by a file boundary becomes one event.
 */
import type { Diagnostic } from '../capture.js';
import { pltFromPst } from '../flicker/classifier.js';
import { clockTimeOf } from '../trend/clock.js';
import { fileList } from '../trend/file-list.js';
import { byName } from '../trend/recording-order.js';
import type { SurveyEvent, SurveyFrequency, SurveyInput, SurveyInterval, SurveyPlt } from './types.js';

/** The fields of a `trend` JSON document the survey reads (other fields are ignored). */
export interface TrendDocument {
	source: string;
	/** Wall-clock time of the first sample, ISO 8601, when the file states it. */
	startTime?: string | null;
	/** The same as seconds since 1970 (what the intervals were aligned to), when known. */
	clockStartS?: number | null;
	declaredV: number | null;
	nominalHz: number;
	durationS: number;
	channels: { name: string; quantity: string; unit: string }[];
	aggregates: {
		interval: string;
		startS: number;
		durationS: number;
		complete: boolean;
		flagged: boolean;
		rms: (number | null)[];
		thdPercent?: (number | null)[];
		harmonicsPercent?: (number | null)[][];
		unbalancePercent?: number | null;
		pst?: (number | null)[];
	}[];
	frequency: { startS: number; durationS: number; frequencyHz: number | null; complete: boolean; flagged: boolean }[];
	events: {
		kind: string;
		startS: number;
		durationS: number;
		percentOfDeclared: number;
		channels: string[];
		ended: boolean;
	}[];
	plt?: { startS: number; plt: (number | null)[]; flagged: boolean }[];
	/** A recording of several files analysed as one: its files, and the gaps between them (times as above). */
	parts?: { source: string; startS: number; samples: number }[];
	gaps?: { startS: number; durationS: number; after: string; before: string }[];
}

export class SurveyMergeError extends Error {
	override readonly name = 'SurveyMergeError';
	constructor(
		readonly source: string,
		message: string,
	) {
		super(message);
	}
}

const TEN_MIN_S = 600;
/** Two files whose ends are this close (s) are contiguous; an event this close to a boundary continues. */
const JOIN_TOLERANCE_S = 0.05;

const num = (v: number | null | undefined): number => (v === null || v === undefined ? NaN : v);

interface Placed {
	doc: TrendDocument;
	baseS: number;
	volts: number[];
}

/** The files of a document in recording order: the parts of a recording of several files, or the file. */
const filesOf = (d: TrendDocument): string[] =>
	d.parts && d.parts.length > 0 ? d.parts.map((p) => p.source) : [d.source];

/**
 * The note when the documents are placed one after another (not every one is on the clock), naming each
 * file so placed, compactly (lib/trend's fileList, as the recording's own notes name them). One file
 * alone needs none: the assessment says its intervals count from its first sample.
 */
function sequenceNote(docs: readonly TrendDocument[], onClock: (d: TrendDocument) => boolean): Diagnostic | undefined {
	const files = docs.flatMap(filesOf);
	if (files.length < 2) return undefined;
	const unstated = docs.filter((d) => !onClock(d)).flatMap(filesOf);
	const order = files.every((f, k) => k === 0 || byName(files[k - 1], f) <= 0)
		? 'in the order of their names'
		: 'in the order they were given';
	const placed = `taken as one recording with nothing missing between them, each file starting where the one before it ends, ${order}`;
	const message =
		unstated.length === files.length
			? `None of these files states when it started: ${fileList(files)}. They are ${placed}.`
			: `${fileList(unstated)} ${unstated.length === 1 ? 'states' : 'state'} no start time, so the start times of the other files are not used either. All ${files.length} files are ${placed}: ${fileList(files)}.`;
	return { code: 'survey-no-start-time', severity: 'assumption', message };
}

function place(docs: readonly TrendDocument[], diagnostics: Diagnostic[]): { placed: Placed[]; clockAligned: boolean } {
	const clockOf = (d: TrendDocument) =>
		typeof d.clockStartS === 'number' ? d.clockStartS : clockTimeOf(d.startTime)?.unixS;
	const clockAligned = docs.every((d) => clockOf(d) !== undefined);
	let next = 0;
	const placed = docs.map((doc) => {
		const volts = doc.channels.flatMap((c, i) => (c.quantity === 'voltage' ? [i] : []));
		const baseS = clockAligned ? clockOf(doc)! : next;
		next = baseS + doc.durationS;
		return { doc, baseS, volts };
	});
	if (clockAligned) placed.sort((a, b) => a.baseS - b.baseS);
	else {
		const note = sequenceNote(docs, (d) => clockOf(d) !== undefined);
		if (note) diagnostics.push(note);
	}
	return { placed, clockAligned };
}

function checkChannels(placed: Placed[]): string[] {
	const names = placed[0].volts.map((i) => placed[0].doc.channels[i].name);
	if (names.length === 0)
		throw new SurveyMergeError(
			placed[0].doc.source,
			'has no voltage channel: a voltage survey needs the supply voltages.',
		);
	for (const p of placed) {
		const these = p.volts.map((i) => p.doc.channels[i].name);
		if (these.join('\u0000') !== names.join('\u0000'))
			throw new SurveyMergeError(
				p.doc.source,
				`has voltage channels ${these.join(', ')}; the first file has ${names.join(', ')}. One survey takes one set of channels.`,
			);
	}
	return names;
}

/** Joins two parts of one clock interval: the RMS of the squared parts weighted by their durations. */
function joinParts(a: SurveyInterval, b: SurveyInterval): SurveyInterval {
	const da = a.durationS;
	const db = b.durationS;
	const w = (x: number, y: number) => Math.sqrt((da * x * x + db * y * y) / (da + db));
	const pair = (x: number[] | undefined, y: number[] | undefined) => (x && y ? x.map((v, i) => w(v, y[i])) : undefined);
	const durationS = b.startS + b.durationS - a.startS;
	return {
		startS: a.startS,
		durationS,
		complete: durationS >= TEN_MIN_S - 1,
		flagged: a.flagged || b.flagged,
		rmsV: pair(a.rmsV, b.rmsV)!,
		thdPercent: pair(a.thdPercent, b.thdPercent),
		harmonicsPercent:
			a.harmonicsPercent && b.harmonicsPercent
				? a.harmonicsPercent.map((h, c) => pair(h, b.harmonicsPercent![c])!)
				: undefined,
		unbalancePercent:
			a.unbalancePercent !== undefined && b.unbalancePercent !== undefined
				? w(a.unbalancePercent, b.unbalancePercent)
				: undefined,
	};
}

function intervalsOf(p: Placed): SurveyInterval[] {
	return p.doc.aggregates
		.filter((r) => r.interval === '10-min')
		.map((r) => ({
			startS: p.baseS + r.startS,
			durationS: r.durationS,
			complete: r.complete,
			flagged: r.flagged,
			rmsV: p.volts.map((i) => num(r.rms[i])),
			thdPercent: r.thdPercent ? p.volts.map((i) => num(r.thdPercent![i])) : undefined,
			harmonicsPercent: r.harmonicsPercent ? p.volts.map((i) => (r.harmonicsPercent![i] ?? []).map(num)) : undefined,
			unbalancePercent: r.unbalancePercent === undefined ? undefined : num(r.unbalancePercent),
			pst: r.pst ? p.volts.map((i) => num(r.pst![i])) : undefined,
		}));
}

/**
 * The documents' intervals in order. Two partial parts of one clock interval are joined only where one
 * document ends and the next begins (a file boundary); inside one document two parts of an interval lie
 * on either side of a gap, and stay apart.
 */
function mergeIntervals(lists: SurveyInterval[][], clockAligned: boolean): SurveyInterval[] {
	const out: SurveyInterval[] = [];
	for (const list of lists) {
		for (const [k, iv] of list.entries()) {
			const last = out[out.length - 1];
			const sameSlot =
				k === 0 &&
				clockAligned &&
				last &&
				!last.complete &&
				!iv.complete &&
				Math.floor((last.startS + 1e-6) / TEN_MIN_S) === Math.floor((iv.startS + 1e-6) / TEN_MIN_S);
			if (sameSlot && Math.abs(last.startS + last.durationS - iv.startS) <= JOIN_TOLERANCE_S + 1)
				out[out.length - 1] = joinParts(last, iv);
			else out.push(iv);
		}
	}
	return out;
}

function mergeEvents(placed: Placed[]): SurveyEvent[] {
	const out: (SurveyEvent & { open: boolean })[] = [];
	for (const p of placed) {
		for (const e of p.doc.events) {
			if (e.kind !== 'dip' && e.kind !== 'swell' && e.kind !== 'interruption') continue;
			const startS = p.baseS + e.startS;
			let prev: (SurveyEvent & { open: boolean }) | undefined;
			for (let k = out.length - 1; k >= 0 && !prev; k--) if (out[k].open && out[k].kind === e.kind) prev = out[k];
			if (prev && Math.abs(prev.startS + prev.durationS - startS) <= JOIN_TOLERANCE_S && e.startS <= JOIN_TOLERANCE_S) {
				prev.durationS = startS + e.durationS - prev.startS;
				prev.percentOfDeclared =
					e.kind === 'swell'
						? Math.max(prev.percentOfDeclared, e.percentOfDeclared)
						: Math.min(prev.percentOfDeclared, e.percentOfDeclared);
				prev.channels = [...new Set([...prev.channels, ...e.channels])];
				prev.open = !e.ended;
				continue;
			}
			out.push({
				kind: e.kind,
				startS,
				durationS: e.durationS,
				percentOfDeclared: e.percentOfDeclared,
				channels: [...e.channels],
				open: !e.ended,
			});
		}
	}
	return out.map(({ open: _open, ...e }) => e);
}

/** 10-minute values in one 2-hour long-term flicker value (IEC 61000-4-15:2010, 5.7.3; from memory). */
const PLT_PST_COUNT = 12;

/**
 * Plt of documents merged from several files: from the merged 10-minute Pst values, in groups of 12
 * consecutive complete intervals (each starting 10 minutes after the one before; a gap, a partial or an
 * unmeasured interval starts a new group, an incomplete group is dropped), the cubic mean of each
 * (lib/flicker's pltFromPst). A group is flagged when one of its intervals is. A file's own 2-hour values
 * cannot be used: a file of an hour holds none, and a file boundary may cut one.
 */
function pltOfIntervals(intervals: readonly SurveyInterval[], channels: number): SurveyPlt[] {
	const out: SurveyPlt[] = [];
	let run: SurveyInterval[] = [];
	for (const iv of intervals) {
		const prev = run[run.length - 1];
		const follows = prev && Math.abs(iv.startS - prev.startS - TEN_MIN_S) <= 1;
		if (!iv.complete || !iv.pst || !iv.pst.every(Number.isFinite)) {
			run = [];
			continue;
		}
		if (!follows) run = [];
		run.push(iv);
		if (run.length === PLT_PST_COUNT) {
			out.push({
				startS: run[0].startS,
				flagged: run.some((r) => r.flagged),
				plt: Array.from({ length: channels }, (_, c) => pltFromPst(run.map((r) => r.pst![c]))),
			});
			run = [];
		}
	}
	return out;
}

/**
 * A document's last 10-minute value that ends on a clock tick where the next document continues without a
 * gap is partial only because its last 10/12-cycle window was cut by the file boundary (that window's
 * samples are in the next file's first value): it is taken as complete when it holds all but 1 s of the
 * interval, the leniency joinParts gives a joined interval.
 */
function completeAtBoundaries(placed: readonly Placed[], lists: SurveyInterval[][]): void {
	for (let k = 0; k + 1 < placed.length; k++) {
		const last = lists[k][lists[k].length - 1];
		const end = placed[k].baseS + placed[k].doc.durationS;
		if (!last || last.complete || Math.abs(placed[k + 1].baseS - end) > JOIN_TOLERANCE_S) continue;
		const tick = (Math.floor((last.startS + 1e-6) / TEN_MIN_S) + 1) * TEN_MIN_S;
		if (Math.abs(end - tick) <= 1 && last.durationS >= TEN_MIN_S - 1)
			lists[k][lists[k].length - 1] = { ...last, complete: true };
	}
}

/** One document (one recording, however many files): its own Plt; several: Plt from the merged Pst. */
function pltOf(placed: readonly Placed[], intervals: readonly SurveyInterval[], channels: number): SurveyPlt[] {
	if (placed.length > 1) return pltOfIntervals(intervals, channels);
	return (placed[0].doc.plt ?? []).map((r) => ({
		startS: placed[0].baseS + r.startS,
		flagged: r.flagged,
		plt: placed[0].volts.map((i) => num(r.plt[i])),
	}));
}

/**
 * One SurveyInput from the `trend` documents of consecutive files of one recording.
 * @throws SurveyMergeError when the files do not form one recording (different voltage channels or
 *   declared voltages), naming the file.
 */
export function surveyInputFromTrend(
	docs: readonly TrendDocument[],
	declaredV?: number,
): { input: SurveyInput; diagnostics: Diagnostic[] } {
	if (docs.length === 0) throw new SurveyMergeError('<input>', 'no recording given');
	const diagnostics: Diagnostic[] = [];
	const { placed, clockAligned } = place(docs, diagnostics);
	const names = checkChannels(placed);
	const udin = declaredV ?? num(placed[0].doc.declaredV);
	if (!(udin > 0))
		throw new SurveyMergeError(placed[0].doc.source, 'states no declared voltage: give the nominal supply voltage.');
	for (const p of placed) {
		const d = num(p.doc.declaredV);
		if (declaredV === undefined && d > 0 && Math.abs(d - udin) > 1e-9 * udin)
			throw new SurveyMergeError(
				p.doc.source,
				`was analysed with a declared voltage of ${d} V, the first file with ${udin} V: analyse all files with the same declared voltage.`,
			);
	}
	for (let k = 1; k < placed.length; k++) {
		const endPrev = placed[k - 1].baseS + placed[k - 1].doc.durationS;
		const gap = placed[k].baseS - endPrev;
		if (gap > JOIN_TOLERANCE_S)
			diagnostics.push({
				code: 'survey-gap',
				severity: 'warning',
				message: `No data for ${gap.toFixed(1)} s between ${placed[k - 1].doc.source} and ${placed[k].doc.source}.`,
			});
		else if (gap < -JOIN_TOLERANCE_S)
			diagnostics.push({
				code: 'survey-overlap',
				severity: 'warning',
				message: `${placed[k].doc.source} starts ${(-gap).toFixed(1)} s before ${placed[k - 1].doc.source} ends: the overlapping intervals are counted once, from the earlier file.`,
			});
	}
	for (const p of placed)
		for (const g of p.doc.gaps ?? [])
			diagnostics.push({
				code: 'survey-gap',
				severity: 'warning',
				message: `No data for ${g.durationS.toFixed(1)} s between ${g.after} and ${g.before}.`,
			});
	const lists = placed.map(intervalsOf);
	if (clockAligned) completeAtBoundaries(placed, lists);
	let covered = -Infinity;
	const deduped = lists.map((list) => {
		const kept = list.filter((iv) => iv.startS >= covered - JOIN_TOLERANCE_S);
		if (kept.length) covered = Math.max(covered, kept[kept.length - 1].startS + kept[kept.length - 1].durationS);
		return kept;
	});
	const frequency: SurveyFrequency[] = placed.flatMap((p) =>
		p.doc.frequency
			.filter((f) => f.complete)
			.map((f) => ({ startS: p.baseS + f.startS, frequencyHz: num(f.frequencyHz), flagged: f.flagged })),
	);
	const intervals = mergeIntervals(deduped, clockAligned);
	const plt = pltOf(placed, intervals, names.length);
	const nominal = placed[0].doc.nominalHz === 60 ? 60 : 50;
	const last = placed[placed.length - 1];
	return {
		input: {
			channels: names,
			declaredV: udin,
			nominalHz: nominal,
			spanStartS: placed[0].baseS,
			spanEndS: placed.reduce((m, p) => Math.max(m, p.baseS + p.doc.durationS), last.baseS),
			clockAligned,
			intervals,
			frequency,
			plt: plt.length ? plt : undefined,
			events: mergeEvents(placed),
		},
		diagnostics,
	};
}
