/**
 * The worker moves an opened capture's sample buffers to the page instead of copying them, so it keeps no
 * capture of its own afterwards: the next analysis of that capture asks the page for it ('missing'), and
 * after the page sends it back ('seed') the analysis runs on the same samples. Checked against the closed
 * form of the generated signal: a 230 V RMS sine (peak 230·√2) reads 230 V.
 */
import { describe, expect, it } from 'vitest';
import { handleMessage } from '../../src/ui/worker-core.js';
import type { FromWorker } from '../../src/ui/protocol.js';

const FS = 5000;

function csvBytes(): ArrayBuffer {
	const lines = ['t (s),U1 (V)'];
	for (let k = 0; k < FS; k++)
		lines.push(`${(k / FS).toFixed(4)},${(230 * Math.SQRT2 * Math.sin((2 * Math.PI * 50 * k) / FS)).toFixed(4)}`);
	return new TextEncoder().encode(lines.join('\n') + '\n').buffer as ArrayBuffer;
}

async function reply(send: (post: (m: FromWorker) => void) => void, want: FromWorker['type'][]): Promise<FromWorker> {
	return new Promise((resolve) => send((m) => want.includes(m.type) && resolve(m)));
}

describe('worker: an opened capture is moved to the page, not copied', () => {
	it('open lists every sample buffer for transfer; the next analysis asks for the capture, then reads 230 V', async () => {
		const transfers: unknown[][] = [];
		const opened = await new Promise<FromWorker>((resolve) =>
			handleMessage(
				{
					type: 'open',
					jobId: 1,
					captureKey: 'moved',
					files: [{ name: 'moved.csv', bytes: csvBytes() }],
					overrides: {},
					analysis: {},
				},
				((m: FromWorker, transfer?: unknown[]) => {
					if (m.type === 'opened') {
						transfers.push(transfer ?? []);
						resolve(m);
					}
				}) as (m: FromWorker) => void,
			),
		);
		if (opened.type !== 'opened') throw new Error(opened.type);
		expect(transfers[0]).toContain(opened.capture.channels[0].samples.buffer);
		const missing = await reply(
			(post) => handleMessage({ type: 'analyse', jobId: 2, captureKey: 'moved', analysis: {} }, post),
			['missing', 'analysed', 'failed'],
		);
		expect(missing.type).toBe('missing');
		handleMessage({ type: 'seed', captureKey: 'moved', capture: opened.capture }, () => {});
		const analysed = await reply(
			(post) => handleMessage({ type: 'analyse', jobId: 3, captureKey: 'moved', analysis: {} }, post),
			['missing', 'analysed', 'failed'],
		);
		if (analysed.type !== 'analysed') throw new Error(analysed.type);
		expect(analysed.report.channels[0].rms).toBeCloseTo(230, 2);
	});
});
