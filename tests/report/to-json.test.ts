import { describe, expect, it } from 'vitest';
import { reportValueToJson } from '../../lib/report/to-json.js';

describe('reportValueToJson', () => {
	it('reportValueToJson(value) turns NaN and infinities into null at any depth (JSON has no NaN, RFC 8259 section 6)', () => {
		const out = reportValueToJson({ a: NaN, b: [1, Infinity, { c: -Infinity }], d: 2 });
		expect(out).toEqual({ a: null, b: [1, null, { c: null }], d: 2 });
	});

	it('reportValueToJson(value) drops undefined fields and copies typed arrays as plain arrays', () => {
		const out = reportValueToJson({ a: undefined, t: new Float64Array([1, NaN]) }) as Record<string, unknown>;
		expect('a' in out).toBe(false);
		expect(out.t).toEqual([1, null]);
		expect(Array.isArray(out.t)).toBe(true);
	});

	it('reportValueToJson(value) does not mutate its input', () => {
		const input = { x: NaN, y: [NaN] };
		reportValueToJson(input);
		expect(input.x).toBeNaN();
		expect(input.y[0]).toBeNaN();
	});
});
