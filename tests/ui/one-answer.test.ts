// @vitest-environment jsdom
/**
 * The page shows lib/report's one answer per figure: the lag note in words with the headline's sign,
 * the DC-coupled meter beside the AC-coupled one where DC moves it, the limit basis, and voltage events in
 * the printed report. Expected values are closed forms, never figures of the code under test.
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { Capture, Channel } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { setDisplayLocale } from '../../src/ui/format.js';
import FiguresTable from '../../src/ui/components/FiguresTable.svelte';
import PhasorPanel from '../../src/ui/components/PhasorPanel.svelte';
import { metadataLabel } from '../../src/ui/metadata-words.js';
import { verdictsFor } from '../../src/ui/verdicts.js';
import { sineSamples } from '../helpers/synth.js';
import { renderComponent } from './dom.js';

setDisplayLocale('en-US');
const FS = 10_000;
let cleanup: (() => void)[] = [];
afterEach(() => {
	for (const c of cleanup) c();
	cleanup = [];
});
function render<P extends Record<string, unknown>>(c: Parameters<typeof renderComponent<P>>[0], props: P) {
	const r = renderComponent(c, props);
	cleanup.push(r.unmount);
	return r.container;
}
const capture = (channels: Channel[], metadata: Record<string, string> = {}): Capture => ({
	source: 'x.csv',
	sampleRateHz: FS,
	startS: 0,
	channels,
	metadata,
	diagnostics: [],
});
const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });

describe('one answer on the page', () => {
	it('PhasorPanel words a current 4° ahead as "leads … by 0.22 ms" in the headline and the note alike, never a signed "-0.22 ms" (4/360 × 20 ms = 0.222 ms, closed form)', () => {
		const i = sineSamples({ amplitude: 10, frequencyHz: 50, sampleRateHz: FS, cycles: 20, phaseDeg: 4 });
		const report = analyseCapture(
			capture([
				{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u },
				{ name: 'I1', unit: 'A', quantity: 'current', samples: i },
			]),
		);
		const el = render(PhasorPanel, { report, colours: {} });
		expect(el.textContent).toContain('I1 leads U1 by 4.0°, 0.22 ms');
		expect(el.textContent).toContain('I1 leads by 0.22 ms');
		expect(el.textContent).not.toMatch(/-0\.22 ms|−0\.22 ms/);
	});

	it('FiguresTable shows the AC-coupled error 0.0 % of a sine on a +0.8 A offset and, because DC moves it, the DC-coupled error too', () => {
		const i = sineSamples({ amplitude: 10 * Math.SQRT2, offset: 0.8, frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const report = analyseCapture(
			capture([
				{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u },
				{ name: 'I1', unit: 'A', quantity: 'current', samples: i },
			]),
		);
		const el = render(FiguresTable, { channels: report.channels });
		expect(el.querySelector('[data-testid="fig-I1-averageError"]')!.textContent).toBe('0.0 %');
		expect(el.querySelector('[data-testid="fig-I1-dcError"]')).not.toBeNull();
		expect(el.querySelector('[data-testid="fig-I1-dcError"]')!.textContent).toMatch(/^−?-?\d\.\d %$/);
	});

	it('the findings name the limit basis and the events of a record with a 100 ms dip to 50 %, in the display locale', () => {
		const n = 2 * FS;
		const dip = new Float64Array(n);
		for (let k = 0; k < n; k++)
			dip[k] = (k >= 0.5 * FS && k < 0.6 * FS ? 0.5 : 1) * 325 * Math.sin((2 * Math.PI * 50 * k) / FS);
		setDisplayLocale('de-DE');
		try {
			const vs = verdictsFor(
				analyseCapture(capture([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: dip }]), {
					limits: 'en50160',
					declaredV: 230,
				}),
			);
			expect(vs.find((v) => v.id === 'distortion-U1')!.text).toContain('harmonic subgroups');
			const ev = vs.find((v) => v.id === 'events')!;
			expect(ev.target.tab).toBe('trends');
			expect(ev.text).toContain('1 dip');
			expect(ev.figure).toMatch(/dip to 50,\d %/);
		} finally {
			setDisplayLocale('en-US');
		}
	});

	it('metadataLabel names importer keys in words (no raw keys in the printed report)', () => {
		expect(metadataLabel('comtrade.ccbm.Ua')).toBe('Circuit of Ua');
		expect(metadataLabel('wav.ICMT')).toBe('Comment');
		expect(metadataLabel('comtrade.time_code')).not.toContain('comtrade');
	});
});
