// @vitest-environment jsdom
import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/index.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { setDisplayLocale } from '../../src/ui/format.js';
import FitNote from '../../src/ui/components/FitNote.svelte';
import { renderComponent } from './dom.js';

setDisplayLocale('en-US');
let cleanup: (() => void)[] = [];
afterEach(() => {
	for (const c of cleanup) c();
	cleanup = [];
});

describe('FitNote on the single-shot scope demo', () => {
	const { captures } = openCaptures([
		{ name: 'moulder-drive-scope.csv', bytes: new Uint8Array(readFileSync('sample-waves/moulder-drive-scope.csv')) },
	]);
	const report = analyseCapture(captures[0]);

	it('FitNote says the figures come from a fit of a short record and gives the lag (ground truth 25°) with its uncertainty', () => {
		const r = renderComponent(FitNote, { report });
		cleanup.push(r.unmount);
		// White space collapsed as the browser shows it (the template's line breaks are not words).
		const text = (r.container.textContent ?? '').replace(/\s+/g, ' ');
		expect(text).toContain('from a fit of a short record');
		const m = /CH2 lags CH1 by ([\d.]+) ± ([\d.]+) °/.exec(text);
		expect(m, text).not.toBeNull();
		expect(Math.abs(Number(m![1]) - 25)).toBeLessThan(0.2);
		expect(text).toMatch(/below resolution/);
		expect(text).not.toMatch(/--|shortRecord/); // plain words, no option names or internal keys
	});
});
