/**
 * `npm run bench -- flicker`: the IEC 61000-4-15 flickermeter on one channel at 6400 S/s, 10 minutes of
 * a 230 V, 50 Hz supply with 7 changes/min rectangular modulation (3.84 million samples, generated once
 * into one array), pushed in 65536-sample chunks: the block squares per sample (a square, an addition and a
 * multiply-add), blocks 1-4 and the classification once per 4 samples (at 1600 S/s), Pst.
 *
 * Target: >= 2000x real time per channel on one core (10 minutes in < 0.3 s).
 * Reference measured in the same run over the same samples: one bare second-order IIR section (direct
 * form II transposed), the cheapest recursive filter there is. Blocks 1-4 run eight sections, a division and
 * a classification per chain value (~6x that kernel per value when they ran at the input rate); at a quarter
 * of the input rate, plus the block squares, a ratio of ~2-3x is the expected cost.
 *
 * Then three voltage channels as `sinecheck trend` meets them: 10 minutes x 3 channels at 10 kS/s (the
 * trend bench's rate; D = 5, the chain at 2000 S/s), a different modulation per channel, through three
 * separate meters and through one group of three (createFlickermeterGroup: each three channels' chains in
 * one set of short loops), alternated in the same run after warm-up; the ratio is separate / group (> 1:
 * the group is faster). Both give bit-identical figures (tests/flicker/group.test.ts); the bench checks the
 * Pst. Last, blocks 1-5 alone on the same channels' block squares: three FlickerChain against one ChainGroup.
 */
import { cpus, loadavg } from 'node:os';
import {
	BlockSquares,
	createFlickermeter,
	createFlickermeterGroup,
	designFlickermeter,
} from '../../lib/flicker/index.js';
import { chainStretch, FlickerChain } from '../../lib/flicker/chain.js';
import { ChainGroup } from '../../lib/flicker/chain-group.js';
import { PINST_CLASSES } from '../../lib/flicker/classifier.js';
import { printTable } from './measure.js';

const FS = 6400;
const DURATION_S = 600;
const N = FS * DURATION_S;
const CHUNK = 65_536;
const RUNS = 5;

function generate(): Float64Array {
	const x = new Float64Array(N);
	const a = 230 * Math.SQRT2;
	const w = (2 * Math.PI * 50) / FS;
	for (let i = 0; i < N; i++) {
		const level = Math.floor((i / FS) * (7 / 60)) % 2 === 0 ? 1.0073 : 0.9927;
		x[i] = a * level * Math.sin(w * i);
	}
	return x;
}

function cpuMs(): number {
	const c = process.cpuUsage();
	return (c.user + c.system) / 1000;
}

/** Median wall and CPU ms of RUNS calls after one warm-up. */
function time(fn: () => void): { wall: number; cpu: number } {
	fn();
	const walls: number[] = [],
		cpusMs: number[] = [];
	for (let r = 0; r < RUNS; r++) {
		const c0 = cpuMs(),
			t0 = performance.now();
		fn();
		walls.push(performance.now() - t0);
		cpusMs.push(cpuMs() - c0);
	}
	walls.sort((p, q) => p - q);
	cpusMs.sort((p, q) => p - q);
	return { wall: walls[RUNS >> 1], cpu: cpusMs[RUNS >> 1] };
}

const x = generate();
let pst = NaN;
let decimation = 1;
const flicker = time(() => {
	const m = createFlickermeter({ sampleRateHz: FS, nominalHz: 50 });
	for (let off = 0; off < N; off += CHUNK) m.push(x.subarray(off, Math.min(N, off + CHUNK)));
	pst = m.finish().pst[0].pst;
	decimation = m.design.decimation;
});

// Reference: one biquad (a 10 Hz resonator-ish low-pass; coefficients only need to be stable).
let sink = 0;
const biquad = time(() => {
	const b0 = 0.0002,
		b1 = 0.0004,
		b2 = 0.0002,
		a1 = -1.97,
		a2 = 0.9704;
	let s1 = 0,
		s2 = 0,
		acc = 0;
	for (let off = 0; off < N; off += CHUNK) {
		const end = Math.min(N, off + CHUNK);
		for (let i = off; i < end; i++) {
			const v = x[i];
			const y = b0 * v + s1;
			s1 = b1 * v - a1 * y + s2;
			s2 = b2 * v - a2 * y;
			acc += y;
		}
	}
	sink = acc;
});

const nsPer = (ms: number) => (ms * 1e6) / N;
const realTime = (ms: number) => (DURATION_S * 1000) / ms;
console.log(
	`${cpus().length} cores, load average ${loadavg()
		.map((l) => l.toFixed(2))
		.join(' ')}; 10 min at ${FS} S/s = ${N} samples, median of ${RUNS}`,
);
printTable(
	['kernel', 'wall ms', 'cpu ms', 'ns/sample (cpu)', 'x real time (cpu)', 'x real time (wall)'],
	[
		[
			'flickermeter (block squares, blocks 1-5 at fs/4, Pst)',
			flicker.wall,
			flicker.cpu,
			nsPer(flicker.cpu),
			realTime(flicker.cpu),
			realTime(flicker.wall),
		],
		[
			'one bare biquad (reference)',
			biquad.wall,
			biquad.cpu,
			nsPer(biquad.cpu),
			realTime(biquad.cpu),
			realTime(biquad.wall),
		],
	],
);
const rt = realTime(flicker.cpu);
console.log(
	`block squares: D = ${decimation}, blocks 1-5 at ${FS / decimation} S/s; flickermeter / bare biquad time ratio: ${(flicker.cpu / biquad.cpu).toFixed(1)}x`,
);
console.log(
	`real-time factor per channel (cpu time; wall time counts waiting for a core on a loaded machine): ${rt.toFixed(0)}x (target >= 2000x): ${rt >= 2000 ? 'met' : 'NOT met'}`,
);
console.log(`(Pst of the test signal ${pst.toFixed(3)}; checksum ${sink.toExponential(2)})`);

// --- three channels at 10 kS/s: three separate meters vs one group of three ---
const FS3 = 10_000;
const N3 = FS3 * DURATION_S;
const CPM3 = [7, 39, 110];
/** The three channels, generated once (3 x 48 MB): 230 V, 50 Hz, rectangular modulation of 1 % at 7/39/110 cpm. */
const x3 = CPM3.map((cpm) => {
	const x = new Float64Array(N3);
	const a = 230 * Math.SQRT2,
		w = (2 * Math.PI * 50) / FS3;
	for (let i = 0; i < N3; i++)
		x[i] = a * (Math.floor(((i / FS3) * cpm) / 60) % 2 === 0 ? 1.005 : 0.995) * Math.sin(w * i);
	return x;
});

let pstSeparate: number[] = [],
	pstGroup: number[] = [];
function separate(): void {
	const meters = x3.map(() => createFlickermeter({ sampleRateHz: FS3, nominalHz: 50 }));
	for (let off = 0; off < N3; off += CHUNK)
		for (let k = 0; k < 3; k++) meters[k].push(x3[k].subarray(off, Math.min(N3, off + CHUNK)));
	pstSeparate = meters.map((m) => m.finish().pst[0].pst);
}
function group(): void {
	const g = createFlickermeterGroup(3, { sampleRateHz: FS3, nominalHz: 50 });
	for (let off = 0; off < N3; off += CHUNK) g.push(x3.map((x) => x.subarray(off, Math.min(N3, off + CHUNK))));
	pstGroup = g.finish().map((r) => r.pst[0].pst);
}

/** Median CPU ms of each, RUNS runs alternated after two warm-up runs of each (V8 tier-up). */
function alternate(fns: (() => void)[]): number[] {
	for (let w = 0; w < 2; w++) for (const f of fns) f();
	const t = fns.map((): number[] => []);
	for (let r = 0; r < RUNS; r++)
		fns.forEach((f, k) => {
			const c0 = cpuMs();
			f();
			t[k].push(cpuMs() - c0);
		});
	return t.map((v) => v.sort((p, q) => p - q)[RUNS >> 1]);
}

const [sepMs, groupMs] = alternate([separate, group]);
const nsPerChannelSample = (ms: number) => (ms * 1e6) / (3 * N3);
console.log(
	`\n3 channels x 10 min at ${FS3} S/s (${3 * N3} samples), median cpu of ${RUNS} alternated runs; load average ${loadavg()
		.map((l) => l.toFixed(2))
		.join(' ')}`,
);
printTable(
	['3 voltage channels', 'cpu ms', 'ns/sample/channel', 'x real time (per recording)'],
	[
		['three separate meters (reference)', sepMs, nsPerChannelSample(sepMs), realTime(sepMs)],
		['one group of three', groupMs, nsPerChannelSample(groupMs), realTime(groupMs)],
	],
);
const same = pstSeparate.every((p, k) => Object.is(p, pstGroup[k]));
console.log(
	`separate / group time ratio: ${(sepMs / groupMs).toFixed(2)}x; Pst ${pstGroup.map((p) => p.toFixed(3)).join(', ')} (${same ? 'bit-identical to the separate meters' : 'DIFFERENT from the separate meters'})`,
);

// The chains alone (blocks 1-5 on the block squares of the same three channels, computed once): three
// FlickerChain one after another against one ChainGroup of three.
const design3 = designFlickermeter({ sampleRateHz: FS3, nominalHz: 50 });
const squares3 = x3.map((x) => {
	const out = new Float64Array(Math.ceil(N3 / design3.decimation) + 1);
	return out.subarray(0, new BlockSquares(design3.decimation, 52_900).run(x, 0, N3, out));
});
const M3 = squares3[0].length;
const counts3 = [0, 1, 2].map(() => new Uint32Array(PINST_CLASSES));
const STRETCH = 2000; // chain values per call: the 1 s blocks the meter cuts at
let chainSums: number[] = [];
function chainsApart(): void {
	const chains = [0, 1, 2].map(() => new FlickerChain(design3, 52_900));
	const st = [0, 1, 2].map(() => chainStretch());
	for (let i = 0; i < M3; i += STRETCH)
		for (let k = 0; k < 3; k++) chains[k].run(squares3[k], i, Math.min(M3, i + STRETCH), counts3[k], st[k]);
	chainSums = st.map((s) => s.sum);
}
let groupSums: number[] = [];
function chainsTogether(): void {
	const g = new ChainGroup(design3, [52_900, 52_900, 52_900]);
	const st = [0, 1, 2].map(() => chainStretch());
	for (let i = 0; i < M3; i += STRETCH) g.run(squares3, i, Math.min(M3, i + STRETCH), counts3, st);
	groupSums = st.map((s) => s.sum);
}
const [apartMs, togetherMs] = alternate([chainsApart, chainsTogether]);
const nsPerChainValue = (ms: number) => (ms * 1e6) / (3 * M3);
printTable(
	['blocks 1-5 alone (3 channels)', 'cpu ms', 'ns/chain value/channel'],
	[
		['three FlickerChain (reference)', apartMs, nsPerChainValue(apartMs)],
		['one ChainGroup of three', togetherMs, nsPerChainValue(togetherMs)],
	],
);
console.log(
	`chains: apart / together time ratio ${(apartMs / togetherMs).toFixed(2)}x (${chainSums.every((v, k) => Object.is(v, groupSums[k])) ? 'Pinst sums bit-identical' : 'Pinst sums DIFFER'}); load average ${loadavg()
		.map((l) => l.toFixed(2))
		.join(' ')}`,
);
