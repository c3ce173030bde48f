/**
 * A one-line progress bar on stderr, drawn only when stderr is a terminal (never into a pipe or a log).
 */
import { printable } from './printable.js';

export interface Progress {
	tick(label: string): void;
	/** Wipes the bar so other text can be written; the next tick draws it again. */
	clear(): void;
	done(): void;
}

const WIDTH = 24;

export function progressBar(total: number, stream: NodeJS.WriteStream = process.stderr): Progress {
	if (!stream.isTTY || total < 2) return { tick() {}, clear() {}, done() {} };
	let count = 0;
	const draw = (label: string) => {
		const filled = Math.round((WIDTH * count) / total);
		const cols = stream.columns ?? 80;
		const head = `[${'#'.repeat(filled)}${'.'.repeat(WIDTH - filled)}] ${count}/${total} `;
		const room = Math.max(0, cols - head.length - 1);
		label = printable(label);
		const tail = label.length > room ? '...' + label.slice(label.length - room + 3) : label;
		stream.write(`\r${head}${tail}\x1b[K`);
	};
	draw('');
	return {
		tick(label: string) {
			count++;
			draw(label);
		},
		clear() {
			stream.write('\r\x1b[K');
		},
		done() {
			stream.write('\r\x1b[K');
		},
	};
}
