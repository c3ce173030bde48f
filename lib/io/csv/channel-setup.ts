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

/** Millivolts per volt: a clamp's mV/A rating as a V-to-A factor is MV_PER_V / rating. */
const MV_PER_V = 1000;

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

/** A channel being set up: what is known so far, the scaling steps taken and what was said. */
interface Draft {
	name: string;
	unitText: string;
	unit: string;
	quantity: Quantity | null;
	factor: number;
	offset: number;
	steps: string[];
	say: (code: string, message: string, severity?: Diagnostic['severity']) => void;
}

/**
 * A data column as a channel: unit and quantity from the settings, the unit and the name (in that order),
 * then the measuring chain (probe, VT, CT, clamp, shunt); every step said.
 * @example setUpChannel(col, layout, {}) // header "I1 (mA)": factor 0.001, unit 'A', quantity 'current'
 */
export function setUpChannel(col: CsvColumnLayout, layout: CsvLayout, options: CsvOptions): ChannelSetup {
	const s = channelSettings(col, layout, options);
	const diagnostics: Diagnostic[] = [];
	const w: Draft = {
		name: s.name ?? col.name,
		unitText: s.unit ?? col.unitText,
		unit: '',
		quantity: s.quantity ?? null,
		factor: 1,
		offset: 0,
		steps: [],
		say: (code, message, severity = 'info') => diagnostics.push({ code, message, severity, column: col.index + 1 }),
	};
	const read = readUnit(w.unitText);
	userScale(w, s, read);
	w.unit = read && read.kind !== 'counts' ? read.unit : '';
	if (read && (read.kind === 'voltage' || read.kind === 'current')) electricalUnit(w, s, read);
	quantityByName(w, s);
	measuringChain(w, s);
	settleQuantity(w, s);
	userSettingsNote(w, col, options);
	const { name, unit, factor, offset } = w;
	const phase = channelPhase(name);
	const mm = minMaxOf(name);
	if (mm)
		w.say(
			'min-max-column',
			`Channel "${name}" holds the ${mm.which}imum of "${mm.base}" per time step (a peak-detect export), not single samples.`,
			'warning',
		);
	const quantity = w.quantity as Quantity;
	return { name, unit, quantity, phase, factor, offset, description: w.steps.join(', '), diagnostics };
}

type UnitRead = ReturnType<typeof readUnit>;

/** A scale or offset given: applied first; raw counts without one are said to stay counts. */
function userScale(w: Draft, s: CsvChannelOptions, read: UnitRead): void {
	if (s.scale !== undefined || s.offset !== undefined) {
		w.factor = s.scale ?? 1;
		w.offset = s.offset ?? 0;
		w.steps.push(`raw x ${w.factor}${w.offset ? ` + ${w.offset}` : ''}`);
	} else if (read?.kind === 'counts') {
		w.say(
			'raw-counts-unscaled',
			`Channel "${w.name}" holds raw counts and no scale was given; values are used as counts. Give the scale to convert them.`,
			'warning',
		);
	}
}

/** A voltage or current unit: its prefix converted (mV to V), and the quantity from it unless set. */
function electricalUnit(w: Draft, s: CsvChannelOptions, read: NonNullable<UnitRead>): void {
	if (read.factor !== 1) {
		w.factor *= read.factor;
		w.offset *= read.factor;
		w.steps.push(`${w.unitText} to ${read.unit}`);
		w.say('unit-normalised', `Channel "${w.name}" is in ${w.unitText}; converted to ${read.unit}.`);
	}
	if (w.quantity) return;
	w.quantity = read.kind as Quantity;
	if (s.clampMvPerA === undefined && s.shuntOhms === undefined)
		w.say('quantity-from-unit', `Channel "${w.name}" taken as a ${read.kind} from its unit ${w.unitText}.`);
}

/** The name's quantity: a disagreement with the unit is warned; without a quantity yet, the name gives it (and the unit when none). */
function quantityByName(w: Draft, s: CsvChannelOptions): void {
	const fromName = quantityFromName(w.name);
	const noChain = s.clampMvPerA === undefined && s.shuntOhms === undefined;
	if (w.quantity && fromName && fromName !== w.quantity && !s.quantity && noChain)
		w.say(
			'name-unit-disagree',
			`Channel "${w.name}" reads as a ${fromName} by its name but is in ${w.unitText}; taken as a ${w.quantity}. If it is a clamp or shunt output, give a clamp ratio (mV/A) or shunt resistance.`,
			'warning',
		);
	if (w.quantity || !fromName) return;
	w.quantity = fromName;
	if (w.unit !== '') {
		w.say('quantity-from-name', `Channel "${w.name}" taken as a ${fromName} from its name.`);
		return;
	}
	w.unit = fromName === 'voltage' ? 'V' : 'A';
	w.say(
		'unit-assumed',
		`Channel "${w.name}" states no unit; taken as ${w.unit} because its name reads as a ${fromName}. Give the unit for ${w.name} to change this.`,
		'assumption',
	);
}

/**
 * Probe, VT and CT ratios, clamp (mV/A) and shunt (ohm) multiply the values; a clamp or shunt makes a
 * current, a voltage probe or VT a voltage, a CT a current.
 */
function measuringChain(w: Draft, s: CsvChannelOptions): void {
	const ratio = (r: number | undefined, what: string) => {
		if (r === undefined || r === 1) return;
		w.factor *= r;
		w.offset *= r;
		w.steps.push(`${what} ${r}`);
	};
	ratio(s.probeRatio, 'probe ratio x');
	ratio(s.vtRatio, 'VT ratio');
	ratio(s.ctRatio, 'CT ratio');
	if (s.clampMvPerA !== undefined) {
		ratio(MV_PER_V / s.clampMvPerA, `clamp ${s.clampMvPerA} mV/A: x`);
		w.unit = 'A';
		w.quantity = 'current';
	}
	if (s.shuntOhms !== undefined) {
		ratio(1 / s.shuntOhms, `shunt ${s.shuntOhms} ohm: x`);
		w.unit = 'A';
		w.quantity = 'current';
	}
	if (s.clampMvPerA !== undefined || s.shuntOhms !== undefined) return;
	if ((s.probeRatio !== undefined || s.vtRatio !== undefined) && s.ctRatio === undefined && w.quantity !== 'current') {
		w.quantity = 'voltage';
		w.unit = 'V';
	} else if (s.ctRatio !== undefined && w.quantity !== 'voltage') {
		w.quantity = 'current';
		w.unit = 'A';
	}
}

/** A quantity set by the user wins; none found is 'other' (an assumption); V or A when the unit is still empty. */
function settleQuantity(w: Draft, s: CsvChannelOptions): void {
	if (s.quantity) w.quantity = s.quantity;
	if (!w.quantity) {
		w.quantity = 'other';
		w.say(
			'quantity-unknown',
			`Channel "${w.name}" could not be told voltage or current from its unit ("${w.unitText}") or name; kept as 'other'. Give its quantity (voltage or current) to say which.`,
			'assumption',
		);
	}
	if (w.quantity === 'voltage' && w.unit === '') w.unit = 'V';
	if (w.quantity === 'current' && w.unit === '') w.unit = 'A';
}

/** What the user set for this channel, said once with the result. */
function userSettingsNote(w: Draft, col: CsvColumnLayout, options: CsvOptions): void {
	const given = { ...options.channels?.[`col${col.index + 1}`], ...options.channels?.[col.name] };
	if (Object.keys(given).length === 0) return;
	const said = [...(given.name !== undefined ? [`named ${given.name}`] : []), ...settingsChain(given).steps].join(', ');
	w.say(
		'channel-from-user',
		`Channel "${w.name}": ${said} (set by the user); now in ${w.unit || 'no unit'}, measures ${w.quantity}.`,
	);
}
