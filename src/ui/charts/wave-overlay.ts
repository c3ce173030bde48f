/**
 * The figures drawn on the wave plot, taken from the analysis report (never computed here): RMS and
 * rectified-mean levels, peak markers, the analysed whole cycles, and the lag between the reference and
 * a chosen channel. `overlayFor` builds a plain list (tested in Node); `drawOverlay` paints it with uPlot.
 */
import type uPlot from 'uplot';
import type { AnalysisReport } from '../../../lib/report/types.js';
import type { ReportExtras } from '../protocol.js';
import { formatQuantity } from '../format.js';
import { lagSentence } from '../verdicts.js';

export type OverlayItem =
	| { kind: 'level'; scale: string; value: number; colour: string; dash: number[]; label: string }
	| { kind: 'peak'; scale: string; tS: number; value: number; colour: string; label: string; below: boolean }
	| { kind: 'window'; startS: number; endS: number; label: string }
	| { kind: 'cycle-ticks'; timesS: number[] }
	| { kind: 'lag'; scale: string; fromS: number; toS: number; text: string }
	| { kind: 'event'; startS: number; endS: number; label: string };

export interface OverlayChannel {
	name: string;
	unit: string;
	scale: string;
	colour: string;
}

/** Scale key a channel is drawn on: 'V', 'A' or 'other:<unit>'. */
export function scaleKey(quantity: string, unit: string): string {
	return quantity === 'voltage' ? 'V' : quantity === 'current' ? 'A' : `other:${unit}`;
}

/**
 * The overlay for the reference and the compared channel (levels and peaks of all channels would hide the
 * waves): each gets its RMS (dashed) and rectified mean (dotted) levels and its two peaks; plus the window
 * and the lag.
 * @param timeOfIndex  time in s of a sample index (peaks are located by index in `extras`)
 */
export function overlayFor(
	report: AnalysisReport,
	extras: ReportExtras,
	channels: readonly OverlayChannel[],
	focus: readonly string[],
	compare: string | null,
	timeOfIndex: (i: number) => number,
): OverlayItem[] {
	const items: OverlayItem[] = [];
	items.push({
		kind: 'window',
		startS: report.window.startS,
		endS: report.window.endS,
		label: `${report.cyclesAnalysed} whole cycle${report.cyclesAnalysed === 1 ? '' : 's'} analysed`,
	});
	if (extras.cycleBoundariesS.length > 1) items.push({ kind: 'cycle-ticks', timesS: extras.cycleBoundariesS });
	for (const name of focus) {
		const ch = channels.find((c) => c.name === name);
		const fig = report.channels.find((c) => c.name === name);
		if (!ch || !fig) continue;
		// positive side only: the negative half mirrors it and would double the lines over the waves
		items.push({
			kind: 'level',
			scale: ch.scale,
			value: fig.rms,
			colour: ch.colour,
			dash: [7, 4],
			label: `${name} RMS ${formatQuantity(fig.rms, ch.unit)}`,
		});
		items.push({
			kind: 'level',
			scale: ch.scale,
			value: fig.rectifiedMean,
			colour: ch.colour,
			dash: [2, 3],
			label: `${name} rectified mean ${formatQuantity(fig.rectifiedMean, ch.unit)}`,
		});
		const p = extras.peakIndex[name];
		if (p && p.max >= 0)
			items.push({
				kind: 'peak',
				scale: ch.scale,
				tS: timeOfIndex(p.max),
				value: fig.peak,
				colour: ch.colour,
				label: `${name} peak ${formatQuantity(fig.peak, ch.unit)}`,
				below: false,
			});
		if (p && p.min >= 0)
			items.push({
				kind: 'peak',
				scale: ch.scale,
				tS: timeOfIndex(p.min),
				value: fig.peakNegative,
				colour: ch.colour,
				label: `${name} peak ${formatQuantity(fig.peakNegative, ch.unit)}`,
				below: true,
			});
	}
	for (const e of extras.trend?.result?.events ?? []) {
		const depth = e.residualV ?? e.maximumV;
		const pct =
			depth !== undefined && extras.trend?.result
				? ` ${Math.round((100 * depth) / extras.trend.result.declaredV)} %`
				: '';
		items.push({
			kind: 'event',
			startS: e.startS,
			endS: e.startS + e.durationS,
			label: `${e.kind} ${e.channels.join(',')}${pct}`,
		});
	}
	const pair = compare ? report.pairs.find((p) => p.other === compare) : undefined;
	const refCh = channels.find((c) => c.name === report.referenceChannel);
	if (pair && refCh && Number.isFinite(pair.lagS)) {
		const from = extras.cycleBoundariesS[0] ?? report.window.startS;
		items.push({ kind: 'lag', scale: refCh.scale, fromS: from, toS: from + pair.lagS, text: lagSentence(pair) });
	}
	return items;
}

/** Paints the overlay on a uPlot canvas (called from its `draw` hook). */
export function drawOverlay(u: uPlot, items: readonly OverlayItem[]): void {
	const ctx = u.ctx;
	const pr = devicePixelRatio || 1;
	const { left, top, width, height } = u.bbox;
	const xMin = u.scales.x.min ?? 0;
	const xMax = u.scales.x.max ?? 1;
	const x = (t: number) => u.valToPos(t, 'x', true);
	const y = (v: number, s: string) => u.valToPos(v, s, true);
	ctx.save();
	ctx.beginPath();
	ctx.rect(left, top, width, height);
	ctx.clip();
	ctx.font = `${11 * pr}px system-ui, sans-serif`;
	ctx.textBaseline = 'middle';
	const labelsAtRight: { yPx: number; text: string; colour: string }[] = [];
	// peak labels are moved down or up a line at a time until they do not overprint one another
	const placed: { x0: number; x1: number; y0: number; y1: number }[] = [];
	const place = (x: number, y: number, w: number, h: number): number => {
		for (const dy of [0, 1, -1, 2, -2, 3, -3]) {
			const y0 = y + dy * h - h / 2;
			const clash = placed.some((r) => x < r.x1 && x + w > r.x0 && y0 < r.y1 && y0 + h > r.y0);
			if (!clash) {
				placed.push({ x0: x, x1: x + w, y0, y1: y0 + h });
				return y + dy * h;
			}
		}
		return y;
	};
	for (const it of items) {
		if (it.kind === 'window') {
			const a = x(Math.max(it.startS, xMin));
			const b = x(Math.min(it.endS, xMax));
			if (b > a) {
				ctx.fillStyle = 'rgba(60, 110, 70, 0.07)';
				ctx.fillRect(a, top, b - a, height);
				ctx.fillStyle = '#2d5a36';
				ctx.textAlign = 'left';
				ctx.fillText(it.label, a + 4 * pr, top + height - 16 * pr);
			}
		} else if (it.kind === 'event') {
			const a = x(Math.max(it.startS, xMin));
			const b = x(Math.min(it.endS, xMax));
			if (b > a) {
				ctx.fillStyle = 'rgba(164, 38, 44, 0.08)';
				ctx.fillRect(a, top, b - a, height);
				ctx.strokeStyle = 'rgba(164, 38, 44, 0.6)';
				ctx.setLineDash([]);
				ctx.lineWidth = pr;
				ctx.strokeRect(a, top, b - a, height);
				ctx.fillStyle = '#7d1d22';
				ctx.textAlign = 'left';
				ctx.fillText(it.label, a + 4 * pr, top + 24 * pr);
			}
		} else if (it.kind === 'cycle-ticks') {
			const visible = it.timesS.filter((t) => t >= xMin && t <= xMax);
			// ticks closer than 4 px would merge into a bar; draw them only when they can be told apart
			if (visible.length > 1 && (x(visible[1]) - x(visible[0])) / pr < 4) continue;
			ctx.strokeStyle = '#2d5a36';
			ctx.lineWidth = pr;
			ctx.setLineDash([]);
			for (const t of visible) {
				const px = Math.round(x(t)) + 0.5;
				ctx.beginPath();
				ctx.moveTo(px, top + height);
				ctx.lineTo(px, top + height - 8 * pr);
				ctx.stroke();
			}
		} else if (it.kind === 'level') {
			if (!Number.isFinite(it.value) || u.scales[it.scale] === undefined) continue;
			const py = Math.round(y(it.value, it.scale)) + 0.5;
			ctx.strokeStyle = it.colour;
			ctx.lineWidth = 1.25 * pr;
			ctx.setLineDash(it.dash.map((d) => d * pr));
			ctx.beginPath();
			ctx.moveTo(left, py);
			ctx.lineTo(left + width, py);
			ctx.stroke();
			labelsAtRight.push({ yPx: py, text: it.label, colour: it.colour });
		} else if (it.kind === 'peak') {
			if (it.tS < xMin || it.tS > xMax || u.scales[it.scale] === undefined) continue;
			const px = x(it.tS);
			const py = y(it.value, it.scale);
			const s = 6 * pr;
			ctx.setLineDash([]);
			ctx.fillStyle = it.colour;
			ctx.strokeStyle = '#fff';
			ctx.lineWidth = pr;
			ctx.beginPath();
			// a triangle pointing at the peak: from above for a positive peak, from below for a negative one
			const d = it.below ? 1 : -1;
			ctx.moveTo(px, py);
			ctx.lineTo(px - s, py + d * 1.7 * s);
			ctx.lineTo(px + s, py + d * 1.7 * s);
			ctx.closePath();
			ctx.fill();
			ctx.stroke();
			ctx.textAlign = 'left';
			const w = ctx.measureText(it.label).width;
			const ly = place(px + 1.4 * s, py + d * 1.2 * s, w, 13 * pr);
			ctx.fillStyle = 'rgba(255,255,255,0.75)';
			ctx.fillRect(px + 1.4 * s - 2 * pr, ly - 6.5 * pr, w + 4 * pr, 13 * pr);
			ctx.fillStyle = it.colour;
			ctx.fillText(it.label, px + 1.4 * s, ly);
		} else if (it.kind === 'lag') {
			if (u.scales[it.scale] === undefined) continue;
			const a = x(it.fromS);
			const b = x(it.toS);
			const py = y(0, it.scale) - 14 * pr;
			ctx.strokeStyle = '#222';
			ctx.fillStyle = '#222';
			ctx.lineWidth = 1.5 * pr;
			ctx.setLineDash([3 * pr, 3 * pr]);
			for (const px of [a, b]) {
				ctx.beginPath();
				ctx.moveTo(px, top);
				ctx.lineTo(px, top + height);
				ctx.stroke();
			}
			ctx.setLineDash([]);
			ctx.beginPath();
			ctx.moveTo(a, py);
			ctx.lineTo(b, py);
			ctx.stroke();
			const dir = b >= a ? 1 : -1;
			ctx.beginPath();
			ctx.moveTo(b, py);
			ctx.lineTo(b - dir * 6 * pr, py - 4 * pr);
			ctx.lineTo(b - dir * 6 * pr, py + 4 * pr);
			ctx.closePath();
			ctx.fill();
			const textX = Math.min(
				Math.max(Math.max(a, b) + 6 * pr, left + 4 * pr),
				left + width - ctx.measureText(it.text).width - 4 * pr,
			);
			ctx.textAlign = 'left';
			ctx.fillStyle = 'rgba(255,255,255,0.85)';
			const w = ctx.measureText(it.text).width;
			ctx.fillRect(textX - 3 * pr, py - 9 * pr, w + 6 * pr, 18 * pr);
			ctx.fillStyle = '#222';
			ctx.fillText(it.text, textX, py);
		}
	}
	// level labels at the right edge, nudged apart so they never overprint
	labelsAtRight.sort((p, q) => p.yPx - q.yPx);
	let lastY = -Infinity;
	ctx.textAlign = 'right';
	for (const l of labelsAtRight) {
		const yy = Math.max(l.yPx - 7 * pr, lastY + 13 * pr);
		lastY = yy;
		const w = ctx.measureText(l.text).width;
		ctx.fillStyle = 'rgba(255,255,255,0.8)';
		ctx.fillRect(left + width - w - 8 * pr, yy - 7 * pr, w + 6 * pr, 13 * pr);
		ctx.fillStyle = l.colour;
		ctx.fillText(l.text, left + width - 4 * pr, yy);
	}
	ctx.restore();
}
