/**
 * COMTRADE (.cfg + .dat) -> Capture: analog scaling a*x+b, primary or secondary values (PS flag and
 * ratio), units normalised to V and A, time base from the sampling rate(s) or the time stamps, start
 * relative to the trigger, digital channels kept as they were recorded.
 * Ref: IEEE C37.111-1999/2013 = IEC 60255-24:2013 (from memory; layout as in docs/methods.md §8).
 */
import { scaleRange, type Capture, type Channel, type Diagnostic, type DigitalChannel } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { type CfgAnalog, type ComtradeConfig, parseComtradeCfg } from './cfg.js';
import { type DatContent, readComtradeDat } from './dat.js';
import { checkDatType } from './dat-type.js';
import { stampDifferenceS } from './stamp.js';
import { channelPhase, normaliseUnitText, quantityFromName } from '../../channel-identity.js';

export interface ComtradeOptions {
	/** Report primary (default, what flows in the network) or secondary (what the recorder saw) values. */
	values?: 'primary' | 'secondary';
	/** Name of the data file for error messages (default: the .cfg name with .dat). */
	datSource?: string;
}

/** Where the .dat data sits inside a larger file (CFF), for error positions. */
export interface ComtradeDatOffsets {
	line?: number;
	byte?: number;
}

/**
 * Read a COMTRADE record from its configuration text and its data bytes.
 *
 * value = a·x + b in the unit the .cfg gives, then ×primary/secondary (PS = S, primary wanted) or
 * ×secondary/primary (PS = P, secondary wanted), then ×prefix (kV -> V ×1000). Time of sample n (1-based,
 * one rate): t = t0 + (n − 1)/samp, with t0 = (first-data time − trigger time) + first time stamp × timemult.
 *
 * @param cfgText  the .cfg text (CRLF or LF)
 * @param dat  the .dat bytes (ASCII text or binary records)
 * @param source  the .cfg file name, used in errors and as the capture's source
 * @throws ImportError cfg-syntax, cfg-count-mismatch, dat-too-short, dat-syntax, time-not-increasing, no-data
 * @example parseComtrade(cfgText, datBytes, 'feeder.cfg').channels.map((c) => c.name) // ['Ia', ..., 'Vc']
 */
export function parseComtrade(
	cfgText: string,
	dat: Uint8Array,
	source: string,
	options: ComtradeOptions = {},
): Capture {
	const datSource = options.datSource ?? source.replace(/\.cfg$/i, (m) => (m === '.CFG' ? '.DAT' : '.dat'));
	const cfg = parseComtradeCfg(cfgText, source);
	return buildCapture(cfg, dat, source, datSource, options, {});
}

/** The data read and checked against the .cfg: its record count, extra records and trailing bytes said. */
function readData(
	cfg: ComtradeConfig,
	datBytes: Uint8Array,
	source: string,
	datSource: string,
	offsets: ComtradeDatOffsets,
	diagnostics: Diagnostic[],
): DatContent {
	const lastRate = cfg.rates[cfg.rates.length - 1];
	const expected = lastRate ? lastRate.endSample : cfg.endSampleNoRate || undefined;
	checkDatType(cfg, datBytes, datSource, source, offsets.byte ?? 0);
	const dat = readComtradeDat(cfg, datBytes, datSource, expected, offsets);
	const n = dat.records;
	if (n === 0) throw new ImportError(datSource, 1 + (offsets.line ?? 0), 0, 'no-data', '', 'at least one data record');
	if (dat.extraRecords > 0)
		diagnostics.push({
			code: 'comtrade-extra-records',
			severity: 'warning',
			message: `The data holds ${dat.extraRecords} record(s) past the ${n} the .cfg declares; they are ignored.`,
		});
	if (dat.trailingBytes > 0)
		diagnostics.push({
			code: 'comtrade-trailing-bytes',
			severity: 'warning',
			message: `The data ends with ${dat.trailingBytes} byte(s) that do not make a whole record; they are ignored.`,
		});
	return dat;
}

/** Time stamp units: microseconds, or nanoseconds when a 2013 .cfg writes its stamps to more than 6 digits. */
const STAMP_UNIT_US_S = 1e-6;
const STAMP_UNIT_NS_S = 1e-9;
const MICROSECOND_DIGITS = 6;

/** Start of the record relative to the trigger, and one time stamp step in seconds. */
function recordStart(
	cfg: ComtradeConfig,
	dat: DatContent,
	diagnostics: Diagnostic[],
): { startS: number; stampS: number } {
	const stampUnitS =
		cfg.revYear >= 2013 && (cfg.firstData?.fracDigits ?? 0) > MICROSECOND_DIGITS ? STAMP_UNIT_NS_S : STAMP_UNIT_US_S;
	const stampS = cfg.timeMult * stampUnitS;
	let recordZeroS = 0;
	if (cfg.firstData && cfg.trigger) recordZeroS = stampDifferenceS(cfg.firstData, cfg.trigger);
	else
		diagnostics.push({
			code: 'comtrade-no-trigger',
			severity: 'assumption',
			message: 'Without both the first-data and the trigger time stamps, times are counted from the first-data time.',
		});
	const firstStamp = Number.isFinite(dat.stamps[0]) ? dat.stamps[0] : 0;
	const startS = recordZeroS + firstStamp * stampS;
	if (firstStamp !== 0)
		diagnostics.push({
			code: 'comtrade-first-stamp',
			severity: 'info',
			message: `The first record's time stamp is ${firstStamp} × ${cfg.timeMult} × ${stampUnitS === STAMP_UNIT_US_S ? 'µs' : 'ns'}; the record starts ${fmt(startS)} s from the trigger.`,
		});
	return { startS, stampS };
}

/** Rate and stamps may disagree by 1 % of the span plus two stamp steps before it is said (our choice). */
const STAMP_SPAN_TOLERANCE = 0.01;

/** Broken sample numbers, and record time stamps that tell another span than the rate. */
function timeNotes(
	cfg: ComtradeConfig,
	dat: DatContent,
	time: { sampleRateHz: number; timeS?: Float64Array; stampS: number },
	where: { datSource: string; lineOffset: number },
	diagnostics: Diagnostic[],
): void {
	const { sampleRateHz, timeS, stampS } = time;
	const n = dat.records;
	if (dat.sampleNumberBreaks > 0) {
		const at =
			cfg.fileType === 'ASCII'
				? `record ${dat.firstBreakRecord} (line ${dat.firstBreakRecord + where.lineOffset} of ${where.datSource})`
				: `record ${dat.firstBreakRecord} of ${where.datSource}`;
		diagnostics.push({
			code: 'comtrade-sample-number-break',
			severity: 'warning',
			message: `Sample numbers do not run on by one from ${at}, ${dat.sampleNumberBreaks} place(s) in all: records may be missing; times follow the ${timeS && !cfg.rates.length ? 'time stamps' : 'sample rate'}.`,
		});
	}
	// With a rate as the time base, the record time stamps should tell the same span; say so when they do not.
	const lastStamp = dat.stamps[n - 1];
	if (cfg.rates.length > 0 && !timeS && n > 1 && Number.isFinite(lastStamp) && Number.isFinite(dat.stamps[0])) {
		const byStampsS = (lastStamp - dat.stamps[0]) * stampS;
		const byRateS = (n - 1) / sampleRateHz;
		if (Math.abs(byStampsS - byRateS) > STAMP_SPAN_TOLERANCE * byRateS + 2 * stampS) {
			diagnostics.push({
				code: 'comtrade-stamps-disagree',
				severity: 'warning',
				message: `The record time stamps span ${fmt(byStampsS)} s but ${n} samples at ${sampleRateHz} Hz span ${fmt(byRateS)} s; times follow the sample rate.`,
			});
		}
	}
}

/** The analog channels scaled, named uniquely, with their missing values and skews said. */
function analogChannels(
	cfg: ComtradeConfig,
	dat: DatContent,
	want: 'primary' | 'secondary',
	diagnostics: Diagnostic[],
): Channel[] {
	const channels = cfg.analog.map((a, c) => scaleChannel(a, dat.raw[c], want, diagnostics));
	uniqueNames(channels, diagnostics);
	if (cfg.analog.length > 0) diagnostics.push(valuesNote(cfg, want), rangeNote(channels));
	cfg.analog.forEach((a, c) => {
		if (dat.missing[c] > 0)
			diagnostics.push({
				code: 'comtrade-missing-values',
				severity: 'warning',
				line: a.line,
				message: `Channel ${channels[c].name}: ${dat.missing[c]} of ${dat.records} values are marked missing in the data; they are NaN.`,
			});
	});
	const skewed = cfg.analog.filter((a) => a.skewUs !== 0);
	if (skewed.length > 0)
		diagnostics.push({
			code: 'comtrade-skew-ignored',
			severity: 'info',
			message: `Channel skews (${skewed.map((a) => `${a.name} ${a.skewUs} µs`).join(', ')}) are reported, not corrected.`,
		});
	return channels;
}

/** Assemble the capture from a parsed .cfg and the data bytes (shared with the CFF reader). */
export function buildCapture(
	cfg: ComtradeConfig,
	datBytes: Uint8Array,
	source: string,
	datSource: string,
	options: ComtradeOptions,
	offsets: ComtradeDatOffsets,
): Capture {
	const diagnostics: Diagnostic[] = [...cfg.diagnostics];
	const want = options.values ?? 'primary';
	if (want !== 'primary' && want !== 'secondary')
		throw new ImportError(source, 0, 0, 'bad-option', String(want), "values: 'primary' or 'secondary'");
	diagnostics.push({
		code: 'comtrade-format',
		severity: 'info',
		message: `COMTRADE ${cfg.revYear} ${cfg.fileType}, station "${cfg.station}", device "${cfg.device}": ${cfg.analog.length} analog and ${cfg.digital.length} digital channels.`,
	});
	if (cfg.lineEnd === 'LF')
		diagnostics.push({
			code: 'comtrade-lf-line-ends',
			severity: 'info',
			message: 'The .cfg uses LF line ends where the standard asks for CRLF; read as usual.',
		});
	const dat = readData(cfg, datBytes, source, datSource, offsets, diagnostics);
	const { startS, stampS } = recordStart(cfg, dat, diagnostics);
	const { sampleRateHz, timeS } = timeBase(cfg, dat.stamps, dat.records, startS, stampS, datSource, diagnostics);
	timeNotes(cfg, dat, { sampleRateHz, timeS, stampS }, { datSource, lineOffset: offsets.line ?? 0 }, diagnostics);
	const channels = analogChannels(cfg, dat, want, diagnostics);
	const digital: DigitalChannel[] = cfg.digital.map((d, c) => ({
		name: d.name || `D${d.index}`,
		normalState: d.normalState,
		states: dat.digital[c],
	}));
	const metadata: Record<string, string> = { ...cfg.metadata };
	for (const a of cfg.analog) if (a.circuit) metadata[`comtrade.ccbm.${a.name}`] = a.circuit;
	if (cfg.firstData)
		diagnostics.push({
			code: 'comtrade-local-time',
			severity: 'info',
			message: `Start time ${cfg.firstData.iso} is the recorder's local time as written in the .cfg${metadata['comtrade.time_code'] ? ` (time_code ${metadata['comtrade.time_code']})` : ''}.`,
		});
	return {
		source,
		sampleRateHz,
		startS,
		startTime: cfg.firstData?.iso,
		...(timeS ? { timeS } : {}),
		nominalFrequencyHz: cfg.lineFrequencyHz > 0 ? cfg.lineFrequencyHz : undefined,
		channels,
		...(digital.length > 0 ? { digital } : {}),
		metadata,
		diagnostics,
	};
}

/** Which channels have a range from the .cfg's min and max (clipping is judged at its limits) and which not. */
function rangeNote(channels: Channel[]): Diagnostic {
	const without = channels.filter((c) => !c.range).map((c) => c.name);
	return {
		code: 'comtrade-range',
		severity: 'info',
		message:
			without.length === channels.length
				? "No channel has a usable range in the .cfg's min and max fields: clipping is judged from the wave's shape."
				: `Channel ranges from the .cfg's min and max fields: flat runs at their limits are taken as clipping${without.length > 0 ? ` (no usable range for ${without.join(', ')})` : ''}.`,
	};
}

/** Which values (primary, secondary, as recorded) the analog channels report. */
export function valuesNote(cfg: ComtradeConfig, want: 'primary' | 'secondary'): Diagnostic {
	const unflagged = cfg.analog.filter((a) => a.ps === undefined).length;
	if (cfg.analog.length > unflagged) {
		return {
			code: 'comtrade-values',
			severity: 'info',
			message: `Analog values are reported as ${want} values${want === 'primary' ? ' (network side; ask for secondary values to see what the recorder measured)' : ' (instrument side, as asked)'}${unflagged > 0 ? `, except ${unflagged} channel(s) without a P/S flag, kept as recorded` : ''}; each channel's scaling says how.`,
		};
	}
	return {
		code: 'comtrade-values',
		severity: 'assumption',
		message:
			'The .cfg gives no P/S flags: analog values are reported as recorded (a·x + b), not known to be primary or secondary.',
	};
}

/** A scale factor as a person reads it: 6 significant digits, no float tail ("0.0122070" not 0.012207031250000001). */
function short(x: number): string {
	return String(Number(x.toPrecision(6)));
}

function fmt(x: number): string {
	return Number(x.toPrecision(9)).toString();
}

/** Uniform rate when one rate (or equal rates) is declared; otherwise explicit times from rates or stamps. */
function timeBase(
	cfg: ComtradeConfig,
	stamps: Float64Array,
	n: number,
	startS: number,
	stampS: number,
	datSource: string,
	diagnostics: Diagnostic[],
): { sampleRateHz: number; timeS?: Float64Array } {
	const rates = cfg.rates.filter((r) => r.sampleRateHz > 0);
	if (rates.length > 0 && rates.length === cfg.rates.length) {
		const distinct = new Set(rates.map((r) => r.sampleRateHz));
		if (distinct.size === 1) {
			diagnostics.push({
				code: 'comtrade-rate',
				severity: 'info',
				line: rates[0].line,
				message: `Sample rate ${rates[0].sampleRateHz} Hz from the .cfg; record time stamps are not used for timing.`,
			});
			return { sampleRateHz: rates[0].sampleRateHz };
		}
		// Several rates: keep every sample on its own time (no resampling) and report the mean rate.
		const timeS = new Float64Array(n);
		let t = startS;
		let seg = 0;
		for (let k = 0; k < n; k++) {
			while (seg < rates.length - 1 && k + 1 > rates[seg].endSample) seg++;
			if (k > 0) t += 1 / rates[seg].sampleRateHz;
			timeS[k] = t;
		}
		const meanHz = n > 1 ? (n - 1) / (timeS[n - 1] - timeS[0]) : rates[0].sampleRateHz;
		diagnostics.push({
			code: 'comtrade-several-rates',
			severity: 'warning',
			line: rates[0].line,
			message: `The record uses ${rates.length} sampling rates (${rates.map((r) => `${r.sampleRateHz} Hz to sample ${r.endSample}`).join(', ')}); samples keep their own times, not resampled; mean rate ${fmt(meanHz)} Hz.`,
		});
		return { sampleRateHz: meanHz, timeS };
	}
	// nrates = 0 (or samp = 0): the time stamps are the time base.
	const timeS = new Float64Array(n);
	const first = stamps[0];
	for (let k = 0; k < n; k++) {
		if (!Number.isFinite(stamps[k]))
			throw new ImportError(
				datSource,
				cfg.fileType === 'ASCII' ? k + 1 : 0,
				cfg.fileType === 'ASCII' ? 0 : 1,
				'dat-syntax',
				'',
				`a time stamp on record ${k + 1}: the .cfg gives no sample rate, so time stamps are the time base`,
			);
		timeS[k] = startS + (stamps[k] - first) * stampS;
		if (k > 0 && timeS[k] <= timeS[k - 1]) {
			throw new ImportError(
				datSource,
				cfg.fileType === 'ASCII' ? k + 1 : 0,
				cfg.fileType === 'ASCII' ? 0 : 1,
				'time-not-increasing',
				String(stamps[k]),
				`a time stamp above the previous one (${stamps[k - 1]}) on record ${k + 1}`,
			);
		}
	}
	const meanHz = n > 1 ? (n - 1) / (timeS[n - 1] - timeS[0]) : NaN;
	diagnostics.push({
		code: 'comtrade-time-stamps',
		severity: 'info',
		message: `No sample rate in the .cfg: the record time stamps (× ${cfg.timeMult}) are the time base; mean rate ${fmt(meanHz)} Hz.`,
	});
	return { sampleRateHz: meanHz, timeS };
}

export function scaleChannel(
	a: CfgAnalog,
	raw: Float64Array,
	want: 'primary' | 'secondary',
	diagnostics: Diagnostic[],
): Channel {
	const u = normaliseUnitText(a.unit);
	let ratio = 1;
	let which: string;
	const ratioKnown = Number.isFinite(a.primary) && Number.isFinite(a.secondary) && a.primary > 0 && a.secondary > 0;
	if (a.ps === undefined) {
		which = 'as recorded (no P/S flag in the .cfg)';
	} else if ((a.ps === 'P') === (want === 'primary')) {
		which = `${want} values, as recorded`;
	} else if (!ratioKnown) {
		which = `${a.ps === 'P' ? 'primary' : 'secondary'} values as recorded: no usable ratio ${a.primary}/${a.secondary} to convert to ${want}`;
		diagnostics.push({
			code: 'comtrade-ratio-missing',
			severity: 'warning',
			line: a.line,
			message: `Channel ${a.name}: ${which}.`,
		});
	} else {
		ratio = a.ps === 'S' ? a.primary / a.secondary : a.secondary / a.primary;
		which = `${want} values, converted with ratio ${a.primary}:${a.secondary}`;
	}
	const factor = a.a * ratio * u.factor;
	const offset = a.b * ratio * u.factor;
	const samples = raw; // our own array: scaled in place
	for (let k = 0; k < samples.length; k++) samples[k] = factor * samples[k] + offset;
	let quantity = u.quantity;
	if (quantity === 'other' && u.unit === '') {
		const q = quantityFromName(a.name);
		if (q) {
			quantity = q;
			diagnostics.push({
				code: 'comtrade-quantity-from-name',
				severity: 'assumption',
				line: a.line,
				message: `Channel ${a.name} has no unit; taken as ${q} from its name.`,
			});
		}
	}
	if (u.factor !== 1)
		diagnostics.push({
			code: 'unit-normalised',
			severity: 'info',
			line: a.line,
			message: `Channel ${a.name}: ${a.unit} converted to ${u.unit} (×${u.factor}).`,
		});
	const channel: Channel = {
		name: a.name || `A${a.index}`,
		unit: u.unit,
		quantity,
		samples,
		scaling: {
			factor,
			offset,
			description: `${short(a.a)}·x + ${short(a.b)} ${a.unit}; ${which}${u.factor !== 1 ? `; ×${u.factor} to ${u.unit}` : ''}`,
		},
	};
	if (a.max > a.min)
		channel.range = scaleRange({ min: a.min, max: a.max, source: "the .cfg's min and max" }, factor, offset);
	const ph = channelPhase(a.name, a.phase);
	if (ph) channel.phase = ph;
	if (a.phase.trim() && !channelPhase('', a.phase))
		diagnostics.push({
			code: 'comtrade-phase-unread',
			severity: 'info',
			line: a.line,
			message: `Channel ${a.name}: phase field "${a.phase.trim()}" is not a phase label Sinecheck reads (L1, A, R, N, ...); ${ph ? `phase ${ph} taken from the name` : 'no phase set'}.`,
		});
	return channel;
}

export function uniqueNames(channels: Channel[], diagnostics: Diagnostic[]): void {
	const seen = new Map<string, number>();
	for (const c of channels) {
		const k = seen.get(c.name) ?? 0;
		seen.set(c.name, k + 1);
		if (k > 0) {
			const renamed = `${c.name} (${k + 1})`;
			diagnostics.push({
				code: 'duplicate-channel-name',
				severity: 'assumption',
				message: `Two channels are named ${c.name}; the later one is called ${renamed}.`,
			});
			c.name = renamed;
		}
	}
}
