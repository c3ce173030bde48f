// lib/survey: voltage-characteristics survey of a long recording (EN 50160, IEC 61000-2-2).
export * from './types.js';
export { assessSurvey, findGaps } from './assess.js';
export {
	SURVEY_STANDARDS,
	EN50160_SURVEY,
	IEC61000_2_2_SURVEY,
	type SurveyStandard,
	type BandRule,
	type PercentileRule,
} from './rules.js';
export {
	dipTable,
	swellTable,
	interruptionCounts,
	DIP_DURATION_EDGES_MS,
	DIP_RESIDUAL_EDGES_PERCENT,
	SWELL_DURATION_EDGES_MS,
	SHORT_INTERRUPTION_MAX_S,
} from './event-table.js';
export { shareWithinPercent, percentileNearestRank, finiteRange } from './statistics.js';
export { surveyInputFromTrend, SurveyMergeError, type TrendDocument } from './from-trend.js';
export { recordingNotesOf, trendDocumentOf } from './from-result.js';
