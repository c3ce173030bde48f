// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { openCaptures } from '../../lib/io/open.js';
import { analyseCapture } from '../../lib/report/analyse.js';
import { Session, type SourceFile } from '../../src/ui/state/session.svelte.js';
import type { WorkerLike } from '../../src/ui/state/analysis-client.js';
import { handleMessage } from '../../src/ui/worker-core.js';
import type { FromWorker, ToWorker } from '../../src/ui/protocol.js';
import { sineSamples } from '../helpers/synth.js';

/** The real worker code, run in-process and answering asynchronously like a Worker. */
function inProcessWorker(counter: { made: number }, silent = false): () => WorkerLike {
	return () => {
		counter.made++;
		const w: WorkerLike = {
			onmessage: null,
			postMessage(msg: ToWorker) {
				if (silent) return;
				const copy = structuredClone(msg);
				setTimeout(
					() =>
						handleMessage(copy, (reply: FromWorker) =>
							w.onmessage?.({ data: structuredClone(reply) } as MessageEvent<FromWorker>),
						),
					0,
				);
			},
			terminate() {
				silent = true;
			},
		};
		return w;
	};
}

function csvFile(name: string, text: string): SourceFile {
	const bytes = new TextEncoder().encode(text);
	return { name, read: async () => bytes.slice().buffer };
}

function demoCsv(): string {
	const fs = 5000;
	const u = sineSamples({ amplitude: 325, frequencyHz: 50, sampleRateHz: fs, cycles: 12 });
	const i = sineSamples({ amplitude: 14.1, frequencyHz: 50, sampleRateHz: fs, cycles: 12, phaseDeg: -36.87 });
	const rows = ['t (s),U1 (V),I1 (A)'];
	for (let k = 0; k < u.length; k++) rows.push(`${(k / fs).toFixed(6)},${u[k].toFixed(4)},${i[k].toFixed(5)}`);
	return rows.join('\n') + '\n';
}

describe('Session', () => {
	it('open() of a CSV gives the capture and the very report lib/report computes for the same bytes', async () => {
		const text = demoCsv();
		const s = new Session(inProcessWorker({ made: 0 }));
		const [key] = await s.open([csvFile('feeder.csv', text)]);
		const item = s.items.find((c) => c.key === key)!;
		expect(item.status).toBe('ready');
		expect(s.selectedKey).toBe(key);
		const direct = analyseCapture(
			openCaptures([{ name: 'feeder.csv', bytes: new TextEncoder().encode(text) }]).captures[0],
			{ limits: 'en50160' },
		);
		expect(item.report).toEqual(direct);
		expect(item.capture?.channels.map((c) => c.name)).toEqual(['U1', 'I1']);
		expect(item.extras?.cycleBoundariesS.length).toBe(direct.cyclesAnalysed + 1);
		s.dispose();
	});

	it('open() of a CSV with a bad cell shows the importer error with its line and column, and keeps the session', async () => {
		const s = new Session(inProcessWorker({ made: 0 }));
		await s.open([csvFile('good.csv', demoCsv())]);
		const [bad] = await s.open([csvFile('bad.csv', 't (s),U1 (V)\n0,1\n0.001,2\n0.002,abc\n0.003,4\n0.004,5\n')]);
		const item = s.items.find((c) => c.key === bad)!;
		expect(item.status).toBe('error');
		// "abc" starts at the 7th character of line 4 ("0.002,abc"): 1-based line and column per the ImportError contract
		expect(item.problems[0]).toMatchObject({
			source: 'bad.csv',
			line: 4,
			column: 7,
			code: 'bad-number',
			text: 'abc',
			lineText: '0.002,abc',
		});
		expect(s.items.filter((c) => c.status === 'ready')).toHaveLength(1);
		s.dispose();
	});

	it('reanalyse(key, { refChannel }) makes the chosen channel the reference, as lib/report does for the same option', async () => {
		const s = new Session(inProcessWorker({ made: 0 }));
		const [key] = await s.open([csvFile('feeder.csv', demoCsv())]);
		await s.reanalyse(key, { refChannel: 'I1' });
		const item = s.items.find((c) => c.key === key)!;
		expect(item.report?.referenceChannel).toBe('I1');
		// U1 leads I1 by the load angle: a pair with a negative lag (leads) of about 36.87° (atan(3/4), the 3-4-5 triangle)
		expect(item.report?.pairs.find((p) => p.other === 'U1')?.lagDeg).toBeCloseTo(-36.87, 1);
		s.dispose();
	});

	it('cancel() stops a running import, marks it stopped, and the next open works on a fresh worker', async () => {
		const counter = { made: 0 };
		let first = true;
		const factory = inProcessWorker(counter);
		const s = new Session(() => {
			if (first) {
				first = false;
				return inProcessWorker(counter, true)(); // a worker that never answers
			}
			return factory();
		});
		const pending = s.open([csvFile('slow.csv', demoCsv())]);
		await new Promise((r) => setTimeout(r, 10));
		expect(s.busy).toBe(true);
		s.cancel();
		await pending;
		expect(s.items[0].status).toBe('cancelled');
		expect(s.notice).toContain('Stopped');
		expect(s.busy).toBe(false);
		await s.open([csvFile('next.csv', demoCsv())]);
		expect(s.items[1].status).toBe('ready');
		expect(counter.made).toBe(2);
		s.dispose();
	});

	it('close(key) removes a capture and selects another ready one', async () => {
		const s = new Session(inProcessWorker({ made: 0 }));
		const [a] = await s.open([csvFile('a.csv', demoCsv())]);
		const [b] = await s.open([csvFile('b.csv', demoCsv())]);
		expect(s.selectedKey).toBe(b);
		s.close(b);
		expect(s.items.map((c) => c.key)).toEqual([a]);
		expect(s.selectedKey).toBe(a);
		s.dispose();
	});
});
