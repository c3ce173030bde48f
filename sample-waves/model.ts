/**
 * Closed-form construction of the demo signals and their ground truth. Every channel is a sum of
 * harmonics of one fundamental, optionally with a piecewise-constant envelope (a dip):
 *
 *   x(t) = env(t) · Σ_h √2 · rms_h · sin(h · 2π f · t + phaseDeg_h · π/180),   t from the first sample.
 *
 * The expected figures follow from the harmonic amplitudes alone (orthogonality of whole cycles):
 *   RMS = √(Σ rms_h²), THD_F = √(Σ_{h≥2} rms_h²) / rms_1, THD_R = √(Σ_{h≥2} rms_h²) / RMS,
 *   P = Σ_h V_h I_h cos(φV_h − φI_h), S = V·I, PF = P/S, DPF = cos(φV_1 − φI_1), Q1 = V_1 I_1 sin(φV_1 − φI_1).
 * Ref: IEEE 1459-2010, 3.1 (single-phase non-sinusoidal definitions; from memory, cf. REFERENCE.md §5.1);
 * symmetrical components: Fortescue 1918 (a = 1∠120°, REFERENCE.md §7).
 */

export interface Harmonic {
	order: number;
	/** RMS value of this component (same unit as the channel). */
	rms: number;
	/** Phase at the first sample, degrees, sine reference. */
	phaseDeg: number;
}

export interface ChannelModel {
	name: string;
	unit: 'V' | 'A';
	phase?: string;
	harmonics: Harmonic[];
	/** Envelope: factor applied from `fromS` (inclusive) to `toS` (exclusive); 1 elsewhere. */
	envelope?: { fromS: number; toS: number; factor: number }[];
}

/** Sample the model at t_k = k / fs, k = 0 … n−1 (times from the first sample). */
export function synthesise(ch: ChannelModel, fundamentalHz: number, sampleRateHz: number, n: number): Float64Array {
	const out = new Float64Array(n);
	for (const h of ch.harmonics) {
		const a = Math.SQRT2 * h.rms;
		const w = (2 * Math.PI * h.order * fundamentalHz) / sampleRateHz;
		const ph = (h.phaseDeg * Math.PI) / 180;
		for (let k = 0; k < n; k++) out[k] += a * Math.sin(w * k + ph);
	}
	for (const e of ch.envelope ?? []) {
		for (let k = 0; k < n; k++) {
			const t = k / sampleRateHz;
			if (t >= e.fromS - 1e-12 && t < e.toS - 1e-12) out[k] *= e.factor;
		}
	}
	return out;
}

const sq = (x: number) => x * x;

/** Closed-form figures of a steady channel (envelope 1). */
export function channelTruth(ch: ChannelModel) {
	const h1 = ch.harmonics.find((h) => h.order === 1)?.rms ?? 0;
	const distortion = Math.sqrt(ch.harmonics.filter((h) => h.order >= 2).reduce((s, h) => s + sq(h.rms), 0));
	const rms = Math.sqrt(ch.harmonics.reduce((s, h) => s + sq(h.rms), 0));
	return {
		rms,
		fundamentalRms: h1,
		thdFPct: h1 > 0 ? (100 * distortion) / h1 : null,
		thdRPct: rms > 0 ? (100 * distortion) / rms : null,
	};
}

/** Single-phase power of a voltage/current pair (same record, same time origin). */
export function pairTruth(v: ChannelModel, i: ChannelModel) {
	let p = 0;
	for (const hv of v.harmonics) {
		const hi = i.harmonics.find((x) => x.order === hv.order);
		if (hi) p += hv.rms * hi.rms * Math.cos(((hv.phaseDeg - hi.phaseDeg) * Math.PI) / 180);
	}
	const v1 = v.harmonics.find((h) => h.order === 1)!;
	const i1 = i.harmonics.find((h) => h.order === 1)!;
	const theta = ((v1.phaseDeg - i1.phaseDeg) * Math.PI) / 180;
	const s = channelTruth(v).rms * channelTruth(i).rms;
	return {
		voltage: v.name,
		current: i.name,
		activePowerW: p,
		fundamentalActivePowerW: v1.rms * i1.rms * Math.cos(theta),
		fundamentalReactivePowerVar: v1.rms * i1.rms * Math.sin(theta),
		apparentPowerVA: s,
		fundamentalApparentPowerVA: v1.rms * i1.rms,
		powerFactor: p / s,
		displacementPowerFactor: Math.cos(theta),
		currentLagDeg: v1.phaseDeg - i1.phaseDeg,
	};
}

type C = [number, number];
const cmul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const cadd = (...xs: C[]): C => xs.reduce((s, x) => [s[0] + x[0], s[1] + x[1]], [0, 0] as C);
const polar = (r: number, deg: number): C => [r * Math.cos((deg * Math.PI) / 180), r * Math.sin((deg * Math.PI) / 180)];
const abs = (z: C) => Math.hypot(z[0], z[1]);

/** Symmetrical components of the fundamentals of three channels in the order given (L1, L2, L3). */
export function sequenceTruth(chs: [ChannelModel, ChannelModel, ChannelModel]) {
	const ph = chs.map((c) => {
		const h = c.harmonics.find((x) => x.order === 1)!;
		return polar(h.rms, h.phaseDeg);
	}) as [C, C, C];
	const a = polar(1, 120);
	const a2 = polar(1, 240);
	const third = (z: C): C => [z[0] / 3, z[1] / 3];
	const zero = third(cadd(ph[0], ph[1], ph[2]));
	const pos = third(cadd(ph[0], cmul(a, ph[1]), cmul(a2, ph[2])));
	const neg = third(cadd(ph[0], cmul(a2, ph[1]), cmul(a, ph[2])));
	return {
		channels: chs.map((c) => c.name),
		rotation: abs(pos) >= abs(neg) ? 'positive (L1-L2-L3)' : 'negative (L1-L3-L2)',
		positiveRms: abs(pos),
		negativeRms: abs(neg),
		zeroRms: abs(zero),
		unbalanceNegativePct: (100 * abs(neg)) / abs(pos),
		unbalanceZeroPct: (100 * abs(zero)) / abs(pos),
	};
}

/** Harmonics of one phase of a balanced set: order h shifts by h × shiftDeg (−120° for L2, +120° for L3). */
export function shifted(hs: Harmonic[], shiftDeg: number, scale = 1): Harmonic[] {
	return hs.map((h) => ({ order: h.order, rms: h.rms * scale, phaseDeg: wrapDeg(h.phaseDeg + h.order * shiftDeg) }));
}

export function wrapDeg(d: number): number {
	const w = ((((d + 180) % 360) + 360) % 360) - 180;
	return w === -180 ? 180 : w;
}
