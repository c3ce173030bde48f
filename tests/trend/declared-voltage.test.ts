import { describe, expect, it } from 'vitest';
import { declaredVoltageFromRms } from '../../lib/trend/index.js';

describe('declaredVoltageFromRms', () => {
	it('declaredVoltageFromRms(values near 233 V) picks 230 V (IEC 60038 nominal, common practice) as an assumption', () => {
		const r = declaredVoltageFromRms([233.1, 232.8, 234.0, 120.0, 233.5]); // one value in a dip: the median ignores it
		expect(r.declaredV).toBe(230);
		expect(r.diagnostic.severity).toBe('assumption');
		expect(r.diagnostic.message).toContain('230 V');
	});

	// 277 V and 120 V are the line-to-neutral nominal voltages of the 480Y/277 V and 208Y/120 V (or 120/240 V)
	// systems of IEC 60038:2009 Table 1 (60 Hz systems) and ANSI C84.1 (common practice; the tables from memory).
	// 281 V is +1.4 % of 277 V and 117 V is −2.5 % of 120 V, both inside ANSI C84.1 Range A (±5 % of nominal at
	// the service point; from memory), so each reading points at one nominal only.
	it('declaredVoltageFromRms picks 277 V for a 480Y/277 V system measured at 281 V, and 120 V for 117 V (IEC 60038 / ANSI C84.1 nominals)', () => {
		expect(declaredVoltageFromRms([281, 280.5, 281.2]).declaredV).toBe(277);
		expect(declaredVoltageFromRms([117, 116.8]).declaredV).toBe(120);
	});

	it('declaredVoltageFromRms of medium-voltage values (7 870 V) assumes nothing and warns: MV systems must be declared', () => {
		const r = declaredVoltageFromRms([7873, 7858, 7870]);
		expect(r.declaredV).toBeNaN();
		expect(r.diagnostic.severity).toBe('warning');
	});

	it('declaredVoltageFromRms of no finite value gives NaN and a warning', () => {
		const r = declaredVoltageFromRms([NaN]);
		expect(r.declaredV).toBeNaN();
		expect(r.diagnostic.severity).toBe('warning');
	});
});
