/**
 * Relations between channels analysed on the same windows: phase against the reference, power of each
 * voltage/current pair (IEEE 1459) and three-phase sets (rotation, sequence components, unbalance).
 */
import type { Capture, Channel } from '../capture.js';
import { currentUnbalance, lineVoltageUnbalance, voltageUnbalance } from '../polyphase/unbalance.js';
import { phaseRotation } from '../polyphase/rotation.js';
import { symmetricalComponents } from '../phasor/sequence.js';
import { loadCharacterFromAngle } from '../power/load-character.js';
import { pairPowerChannels, type PowerChannelPairing } from '../power/pairing.js';
import {
	complexPower,
	phasorAbs,
	phasorArgDeg,
	phasorFromHarmonic,
	phasorMul,
	phasorScale,
	wrapAngleDeg,
	type ComplexPhasor,
} from '../phasor/phasor.js';
import { ieee1459FromComponents } from '../power/single-phase.js';
import { crossCorrelationLag } from '../power/time-lag.js';
import type { PowerSampleWindow } from '../power/window.js';
import { PowerWindowSums } from './window-sums.js';
import type { ChannelSpectrum } from './spectra.js';
import type { ReportPairOverride, ReportPair, ReportPower, ReportThreePhase } from './types.js';

/**
 * Each channel's fundamental phasor averaged over the windows after turning every window so that the
 * reference fundamental lies at 0°: a stable phasor per channel even when the windows start at different
 * points of the wave. Magnitudes are RMS; the reference comes out real and positive.
 */
export function alignedFundamentals(
	spectra: (ChannelSpectrum | undefined)[],
	refIndex: number,
): (ComplexPhasor | undefined)[] {
	const ref = spectra[refIndex];
	if (!ref) return spectra.map(() => undefined);
	const turns = ref.fundamentals.map((f) => {
		const a = phasorArgDeg(phasorFromHarmonic(f));
		const rad = Number.isNaN(a) ? 0 : (-a * Math.PI) / 180;
		return { re: Math.cos(rad), im: Math.sin(rad) };
	});
	return spectra.map((s) => {
		if (!s) return undefined;
		let re = 0;
		let im = 0;
		s.fundamentals.forEach((f, k) => {
			const p = phasorMul(phasorFromHarmonic(f), turns[k]);
			re += p.re;
			im += p.im;
		});
		return { re: re / s.fundamentals.length, im: im / s.fundamentals.length };
	});
}

/** Every other channel with a fundamental against the reference: phasor angle and cross-correlation time lag. */
export function pairsAgainstReference(
	capture: Capture,
	refIndex: number,
	phasors: (ComplexPhasor | undefined)[],
	window: PowerSampleWindow,
): ReportPair[] {
	const ref = capture.channels[refIndex];
	const out: ReportPair[] = [];
	capture.channels.forEach((c, i) => {
		if (i === refIndex) return;
		const p = phasors[i];
		const lagDeg = p && phasorAbs(p) > 0 ? wrapAngleDeg(-phasorArgDeg(p)) : NaN;
		let lagS = NaN;
		if (!Number.isNaN(lagDeg)) lagS = crossCorrelationLag(ref.samples, c.samples, capture.sampleRateHz, window).lagS;
		out.push({ ref: ref.name, other: c.name, lagDeg, lagS });
	});
	return out;
}

export interface PairingResult {
	pairs: { voltage: number; current: number; pairedBy: string; phase: number | null }[];
	pairing: PowerChannelPairing;
	assumptions: string[];
}

/** Voltage/current pairs: by phase label (lib/power), the user's overrides first; one V and one I pair anyway. */
export function pairChannels(channels: Channel[], overrides: ReportPairOverride[] | undefined): PairingResult {
	const pairing = pairPowerChannels(channels, overrides ?? []);
	const assumptions = pairing.diagnostics
		.filter((d) => d.severity !== 'info' || d.code === 'pairing-auto')
		.map((d) => d.message);
	const idx = (name: string) => channels.findIndex((c) => c.name === name);
	const pairs: PairingResult['pairs'] = pairing.pairs.map((p) => ({
		voltage: idx(p.voltage),
		current: idx(p.current),
		pairedBy: p.origin === 'override' ? 'user' : 'phase-label',
		phase: p.phase,
	}));
	if (pairs.length === 0 && !(overrides && overrides.length)) {
		const vs = channels.map((c, i) => (c.quantity === 'voltage' ? i : -1)).filter((i) => i >= 0);
		const is = channels.map((c, i) => (c.quantity === 'current' ? i : -1)).filter((i) => i >= 0);
		if (vs.length === 1 && is.length === 1) {
			pairs.push({ voltage: vs[0], current: is[0], pairedBy: 'only-pair', phase: null });
			assumptions.push(
				`${channels[vs[0]].name} and ${channels[is[0]].name} paired for power: the only voltage and the only current channel.`,
			);
		}
	}
	return { pairs, pairing, assumptions };
}

/** IEEE 1459 single-phase power of one pair over the whole-cycle window. */
export function pairPower(
	capture: Capture,
	pair: PairingResult['pairs'][number],
	spectra: (ChannelSpectrum | undefined)[],
	window: PowerSampleWindow,
	sums = new PowerWindowSums(window),
): Omit<ReportPower, 'relation' | 'loadSentence' | 'powerFactorIntervals'> {
	const v = capture.channels[pair.voltage];
	const i = capture.channels[pair.current];
	const sv = spectra[pair.voltage];
	const si = spectra[pair.current];
	let theta1Deg = NaN;
	let v1 = NaN;
	let i1 = NaN;
	if (sv && si) {
		// Fundamental complex power averaged over the windows: θ1 = its angle (P1 + jQ1 = V1·I1*).
		let re = 0;
		let im = 0;
		sv.fundamentals.forEach((f, k) => {
			const s = complexPower(phasorFromHarmonic(f), phasorFromHarmonic(si.fundamentals[k]));
			re += s.re;
			im += s.im;
		});
		theta1Deg = phasorArgDeg({ re, im });
		v1 = sv.aggregate.set.orders[1].rms;
		i1 = si.aggregate.set.orders[1].rms;
	}
	const q = ieee1459FromComponents({
		voltageRmsV: sums.rms(v.samples),
		currentRmsA: sums.rms(i.samples),
		v1RmsV: v1,
		i1RmsA: i1,
		theta1Deg,
		activePowerW: sums.activePowerW(v.samples, i.samples),
	});
	const ch = loadCharacterFromAngle(theta1Deg);
	const all: Record<string, number> = {};
	for (const [k, x] of Object.entries(q)) if (typeof x === 'number') all[k] = x;
	return {
		voltage: v.name,
		current: i.name,
		activeW: q.activePowerW,
		apparentVA: q.apparentPowerVA,
		reactiveVar: q.fundamentalReactivePowerVar,
		powerFactor: q.powerFactor,
		displacementPowerFactor: q.displacementPowerFactor,
		character: ch.character === 'undetermined' ? null : ch.character,
		ieee1459: all,
		pairedBy: pair.pairedBy,
		phase: pair.phase,
	};
}

/** Three-phase sets: phase voltages (or currents) labelled 1, 2, 3; else exactly three unlabelled channels of a kind. */
export function threePhaseSets(
	channels: Channel[],
	pairing: PowerChannelPairing,
	phasors: (ComplexPhasor | undefined)[],
): { sets: ReportThreePhase[]; members: number[][]; assumptions: string[] } {
	const sets: ReportThreePhase[] = [];
	const memberList: number[][] = [];
	const assumptions: string[] = [];
	const idx = (name: string) => channels.findIndex((c) => c.name === name);
	for (const quantity of ['voltage', 'current'] as const) {
		const labelled = quantity === 'voltage' ? pairing.phaseVoltages : pairing.phaseCurrents;
		let members: number[] | undefined;
		const byPhase = [1, 2, 3].map((p) => labelled.filter((x) => x.phase === p));
		if (byPhase.every((l) => l.length === 1)) members = byPhase.map((l) => idx(l[0].name));
		else {
			const all = channels.map((c, i) => (c.quantity === quantity ? i : -1)).filter((i) => i >= 0);
			const lines = new Set(pairing.lineVoltages.map((l) => l.name));
			const plain = all.filter(
				(i) =>
					!lines.has(channels[i].name) &&
					channels[i].name !== pairing.neutralCurrent &&
					channels[i].name !== pairing.neutralVoltage,
			);
			if (labelled.length === 0 && plain.length === 3) {
				members = plain;
				assumptions.push(
					`${plain.map((i) => channels[i].name).join(', ')} taken as phases 1, 2, 3 in column order (no phase labels could be read).`,
				);
			}
		}
		if (!members) continue;
		const ph = members.map((i) => phasors[i]);
		if (ph.some((p) => p === undefined)) continue;
		const [a, b, c] = ph as ComplexPhasor[];
		const seq = symmetricalComponents(a, b, c);
		const rot = phaseRotation(a, b, c);
		let unbalancePercent: number;
		let lvurPercent: number;
		let pvurPercent: number;
		if (quantity === 'voltage') {
			const u = voltageUnbalance(a, b, c);
			unbalancePercent = u.vufPercent;
			lvurPercent = u.lvurPercent;
			pvurPercent = u.pvurPercent;
		} else {
			const u = currentUnbalance(a, b, c);
			unbalancePercent = u.negativeSequencePercent;
			lvurPercent = NaN;
			pvurPercent = u.maxDeviationPercent;
		}
		memberList.push(members);
		sets.push({
			channels: members.map((i) => channels[i].name),
			quantity,
			connection: quantity === 'voltage' ? 'line-to-neutral' : 'line',
			rotation: rot.rotation === 'undetermined' ? null : rot.rotation,
			rotationClarity: rot.clarity,
			rotationSentence: rot.sentence,
			unbalancePercent,
			lvurPercent,
			pvurPercent,
			sequence: { zero: seq.zeroRms, positive: seq.positiveRms, negative: seq.negativeRms },
			sequenceDeg: { zero: phasorArgDeg(seq.zero), positive: seq.positivePhaseDeg, negative: seq.negativePhaseDeg },
		});
	}
	if (!sets.some((t) => t.quantity === 'voltage')) {
		const line = lineToLineSet(channels, pairing, phasors);
		if (line) {
			sets.unshift(line.set);
			memberList.unshift(line.members);
		}
	}
	return { sets, members: memberList, assumptions };
}

/**
 * A set of three line-to-line voltage channels (U12, U23, U31 or the like; a channel written the other
 * way round, U21, counts negated). Line voltages hold no zero sequence; VUF from their sequence
 * components equals the phase-voltage VUF; PVUR needs phase voltages and is NaN.
 */
function lineToLineSet(
	channels: Channel[],
	pairing: PowerChannelPairing,
	phasors: (ComplexPhasor | undefined)[],
): { set: ReportThreePhase; members: number[] } | undefined {
	const want: [number, number][] = [
		[1, 2],
		[2, 3],
		[3, 1],
	];
	const found = want.map(([a, b]) => {
		const same = pairing.lineVoltages.find((l) => l.from === a && l.to === b);
		const reversed = pairing.lineVoltages.find((l) => l.from === b && l.to === a);
		const hit = same ?? reversed;
		if (!hit) return undefined;
		const index = channels.findIndex((c) => c.name === hit.name);
		const p = phasors[index];
		return p ? { index, phasor: same ? p : phasorScale(p, -1) } : undefined;
	});
	if (found.some((f) => f === undefined)) return undefined;
	const [a, b, c] = found.map((f) => f!.phasor);
	const seq = symmetricalComponents(a, b, c);
	const rot = phaseRotation(a, b, c);
	const u = lineVoltageUnbalance(a, b, c);
	return {
		members: found.map((f) => f!.index),
		set: {
			channels: found.map((f) => channels[f!.index].name),
			quantity: 'voltage',
			connection: 'line-to-line',
			rotation: rot.rotation === 'undetermined' ? null : rot.rotation,
			rotationClarity: rot.clarity,
			rotationSentence: rot.sentence,
			unbalancePercent: u.vufPercent,
			lvurPercent: u.lvurPercent,
			pvurPercent: NaN,
			sequence: { zero: seq.zeroRms, positive: seq.positiveRms, negative: seq.negativeRms },
			sequenceDeg: { zero: phasorArgDeg(seq.zero), positive: seq.positivePhaseDeg, negative: seq.negativePhaseDeg },
		},
	};
}
