/** A Capture around channels made by the tests (closed-form signals), as an importer would return it. */
import type { Capture, Channel, Quantity } from '../../lib/capture.js';

export function channelOf(name: string, unit: string, quantity: Quantity, samples: Float64Array): Channel {
	return { name, unit, quantity, samples };
}

export function captureOf(
	channels: Channel[],
	sampleRateHz: number,
	source = 'test.csv',
	diagnostics: Capture['diagnostics'] = [],
): Capture {
	return { source, sampleRateHz, startS: 0, channels, metadata: {}, diagnostics };
}
