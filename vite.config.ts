import { defineConfig } from 'vitest/config';
import { svelte } from '@sveltejs/vite-plugin-svelte';

// The UI lives in src/ui; the built app is static files in dist-ui/ (no CDN, no fetched fonts).
export default defineConfig({
	root: 'src/ui',
	base: './',
	publicDir: false,
	plugins: [svelte()],
	build: { outDir: '../../dist-ui', emptyOutDir: true, target: 'es2022' },
	worker: { format: 'es' },
	server: { fs: { allow: ['../..'] } },
	test: {
		root: '.',
		include: ['tests/**/*.test.ts'],
		environment: 'node',
		testTimeout: 60_000,
		hookTimeout: 120_000,
		pool: 'forks',
		reporters: ['default', 'json'],
		outputFile: { json: 'test-artifacts/vitest.json' },
	},
});
