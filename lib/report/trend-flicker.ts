/**
 * The trend view's flicker from the report's own flickermeter pass (flicker-report.ts), so a capture goes
 * through the flickermeter once: the event step's lib/trend pass then runs without its flicker (`flicker:
 * false`) and the view gets, from the report's runs, what lib/trend's flicker beside the trend holds (Pst
 * and Plt rows flagged by the events, the highest Pinst per channel and per second, and the IEC 61000-3-3
 * changes relative to the trend's declared voltage), figure for figure.
 *
 * Shared only where both would measure the same samples the same way (`flickerShareable`): a nominal
 * frequency of 50 or 60 Hz given to both, every sample read by the event step (no block averaging), a
 * voltage channel at a flicker rate, longer than the flickermeter's settling time. Elsewhere lib/trend
 * keeps its own flickermeter.
 */
import type { Capture, Diagnostic } from '../capture.js';
import { createVoltageChangeTracker, FLICKER_MIN_SAMPLE_RATE_HZ, FLICKER_SETTLING_S } from '../flicker/index.js';
import type { VoltageChange } from '../flicker/index.js';
import { maxOf } from '../signal/extremes.js';
import type { TrendFlicker, TrendFlickerRow } from '../trend/flicker-tracker.js';
import type { TrendEvent, TrendResult } from '../trend/types.js';
import type { FlickerRun } from './flicker-report.js';

/**
 * Whether the report's flicker runs can stand for lib/trend's flicker of the event step on `capture`.
 * @param eventsReadEverySample  the event step reads the capture itself, not block averages of it
 */
export function flickerShareable(
	capture: Capture,
	nominalHz: number | undefined,
	eventsReadEverySample: boolean,
): boolean {
	const voltage = capture.channels.find((c) => c.quantity === 'voltage');
	return (
		eventsReadEverySample &&
		(nominalHz === 50 || nominalHz === 60) &&
		voltage !== undefined &&
		capture.sampleRateHz >= FLICKER_MIN_SAMPLE_RATE_HZ &&
		voltage.samples.length / capture.sampleRateHz > FLICKER_SETTLING_S
	);
}

/**
 * A trend result with the flicker of the report's runs, as lib/trend's own flicker beside the trend would
 * give it (lib/trend/flicker-tracker.ts): rows flagged when a dip, swell or interruption overlaps them;
 * changes relative to `trend.declaredV` when it is known; a warning at the end of the diagnostics when a
 * meter bridged non-finite samples. Null when there is no run or a run has no meter result.
 * @param trend  the event step's lib/trend result (run with `flicker: false`)
 * @param runs  one per voltage channel, in the capture's order (measureFlicker's `runs`)
 * @param found  lib/trend's events as it found them (before any folding), which flag the rows
 */
export function withRunsFlicker(
	trend: TrendResult,
	runs: FlickerRun[],
	found: readonly TrendEvent[],
): TrendResult | null {
	const results = runs.map((r) => r.result);
	if (runs.length === 0 || results.some((r) => r === null)) return null;
	const meters = results.map((r) => r!);
	const flagging = found.filter((e) => e.kind !== 'rvc');
	const flagged = (startS: number, durationS: number) =>
		flagging.some((e) => e.startS < startS + durationS && e.startS + e.durationS > startS);
	const rows = (pick: (k: number) => { startS: number; durationS: number; value: number }[]): TrendFlickerRow[] =>
		pick(0).map((first, i) => ({
			startS: first.startS,
			durationS: first.durationS,
			values: meters.map((_, k) => pick(k)[i].value),
			flagged: flagged(first.startS, first.durationS),
		}));
	const flicker: TrendFlicker = {
		channels: runs.map((r) => r.channel),
		lamp: meters[0].lamp,
		pst: rows((k) => meters[k].pst.map((p) => ({ startS: p.startS, durationS: p.durationS, value: p.pst }))),
		plt: rows((k) => meters[k].plt.map((p) => ({ startS: p.startS, durationS: p.durationS, value: p.plt }))),
		pinstMax: meters.map((r) => r.pinst.max),
		...(trend.declaredV > 0 ? { changes: runs.map((r) => changeSummary(r, trend.declaredV, trend.nominalHz)) } : {}),
		pinst: { startS: meters[0].pinstBlocks?.startS ?? [], max: meters.map((r) => r.pinstBlocks?.max ?? []) },
	};
	const diagnostics: Diagnostic[] = [...trend.diagnostics];
	if (meters.some((r) => r.nonFiniteSamples > 0)) {
		diagnostics.push({
			code: 'flicker-non-finite',
			severity: 'warning',
			message:
				'Flicker: missing or non-finite samples were bridged by repeating the previous value; the Pst around them is doubtful.',
		});
	}
	return { ...trend, diagnostics, flicker };
}

/** Count and worst figures of the changes relative to `declaredV` (the run's own list when it used that Un). */
function changeSummary(run: FlickerRun, declaredV: number, nominalHz: number): NonNullable<TrendFlicker['changes']>[0] {
	let list: VoltageChange[] = run.changes;
	if (run.nominalV !== declaredV) {
		const tracker = createVoltageChangeTracker(declaredV, nominalHz === 60 ? 60 : 50);
		const { t, v } = run.halfPeriod;
		for (let k = 0; k < t.length; k++) tracker.push(t[k], v[k]);
		list = tracker.finish();
	}
	const worst = (v: number[]) => (v.filter(Number.isFinite).length ? maxOf(v.filter(Number.isFinite)) : NaN);
	return {
		count: list.length,
		dcMaxPercent: worst(list.map((c) => c.dcPercent)),
		dmaxPercent: worst(list.map((c) => c.dmaxPercent)),
		tmaxS: worst(list.map((c) => c.tmaxS)),
	};
}
