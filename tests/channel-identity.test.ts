// Channel identity: one set of rules for every importer and the pairing.
// Letter conventions are common practice: U, V or E for voltage, I for current (IEC 60027-1 letter
// symbols, from memory); conductors L1/L2/L3 and N (IEC 60445, from memory); A/B/C, R/S/T, R/Y/B, U/V/W
// families common practice. Unit prefixes per the SI brochure (BIPM, 9th edition, 2019, table 7:
// m = 1e-3, k = 1e3, µ = 1e-6, n = 1e-9); 'KV' upper case is how relays write kV (common practice).
import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import type { Capture } from '../lib/capture.js';
import {
	channelIdentity,
	channelPhase,
	normaliseUnitText,
	quantityFromName,
	readUnit,
} from '../lib/channel-identity.js';
import { openCapture, openCaptures } from '../lib/io/open.js';
import { pairPowerChannels } from '../lib/power/pairing.js';
import { comtradeCffBytes, type WriterSpec } from '../sample-waves/writers/comtrade.js';

describe('readUnit and normaliseUnitText', () => {
	it('readUnit(text) gives the SI prefix factors for V, A and s', () => {
		expect(readUnit('mV')).toEqual({ unit: 'V', factor: 1e-3, kind: 'voltage' });
		expect(readUnit('kV')).toEqual({ unit: 'V', factor: 1e3, kind: 'voltage' });
		expect(readUnit('KV')).toEqual({ unit: 'V', factor: 1e3, kind: 'voltage' });
		expect(readUnit('kA')).toEqual({ unit: 'A', factor: 1e3, kind: 'current' });
		expect(readUnit('µs')).toEqual({ unit: 's', factor: 1e-6, kind: 'time' });
		expect(readUnit('counts')?.kind).toBe('counts');
		expect(readUnit('')).toBeNull();
	});

	it.each([
		['V', 'V', 1, 'voltage'],
		['kV', 'V', 1e3, 'voltage'],
		['KV', 'V', 1e3, 'voltage'],
		['mV', 'V', 1e-3, 'voltage'],
		['A', 'A', 1, 'current'],
		['kA', 'A', 1e3, 'current'],
		['mA', 'A', 1e-3, 'current'],
		[' a ', 'A', 1, 'current'],
		['Volts', 'V', 1, 'voltage'],
		['(V)', 'V', 1, 'voltage'],
		['Hz', 'Hz', 1, 'other'],
		['MW', 'MW', 1, 'other'],
		['', '', 1, 'other'],
	])('normaliseUnitText(%j) gives %s ×%d (%s)', (text, unit, factor, quantity) => {
		expect(normaliseUnitText(text)).toEqual({ unit, factor, quantity });
	});
});

/** Names and what they are, by the conventions in the header; undefined = the name does not say. */
const NAMES: [string, 'voltage' | 'current' | undefined, string | undefined][] = [
	['Uab', 'voltage', 'A-B'],
	['VAN', 'voltage', 'A'],
	['Va', 'voltage', 'A'],
	['E1', 'voltage', 'L1'],
	['L1-N', 'voltage', 'L1'],
	['L1-L2', 'voltage', 'L1-L2'],
	['Spannung L1', 'voltage', 'L1'],
	['Voltage L3', 'voltage', 'L3'],
	['U1', 'voltage', 'L1'],
	['UL2', 'voltage', 'L2'],
	['UL3-N', 'voltage', 'L3'],
	['U12', 'voltage', 'L1-L2'],
	['V_B', 'voltage', 'B'],
	['VY', 'voltage', 'Y'],
	['US', 'voltage', 'S'],
	['UN', 'voltage', 'N'],
	['V_N', 'voltage', 'N'],
	['IL2', 'current', 'L2'],
	['Ia', 'current', 'A'],
	['I_C', 'current', 'C'],
	['IR', 'current', 'R'],
	['IW', 'current', 'W'],
	['IN', 'current', 'N'],
	['I4', 'current', undefined],
	['Strom L2', 'current', 'L2'],
	['Current', 'current', undefined],
	['Phase C', undefined, 'C'],
	['L3', undefined, 'L3'],
	['U', 'voltage', undefined],
	['Umax', undefined, undefined],
	['Idle', undefined, undefined],
	['CH1', undefined, undefined],
	['Temp', undefined, undefined],
	['Probe 3', undefined, undefined],
];

describe('channelIdentity(name)', () => {
	it.each(NAMES)('%j reads as %s, phase %s', (name, quantity, phase) => {
		expect(quantityFromName(name)).toBe(quantity);
		expect(channelPhase(name)).toBe(phase);
		const id = channelIdentity(name);
		expect(id.quantity).toBe(quantity);
		expect(id.phase).toBe(phase);
	});

	it('a V or A unit decides the quantity over the name, and the disagreement is kept', () => {
		expect(channelIdentity('I1', 'mV')).toEqual({
			quantity: 'voltage',
			quantityFrom: 'unit',
			nameQuantity: 'current',
			phase: 'L1',
			unit: 'V',
			factor: 1e-3,
		});
	});

	it('a phase field that reads as a label wins over the name; one that does not falls back to the name', () => {
		expect(channelPhase('Ia', 'c')).toBe('C');
		expect(channelPhase('Ia', '  ')).toBe('A');
		expect(channelPhase('Ia', 'xyz')).toBe('A');
	});
});

// ---- the same names through every format ----------------------------------------------------------

const N = 8;
const values = Array.from({ length: N }, (_, k) => Math.sin((2 * Math.PI * k) / N));
const fileNames = NAMES.map(([n]) => n);

function csvCapture(): Capture {
	const header = ['t (s)', ...fileNames].join(';');
	const rows = values.map((v, k) => [(k / 1000).toString(), ...fileNames.map(() => v.toFixed(6))].join(';'));
	return openCapture({ name: 'names.csv', bytes: new TextEncoder().encode([header, ...rows].join('\n') + '\n') });
}

function comtradeCapture(): Capture {
	const spec: WriterSpec = {
		station: 'Tallowmere Joinery',
		device: 'names',
		revYear: 1999,
		lineFrequencyHz: 50,
		rates: [{ sampleRateHz: 1000, endSample: N }],
		firstData: '01/02/2026,10:00:00.000000',
		trigger: '01/02/2026,10:00:00.000000',
		fileType: 'ASCII',
		// a channel name may not hold a comma in a .cfg; none of these does
		analog: fileNames.map((name) => ({ name, unit: '', values })),
	};
	return openCapture({ name: 'names.cff', bytes: comtradeCffBytes(spec) });
}

function wavCapture(): Capture {
	const { WaveFile } = wavefile as unknown as {
		WaveFile: new () => {
			fromScratch(ch: number, rate: number, depth: string, s: number[][]): void;
			toBuffer(): Uint8Array;
		};
	};
	const w = new WaveFile();
	w.fromScratch(
		fileNames.length,
		1000,
		'16',
		fileNames.map(() => values.map((v) => Math.round(v * 16000))),
	);
	return openCapture({ name: 'names.wav', bytes: w.toBuffer() }, [], {
		wav: { channels: fileNames.map((name) => ({ fullScale: 1, name })) },
	});
}

describe('the same channel names in CSV, COMTRADE and WAV', () => {
	const formats: [string, () => Capture][] = [
		['CSV', csvCapture],
		['COMTRADE', comtradeCapture],
		['WAV', wavCapture],
	];
	for (const [format, make] of formats) {
		it(`${format}: every name gets the quantity and phase of the table`, () => {
			const c = make();
			expect(c.channels.map((ch) => [ch.name, ch.quantity, ch.phase])).toEqual(
				NAMES.map(([n, q, p]) => [n, q ?? 'other', p]),
			);
		});
	}

	it("a unit beside the name: CSV 'N (V)' and COMTRADE 'N' in V are the neutral voltage", () => {
		const csv = openCapture({
			name: 'n.csv',
			bytes: new TextEncoder().encode(['t (s);N (V)', ...values.map((v, k) => `${k / 1000};${v}`)].join('\n')),
		});
		const spec: WriterSpec = {
			station: 'Tallowmere Joinery',
			device: 'n',
			revYear: 1999,
			lineFrequencyHz: 50,
			rates: [{ sampleRateHz: 1000, endSample: N }],
			firstData: '01/02/2026,10:00:00.000000',
			trigger: '01/02/2026,10:00:00.000000',
			fileType: 'ASCII',
			analog: [{ name: 'N', unit: 'V', values }],
		};
		const cff = openCapture({ name: 'n.cff', bytes: comtradeCffBytes(spec) });
		for (const c of [csv, cff])
			expect(c.channels.map((ch) => [ch.name, ch.quantity, ch.unit, ch.phase])).toEqual([['N', 'voltage', 'V', 'N']]);
	});

	it('pairing gives the same pairs for one three-phase naming in every format', () => {
		const names = ['VAN', 'VBN', 'VCN', 'Ia', 'Ib', 'Ic'];
		const pick = (c: Capture) => ({ ...c, channels: c.channels.filter((ch) => names.includes(ch.name)) });
		const csv = openCaptures([
			{
				name: 'p.csv',
				bytes: new TextEncoder().encode(
					['t (s);' + names.join(';'), ...values.map((v, k) => `${k / 1000};${names.map(() => v).join(';')}`)].join(
						'\n',
					),
				),
			},
		]).captures[0];
		const pairsOf = (c: Capture) =>
			pairPowerChannels(pick(c).channels).pairs.map((p) => [p.label, p.voltage, p.current]);
		const expected = [
			['A', 'VAN', 'Ia'],
			['B', 'VBN', 'Ib'],
			['C', 'VCN', 'Ic'],
		];
		expect(pairsOf(csv)).toEqual(expected);
		const spec: WriterSpec = {
			station: 'Tallowmere Joinery',
			device: 'pairs',
			revYear: 1999,
			lineFrequencyHz: 50,
			rates: [{ sampleRateHz: 1000, endSample: N }],
			firstData: '01/02/2026,10:00:00.000000',
			trigger: '01/02/2026,10:00:00.000000',
			fileType: 'ASCII',
			analog: names.map((name) => ({ name, unit: '', values })),
		};
		expect(pairsOf(openCapture({ name: 'p.cff', bytes: comtradeCffBytes(spec) }))).toEqual(expected);
	});
});
