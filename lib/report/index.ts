// Public API of lib/report: re-exports only. Analysis results -> plain objects (the JSON contract of
// report.schema.json, shared by the CLI and the UI).
export { analyseCapture, REPORT_DEFAULT_MAX_ORDER } from './analyse.js';
export { applyLimits, LIMIT_STEP_OPTIONS } from './limits-report.js';
export {
	REPORT_SCHEMA_VERSION,
	REPORT_LIMIT_TABLE_IDS,
	type AnalysisOptions,
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
export { CSV_SUMMARY_COLUMNS, csvTextCell, csvNumberCell, csvSummaryHeader, csvSummaryRows, reportsToCsv } from './csv-summary.js';
export { flickerReport, type ReportFlicker, type ReportFlickerChannel } from './flicker-report.js';
export { csvCell, startsLikeFormula } from './csv-cell.js';
export { chooseReference } from './reference.js';
