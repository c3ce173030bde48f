import { describe, expect, it } from 'vitest';
import { settingsFromOptions } from '../../src/cli/options.js';
import { UsageError } from '../../src/cli/usage-error.js';

describe('settingsFromOptions', () => {
	it('settingsFromOptions(raw) maps every analysis option to the library names', () => {
		const s = settingsFromOptions({
			limits: 'ieee519',
			iscIl: 35,
			il: '120',
			ref: 'I1',
			window: 12,
			nominal: 400,
			nominalHz: 60,
			maxOrder: 40,
			wholeRecord: true,
			pair: ['U2=I3'],
		});
		expect(s.analysis).toEqual({
			limits: 'ieee519',
			iscIl: 35,
			ilA: 120,
			refChannel: 'I1',
			windowCycles: 12,
			nominalV: 400,
			nominalHz: 60,
			maxOrder: 40,
			span: 'whole-record',
			pairs: [{ voltage: 'U2', current: 'I3' }],
		});
	});

	it('settingsFromOptions(raw) asks for single DFT bins only with a limit table, and reads the declared voltage for events', () => {
		expect(settingsFromOptions({ limits: 'en50160', singleBins: true, declared: '230' }).analysis).toEqual({
			limits: 'en50160',
			harmonicBasis: 'single-bins',
			declaredV: 230,
		});
		expect(() => settingsFromOptions({ singleBins: true })).toThrow(UsageError);
		expect(() => settingsFromOptions({ declared: '-5' })).toThrow(/--declared -5/);
	});

	it('settingsFromOptions(raw) reads repeated channel=value assignments, the last = splitting name from value', () => {
		const s = settingsFromOptions({
			scale: ['U1=100', 'I1=0,5'],
			unit: ['I1=A'],
			quantity: ['CH3=current'],
			rate: '10000',
		});
		expect(s.import).toEqual({
			sampleRateHz: 10000,
			scale: { U1: 100, I1: 0.5 },
			unit: { I1: 'A' },
			quantity: { CH3: 'current' },
		});
	});

	it('settingsFromOptions(raw) reads --probe as x100, 100 or 100:1 and --clamp in mV per A', () => {
		const s = settingsFromOptions({ probe: ['CH1=x100', 'CH3=10:1', 'CH4=100'], clamp: ['CH2=100 mV/A'] });
		expect(s.import.probe).toEqual({ CH1: 100, CH3: 10, CH4: 100 });
		expect(s.import.clamp).toEqual({ CH2: 100 });
	});

	it('settingsFromOptions(raw) maps the CSV layout and COMTRADE overrides', () => {
		const s = settingsFromOptions({
			delimiter: 'semicolon',
			decimal: 'comma',
			timeColumn: 1,
			timeUnit: 'ms',
			secondary: true,
		});
		expect(s.import).toMatchObject({
			delimiter: ';',
			decimalMark: ',',
			timeColumn: 0,
			timeUnit: 'ms',
			comtradeValues: 'secondary',
		});
		expect(settingsFromOptions({ timeColumn: 'none' }).import.timeColumn).toBe('none');
	});

	it('settingsFromOptions(raw) takes a numeric channel name as text', () => {
		expect(settingsFromOptions({ ref: 2 }).analysis.refChannel).toBe('2');
	});

	it.each([
		[{ limits: 'en61000' }, /--limits en61000: expected one of en50160, iec61000-2-2, ieee519/],
		[{ rate: 'fast' }, /--rate fast: expected the sample rate in Hz/],
		[{ rate: -5 }, /--rate -5/],
		[{ scale: ['U1'] }, /--scale U1: expected <channel>=<factor>/],
		[{ scale: ['U1=x'] }, /--scale U1=x: expected a non-zero number/],
		[{ quantity: ['U1=power'] }, /expected voltage, current or other/],
		[{ probe: ['U1=ten'] }, /--probe U1=ten: expected the probe's attenuation/],
		[{ probe: ['U1'] }, /--probe U1: expected <channel>=<ratio>, e.g. --probe U1=x100/],
		[{ clamp: ['I1=0'] }, /--clamp I1=0: expected the clamp's output in mV per A/],
		[{ window: 2.5 }, /--window 2.5: expected a whole number/],
		[{ nominalHz: 55 }, /expected 50 or 60/],
		[{ limits: 'en50160', iscIl: 20 }, /apply to --limits ieee519 only/],
		[{ ref: true }, /--ref needs a value/],
		[{ delimiter: 'pipe' }, /--delimiter pipe: expected comma, semicolon, tab or space/],
		[{ timeColumn: 0 }, /--time-column 0: expected a column number from 1/],
	])('settingsFromOptions(%o) throws a UsageError naming the option', (raw, message) => {
		expect(() => settingsFromOptions(raw)).toThrow(UsageError);
		expect(() => settingsFromOptions(raw)).toThrow(message);
	});
});
