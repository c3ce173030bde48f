import { launchChromium, startStaticServer } from './browser.js';
const server = await startStaticServer('/work/wt-16/dist-ui');
const b = await launchChromium({ width: 390, height: 844 });
const page = await b.context.newPage();
await page.goto(server.url);
await page.waitForSelector('[data-testid=capture-title]');
await page.waitForFunction(() => document.querySelector('[data-testid=app]')?.getAttribute('data-busy') === 'no', null, { timeout: 60000 });
await page.selectOption('.phone-pick select', { label: 'pump-drive.csv' });
await page.waitForTimeout(500);
for (const t of process.argv.slice(2)) {
await page.click('#tab-' + t);
await page.waitForTimeout(500);
console.log(t, await page.evaluate(() => [...document.querySelectorAll('#panel *')].filter((e) => e.getBoundingClientRect().right > 391).slice(0, 8).map((e) => `${e.tagName}.${e.className} ${Math.round(e.getBoundingClientRect().width)}`)));
}
await b.close(); await server.close();
