/**
 * Three-phase figures of a short record: the sets (rotation, sequence components, unbalance), the
 * neutral current and the IEEE 1459 three-phase power from the shared-frequency fit, each marked as fitted with its uncertainty.
 * The sets are found and computed by the same code as on whole cycles (`threePhaseSets`, which takes the
 * sequence components from lib/phasor); only the phasors and the uncertainties come from here.
 */
import type { Capture } from '../capture.js';
import { phasorFromPolarDeg, type ComplexPhasor } from '../phasor/phasor.js';
import { neutralCurrentFigures } from '../polyphase/neutral.js';
import type { HarmonicSet } from '../spectrum/types.js';
import { FITTED_NOTE, type ShortRecordResult } from './short-record.js';
import { pairChannels, threePhaseSets } from './relations.js';
import { threePhasePowerFromHarmonics, type ThreePhaseInputPhase } from '../power/three-phase.js';
import type { ReportNeutral, ReportThreePhase, ReportThreePhasePower } from './types.js';

/**
 * Each channel's fitted fundamental as an RMS phasor, turned so that the reference's lies at 0° (the same
 * convention as `alignedFundamentals` on whole cycles).
 */
export function fittedFundamentals(r: ShortRecordResult, refIndex: number): ComplexPhasor[] {
	const turn = r.fit.channels[refIndex].phaseRad[1];
	return r.fit.channels.map((c) => phasorFromPolarDeg(c.amplitude[1] / Math.SQRT2, deg(c.phaseRad[1] - turn)));
}

/**
 * One standard deviation of a sequence component X = (1/3)·Σ cⱼ·Vⱼ (|cⱼ| = 1) from independent errors of the
 * three phasors: E|δX|² = (1/9)·Σ (σ_Aⱼ² + Aⱼ²·σ_φⱼ²), amplitude σ and phase σ of each fitted fundamental
 * (RMS). It bounds the deviation of |X| too (|δ|X|| ≤ |δX|), also where |X| is near zero.
 */
function componentStd(amps: number[], ampStd: number[], phaseStd: number[]): number {
	let v = 0;
	for (let j = 0; j < 3; j++) v += ampStd[j] ** 2 + (amps[j] * phaseStd[j]) ** 2;
	return Math.sqrt(v) / 3;
}

/**
 * The three-phase sets of a short record with the fit's uncertainty on U1, U2, U0 and the unbalance
 * (first-order: σ_u = 100·√((σ₂/U₁)² + (U₂·σ₁/U₁²)²), U₁ the dominant sequence, U₂ the other), and the
 * neutral current from the fitted harmonics.
 */
export function fittedThreePhase(
	capture: Capture,
	refIndex: number,
	r: ShortRecordResult,
	overrides: Parameters<typeof pairChannels>[1],
): {
	sets: ReportThreePhase[];
	neutral: ReportNeutral | null;
	power: ReportThreePhasePower | null;
	assumptions: string[];
} {
	const pairing = pairChannels(capture.channels, overrides);
	const three = threePhaseSets(capture.channels, pairing.pairing, fittedFundamentals(r, refIndex));
	const sets = three.sets.map((set, k): ReportThreePhase => {
		const m = three.members[k];
		const fitted = m.map((i) => r.fit.channels[i]);
		const amps = fitted.map((c) => c.amplitude[1] / Math.SQRT2);
		const ampStd = fitted.map((c) => c.amplitudeStd[1] / Math.SQRT2);
		const sd = componentStd(
			amps,
			ampStd,
			fitted.map((c) => c.phaseStdRad[1]),
		);
		// unbalance is taken in the measured rotation: the minor sequence over the dominant one
		const [u1, u2] = [
			Math.max(set.sequence.positive, set.sequence.negative),
			Math.min(set.sequence.positive, set.sequence.negative),
		];
		return {
			...set,
			fit: {
				sequenceUncertainty: sd,
				unbalanceUncertaintyPercent: u1 > 0 ? 100 * Math.hypot(sd / u1, (u2 * sd) / (u1 * u1)) : NaN,
				note: FITTED_NOTE,
			},
		};
	});
	const currentSet = three.sets.findIndex((t) => t.quantity === 'current');
	let neutral: ReportNeutral | null = null;
	if (currentSet >= 0) {
		const name = pairing.pairing.neutralCurrent;
		const measured = name === undefined ? -1 : capture.channels.findIndex((c) => c.name === name);
		neutral = fittedNeutral(capture, r, three.members[currentSet], measured);
	}
	// the pairing's own assumptions are said once, by the power step
	return { sets, neutral, power: fittedThreePhasePower(capture, r, pairing.pairs), assumptions: three.assumptions };
}

/**
 * IEEE 1459 three-phase figures of three V/I pairs labelled phases 1, 2, 3, from the fitted harmonic sets
 * (orders up to the highest the record resolves; line voltages and neutral summed per order from them).
 */
function fittedThreePhasePower(
	capture: Capture,
	r: ShortRecordResult,
	pairs: { voltage: number; current: number; phase: number | null }[],
): ReportThreePhasePower | null {
	const byPhase = [1, 2, 3].map((ph) => pairs.find((p) => p.phase === ph));
	if (byPhase.some((p) => p === undefined)) return null;
	const fitted = (i: number): HarmonicSet => ({
		...r.sets[i],
		orders: r.sets[i].orders.filter((o) => o.order <= r.fit.highestOrder),
	});
	const phases = byPhase.map((p) => ({ voltage: fitted(p!.voltage), current: fitted(p!.current) })) as [
		ThreePhaseInputPhase,
		ThreePhaseInputPhase,
		ThreePhaseInputPhase,
	];
	const q = threePhasePowerFromHarmonics('4-wire', phases);
	const figures: Record<string, number> = {};
	for (const [k, x] of Object.entries(q)) if (typeof x === 'number') figures[k] = x;
	return {
		channels: byPhase.map((p) => [capture.channels[p!.voltage].name, capture.channels[p!.current].name]),
		wiring: q.wiring,
		sequenceOrder: q.sequenceOrder,
		figures,
		note: FITTED_NOTE,
	};
}

/** RMS of a fitted set: √(Σ rms_h²) over its orders (dc included). */
function setRms(set: HarmonicSet): number {
	let s = 0;
	for (const o of set.orders) if (Number.isFinite(o.rms)) s += o.rms * o.rms;
	return Math.sqrt(s);
}

/**
 * Neutral current of a fitted current set: a measured neutral channel's fitted set, else the phasor sum
 * of the three phases order by order (all fitted phases refer to the same first sample, so the sums hold).
 */
function fittedNeutral(capture: Capture, r: ShortRecordResult, currents: number[], measured: number): ReportNeutral {
	const phaseRms = currents.map((i) => setRms(r.sets[i])) as [number, number, number];
	if (measured >= 0) {
		const set = { ...r.sets[measured], orders: r.sets[measured].orders.filter((o) => o.order <= r.fit.highestOrder) };
		return {
			channel: capture.channels[measured].name,
			...neutralCurrentFigures('measured', setRms(set), phaseRms, set),
		};
	}
	const orders = r.sets[currents[0]].orders.map((o, k) => {
		let re = 0;
		let im = 0;
		for (const i of currents) {
			const h = r.sets[i].orders[k];
			if (!Number.isFinite(h.rms) || h.rms === 0) continue;
			const p = phasorFromPolarDeg(h.rms, h.phaseDeg); // order 0: the dc at 0° or 180°
			re += p.re;
			im += p.im;
		}
		const rms = Number.isFinite(o.rms) ? Math.hypot(re, im) : NaN;
		return { order: o.order, rms, phaseDeg: rms > 0 ? deg(Math.atan2(im, re)) : NaN };
	});
	// only the fitted orders: those above the highest the record resolves are not known (NaN)
	const set: HarmonicSet = { ...r.sets[currents[0]], orders: orders.filter((o) => o.order <= r.fit.highestOrder) };
	return { channel: null, ...neutralCurrentFigures('computed', setRms(set), phaseRms, set) };
}

function deg(rad: number): number {
	return (rad * 180) / Math.PI;
}
