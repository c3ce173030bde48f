/**
 * Voltage events in words: one line per event (shared by the findings, the CLI table and the printed
 * report) and the events finding.
 */
import type { ReportEvent, ReportEvents } from './events.js';
import type { ReportFinding } from './findings.js';
import { PLAIN_WORDS, type NumberWords } from './words.js';

const KIND = { dip: 'dip', swell: 'swell', interruption: 'interruption' } as const;

/** "dip to 52.0 % (119.6 V) for 110 ms at 0.200 s on U1, U2" (swells: "up to"). */
export function eventLine(e: ReportEvent, w: NumberWords = PLAIN_WORDS): string {
	const to = e.kind === 'swell' ? 'up to' : 'to';
	const lasting = e.ended
		? `for ${w.duration(e.durationS)}`
		: `for at least ${w.duration(e.durationS)} (the record ends during it)`;
	const on = e.kind === 'interruption' ? 'on every phase' : `on ${e.channels.join(', ')}`;
	return `${KIND[e.kind]} ${to} ${w.percent(e.percentOfDeclared)} (${w.quantity(e.extremeV, 'V')}) ${lasting} at ${w.at(e.startS)} ${on}`;
}

/** "1 dip, 1 interruption". */
export function eventCounts(events: ReportEvent[]): string {
	const n = (k: ReportEvent['kind']) => events.filter((e) => e.kind === k).length;
	const parts = (['dip', 'swell', 'interruption'] as const)
		.filter((k) => n(k) > 0)
		.map((k) => `${n(k)} ${k}${n(k) === 1 ? '' : 's'}`);
	return parts.join(', ');
}

/** The events finding: none found (with the thresholds), or how many and the first few. */
export function eventFindings(ev: ReportEvents | null, w: NumberWords = PLAIN_WORDS): ReportFinding[] {
	if (!ev) return [];
	const t = ev.thresholdsPercent;
	const basis = `dip below ${t.dip} %, swell above ${t.swell} %, interruption below ${t.interruption} % of ${w.quantity(ev.declaredV, 'V', 3)}`;
	if (ev.events.length === 0) {
		return [
			{
				id: 'events',
				topic: 'events',
				level: 'ok',
				channel: null,
				text: 'No voltage dips, swells or interruptions in the record.',
				figure: basis,
			},
		];
	}
	const lines = ev.events.slice(0, 4).map((e) => eventLine(e, w));
	return [
		{
			id: 'events',
			topic: 'events',
			level: 'attention',
			channel: null,
			text: `Voltage events in the record: ${eventCounts(ev.events)}.`,
			figure: lines.join('; ') + (ev.events.length > 4 ? `; and ${ev.events.length - 4} more` : '') + ` (${basis})`,
		},
	];
}
