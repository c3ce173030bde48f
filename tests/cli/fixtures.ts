/**
 * Capture files written by the CLI tests into a temporary folder: closed-form signals (tests/helpers/synth.ts)
 * in a plain CSV layout of our own (time column in s, one column per channel, unit in brackets).
 */
import { writeFileSync } from 'node:fs';
import { harmonicSamples, type Tone } from '../helpers/synth.js';

export interface FixtureChannel {
	/** Header cell, e.g. 'U1 (V)'. */
	header: string;
	tones: Tone[];
	offset?: number;
}

/** Writes `t (s),<headers...>` rows at `sampleRateHz`, `cycles` of `frequencyHz`. */
export function writeCsvCapture(
	path: string,
	channels: FixtureChannel[],
	opts: { frequencyHz: number; sampleRateHz: number; cycles: number },
): void {
	const cols = channels.map((c) => harmonicSamples(c.tones, { ...opts, offset: c.offset }));
	const n = cols[0].length;
	const lines = [['t (s)', ...channels.map((c) => csvCell(c.header))].join(',')];
	for (let i = 0; i < n; i++) {
		const row = [(i / opts.sampleRateHz).toFixed(8)];
		for (const col of cols) row.push(String(col[i]));
		lines.push(row.join(','));
	}
	writeFileSync(path, lines.join('\n') + '\n');
}

function csvCell(text: string): string {
	return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
