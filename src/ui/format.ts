/**
 * Display formatting: numbers with their unit and a sensible precision, in the browser's locale (a decimal
 * comma where the locale uses one, via Intl.NumberFormat). Presentation only: no figure is computed here.
 */

let locale: string | undefined =
	typeof navigator !== 'undefined' && navigator.language ? navigator.language : undefined;
const cache = new Map<string, Intl.NumberFormat>();

/** Sets the display locale (BCP 47 tag, e.g. 'de-DE'); undefined = the browser's. */
export function setDisplayLocale(tag: string | undefined): void {
	locale = tag;
	cache.clear();
}

/** The display locale in use ('en' when the browser states none). */
export function displayLocale(): string {
	return locale ?? 'en';
}

function nf(decimals: number): Intl.NumberFormat {
	const key = `${decimals}`;
	let f = cache.get(key);
	if (!f) {
		f = new Intl.NumberFormat(locale, {
			minimumFractionDigits: decimals,
			maximumFractionDigits: decimals,
			useGrouping: true,
		});
		cache.set(key, f);
	}
	return f;
}

/** Placeholder shown for a figure the data cannot give (NaN, null, ±Infinity). */
export const NO_VALUE = '–';

/** A number with a fixed count of decimals in the display locale; '–' for NaN/null. */
export function formatFixed(value: number | null | undefined, decimals: number): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
	const v = Object.is(Math.round(value * 10 ** decimals), -0) ? 0 : value; // no "-0.0"
	return nf(decimals).format(v);
}

/** Decimals giving `significant` significant digits for |value| (never negative, at most 6). */
export function decimalsFor(value: number, significant = 4): number {
	const a = Math.abs(value);
	if (!Number.isFinite(a) || a === 0) return Math.max(0, significant - 1);
	const digitsLeft = Math.floor(Math.log10(a)) + 1;
	return Math.min(6, Math.max(0, significant - digitsLeft));
}

const PREFIXES: [number, string][] = [
	[1e6, 'M'],
	[1e3, 'k'],
	[1, ''],
	[1e-3, 'm'],
	[1e-6, 'µ'],
];

/**
 * A value with its unit and an SI prefix chosen so 1 ≤ |mantissa| < 1000, to `significant` digits:
 * formatQuantity(0.00512, 'A') → "5.120 mA"; formatQuantity(230.14, 'V') → "230.1 V";
 * formatQuantity(12345, 'W') → "12.35 kW". Units other than V, A, W, VA, var, Hz, s, Ω are shown unprefixed.
 * |value| < `resolution` is shown as "0 V" (computed noise such as a 1e-14 V mean of a pure sine).
 */
export function formatQuantity(
	value: number | null | undefined,
	unit: string,
	significant = 4,
	resolution = 0,
): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
	// below the stated resolution (e.g. a millionth of the channel's RMS: rounding noise) show a plain zero
	if (Math.abs(value) < resolution) return unit ? `${formatFixed(0, 0)} ${unit}` : formatFixed(0, 0);
	const prefixable = ['V', 'A', 'W', 'VA', 'var', 'Hz', 's', 'Ω'].includes(unit);
	let scale = 1;
	let prefix = '';
	if (prefixable && value !== 0) {
		const a = Math.abs(value);
		for (const [s, p] of PREFIXES) {
			if (a >= s * 0.9995) {
				scale = s;
				prefix = p;
				break;
			}
			scale = s;
			prefix = p;
		}
	}
	const m = value / scale;
	const text = formatFixed(m, decimalsFor(m, significant));
	return unit ? `${text} ${prefix}${unit}` : text;
}

/** A percentage: formatPercent(4.237) → "4.24 %" (2 decimals below 10, 1 above, 0 above 1000). */
export function formatPercent(value: number | null | undefined, decimals?: number): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
	const d = decimals ?? (Math.abs(value) < 10 ? 2 : Math.abs(value) < 1000 ? 1 : 0);
	return `${formatFixed(value, d)} %`;
}

/** An angle in degrees with one decimal: formatDeg(-32.04) → "−32.0°". */
export function formatDeg(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
	return `${formatFixed(value, 1)}°`;
}

/** A time span in s shown in ms from 0.1 ms to 1 s, in µs below: formatDuration(0.00178) → "1.78 ms". */
export function formatDuration(seconds: number | null | undefined): string {
	if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return NO_VALUE;
	const a = Math.abs(seconds);
	if (a >= 1) return `${formatFixed(seconds, decimalsFor(seconds, 4))} s`;
	if (a >= 1e-4 || a === 0) return `${formatFixed(seconds * 1e3, a === 0 ? 0 : 2)} ms`;
	return `${formatFixed(seconds * 1e6, 1)} µs`;
}

/** A dimensionless ratio (power factor, crest factor) to 3 decimals. */
export function formatRatio(value: number | null | undefined, decimals = 3): string {
	return formatFixed(value, decimals);
}
