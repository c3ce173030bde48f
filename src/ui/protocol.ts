/**
 * Messages between the page and the analysis worker (src/ui/worker.ts). Samples travel as transferable
 * Float64Arrays (moved, not copied); reports are plain objects.
 */
import type { Capture, CaptureGap } from '../../lib/capture.js';
import type { AnalysisOptions, AnalysisReport } from '../../lib/report/types.js';
import type { CaptureTrend } from '../../lib/report/index.js';
import type { OpenOptions } from '../../lib/io/open.js';
import type { SurveyInput, SurveyResult, SurveyStandardId } from '../../lib/survey/types.js';

/** What the user overrode on import (CSV layout, per-channel unit, quantity and scale): lib/io's options. */
export type ImportOverrides = Omit<OpenOptions, 'onProgress'>;

/** One file: its bytes (moved to the worker), or the picked file itself, which the worker reads in slices. */
export interface FileBytes {
	name: string;
	bytes?: ArrayBuffer;
	blob?: Blob;
}

/** An importer error as data (structured clone drops the ImportError prototype). */
export interface ImportProblem {
	source: string;
	line: number;
	column: number;
	code: string;
	text: string;
	expected: string;
	message: string;
	/** The offending line of a text file as written (at most 160 characters), when the error names a line. */
	lineText?: string;
}

export type ToWorker =
	| {
			type: 'open';
			jobId: number;
			captureKey: string;
			files: FileBytes[];
			overrides: ImportOverrides;
			analysis: AnalysisOptions;
	  }
	| { type: 'analyse'; jobId: number; captureKey: string; analysis: AnalysisOptions }
	| { type: 'seed'; captureKey: string; capture: Capture }
	| { type: 'forget'; captureKey: string }
	| { type: 'survey'; jobId: number; files: FileBytes[]; standard: SurveyStandardId; declaredV?: number };

export type FromWorker =
	| { type: 'progress'; jobId: number; stage: string; fraction: number | null; etaS?: number | null; expectS?: number }
	| {
			type: 'opened';
			jobId: number;
			captureKey: string;
			capture: Capture;
			report: AnalysisReport;
			extras: ReportExtras;
	  }
	| { type: 'import-failed'; jobId: number; captureKey: string; problems: ImportProblem[] }
	| { type: 'analysed'; jobId: number; captureKey: string; report: AnalysisReport; extras: ReportExtras }
	| { type: 'missing'; jobId: number; captureKey: string }
	| { type: 'failed'; jobId: number; message: string }
	| { type: 'surveyed'; jobId: number; survey: SurveyView | null; problems: ImportProblem[] };

/** One record of a survey: its name, where it starts on the clock (Unix s; null when it states none), its length. */
export interface SurveyFileLine {
	name: string;
	startS: number | null;
	durationS: number;
	/** Why it could not be read (then it adds nothing to the survey). */
	problem?: string;
}

/** A supply survey as lib/survey made it: the verdicts, the merged 10-minute and 10-s values it judged, notes. */
export interface SurveyView {
	result: SurveyResult;
	input: SurveyInput;
	/** What the merge found or assumed (gaps, overlaps, missing start times), in words. */
	notes: string[];
	/** The records in the order they were read (start-time order). */
	files: SurveyFileLine[];
	/** Samples per channel read over all records. */
	samples: number;
}

/**
 * Figures the worker gets from lib beyond the report itself, for drawing: the whole-cycle boundaries of the
 * reference channel (seconds from the first sample) and each channel's peaks. Harmonic groups and THD
 * variants are in the report (ReportChannel.groups, .thdVariants).
 */
export interface ReportExtras {
	cycleBoundariesS: number[];
	/** Sample index of each channel's positive and negative peak within the analysed window (-1 when none). */
	peakIndex: Record<string, { max: number; min: number }>;
	/** Trends and voltage events (lib/trend), with the Urms(1/2) series; null when it could not be run. */
	trend: TrendView | null;
	/**
	 * Cells read as gaps, when the file had any: the figures come from the longest stretch without gaps,
	 * which starts `offsetS` after the first sample (report times count from there).
	 */
	gaps?: GapView;
}

/** Cells read as gaps and where the analysed stretch lies. */
export interface GapView {
	offsetS: number;
	/** First sample of the analysed stretch and one past its last (indices of the whole capture). */
	startIndex: number;
	endIndex: number;
	cells: (CaptureGap & { timeS: number })[];
}

/** lib/trend's result plus the RMS over one cycle refreshed every half cycle, per channel (lib/report's trend view). */
export type TrendView = CaptureTrend;
