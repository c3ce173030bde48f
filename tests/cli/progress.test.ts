import { describe, expect, it } from 'vitest';
import { progressBar } from '../../src/cli/progress.js';

function stream(isTTY: boolean): NodeJS.WriteStream & { text: string } {
	const s = {
		isTTY,
		columns: 60,
		text: '',
		write(t: string) {
			s.text += t;
			return true;
		},
	};
	return s as unknown as NodeJS.WriteStream & { text: string };
}

describe('progressBar', () => {
	it('progressBar(total, stream) draws nothing when the stream is not a terminal (pipes and logs stay clean)', () => {
		const s = stream(false);
		const p = progressBar(3, s);
		p.tick('a.csv');
		p.clear();
		p.done();
		expect(s.text).toBe('');
	});

	it('progressBar(total, stream) draws count/total on a terminal, within its width, and clears the line at the end', () => {
		const s = stream(true);
		const p = progressBar(4, s);
		p.tick('surveys/site-a/very-long-folder-name/with/many/parts/capture-0001.csv');
		expect(s.text).toContain('1/4');
		const lastLine = s.text.split('\r').pop()!.replace('\x1b[K', '');
		expect(lastLine.length).toBeLessThanOrEqual(60);
		p.done();
		expect(s.text.endsWith('\r\x1b[K')).toBe(true);
	});
});
