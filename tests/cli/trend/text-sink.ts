/** A Writable that keeps what is written, for the trend command's stdout and stderr in tests. */
import { Writable } from 'node:stream';

export function textSink(): Writable & { text: () => string } {
	const parts: string[] = [];
	const w = new Writable({
		write(chunk, _enc, cb) {
			parts.push(String(chunk));
			cb();
		},
	}) as Writable & { text: () => string };
	w.text = () => parts.join('');
	return w;
}
