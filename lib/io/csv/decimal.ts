/**
 * Decimal numbers read straight from bytes (decimal point or comma), bit-identical to parseFloat: a decimal
 * significand below 2^53 (exact) scaled by an exact power of ten (10^0..10^22 are exact in binary64) takes
 * one correctly rounded multiply or divide (Clinger's fast path, W. D. Clinger, "How to read floating point
 * numbers accurately", PLDI 1990); anything else goes to parseFloat on the same characters.
 */

// ASCII bytes (ANSI X3.4-1986 code chart); module-local so V8 folds them into the loops (see scan-rows.ts).
const PLUS = 0x2b;
const MINUS = 0x2d;
const DIGIT_0 = 0x30;
const DIGIT_9 = 0x39;
const LOWER_E = 0x65;
/** OR-ing this bit into an ASCII capital gives its small letter ('E' | 0x20 = 'e'). */
const ASCII_CASE_BIT = 0x20;
/** The largest k with 10^k exact in binary64: 5^22 < 2^53 < 5^23. Ref: Clinger 1990, section 6. */
const MAX_EXACT_POW10 = 22;
const POW10 = Float64Array.from({ length: MAX_EXACT_POW10 + 1 }, (_, i) => Number(`1e${i}`));
// m * 10 + d is exact while the result stays below 2^53, and m only grows: a final m <= 2^53 - 1 was
// accumulated without rounding.
const MAX_EXACT = Number.MAX_SAFE_INTEGER;
/** Exponent digits past this value cannot change the result (any |exponent| above ~400 under- or overflows). */
const EXPONENT_CAP = 100_000;

/** readDecimal's answer when there is no digit before the exponent (a word such as NaN, or nothing). */
export const NO_DIGITS = -1;
/** readDecimal's answer for an exponent mark without digits after it ('1e', '2E+'). */
export const NO_EXPONENT_DIGITS = -2;

/** The value the last successful readDecimal read (a scratch slot: the hot loop gets one number back, the end offset). */
export const decimalValue = new Float64Array(1);

/**
 * Reads the number starting at buf[p]: an optional sign, digits with at most one decimal mark `dec` (-1:
 * none), an optional exponent. Leaves the value in decimalValue[0] and returns the offset just after it.
 *
 * @param dec  byte of the decimal mark ('.' 0x2e or ',' 0x2c), or -1 when no mark is allowed
 * @returns the offset after the number, or NO_DIGITS / NO_EXPONENT_DIGITS (nothing is stored then)
 * @example readDecimal(new TextEncoder().encode('-3,25;'), 0, 0x2c) // 5, decimalValue[0] === -3.25
 */
export function readDecimal(buf: Uint8Array, p: number, dec: number): number {
	let b = buf[p];
	const neg = b === MINUS;
	if (neg || b === PLUS) b = buf[++p];
	const numStart = p;
	let m = 0;
	while (b >= DIGIT_0 && b <= DIGIT_9) {
		m = m * 10 + (b - DIGIT_0);
		b = buf[++p];
	}
	let digits = p - numStart;
	let e10 = 0;
	if (b === dec) {
		const fracStart = ++p;
		b = buf[p];
		while (b >= DIGIT_0 && b <= DIGIT_9) {
			m = m * 10 + (b - DIGIT_0);
			b = buf[++p];
		}
		digits += p - fracStart;
		e10 = fracStart - p;
	}
	if (digits === 0) return NO_DIGITS;
	if ((b | ASCII_CASE_BIT) === LOWER_E) {
		b = buf[++p];
		const eneg = b === MINUS;
		if (eneg || b === PLUS) b = buf[++p];
		if (!(b >= DIGIT_0 && b <= DIGIT_9)) return NO_EXPONENT_DIGITS;
		let e = 0;
		while (b >= DIGIT_0 && b <= DIGIT_9) {
			if (e < EXPONENT_CAP) e = e * 10 + (b - DIGIT_0);
			b = buf[++p];
		}
		e10 += eneg ? -e : e;
	}
	const v = isFastDecimal(m, e10) ? fastDecimal(m, e10) : slowDecimal(buf, numStart, p, dec);
	decimalValue[0] = neg ? -v : v;
	return p;
}

/** True when m * 10^e10 is one correctly rounded operation on exact operands (Clinger's fast path). */
export function isFastDecimal(m: number, e10: number): boolean {
	return m <= MAX_EXACT && e10 >= -MAX_EXACT_POW10 && e10 <= MAX_EXACT_POW10;
}

/** m * 10^e10 for an isFastDecimal pair: one multiply or divide by an exact power of ten. */
export function fastDecimal(m: number, e10: number): number {
	return e10 < 0 ? m / POW10[-e10] : m * POW10[e10];
}

/** parseFloat on the number's characters (the decimal comma, if any, read as a point). */
export function slowDecimal(buf: Uint8Array, from: number, to: number, dec: number): number {
	let s = '';
	for (let i = from; i < to; i++) s += buf[i] === dec ? '.' : String.fromCharCode(buf[i]);
	return parseFloat(s);
}
