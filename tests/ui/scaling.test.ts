import { describe, expect, it } from 'vitest';
import { describeScale, scaleFactor, scaledUnit, toCsvChannelOptions } from '../../src/ui/scaling.js';

describe('scaleFactor', () => {
	it('scaleFactor of a 10 mV/A clamp is 100 A per V (I = U / sensitivity; common practice)', () => {
		expect(scaleFactor({ kind: 'clamp-mv-per-a', value: 10 })).toBe(100);
		expect(scaledUnit({ kind: 'clamp-mv-per-a', value: 10 })).toBe('A');
	});

	it("scaleFactor of a 0.01 Ω shunt is 100 A per V (Ohm's law I = U / R)", () => {
		expect(scaleFactor({ kind: 'shunt-ohm', value: 0.01 })).toBeCloseTo(100, 12);
	});

	it('scaleFactor of a 200/5 A CT is 40 and of an 11 000/110 V VT is 100 (rated ratio; common practice)', () => {
		expect(scaleFactor({ kind: 'ct', primary: 200, secondary: 5 })).toBe(40);
		expect(scaleFactor({ kind: 'vt', primary: 11_000, secondary: 110 })).toBe(100);
	});

	it('scaleFactor of a ×10 probe is 10; of nothing stated, 1', () => {
		expect(scaleFactor({ kind: 'probe', value: 10 })).toBe(10);
		expect(scaleFactor({ kind: 'none' })).toBe(1);
	});

	it('scaleFactor is NaN for a missing, zero or negative value (nothing is guessed)', () => {
		expect(scaleFactor({ kind: 'probe' })).toBeNaN();
		expect(scaleFactor({ kind: 'shunt-ohm', value: 0 })).toBeNaN();
		expect(scaleFactor({ kind: 'ct', primary: 200, secondary: -5 })).toBeNaN();
		expect(toCsvChannelOptions({ kind: 'shunt-ohm', value: 0 })).toEqual({});
	});
});

describe('toCsvChannelOptions', () => {
	it('toCsvChannelOptions maps each chain to the CSV importer option that applies it', () => {
		expect(toCsvChannelOptions({ kind: 'probe', value: 100 })).toEqual({ probeRatio: 100 });
		expect(toCsvChannelOptions({ kind: 'clamp-mv-per-a', value: 10 })).toEqual({ clampMvPerA: 10 });
		expect(toCsvChannelOptions({ kind: 'shunt-ohm', value: 0.5 })).toEqual({ shuntOhms: 0.5 });
		expect(toCsvChannelOptions({ kind: 'ct', primary: 200, secondary: 5 })).toEqual({ ctRatio: 40 });
		expect(toCsvChannelOptions({ kind: 'none' })).toEqual({});
	});

	it('describeScale names the chain and its factor for the report', () => {
		expect(describeScale({ kind: 'ct', primary: 200, secondary: 5 })).toBe('CT 200/5 A (×40)');
	});
});
