import { describe, expect, it } from 'vitest';
import { normaliseUnitText, phaseLabel, quantityFromName } from '../../lib/io/comtrade/units.js';

describe('normaliseUnitText', () => {
	// SI prefixes k = 10^3, m = 10^-3, M = 10^6 (SI brochure, common practice); 'KV' upper case is how relays write kV.
	it.each([
		['V', 'V', 1, 'voltage'], ['kV', 'V', 1e3, 'voltage'], ['KV', 'V', 1e3, 'voltage'], ['mV', 'V', 1e-3, 'voltage'],
		['A', 'A', 1, 'current'], ['kA', 'A', 1e3, 'current'], ['mA', 'A', 1e-3, 'current'], [' a ', 'A', 1, 'current'],
		['Hz', 'Hz', 1, 'other'], ['MW', 'MW', 1, 'other'], ['', '', 1, 'other'],
	])('normaliseUnitText(%j) gives %s ×%d (%s)', (text, unit, factor, quantity) => {
		expect(normaliseUnitText(text)).toEqual({ unit, factor, quantity });
	});
});

describe('quantityFromName and phaseLabel', () => {
	it.each([
		['Va', 'voltage', 'A'], ['VAN', 'voltage', 'A'], ['UL1', 'voltage', 'L1'], ['U1', 'voltage', 'L1'], ['Voltage L2', 'voltage', 'L2'],
		['Ib', 'current', 'B'], ['IN', 'current', 'N'], ['I_C', 'current', 'C'],
		['Umax', undefined, undefined], ['Idle', undefined, undefined], ['Temp', undefined, undefined],
	])('name %j reads as %s, phase %s', (name, quantity, phase) => {
		expect(quantityFromName(name)).toBe(quantity);
		expect(phaseLabel(undefined, name)).toBe(phase);
	});

	it('phaseLabel prefers the explicit phase field over the name', () => {
		expect(phaseLabel('c', 'Ia')).toBe('C');
		expect(phaseLabel('  ', 'Ia')).toBe('A');
	});
});
