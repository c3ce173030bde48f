/**
 * End to end in headless Chromium against the built app (dist-ui/, served by a tiny static server):
 * the demo's figures on screen equal lib's for that file, a fixture opened through the file input, the
 * reference switched, the JSON download equal to the CLI's JSON, a corrupt file shown in place.
 * Screenshots go to test-artifacts/. Skips with a message when /usr/bin/chromium is absent.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { analyseTrend } from '../../lib/trend/analyse-capture.js';
import { hasChromium, launchChromium, startStaticServer } from './browser.js';
import { sineSamples } from '../helpers/synth.js';

const ROOT = resolve(__dirname, '../..');
const DIST = join(ROOT, 'dist-ui');
const CLI = join(ROOT, 'dist/bin/sinecheck.js');
const ARTIFACTS = join(ROOT, 'test-artifacts');
if (!hasChromium) console.warn('SKIPPED browser tests: /usr/bin/chromium is absent (apt-get install -y chromium)');

/** A displayed figure "5.120 mA" as its value in SI units and the size of its last digit. */
function parseShown(text: string): { value: number; step: number } {
	const m = /^(-?[\d,]*\.?\d*)\s*([µmkM]?)(V|A|Hz|W|VA|var|%|°)?/.exec(text.trim().replace('−', '-'));
	if (!m) throw new Error(`not a number: ${text}`);
	const digits = m[1].replace(/,/g, '');
	const scale = { '': 1, µ: 1e-6, m: 1e-3, k: 1e3, M: 1e6 }[m[2] as '' | 'µ' | 'm' | 'k' | 'M'];
	const decimals = digits.includes('.') ? digits.length - digits.indexOf('.') - 1 : 0;
	return { value: Number(digits) * scale, step: 10 ** -decimals * scale };
}

function fixtureCsv(): string {
	const fs = 10_000;
	const u = sineSamples({ amplitude: 325.27, frequencyHz: 50, sampleRateHz: fs, cycles: 25 });
	const i = sineSamples({ amplitude: 14.14, frequencyHz: 50, sampleRateHz: fs, cycles: 25, phaseDeg: -30 });
	const rows = ['t (ms);U1 (V);I1 (A)'];
	// decimal comma and semicolons, as a European scope exports them
	for (let k = 0; k < u.length; k++)
		rows.push(`${((1000 * k) / fs).toFixed(3)};${u[k].toFixed(3)};${i[k].toFixed(4)}`.replace(/\./g, ','));
	return rows.join('\r\n') + '\r\n';
}

/** Collects where two JSON values differ: structure exactly, numbers to a relative 1e-9 (absolute 1e-12), angles to 1e-6°. */
function sameJson(a: unknown, b: unknown, at: string, out: string[]): void {
	if (typeof a === 'number' && typeof b === 'number') {
		// angles to a micro-degree (phases of noise-level harmonics near 0° carry no relative precision)
		const ok = at.endsWith('Deg')
			? Math.abs(((a - b + 540) % 360) - 180) <= 1e-6
			: Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b)) + 1e-12;
		if (!ok) out.push(`${at}: ${a} vs ${b}`);
		return;
	}
	if (Array.isArray(a) && Array.isArray(b)) {
		if (a.length !== b.length) out.push(`${at}: length ${a.length} vs ${b.length}`);
		else a.forEach((x, i) => sameJson(x, (b as unknown[])[i], `${at}[${i}]`, out));
		return;
	}
	if (a && b && typeof a === 'object' && typeof b === 'object') {
		if (at.endsWith('.worstCycle')) {
			// every cycle of a pure sine ties for "highest RMS/peak": which one wins is decided by the last bit, so
			// only the values are compared, not the index or start time of the winning cycle
			a = Object.fromEntries(Object.entries(a).filter(([k]) => !/(Cycle|StartS)$/.test(k)));
			b = Object.fromEntries(Object.entries(b as object).filter(([k]) => !/(Cycle|StartS)$/.test(k)));
		}
		const ka = Object.keys(a as object).sort();
		const kb = Object.keys(b as object).sort();
		if (ka.join() !== kb.join()) out.push(`${at}: keys ${ka.join()} vs ${kb.join()}`);
		else
			for (const k of ka)
				sameJson((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${at}.${k}`, out);
		return;
	}
	if (a !== b) out.push(`${at}: ${JSON.stringify(a)} vs ${JSON.stringify(b)}`);
}

async function settled(page: Page): Promise<void> {
	await page.waitForFunction(
		() =>
			document.querySelector('[data-testid=app]')?.getAttribute('data-busy') === 'no' &&
			!document.body.textContent?.includes('reading…'),
		null,
		{ timeout: 60_000 },
	);
}

describe.skipIf(!hasChromium)('the analyser in Chromium', () => {
	let server: Awaited<ReturnType<typeof startStaticServer>>;
	let browser: Awaited<ReturnType<typeof launchChromium>>;
	let page: Page;
	let work: string;
	const requests: string[] = [];
	const pageErrors: string[] = [];

	beforeAll(async () => {
		if (!existsSync(join(DIST, 'index.html'))) {
			console.warn('dist-ui/ missing: building the UI for the browser tests (npm test builds it first)');
			execFileSync('npx', ['vite', 'build'], { cwd: ROOT, stdio: 'ignore' });
		}
		mkdirSync(ARTIFACTS, { recursive: true });
		work = mkdtempSync(join(tmpdir(), 'sinecheck-e2e-'));
		server = await startStaticServer(DIST);
		browser = await launchChromium({ width: 1400, height: 1000 });
		page = await browser.context.newPage();
		page.on('request', (r) => requests.push(r.url()));
		page.on('pageerror', (e) => pageErrors.push(e.message));
		await page.goto(server.url);
		await page.waitForSelector('[data-testid=capture-title]', { timeout: 60_000 });
		await settled(page);
	});

	afterAll(async () => {
		await browser?.close();
		await server?.close();
		if (work) rmSync(work, { recursive: true, force: true });
	});

	it('opens on the demo captures and shows the figures lib/report computes for the same file', async () => {
		const title = (await page.textContent('[data-testid=capture-title]'))!.trim();
		const path = join(ROOT, 'sample-waves', title);
		expect(existsSync(path)).toBe(true);
		const capture = openCaptures([{ name: title, bytes: new Uint8Array(readFileSync(path)) }]).captures[0];
		const report = analyseCapture(capture, { limits: 'en50160' });
		expect(Number(await page.textContent('[data-testid=cycles]'))).toBe(report.cyclesAnalysed);
		const checks: [string, (c: (typeof report.channels)[number]) => number][] = [
			['rms', (c) => c.rms],
			['rectifiedMean', (c) => c.rectifiedMean],
			['peak', (c) => c.peak],
			['peakNegative', (c) => c.peakNegative],
			['crestFactor', (c) => c.crestFactor],
			['formFactor', (c) => c.formFactor],
			['thdPercent', (c) => c.thdPercent],
			['averageReading', (c) => c.averageResponding.reading],
			['frequencyHz', (c) => c.frequencyHz],
		];
		let compared = 0;
		for (const ch of report.channels) {
			for (const [key, get] of checks) {
				const shown = parseShown((await page.textContent(`[data-testid="fig-${ch.name}-${key}"]`))!);
				// equal to lib's value within half a unit of the last digit shown
				expect(Math.abs(shown.value - get(ch)), `${ch.name} ${key}`).toBeLessThanOrEqual(shown.step / 2 + 1e-12);
				compared++;
			}
		}
		expect(compared).toBe(report.channels.length * checks.length);
		await page.screenshot({ path: join(ARTIFACTS, 'ui-demo-waves.png'), fullPage: true });
	});

	it('shows the harmonics, phasors and report of the demo', async () => {
		for (const tab of ['harmonics', 'phasors', 'check', 'report']) {
			await page.click(`#tab-${tab}`);
			await page.waitForTimeout(300);
			await page.locator('#panel').screenshot({ path: join(ARTIFACTS, `ui-demo-${tab}.png`) });
		}
		expect(await page.textContent('#panel')).toContain('Definitions and formulas');
		await page.emulateMedia({ media: 'print' });
		await page.screenshot({ path: join(ARTIFACTS, 'ui-report-print.png'), fullPage: true });
		await page.emulateMedia({ media: 'screen' });
		await page.click('#tab-waves');
	});

	it('shows the dip of the incomer demo in the trends, as lib/trend finds it, and its waves on request', async () => {
		await page.click('.pick >> text=incomer-dip.cfg');
		await page.click('#tab-trends');
		await page.waitForSelector('[data-testid=event-0]');
		const files = ['incomer-dip.cfg', 'incomer-dip.dat'].map((name) => ({
			name,
			bytes: new Uint8Array(readFileSync(join(ROOT, 'sample-waves', name))),
		}));
		const trend = analyseTrend(openCaptures(files).captures[0]);
		expect(await page.$$eval('[data-testid^=event-]', (els) => els.length)).toBe(trend.events.length);
		const shownStart = parseShown(
			(await page.textContent('[data-testid=event-0] td:nth-child(3)'))!.replace(' ms', ''),
		);
		expect(Math.abs(shownStart.value / 1000 - trend.events[0].startS)).toBeLessThanOrEqual(
			shownStart.step / 2000 + 1e-12,
		);
		await page.locator('#panel').screenshot({ path: join(ARTIFACTS, 'ui-trends-incomer-dip.png') });
		await page.click('[data-testid=event-0] button');
		await page.waitForSelector('#tab-waves[aria-selected=true]');
		await page.locator('#panel').screenshot({ path: join(ARTIFACTS, 'ui-event-waves.png') });
	});

	it('opens a fixture through the file input, switches the reference, and the JSON download equals the CLI JSON', async () => {
		const file = join(work, 'fixture.csv');
		writeFileSync(file, fixtureCsv());
		await page.setInputFiles('[data-testid=file-input]', file);
		await page.waitForFunction(
			() => document.querySelector('[data-testid=capture-title]')?.textContent?.trim() === 'fixture.csv',
			null,
			{ timeout: 30_000 },
		);
		await settled(page);
		// closed form: 30° at 50 Hz is 30/360 × 20 ms = 1.67 ms
		expect((await page.textContent('[data-testid=lag-sentence]'))!.trim()).toBe('I1 lags U1 by 30.0°, 1.67 ms');
		await page.screenshot({ path: join(ARTIFACTS, 'ui-fixture-waves.png') });

		await page.selectOption('[data-testid=ref-select]', 'I1');
		await page.waitForFunction(
			() => document.querySelector('[data-testid=lag-sentence]')?.textContent?.includes('leads I1'),
			null,
			{ timeout: 30_000 },
		);
		expect((await page.textContent('[data-testid=lag-sentence]'))!.trim()).toBe('U1 leads I1 by 30.0°, 1.67 ms');

		await page.click('#tab-report');
		const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=download-json]')]);
		const saved = join(work, 'download.json');
		await download.saveAs(saved);
		const fromUi = JSON.parse(readFileSync(saved, 'utf8'));
		expect(fromUi.referenceChannel).toBe('I1');
		if (!existsSync(CLI)) {
			console.warn('SKIPPED CLI comparison: dist/bin/sinecheck.js is not built (npm test builds it)');
			return;
		}
		const cli = spawnSync(
			process.execPath,
			[CLI, 'analyse', '--json', '--quiet', '--ref', 'I1', '--limits', 'en50160', 'fixture.csv'],
			{ cwd: work, encoding: 'utf8' },
		);
		expect(cli.stdout.trim().length, cli.stderr).toBeGreaterThan(0);
		// one file: one JSON document. Same keys, strings, nulls and array lengths; numbers equal to 1 part in
		// 10^9, angles to 1e-6° (Chromium's and Node's V8 builds differ in the last bits of Math.sin/cos/atan2)
		const diffs: string[] = [];
		sameJson(fromUi, JSON.parse(cli.stdout), '$', diffs);
		expect(diffs).toEqual([]);
		await page.click('#tab-waves');
	});

	it("shows a corrupt file's error in place with line and column, and the other captures stay open", async () => {
		const bad = join(work, 'broken.csv');
		writeFileSync(bad, 't (s),U1 (V)\n0,1\n0.0001,2\n0.0002,12x\n0.0003,4\n0.0004,5\n');
		await page.setInputFiles('[data-testid=file-input]', bad);
		await page.waitForSelector('[data-testid=import-problem]', { timeout: 30_000 });
		const text = (await page.textContent('[data-testid=import-problem]'))!;
		expect(text).toContain('broken.csv');
		expect(text).toContain('line 4, column 8'); // "12x" starts at character 8 of "0.0002,12x"
		await page.screenshot({ path: join(ARTIFACTS, 'ui-corrupt-file.png'), fullPage: true });
		const ready = await page.$$eval(
			'.pick',
			(els) => els.filter((e) => !e.textContent?.includes('could not be read')).length,
		);
		expect(ready).toBeGreaterThan(1);
	});

	it('keyboard: the tabs move with the arrow keys and the wave plot zooms with + and −', async () => {
		await page.click('.pick >> text=fixture.csv');
		await page.waitForSelector('.plot');
		await page.focus('#tab-waves');
		await page.keyboard.press('ArrowRight');
		expect(await page.getAttribute('#tab-harmonics', 'aria-selected')).toBe('true');
		await page.keyboard.press('ArrowLeft');
		const before = await page.textContent('[data-testid=wave-span]');
		await page.focus('.plot');
		await page.keyboard.press('-');
		expect(await page.textContent('[data-testid=wave-span]')).not.toBe(before);
	});

	it('works offline: every request stayed on the local server (no CDN, no fonts) and no script error was raised', () => {
		const foreign = requests.filter(
			(u) => !u.startsWith(server.url) && !u.startsWith('data:') && !u.startsWith('blob:'),
		);
		expect(foreign).toEqual([]);
		expect(pageErrors).toEqual([]);
	});
});
