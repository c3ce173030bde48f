/**
 * Unit and phase helpers shared by the COMTRADE and WAV readers: a source's unit text becomes an SI unit,
 * a factor to it and a quantity; a channel name or phase field becomes a phase label.
 */
import type { Quantity } from '../../capture.js';

export interface NormalisedUnit {
	/** 'V', 'A', or the source's own text (trimmed) for anything else. */
	unit: string;
	/** Multiply values in the source unit by this to get `unit` (kV -> V: 1000). */
	factor: number;
	quantity: Quantity;
}

// Prefixes written by recorders. 'K' is common for kilo in relay files (`KV`, `KA`); an upper-case 'M'
// is taken as mega (SI), a lower-case 'm' as milli; 'u' and 'µ' as micro. Ref: SI brochure, prefixes (common practice).
const PREFIX: Record<string, number> = { '': 1, k: 1e3, K: 1e3, M: 1e6, m: 1e-3, u: 1e-6, µ: 1e-6, μ: 1e-6 };

/**
 * Normalise a unit text to V or A when it is one, with its prefix factor.
 * @example normaliseUnitText('kV') // { unit: 'V', factor: 1000, quantity: 'voltage' }
 */
export function normaliseUnitText(text: string): NormalisedUnit {
	const t = text.trim();
	const m = /^([kKMmuµμ]?)(V|A)$/.exec(t) ?? /^([kKMmuµμ]?)(v|a)$/.exec(t);
	if (m && m[1] in PREFIX) {
		const base = m[2].toUpperCase();
		return { unit: base, factor: PREFIX[m[1]], quantity: base === 'V' ? 'voltage' : 'current' };
	}
	return { unit: t, factor: 1, quantity: 'other' };
}

/**
 * Quantity guessed from a channel name: U/V followed by a phase tag (or nothing), or a name with "volt", is a
 * voltage; I likewise, or "current"/"amp", a current (`Va`, `UL1`, `V_AN`, `U1`, `Ib`, `IN`). Undefined otherwise.
 */
export function quantityFromName(name: string): Quantity | undefined {
	const n = name.trim();
	const tail = '(?:[_ -]?(?:l[123n]|[abcnrst]{1,2}))?(?:$|[^a-z])';
	if (new RegExp(`^[uv]${tail}`, 'i').test(n) || /volt/i.test(n)) return 'voltage';
	if (new RegExp(`^i${tail}`, 'i').test(n) || /current|amp/i.test(n)) return 'current';
	return undefined;
}

/**
 * Phase label from an explicit phase field, else from the end of a channel name:
 * `Ia` -> 'A', `VB` -> 'B', `U L2` -> 'L2', `I3` -> 'L3', `In` -> 'N'. Undefined when nothing matches.
 */
export function phaseLabel(phaseField: string | undefined, name: string): string | undefined {
	const f = (phaseField ?? '').trim();
	if (f) return f.toUpperCase();
	const n = name.trim();
	let m = /(?:^|[^A-Za-z])(L[123N])$/i.exec(n) ?? /^[UVI][_ -]?(L[123N])$/i.exec(n);
	if (m) return m[1].toUpperCase();
	m = /^[UVI][_ -]?([ABCNRST])(?:N|G)?$/i.exec(n);
	if (m) return m[1].toUpperCase();
	m = /^[UVI][_ -]?([123])$/.exec(n);
	if (m) return `L${m[1]}`;
	return undefined;
}
