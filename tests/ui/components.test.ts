// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, getByRole, getByText, queryByText } from '@testing-library/dom';
import type { Capture, Channel } from '../../lib/capture.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { setDisplayLocale } from '../../src/ui/format.js';
import SpectrumChart from '../../src/ui/charts/SpectrumChart.svelte';
import PhasorDiagram from '../../src/ui/charts/PhasorDiagram.svelte';
import ProblemList from '../../src/ui/components/ProblemList.svelte';
import Findings from '../../src/ui/components/Findings.svelte';
import FiguresTable from '../../src/ui/components/FiguresTable.svelte';
import SafetyNote from '../../src/ui/components/SafetyNote.svelte';
import { harmonicSamples } from '../helpers/synth.js';
import { renderComponent } from './dom.js';
import { captureOf } from '../helpers/capture.js';

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
const capture = (channels: Channel[]): Capture => captureOf(channels, FS, 'x.csv');

describe('SpectrumChart', () => {
	// 5th at 7 % is over the EN 50160 limit of 6 %; the 3rd at 3 % is under its 5 % (EN 50160:2010 Table 1; from memory)
	const u = harmonicSamples(
		[
			{ order: 1, rms: 230 },
			{ order: 3, rms: 6.9 },
			{ order: 5, rms: 16.1 },
		],
		{ frequencyHz: 50, sampleRateHz: FS, cycles: 20 },
	);
	const report = analyseCapture(capture([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u }]), {
		limits: 'en50160',
	});
	const ch = report.channels[0];
	const rows = report.limits!.rows.filter((r) => r.channel === 'U1');

	it('SpectrumChart marks an order over its limit with a text mark ▲ and its number and a hatched, outlined bar (not colour alone)', () => {
		const el = render(SpectrumChart, { channel: ch, limitRows: rows, maxOrder: 40 });
		expect(getByText(el, '▲5')).toBeTruthy();
		expect(queryByText(el, '▲3')).toBeNull();
		const over = el.querySelectorAll('rect.bar.over');
		expect(over).toHaveLength(1);
		expect((over[0] as SVGRectElement).style.fill).toContain('over-hatch');
	});

	it('SpectrumChart draws one limit segment per limited order and says which orders are over in its accessible label', () => {
		const el = render(SpectrumChart, { channel: ch, limitRows: rows, maxOrder: 25 });
		const limited = rows.filter((r) => r.figure === 'harmonic' && r.order >= 2 && r.order <= 25).length;
		expect(el.querySelectorAll('line.limit')).toHaveLength(limited);
		expect(getByRole(el, 'img').getAttribute('aria-label')).toContain('over their limit: 5');
	});

	it('SpectrumChart bar heights are proportional to percent of fundamental (7 % bar is 7/3 of the 3 % bar)', () => {
		const el = render(SpectrumChart, { channel: ch, limitRows: [], maxOrder: 10 });
		const bars = [...el.querySelectorAll('rect.bar')] as SVGRectElement[];
		const h = (order: number) => Number(bars[order - 2].getAttribute('height'));
		expect(h(5) / h(3)).toBeCloseTo(16.1 / 6.9, 6);
	});
});

describe('PhasorDiagram', () => {
	it('PhasorDiagram draws a current lagging by 30° clockwise of the reference (tip angle −30° on screen, y pointing down)', () => {
		const el = render(PhasorDiagram, {
			title: 't',
			phasors: [
				{ name: 'U1', unit: 'V', quantity: 'voltage', rms: 230, angleDeg: 0, colour: '#000' },
				{ name: 'I1', unit: 'A', quantity: 'current', rms: 10, angleDeg: -30, colour: '#00f' },
			],
		});
		const lines = [...el.querySelectorAll('line[stroke]')] as SVGLineElement[];
		const tip = (l: SVGLineElement) => {
			const x1 = Number(l.getAttribute('x1'));
			const y1 = Number(l.getAttribute('y1'));
			return (Math.atan2(-(Number(l.getAttribute('y2')) - y1), Number(l.getAttribute('x2')) - x1) * 180) / Math.PI;
		};
		expect(tip(lines[0])).toBeCloseTo(0, 9);
		expect(tip(lines[1])).toBeCloseTo(-30, 9);
		expect(getByText(el, '10.00 A ∠-30.0°')).toBeTruthy();
	});
});

describe('ProblemList', () => {
	it('ProblemList names the file, line and column, what was found and what was expected', () => {
		const el = render(ProblemList, {
			problems: [
				{
					source: 'bad.csv',
					line: 4,
					column: 7,
					code: 'bad-number',
					text: 'abc',
					expected: 'a number',
					message: '',
					lineText: '0.002,abc',
				},
			],
		});
		// the line as written, with a caret under column 7
		expect(el.querySelector('pre.line')?.textContent).toBe('0.002,abc\n      ^ column 7');
		expect(el.textContent).toContain('Could not read bad.csv');
		expect(el.textContent).toContain('line 4, column 7');
		expect(el.textContent).toContain('Expected a number, found abc');
		expect(getByRole(el, 'alert')).toBeTruthy();
	});
});

describe('Findings', () => {
	it('Findings shows each verdict with its number and a "show" button that reports where to go', async () => {
		const onshow = vi.fn();
		const v = {
			id: 'meter-I1',
			topic: 'meter' as const,
			level: 'attention' as const,
			channel: 'I1',
			text: 'I1 reads 12 % low',
			figure: 'it would show 8.8 A',
			target: { tab: 'waves' as const, channel: 'I1' },
		};
		const el = render(Findings, { verdicts: [v], onshow });
		expect(el.textContent).toContain('it would show 8.8 A');
		expect(el.textContent).toContain('look at this'); // the level in words for screen readers, not only a colour
		await fireEvent.click(getByRole(el, 'button'));
		expect(onshow).toHaveBeenCalledWith(v);
	});
});

describe('FiguresTable', () => {
	it('FiguresTable shows the report figures of lib with units (a 230 V sine: RMS 230.0 V, peak 325.3 V, crest 1.414)', () => {
		const u = harmonicSamples([{ order: 1, rms: 230 }], { frequencyHz: 50, sampleRateHz: FS, cycles: 20 });
		const report = analyseCapture(capture([{ name: 'U1', unit: 'V', quantity: 'voltage', samples: u }]));
		const el = render(FiguresTable, { channels: report.channels });
		const cell = (k: string) => el.querySelector(`[data-testid="fig-U1-${k}"]`)?.textContent;
		expect(cell('rms')).toBe('230.0 V');
		expect(cell('peak')).toBe('325.3 V'); // 230·√2 = 325.27 (closed form)
		expect(cell('crestFactor')).toBe('1.414');
		expect(cell('mean')).toBe('0 V');
	});
});

describe('SafetyNote', () => {
	it('SafetyNote states the CAT ratings, isolated/differential probes, the floating-earth warning and the compliance caveat', () => {
		const el = render(SafetyNote, {});
		for (const words of [
			'CAT II / CAT III / CAT IV',
			'isolated channels',
			'differential probes',
			"Never float a scope's earth",
			'not a compliance measurement',
			'local electrical-safety rules',
		]) {
			expect(el.textContent).toContain(words);
		}
	});
});
