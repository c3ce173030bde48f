/**
 * The demo captures in sample-waves/, bundled as static assets (URLs) so `npm start` and the built app
 * both open on a worked analysis without a server of their own. Vite resolves the glob at build time.
 */
import type { SourceFile } from './state/session.svelte.js';

const urls = import.meta.glob(
	[
		'../../sample-waves/*.csv',
		'../../sample-waves/*.wav',
		'../../sample-waves/*.cfg',
		'../../sample-waves/*.dat',
		'../../sample-waves/*.cff',
	],
	{
		query: '?url',
		import: 'default',
		eager: true,
	},
) as Record<string, string>;

/** One line per demo capture: what it shows, in the words of sample-waves/README.md (the made-up site). */
export const DEMO_DESCRIPTIONS: Record<string, string> = {
	'board-unbalance.csv': 'machine-shop board with L3 sagging to 212 V: unbalanced voltages and currents.',
	'feeder-rectifiers.csv': 'office and charger sub-feeder: rectifier loads, very distorted current, power factor 0.70.',
	'generator-60hz.cfg': 'hire generator at 60 Hz (relay record): 277 V with 5th and 7th, 85 A lagging 30°.',
	'incomer-dip.cfg': 'incomer relay record: phase B dips to 55 % for 6 cycles.',
	'pump-drive.csv': "three-phase input of the boiler pump's drive: 5th, 7th, 11th and 13th harmonic currents.",
	'spindle-clamp.wav': 'clamp recorder on the spindle moulder: motor current lagging 38°.',
};

/** The demo files as session sources (fetched when read), sorted by name. */
export function demoFiles(): SourceFile[] {
	return Object.entries(urls)
		.map(([path, url]) => ({
			name: path.replace(/^.*\//, ''),
			description: DEMO_DESCRIPTIONS[path.replace(/^.*\//, '')],
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
	return { name: file.name, blob: file, read: () => file.arrayBuffer() };
}
