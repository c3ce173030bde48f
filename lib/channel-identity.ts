/**
 * Channel identity: what a channel's name, unit text and (COMTRADE) phase field say it is: voltage or
 * current, which phase, a line-to-line pair or the neutral, and its SI unit with the factor to it.
 * The one set of rules every importer (CSV, WAV, COMTRADE) and the power pairing use, so the same name
 * means the same thing in every format.
 *
 * Letter conventions are common practice: U, V or E for voltage, I for current (IEC 60027-1 letter
 * symbols, from memory); conductors L1/L2/L3 and N (IEC 60445, from memory); the letter families
 * A/B/C, R/S/T, R/Y/B and U/V/W are common practice. Unit prefixes per the SI brochure (BIPM, 9th ed.,
 * 2019, table 7).
 */
import type { ChannelPhase, PhaseName, Quantity } from './capture.js';

// ---------------------------------------------------------------------------------------------- units

/** A unit as written, read: base unit ('V', 'A', 's', or the text itself), factor to it, what it measures. */
export interface ReadUnit {
	unit: string;
	factor: number;
	kind: Quantity | 'time' | 'counts';
}

// 'K' is how relay files write kilo (`KV`, `KA`); upper-case 'M' is mega, lower-case 'm' milli; 'u' micro.
const PREFIX: Record<string, number> = { n: 1e-9, u: 1e-6, µ: 1e-6, μ: 1e-6, m: 1e-3, '': 1, k: 1e3, K: 1e3, M: 1e6 };

/**
 * Reads unit text such as 'mV', 'kA', 'KV', '(V)', 'Volts', 'a', 'ms', 'µs', 'counts'. Null when empty.
 * @example readUnit('kV') // { unit: 'V', factor: 1000, kind: 'voltage' }
 */
export function readUnit(text: string): ReadUnit | null {
	if (text.length > 40) return { unit: text, factor: 1, kind: 'other' };
	let t = text
		.trim()
		.replace(/^[([{]\s*|\s*[)\]}]$/g, '')
		.trim();
	if (t === '') return null;
	t = t
		.replace(/\s*(rms|pk|peak|inst)$/i, '')
		.replace(/^(volts?|v)$/i, 'V')
		.replace(/^(amps?|amperes?|a)$/i, 'A')
		.replace(/^([kKMmuµμn])(v|a)$/, (_, p: string, b: string) => p + b.toUpperCase());
	const m = /^(n|u|µ|μ|m|k|K|M)?(V|A|s|sec|secs|seconds?)$/.exec(t);
	if (m) {
		const base = m[2] === 'V' ? 'V' : m[2] === 'A' ? 'A' : 's';
		const factor = PREFIX[m[1] ?? ''];
		// 'Ms' (megasecond) and 'ks' are not time units anyone writes for samples; treat as unknown text.
		if (base === 's' && factor > 1) return { unit: t, factor: 1, kind: 'other' };
		return { unit: base, factor, kind: base === 'V' ? 'voltage' : base === 'A' ? 'current' : 'time' };
	}
	if (/^(counts?|lsb|raw|adc|digits?|codes?)$/i.test(t)) return { unit: t, factor: 1, kind: 'counts' };
	return { unit: t, factor: 1, kind: 'other' };
}

/** A unit normalised to V or A when it is one: SI unit, factor from the source unit, quantity. */
export interface NormalisedUnit {
	/** 'V', 'A', or the source's own text (trimmed) for anything else. */
	unit: string;
	/** Multiply values in the source unit by this to get `unit` (kV -> V: 1000). */
	factor: number;
	quantity: Quantity;
}

/**
 * Normalise a unit text to V or A when it is one, with its prefix factor; anything else is kept as text.
 * @example normaliseUnitText('kV') // { unit: 'V', factor: 1000, quantity: 'voltage' }
 */
export function normaliseUnitText(text: string): NormalisedUnit {
	const r = readUnit(text);
	if (r && (r.kind === 'voltage' || r.kind === 'current')) return { unit: r.unit, factor: r.factor, quantity: r.kind };
	return { unit: text.trim(), factor: 1, quantity: 'other' };
}

// --------------------------------------------------------------------------------------- phase labels

/** Label families in use around the world; B is phase 2 in A/B/C but phase 3 in R/Y/B. */
export type PhaseFamily = 'numeric' | 'ABC' | 'RST' | 'RYB' | 'UVW';

/** Phase index 1..3 in the family's own order (A = R = U = L1 = 1). */
export type PhaseIndex = 1 | 2 | 3;

/** What a channel name says about phase and quantity. Letter tokens are left unresolved (see resolvePhaseToken). */
export interface ParsedPhaseLabel {
	kind: 'phase' | 'line-to-line' | 'neutral';
	/** Phase tokens as written, normalised: '1', '2', '3', or one letter of ABCRSTYUVW. One for 'phase', two for 'line-to-line', none for 'neutral'. */
	tokens: string[];
	/** Quantity the name implies through a prefix or a word (U/V/E/VOLTAGE, I/CURRENT), if any. */
	quantityHint?: 'voltage' | 'current';
}

// Words for the quantity in the languages recorders are set to (common practice): English, German, French, Spanish.
const WORD_VOLTAGE = new Set(['VOLTAGE', 'VOLTS', 'VOLT', 'SPANNUNG', 'TENSION', 'TENSIÓN']);
const WORD_CURRENT = new Set(['CURRENT', 'AMPS', 'AMP', 'AMPERE', 'AMPERES', 'STROM', 'COURANT', 'CORRIENTE']);
const WORD_NOISE = new Set([
	'PHASE',
	'PH',
	'LINE',
	'RMS',
	'INST',
	'INSTANTANEOUS',
	'WAVE',
	'WAVEFORM',
	'SAMPLE',
	'SAMPLES',
	'TO',
	'PRIMARY',
	'SECONDARY',
]);
const PREFIXES: [string, 'voltage' | 'current'][] = [
	['U', 'voltage'],
	['V', 'voltage'],
	['E', 'voltage'],
	['I', 'current'],
];
const TOKEN = '(?:L?([123])|([ABCRSTYUVW]))';
const PHASE_RE = new RegExp(`^${TOKEN}N?$`);
const PAIR_RE = new RegExp(`^${TOKEN}L?${TOKEN}$`);
/** Longest name read for a label: longer cells are not channel names (and keep the patterns cheap). */
const MAX_NAME_CHARS = 120;

/**
 * Reads a phase label from a channel name (or a COMTRADE `ph` field).
 *
 * Accepted, case-insensitive, separators (space _ - / . :) ignored: an optional quantity prefix
 * (U, V, E for voltage, I for current; or a word such as VOLTAGE, SPANNUNG, CURRENT, STROM), then a
 * phase token (1, L1, A, R, Y, U...) optionally followed by N ('to neutral'); or two tokens
 * (line-to-line: 12, L1-L2, AB); or N alone (neutral). Names starting with CH/CHANNEL (oscilloscope
 * inputs) are never read as phases. A quantity prefix is preferred when both readings exist: 'UV' is the
 * voltage of phase V, not U-V.
 * Ref: IEC 60445 conductor designations L1/L2/L3/N (from memory); the other families are common practice.
 * @returns the parse, or undefined when the name carries no phase label
 * @example parsePhaseLabel('V_L3-N') // { kind: 'phase', tokens: ['3'], quantityHint: 'voltage' }
 */
export function parsePhaseLabel(name: string): ParsedPhaseLabel | undefined {
	const cleaned = name
		.slice(0, MAX_NAME_CHARS)
		.toUpperCase()
		.replace(/\(.*?\)|\[.*?\]/g, ' ')
		.trim();
	if (cleaned === '' || /^CH(ANNEL)?\b|^CH\d/.test(cleaned)) return undefined;
	let quantityHint: 'voltage' | 'current' | undefined;
	const kept: string[] = [];
	for (const word of cleaned.split(/[\s_\-/.:,]+/)) {
		if (word === '') continue;
		if (WORD_VOLTAGE.has(word)) quantityHint = 'voltage';
		else if (WORD_CURRENT.has(word)) quantityHint = 'current';
		else if (!WORD_NOISE.has(word)) kept.push(word);
	}
	const compact = kept.join('');
	if (compact === '') return undefined;
	for (const [prefix, q] of PREFIXES) {
		if (compact.length > prefix.length && compact.startsWith(prefix)) {
			const body = parseBody(compact.slice(prefix.length));
			if (body) return { ...body, quantityHint: quantityHint ?? q };
		}
	}
	const body = parseBody(compact);
	return body ? { ...body, ...(quantityHint ? { quantityHint } : {}) } : undefined;
}

function parseBody(body: string): Omit<ParsedPhaseLabel, 'quantityHint'> | undefined {
	if (body === 'N') return { kind: 'neutral', tokens: [] };
	const p = PHASE_RE.exec(body);
	if (p) return { kind: 'phase', tokens: [p[1] ?? p[2]] };
	const q = PAIR_RE.exec(body);
	if (q) {
		const a = q[1] ?? q[2];
		const b = q[3] ?? q[4];
		// both digits or both letters: 'C1' is not a line-to-line pair
		if (a !== b && /\d/.test(a) === /\d/.test(b)) return { kind: 'line-to-line', tokens: [a, b] };
	}
	return undefined;
}

const LETTERS: Record<string, [PhaseFamily, PhaseIndex][]> = {
	A: [['ABC', 1]],
	B: [
		['ABC', 2],
		['RYB', 3],
	],
	C: [['ABC', 3]],
	R: [
		['RST', 1],
		['RYB', 1],
	],
	S: [['RST', 2]],
	T: [['RST', 3]],
	Y: [['RYB', 2]],
	U: [['UVW', 1]],
	V: [['UVW', 2]],
	W: [['UVW', 3]],
};

/**
 * Phase index of one token under the capture's letter family: '2' → 2; 'B' → 2 under A/B/C, 3 under R/Y/B.
 * @param letterFamily  family the capture's letters were found to use (see inferPhaseFamily); ignored for digits
 * @returns the index, or undefined when the token does not belong to the family
 * @example resolvePhaseToken('B', 'RYB') // 3
 */
export function resolvePhaseToken(token: string, letterFamily: PhaseFamily): PhaseIndex | undefined {
	if (token === '1' || token === '2' || token === '3') return Number(token) as PhaseIndex;
	return LETTERS[token]?.find(([f]) => f === letterFamily)?.[1];
}

/**
 * The letter family a set of parsed labels uses: A/C → A/B/C, Y → R/Y/B, S/T → R/S/T, U/V/W → U/V/W;
 * 'numeric' when no letters appear. B alone or R alone is ambiguous: A/B/C (resp. R/S/T) is assumed and
 * `assumed` is true, so the caller can report it.
 * @example inferPhaseFamily([['R'], ['Y'], ['B']].map((t) => ({ kind: 'phase', tokens: t }))) // { family: 'RYB', assumed: false }
 */
export function inferPhaseFamily(labels: ParsedPhaseLabel[]): {
	family: PhaseFamily;
	assumed: boolean;
	conflicting: PhaseFamily[];
} {
	const letters = new Set(labels.flatMap((l) => l.tokens).filter((t) => /[A-Z]/.test(t)));
	if (letters.size === 0) return { family: 'numeric', assumed: false, conflicting: [] };
	const votes: PhaseFamily[] = [];
	if (letters.has('A') || letters.has('C')) votes.push('ABC');
	if (letters.has('Y')) votes.push('RYB');
	if (letters.has('S') || letters.has('T')) votes.push('RST');
	if (letters.has('U') || letters.has('V') || letters.has('W')) votes.push('UVW');
	if (votes.length >= 1) return { family: votes[0], assumed: false, conflicting: votes.slice(1) };
	return { family: letters.has('B') ? 'ABC' : 'RST', assumed: true, conflicting: [] };
}

/** Display label of a phase in a family: 'L1' (numeric), 'A', 'R', 'U'... */
export function phaseDisplayLabel(index: PhaseIndex, family: PhaseFamily): PhaseName {
	const names: Record<PhaseFamily, PhaseName[]> = {
		numeric: ['L1', 'L2', 'L3'],
		ABC: ['A', 'B', 'C'],
		RST: ['R', 'S', 'T'],
		RYB: ['R', 'Y', 'B'],
		UVW: ['U', 'V', 'W'],
	};
	return names[family][index - 1];
}

// ------------------------------------------------------------------------------------ channel identity

/** A token as a conductor name: digits become L1..L3 (IEC 60445), letters stay. */
function tokenName(token: string): PhaseName {
	return (/^[123]$/.test(token) ? `L${token}` : token) as PhaseName;
}

/** The Channel.phase a parsed label stands for: 'L1', 'A', 'L1-L2', 'A-B', 'N'. */
export function channelPhaseOf(label: ParsedPhaseLabel): ChannelPhase {
	if (label.kind === 'neutral') return 'N';
	if (label.kind === 'line-to-line') return `${tokenName(label.tokens[0])}-${tokenName(label.tokens[1])}`;
	return tokenName(label.tokens[0]);
}

/** A name that is a quantity letter alone (U, V, E, I) names a quantity, not phase U or V. */
const LONE_LETTER = /^\s*([UVEI])\s*$/i;

/**
 * Phase of a channel from an explicit phase field (COMTRADE `ph`, a WAV calibration) when that reads as
 * a label, else from its name. Undefined when neither carries one.
 * @example channelPhase('Spannung L1') // 'L1'
 * @example channelPhase('U12') // 'L1-L2'
 */
export function channelPhase(name: string, phaseField?: string): ChannelPhase | undefined {
	const field = phaseField?.trim() ? parsePhaseLabel(phaseField) : undefined;
	if (field) return channelPhaseOf(field);
	if (LONE_LETTER.test(name)) return undefined;
	const label = parsePhaseLabel(name);
	return label ? channelPhaseOf(label) : undefined;
}

/**
 * Voltage or current from a channel name alone, or undefined when the name does not say:
 * a word (volt, Spannung, tension, current, Strom, courant, corriente, amp), a label with a quantity
 * prefix (`Uab`, `VAN`, `E1`, `IL2`, `U12`), a quantity letter alone or followed by a number or a
 * separator (`U`, `I4`, `U_rms`), or a conductor pair (`L1-N`, `L1-L2`: a potential difference).
 * @example quantityFromName('Spannung L1') // 'voltage'
 */
export function quantityFromName(name: string): 'voltage' | 'current' | undefined {
	const n = name.trim().slice(0, MAX_NAME_CHARS);
	if (/volt|spannung|tension|tensi[oó]n|u_?ln|u_?ll/i.test(n)) return 'voltage';
	if (/current|strom|courant|corriente|amp/i.test(n)) return 'current';
	const hint = parsePhaseLabel(n)?.quantityHint;
	if (hint) return hint;
	const letter = /^([UVEI])(?=$|[\d\s_\-./:([])/i.exec(n);
	if (letter) return letter[1].toUpperCase() === 'I' ? 'current' : 'voltage';
	if (/^L[1-3][\s_-]?(N|L[1-3])$/i.test(n)) return 'voltage';
	return undefined;
}

/** Everything a channel's name, unit text and phase field say about it (see channelIdentity). */
export interface ChannelIdentity {
	/** From the unit when it is V or A, else from the name; undefined when neither says. */
	quantity?: 'voltage' | 'current';
	/** Where `quantity` came from. */
	quantityFrom?: 'unit' | 'name';
	/** What the name reads as, disagreeing with the unit (a clamp's voltage output named I1, say). */
	nameQuantity?: 'voltage' | 'current';
	phase?: ChannelPhase;
	/** Normalised unit of the unit text ('V', 'A', or the text itself; '' when none was given). */
	unit: string;
	/** Factor from the written unit to `unit` (mV -> V: 0.001). */
	factor: number;
}

/**
 * The identity of one channel from what its source says: name, unit text (may be empty) and phase field.
 * @example channelIdentity('VAN', 'kV') // { quantity: 'voltage', quantityFrom: 'unit', phase: 'A', unit: 'V', factor: 1000 }
 */
export function channelIdentity(name: string, unitText = '', phaseField?: string): ChannelIdentity {
	const u = normaliseUnitText(unitText);
	const fromName = quantityFromName(name);
	const phase = channelPhase(name, phaseField);
	const id: ChannelIdentity = { unit: u.unit, factor: u.factor };
	if (u.quantity !== 'other') {
		id.quantity = u.quantity;
		id.quantityFrom = 'unit';
		if (fromName && fromName !== u.quantity) id.nameQuantity = fromName;
	} else if (fromName) {
		id.quantity = fromName;
		id.quantityFrom = 'name';
	}
	if (phase) id.phase = phase;
	return id;
}
