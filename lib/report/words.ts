/**
 * Numbers in sentences, rounded to their meaning. One set of rules for every sentence lib/report writes
 * (findings, the meter explanation, event lines): the JSON gets them with a decimal point, and the UI
 * rebuilds the same sentences through `numberWords(itsLocaleFixed)` so only the decimal mark differs.
 */

/** Formats a finite number with a fixed count of decimals (the one locale-dependent step). */
export type FixedFormat = (value: number, decimals: number) => string;

/** Plain decimal point, no grouping, never "-0". */
export const plainFixed: FixedFormat = (value, decimals) => {
	const t = value.toFixed(decimals);
	return /^-0(\.0*)?$/.test(t) ? t.slice(1) : t;
};

export interface NumberWords {
	fixed: FixedFormat;
	/**
	 * 4 significant digits with an SI prefix for V, A, W, VA, var, Hz, s: "70.71 A", "1.250 kW", "5.120 mA";
	 * |value| below `resolution` reads "0 var" (rounding noise such as a 1e-12 var Q of an in-phase pair).
	 */
	quantity(value: number, unit: string, significant?: number, resolution?: number): string;
	/** "29.3 %": 1 decimal by default (a tenth of a percent is what the figures mean). */
	percent(value: number, decimals?: number): string;
	/** A ratio such as a power factor, 2 decimals by default. */
	ratio(value: number, decimals?: number): string;
	/** "32.0°". */
	deg(value: number): string;
	/** "1.78 ms", "0.56 ms" (10 µs steps below 10 ms), "130 ms", "2.35 s", "54.0 µs". */
	duration(seconds: number): string;
	/** A time in the record: "0.087 s", "12.4 s", "10 min 12.4 s". */
	at(seconds: number): string;
}

const NONE = '–';
const PREFIXABLE = new Set(['V', 'A', 'W', 'VA', 'var', 'Hz', 's', 'Ω']);
const PREFIXES: [number, string][] = [
	[1e6, 'M'],
	[1e3, 'k'],
	[1, ''],
	[1e-3, 'm'],
	[1e-6, 'µ'],
];

function decimalsFor(value: number, significant: number): number {
	const a = Math.abs(value);
	if (!Number.isFinite(a) || a === 0) return Math.max(0, significant - 1);
	return Math.min(6, Math.max(0, significant - (Math.floor(Math.log10(a)) + 1)));
}

/** The sentence number rules over one fixed-decimals formatter. */
export function numberWords(fixed: FixedFormat = plainFixed): NumberWords {
	const f = (x: number, d: number) => (Number.isFinite(x) ? fixed(x, d) : NONE);
	return {
		fixed: f,
		quantity(value, unit, significant = 4, resolution = 0) {
			if (!Number.isFinite(value)) return NONE;
			if (Math.abs(value) < resolution) return unit ? `${f(0, 0)} ${unit}` : f(0, 0);
			let scale = 1;
			let prefix = '';
			if (PREFIXABLE.has(unit) && value !== 0) {
				for (const [s, p] of PREFIXES) {
					scale = s;
					prefix = p;
					if (Math.abs(value) >= s * 0.9995) break;
				}
			}
			const m = value / scale;
			const text = f(m, decimalsFor(m, significant));
			return unit ? `${text} ${prefix}${unit}` : text;
		},
		percent: (value, decimals = 1) => (Number.isFinite(value) ? `${f(value, decimals)} %` : NONE),
		ratio: (value, decimals = 2) => f(value, decimals),
		deg: (value) => (Number.isFinite(value) ? `${f(value, 1)}°` : NONE),
		duration(seconds) {
			if (!Number.isFinite(seconds)) return NONE;
			const a = Math.abs(seconds);
			if (a >= 1) return `${f(seconds, decimalsFor(seconds, 3))} s`;
			// 10 µs steps below 10 ms (a phase lag), 3 significant digits above (an event of 130 ms)
			if (a >= 1e-4 || a === 0)
				return `${f(seconds * 1e3, a === 0 ? 0 : a < 0.01 ? 2 : decimalsFor(seconds * 1e3, 3))} ms`;
			return `${f(seconds * 1e6, 1)} µs`;
		},
		at(seconds) {
			if (!Number.isFinite(seconds)) return NONE;
			if (seconds < 60) return `${f(seconds, seconds < 10 ? 3 : 1)} s`;
			const min = Math.floor(seconds / 60);
			return `${min} min ${f(seconds - 60 * min, 1)} s`;
		},
	};
}

/** The plain (decimal point) words every JSON sentence uses. */
export const PLAIN_WORDS = numberWords();

/** 1st, 2nd, 3rd, 11th... */
export function ordinal(n: number): string {
	const s =
		n % 100 >= 11 && n % 100 <= 13 ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th');
	return `${n}${s}`;
}
