/**
 * The next-steps part of the terminal report: each step's finding, what it still needs, its conclusions
 * and warnings, its sources, and the caution once.
 */
import type { ReportJson } from '../../lib/report/to-json.js';

const STATUS: Record<string, string> = {
	result: '',
	partial: ' (partial: site values missing)',
	'needs-input': ' (needs site values)',
	'not-applicable': ' (does not apply to this recording)',
};

/** Lines (no trailing newline) of the next steps of one report; none when the report has no such section. */
export function formatNextSteps(r: ReportJson): string[] {
	const section = r.nextSteps;
	if (!section) return [];
	const out = ['', '  next steps (planning calculations from this recording):'];
	for (const s of section.steps) {
		out.push('', `    ${s.title}${STATUS[s.status] ?? ''}`);
		out.push(`      from: ${s.finding}`);
		if (s.status === 'not-applicable') continue;
		for (const c of s.conclusions) out.push(`      ${c}`);
		for (const w of s.warnings) out.push(`      ! ${w}`);
		if (s.needs.length > 0) out.push(`      needs: ${s.needs.join('; ')}`);
		for (const a of s.assumptions) out.push(`      assumes: ${a}`);
		for (const m of s.method) out.push(`      method: ${m}`);
	}
	out.push('', `    ${section.caution}`);
	return out;
}
