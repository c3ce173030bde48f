/**
 * Is a capture's voltage set line-to-line or line-to-neutral, and is the star/delta picture consistent?
 * Hints only: every verdict comes with its evidence as a Diagnostic.
 */
import type { Diagnostic } from '../capture.js';
import { parsePhaseLabel } from '../channel-identity.js';
import { phasorAbs, phasorArgDeg, phasorSub, wrapAngleDeg, type ComplexPhasor } from '../phasor/phasor.js';
import { symmetricalComponents } from '../phasor/sequence.js';
import { sqrt3Check } from './line-voltages.js';
import { maxOf, minOf } from '../signal/extremes.js';

/**
 * Nominal low-voltage systems, line-to-neutral / line-to-line RMS volts, used to read a level.
 * Ref: IEC 60038:2009, Table 1 (230/400, 120/208, 277/480, 347/600) (from memory); 127/220, 220/380,
 * 240/415 are older or regional systems (common practice). 400/690 V is left out on purpose: its 400 V
 * phase voltage would make every 400 V reading ambiguous; pass `systems` to include it.
 */
export const NOMINAL_LV_SYSTEMS_V: readonly (readonly [number, number])[] = [
	[120, 208],
	[127, 220],
	[220, 380],
	[230, 400],
	[240, 415],
	[277, 480],
	[347, 600],
];

/** A voltage channel to classify. */
export interface VoltageChannelLevel {
	name: string;
	/** True RMS over the analysed window, V. */
	rmsV: number;
	/** Fundamental phasor on the shared window, V (optional; enables the angle and sum tests). */
	phasor?: ComplexPhasor;
}

/** How each channel reads, and the capture's verdict. */
export interface LineToLineDetection {
	verdict: 'line-to-line' | 'line-to-neutral' | 'mixed' | 'unknown';
	channels: {
		name: string;
		reading: 'line-to-line' | 'line-to-neutral' | 'unknown';
		byName?: 'line-to-line' | 'line-to-neutral';
		byLevel?: 'line-to-line' | 'line-to-neutral';
	}[];
	diagnostics: Diagnostic[];
}

/** Band around a nominal voltage within which a level is taken to be that nominal: ±10 % (common practice: supply tolerance). */
export const NOMINAL_MATCH_PERCENT = 10;
/** A level is ambiguous when the nearest phase and line nominals are within 2 percentage points of equally close (our choice). */
const AMBIGUITY_PERCENT = 2;

/** Reading of one RMS level against the nominal systems: the nearer of the nearest LN and LL nominals. */
function readLevel(
	rmsV: number,
	systems: readonly (readonly [number, number])[],
): { reading?: 'line-to-line' | 'line-to-neutral'; system?: readonly [number, number] } {
	const dist = (nom: number) => Math.abs(rmsV / nom - 1) * 100;
	let ln = { d: Infinity, sys: systems[0] };
	let ll = { d: Infinity, sys: systems[0] };
	for (const sys of systems) {
		if (dist(sys[0]) < ln.d) ln = { d: dist(sys[0]), sys };
		if (dist(sys[1]) < ll.d) ll = { d: dist(sys[1]), sys };
	}
	if (Math.min(ln.d, ll.d) > NOMINAL_MATCH_PERCENT || Math.abs(ln.d - ll.d) < AMBIGUITY_PERCENT) return {};
	return ln.d < ll.d ? { reading: 'line-to-neutral', system: ln.sys } : { reading: 'line-to-line', system: ll.sys };
}

/**
 * Says whether a capture holds line-to-line voltages, from names (U12, L1-L2, Vab...) and levels
 * (a level is read as the nearer of the nearest phase and line nominal, within ±10 %, unless both are
 * about equally near, as 220 V is: phase of 220/380, line of 127/220). Name and level disagreeing
 * is reported as a warning. With three phasors, a set summing to zero within 0.1 % is noted: line
 * voltages always do, line-to-neutral ones only when perfectly balanced.
 * Ref: common practice; nominal levels from NOMINAL_LV_SYSTEMS_V.
 * @example detectLineToLineVoltages([{ name: 'U12', rmsV: 401 }, ...]).verdict // 'line-to-line'
 */
export function detectLineToLineVoltages(
	voltages: readonly VoltageChannelLevel[],
	systems: readonly (readonly [number, number])[] = NOMINAL_LV_SYSTEMS_V,
): LineToLineDetection {
	const diagnostics: Diagnostic[] = [];
	const channels: LineToLineDetection['channels'] = voltages.map((v) => {
		const lab = parsePhaseLabel(v.name);
		const byName =
			lab?.kind === 'line-to-line' ? 'line-to-line' : lab?.kind === 'phase' ? 'line-to-neutral' : undefined;
		const level = readLevel(v.rmsV, systems);
		const byLevel = level.reading;
		if (byName && byLevel && byName !== byLevel) {
			const sys = level.system!;
			diagnostics.push({
				code: 'voltage-name-level-mismatch',
				severity: 'warning',
				message: `${v.name} is named as a ${byName} voltage but its ${v.rmsV.toFixed(1)} V RMS fits the ${byLevel} voltage of a ${sys[0]}/${sys[1]} V system: check how it was connected (or its probe ratio).`,
			});
		}
		const reading = byName ?? byLevel ?? 'unknown';
		return { name: v.name, reading, ...(byName ? { byName } : {}), ...(byLevel ? { byLevel } : {}) };
	});
	const kinds = new Set(channels.map((c) => c.reading).filter((r) => r !== 'unknown'));
	const verdict: LineToLineDetection['verdict'] =
		kinds.size === 0
			? 'unknown'
			: kinds.size === 2
				? 'mixed'
				: [...kinds][0] === 'line-to-line'
					? 'line-to-line'
					: 'line-to-neutral';
	if (verdict === 'line-to-line') {
		diagnostics.push({
			code: 'voltages-line-to-line',
			severity: 'info',
			message: `the capture holds line-to-line voltages (${channels.map((c) => c.name).join(', ')}): phase powers need line-to-neutral voltages; unbalance is given from line voltages (VUF, LVUR).`,
		});
	} else if (verdict === 'mixed') {
		diagnostics.push({
			code: 'voltages-mixed',
			severity: 'info',
			message: `the capture holds both line-to-line (${channels
				.filter((c) => c.reading === 'line-to-line')
				.map((c) => c.name)
				.join(', ')}) and line-to-neutral voltages.`,
		});
	}
	const ph = voltages.map((v) => v.phasor).filter((p): p is ComplexPhasor => p !== undefined);
	if (ph.length === 3) {
		const s = symmetricalComponents(ph[0], ph[1], ph[2]);
		const ratio = s.positiveRms + s.negativeRms > 0 ? (100 * s.zeroRms) / Math.max(s.positiveRms, s.negativeRms) : NaN;
		if (ratio < 0.1 && verdict !== 'line-to-line') {
			diagnostics.push({
				code: 'voltages-sum-to-zero',
				severity: 'info',
				message: `the three voltages sum to zero within ${ratio.toFixed(3)} %: line-to-line voltages always do; line-to-neutral voltages only on a perfectly balanced supply.`,
			});
		}
	}
	return { verdict, channels, diagnostics };
}

/** What starDeltaHints looks at; give what the capture has. Phasors are fundamentals on one window. */
export interface StarDeltaEvidence {
	/** Line-to-neutral voltages of phases 1, 2, 3. */
	phaseVoltages?: [ComplexPhasor, ComplexPhasor, ComplexPhasor];
	/** Measured line-to-line voltages V12, V23, V31. */
	lineVoltages?: [ComplexPhasor, ComplexPhasor, ComplexPhasor];
	/** Line currents of phases 1, 2, 3. */
	lineCurrents?: [ComplexPhasor, ComplexPhasor, ComplexPhasor];
	/** Wiring the user declared, if any: a 3-wire circuit whose line currents do not sum to zero is a warning. */
	wiring?: '3-wire' | '4-wire';
}

/** Agreement required between a measured line voltage and the difference of two phase voltages: ±2 % (our choice). */
export const LINE_VOLTAGE_AGREEMENT_PERCENT = 2;

/**
 * Star/delta consistency hints from line vs phase relations: the √3 check, measured against derived
 * line voltages, whether the line currents sum to zero (3-wire or delta) or leave a neutral current (star
 * with neutral), and voltage/current angles all near ±30° (line-to-line voltages taken as phase voltages).
 * Ref: balanced star/delta relations (docs/methods.md §7; common practice); the thresholds are our choice, stated in each message.
 * @returns diagnostics, 'info' for what fits and 'warning' for what does not
 */
export function starDeltaHints(e: StarDeltaEvidence): Diagnostic[] {
	const out: Diagnostic[] = [];
	if (e.phaseVoltages) {
		const derived: [ComplexPhasor, ComplexPhasor, ComplexPhasor] = [
			phasorSub(e.phaseVoltages[0], e.phaseVoltages[1]),
			phasorSub(e.phaseVoltages[1], e.phaseVoltages[2]),
			phasorSub(e.phaseVoltages[2], e.phaseVoltages[0]),
		];
		const c = sqrt3Check(e.phaseVoltages, derived);
		out.push({ code: 'star-sqrt3-check', severity: c.consistent ? 'info' : 'warning', message: c.sentence });
		if (e.lineVoltages) {
			const dev = [0, 1, 2].map(
				(k) => (100 * phasorAbs(phasorSub(e.lineVoltages![k], derived[k]))) / phasorAbs(derived[k]),
			);
			const worst = maxOf(dev);
			out.push({
				code: 'line-voltage-agreement',
				severity: worst <= LINE_VOLTAGE_AGREEMENT_PERCENT ? 'info' : 'warning',
				message:
					worst <= LINE_VOLTAGE_AGREEMENT_PERCENT
						? `measured line voltages match the differences of the phase voltages within ${worst.toFixed(2)} %.`
						: `measured line voltages differ from the differences of the phase voltages by up to ${worst.toFixed(1)} % (limit ${LINE_VOLTAGE_AGREEMENT_PERCENT} %): a swapped or mislabelled channel, a probe ratio, or line channels not taken from these phases.`,
			});
		}
	}
	if (e.lineCurrents) {
		const s = symmetricalComponents(e.lineCurrents[0], e.lineCurrents[1], e.lineCurrents[2]);
		const major = Math.max(s.positiveRms, s.negativeRms);
		const inPercent = major > 0 ? (100 * 3 * s.zeroRms) / major : NaN;
		if (inPercent < 1) {
			out.push({
				code: 'currents-sum-to-zero',
				severity: 'info',
				message: `the line currents sum to ${inPercent.toFixed(2)} % of the dominant sequence current: a 3-wire connection (delta, or star without neutral), or a balanced star.`,
			});
		} else if (inPercent >= 1) {
			out.push({
				code: 'currents-leave-neutral-current',
				severity: e.wiring === '3-wire' ? 'warning' : 'info',
				message: `the line currents do not sum to zero (fundamental residual ${inPercent.toFixed(1)} % of the dominant sequence current): current returns through a neutral (star with neutral) or to earth${e.wiring === '3-wire' ? '; a 3-wire circuit cannot do this: check the current clamps and their ratios' : ''}.`,
			});
		}
		if (e.phaseVoltages) {
			const th = [0, 1, 2].map((k) =>
				wrapAngleDeg(phasorArgDeg(e.phaseVoltages![k]) - phasorArgDeg(e.lineCurrents![k])),
			);
			const mean = (th[0] + th[1] + th[2]) / 3;
			if (maxOf(th) - minOf(th) < 5 && Math.abs(Math.abs(mean) - 30) < 3) {
				out.push({
					code: 'angles-near-30',
					severity: 'info',
					message: `voltage/current angles are all ${mean.toFixed(1)} deg: a load with PF 0.87, or voltages measured line-to-line (which shifts every angle by 30 deg) on a resistive load.`,
				});
			}
		}
	}
	return out;
}
