/**
 * A 2-hour flicker test recording written as binary COMTRADE files (tests/cli/survey/survey-plt.test.ts
 * says what the signal is and which Pst and Plt it gives).
 *
 * One 230 V, 50 Hz phase at 1600 S/s from 07:59:50 UTC to 10:00:05, its RMS modulated by a rectangular
 * wave of 110 changes per minute, ΔV/V = 0.725 % to 09:00 and 0.3625 % after.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { comtradeCfgText, comtradeDatBytes, type WriterSpec } from '../../sample-waves/writers/comtrade.js';
import { forEachChunk } from './flicker-signals.js';

export const FS = 1600;
export const LEAD_S = 10; // 07:59:50 to the 08:00:00 tick
const FIRST_S = LEAD_S + 3600; // to 09:00:00, ΔV/V = 0.725 %
const SECOND_S = 3605; // to 10:00:05, ΔV/V = 0.3625 %
const START_MS = Date.parse('2026-05-04T07:59:50Z');
const DV = 0.00725;

/** The whole signal: 50 Hz × 3610 s is a whole number of cycles, so the second part continues the wave. */
function signal(): Float64Array {
	const x = new Float64Array(Math.round((FIRST_S + SECOND_S) * FS));
	let at = 0;
	for (const [durationS, dv] of [
		[FIRST_S, DV],
		[SECOND_S, DV / 2],
	])
		forEachChunk(
			{
				sampleRateHz: FS,
				mainsHz: 50,
				rmsV: 230,
				durationS,
				modulation: { shape: 'rectangular', changesPerMinute: 110, deltaVOverV: dv },
			},
			(c) => {
				x.set(c, at);
				at += c.length;
			},
		);
	return x;
}

function stamp(sample: number): string {
	const d = new Date(START_MS + (sample * 1000) / FS);
	const p = (v: number, w = 2) => String(v).padStart(w, '0');
	const us = Math.round(((sample * 1e6) / FS) % 1e6);
	return `${p(d.getUTCDate())}/${p(d.getUTCMonth() + 1)}/${d.getUTCFullYear()},${p(d.getUTCHours())}:${p(d.getUTCMinutes())}:${p(d.getUTCSeconds())}.${p(us, 6)}`;
}

/** The recording cut at `cutsS` (s from its first sample) into part1.cfg/.dat ... in `folder`. */
export function writePltRecording(folder: string, cutsS: number[]): void {
	const x = signal();
	mkdirSync(folder, { recursive: true });
	const edges = [0, ...cutsS.map((t) => Math.round(t * FS)), x.length];
	for (let k = 0; k + 1 < edges.length; k++) {
		const spec: WriterSpec = {
			station: 'Tallowmere Joinery',
			device: 'flicker logger',
			revYear: 2013,
			lineFrequencyHz: 50,
			rates: [{ sampleRateHz: FS, endSample: edges[k + 1] - edges[k] }],
			firstData: stamp(edges[k]),
			trigger: stamp(edges[k]),
			fileType: 'BINARY32',
			analog: [{ name: 'L1', phase: 'A', unit: 'V', a: 1e-6, values: x.subarray(edges[k], edges[k + 1]) }],
		};
		writeFileSync(join(folder, `part${k + 1}.cfg`), comtradeCfgText(spec));
		writeFileSync(join(folder, `part${k + 1}.dat`), comtradeDatBytes(spec));
	}
}
