/** The contract of a recording over many files (recording.ts): where each part, gap and overlap lies. */
import type { TrendResult } from './types.js';

/** A stretch without samples between two parts. */
export interface RecordingGap {
	/** Seconds from the recording's first sample to the end of the samples before the gap. */
	startS: number;
	durationS: number;
	/** The part before and the part after the gap. */
	after: string;
	before: string;
}

/** A part that started before the samples already in the recording had ended. */
export interface RecordingOverlap {
	source: string;
	/** Seconds from the recording's first sample to the part's stated start. */
	startS: number;
	durationS: number;
	/** Samples per channel of this part left out (the earlier file's samples are kept). */
	droppedSamples: number;
}

/** Where each part went. */
export interface RecordingPart {
	source: string;
	/** Seconds from the recording's first sample to the part's first sample. */
	startS: number;
	/** Samples per channel the part held (dropped ones included). */
	samples: number;
}

export interface RecordingResult extends TrendResult {
	parts: RecordingPart[];
	gaps: RecordingGap[];
	overlaps: RecordingOverlap[];
}
