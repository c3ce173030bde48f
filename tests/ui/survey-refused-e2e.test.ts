/**
 * The supply survey in headless Chromium against the built app (dist-ui/) when one picked file does not
 * belong to the recording: two files of the closed-form recording (tests/helpers/survey-recording.ts) and a
 * scope export that states no start time. The survey is made from the two files (their samples counted), and
 * the scope export is listed as not used, saying why in words, and in the problem list. Screenshot:
 * test-artifacts/ui-survey-refused.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { hasChromium, launchChromium, startStaticServer } from './browser.js';
import { SURVEY_FILE_S, SURVEY_RATE_HZ, surveyFileCsv } from '../helpers/survey-recording.js';

const ROOT = resolve(__dirname, '../..');
const DIST = join(ROOT, 'dist-ui');
const ARTIFACTS = join(ROOT, 'test-artifacts');
if (!hasChromium) console.warn('SKIPPED survey refused-file browser test: /usr/bin/chromium is absent');

describe.skipIf(!hasChromium)('the supply survey in Chromium with a file of no recording', () => {
	let server: Awaited<ReturnType<typeof startStaticServer>>;
	let browser: Awaited<ReturnType<typeof launchChromium>>;
	let page: Page;
	let work: string;
	const pageErrors: string[] = [];

	beforeAll(async () => {
		if (!existsSync(join(DIST, 'index.html'))) execFileSync('npx', ['vite', 'build'], { cwd: ROOT, stdio: 'ignore' });
		mkdirSync(ARTIFACTS, { recursive: true });
		work = mkdtempSync(join(tmpdir(), 'sinecheck-survey-refused-'));
		const files = [0, 1].map((k) => {
			const f = join(work, `tallowmere-joinery-part${k + 1}.csv`);
			writeFileSync(f, surveyFileCsv(k));
			return f;
		});
		const scope = join(work, 'scope-export.csv');
		const rows = Array.from({ length: 2000 }, (_, i) => `${(i / 1000).toFixed(3)},325,325,310`).join('\n');
		writeFileSync(scope, `time (s),L1 (V),L2 (V),L3 (V)\n${rows}\n`);
		server = await startStaticServer(DIST);
		browser = await launchChromium({ width: 1400, height: 900 });
		page = await browser.context.newPage();
		page.on('pageerror', (e) => pageErrors.push(e.message));
		await page.goto(server.url);
		await page.click('[data-testid=survey-mode]');
		await page.waitForSelector('[data-testid=survey-setup]');
		await page.setInputFiles('[data-testid=survey-file-input]', [scope, files[1], files[0]]);
		await page.fill('[data-testid=survey-declared]', '230');
		await page.click('[data-testid=survey-run]');
		await page.waitForSelector('[data-testid=survey-report]', { timeout: 120_000 });
	}, 180_000);

	afterAll(async () => {
		await browser?.close();
		await server?.close();
		if (work) rmSync(work, { recursive: true, force: true });
	});

	it('surveys the two files of the recording and says, in words, why the scope export is not used', async () => {
		expect(pageErrors).toEqual([]);
		const lines = await page.$$eval('[data-testid=survey-report] .files li', (els) =>
			els.map((e) => e.textContent ?? ''),
		);
		expect(lines).toHaveLength(3);
		expect(lines[0]).toContain('part1');
		expect(lines[1]).toContain('part2');
		expect(lines[2]).toMatch(/scope-export\.csv: not used: expected a start time/);
		expect(lines[2]).not.toMatch(/not-same-recording|:0:0/);
		expect(await page.textContent('[data-testid=survey-problems]')).toContain('scope-export.csv');
		// samples per channel: 2 files x 240 s x 1000 samples/s (the signal's own length)
		const header = await page.textContent('[data-testid=survey-report] header');
		expect(Number(/\(([\d,]+) samples per channel\)/.exec(header ?? '')?.[1].replace(/,/g, ''))).toBe(
			2 * SURVEY_FILE_S * SURVEY_RATE_HZ,
		);
		await page
			.locator('[data-testid=survey-problems]')
			.screenshot({ path: join(ARTIFACTS, 'ui-survey-refused-problems.png') });
		await page
			.locator('[data-testid=survey-report] .files')
			.screenshot({ path: join(ARTIFACTS, 'ui-survey-refused.png') });
	});
});
