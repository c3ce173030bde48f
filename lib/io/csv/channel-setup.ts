/**
 * From a column's name and unit (header, units row, preamble, options) to a channel: its name without
 * unit, SI unit, quantity, phase, and the scaling value = factor * raw + offset that turns the numbers
 * in the file into V or A. Every step taken is said in a Diagnostic.
 */
import type { ChannelPhase, Diagnostic, Quantity } from '../../capture.js';
import { channelPhase, quantityFromName, readUnit } from '../../channel-identity.js';
import { settingsChain } from '../import-settings.js';
import { minMaxOf } from './names.js';
import type { CsvChannelOptions, CsvColumnLayout, CsvLayout, CsvOptions } from './types.js';

export interface ChannelSetup {
	name: string;
	unit: string;
	quantity: Quantity;
	phase?: ChannelPhase;
	factor: number;
	offset: number;
	/** Empty when the numbers are used as written. */
	description: string;
	diagnostics: Diagnostic[];
}

/** Settings for one data column: options over preamble per channel over preamble for all. */
export function channelSettings(col: CsvColumnLayout, layout: CsvLayout, options: CsvOptions): CsvChannelOptions {
	const key = `col${col.index + 1}`;
	return {
		...layout.preambleAll,
		...(layout.preambleChannels[key] ?? {}),
		...(layout.preambleChannels[col.name] ?? layout.preambleChannels[col.header] ?? {}),
		...(options.channels?.[key] ?? {}),
		...(options.channels?.[col.name] ?? {}),
	};
}

export function setUpChannel(col: CsvColumnLayout, layout: CsvLayout, options: CsvOptions): ChannelSetup {
	const s = channelSettings(col, layout, options);
	const name = s.name ?? col.name;
	const diagnostics: Diagnostic[] = [];
	const say = (code: string, message: string, severity: Diagnostic['severity'] = 'info') =>
		diagnostics.push({ code, message, severity, column: col.index + 1 });
	const unitText = s.unit ?? col.unitText;
	const read = readUnit(unitText);
	const steps: string[] = [];
	let factor = 1;
	let offset = 0;
	if (s.scale !== undefined || s.offset !== undefined) {
		factor = s.scale ?? 1;
		offset = s.offset ?? 0;
		steps.push(`raw x ${factor}${offset ? ` + ${offset}` : ''}`);
	} else if (read?.kind === 'counts') {
		say(
			'raw-counts-unscaled',
			`Channel "${name}" holds raw counts and no scale was given; values are used as counts. Give the scale to convert them.`,
			'warning',
		);
	}
	let unit = read && read.kind !== 'counts' ? read.unit : '';
	let quantity: Quantity | null = s.quantity ?? null;
	if (read && (read.kind === 'voltage' || read.kind === 'current')) {
		if (read.factor !== 1) {
			factor *= read.factor;
			offset *= read.factor;
			steps.push(`${unitText} to ${read.unit}`);
			say('unit-normalised', `Channel "${name}" is in ${unitText}; converted to ${read.unit}.`);
		}
		if (!quantity) {
			quantity = read.kind;
			if (s.clampMvPerA === undefined && s.shuntOhms === undefined)
				say('quantity-from-unit', `Channel "${name}" taken as a ${read.kind} from its unit ${unitText}.`);
		}
	}
	const fromName = quantityFromName(name);
	if (
		quantity &&
		fromName &&
		fromName !== quantity &&
		!s.quantity &&
		s.clampMvPerA === undefined &&
		s.shuntOhms === undefined
	)
		say(
			'name-unit-disagree',
			`Channel "${name}" reads as a ${fromName} by its name but is in ${unitText}; taken as a ${quantity}. If it is a clamp or shunt output, give a clamp ratio (mV/A) or shunt resistance.`,
			'warning',
		);
	if (!quantity && fromName) {
		quantity = fromName;
		if (!unit || unit === '') {
			unit = fromName === 'voltage' ? 'V' : 'A';
			say(
				'unit-assumed',
				`Channel "${name}" states no unit; taken as ${unit} because its name reads as a ${fromName}. Give the unit for ${name} to change this.`,
				'assumption',
			);
		} else say('quantity-from-name', `Channel "${name}" taken as a ${fromName} from its name.`);
	}
	const ratio = (r: number | undefined, what: string) => {
		if (r === undefined || r === 1) return;
		factor *= r;
		offset *= r;
		steps.push(`${what} ${r}`);
	};
	ratio(s.probeRatio, 'probe ratio x');
	ratio(s.vtRatio, 'VT ratio');
	ratio(s.ctRatio, 'CT ratio');
	if (s.clampMvPerA !== undefined) {
		ratio(1000 / s.clampMvPerA, `clamp ${s.clampMvPerA} mV/A: x`);
		unit = 'A';
		quantity = 'current';
	}
	if (s.shuntOhms !== undefined) {
		ratio(1 / s.shuntOhms, `shunt ${s.shuntOhms} ohm: x`);
		unit = 'A';
		quantity = 'current';
	}
	// a voltage probe or VT ratio makes a voltage, a CT a current (a clamp or shunt did so above)
	if (s.clampMvPerA === undefined && s.shuntOhms === undefined) {
		if ((s.probeRatio !== undefined || s.vtRatio !== undefined) && s.ctRatio === undefined && quantity !== 'current') {
			quantity = 'voltage';
			unit = 'V';
		} else if (s.ctRatio !== undefined && quantity !== 'voltage') {
			quantity = 'current';
			unit = 'A';
		}
	}
	if (s.quantity) quantity = s.quantity;
	if (!quantity) {
		quantity = 'other';
		say(
			'quantity-unknown',
			`Channel "${name}" could not be told voltage or current from its unit ("${unitText}") or name; kept as 'other'. Give its quantity (voltage or current) to say which.`,
			'assumption',
		);
	}
	if (quantity === 'voltage' && unit === '') unit = 'V';
	if (quantity === 'current' && unit === '') unit = 'A';
	const given = { ...options.channels?.[`col${col.index + 1}`], ...options.channels?.[col.name] };
	if (Object.keys(given).length > 0) {
		const said = [...(given.name !== undefined ? [`named ${given.name}`] : []), ...settingsChain(given).steps].join(
			', ',
		);
		say(
			'channel-from-user',
			`Channel "${name}": ${said} (set by the user); now in ${unit || 'no unit'}, measures ${quantity}.`,
		);
	}
	const phase = channelPhase(name);
	const mm = minMaxOf(name);
	if (mm)
		say(
			'min-max-column',
			`Channel "${name}" holds the ${mm.which}imum of "${mm.base}" per time step (a peak-detect export), not single samples.`,
			'warning',
		);
	return { name, unit, quantity, phase, factor, offset, description: steps.join(', '), diagnostics };
}
