/**
 * COMTRADE configuration (.cfg) reader: text -> a typed description of the record, with every field's
 * line so later errors and diagnostics can point back at it.
 * Ref: IEEE C37.111-1991/1999/2013 (= IEC 60255-24:2013), configuration file (from memory; the line
 * layout is the one in docs/methods.md §8.1).
 */
import type { Diagnostic } from '../../capture.js';
import { CfgCursor, trimTrailing } from './cfg-reader.js';
import { type CfgStamp, parseCfgStamp } from './stamp.js';
import { type Field, splitFields, splitLines, strictNumber } from './text.js';

export type ComtradeFileType = 'ASCII' | 'BINARY' | 'BINARY32' | 'FLOAT32';

export interface CfgAnalog {
	index: number;
	name: string;
	phase: string;
	circuit: string;
	unit: string;
	a: number;
	b: number;
	skewUs: number;
	primary: number;
	secondary: number;
	/** The channel's range in raw data values (the min and max fields); NaN when blank. */
	min: number;
	max: number;
	/** 'P' or 'S' when the file says which; undefined for 1991 files. */
	ps?: 'P' | 'S';
	line: number;
}

export interface CfgDigital {
	index: number;
	name: string;
	phase: string;
	circuit: string;
	normalState?: 0 | 1;
	line: number;
}

export interface CfgRate {
	sampleRateHz: number;
	endSample: number;
	line: number;
}

export interface ComtradeConfig {
	station: string;
	device: string;
	/** 1991, 1999, 2013 or whatever the file wrote (a missing year reads as 1991). */
	revYear: number;
	analog: CfgAnalog[];
	digital: CfgDigital[];
	lineFrequencyHz: number;
	/** Sampling rates with the last sample number of each; empty when nrates = 0. */
	rates: CfgRate[];
	/** Last sample number given with nrates = 0 (`0,endsamp`), when present. */
	endSampleNoRate?: number;
	firstData?: CfgStamp;
	trigger?: CfgStamp;
	fileType: ComtradeFileType;
	fileTypeLine: number;
	timeMult: number;
	/** Lines read from the text (for CFF: where the CFG section ended). */
	linesUsed: number;
	lineEnd: string;
	metadata: Record<string, string>;
	diagnostics: Diagnostic[];
}

const REVISION_YEARS = [1991, 1999, 2013];
const FILE_TYPES: readonly ComtradeFileType[] = ['ASCII', 'BINARY', 'BINARY32', 'FLOAT32'];

/** 1. station_name,rec_dev_id[,rev_year] (a missing year reads as 1991, said as an assumption). */
function readStationLine(c: CfgCursor): { station: string; device: string; revYear: number; revText: string } {
	const st = c.next('the station line');
	const revText = st[2]?.text ?? '';
	let revYear = 1991;
	if (revText === '') {
		c.diagnostics.push({
			code: 'comtrade-revision-assumed',
			severity: 'assumption',
			line: c.lineNo(0),
			message: 'The .cfg gives no revision year; read as a 1991 file.',
		});
	} else {
		revYear = c.num(st[2], 0, 'a revision year (1991, 1999 or 2013)', { int: true, min: 1900 });
		if (!REVISION_YEARS.includes(revYear)) {
			c.diagnostics.push({
				code: 'comtrade-revision-unknown',
				severity: 'warning',
				line: c.lineNo(0),
				column: st[2].column,
				message: `Revision year ${revYear} is not one of 1991, 1999, 2013; read with the ${revYear > 2013 ? 2013 : 1999} layout.`,
			});
		}
	}
	return { station: st[0].text, device: st[1]?.text ?? '', revYear, revText };
}

interface ChannelCounts {
	total: number;
	nA: number;
	nD: number;
	/** Index of the counts line. */
	countLine: number;
}

/** 2. TT,##A,##D; the total must equal analog + digital. */
function readCounts(c: CfgCursor): ChannelCounts {
	const ct = c.next('the channel counts line `TT,##A,##D`');
	const countLine = c.last;
	const total = c.num(ct[0], countLine, 'the total channel count (an integer)', { int: true, min: 0 });
	const countField = (f: Field | undefined, suffix: 'A' | 'D'): number => {
		const m = f ? new RegExp(`^(\\d+)\\s*${suffix}$`, 'i').exec(f.text) : null;
		if (!m)
			c.fail(
				countLine,
				f?.column ?? c.lines[countLine].length + 1,
				'cfg-syntax',
				f?.text ?? '',
				`a count followed by ${suffix}, e.g. 4${suffix}`,
			);
		return Number(m![1]);
	};
	const nA = countField(ct[1], 'A');
	const nD = countField(ct[2], 'D');
	if (nA + nD !== total)
		c.fail(
			countLine,
			ct[0].column,
			'cfg-count-mismatch',
			c.lines[countLine],
			`total ${total} = analog + digital (${nA} + ${nD} = ${nA + nD})`,
		);
	return { total, nA, nD, countLine };
}

/** A channel line of two fields or fewer means the channel lines ran out before the declared count. */
function channelLineCheck(
	c: CfgCursor,
	counts: ChannelCounts,
	f: Field[],
	kind: 'analog' | 'digital',
	n: number,
	got: number,
): void {
	if (f.length <= 2) {
		c.fail(
			c.last,
			1,
			'cfg-count-mismatch',
			c.lines[c.last],
			`${n} ${kind} channel lines as line ${c.lineNo(counts.countLine)} declares; only ${got} found before this line`,
		);
	}
}

/** 3. analog channel lines: An,ch_id,ph,ccbm,uu,a,b,skew,min,max[,primary,secondary,PS]. */
function readAnalogLines(c: CfgCursor, counts: ChannelCounts): CfgAnalog[] {
	const { nA } = counts;
	const analog: CfgAnalog[] = [];
	for (let ch = 0; ch < nA; ch++) {
		const f = c.next(`analog channel line ${ch + 1} of ${nA}`);
		const k = c.last;
		channelLineCheck(c, counts, f, 'analog', nA, ch);
		if (f.length < 10) {
			const digitalLike = f.length === 5 || f.length === 3;
			c.fail(
				k,
				1,
				digitalLike ? 'cfg-count-mismatch' : 'cfg-syntax',
				c.lines[k],
				digitalLike
					? `${nA} analog channel lines as line ${c.lineNo(counts.countLine)} declares; this looks like a digital channel line`
					: 'an analog channel line of 10 or 13 fields: An,ch_id,ph,ccbm,uu,a,b,skew,min,max,primary,secondary,PS',
			);
		}
		const psText = (f[12]?.text ?? '').toUpperCase();
		if (f.length >= 13 && psText !== 'P' && psText !== 'S' && psText !== '')
			c.fail(k, f[12].column, 'cfg-syntax', f[12].text, 'P or S (primary or secondary values)');
		if (f.length >= 13 && psText === '') {
			c.diagnostics.push({
				code: 'comtrade-ps-blank',
				severity: 'assumption',
				line: c.lineNo(k),
				column: f[12].column,
				message: `Channel ${f[1].text} leaves the P/S flag blank; its values are taken as recorded.`,
			});
		}
		analog.push({
			index: c.num(f[0], k, 'the channel index (an integer)', { int: true }),
			name: f[1].text,
			phase: f[2].text,
			circuit: f[3].text,
			unit: f[4].text,
			a: c.num(f[5], k, 'the multiplier a (a number)'),
			b: c.num(f[6], k, 'the offset b (a number)', { blank: 0 }),
			skewUs: c.num(f[7], k, 'the skew in microseconds (a number)', { blank: 0 }),
			// min and max are read leniently: a channel without a usable range is judged by the wave's shape
			min: strictNumber(f[8].text),
			max: strictNumber(f[9].text),
			primary: f.length >= 13 ? c.num(f[10], k, 'the primary ratio factor (a number)', { blank: NaN }) : NaN,
			secondary: f.length >= 13 ? c.num(f[11], k, 'the secondary ratio factor (a number)', { blank: NaN }) : NaN,
			ps: f.length >= 13 && psText !== '' ? (psText as 'P' | 'S') : undefined,
			line: c.lineNo(k),
		});
	}
	return analog;
}

/** 4. digital channel lines: Dn,ch_id,ph,ccbm,y (1991: Dn,ch_id,y). */
function readDigitalLines(c: CfgCursor, counts: ChannelCounts): CfgDigital[] {
	const { nA, nD } = counts;
	const digital: CfgDigital[] = [];
	for (let ch = 0; ch < nD; ch++) {
		const raw = c.next(`digital channel line ${ch + 1} of ${nD}`);
		const f = trimTrailing(trimTrailing(raw, 5), 3);
		const k = c.last;
		channelLineCheck(c, counts, f, 'digital', nD, ch);
		if (f.length >= 10)
			c.fail(
				k,
				1,
				'cfg-count-mismatch',
				c.lines[k],
				`${nD} digital channel lines after ${nA} analog ones as line ${c.lineNo(counts.countLine)} declares; this looks like an analog channel line`,
			);
		if (f.length !== 5 && f.length !== 3)
			c.fail(k, 1, 'cfg-syntax', c.lines[k], 'a digital channel line Dn,ch_id,ph,ccbm,y (or Dn,ch_id,y in 1991 files)');
		const yField = f[f.length - 1];
		const y = yField.text === '' ? undefined : c.num(yField, k, 'the normal state 0 or 1', { int: true, min: 0 });
		if (y !== undefined && y > 1) c.fail(k, yField.column, 'cfg-syntax', yField.text, 'the normal state 0 or 1');
		digital.push({
			index: c.num(f[0], k, 'the channel index (an integer)', { int: true }),
			name: f[1].text,
			phase: f.length === 5 ? f[2].text : '',
			circuit: f.length === 5 ? f[3].text : '',
			normalState: y as 0 | 1 | undefined,
			line: c.lineNo(k),
		});
	}
	return digital;
}

/** 5. lf: the line frequency; a longer line means one channel line more than counted. */
function readLineFrequency(c: CfgCursor, counts: ChannelCounts): { lineFrequencyHz: number; text: string } {
	const lfFields = trimTrailing(c.next('the line frequency `lf`'), 1);
	if (lfFields.length > 2)
		c.fail(
			c.last,
			1,
			'cfg-count-mismatch',
			c.lines[c.last],
			`the line frequency after ${counts.nA} analog and ${counts.nD} digital channel lines (line ${c.lineNo(counts.countLine)}); this looks like one more channel line`,
		);
	const lineFrequencyHz = c.num(lfFields[0], c.last, 'the line frequency in Hz (a number)', { min: 0 });
	return { lineFrequencyHz, text: lfFields[0].text };
}

/** 6-7. nrates, then samp,endsamp per rate (nrates = 0 may be followed by `0,endsamp`). */
function readRates(c: CfgCursor): { nrates: number; rates: CfgRate[]; endSampleNoRate?: number } {
	const nrFields = trimTrailing(c.next('the number of sampling rates `nrates`'), 1);
	const nrates = c.num(nrFields[0], c.last, 'the number of sampling rates (an integer)', { int: true, min: 0 });
	const rates: CfgRate[] = [];
	let endSampleNoRate: number | undefined;
	for (let r = 0; r < nrates; r++) {
		const f = trimTrailing(c.next(`sampling rate line ${r + 1} of ${nrates} (samp,endsamp)`), 2);
		const k = c.last;
		if (f.length !== 2) c.fail(k, 1, 'cfg-syntax', c.lines[k], 'a sampling rate line `samp,endsamp`');
		const sampleRateHz = c.num(f[0], k, 'a sample rate in Hz (a number >= 0)', { min: 0 });
		const endSample = c.num(f[1], k, 'the last sample number at this rate (an integer >= 1)', { int: true, min: 1 });
		if (rates.length > 0 && endSample <= rates[rates.length - 1].endSample)
			c.fail(
				k,
				f[1].column,
				'cfg-syntax',
				f[1].text,
				`a last sample number above ${rates[rates.length - 1].endSample}`,
			);
		rates.push({ sampleRateHz, endSample, line: c.lineNo(k) });
	}
	if (nrates === 0 && c.more) {
		const f = trimTrailing(splitFields(c.lines[c.at]), 2);
		if (f.length === 2 && !f[0].text.includes('/') && Number.isFinite(strictNumber(f[1].text))) {
			c.at++;
			endSampleNoRate = c.num(f[1], c.last, 'the last sample number (an integer >= 0)', { int: true, min: 0 });
		}
	}
	return { nrates, rates, endSampleNoRate };
}

/** 8-9. one time stamp dd/mm/yyyy,hh:mm:ss.ssssss; blank or invalid ones are warned about and dropped. */
function readStamp(c: CfgCursor, what: string): CfgStamp | undefined {
	const f = trimTrailing(c.next(`the ${what} time stamp dd/mm/yyyy,hh:mm:ss.ssssss`), 2);
	const k = c.last;
	if (f.length === 2 && f[0].text === '' && f[1].text === '') {
		c.diagnostics.push({
			code: 'comtrade-no-time-stamp',
			severity: 'warning',
			line: c.lineNo(k),
			message: `The ${what} time stamp is blank.`,
		});
		return undefined;
	}
	if (f.length !== 2) c.fail(k, 1, 'cfg-syntax', c.lines[k], `the ${what} time stamp dd/mm/yyyy,hh:mm:ss.ssssss`);
	const s = parseCfgStamp(f[0].text, f[1].text);
	if (!s) {
		c.diagnostics.push({
			code: 'comtrade-bad-time-stamp',
			severity: 'warning',
			line: c.lineNo(k),
			column: 1,
			message: `The ${what} time stamp "${c.lines[k].trim()}" is not a valid date and time; it is ignored.`,
		});
	} else if (s.monthFirst) {
		c.diagnostics.push({
			code: 'comtrade-1991-date',
			severity: 'assumption',
			line: c.lineNo(k),
			message: `The ${what} date has a two-digit year; read as the 1991 order mm/dd/yy (${s.iso.slice(0, 10)}).`,
		});
	}
	return s;
}

/** 10. ft: the data file type. */
function readFileType(c: CfgCursor): { ft: string; fileTypeLine: number } {
	const ftFields = trimTrailing(c.next('the data file type (ASCII, BINARY, BINARY32 or FLOAT32)'), 1);
	const fileTypeLine = c.lineNo(c.last);
	const ft = ftFields[0].text.toUpperCase();
	if (ftFields.length !== 1 || !(FILE_TYPES as readonly string[]).includes(ft)) {
		c.fail(
			c.last,
			ftFields[0].column,
			'cfg-syntax',
			c.lines[c.last],
			'the data file type ASCII, BINARY, BINARY32 or FLOAT32',
		);
	}
	return { ft, fileTypeLine };
}

/** 11. timemult (1999 and later; absent in 1991 files). */
function readTimeMult(c: CfgCursor, revYear: number): number {
	let timeMult = 1;
	if (c.more) {
		const f = trimTrailing(splitFields(c.lines[c.at]), 1);
		if (f.length === 1) {
			c.at++;
			timeMult = c.num(f[0], c.last, 'the time stamp multiplier timemult (a number > 0)', { min: 0 });
			if (timeMult === 0)
				c.fail(c.last, f[0].column, 'cfg-syntax', f[0].text, 'the time stamp multiplier timemult (a number > 0)');
		}
	} else if (revYear >= 1999) {
		c.diagnostics.push({
			code: 'comtrade-timemult-assumed',
			severity: 'assumption',
			message: 'The .cfg has no timemult line; time stamps are taken as written (timemult = 1).',
		});
	}
	return timeMult;
}

/** 12-13. (2013) time_code,local_code and tmq_code,leapsec, kept as metadata; then no more lines expected. */
function readTimeCodes(c: CfgCursor): void {
	if (c.peek()?.length === 2) {
		const f = c.next('time_code,local_code');
		c.metadata['comtrade.time_code'] = f[0].text;
		c.metadata['comtrade.local_code'] = f[1].text;
	}
	if (c.peek()?.length === 2) {
		const f = c.next('tmq_code,leapsec');
		c.metadata['comtrade.tmq_code'] = f[0].text;
		c.metadata['comtrade.leapsec'] = f[1].text;
	}
	if (c.more) {
		c.diagnostics.push({
			code: 'comtrade-cfg-extra-lines',
			severity: 'warning',
			line: c.lineNo(c.at),
			message: `The .cfg has ${c.lines.length - c.at} line(s) after the last field it should have; they are ignored.`,
		});
	}
}

/**
 * Read a .cfg text. `lineOffset` shifts reported line numbers (a CFF section starts below line 1).
 * @throws ImportError 'cfg-syntax' (a field that cannot be read, with its line and column) or
 *   'cfg-count-mismatch' (the channel lines disagree with the counts on line 2).
 */
export function parseComtradeCfg(text: string, source: string, lineOffset = 0): ComtradeConfig {
	const { lines, lineEnd } = splitLines(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
	while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
	const c = new CfgCursor(lines, source, lineOffset);
	const { station, device, revYear, revText } = readStationLine(c);
	const counts = readCounts(c);
	const analog = readAnalogLines(c, counts);
	const digital = readDigitalLines(c, counts);
	const lf = readLineFrequency(c, counts);
	const { nrates, rates, endSampleNoRate } = readRates(c);
	const firstData = readStamp(c, 'first-data');
	const trigger = readStamp(c, 'trigger');
	const { ft, fileTypeLine } = readFileType(c);
	const timeMult = readTimeMult(c, revYear);
	readTimeCodes(c);
	const metadata = c.metadata;
	Object.assign(metadata, {
		'comtrade.station': station,
		'comtrade.device': device,
		'comtrade.rev_year': revText,
		'comtrade.channels': `${counts.total},${counts.nA}A,${counts.nD}D`,
		'comtrade.lf': lf.text,
		'comtrade.nrates': String(nrates),
		'comtrade.rates': rates.map((r) => `${r.sampleRateHz},${r.endSample}`).join(';'),
		'comtrade.first_data': firstData?.iso ?? '',
		'comtrade.trigger': trigger?.iso ?? '',
		'comtrade.ft': ft,
		'comtrade.timemult': String(timeMult),
	});
	return {
		station,
		device,
		revYear,
		analog,
		digital,
		lineFrequencyHz: lf.lineFrequencyHz,
		rates,
		endSampleNoRate,
		firstData,
		trigger,
		fileType: ft as ComtradeFileType,
		fileTypeLine,
		timeMult,
		linesUsed: c.at,
		lineEnd,
		metadata,
		diagnostics: c.diagnostics,
	};
}
