/**
 * The trend view a front end draws beside the report (the Urms(1/2) series of every voltage channel, the
 * 10/12-cycle THD and frequency rows, flicker with Pinst, the events), taken from the very lib/trend pass
 * the report's event step makes (events.ts), so a capture goes through lib/trend once.
 */
import type { Capture } from '../capture.js';
import type { TrendResult } from '../trend/types.js';

/** lib/trend's result plus the RMS over one cycle refreshed every half cycle, per voltage channel. */
export interface CaptureTrend {
	/** Null when the trend analyser refused the capture (see `problem`). */
	result: TrendResult | null;
	/** Window starts (s, of the first channel with values) and one Urms(1/2) series per channel (V), cut to the shortest. */
	halfCycle: { timeS: Float64Array; rms: Float64Array[]; channels: string[] };
	/** Why there is no trend when the analyser refused the capture. */
	problem?: string;
}

/** What `analyseCaptureParts` is asked for beside the report. */
export interface TrendViewRequest {
	/** Hears the trend pass advance: share of the record's duration measured so far (0-1). */
	onFraction?: (fraction: number) => void;
}

/** A trend view that holds nothing but why (the analyser refused the capture). */
export function refusedTrend(problem: string): CaptureTrend {
	return { result: null, halfCycle: { timeS: new Float64Array(0), rms: [], channels: [] }, problem };
}

/**
 * Collects the Urms(1/2) values lib/trend reports (its `onHalfCycle`) per channel index, and reports the
 * share of the record measured at most every 2 %.
 */
export function halfCycleCollector(capture: Capture, onFraction?: (fraction: number) => void) {
	const times: number[][] = capture.channels.map(() => []);
	const values: number[][] = capture.channels.map(() => []);
	const endS = (capture.channels[0]?.samples.length ?? 0) / capture.sampleRateHz;
	let next = 0.02;
	return {
		times,
		values,
		onHalfCycle(channel: number, startS: number, rmsV: number): void {
			times[channel].push(startS);
			values[channel].push(rmsV);
			if (!onFraction) return;
			const f = endS > 0 ? startS / endS : 0;
			if (f >= next) {
				next = f + 0.02;
				onFraction(f);
			}
		},
		/** The series of every channel with values, cut to the shortest, on the first one's window starts. */
		halfCycle(): CaptureTrend['halfCycle'] {
			const used = capture.channels.map((c, k) => ({ c, k })).filter(({ k }) => values[k].length > 0);
			let n = used.length > 0 ? Infinity : 0;
			for (const { k } of used) n = Math.min(n, values[k].length);
			const first = used[0]?.k ?? 0;
			return {
				timeS: Float64Array.from(times[first].slice(0, n)),
				rms: used.map(({ k }) => Float64Array.from(values[k].slice(0, n))),
				channels: used.map(({ c }) => c.name),
			};
		},
	};
}
