/**
 * A capture with gaps (NaN samples, e.g. cells read as gaps by the CSV reader) cut to its longest stretch
 * without any, so every figure is computed from readable samples only. The cut is stated as a diagnostic.
 */
import type { Capture } from '../capture.js';

export interface GapFreeSpan {
	/** The stretch as a capture (channel samples are views into the original, not copies). */
	capture: Capture;
	/** First sample of the stretch and one past its last, in the original capture. */
	startIndex: number;
	endIndex: number;
}

/**
 * First and one-past-last index of the longest run of rows where every channel is a number (not NaN); the
 * earlier run wins a tie. {0, 0} when every row has a gap.
 * Ref: common practice (analyse only readable data; IEC 61000-4-30 likewise leaves flagged data out)
 * @example longestGapFreeRun([Float64Array.of(1, NaN, 2, 3)]) // { start: 2, end: 4 }
 */
export function longestGapFreeRun(channels: readonly Float64Array[]): { start: number; end: number } {
	const n = channels[0]?.length ?? 0;
	let best = { start: 0, end: 0 };
	let runStart = 0;
	for (let i = 0; i <= n; i++) {
		let gap = i === n;
		for (let c = 0; !gap && c < channels.length; c++) if (channels[c][i] !== channels[c][i]) gap = true;
		if (!gap) continue;
		if (i - runStart > best.end - best.start) best = { start: runStart, end: i };
		runStart = i + 1;
	}
	return best;
}

/**
 * The longest gap-free stretch of a capture; the capture itself when it has no gap. The cut capture's
 * `startS` moves to its first sample and a 'gap-free-span' warning says which samples it covers.
 * Ref: common practice
 * @example gapFreeSpan(capture).capture.channels[0].samples // the samples after the last gap, when that stretch is the longest
 */
export function gapFreeSpan(capture: Capture): GapFreeSpan {
	const n = capture.channels[0]?.samples.length ?? 0;
	const { start, end } = longestGapFreeRun(capture.channels.map((c) => c.samples));
	if (start === 0 && end === n) return { capture, startIndex: 0, endIndex: n };
	const fs = capture.sampleRateHz;
	const t = (i: number) => (capture.timeS ? capture.timeS[i] - capture.timeS[0] : i / fs);
	const gapRows = new Set<number>();
	for (const c of capture.channels) for (let i = 0; i < n; i++) if (c.samples[i] !== c.samples[i]) gapRows.add(i);
	const cut: Capture = {
		...capture,
		startS: capture.startS + t(start),
		timeS: capture.timeS?.subarray(start, end),
		channels: capture.channels.map((c) => ({ ...c, samples: c.samples.subarray(start, end) })),
		digital: capture.digital?.map((d) => ({ ...d, states: d.states.subarray(start, end) })),
		diagnostics: [
			...capture.diagnostics,
			{
				code: 'gap-free-span',
				severity: 'warning',
				message: `Figures cover the longest stretch without gaps: samples ${start + 1} to ${end} of ${n} (${t(start).toFixed(4)} s to ${t(end - 1).toFixed(4)} s from the first sample); ${gapRows.size} row${gapRows.size === 1 ? '' : 's'} with gaps are left out.`,
			},
		],
	};
	return { capture: cut, startIndex: start, endIndex: end };
}
