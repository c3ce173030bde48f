/**
 * The report's next-steps section: each calculation fed from the report's own figures and the site
 * inputs. `lib/report/analyse.ts` calls `nextStepsSection` once, at the end of the analysis.
 */
import type { AnalysisReport } from '../report/types.js';
import { notApplicable } from './common.js';
import { meterReading } from './meter.js';
import { motorUnbalance } from './motor-unbalance.js';
import { neutralConductor } from './neutral-conductor.js';
import { powerFactorCorrection } from './pf-correction.js';
import { transformerLoading } from './transformer.js';
import { NEXT_STEP_CAUTION, SITE_INPUT_LABELS, type NextStep, type ReportNextSteps, type SiteInputs } from './types.js';
import { minOf } from '../signal/extremes.js';

/**
 * Checks the site inputs: every one a finite number above 0 (the target power factor at most 1), the
 * meter response 'true-rms' or 'average'.
 * @throws RangeError naming the input and what was expected
 */
export function checkSiteInputs(site: SiteInputs): void {
	for (const [key, value] of Object.entries(site) as [keyof SiteInputs, unknown][]) {
		if (value === undefined) continue;
		const what = SITE_INPUT_LABELS[key];
		if (!what) throw new RangeError(`unknown site input ${String(key)}`);
		if (key === 'meterResponse') {
			if (value !== 'true-rms' && value !== 'average')
				throw new RangeError(`${what.label} must be 'true-rms' or 'average', got ${String(value)}`);
			continue;
		}
		if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0)
			throw new RangeError(`${what.label} must be a number above 0, got ${String(value)}`);
	}
	if (site.targetPowerFactor !== undefined && site.targetPowerFactor > 1)
		throw new RangeError(`target displacement power factor must be at most 1, got ${site.targetPowerFactor}`);
}

/** Every next step for a report and the site inputs (missing inputs become `needs`). */
export function nextStepsSection(report: AnalysisReport, site: SiteInputs = {}): ReportNextSteps {
	checkSiteInputs(site);
	return {
		site: { ...site },
		steps: [
			pfStep(report, site),
			transformerStep(report, site),
			neutralStep(report),
			motorStep(report),
			meterStep(report, site),
		],
		caution: NEXT_STEP_CAUTION,
	};
}

const currentChannels = (r: AnalysisReport) =>
	r.channels.filter((c) => c.quantity === 'current' && c.harmonics.length > 1 && c.harmonics[1].rms > 0);

function pfStep(r: AnalysisReport, site: SiteInputs): NextStep {
	const title = 'Power-factor correction';
	const pairs = r.power.filter((p) => Number.isFinite(p.displacementPowerFactor));
	if (pairs.length === 0)
		return notApplicable(
			'power-factor-correction',
			title,
			'No voltage and current pair with a fundamental: the recording gives no power factor.',
			[],
		);
	// the report's character is null where the current is no sine; the correction arithmetic still needs the direction (relation)
	const phases = pairs.map((p) => ({
		label: `${p.voltage} × ${p.current}`,
		activeW: p.activeW,
		fundamentalActiveW: p.ieee1459.fundamentalActivePowerW ?? NaN,
		displacementPowerFactor: p.displacementPowerFactor,
		powerFactor: p.powerFactor,
		character: p.character ?? (p.relation === 'leads' ? 'capacitive' : p.relation === 'lags' ? 'inductive' : null),
	}));
	const currents = currentChannels(r).map((c) => ({
		channel: c.name,
		percentByOrder: c.harmonics.map((h) => h.percentOfFundamental),
	}));
	return powerFactorCorrection(phases, currents, site) as unknown as NextStep;
}

function transformerStep(r: AnalysisReport, site: SiteInputs): NextStep {
	const voltageOf = (current: string) => {
		const pair = r.power.find((p) => p.current === current);
		return pair ? r.channels.find((c) => c.name === pair.voltage)?.rms : undefined;
	};
	const currents = currentChannels(r).map((c) => ({
		channel: c.name,
		rmsByOrder: c.harmonics.map((h) => h.rms),
		top: c.thdMaxOrder,
		rmsA: c.rms,
		phaseVoltageV: voltageOf(c.name),
	}));
	if (currents.length === 0)
		return notApplicable(
			'transformer-loading',
			'Transformer loading under harmonic current',
			'No current channel with harmonics: the K-factor needs a current.',
			[],
		);
	const maxOrder = minOf(currents.map((c) => c.top));
	return transformerLoading(currents, maxOrder, site) as unknown as NextStep;
}

function neutralStep(r: AnalysisReport): NextStep {
	const set = r.threePhaseSets.find((t) => t.quantity === 'current');
	if (!set || !r.neutral)
		return notApplicable(
			'neutral-conductor',
			'Neutral conductor',
			'No three-phase set of currents: the neutral rule is for three-phase circuits (in a single-phase circuit the neutral carries the phase current).',
			[],
		);
	const phases = set.channels.map((name) => {
		const c = r.channels.find((x) => x.name === name)!;
		return { channel: name, rmsA: c.rms, thirdPercent: c.harmonics[3]?.percentOfFundamental ?? NaN };
	});
	if (phases.some((p) => !Number.isFinite(p.thirdPercent)))
		return notApplicable(
			'neutral-conductor',
			'Neutral conductor',
			'The phase currents have no harmonic figures: the third-harmonic content cannot be told.',
			[],
		);
	return neutralConductor(phases, {
		rmsA: r.neutral.neutralRmsA,
		measured: r.neutral.source === 'measured',
	}) as unknown as NextStep;
}

function motorStep(r: AnalysisReport): NextStep {
	const set = r.threePhaseSets.find((t) => t.quantity === 'voltage' && Number.isFinite(t.lvurPercent));
	if (!set)
		return notApplicable(
			'motor-unbalance',
			'Motors on an unbalanced supply',
			'No three-phase set of voltages: voltage unbalance needs three phase or line voltages.',
			[],
		);
	return motorUnbalance(set.channels, set.lvurPercent) as unknown as NextStep;
}

function meterStep(r: AnalysisReport, site: SiteInputs): NextStep {
	const channels = r.channels
		.filter(
			(c) =>
				(c.quantity === 'voltage' || c.quantity === 'current') &&
				c.harmonics.length > 1 &&
				Number.isFinite(c.acRms) &&
				c.acRms > 0,
		)
		.map((c) => ({
			channel: c.name,
			unit: c.unit,
			quantity: c.quantity as 'voltage' | 'current',
			acRms: c.acRms,
			crestFactor: c.crestFactor,
			fundamentalHz: Number.isFinite(c.frequencyHz) ? c.frequencyHz : r.frequencyHz,
			rmsByOrder: c.harmonics.map((h) => h.rms),
			phaseDegByOrder: c.harmonics.map((h) => h.phaseDeg),
			averageReading: c.averageResponding.reading,
			averageErrorPercent: c.averageResponding.errorPercent,
		}));
	if (channels.length === 0)
		return notApplicable(
			'meter-reading',
			'Will a meter read this right?',
			'No voltage or current channel with harmonics.',
			[],
		);
	return meterReading(channels, site) as unknown as NextStep;
}
