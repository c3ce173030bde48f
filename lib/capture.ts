/**
 * The waveform model every Sinecheck module takes: a capture is a time base and named channels whose
 * samples are already in engineering units (scale, probe ratio, CT/VT ratio applied by the importer).
 */

/** What a channel measures. Inferred from the unit, else the name; 'other' when neither tells. */
export type Quantity = 'voltage' | 'current' | 'other';

/**
 * A conductor's name: L1/L2/L3 (IEC 60445, from memory) or a letter of the families A/B/C, R/S/T,
 * R/Y/B, U/V/W (common practice). lib/channel-identity.ts reads them from names.
 */
export type PhaseName = 'L1' | 'L2' | 'L3' | 'A' | 'B' | 'C' | 'R' | 'S' | 'T' | 'Y' | 'U' | 'V' | 'W';

/** What a channel is measured on: one phase, the neutral ('N'), or between two lines ('L1-L2', 'A-B'). */
export type ChannelPhase = PhaseName | 'N' | `${PhaseName}-${PhaseName}`;

/** Something an importer (or an analysis) assumed, corrected or noticed; never silent. */
export interface Diagnostic {
	/** Stable machine code, kebab-case, e.g. 'decimal-comma', 'rate-from-preamble'. */
	code: string;
	/** One sentence an electrician can read, with the values involved. */
	message: string;
	/** 'info' = what was detected; 'assumption' = a guess the user may override; 'warning' = doubtful data. */
	severity: 'info' | 'assumption' | 'warning';
	/** 1-based line of the source file, when the diagnostic points at one. */
	line?: number;
	/** 1-based column (characters), when known. */
	column?: number;
}

/** One analogue channel, samples in SI units (V or A; 'other' channels keep their own unit). */
export interface Channel {
	/** Name without its unit: header `U1 (V)` gives name `U1`. Unique within a capture. */
	name: string;
	/** Normalised unit: 'V', 'A', or the source's own text for anything else ('' if none). */
	unit: string;
	quantity: Quantity;
	/** Phase when the source states one or the name carries one ('L1', 'A', 'L1-L2', 'N'; see channel-identity.ts). */
	phase?: ChannelPhase;
	/** Samples in `unit`, all scaling already applied. Length equals the capture's sample count. */
	samples: Float64Array;
	/** How raw values became `samples` (value = factor * raw + offset), for the report. Omitted if none. */
	scaling?: { factor: number; offset: number; description: string };
	/**
	 * The range the file states for the channel (a scope's vertical range, a COMTRADE channel's min and max,
	 * an integer WAV's full scale), in `unit` after all scaling; flat runs at its limits are clipping.
	 * Omitted when the file states none.
	 */
	range?: ChannelRange;
}

/** A channel's stated range: the lowest and highest values its converter or recorder can give, in the channel's unit. */
export interface ChannelRange {
	min: number;
	max: number;
	/** Where it was stated, in words ('the preamble's "Vertical Range"', 'the .cfg's min and max', ...). */
	source: string;
}

/** The range after value = factor · raw + offset (a negative factor swaps the limits). */
export function scaleRange(range: ChannelRange, factor: number, offset: number): ChannelRange {
	const a = factor * range.min + offset;
	const b = factor * range.max + offset;
	return { min: Math.min(a, b), max: Math.max(a, b), source: range.source };
}

/** A binary status channel (COMTRADE digital), kept as it was recorded. */
export interface DigitalChannel {
	name: string;
	/** Normal (inactive) state as declared by the source, when it declares one. */
	normalState?: 0 | 1;
	states: Uint8Array;
}

/** A recorded capture: uniform sampling at `sampleRateHz`, or an explicit time base in `timeS`. */
/** The reader that made a capture, decided from its content (lib/io/open.ts). */
export type CaptureFormat = 'csv' | 'wav' | 'comtrade';

export interface Capture {
	/** File name as given by the caller, or '<input>'. */
	source: string;
	/** The reader that made it; every importer sets it (absent on captures built in code, e.g. by tests). */
	format?: CaptureFormat;
	/** Sample rate in Hz (samples per second). For an explicit time base: the mean rate. */
	sampleRateHz: number;
	/** Time of the first sample in s, relative to the record's zero (a trigger, when there is one; may be negative). */
	startS: number;
	/** Absolute wall-clock start as ISO 8601 text when the source states it; undefined otherwise. */
	startTime?: string;
	/** Explicit per-sample times in s, only when sampling is not uniform (then `sampleRateHz` is the mean rate). */
	timeS?: Float64Array;
	/** Nominal system frequency in Hz when the source declares one (COMTRADE `lf`, a preamble key). */
	nominalFrequencyHz?: number;
	channels: Channel[];
	digital?: DigitalChannel[];
	/** Every key/value the source carried (preamble lines, COMTRADE header fields), verbatim. */
	metadata: Record<string, string>;
	/** What the importer detected, assumed or corrected; shown by every front end. */
	diagnostics: Diagnostic[];
	/** Cells the importer could not read and, as asked, kept as NaN gaps (CSV option `unreadableCells: 'gap'`). */
	gaps?: CaptureGap[];
}

/** A cell read as a gap: its place in the file and in the samples. */
export interface CaptureGap {
	channel: string;
	/** 0-based sample index in the channel. */
	sampleIndex: number;
	/** 1-based line and column (characters) in the file. */
	line: number;
	column: number;
	/** The cell as written. */
	text: string;
}

/** Number of samples per channel in a capture (0 for a capture with no channels). */
export function sampleCount(capture: Capture): number {
	return capture.channels[0]?.samples.length ?? capture.digital?.[0]?.states.length ?? 0;
}

/** Duration covered by the samples in s: N / fs for uniform sampling (each sample stands for 1/fs). */
export function durationS(capture: Capture): number {
	const n = sampleCount(capture);
	if (capture.timeS && n > 1) return capture.timeS[n - 1] - capture.timeS[0] + 1 / capture.sampleRateHz;
	return n / capture.sampleRateHz;
}
