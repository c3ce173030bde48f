/**
 * Helpers for the browser tests and the plot bench: a tiny static file server on 127.0.0.1 (a free port,
 * started and stopped by the caller) and headless Debian Chromium driven by playwright-core.
 */
import { createServer, type Server } from 'node:http';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve } from 'node:path';
import type { AddressInfo } from 'node:net';
import { chromium, type BrowserContext } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';
export const hasChromium = existsSync(CHROMIUM_PATH);

const TYPES: Record<string, string> = {
	'.html': 'text/html; charset=utf-8',
	'.js': 'text/javascript',
	'.css': 'text/css',
	'.json': 'application/json',
	'.svg': 'image/svg+xml',
	'.wasm': 'application/wasm',
};

/** Serves `dir` read-only on 127.0.0.1; `extra` maps URL paths to generated bodies. */
export async function startStaticServer(
	dir: string,
	extra: Record<string, { type: string; body: string | Uint8Array }> = {},
): Promise<{ url: string; close: () => Promise<void> }> {
	const root = resolve(dir);
	const server: Server = createServer((req, res) => {
		const path = decodeURIComponent((req.url ?? '/').split('?')[0]);
		if (extra[path]) {
			res.writeHead(200, { 'content-type': extra[path].type });
			res.end(extra[path].body);
			return;
		}
		let file = normalize(join(root, path === '/' ? 'index.html' : path));
		if (!file.startsWith(root)) {
			res.writeHead(403).end();
			return;
		}
		if (existsSync(file) && statSync(file).isDirectory()) file = join(file, 'index.html');
		if (!existsSync(file)) {
			res.writeHead(404).end('not found');
			return;
		}
		res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' });
		res.end(readFileSync(file));
	});
	await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
	const { port } = server.address() as AddressInfo;
	return {
		url: `http://127.0.0.1:${port}/`,
		close: () => new Promise<void>((ok) => server.close(() => ok())),
	};
}

/**
 * Headless Chromium with a fresh profile directory (removed by `close`). playwright-core refuses a
 * `--user-data-dir` argument and takes the directory through launchPersistentContext instead.
 */
export async function launchChromium(
	viewport = { width: 1400, height: 1000 },
): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
	const profile = mkdtempSync(join(tmpdir(), 'sinecheck-chromium-'));
	const context = await chromium.launchPersistentContext(profile, {
		executablePath: CHROMIUM_PATH,
		headless: true,
		viewport,
		acceptDownloads: true,
		args: [
			'--headless',
			'--no-sandbox',
			'--disable-gpu',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync',
		],
	});
	return {
		context,
		close: async () => {
			await context.close();
			rmSync(profile, { recursive: true, force: true });
		},
	};
}
