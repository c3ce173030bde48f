/**
 * Phase labels read from channel names: L1/L2/L3, A/B/C, R/S/T, R/Y/B, U/V/W, 1/2/3, with quantity
 * prefixes (U, V, E, I), line-to-line pairs (U12, L1-L2, Vab) and neutral (IN, I_N).
 */

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

const WORD_VOLTAGE = new Set(['VOLTAGE', 'VOLTS', 'VOLT']);
const WORD_CURRENT = new Set(['CURRENT', 'AMPS', 'AMP', 'AMPERE', 'AMPERES']);
const WORD_NOISE = new Set(['PHASE', 'PH', 'LINE', 'RMS', 'INST', 'INSTANTANEOUS', 'WAVE', 'WAVEFORM', 'SAMPLE', 'SAMPLES', 'TO', 'PRIMARY', 'SECONDARY']);
const PREFIXES: [string, 'voltage' | 'current'][] = [
	['U', 'voltage'],
	['V', 'voltage'],
	['E', 'voltage'],
	['I', 'current'],
];
const TOKEN = '(?:L?([123])|([ABCRSTYUVW]))';
const PHASE_RE = new RegExp(`^${TOKEN}N?$`);
const PAIR_RE = new RegExp(`^${TOKEN}L?${TOKEN}$`);

/**
 * Reads a phase label from a channel name (or a COMTRADE `ph` field).
 *
 * Accepted, case-insensitive, separators (space _ - / . :) ignored: an optional quantity prefix
 * (U, V, E for voltage, I for current; or the words VOLTAGE/CURRENT), then a phase token (1, L1, A, R, Y, U...)
 * optionally followed by N ('to neutral'); or two tokens (line-to-line: 12, L1-L2, AB); or N alone (neutral).
 * Names starting with CH/CHANNEL (oscilloscope inputs) are never read as phases.
 * A quantity prefix is preferred when both readings exist: 'UV' is the voltage of phase V, not U-V.
 * Ref: IEC 60445 conductor designations L1/L2/L3/N (from memory); the other families are common practice.
 * @returns the parse, or undefined when the name carries no phase label
 * @example parsePhaseLabel('V_L3-N') // { kind: 'phase', tokens: ['3'], quantityHint: 'voltage' }
 */
export function parsePhaseLabel(name: string): ParsedPhaseLabel | undefined {
	const cleaned = name
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
	B: [['ABC', 2], ['RYB', 3]],
	C: [['ABC', 3]],
	R: [['RST', 1], ['RYB', 1]],
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
export function inferPhaseFamily(labels: ParsedPhaseLabel[]): { family: PhaseFamily; assumed: boolean; conflicting: PhaseFamily[] } {
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
export function phaseDisplayLabel(index: PhaseIndex, family: PhaseFamily): string {
	const names: Record<PhaseFamily, string[]> = { numeric: ['L1', 'L2', 'L3'], ABC: ['A', 'B', 'C'], RST: ['R', 'S', 'T'], RYB: ['R', 'Y', 'B'], UVW: ['U', 'V', 'W'] };
	return names[family][index - 1];
}
