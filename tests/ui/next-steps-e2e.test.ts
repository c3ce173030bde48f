/**
 * End to end in headless Chromium against the built app (dist-ui/): site values typed under the findings
 * re-run the analysis, and the next steps on screen say what lib/report gives for the same file and site
 * values (screenshot in test-artifacts/). Skips with a message when /usr/bin/chromium is absent.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { hasChromium, launchChromium, startStaticServer } from './browser.js';

const ROOT = resolve(__dirname, '../..');
const DIST = join(ROOT, 'dist-ui');
if (!hasChromium) console.warn('SKIPPED browser tests: /usr/bin/chromium is absent (apt-get install -y chromium)');

async function settled(page: Page): Promise<void> {
	await page.waitForFunction(
		() => document.querySelector('[data-testid=app]')?.getAttribute('data-busy') === 'no',
		null,
		{ timeout: 60_000 },
	);
}

describe.skipIf(!hasChromium)('next steps in Chromium', () => {
	let server: Awaited<ReturnType<typeof startStaticServer>>;
	let browser: Awaited<ReturnType<typeof launchChromium>>;
	let page: Page;

	beforeAll(async () => {
		if (!existsSync(join(DIST, 'index.html'))) {
			console.warn('dist-ui/ missing: building the UI for the browser tests (npm test builds it first)');
			execFileSync('npx', ['vite', 'build'], { cwd: ROOT, stdio: 'ignore' });
		}
		server = await startStaticServer(DIST);
		browser = await launchChromium({ width: 1400, height: 1000 });
		page = await browser.context.newPage();
		await page.goto(server.url);
		await page.waitForSelector('[data-testid=capture-title]', { timeout: 60_000 });
		await settled(page);
	}, 180_000);

	afterAll(async () => {
		await browser?.close();
		await server?.close();
	});

	it('typing a target power factor and a transformer under the findings shows the power-factor step lib/report gives for the same file and values', async () => {
		// the next steps sit one click below the findings (the views' tabs stay on the first screen)
		await page.click('[data-testid=next-steps-details] > summary');
		await page.fill('[data-testid=site-targetPowerFactor]', '0.95');
		await page.press('[data-testid=site-targetPowerFactor]', 'Tab');
		await settled(page);
		await page.fill('[data-testid=site-transformerKva]', '250');
		await page.press('[data-testid=site-transformerKva]', 'Tab');
		await settled(page);
		await page.fill('[data-testid=site-transformerImpedancePercent]', '4');
		await page.press('[data-testid=site-transformerImpedancePercent]', 'Tab');
		await settled(page);
		const title = (await page.textContent('[data-testid=capture-title]'))!.trim();
		const capture = openCaptures([
			{ name: title, bytes: new Uint8Array(readFileSync(join(ROOT, 'sample-waves', title))) },
		]).captures[0];
		const pf = analyseCapture(capture, {
			site: { targetPowerFactor: 0.95, transformerKva: 250, transformerImpedancePercent: 4 },
		}).nextSteps!.steps[0];
		const shown = (await page.textContent('[data-testid=step-power-factor-correction]'))!;
		expect(pf.conclusions.length).toBeGreaterThan(0);
		for (const c of pf.conclusions) expect(shown).toContain(c);
		expect(shown).not.toMatch(/Needs:/);
		expect(await page.textContent('[data-testid=next-steps]')).toContain(pf.caution);
		mkdirSync(join(ROOT, 'test-artifacts'), { recursive: true });
		await (await page.$('[data-testid=next-steps]'))!.screenshot({
			path: join(ROOT, 'test-artifacts', 'ui-next-steps.png'),
		});
	}, 120_000);
});
