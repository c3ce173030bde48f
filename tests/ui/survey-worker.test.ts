/**
 * The worker's survey (src/ui/survey-worker.ts) in-process on Blobs, as the page hands picked files over:
 * the closed-form three-file recording (tests/helpers/survey-recording.ts) given out of order, with an
 * unreadable file beside it, and a file of another recording.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { runSurvey, type SurveyProgress } from '../../src/ui/survey-worker.js';
import { toProblem } from '../../src/ui/worker-core.js';
import {
	SURVEY_FILE_S,
	SURVEY_FILES,
	SURVEY_RATE_HZ,
	surveyFileCsv,
	surveyFileStart,
} from '../helpers/survey-recording.js';

const parts = Array.from({ length: SURVEY_FILES }, (_, k) => ({
	name: `part${k + 1}.csv`,
	blob: new Blob([surveyFileCsv(k)]),
}));

/** `seconds` of a 230 V, 50 Hz sine at 1000 S/s with no start time, as a logger without a clock writes it. */
function unstatedCsv(seconds: number): string {
	const rows = Array.from({ length: seconds * 1000 }, (_, i) => {
		const t = i / 1000;
		return `${t.toFixed(3)},${(230 * Math.SQRT2 * Math.sin(2 * Math.PI * 50 * t)).toFixed(2)}`;
	});
	return `time (s),V1 (V)\n${rows.join('\n')}\n`;
}

describe('runSurvey', () => {
	it('files without start times: one note names each file in name order (h2 before h10), as the CLI does', async () => {
		const picked = ['h10.csv', 'h2.csv', 'h1.csv'].map((name) => ({ name, blob: new Blob([unstatedCsv(3)]) }));
		const { survey, problems } = await runSurvey(picked, 'en50160', 230, () => undefined, toProblem);
		expect(problems).toEqual([]);
		const notes = survey!.notes.filter((n) => n.includes('start'));
		// numbered files in numeric order (common practice for a logger's numbered files); the same words as
		// tests/cli/survey/survey-command.test.ts finds in the CLI's note (there with the folder said once)
		expect(
			notes.filter((n) => n.includes('None of these files states when it started: h1.csv, h2.csv and h10.csv.')),
		).toHaveLength(1);
		// the recording's name ("h1.csv to h10.csv (3 files)") is not taken for a file
		expect(notes.filter((n) => n.includes('3 files) states'))).toEqual([]);
	});

	it('reads the records in start-time order, counts every sample, and lists an unreadable file without losing the rest', async () => {
		const bad = { name: 'aaa-notes.csv', blob: new Blob(['time (s),L1 (V)\n0,1\n0.001,abc\n']) };
		const seen: SurveyProgress[] = [];
		const { survey, problems } = await runSurvey(
			[parts[2], bad, parts[0], parts[1]],
			'en50160',
			230,
			(p) => seen.push(p),
			toProblem,
		);
		expect(survey).not.toBeNull();
		// the three parts by their stated start times; the file that states none comes last
		expect(survey!.files.map((f) => f.name)).toEqual(['part1.csv', 'part2.csv', 'part3.csv', 'aaa-notes.csv']);
		expect(survey!.files[1].startS).toBe(Date.parse(surveyFileStart(1)) / 1000);
		expect(survey!.files[3].problem).toBeTruthy();
		expect(problems.map((p) => p.source)).toEqual(['aaa-notes.csv']);
		expect(problems[0].line).toBe(3);
		// samples per channel of the readable parts: 3 x 240 s x 1000 S/s (the signal's length)
		expect(survey!.samples).toBe(SURVEY_FILES * SURVEY_FILE_S * SURVEY_RATE_HZ);
		expect(seen[seen.length - 1].filesDone).toBe(4);
		expect(seen.some((p) => p.filesDone === 1 && p.samplesDone > 0)).toBe(true);
		expect(survey!.result.dips.counts[2][1]).toBe(1);
	});

	it('a file with other voltage channels is refused as not the same recording, naming it; the rest is surveyed', async () => {
		const other = {
			name: 'other-board.csv',
			blob: new Blob([
				`Start time,${surveyFileStart(3)}\ntime (s),L1 (V)\n` +
					Array.from(
						{ length: 2000 },
						(_, i) => `${(i / 1000).toFixed(3)},${(325 * Math.sin(0.1 * Math.PI * i)).toFixed(2)}`,
					).join('\n') +
					'\n',
			]),
		};
		const { survey, problems } = await runSurvey([parts[0], other], 'en50160', 230, () => undefined, toProblem);
		expect(problems).toHaveLength(1);
		expect(problems[0].code).toBe('not-same-recording');
		expect(problems[0].source).toBe('other-board.csv');
		expect(problems[0].expected).toContain('channels of part1.csv');
		expect(survey!.files.map((f) => [f.name, !!f.problem])).toEqual([
			['part1.csv', false],
			['other-board.csv', true],
		]);
		// only part1's 240 s x 1000 S/s went into the survey
		expect(survey!.samples).toBe(SURVEY_FILE_S * SURVEY_RATE_HZ);
	});

	it('a file that states no start time beside files that do is refused by name (it cannot be placed on their clock); the rest is surveyed', async () => {
		const rows = Array.from({ length: 2000 }, (_, i) => `${(i / 1000).toFixed(3)},325,325,310`).join('\n');
		const unstated = { name: 'scope-export.csv', blob: new Blob([`time (s),L1 (V),L2 (V),L3 (V)\n${rows}\n`]) };
		const { survey, problems } = await runSurvey(
			[unstated, parts[1], parts[0]],
			'en50160',
			230,
			() => undefined,
			toProblem,
		);
		expect(problems.map((p) => [p.source, p.code])).toEqual([['scope-export.csv', 'not-same-recording']]);
		expect(problems[0].expected).toContain('start time');
		expect(survey!.files.map((f) => [f.name, !!f.problem])).toEqual([
			['part1.csv', false],
			['part2.csv', false],
			['scope-export.csv', true],
		]);
		expect(survey!.samples).toBe(2 * SURVEY_FILE_S * SURVEY_RATE_HZ);
	});

	it('streams a COMTRADE record (.cfg with its .dat): the demo incomer dip, phase B to 55 % for 6 cycles (sample-waves ground truth), lands in the 70-40 % x 10-200 ms cell', async () => {
		const dir = resolve(__dirname, '../../sample-waves');
		const file = (name: string) => ({ name, blob: new Blob([readFileSync(join(dir, name))]) });
		const { survey, problems } = await runSurvey(
			[file('incomer-dip.dat'), file('incomer-dip.cfg')],
			'en50160',
			undefined,
			() => undefined,
			toProblem,
		);
		expect(problems).toEqual([]);
		expect(survey!.input.clockAligned).toBe(true);
		// 3840 samples per channel in the record (sample-waves/ground-truth.json)
		expect(survey!.samples).toBe(3840);
		expect(survey!.result.dips.counts[2][0]).toBe(1);
		expect(survey!.result.dips.counts.flat().reduce((a, b) => a + b, 0)).toBe(1);
	});
});
