// @vitest-environment jsdom
// Switching the limit table in the UI runs only lib/report's limit step on the report the page has: the
// worker gets no new analysis, and the result equals a full analysis with that table (the CLI's route).
import { describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { Session, type SourceFile } from '../../src/ui/state/session.svelte.js';
import type { WorkerLike } from '../../src/ui/state/analysis-client.js';
import { handleMessage } from '../../src/ui/worker-core.js';
import type { FromWorker, ToWorker } from '../../src/ui/protocol.js';
import { harmonicSamples } from '../helpers/synth.js';

function recordingWorker(sent: ToWorker['type'][]): () => WorkerLike {
	return () => {
		const w: WorkerLike = {
			onmessage: null,
			postMessage(msg: ToWorker) {
				sent.push(msg.type);
				const copy = structuredClone(msg);
				setTimeout(
					() =>
						handleMessage(copy, (reply: FromWorker) =>
							w.onmessage?.({ data: structuredClone(reply) } as MessageEvent<FromWorker>),
						),
					0,
				);
			},
			terminate() {},
		};
		return w;
	};
}

// 230 V with a 5 % 5th harmonic (11.5 V, closed form from the synthesised tones); each table gives its own rows
function csvText(): string {
	const fs = 6400;
	const u = harmonicSamples(
		[
			{ order: 1, rms: 230 },
			{ order: 5, rms: 11.5 },
		],
		{ frequencyHz: 50, sampleRateHz: fs, cycles: 20 },
	);
	return ['t (s),U1 (V)', ...Array.from(u, (v, k) => `${(k / fs).toFixed(7)},${v.toFixed(5)}`)].join('\n') + '\n';
}

describe('limit step in the UI', () => {
	it('setLimits switches tables without a new analysis and gives what a full analysis with that table gives', async () => {
		const text = csvText();
		const bytes = new TextEncoder().encode(text);
		const file: SourceFile = { name: 'board.csv', read: async () => bytes.slice().buffer };
		const sent: ToWorker['type'][] = [];
		const s = new Session(recordingWorker(sent));
		const [key] = await s.open([file]);
		const before = sent.length;
		const capture = openCaptures([{ name: 'board.csv', bytes }]).captures[0];
		for (const id of ['iec61000-2-2', 'ieee519', undefined] as const) {
			await s.setLimits(id);
			const item = s.items.find((c) => c.key === key)!;
			expect(sent.slice(before)).toEqual([]); // nothing went to the worker
			expect(item.report).toEqual(analyseCapture(capture, { ...item.analysis, limits: id }));
		}
		s.dispose();
	});
});
