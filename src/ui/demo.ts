/**
 * The demo captures in sample-waves/, bundled as static assets (URLs) so `npm start` and the built app
 * both open on a worked analysis without a server of their own. Vite resolves the glob at build time.
 */
import type { SourceFile } from './state/session.svelte.js';

const urls = import.meta.glob(['../../sample-waves/*.csv', '../../sample-waves/*.wav', '../../sample-waves/*.cfg', '../../sample-waves/*.dat', '../../sample-waves/*.cff'], {
	query: '?url',
	import: 'default',
	eager: true,
}) as Record<string, string>;

/** The demo files as session sources (fetched when read), sorted by name. */
export function demoFiles(): SourceFile[] {
	return Object.entries(urls)
		.map(([path, url]) => ({
			name: path.replace(/^.*\//, ''),
			read: async () => {
				const r = await fetch(url);
				if (!r.ok) throw new Error(`demo file ${path} could not be loaded (${r.status})`);
				return r.arrayBuffer();
			},
		}))
		.sort((a, b) => a.name.localeCompare(b.name));
}

/** A picked or dropped File as a session source (re-readable for the file check's re-import). */
export function fromFile(file: File): SourceFile {
	return { name: file.name, read: () => file.arrayBuffer() };
}
