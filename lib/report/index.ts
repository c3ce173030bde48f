// Public API of lib/report: re-exports only. Analysis results -> plain objects (the JSON contract of
// report.schema.json, shared by the CLI and the UI).
export { analyseCapture, analyseCaptureParts, REPORT_DEFAULT_MAX_ORDER, type AnalysisParts } from './analyse.js';
export { type CaptureTrend, type TrendViewRequest } from './trend-view.js';
export { applyLimits, LIMIT_STEP_OPTIONS } from './limits-report.js';
export {
	REPORT_SCHEMA_VERSION,
	REPORT_LIMIT_TABLE_IDS,
	type AnalysisOptions,
	type AnalysisProgress,
	type AnalysisStage,
	type AnalysisReport,
	type ReportChannel,
	type ReportHarmonic,
	type ReportPair,
	type ReportPower,
	type ReportLoadCharacter,
	type ReportThreePhase,
	type ReportLimits,
	type ReportLimitRow,
	type ReportLimitTableId,
	type ReportPairOverride,
	type ReportShortRecord,
	type ReportFitChannel,
	type ReportResolution,
} from './types.js';
export { FITTED_NOTE, SHORT_RECORD_SEARCH_HZ } from './short-record.js';
export { reportToJson, reportValueToJson, type ReportJson, type ReportJsonValue, type Jsonified } from './to-json.js';
export {
	CSV_SUMMARY_COLUMNS,
	csvTextCell,
	csvNumberCell,
	csvSummaryHeader,
	csvSummaryRows,
	reportsToCsv,
} from './csv-summary.js';
export { flickerReport, type ReportFlicker, type ReportFlickerChannel } from './flicker-report.js';
export { csvCell, startsLikeFormula } from './csv-cell.js';
export { chooseReference } from './reference.js';
export { reportFindings, lagSentence, LIMIT_TABLE_NAMES, type ReportFinding, type FindingLevel } from './findings.js';
export { VERDICT_THRESHOLDS, threshold, type VerdictThreshold, type VerdictThresholdId } from './thresholds.js';
export { captureEvents, eventsCountedOnce, foldInterruptions, type ReportEvent, type ReportEvents } from './events.js';
export { classifyEvents, type ReportEventTable } from './events-table.js';
export { eventLine } from './event-findings.js';
export { limitBasis, type ReportLimitBasis, type ReportHarmonicBasis } from './limits-basis.js';
export { meterModel, shapeFigures, type MeterModel, type MeterReading } from './meter.js';
export { intervalsDiffer, type ChannelIntervals, type IntervalFigure } from './intervals.js';
export { numberWords, PLAIN_WORDS, type NumberWords } from './words.js';
