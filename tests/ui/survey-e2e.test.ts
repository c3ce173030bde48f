/**
 * The supply survey in headless Chromium against the built app (dist-ui/): three files of one recording,
 * written here from closed-form signals (tests/helpers/survey-recording.ts), picked through the survey's file
 * input in the wrong order; the dip table cell, a rule's measured value and the samples read are checked
 * against the numbers put into the signal, the progress against the files and samples, and the printed PDF
 * (text read back with poppler's pdftotext) for the rule table, the sources and the safety caution.
 * Screenshots (desktop 1400x900, phone 390x844) go to test-artifacts/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { hasChromium, launchChromium, startStaticServer } from './browser.js';
import {
	SURVEY_FILE_S,
	SURVEY_FILES,
	SURVEY_RATE_HZ,
	SURVEY_RMS_V,
	SURVEY_UNBALANCE_PERCENT,
	surveyFileCsv,
} from '../helpers/survey-recording.js';

const ROOT = resolve(__dirname, '../..');
const DIST = join(ROOT, 'dist-ui');
const ARTIFACTS = join(ROOT, 'test-artifacts');
const PDFTOTEXT = '/usr/bin/pdftotext';
if (!hasChromium) console.warn('SKIPPED survey browser test: /usr/bin/chromium is absent');
if (!existsSync(PDFTOTEXT)) console.warn('SKIPPED the survey PDF check: /usr/bin/pdftotext (poppler-utils) is absent');

describe.skipIf(!hasChromium)('the supply survey in Chromium', () => {
	let server: Awaited<ReturnType<typeof startStaticServer>>;
	let browser: Awaited<ReturnType<typeof launchChromium>>;
	let page: Page;
	let work: string;
	const files: string[] = [];
	const pageErrors: string[] = [];
	const progressTexts: string[] = [];

	beforeAll(async () => {
		if (!existsSync(join(DIST, 'index.html'))) {
			console.warn('dist-ui/ missing: building the UI for the browser tests (npm test builds it first)');
			execFileSync('npx', ['vite', 'build'], { cwd: ROOT, stdio: 'ignore' });
		}
		mkdirSync(ARTIFACTS, { recursive: true });
		work = mkdtempSync(join(tmpdir(), 'sinecheck-survey-'));
		for (let k = 0; k < SURVEY_FILES; k++) {
			const f = join(work, `tallowmere-joinery-part${k + 1}.csv`);
			writeFileSync(f, surveyFileCsv(k));
			files.push(f);
		}
		server = await startStaticServer(DIST);
		browser = await launchChromium({ width: 1400, height: 900 });
		page = await browser.context.newPage();
		page.on('pageerror', (e) => pageErrors.push(e.message));
		await page.exposeFunction('recordProgress', (t: string) => progressTexts.push(t));
		await page.goto(server.url);
		await page.click('[data-testid=survey-mode]');
		await page.waitForSelector('[data-testid=survey-setup]');
		// every progress text the page shows, as it shows it
		await page.evaluate(() => {
			const w = window as unknown as { recordProgress: (t: string) => void };
			new MutationObserver(() => {
				const p = document.querySelector('[data-testid=survey-progress]');
				if (p?.textContent) w.recordProgress(p.textContent);
			}).observe(document.body, { subtree: true, childList: true, characterData: true });
		});
		await page.setInputFiles('[data-testid=survey-file-input]', [files[2], files[0], files[1]]);
		await page.fill('[data-testid=survey-declared]', '230');
		await page.selectOption('[data-testid=survey-standard]', 'en50160');
		await page.click('[data-testid=survey-run]');
		await page.waitForSelector('[data-testid=survey-report]', { timeout: 120_000 });
	}, 180_000);

	afterAll(async () => {
		await browser?.close();
		await server?.close();
		if (work) rmSync(work, { recursive: true, force: true });
	});

	it('reads the three files as one recording in start-time order, showing files and samples as it goes', async () => {
		expect(pageErrors).toEqual([]);
		expect(progressTexts.some((t) => /record 1 of 3 \(tallowmere-joinery-part1\.csv\)/.test(t))).toBe(true);
		expect(progressTexts.some((t) => /record 3 of 3 \(tallowmere-joinery-part3\.csv\)/.test(t))).toBe(true);
		expect(progressTexts.some((t) => /[1-9][\d,]* samples per channel read/.test(t))).toBe(true);
		const order = await page.$$eval('[data-testid=survey-report] .files li', (els) => els.map((e) => e.textContent));
		expect(order.map((t) => /part(\d)/.exec(t ?? '')?.[1])).toEqual(['1', '2', '3']);
		// samples per channel: 3 files x 240 s x 1000 samples/s (the signal's own length)
		const header = await page.textContent('[data-testid=survey-report] header');
		const samples = Number(/\(([\d,]+) samples per channel\)/.exec(header ?? '')?.[1].replace(/,/g, ''));
		expect(samples).toBe(SURVEY_FILES * SURVEY_FILE_S * SURVEY_RATE_HZ);
	});

	it('puts the 300 ms dip of L1 to 60 % in the 70-40 % x 200-500 ms cell and nowhere else (EN 50160:2010 Table 5)', async () => {
		const rows = await page.$$eval('[data-testid=survey-dip-table] tbody th', (els) => els.map((e) => e.textContent));
		const cols = await page.$$eval('[data-testid=survey-dip-table] thead th', (els) => els.map((e) => e.textContent));
		expect(rows[2]).toBe('70 % > u ≥ 40 %');
		expect(cols[2]).toBe('> 200 ms to 500 ms');
		expect(await page.textContent('[data-testid=dip-2-1]')).toBe('1');
		const cells = await page.$$eval('[data-testid=survey-dip-table] td', (els) =>
			els.map((e) => Number(e.textContent)),
		);
		expect(cells.reduce((a, b) => a + b, 0)).toBe(1);
		expect(await page.textContent('[data-testid=survey-interruptions]')).toContain('0 short');
	});

	it("shows the unbalance rule's measured 95th percentile and L3's 10-minute mean at their closed-form values", async () => {
		const rows = await page.$$eval('[data-testid=survey-rules] tbody tr', (trs) =>
			trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? '')),
		);
		const unbalance = rows.find((r) => r[1].startsWith('Voltage unbalance'))!;
		expect(unbalance[0]).toContain('Meets');
		// |U2|/|U1| = 10/680 % for phases 230, 230, 220 V at balanced angles (symmetrical components, closed form)
		const shown = Number(/95th percentile ([\d.]+) %/.exec(unbalance[4])?.[1]);
		expect(Math.abs(shown - SURVEY_UNBALANCE_PERCENT)).toBeLessThanOrEqual(0.005 + 0.002);
		expect(unbalance[5]).toBe('EN 50160:2010, 4.2.4 (supply voltage unbalance)');
		// L3: 220 V RMS sine, the one complete 08:00-08:10 interval joined from the three files
		const l3 = rows.find((r) => r[1] === 'Supply voltage, 10-minute means' && r[2] === 'L3')!;
		const lowest = Number(/lowest ([\d.]+) V/.exec(l3[4])?.[1]);
		expect(Math.abs(lowest - SURVEY_RMS_V[2])).toBeLessThanOrEqual(0.05 + 0.1);
		expect(await page.textContent('[data-testid=survey-coverage]')).toMatch(/: 1 complete 10-minute value, /);
	});

	it('draws the trends with clock-time axes, and says nothing in option names', async () => {
		for (const id of ['chart-rms', 'chart-frequency', 'chart-unbalance'])
			expect(await page.locator(`[data-testid=${id}] canvas`).count(), id).toBeGreaterThan(0);
		// uPlot draws axes on the canvas; its legend (time and each phase) is text
		const labels = await page.$$eval('[data-testid=chart-rms] .u-label', (els) => els.map((e) => e.textContent));
		expect(labels).toEqual(['time (UTC)', 'L1', 'L2', 'L3']);
		const text = (await page.textContent('body')) ?? '';
		expect(text).not.toMatch(/--[a-z]/);
		await page.screenshot({ path: join(ARTIFACTS, 'ui-survey-desktop.png'), fullPage: true });
		await page.locator('[data-testid=survey-summary]').screenshot({ path: join(ARTIFACTS, 'ui-survey-summary.png') });
		await page.locator('[data-testid=chart-rms]').screenshot({ path: join(ARTIFACTS, 'ui-survey-chart.png') });
		await page.locator('[data-testid=survey-setup]').screenshot({ path: join(ARTIFACTS, 'ui-survey-setup.png') });
		await page.setViewportSize({ width: 390, height: 844 });
		await page.waitForTimeout(300);
		await page.screenshot({ path: join(ARTIFACTS, 'ui-survey-phone.png'), fullPage: true });
		await page.evaluate(() => window.scrollTo(0, 0));
		await page.screenshot({ path: join(ARTIFACTS, 'ui-survey-phone-top.png') });
		// nothing wider than the phone's screen (a chart drawn at the desktop's width would be)
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		await page
			.locator('[data-testid=survey-summary]')
			.screenshot({ path: join(ARTIFACTS, 'ui-survey-phone-summary.png') });
		await page.locator('[data-testid=survey-rules]').screenshot({ path: join(ARTIFACTS, 'ui-survey-phone-rules.png') });
		await page.locator('[data-testid=chart-rms]').screenshot({ path: join(ARTIFACTS, 'ui-survey-phone-chart.png') });
		await page.setViewportSize({ width: 1400, height: 900 });
	});

	it.skipIf(!existsSync(PDFTOTEXT))(
		'prints the survey on portrait A4 and Letter with the rule table, the dip table, the sources and the safety caution',
		async () => {
			for (const format of ['A4', 'Letter'] as const) {
				const pdf = join(work, `survey-${format}.pdf`);
				await page.pdf({ path: pdf, format, printBackground: true, preferCSSPageSize: false });
				const flat = execFileSync(PDFTOTEXT, ['-layout', pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
				if (format === 'A4') {
					writeFileSync(join(ARTIFACTS, 'survey-A4.txt'), flat);
					copyFileSync(pdf, join(ARTIFACTS, 'survey-A4.pdf'));
				}
				for (const words of [
					'Each rule, as measured',
					'Supply voltage, 10-minute means',
					'EN 50160:2010, 4.2.2 (supply voltage variations)',
					'Voltage unbalance',
					'70 % > u ≥ 40 %',
					'EN 50160:2010, Table 5 (classification of dips)',
					'Safety first',
				])
					expect(flat, `${format}: ${words}`).toContain(words);
				expect(flat).not.toContain('Choose files');
				const info = execFileSync('/usr/bin/pdfinfo', [pdf], { encoding: 'utf8' });
				const [w, h] = (/Page size:\s+([\d.]+) x ([\d.]+)/.exec(info) ?? []).slice(1).map(Number);
				expect(h, `${format} portrait`).toBeGreaterThan(w);
			}
		},
	);
	// last: choosing files again clears the survey the other checks read
	it('a chosen folder gives its recordings and leaves other files out, saying how many', async () => {
		const folder = join(work, 'logger');
		mkdirSync(folder, { recursive: true });
		for (const f of files) copyFileSync(f, join(folder, f.replace(/^.*[\\/]/, '')));
		writeFileSync(join(folder, 'site-notes.md'), 'Tallowmere Joinery, incomer, week 19\n');
		await page.setInputFiles('[data-testid=survey-folder-input]', folder);
		expect(await page.textContent('[data-testid=survey-chosen]')).toContain(
			'3 files chosen (1 other file in the folder left out)',
		);
		// new files chosen: the survey of the old ones is no longer shown
		expect(await page.locator('[data-testid=survey-report]').count()).toBe(0);
	});
});
