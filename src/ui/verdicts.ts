/**
 * Findings for the page: lib/report's findings (the same thresholds, sentences and numbers as the JSON
 * report and the CLI), rebuilt with the display locale's decimal mark, each with where it shows on the plots.
 */
import { lagSentence as libLagSentence, reportFindings, type ReportFinding } from '../../lib/report/index.js';
import type { AnalysisReport, ReportPair } from '../../lib/report/types.js';
import { numberWords, type NumberWords } from '../../lib/report/index.js';
import { formatFixed } from './format.js';

export type VerdictLevel = ReportFinding['level'];
export type ViewTab = 'waves' | 'harmonics' | 'phasors' | 'trends' | 'check' | 'report';

export interface Verdict extends ReportFinding {
	/** Where it shows: a tab and optionally a channel to select there. */
	target: { tab: ViewTab; channel?: string };
}

export { LIMIT_TABLE_NAMES } from '../../lib/report/index.js';

/** lib/report's sentence numbers in the display locale. */
function words(): NumberWords {
	return numberWords((x, d) => formatFixed(x, d));
}

/** "I1 lags U1 by 32.0°, 1.78 ms" (or "leads"): the one sign convention, positive lag = lags. */
export function lagSentence(pair: Pick<ReportPair, 'ref' | 'other' | 'lagDeg' | 'lagS'>): string {
	return libLagSentence(pair, words());
}

const TAB: Record<ReportFinding['topic'], ViewTab> = {
	distortion: 'harmonics',
	meter: 'waves',
	load: 'phasors',
	'three-phase': 'phasors',
	events: 'trends',
	flicker: 'trends',
	data: 'waves',
};

/** Every finding for a report, in reading order: distortion, meters, load, three-phase, events, data warnings. */
export function verdictsFor(report: AnalysisReport): Verdict[] {
	return reportFindings(report, words()).map((f) => ({
		...f,
		target: f.channel && f.topic !== 'three-phase' ? { tab: TAB[f.topic], channel: f.channel } : { tab: TAB[f.topic] },
	}));
}
