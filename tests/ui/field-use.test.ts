/**
 * The analyser in the field, in headless Chromium against the built app (dist-ui/): positions at a desktop
 * (1400 x 900) and a phone (390 x 844) viewport, no sideways scrolling, the skip link and tab keys, the
 * printed report (rendered to PDF, its text read back with poppler's pdftotext and compared with the figures
 * on screen), the wave plot's tools (legend toggles, wheel, read-out, two cursors on a known sine), the
 * unreadable-cell gaps and the settings remembered per file. Screenshots go to test-artifacts/.
 * Skips with a message when /usr/bin/chromium (or, for the PDF, /usr/bin/pdftotext) is absent.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { hasChromium, launchChromium, startStaticServer } from './browser.js';

const ROOT = resolve(__dirname, '../..');
const DIST = join(ROOT, 'dist-ui');
const ARTIFACTS = join(ROOT, 'test-artifacts');
const PDFTOTEXT = '/usr/bin/pdftotext';
if (!hasChromium) console.warn('SKIPPED field-use browser tests: /usr/bin/chromium is absent');
if (!existsSync(PDFTOTEXT)) console.warn('SKIPPED the PDF text check: /usr/bin/pdftotext (poppler-utils) is absent');

const DEMOS = [
	'board-unbalance.csv',
	'feeder-rectifiers.csv',
	'generator-60hz.cfg',
	'incomer-dip.cfg',
	'pump-drive.csv',
	'spindle-clamp.wav',
];
const AMPLITUDE_V = 325.27;
const FREQUENCY_HZ = 50;
const RATE_HZ = 10_000;

/** A 50 Hz sine of 325.27 V peak (230.0 V RMS) and a current lagging 30°, 1 s at 10 kS/s; optionally one text cell. */
function sineCsv(badLine?: number): string {
	const rows = ['t (s),U1 (V),I1 (A)'];
	for (let k = 0; k < RATE_HZ; k++) {
		const t = k / RATE_HZ;
		const u = (AMPLITUDE_V * Math.sin(2 * Math.PI * FREQUENCY_HZ * t)).toFixed(3);
		const i = (14.14 * Math.sin(2 * Math.PI * FREQUENCY_HZ * t - Math.PI / 6)).toFixed(4);
		rows.push(rows.length + 1 === badLine ? `${t.toFixed(4)},OVL,${i}` : `${t.toFixed(4)},${u},${i}`);
	}
	return rows.join('\n') + '\n';
}

async function settled(page: Page): Promise<void> {
	await page.waitForFunction(
		() =>
			document.querySelector('[data-testid=app]')?.getAttribute('data-busy') === 'no' &&
			!document.body.textContent?.includes('reading…'),
		null,
		{ timeout: 120_000 },
	);
}

/** Widest element sticking out of the viewport sideways (0 when nothing does). */
async function overflowPx(page: Page): Promise<number> {
	return page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
}

async function openDemo(page: Page, name: string): Promise<void> {
	const phone = await page.evaluate(() => window.innerWidth < 900);
	if (phone && (await page.$('.phone-pick select'))) await page.selectOption('.phone-pick select', { label: name });
	else await page.click(`.pick >> text=${name}`);
	await page.waitForFunction(
		(n) => document.querySelector('[data-testid=capture-title]')?.textContent?.trim() === n,
		name,
	);
	await page.evaluate(() => window.scrollTo(0, 0));
}

describe.skipIf(!hasChromium)('the analyser for field use, in Chromium', () => {
	let server: Awaited<ReturnType<typeof startStaticServer>>;
	let work: string;
	const pageErrors: string[] = [];

	beforeAll(async () => {
		if (!existsSync(join(DIST, 'index.html'))) {
			console.warn('dist-ui/ missing: building the UI for the browser tests (npm test builds it first)');
			execFileSync('npx', ['vite', 'build'], { cwd: ROOT, stdio: 'ignore' });
		}
		mkdirSync(ARTIFACTS, { recursive: true });
		work = mkdtempSync(join(tmpdir(), 'sinecheck-field-'));
		server = await startStaticServer(DIST);
	});

	afterAll(async () => {
		await server?.close();
		if (work) rmSync(work, { recursive: true, force: true });
	});

	async function session(viewport: { width: number; height: number }) {
		const browser = await launchChromium(viewport);
		const page = await browser.context.newPage();
		page.on('pageerror', (e) => pageErrors.push(e.message));
		await page.goto(server.url);
		await page.waitForSelector('[data-testid=capture-title]', { timeout: 60_000 });
		await settled(page);
		return { browser, page };
	}

	it("desktop 1400 x 900: every demo has its one-line description and the views' tabs inside the first screen; nothing scrolls sideways", async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			for (const name of DEMOS) {
				await openDemo(page, name);
				const box = (await page.locator('[data-testid=tabs]').boundingBox())!;
				expect(box.y + box.height, `${name}: bottom of the tabs`).toBeLessThanOrEqual(900);
				expect((await page.textContent('[data-testid=capture-description]'))!.length, name).toBeGreaterThan(20);
				expect(await overflowPx(page), name).toBe(0);
			}
			await openDemo(page, 'pump-drive.csv');
			await page.screenshot({ path: join(ARTIFACTS, 'field-desktop-pump-drive.png') });
			// the compact summary: every finding one click away
			await page.click('[data-testid=findings-all] summary');
			expect(await page.$$eval('[data-testid=findings-all] li', (els) => els.length)).toBeGreaterThan(5);
			await page.click('[data-testid=findings-all] summary');
		} finally {
			await browser.close();
		}
	});

	it('keyboard: the first Tab reaches the skip link, which lands on the selected tab; Home and End go to the first and last tab', async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			await page.keyboard.press('Tab');
			expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('skip-link');
			await page.keyboard.press('Enter');
			expect(await page.evaluate(() => document.activeElement?.id)).toBe('tab-waves');
			await page.keyboard.press('End');
			expect(await page.getAttribute('#tab-report', 'aria-selected')).toBe('true');
			expect(await page.evaluate(() => document.activeElement?.id)).toBe('tab-report');
			await page.keyboard.press('Home');
			expect(await page.getAttribute('#tab-waves', 'aria-selected')).toBe('true');
		} finally {
			await browser.close();
		}
	});

	it('phone 390 x 844: one column, no sideways scroll on any view, and every table fits or scrolls inside its own box', async () => {
		const { browser, page } = await session({ width: 390, height: 844 });
		try {
			for (const name of ['pump-drive.csv', 'board-unbalance.csv']) {
				await openDemo(page, name);
				const main = (await page.locator('main').boundingBox())!;
				expect(main.x + main.width, 'main column inside the screen').toBeLessThanOrEqual(390);
				for (const tab of ['waves', 'harmonics', 'phasors', 'trends', 'check', 'report']) {
					await page.click(`#tab-${tab}`);
					await page.waitForTimeout(250);
					expect(await overflowPx(page), `${name} ${tab}`).toBe(0);
					const wide = await page.$$eval('#panel table', (tables) =>
						tables
							.filter(
								(t) =>
									t.getBoundingClientRect().right > window.innerWidth + 0.5 || t.getBoundingClientRect().left < -0.5,
							)
							.filter((t) => {
								// allowed only inside a box that scrolls sideways by itself and fits the screen
								const box = t.closest('.scroll-x');
								return (
									!box ||
									box.getBoundingClientRect().right > window.innerWidth + 0.5 ||
									getComputedStyle(box).overflowX !== 'auto'
								);
							})
							.map((t) => t.getAttribute('aria-label') ?? t.className),
					);
					expect(wide, `${name} ${tab}: tables wider than the screen outside a scroll box`).toEqual([]);
					if (name === 'pump-drive.csv')
						await page.screenshot({ path: join(ARTIFACTS, `field-phone-${tab}.png`), fullPage: tab === 'waves' });
				}
				await page.click('#tab-waves');
			}
		} finally {
			await browser.close();
		}
	});

	it.skipIf(!existsSync(PDFTOTEXT))(
		"prints an A4 and a Letter portrait report whose text holds every channel's figures as shown on screen, with nothing wider than the page",
		async () => {
			const { browser, page } = await session({ width: 1400, height: 900 });
			try {
				await openDemo(page, 'pump-drive.csv');
				const keys = ['rms', 'peak', 'crestFactor', 'thdPercent', 'frequencyHz'];
				const shown = await page.$$eval('[data-testid^=fig-]', (els) =>
					els.map((e) => [e.getAttribute('data-testid')!, e.textContent!.trim()] as const),
				);
				const channels = [...new Set(shown.map(([id]) => id.split('-')[1]))];
				expect(channels.length).toBe(6);
				await page.click('#tab-report');
				await page.emulateMedia({ media: 'print' });
				// on paper no element is wider than its box (a clipped label or a cut table column would be)
				const cut = await page.$$eval('.report *', (els) =>
					els
						.filter(
							(e) =>
								!e.classList.contains('visually-hidden') &&
								e.scrollWidth > e.clientWidth + 1 &&
								e.clientWidth > 0 &&
								getComputedStyle(e).overflowX !== 'visible',
						)
						.map((e) => `${e.tagName}.${e.className}`),
				);
				expect(cut).toEqual([]);
				for (const format of ['A4', 'Letter'] as const) {
					const pdf = join(work, `report-${format}.pdf`);
					await page.pdf({ path: pdf, format, printBackground: true, preferCSSPageSize: false });
					const text = execFileSync(PDFTOTEXT, ['-layout', pdf, '-'], { encoding: 'utf8' });
					const info = execFileSync('/usr/bin/pdfinfo', [pdf], { encoding: 'utf8' });
					const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
					const [w, h] = (/Page size:\s+([\d.]+) x ([\d.]+)/.exec(info) ?? []).slice(1).map(Number);
					expect(h, `${format} portrait`).toBeGreaterThan(w);
					expect(pages, `${format} pages`).toBeGreaterThan(1);
					const flat = text.replace(/\s+/g, ' ');
					for (const ch of channels) {
						for (const key of keys) {
							const value = shown.find(([id]) => id === `fig-${ch}-${key}`)![1];
							expect(flat, `${format}: ${ch} ${key} "${value}"`).toContain(value);
						}
					}
					if (format === 'A4') writeFileSync(join(ARTIFACTS, 'field-report-A4.txt'), text);
				}
				await page.screenshot({ path: join(ARTIFACTS, 'field-report-print.png'), fullPage: true });
				await page.emulateMedia({ media: 'screen' });
			} finally {
				await browser.close();
			}
		},
	);

	it('wave plot: a legend entry hides its channel, "Later" moves the read-out, the wheel scrolls the page unless armed by a click or Ctrl', async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			await openDemo(page, 'pump-drive.csv');
			const inkOf = (hex: string) =>
				page.evaluate(
					(rgb) => {
						const c = document.querySelector('#wave-chart canvas') as HTMLCanvasElement;
						const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
						let n = 0;
						for (let i = 0; i < d.length; i += 4)
							if (
								Math.abs(d[i] - rgb[0]) + Math.abs(d[i + 1] - rgb[1]) + Math.abs(d[i + 2] - rgb[2]) < 40 &&
								d[i + 3] > 200
							)
								n++;
						return n;
					},
					[1, 3, 5].map((k) => parseInt(hex.slice(k, k + 2), 16)),
				);
			const u2 = await page.$eval('[data-testid="legend-U2"] line', (l) => l.getAttribute('stroke')!);
			const before = await inkOf(u2);
			await page.click('[data-testid="legend-U2"]');
			expect(await page.getAttribute('[data-testid="legend-U2"]', 'aria-pressed')).toBe('false');
			const after = await inkOf(u2);
			expect(before).toBeGreaterThan(500);
			expect(after, 'U2 trace pixels after hiding').toBeLessThan(before * 0.3);
			await page.click('[data-testid="legend-U2"]');

			const span0 = await page.textContent('[data-testid=wave-span]');
			await page.click('text=Later ▶');
			const span1 = await page.textContent('[data-testid=wave-span]');
			expect(span1).not.toBe(span0);

			const plot = (await page.locator('#wave-chart .u-over').boundingBox())!;
			await page.mouse.move(plot.x + plot.width / 2, plot.y + plot.height / 2);
			const y0 = await page.evaluate(() => window.scrollY);
			await page.mouse.wheel(0, 400);
			await page.waitForTimeout(300);
			expect(await page.evaluate(() => window.scrollY), 'the wheel scrolled the page').toBeGreaterThan(y0);
			expect(await page.textContent('[data-testid=wave-span]'), 'the plot did not zoom').toBe(span1);

			const moved = (await page.locator('#wave-chart .u-over').boundingBox())!;
			await page.mouse.move(moved.x + moved.width / 2, moved.y + moved.height / 2);
			await page.keyboard.down('Control');
			await page.mouse.wheel(0, -200);
			await page.keyboard.up('Control');
			await page.waitForTimeout(200);
			const span2 = await page.textContent('[data-testid=wave-span]');
			expect(span2, 'Ctrl + wheel zooms').not.toBe(span1);
		} finally {
			await browser.close();
		}
	});

	it('two cursors on a known sine: times, values and phase difference agree with u(t) = 325.27 sin(2π·50·t)', async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			const file = join(work, 'cursor-sine.csv');
			writeFileSync(file, sineCsv());
			await page.setInputFiles('[data-testid=file-input]', file);
			await page.waitForFunction(
				() => document.querySelector('[data-testid=capture-title]')?.textContent?.trim() === 'cursor-sine.csv',
				null,
				{ timeout: 60_000 },
			);
			await settled(page);
			const plot = (await page.locator('#wave-chart .u-over').boundingBox())!;
			await page.mouse.click(plot.x + plot.width * 0.23, plot.y + plot.height / 2);
			await page.mouse.click(plot.x + plot.width * 0.61, plot.y + plot.height / 2);
			await page.waitForSelector('[data-testid=cursor-table]');
			const ms = async (id: string) =>
				Number((await page.textContent(`[data-testid=${id}]`))!.replace(/[^\d.−-]/g, '').replace('−', '-'));
			const tA = (await ms('cursor-a-time')) / 1000;
			const tB = (await ms('cursor-b-time')) / 1000;
			const dt = (await ms('cursor-dt')) / 1000;
			expect(Math.abs(dt - (tB - tA))).toBeLessThan(1e-9);
			// the cursors sit on samples: whole multiples of 0.1 ms
			expect(Math.abs(tA * RATE_HZ - Math.round(tA * RATE_HZ))).toBeLessThan(1e-6);
			for (const [id, t] of [
				['cursor-a-U1', tA],
				['cursor-b-U1', tB],
			] as const) {
				const shown = Number(
					(await page.textContent(`[data-testid=${id}]`))!.replace(/[^\d.−-]/g, '').replace('−', '-'),
				);
				// closed form, within the file's 0.001 V and the 4 significant digits shown
				const expected = AMPLITUDE_V * Math.sin(2 * Math.PI * FREQUENCY_HZ * t);
				expect(Math.abs(shown - expected), id).toBeLessThanOrEqual(Math.max(0.05, Math.abs(expected) * 5e-4));
			}
			const phase = Number((await page.textContent('[data-testid=cursor-phase]'))!.replace('°', '').replace('−', '-'));
			let expectedPhase = (360 * FREQUENCY_HZ * dt) % 360;
			if (expectedPhase > 180) expectedPhase -= 360;
			expect(Math.abs(phase - expectedPhase)).toBeLessThanOrEqual(0.06);
			await page.locator('#wave-chart').screenshot({ path: join(ARTIFACTS, 'field-two-cursors.png') });
		} finally {
			await browser.close();
		}
	});

	it("an unreadable cell: the error offers gaps in place (no File check tab named), then the cell is listed, marked, and the figures are the sine's", async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			const file = join(work, 'overload.csv');
			writeFileSync(file, sineCsv(5002));
			await page.setInputFiles('[data-testid=file-input]', file);
			await page.waitForSelector('[data-testid=import-problem]', { timeout: 60_000 });
			const problem = (await page.textContent('[data-testid=import-problem]'))!;
			// "0.5000,OVL,..." : OVL starts at character 8 of line 5002
			expect(problem).toContain('line 5002, column 8');
			expect(await page.textContent('main')).not.toMatch(/file check/i);
			await page.screenshot({ path: join(ARTIFACTS, 'field-bad-cell-error.png') });
			await page.click('[data-testid=read-as-gaps]');
			await page.waitForSelector('[data-testid=gap-list]', { timeout: 60_000 });
			await settled(page);
			expect(await page.textContent('[data-testid=gap-0]')).toContain('line 5002, column 8: “OVL” in U1');
			// closed form: a 325.27 V peak sine has RMS 325.27/√2 = 230.0 V
			expect(await page.textContent('[data-testid="fig-U1-rms"]')).toBe('230.0 V');
			await page.screenshot({ path: join(ARTIFACTS, 'field-bad-cell-gaps.png') });
		} finally {
			await browser.close();
		}
	});

	it('settings are remembered per file: the same file opened again is one list entry and keeps the chosen reference after a reload', async () => {
		const { browser, page } = await session({ width: 1400, height: 900 });
		try {
			const file = join(work, 'remember.csv');
			writeFileSync(file, sineCsv());
			const open = async () => {
				await page.setInputFiles('[data-testid=file-input]', file);
				await page.waitForFunction(
					() => document.querySelector('[data-testid=capture-title]')?.textContent?.trim() === 'remember.csv',
					null,
					{ timeout: 60_000 },
				);
				await settled(page);
			};
			await open();
			await page.selectOption('[data-testid=ref-select]', 'I1');
			await page.waitForFunction(
				() => document.querySelector('[data-testid=lag-sentence]')?.textContent?.includes('leads I1'),
				null,
				{ timeout: 30_000 },
			);
			await settled(page);
			await openDemo(page, 'pump-drive.csv');
			await open();
			expect(
				await page.$$eval('.pick', (els) => els.filter((e) => e.textContent?.includes('remember.csv')).length),
			).toBe(1);
			await page.reload();
			await page.waitForSelector('[data-testid=capture-title]', { timeout: 60_000 });
			await settled(page);
			await open();
			expect(await page.$eval('[data-testid=ref-select]', (s) => (s as HTMLSelectElement).value)).toBe('I1');
		} finally {
			await browser.close();
		}
	});

	it('raised no script error', () => {
		expect(pageErrors).toEqual([]);
	});
});
