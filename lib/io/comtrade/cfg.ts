/**
 * COMTRADE configuration (.cfg) reader: text -> a typed description of the record, with every field's
 * line so later errors and diagnostics can point back at it.
 * Ref: IEEE C37.111-1991/1999/2013 (= IEC 60255-24:2013), configuration file (from memory; the line
 * layout is the one in docs/methods.md §8.1).
 */
import type { Diagnostic } from '../../capture.js';
import { ImportError } from '../import-error.js';
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

/** Drop one trailing empty field (a line ending in a comma) when the line has one field more than `wanted`. */
function trimTrailing(f: Field[], wanted: number): Field[] {
	return f.length === wanted + 1 && f[wanted].text === '' ? f.slice(0, wanted) : f;
}

/**
 * Read a .cfg text. `lineOffset` shifts reported line numbers (a CFF section starts below line 1).
 * @throws ImportError 'cfg-syntax' (a field that cannot be read, with its line and column) or
 *   'cfg-count-mismatch' (the channel lines disagree with the counts on line 2).
 */
export function parseComtradeCfg(text: string, source: string, lineOffset = 0): ComtradeConfig {
	const { lines, lineEnd } = splitLines(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
	while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
	const diagnostics: Diagnostic[] = [];
	const metadata: Record<string, string> = {};
	let i = 0; // index of the next line to read
	const lineNo = (k: number) => k + 1 + lineOffset;
	const fail = (
		k: number,
		column: number,
		code: 'cfg-syntax' | 'cfg-count-mismatch',
		got: string,
		expected: string,
	): never => {
		throw new ImportError(source, lineNo(k), column, code, got, expected);
	};
	const next = (what: string): Field[] => {
		if (i >= lines.length) fail(i, 0, 'cfg-syntax', '', `${what} (the file ends at line ${lineNo(i - 1)})`);
		return splitFields(lines[i++]);
	};
	const num = (
		f: Field | undefined,
		k: number,
		what: string,
		opt?: { int?: boolean; min?: number; blank?: number },
	): number => {
		const t = f?.text ?? '';
		if (t === '' && opt?.blank !== undefined) return opt.blank;
		const v = strictNumber(t);
		if (!Number.isFinite(v) || (opt?.int && !Number.isInteger(v)) || (opt?.min !== undefined && v < opt.min)) {
			fail(k, f?.column ?? lines[k].length + 1, 'cfg-syntax', t, what);
		}
		return v;
	};

	// 1. station_name,rec_dev_id[,rev_year]
	const st = next('the station line');
	const revText = st[2]?.text ?? '';
	let revYear = 1991;
	if (revText === '') {
		diagnostics.push({
			code: 'comtrade-revision-assumed',
			severity: 'assumption',
			line: lineNo(0),
			message: 'The .cfg gives no revision year; read as a 1991 file.',
		});
	} else {
		revYear = num(st[2], 0, 'a revision year (1991, 1999 or 2013)', { int: true, min: 1900 });
		if (![1991, 1999, 2013].includes(revYear)) {
			diagnostics.push({
				code: 'comtrade-revision-unknown',
				severity: 'warning',
				line: lineNo(0),
				column: st[2].column,
				message: `Revision year ${revYear} is not one of 1991, 1999, 2013; read with the ${revYear > 2013 ? 2013 : 1999} layout.`,
			});
		}
	}
	const station = st[0].text;
	const device = st[1]?.text ?? '';

	// 2. TT,##A,##D
	const ct = next('the channel counts line `TT,##A,##D`');
	const countLine = i - 1;
	const total = num(ct[0], countLine, 'the total channel count (an integer)', { int: true, min: 0 });
	const countField = (f: Field | undefined, suffix: 'A' | 'D'): number => {
		const m = f ? new RegExp(`^(\\d+)\\s*${suffix}$`, 'i').exec(f.text) : null;
		if (!m)
			fail(
				countLine,
				f?.column ?? lines[countLine].length + 1,
				'cfg-syntax',
				f?.text ?? '',
				`a count followed by ${suffix}, e.g. 4${suffix}`,
			);
		return Number(m![1]);
	};
	const nA = countField(ct[1], 'A');
	const nD = countField(ct[2], 'D');
	if (nA + nD !== total)
		fail(
			countLine,
			ct[0].column,
			'cfg-count-mismatch',
			lines[countLine],
			`total ${total} = analog + digital (${nA} + ${nD} = ${nA + nD})`,
		);

	const channelLineCheck = (k: number, f: Field[], kind: 'analog' | 'digital', n: number, got: number) => {
		if (f.length <= 2) {
			fail(
				k,
				1,
				'cfg-count-mismatch',
				lines[k],
				`${n} ${kind} channel lines as line ${lineNo(countLine)} declares; only ${got} found before this line`,
			);
		}
	};

	// 3. analog channel lines: An,ch_id,ph,ccbm,uu,a,b,skew,min,max[,primary,secondary,PS]
	const analog: CfgAnalog[] = [];
	for (let c = 0; c < nA; c++) {
		const f = next(`analog channel line ${c + 1} of ${nA}`);
		const k = i - 1;
		channelLineCheck(k, f, 'analog', nA, c);
		if (f.length < 10) {
			fail(
				k,
				1,
				f.length === 5 || f.length === 3 ? 'cfg-count-mismatch' : 'cfg-syntax',
				lines[k],
				f.length === 5 || f.length === 3
					? `${nA} analog channel lines as line ${lineNo(countLine)} declares; this looks like a digital channel line`
					: 'an analog channel line of 10 or 13 fields: An,ch_id,ph,ccbm,uu,a,b,skew,min,max,primary,secondary,PS',
			);
		}
		const psText = (f[12]?.text ?? '').toUpperCase();
		if (f.length >= 13 && psText !== 'P' && psText !== 'S' && psText !== '')
			fail(k, f[12].column, 'cfg-syntax', f[12].text, 'P or S (primary or secondary values)');
		if (f.length >= 13 && psText === '') {
			diagnostics.push({
				code: 'comtrade-ps-blank',
				severity: 'assumption',
				line: lineNo(k),
				column: f[12].column,
				message: `Channel ${f[1].text} leaves the P/S flag blank; its values are taken as recorded.`,
			});
		}
		analog.push({
			index: num(f[0], k, 'the channel index (an integer)', { int: true }),
			name: f[1].text,
			phase: f[2].text,
			circuit: f[3].text,
			unit: f[4].text,
			a: num(f[5], k, 'the multiplier a (a number)'),
			b: num(f[6], k, 'the offset b (a number)', { blank: 0 }),
			skewUs: num(f[7], k, 'the skew in microseconds (a number)', { blank: 0 }),
			// min and max are read leniently: a channel without a usable range is judged by the wave's shape
			min: strictNumber(f[8].text),
			max: strictNumber(f[9].text),
			primary: f.length >= 13 ? num(f[10], k, 'the primary ratio factor (a number)', { blank: NaN }) : NaN,
			secondary: f.length >= 13 ? num(f[11], k, 'the secondary ratio factor (a number)', { blank: NaN }) : NaN,
			ps: f.length >= 13 && psText !== '' ? (psText as 'P' | 'S') : undefined,
			line: lineNo(k),
		});
	}

	// 4. digital channel lines: Dn,ch_id,ph,ccbm,y (1991: Dn,ch_id,y)
	const digital: CfgDigital[] = [];
	for (let c = 0; c < nD; c++) {
		const raw = next(`digital channel line ${c + 1} of ${nD}`);
		const f = trimTrailing(trimTrailing(raw, 5), 3);
		const k = i - 1;
		channelLineCheck(k, f, 'digital', nD, c);
		if (f.length >= 10)
			fail(
				k,
				1,
				'cfg-count-mismatch',
				lines[k],
				`${nD} digital channel lines after ${nA} analog ones as line ${lineNo(countLine)} declares; this looks like an analog channel line`,
			);
		if (f.length !== 5 && f.length !== 3)
			fail(k, 1, 'cfg-syntax', lines[k], 'a digital channel line Dn,ch_id,ph,ccbm,y (or Dn,ch_id,y in 1991 files)');
		const yField = f[f.length - 1];
		const y = yField.text === '' ? undefined : num(yField, k, 'the normal state 0 or 1', { int: true, min: 0 });
		if (y !== undefined && y > 1) fail(k, yField.column, 'cfg-syntax', yField.text, 'the normal state 0 or 1');
		digital.push({
			index: num(f[0], k, 'the channel index (an integer)', { int: true }),
			name: f[1].text,
			phase: f.length === 5 ? f[2].text : '',
			circuit: f.length === 5 ? f[3].text : '',
			normalState: y as 0 | 1 | undefined,
			line: lineNo(k),
		});
	}

	// 5. lf
	const lfFields = trimTrailing(next('the line frequency `lf`'), 1);
	if (lfFields.length > 2)
		fail(
			i - 1,
			1,
			'cfg-count-mismatch',
			lines[i - 1],
			`the line frequency after ${nA} analog and ${nD} digital channel lines (line ${lineNo(countLine)}); this looks like one more channel line`,
		);
	const lineFrequencyHz = num(lfFields[0], i - 1, 'the line frequency in Hz (a number)', { min: 0 });

	// 6-7. nrates, then samp,endsamp per rate (nrates = 0 may be followed by `0,endsamp`)
	const nrFields = trimTrailing(next('the number of sampling rates `nrates`'), 1);
	const nrates = num(nrFields[0], i - 1, 'the number of sampling rates (an integer)', { int: true, min: 0 });
	const rates: CfgRate[] = [];
	let endSampleNoRate: number | undefined;
	for (let r = 0; r < nrates; r++) {
		const f = trimTrailing(next(`sampling rate line ${r + 1} of ${nrates} (samp,endsamp)`), 2);
		const k = i - 1;
		if (f.length !== 2) fail(k, 1, 'cfg-syntax', lines[k], 'a sampling rate line `samp,endsamp`');
		const sampleRateHz = num(f[0], k, 'a sample rate in Hz (a number >= 0)', { min: 0 });
		const endSample = num(f[1], k, 'the last sample number at this rate (an integer >= 1)', { int: true, min: 1 });
		if (rates.length > 0 && endSample <= rates[rates.length - 1].endSample)
			fail(k, f[1].column, 'cfg-syntax', f[1].text, `a last sample number above ${rates[rates.length - 1].endSample}`);
		rates.push({ sampleRateHz, endSample, line: lineNo(k) });
	}
	if (nrates === 0 && i < lines.length) {
		const f = trimTrailing(splitFields(lines[i]), 2);
		if (f.length === 2 && !f[0].text.includes('/') && Number.isFinite(strictNumber(f[1].text))) {
			i++;
			endSampleNoRate = num(f[1], i - 1, 'the last sample number (an integer >= 0)', { int: true, min: 0 });
		}
	}

	// 8-9. first-data and trigger time stamps
	const stampAt = (what: string): CfgStamp | undefined => {
		const f = trimTrailing(next(`the ${what} time stamp dd/mm/yyyy,hh:mm:ss.ssssss`), 2);
		const k = i - 1;
		if (f.length === 2 && f[0].text === '' && f[1].text === '') {
			diagnostics.push({
				code: 'comtrade-no-time-stamp',
				severity: 'warning',
				line: lineNo(k),
				message: `The ${what} time stamp is blank.`,
			});
			return undefined;
		}
		if (f.length !== 2) fail(k, 1, 'cfg-syntax', lines[k], `the ${what} time stamp dd/mm/yyyy,hh:mm:ss.ssssss`);
		const s = parseCfgStamp(f[0].text, f[1].text);
		if (!s) {
			diagnostics.push({
				code: 'comtrade-bad-time-stamp',
				severity: 'warning',
				line: lineNo(k),
				column: 1,
				message: `The ${what} time stamp "${lines[k].trim()}" is not a valid date and time; it is ignored.`,
			});
		} else if (s.monthFirst) {
			diagnostics.push({
				code: 'comtrade-1991-date',
				severity: 'assumption',
				line: lineNo(k),
				message: `The ${what} date has a two-digit year; read as the 1991 order mm/dd/yy (${s.iso.slice(0, 10)}).`,
			});
		}
		return s;
	};
	const firstData = stampAt('first-data');
	const trigger = stampAt('trigger');

	// 10. ft
	const ftFields = trimTrailing(next('the data file type (ASCII, BINARY, BINARY32 or FLOAT32)'), 1);
	const fileTypeLine = lineNo(i - 1);
	const ft = ftFields[0].text.toUpperCase();
	if (ftFields.length !== 1 || !['ASCII', 'BINARY', 'BINARY32', 'FLOAT32'].includes(ft)) {
		fail(
			i - 1,
			ftFields[0].column,
			'cfg-syntax',
			lines[i - 1],
			'the data file type ASCII, BINARY, BINARY32 or FLOAT32',
		);
	}
	// 11. timemult (1999 and later; absent in 1991 files)
	let timeMult = 1;
	if (i < lines.length) {
		const f = trimTrailing(splitFields(lines[i]), 1);
		if (f.length === 1) {
			i++;
			timeMult = num(f[0], i - 1, 'the time stamp multiplier timemult (a number > 0)', { min: 0 });
			if (timeMult === 0)
				fail(i - 1, f[0].column, 'cfg-syntax', f[0].text, 'the time stamp multiplier timemult (a number > 0)');
		}
	} else if (revYear >= 1999) {
		diagnostics.push({
			code: 'comtrade-timemult-assumed',
			severity: 'assumption',
			message: 'The .cfg has no timemult line; time stamps are taken as written (timemult = 1).',
		});
	}
	// 12-13. (2013) time_code,local_code and tmq_code,leapsec: kept as metadata
	if (i < lines.length && splitFields(lines[i]).length === 2) {
		const f = splitFields(lines[i++]);
		metadata['comtrade.time_code'] = f[0].text;
		metadata['comtrade.local_code'] = f[1].text;
	}
	if (i < lines.length && splitFields(lines[i]).length === 2) {
		const f = splitFields(lines[i++]);
		metadata['comtrade.tmq_code'] = f[0].text;
		metadata['comtrade.leapsec'] = f[1].text;
	}
	if (i < lines.length) {
		diagnostics.push({
			code: 'comtrade-cfg-extra-lines',
			severity: 'warning',
			line: lineNo(i),
			message: `The .cfg has ${lines.length - i} line(s) after the last field it should have; they are ignored.`,
		});
	}

	Object.assign(metadata, {
		'comtrade.station': station,
		'comtrade.device': device,
		'comtrade.rev_year': revText,
		'comtrade.channels': `${total},${nA}A,${nD}D`,
		'comtrade.lf': lfFields[0].text,
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
		lineFrequencyHz,
		rates,
		endSampleNoRate,
		firstData,
		trigger,
		fileType: ft as ComtradeFileType,
		fileTypeLine,
		timeMult,
		linesUsed: i,
		lineEnd,
		metadata,
		diagnostics,
	};
}
