/**
 * The site values of the next steps from the command line (--target-pf, --transformer-kva, ...): each a
 * number above 0 (--meter-response: true-rms or average), or a UsageError naming the option. Nothing is assumed for a value not given.
 */
import type { SiteInputs } from '../../lib/next-steps/types.js';
import { UsageError } from './usage-error.js';

/** option name -> site input and what the user is asked for. */
export const SITE_OPTIONS: { option: string; key: Exclude<keyof SiteInputs, 'meterResponse'>; what: string }[] = [
	{
		option: 'target-pf',
		key: 'targetPowerFactor',
		what: 'the target displacement power factor, above 0 and at most 1 (e.g. 0.95)',
	},
	{ option: 'supply-ssc-kva', key: 'supplyShortCircuitKva', what: 'the short-circuit power at the board in kVA' },
	{ option: 'transformer-kva', key: 'transformerKva', what: 'the transformer rating in kVA' },
	{ option: 'transformer-z-pct', key: 'transformerImpedancePercent', what: 'the transformer impedance in % (e.g. 6)' },
	{
		option: 'transformer-pec-pu',
		key: 'transformerEddyLossPu',
		what: "the transformer's winding eddy-current loss per unit of its I²R loss (e.g. 0.1)",
	},
	{ option: 'meter-crest', key: 'meterCrestFactor', what: "the meter's rated crest factor at full scale (e.g. 3)" },
	{ option: 'meter-bandwidth-hz', key: 'meterBandwidthHz', what: "the meter's bandwidth in Hz" },
	{ option: 'meter-range-v', key: 'meterRangeV', what: 'the full scale of the voltage range used, V' },
	{ option: 'meter-range-a', key: 'meterRangeA', what: 'the full scale of the current range used, A' },
];

// cac camel-cases "a-b" pairs of letters left to right without overlap: --transformer-z-pct arrives as
// transformerZ-pct. Both spellings are looked up.
const camel = (option: string) => option.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
const cacCamel = (option: string) =>
	option.replace(/([a-z])-([a-z])/g, (_, a: string, b: string) => a + b.toUpperCase());

/** The site inputs given on the command line; undefined when none was. */
export function siteFromOptions(raw: Record<string, unknown>): SiteInputs | undefined {
	const site: SiteInputs = {};
	for (const { option, key, what } of SITE_OPTIONS) {
		const value = raw[camel(option)] ?? raw[cacCamel(option)];
		if (value === undefined || value === false) continue;
		const text = String(Array.isArray(value) ? value[value.length - 1] : value);
		if (text === 'true') throw new UsageError(`--${option} needs a value: ${what}`);
		const x = Number(text.replace(',', '.'));
		if (!Number.isFinite(x) || x <= 0 || (key === 'targetPowerFactor' && x > 1))
			throw new UsageError(`--${option} ${text}: expected ${what}`);
		site[key] = x;
	}
	const response = raw.meterResponse;
	if (response !== undefined && response !== false) {
		const text = String(Array.isArray(response) ? response[response.length - 1] : response);
		if (text !== 'true-rms' && text !== 'average')
			throw new UsageError(
				`--meter-response ${text === 'true' ? '' : `${text}: `}expected true-rms or average (average-responding, calibrated on a sine)`,
			);
		site.meterResponse = text;
	}
	return Object.keys(site).length > 0 ? site : undefined;
}
