/**
 * Writes the demo captures of Tallowmere Joinery (a made-up joinery workshop) and their ground truth.
 * Run with `npm run sample-waves`. Every signal is built in closed form (model.ts) and written by the small
 * writers in writers/; ground-truth.json records the construction and the figures that follow from it.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
	type ChannelModel,
	type Harmonic,
	channelTruth,
	pairTruth,
	sequenceTruth,
	shifted,
	synthesise,
	wrapDeg,
} from './model.js';
import { comtradeCfgText, comtradeDatBytes } from './writers/comtrade.js';
import { csvText } from './writers/csv.js';
import { wavFloat32Bytes } from './writers/wav.js';

const OUT = dirname(fileURLToPath(import.meta.url));
const SITE = 'Tallowmere Joinery (made-up site for demonstration)';

interface FileTruth {
	file: string;
	companions: string[];
	layout: string;
	description: string;
	fundamentalHz: number;
	sampleRateHz: number;
	samples: number;
	startS: number;
	channelCount: number;
	digitalCount: number;
	channels: ReturnType<typeof describeChannel>[];
	power: (ReturnType<typeof pairTruth> & { note?: string })[];
	threePhase: (ReturnType<typeof sequenceTruth> & { window?: string })[];
	events: {
		channel: string;
		kind: string;
		startS: number;
		durationS: number;
		residualPct: number;
		residualRms: number;
	}[];
}

function describeChannel(ch: ChannelModel, sampleRateHz: number, n: number, fileUnitNote?: string) {
	const steady = channelTruth(ch);
	// Whole-record RMS with the envelope: Σ over samples of factor², whole cycles in every segment.
	let sumF2 = 0;
	for (let k = 0; k < n; k++) {
		const t = k / sampleRateHz;
		const e = (ch.envelope ?? []).find((x) => t >= x.fromS - 1e-12 && t < x.toS - 1e-12);
		sumF2 += (e?.factor ?? 1) ** 2;
	}
	return {
		name: ch.name,
		unit: ch.unit,
		quantity: ch.unit === 'V' ? 'voltage' : 'current',
		phase: ch.phase ?? null,
		...(fileUnitNote ? { note: fileUnitNote } : {}),
		harmonics: ch.harmonics.map((h) => ({
			order: h.order,
			rms: h.rms,
			phaseDeg: wrapDeg(h.phaseDeg),
			phaseDegCos: wrapDeg(h.phaseDeg - 90),
		})),
		envelope: ch.envelope ?? [],
		expected: {
			steadyRms: steady.rms,
			fundamentalRms: steady.fundamentalRms,
			thdFPct: steady.thdFPct,
			thdRPct: steady.thdRPct,
			recordRms: steady.rms * Math.sqrt(sumF2 / n),
		},
	};
}

const truths: FileTruth[] = [];
const write = (name: string, data: string | Uint8Array) => writeFileSync(join(OUT, name), data);
const columns = (chs: ChannelModel[], f: number, fs: number, n: number) => chs.map((c) => synthesise(c, f, fs, n));
const h = (order: number, rms: number, phaseDeg: number): Harmonic => ({ order, rms, phaseDeg });

// --- A: office and charger sub-feeder, rectifier loads (PCs, LED drivers, tool-battery chargers) -----------
{
	const f = 50,
		fs = 10_000,
		n = 10_000; // 1 s, 50 whole cycles
	// Voltage flat-topped by the rectifier loads: 3rd, 5th and 7th phased to pull the crest down at ωt = 90°.
	const u: ChannelModel = {
		name: 'U1',
		unit: 'V',
		phase: 'L1',
		harmonics: [h(1, 230, 0), h(3, 5.29, 0), h(5, 6.9, 180), h(7, 2.3, 0)],
	};
	// Capacitor-input rectifier current: narrow pulses at the voltage crest (peak at ωt = 86°, 4° leading);
	// phase of order h = 90° − h·86° so every harmonic peaks with the fundamental.
	const peakDeg = 86;
	const iH = [
		[1, 8.0],
		[3, 6.0],
		[5, 4.0],
		[7, 2.24],
		[9, 0.96],
		[11, 0.48],
	].map(([o, r]) => h(o, r, wrapDeg(90 - o * peakDeg)));
	const i: ChannelModel = { name: 'I1', unit: 'A', phase: 'L1', harmonics: iH };
	const t = Float64Array.from({ length: n }, (_, k) => k / fs);
	const [uu, ii] = columns([u, i], f, fs, n);
	write(
		'feeder-rectifiers.csv',
		csvText({
			delimiter: ',',
			names: ['t (s)', 'U1 (V)', 'I1 (A)'],
			columns: [t, uu, ii],
			decimals: [4, 2, 3],
			lineEnd: '\n',
		}),
	);
	truths.push({
		file: 'feeder-rectifiers.csv',
		companions: [],
		layout: 'comma-separated, header `t (s),U1 (V),I1 (A)`, time column in seconds, LF',
		description:
			'Single-phase sub-feeder to the office and charging bench: rectifier loads draw pulsed current (strong 3rd and 5th); the voltage is flat-topped.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: 0,
		channelCount: 2,
		digitalCount: 0,
		channels: [describeChannel(u, fs, n), describeChannel(i, fs, n)],
		power: [pairTruth(u, i)],
		threePhase: [],
		events: [],
	});
}

// --- B: wood-chip boiler circulation pump on a 6-pulse drive (semicolon, decimal comma, preamble) ------------
{
	const f = 50,
		fs = 10_000,
		n = 10_000;
	const vBase = [h(1, 230, 0), h(5, 3.45, 180), h(7, 2.3, 0)];
	// Six-pulse bridge current: Fourier series sin x − sin 5x/5 − sin 7x/7 + sin 11x/11 + sin 13x/13 − …, with
	// x = ωt + φ1 (from memory, textbook six-step wave); magnitudes reduced by the drive's DC choke.
	// DPF 0.95 -> the fundamental lags by acos(0.95) = 18.19°.
	const phi1 = -(Math.acos(0.95) * 180) / Math.PI;
	const sixPulse: [number, number, number][] = [
		[1, 12, 0],
		[5, 3.96, 180],
		[7, 1.32, 180],
		[11, 0.84, 0],
		[13, 0.54, 0],
		[17, 0.36, 180],
		[19, 0.3, 180],
	];
	const iBase = sixPulse.map(([o, r, sign]) => h(o, r, wrapDeg(o * phi1 + sign)));
	const shifts = [0, -120, 120];
	const us = shifts.map((s, k): ChannelModel => ({
		name: `U${k + 1}`,
		unit: 'V',
		phase: `L${k + 1}`,
		harmonics: shifted(vBase, s),
	}));
	const is = shifts.map((s, k): ChannelModel => ({
		name: `I${k + 1}`,
		unit: 'A',
		phase: `L${k + 1}`,
		harmonics: shifted(iBase, s),
	}));
	const t = Float64Array.from({ length: n }, (_, k) => k / fs);
	const data = columns([...us, ...is], f, fs, n);
	write(
		'pump-drive.csv',
		csvText({
			delimiter: ';',
			decimalComma: true,
			preamble: [
				'Site;Tallowmere Joinery',
				'Point;boiler room, pump drive input terminals',
				'Start;2026-10-14 09:12:05',
				'Sample interval;0,0001;s',
				'',
			],
			names: ['Time', 'U1', 'U2', 'U3', 'I1', 'I2', 'I3'],
			units: ['s', 'V', 'V', 'V', 'A', 'A', 'A'],
			columns: [t, ...data],
			decimals: [4, 2, 2, 2, 3, 3, 3],
		}),
	);
	truths.push({
		file: 'pump-drive.csv',
		companions: [],
		layout: 'semicolon-separated, decimal comma, 5-line preamble (`key;value[;unit]`), names row then units row, CRLF',
		description:
			'Three-phase input of the 6-pulse drive on the wood-chip boiler circulation pump: displacement PF 0.95, true PF lower because of the 5th/7th/11th/13th currents.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: 0,
		channelCount: 6,
		digitalCount: 0,
		channels: [...us, ...is].map((c) => describeChannel(c, fs, n)),
		power: us.map((u, k) => pairTruth(u, is[k])),
		threePhase: [
			sequenceTruth(us as [ChannelModel, ChannelModel, ChannelModel]),
			sequenceTruth(is as [ChannelModel, ChannelModel, ChannelModel]),
		],
		events: [],
	});
}

// --- C: machine-shop distribution board, phase L3 sagging under a long single-phase load ---------------------
{
	const f = 50,
		fs = 10_000,
		n = 10_000;
	const us: ChannelModel[] = [
		{ name: 'U1', unit: 'V', phase: 'L1', harmonics: [h(1, 231, 0), h(5, 4.6, 180)] },
		{ name: 'U2', unit: 'V', phase: 'L2', harmonics: [h(1, 229, -120.5), h(5, 4.6, wrapDeg(180 - 5 * 120.5))] },
		{ name: 'U3', unit: 'V', phase: 'L3', harmonics: [h(1, 212, 118.0), h(5, 4.2, wrapDeg(180 + 5 * 118))] },
	];
	const is: ChannelModel[] = [
		{ name: 'I1', unit: 'A', phase: 'L1', harmonics: [h(1, 18, -25), h(3, 1.2, 30)] },
		{ name: 'I2', unit: 'A', phase: 'L2', harmonics: [h(1, 15, -147), h(3, 1.0, 40)] },
		{ name: 'I3', unit: 'A', phase: 'L3', harmonics: [h(1, 31, 96), h(3, 2.1, 20)] },
	];
	const tMs = Float64Array.from({ length: n }, (_, k) => (1000 * k) / fs);
	const data = columns([...us, ...is], f, fs, n);
	write(
		'board-unbalance.csv',
		csvText({
			delimiter: ',',
			names: ['t [ms]', 'U1 [V]', 'U2 [V]', 'U3 [V]', 'I1 [A]', 'I2 [A]', 'I3 [A]'],
			columns: [tMs, ...data],
			decimals: [1, 2, 2, 2, 3, 3, 3],
		}),
	);
	truths.push({
		file: 'board-unbalance.csv',
		companions: [],
		layout: 'comma-separated, header with units in brackets `U1 [V]`, time column in milliseconds, CRLF',
		description:
			'Machine-shop distribution board: L3 sags to 212 V under the heavy single-phase load of the edge bander; unbalanced voltages and currents, positive (L1-L2-L3) rotation.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: 0,
		channelCount: 6,
		digitalCount: 0,
		channels: [...us, ...is].map((c) => describeChannel(c, fs, n)),
		power: us.map((u, k) => pairTruth(u, is[k])),
		threePhase: [
			sequenceTruth(us as [ChannelModel, ChannelModel, ChannelModel]),
			sequenceTruth(is as [ChannelModel, ChannelModel, ChannelModel]),
		],
		events: [],
	});
}

// --- D: clamp recorder on the spindle moulder motor supply (WAV float32, calibration in the INFO comment) -----
{
	const f = 50,
		fs = 12_800,
		n = 25_600; // 2 s, 256 samples per cycle
	const u: ChannelModel = {
		name: 'U1',
		unit: 'V',
		phase: 'L1',
		harmonics: [h(1, 232, 0), h(3, 2.32, 0), h(5, 5.8, 180)],
	};
	const i: ChannelModel = {
		name: 'I1',
		unit: 'A',
		phase: 'L1',
		harmonics: [h(1, 9.5, -38), h(5, 0.29, wrapDeg(180 - 5 * 38)), h(7, 0.19, wrapDeg(-7 * 38))],
	};
	const fullScaleV = 500,
		fullScaleA = 50;
	const [uu, ii] = columns([u, i], f, fs, n);
	const comment = `Clamp recorder on the spindle moulder supply, ${SITE}.\nsinecheck-calibration: 1=U1 V ${fullScaleV}; 2=I1 A ${fullScaleA}`;
	write(
		'spindle-clamp.wav',
		wavFloat32Bytes([uu.map((x) => x / fullScaleV), ii.map((x) => x / fullScaleA)], fs, {
			INAM: 'spindle moulder supply',
			ICMT: comment,
		}),
	);
	truths.push({
		file: 'spindle-clamp.wav',
		companions: [],
		layout: `WAV, 2 channels, IEEE float 32-bit, ${fs} Hz; calibration in the INFO comment (ICMT): 1=U1 V ${fullScaleV}; 2=I1 A ${fullScaleA} (value at full scale 1.0)`,
		description:
			'Single-phase supply of the spindle moulder motor: induction-motor current lagging 38° (DPF 0.79), mildly distorted voltage.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: 0,
		channelCount: 2,
		digitalCount: 0,
		channels: [describeChannel(u, fs, n), describeChannel(i, fs, n)],
		power: [pairTruth(u, i)],
		threePhase: [],
		events: [],
	});
}

// --- E: incomer protection relay record of a dip on L2 (COMTRADE 1999 ASCII, voltages in kV) -----------------
{
	const f = 50,
		fs = 6400,
		n = 3840; // 0.6 s = 30 cycles, 128 samples per cycle
	const preS = 0.1,
		dipS = 0.12,
		residual = 0.55; // dip from the trigger for 6 cycles, to 55 %
	const vBase = [h(1, 230, 0), h(5, 4.6, 180)];
	const iBase = [h(1, 42, -20), h(5, 2.1, 0), h(7, 1.3, 180)];
	const shifts = [0, -120, 120];
	const us = shifts.map((s, k): ChannelModel => ({
		name: `U${'abc'[k]}`,
		unit: 'V',
		phase: 'ABC'[k],
		harmonics: shifted(vBase, s),
		...(k === 1 ? { envelope: [{ fromS: preS, toS: preS + dipS, factor: residual }] } : {}),
	}));
	const is = shifts.map((s, k): ChannelModel => ({
		name: `I${'abc'[k]}`,
		unit: 'A',
		phase: 'ABC'[k],
		harmonics: shifted(iBase, s),
	}));
	const data = columns([...us, ...is], f, fs, n);
	const pickup = Array.from({ length: n }, (_, k) => (k / fs >= preS && k / fs < preS + dipS ? 1 : 0));
	const spec = {
		station: 'Tallowmere Joinery incomer',
		device: 'relay-1',
		revYear: 1999 as const,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: fs, endSample: n }],
		firstData: '14/10/2026,07:42:18.400000',
		trigger: '14/10/2026,07:42:18.500000',
		fileType: 'ASCII' as const,
		analog: [
			...us.map((u, k) => ({
				name: u.name,
				phase: u.phase,
				circuit: 'incomer',
				unit: 'kV',
				values: data[k].map((x) => x / 1000),
				primary: 1,
				secondary: 1,
				ps: 'P' as const,
			})),
			...is.map((c, k) => ({
				name: c.name,
				phase: c.phase,
				circuit: 'incomer',
				unit: 'A',
				values: data[3 + k],
				primary: 400,
				secondary: 1,
				ps: 'P' as const,
			})),
		],
		digital: [{ name: 'U< pickup', normalState: 0 as const, states: pickup }],
	};
	write('incomer-dip.cfg', comtradeCfgText(spec));
	write('incomer-dip.dat', comtradeDatBytes(spec));
	truths.push({
		file: 'incomer-dip.cfg',
		companions: ['incomer-dip.dat'],
		layout: 'COMTRADE 1999, ASCII data, CRLF; voltages written in kV (a·x+b, PS = P), currents in A; 1 digital channel',
		description:
			'Incomer relay record: a dip on phase B to 55 % for 6 cycles starting at the trigger (0.1 s into the record); currents steady.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: -preS,
		channelCount: 6,
		digitalCount: 1,
		channels: [...us, ...is].map((c) =>
			describeChannel(c, fs, n, c.unit === 'V' ? 'written in kV in the file; ground truth in V' : undefined),
		),
		power: us.map((u, k) => ({
			...pairTruth(u, is[k]),
			note: 'outside the dip (phase B: before 0 s and from 0.12 s after the trigger)',
		})),
		threePhase: [
			{ ...sequenceTruth(us as [ChannelModel, ChannelModel, ChannelModel]), window: 'outside the dip' },
			{
				...sequenceTruth([us[0], { ...us[1], harmonics: shifted(us[1].harmonics, 0, residual) }, us[2]]),
				window: 'during the dip (0 to 0.12 s after the trigger)',
			},
		],
		events: [
			{
				channel: 'Ub',
				kind: 'dip',
				startS: 0,
				durationS: dipS,
				residualPct: 100 * residual,
				residualRms: residual * channelTruth(us[1]).rms,
			},
		],
	});
}

// --- F: hire generator (a 60 Hz set) feeding the dust extractor (COMTRADE 2013 BINARY, secondary values) ------
{
	const f = 60,
		fs = 7680,
		n = 3840; // 0.5 s = 30 cycles, 128 samples per cycle
	const vtRatio = 480 / 120,
		ctRatio = 200 / 5;
	const vBase = [h(1, 277, 0), h(5, 8.31, 0), h(7, 4.16, 180)];
	const iBase = [h(1, 85, -30), h(5, 3.4, 30), h(7, 1.7, -30)];
	const shifts = [0, -120, 120];
	const us = shifts.map((s, k): ChannelModel => ({
		name: `V${'ABC'[k]}`,
		unit: 'V',
		phase: 'ABC'[k],
		harmonics: shifted(vBase, s),
	}));
	const is = shifts.map((s, k): ChannelModel => ({
		name: `I${'ABC'[k]}`,
		unit: 'A',
		phase: 'ABC'[k],
		harmonics: shifted(iBase, s),
	}));
	const data = columns([...us, ...is], f, fs, n);
	const spec = {
		station: 'Tallowmere Joinery generator',
		device: 'gen-relay',
		revYear: 2013 as const,
		lineFrequencyHz: 60,
		rates: [{ sampleRateHz: fs, endSample: n }],
		firstData: '02/11/2026,13:05:59.950000',
		trigger: '02/11/2026,13:06:00.000000',
		fileType: 'BINARY' as const,
		analog: [
			...us.map((u, k) => ({
				name: u.name,
				phase: u.phase,
				circuit: 'generator',
				unit: 'V',
				values: data[k].map((x) => x / vtRatio),
				primary: 480,
				secondary: 120,
				ps: 'S' as const,
			})),
			...is.map((c, k) => ({
				name: c.name,
				phase: c.phase,
				circuit: 'generator',
				unit: 'A',
				values: data[3 + k].map((x) => x / ctRatio),
				primary: 200,
				secondary: 5,
				ps: 'S' as const,
			})),
		],
	};
	write('generator-60hz.cfg', comtradeCfgText(spec));
	write('generator-60hz.dat', comtradeDatBytes(spec));
	truths.push({
		file: 'generator-60hz.cfg',
		companions: ['generator-60hz.dat'],
		layout:
			'COMTRADE 2013, BINARY (int16) data; secondary values (PS = S) with VT 480:120 and CT 200:5; primary values in the ground truth',
		description:
			'Hire generator (a 60 Hz set) feeding the dust extractor during a supply outage: 277 V line-to-neutral with slot harmonics, 85 A lagging 30°.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: -0.05,
		channelCount: 6,
		digitalCount: 0,
		channels: [...us, ...is].map((c) => describeChannel(c, fs, n, 'secondary in the file; ground truth in primary')),
		power: us.map((u, k) => pairTruth(u, is[k])),
		threePhase: [
			sequenceTruth(us as [ChannelModel, ChannelModel, ChannelModel]),
			sequenceTruth(is as [ChannelModel, ChannelModel, ChannelModel]),
		],
		events: [],
	});
}

// --- G: single-shot scope capture of the moulder's drive input (8-bit, 1 MS/s, one cycle, trigger mid-record) -----
{
	const f = 50.2,
		fs = 1_000_000,
		n = 20_000; // 20 ms: 1.004 cycles; trigger on U's rising zero crossing at t = 0
	const preS = 0.01;
	const atStart = -360 * f * preS; // phase at the first sample of a wave crossing zero upwards at the trigger
	const lagDeg = 25;
	const u: ChannelModel = { name: 'CH1', unit: 'V', harmonics: [h(1, 230, atStart), h(5, 4.6, 5 * atStart + 180)] };
	const i: ChannelModel = {
		name: 'CH2',
		unit: 'A',
		harmonics: [h(1, 10, atStart - lagDeg), h(3, 3, 3 * (atStart - lagDeg) - 30)],
	};
	const [uu, ii] = columns([u, i], f, fs, n);
	// the scope reads the probe tip / clamp output: ±4 V and ±2 V full scale in 256 codes
	const probe = 100,
		clampVPerA = 0.1;
	const code = (x: number, fullScaleV: number) =>
		Math.max(-128, Math.min(127, Math.round((x / (2 * fullScaleV)) * 256))) * ((2 * fullScaleV) / 256);
	const t = Float64Array.from({ length: n }, (_, k) => -preS + k / fs);
	const ch1 = uu.map((x) => code(x / probe, 4));
	const ch2 = ii.map((x) => code(x * clampVPerA, 2));
	write(
		'moulder-drive-scope.csv',
		csvText({
			delimiter: ',',
			lineEnd: '\r\n',
			decimals: [7, 5, 6],
			names: ['Time', 'CH1', 'CH2'],
			columns: [t, ch1, ch2],
			preamble: [
				'Record Length,20000',
				'Sample Interval,1e-06',
				'Trigger Point,10000',
				'Vertical Units,V,V',
				'Vertical Scale,1,0.5',
				'Probe Attenuation,100,100 mV/A',
			],
		}),
	);
	truths.push({
		file: 'moulder-drive-scope.csv',
		companions: [],
		layout:
			'scope single-shot CSV, CRLF: preamble (vertical units per channel, probe attenuation x100 and a 100 mV/A clamp), Time from −10 ms, values at the probe tip / clamp output in 8-bit codes (±4 V and ±2 V full scale)',
		description:
			'Single shot across the spindle moulder drive input: one cycle (20 ms at 1 MS/s) of 230 V with a 2 % 5th and the drive current (10 A lagging 25° with a 30 % 3rd), trigger on the voltage rising through zero mid-record.',
		fundamentalHz: f,
		sampleRateHz: fs,
		samples: n,
		startS: -preS,
		channelCount: 2,
		digitalCount: 0,
		channels: [
			describeChannel(u, fs, n, 'CH1 through a x100 probe, 8-bit codes of ±4 V; ground truth in V'),
			describeChannel(i, fs, n, 'CH2 through a 100 mV/A clamp, 8-bit codes of ±2 V; ground truth in A'),
		].map((c, k) => {
			// 1.004 cycles is not a whole number: the whole-record RMS is that of the sampled construction itself
			const x = [uu, ii][k];
			return { ...c, expected: { ...c.expected, recordRms: Math.sqrt(x.reduce((sum, v) => sum + v * v, 0) / n) } };
		}),
		power: [
			{
				...pairTruth(u, i),
				note: 'IEEE 1459 from the construction; the file holds 1.004 cycles, so the analyser fits it (short-record path)',
			},
		],
		threePhase: [],
		events: [],
	});
}

mkdirSync(OUT, { recursive: true });
const round = (_k: string, v: unknown) =>
	typeof v === 'number' && !Number.isInteger(v) ? Number(v.toPrecision(12)) : v;
write(
	'ground-truth.json',
	JSON.stringify(
		{
			site: SITE,
			generatedBy: 'sample-waves/make-sample-waves.ts (npm run sample-waves)',
			conventions: {
				signal:
					'x(t) = env(t) · Σ_h √2 · rms_h · sin(h · 2π · fundamentalHz · t + phaseDeg_h · π/180), t in s from the first sample of the file',
				phaseDegCos: 'the same phase in the cosine reference: phaseDeg − 90',
				steadyRms: '√(Σ rms_h²) where the envelope is 1; recordRms: over the whole file, envelope included',
				thd: 'thdFPct = 100·√(Σ_{h≥2} rms_h²)/rms_1; thdRPct = 100·√(Σ_{h≥2} rms_h²)/steadyRms',
				power:
					'IEEE 1459-2010: P = Σ_h V_h·I_h·cos(φV_h − φI_h), S = V·I (rms), PF = P/S, DPF = cos(φV_1 − φI_1), Q1 = V_1·I_1·sin(φV_1 − φI_1); currentLagDeg > 0 means the current lags',
				threePhase:
					'symmetrical components of the fundamental phasors, a = 1∠120°: positive = (X1 + a·X2 + a²·X3)/3, negative = (X1 + a²·X2 + a·X3)/3; unbalanceNegativePct = 100·|negative|/|positive|',
				quantisation: 'CSV values rounded to the printed decimals; COMTRADE to the raw integer step a; WAV float32',
			},
			files: truths,
		},
		round,
		2,
	) + '\n',
);
console.log(`wrote ${truths.length} captures and ground-truth.json to ${OUT}`);
