/**
 * Flicker findings for the page: lib/report's flicker findings (flicker-findings.ts, thresholds in
 * lib/report/thresholds.ts), with where they show.
 */
import type { AnalysisReport } from '../../lib/report/types.js';
import { verdictsFor, type Verdict } from './verdicts.js';

/** The flicker and voltage-step findings of a report. */
export function flickerVerdicts(report: AnalysisReport): Verdict[] {
	return verdictsFor(report).filter((v) => v.topic === 'flicker');
}
