/**
 * Pairs voltage and current channels of a capture by phase label, with a user override of every pair.
 */
import type { Channel, Diagnostic } from '../capture.js';
import {
	inferPhaseFamily,
	parsePhaseLabel,
	phaseDisplayLabel,
	resolvePhaseToken,
	type ParsedPhaseLabel,
	type PhaseFamily,
	type PhaseIndex,
} from '../channel-identity.js';

/** A voltage channel and a current channel of the same phase. */
export interface PowerChannelPair {
	/** Phase index 1..3 in the capture's own family. */
	phase: PhaseIndex;
	/** Phase as the capture names it: 'L1', 'A', 'R', 'U'... */
	label: string;
	voltage: string;
	current: string;
	/** 'auto' = matched by label; 'override' = given by the user. */
	origin: 'auto' | 'override';
}

/** A user-chosen pair; `phase` defaults to the voltage channel's label, else the override's position (1, 2, 3). */
export interface PowerPairOverride {
	voltage: string;
	current: string;
	phase?: PhaseIndex;
}

/** Result of pairPowerChannels: pairs, the other roles found, what was left and why. */
export interface PowerChannelPairing {
	/** Pairs sorted by phase. */
	pairs: PowerChannelPair[];
	/** Label family the capture uses ('numeric' for L1/1/U1 style). */
	family: PhaseFamily;
	/** Line-to-neutral (or line-to-reference) voltage channels by phase. */
	phaseVoltages: { phase: PhaseIndex; name: string }[];
	/** Line current channels by phase. */
	phaseCurrents: { phase: PhaseIndex; name: string }[];
	/** Line-to-line voltage channels (U12, L1-L2, Vab...): from → to. */
	lineVoltages: { name: string; from: PhaseIndex; to: PhaseIndex }[];
	/** Neutral current channel, if one is named so (IN, I_N). */
	neutralCurrent?: string;
	/** Neutral(-to-earth) voltage channel, if one is named so (UN, V_N). */
	neutralVoltage?: string;
	/** Channels in no pair and not a line-to-line or neutral channel (a phase voltage without its current is here too). */
	unpaired: string[];
	diagnostics: Diagnostic[];
}

/** What pairing reads of a channel; `phase` may be any label text (it is parsed like a name). */
type ChannelInfo = Pick<Channel, 'name' | 'quantity'> & { phase?: string; unit?: string };

/** What the pairing steps share: each channel's label, the capture's family, the channels taken, the pairs so far. */
interface PairingWork {
	parsed: Map<string, ParsedPhaseLabel | undefined>;
	family: PhaseFamily;
	used: Set<string>;
	pairs: PowerChannelPair[];
	diagnostics: Diagnostic[];
}

/** Read every channel's label and infer the capture's letter family once, saying when it is assumed or mixed. */
function readLabels(channels: readonly ChannelInfo[], diagnostics: Diagnostic[]): PairingWork {
	const parsed = new Map<string, ParsedPhaseLabel | undefined>();
	for (const c of channels)
		parsed.set(c.name, (c.phase ? parsePhaseLabel(c.phase) : undefined) ?? parsePhaseLabel(c.name));
	const labels = [...parsed.values()].filter((p): p is ParsedPhaseLabel => p !== undefined);
	const fam = inferPhaseFamily(labels);
	if (fam.assumed) {
		diagnostics.push({
			code: 'pairing-family-assumed',
			severity: 'assumption',
			message: `phase letters are ambiguous; read as ${fam.family === 'ABC' ? 'A/B/C (B = phase 2, not R/Y/B where B = phase 3)' : 'R/S/T'}. Override the pairs if that is wrong.`,
		});
	}
	if (fam.conflicting.length > 0) {
		diagnostics.push({
			code: 'pairing-family-mixed',
			severity: 'warning',
			message: `channel names mix phase-letter families (${[fam.family, ...fam.conflicting].join(', ')}); letters were read as ${fam.family}.`,
		});
	}
	return { parsed, family: fam.family, used: new Set(), pairs: [], diagnostics };
}

/** The user's pairs first: every name must exist and be used once; phase from the override, the label, or position. */
function applyOverrides(w: PairingWork, names: Set<string>, overrides: readonly PowerPairOverride[]): void {
	overrides.forEach((o, k) => {
		for (const n of [o.voltage, o.current]) {
			if (!names.has(n))
				throw new RangeError(
					`pairing override names channel "${n}", which the capture does not have (it has: ${[...names].join(', ')})`,
				);
			if (w.used.has(n)) throw new RangeError(`pairing override uses channel "${n}" twice`);
			w.used.add(n);
		}
		const lab = w.parsed.get(o.voltage);
		const fromLabel = lab?.kind === 'phase' ? resolvePhaseToken(lab.tokens[0], w.family) : undefined;
		const phase = o.phase ?? fromLabel ?? (((k % 3) + 1) as PhaseIndex);
		w.pairs.push({
			phase,
			label: phaseDisplayLabel(phase, w.family),
			voltage: o.voltage,
			current: o.current,
			origin: 'override',
		});
		w.diagnostics.push({
			code: 'pairing-override',
			severity: 'info',
			message: `${o.voltage} paired with ${o.current} as phase ${phaseDisplayLabel(phase, w.family)} (set by the user).`,
		});
	});
}

/** A channel's quantity, else the one its name hints at (said as an assumption). */
function quantityOf(w: PairingWork, c: ChannelInfo): 'voltage' | 'current' | 'other' {
	if (c.quantity !== 'other') return c.quantity;
	const hint = w.parsed.get(c.name)?.quantityHint;
	if (hint) {
		w.diagnostics.push({
			code: 'pairing-quantity-from-name',
			severity: 'assumption',
			message: `channel ${c.name} has no V or A unit; taken as a ${hint} channel from its name.`,
		});
		return hint;
	}
	return 'other';
}

type ChannelRoles = Pick<
	PowerChannelPairing,
	'phaseVoltages' | 'phaseCurrents' | 'lineVoltages' | 'neutralCurrent' | 'neutralVoltage'
> & { unlabelled: string[] };

/** Each channel's role by its label: phase voltage or current, line-to-line voltage, neutral, or unlabelled. */
function sortRoles(w: PairingWork, channels: readonly ChannelInfo[]): ChannelRoles {
	const r: ChannelRoles = { phaseVoltages: [], phaseCurrents: [], lineVoltages: [], unlabelled: [] };
	for (const c of channels) {
		const q = quantityOf(w, c);
		const lab = w.parsed.get(c.name);
		if (!lab || q === 'other') {
			if (q !== 'other') r.unlabelled.push(c.name);
			continue;
		}
		if (lab.kind === 'neutral') {
			if (q === 'current' && r.neutralCurrent === undefined) {
				r.neutralCurrent = c.name;
				w.used.add(c.name);
			} else if (q === 'voltage' && r.neutralVoltage === undefined) {
				r.neutralVoltage = c.name;
				w.used.add(c.name);
			}
			continue;
		}
		const idx = lab.tokens.map((t) => resolvePhaseToken(t, w.family));
		if (idx.some((i) => i === undefined)) {
			w.diagnostics.push({
				code: 'pairing-label-family',
				severity: 'warning',
				message: `channel ${c.name}: its phase letter does not belong to the ${w.family} family the other channels use; not paired.`,
			});
			continue;
		}
		if (lab.kind === 'line-to-line') {
			if (q === 'voltage') {
				r.lineVoltages.push({ name: c.name, from: idx[0]!, to: idx[1]! });
				w.used.add(c.name);
			}
			continue;
		}
		if (q === 'voltage') r.phaseVoltages.push({ phase: idx[0]!, name: c.name });
		else r.phaseCurrents.push({ phase: idx[0]!, name: c.name });
	}
	return r;
}

/** Pair each phase without an override that has exactly one free voltage and one free current channel. */
function matchByPhase(w: PairingWork, r: ChannelRoles): void {
	for (const phase of [1, 2, 3] as PhaseIndex[]) {
		const label = phaseDisplayLabel(phase, w.family);
		if (w.pairs.some((p) => p.phase === phase)) continue;
		const vs = r.phaseVoltages.filter((v) => v.phase === phase && !w.used.has(v.name));
		const is = r.phaseCurrents.filter((i) => i.phase === phase && !w.used.has(i.name));
		if (vs.length === 1 && is.length === 1) {
			w.pairs.push({ phase, label, voltage: vs[0].name, current: is[0].name, origin: 'auto' });
			w.used.add(vs[0].name).add(is[0].name);
			w.diagnostics.push({
				code: 'pairing-auto',
				severity: 'info',
				message: `${vs[0].name} paired with ${is[0].name} as phase ${label} (matched by phase label).`,
			});
		} else if (vs.length > 1 || is.length > 1) {
			w.diagnostics.push({
				code: 'pairing-ambiguous',
				severity: 'warning',
				message: `phase ${label} has ${vs.length} voltage and ${is.length} current channels (${[...vs, ...is].map((x) => x.name).join(', ')}); not paired: give the pair explicitly.`,
			});
		} else if (vs.length + is.length === 1) {
			const only = vs[0] ?? is[0];
			w.diagnostics.push({
				code: 'pairing-missing-partner',
				severity: 'info',
				message: `phase ${label} has ${vs.length ? 'a voltage' : 'a current'} channel (${only.name}) but no ${vs.length ? 'current' : 'voltage'} channel: no power for that phase.`,
			});
		}
	}
}

/**
 * Pairs voltage and current channels by phase label and quantity.
 *
 * Each channel's label is read from `channel.phase` when set, else from its name (parsePhaseLabel);
 * its quantity from `channel.quantity`, else from the name's prefix (reported as an assumption).
 * The letter family (A/B/C, R/S/T, R/Y/B, U/V/W) is inferred once for the capture, so 'B' is phase 2 of
 * A/B/C but phase 3 of R/Y/B. A phase pairs when it has exactly one voltage and one current channel.
 * Overrides are applied first and take their channels out of the automatic matching.
 * Ref: common practice (no standard fixes channel naming).
 * @param channels  the capture's channels (only name, quantity, phase and unit are read)
 * @param overrides  user pairs; every name must exist and be used once
 * @throws RangeError for an override naming an unknown channel or using a channel twice
 * @example pairPowerChannels(capture.channels).pairs // [{ phase: 1, label: 'A', voltage: 'Va', current: 'Ia', origin: 'auto' }, ...]
 */
export function pairPowerChannels(
	channels: readonly ChannelInfo[],
	overrides: readonly PowerPairOverride[] = [],
): PowerChannelPairing {
	const w = readLabels(channels, []);
	applyOverrides(w, new Set(channels.map((c) => c.name)), overrides);
	const r = sortRoles(w, channels);
	matchByPhase(w, r);
	if (r.unlabelled.length > 0) {
		w.diagnostics.push({
			code: 'pairing-unlabelled',
			severity: 'info',
			message: `no phase label could be read from ${r.unlabelled.join(', ')}; pair them by hand if they belong to a phase.`,
		});
	}
	w.pairs.sort((a, b) => a.phase - b.phase);
	return {
		pairs: w.pairs,
		family: w.family,
		phaseVoltages: r.phaseVoltages,
		phaseCurrents: r.phaseCurrents,
		lineVoltages: r.lineVoltages,
		...(r.neutralCurrent !== undefined ? { neutralCurrent: r.neutralCurrent } : {}),
		...(r.neutralVoltage !== undefined ? { neutralVoltage: r.neutralVoltage } : {}),
		unpaired: channels.map((c) => c.name).filter((n) => !w.used.has(n)),
		diagnostics: w.diagnostics,
	};
}
