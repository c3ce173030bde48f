/**
 * Phasor diagram entries from a report: each channel's fundamental RMS (harmonic order 1) and its angle
 * against the reference, taken as −lagDeg of the report's pair (lag positive = clockwise on the diagram).
 */
import type { AnalysisReport } from '../../../lib/report/types.js';

export interface PhasorEntry {
	name: string;
	unit: string;
	quantity: string;
	/** Fundamental RMS, channel unit. */
	rms: number;
	/** Angle relative to the reference, degrees, counter-clockwise positive (= −lagDeg). */
	angleDeg: number;
	colour: string;
}

/** One entry per channel with a fundamental; the reference at 0°. */
export function phasorEntries(report: AnalysisReport, colours: Record<string, string>): PhasorEntry[] {
	return report.channels
		.filter((ch) => ch.quantity !== 'other' || report.channels.length < 4)
		.map((ch) => {
			const pair = report.pairs.find((p) => p.other === ch.name);
			const angleDeg = ch.name === report.referenceChannel ? 0 : pair ? -pair.lagDeg : NaN;
			return {
				name: ch.name,
				unit: ch.unit,
				quantity: ch.quantity,
				rms: ch.harmonics[1]?.rms ?? NaN,
				angleDeg,
				colour: colours[ch.name] ?? '#333',
			};
		});
}
