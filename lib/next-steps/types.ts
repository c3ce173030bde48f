/**
 * Next steps: the engineering calculations a technician does by hand from the report's figures and a
 * few site values (capacitor bank, transformer, neutral conductor, motors, meters). Every step carries
 * the finding it follows from, its method with the source, its inputs, what it still needs, its result
 * with the assumptions, and the caution that the decision belongs to a competent person.
 *
 * Units: SI except where the trade states site values otherwise (kVA, kvar, percent impedance), always
 * named in the field. In memory a figure the data cannot give is NaN; in JSON it is null.
 */

/** Site values the user gives; every field optional. A step that needs a missing one says so. */
export interface SiteInputs {
	/** Displacement power factor wanted after correction, 0 < x <= 1 (e.g. 0.95). */
	targetPowerFactor?: number;
	/** Three-phase short-circuit power at the point where the capacitor bank connects, kVA. */
	supplyShortCircuitKva?: number;
	/** Rating of the transformer feeding the board, kVA. */
	transformerKva?: number;
	/** Its short-circuit impedance, percent (e.g. 6 for 6 %). */
	transformerImpedancePercent?: number;
	/** Its winding eddy-current loss at rated current, per unit of its I²R loss (P_EC-R(pu) of IEEE C57.110). */
	transformerEddyLossPu?: number;
	/** The meter's rated crest factor at full scale of a range (e.g. 3). */
	meterCrestFactor?: number;
	/** The meter's bandwidth (upper -3 dB or stated AC bandwidth), Hz. */
	meterBandwidthHz?: number;
	/** Full scale of the voltage range the meter is used on, V. */
	meterRangeV?: number;
	/** Full scale of the current range the meter is used on, A. */
	meterRangeA?: number;
	/** How the meter responds: 'true-rms', or 'average' (average-responding, calibrated on a sine). */
	meterResponse?: 'true-rms' | 'average';
}

/** The site inputs in the order and words a user is asked for them (for CLI help and UI labels). */
export const SITE_INPUT_LABELS: Record<keyof SiteInputs, { label: string; unit: string }> = {
	targetPowerFactor: { label: 'target displacement power factor', unit: '' },
	supplyShortCircuitKva: { label: 'short-circuit power of the supply at the board', unit: 'kVA' },
	transformerKva: { label: 'transformer rating', unit: 'kVA' },
	transformerImpedancePercent: { label: 'transformer impedance', unit: '%' },
	transformerEddyLossPu: { label: 'transformer winding eddy-current loss, per unit of its I²R loss', unit: 'pu' },
	meterCrestFactor: { label: "meter's rated crest factor at full scale", unit: '' },
	meterBandwidthHz: { label: "meter's bandwidth", unit: 'Hz' },
	meterRangeV: { label: 'voltage range used on the meter', unit: 'V' },
	meterRangeA: { label: 'current range used on the meter', unit: 'A' },
	meterResponse: { label: 'how the meter responds (true RMS or average-responding)', unit: '' },
};

export type NextStepId =
	'power-factor-correction' | 'transformer-loading' | 'neutral-conductor' | 'motor-unbalance' | 'meter-reading';

/**
 * 'result': every input given and a result follows; 'partial': part of the result, the rest `needs`
 * inputs; 'needs-input': nothing can be computed until `needs` is given; 'not-applicable': the
 * recording does not hold what the step starts from (the finding says why).
 */
export type NextStepStatus = 'result' | 'partial' | 'needs-input' | 'not-applicable';

/** One input of a step: a figure of the recording or a site value (null when not given). */
export interface NextStepInput {
	name: string;
	value: number | string | null;
	unit: string;
	from: 'recording' | 'site';
}

/** One calculation from a finding to a next step. */
export interface NextStep<R = Record<string, unknown>> {
	step: NextStepId;
	title: string;
	status: NextStepStatus;
	/** The finding of the recording this step follows from, in words with its numbers. */
	finding: string;
	/** The calculation, formula by formula, each with its source. */
	method: string[];
	inputs: NextStepInput[];
	/** Site values still needed, in plain words ("transformer kVA and impedance"). */
	needs: string[];
	/** The figures; null when nothing could be computed. Fields the inputs cannot give are NaN. */
	result: R | null;
	/** What the result means, in plain sentences with the numbers. */
	conclusions: string[];
	assumptions: string[];
	/** Points to look at before deciding (a resonance near a recorded order, unbalance above 1 %...). */
	warnings: string[];
	caution: string;
}

/** The report's next-steps section. */
export interface ReportNextSteps {
	/** The site values the steps used, as given. */
	site: SiteInputs;
	steps: NextStep[];
	caution: string;
}

/** Said with every result: the calculations inform a decision, they do not make it. */
export const NEXT_STEP_CAUTION =
	'These are planning calculations from one recording. The decision and the design belong to a competent person ' +
	'working to the local wiring rules and codes and under licensed practice; check the site values and the equipment data before acting.';
