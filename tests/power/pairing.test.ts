import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Channel } from '../../lib/capture.js';
import { inferPhaseFamily, pairPowerChannels, parsePhaseLabel, resolvePhaseToken } from '../../lib/power/index.js';

const ch = (name: string, quantity: Channel['quantity'] = 'other', phase?: string) => ({
	name,
	quantity,
	...(phase ? { phase } : {}),
});

describe('parsePhaseLabel', () => {
	it.each([
		['U1', 'phase', ['1'], 'voltage'],
		['IL2', 'phase', ['2'], 'current'],
		['Va', 'phase', ['A'], 'voltage'],
		['Ib', 'phase', ['B'], 'current'],
		['V_L3-N', 'phase', ['3'], 'voltage'],
		['VAN', 'phase', ['A'], 'voltage'],
		['L2', 'phase', ['2'], undefined],
		['I R', 'phase', ['R'], 'current'],
		['Phase Y current', 'phase', ['Y'], 'current'],
		['U12', 'line-to-line', ['1', '2'], 'voltage'],
		['L1-L2', 'line-to-line', ['1', '2'], undefined],
		['Vab (kV)', 'line-to-line', ['A', 'B'], 'voltage'],
		['UL31', 'line-to-line', ['3', '1'], 'voltage'],
		['IN', 'neutral', [], 'current'],
		['I_N', 'neutral', [], 'current'],
	])('reads %s as %s %j (quantity %s)', (name, kind, tokens, q) => {
		const p = parsePhaseLabel(name)!;
		expect(p.kind).toBe(kind);
		expect(p.tokens).toEqual(tokens);
		expect(p.quantityHint).toBe(q);
	});

	it.each(['CH1', 'Channel 2', 'C1', 'Temperature', '', 'I4', '3I0'])('finds no phase label in %j', (name) => {
		expect(parsePhaseLabel(name)).toBeUndefined();
	});

	it("prefers a quantity prefix: 'UV' is the voltage of phase V, not U-V", () => {
		expect(parsePhaseLabel('UV')).toEqual({ kind: 'phase', tokens: ['V'], quantityHint: 'voltage' });
	});
});

describe('resolvePhaseToken and inferPhaseFamily', () => {
	it('B is phase 2 in A/B/C and phase 3 in R/Y/B (common practice)', () => {
		expect(resolvePhaseToken('B', 'ABC')).toBe(2);
		expect(resolvePhaseToken('B', 'RYB')).toBe(3);
		expect(resolvePhaseToken('S', 'ABC')).toBeUndefined();
	});
	it('Y makes a capture R/Y/B; B alone is assumed A/B/C and says so', () => {
		expect(
			inferPhaseFamily([
				{ kind: 'phase', tokens: ['Y'] },
				{ kind: 'phase', tokens: ['B'] },
			]).family,
		).toBe('RYB');
		expect(inferPhaseFamily([{ kind: 'phase', tokens: ['B'] }])).toEqual({
			family: 'ABC',
			assumed: true,
			conflicting: [],
		});
		expect(inferPhaseFamily([{ kind: 'phase', tokens: ['1'] }]).family).toBe('numeric');
	});
});

describe('pairPowerChannels', () => {
	it('pairs U1/U2/U3 with I1/I2/I3 by label and leaves nothing unpaired', () => {
		const r = pairPowerChannels(
			['U1', 'U2', 'U3', 'I1', 'I2', 'I3'].map((n) => ch(n, n[0] === 'U' ? 'voltage' : 'current')),
		);
		expect(r.pairs.map((p) => [p.label, p.voltage, p.current, p.origin])).toEqual([
			['L1', 'U1', 'I1', 'auto'],
			['L2', 'U2', 'I2', 'auto'],
			['L3', 'U3', 'I3', 'auto'],
		]);
		expect(r.unpaired).toEqual([]);
	});

	it('pairs R/Y/B names with B as phase 3, and finds the neutral current', () => {
		const names = ['V_R', 'V_Y', 'V_B', 'I_B', 'I_R', 'I_Y', 'I_N'];
		const r = pairPowerChannels(names.map((n) => ch(n, n[0] === 'V' ? 'voltage' : 'current')));
		expect(r.family).toBe('RYB');
		expect(r.pairs.map((p) => [p.phase, p.voltage, p.current])).toEqual([
			[1, 'V_R', 'I_R'],
			[2, 'V_Y', 'I_Y'],
			[3, 'V_B', 'I_B'],
		]);
		expect(r.neutralCurrent).toBe('I_N');
	});

	it('takes the quantity from the name when the unit says nothing, and reports the assumption', () => {
		const r = pairPowerChannels([ch('Va'), ch('Ia')]);
		expect(r.pairs).toHaveLength(1);
		expect(r.diagnostics.filter((d) => d.code === 'pairing-quantity-from-name')).toHaveLength(2);
	});

	it('lists line-to-line channels separately and reports unlabelled channels', () => {
		const r = pairPowerChannels([
			ch('U12', 'voltage'),
			ch('U23', 'voltage'),
			ch('U31', 'voltage'),
			ch('CH4', 'current'),
		]);
		expect(r.lineVoltages).toEqual([
			{ name: 'U12', from: 1, to: 2 },
			{ name: 'U23', from: 2, to: 3 },
			{ name: 'U31', from: 3, to: 1 },
		]);
		expect(r.pairs).toEqual([]);
		expect(r.unpaired).toEqual(['CH4']);
		expect(r.diagnostics.some((d) => d.code === 'pairing-unlabelled' && d.message.includes('CH4'))).toBe(true);
	});

	it('does not guess when a phase has two current channels, and says so', () => {
		const r = pairPowerChannels([ch('U1', 'voltage'), ch('I1', 'current'), ch('IL1', 'current')]);
		expect(r.pairs).toEqual([]);
		expect(r.diagnostics.some((d) => d.code === 'pairing-ambiguous' && d.severity === 'warning')).toBe(true);
	});

	it('applies a user override before the automatic matching (crossed clamps)', () => {
		const chans = ['U1', 'U2', 'U3', 'I1', 'I2', 'I3'].map((n) => ch(n, n[0] === 'U' ? 'voltage' : 'current'));
		const r = pairPowerChannels(chans, [
			{ voltage: 'U1', current: 'I2' },
			{ voltage: 'U2', current: 'I1' },
		]);
		expect(r.pairs.map((p) => [p.phase, p.voltage, p.current, p.origin])).toEqual([
			[1, 'U1', 'I2', 'override'],
			[2, 'U2', 'I1', 'override'],
			[3, 'U3', 'I3', 'auto'],
		]);
	});

	it('throws RangeError for an override naming an unknown channel or reusing one', () => {
		const chans = [ch('U1', 'voltage'), ch('I1', 'current')];
		expect(() => pairPowerChannels(chans, [{ voltage: 'U9', current: 'I1' }])).toThrow(RangeError);
		expect(() => pairPowerChannels(chans, [{ voltage: 'U1', current: 'U1' }])).toThrow(RangeError);
	});

	it('uses channel.phase when the importer already parsed one', () => {
		const r = pairPowerChannels([ch('Volts 1', 'voltage', 'L2'), ch('Amps 1', 'current', 'L2')]);
		expect(r.pairs.map((p) => [p.phase, p.voltage, p.current])).toEqual([[2, 'Volts 1', 'Amps 1']]);
	});

	const cfg = '../shared/data/feeder-sag-1999/feeder-sag.cfg';
	if (!existsSync(cfg)) console.warn(`skipping the field-recording pairing test: ${cfg} is absent`);
	it.skipIf(!existsSync(cfg))(
		'pairs the channel names of the real feeder-sag-1999 COMTRADE record (Ia..Vc) as A/B/C',
		() => {
			// channel name and unit read straight from the .cfg analog lines (fields 2 and 5)
			const lines = readFileSync(cfg, 'utf8').split(/\r?\n/);
			const count = Number(/(\d+)A/.exec(lines[1])![1]);
			const chans = lines.slice(2, 2 + count).map((l) => {
				const f = l.split(',');
				return ch(f[1], f[4] === 'V' ? 'voltage' : f[4] === 'A' ? 'current' : 'other');
			});
			const r = pairPowerChannels(chans);
			expect(r.family).toBe('ABC');
			expect(r.pairs.map((p) => [p.label, p.voltage, p.current])).toEqual([
				['A', 'Va', 'Ia'],
				['B', 'Vb', 'Ib'],
				['C', 'Vc', 'Ic'],
			]);
		},
	);
});
