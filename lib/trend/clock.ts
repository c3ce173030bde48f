/**
 * Wall-clock time of a recording: the ISO 8601 text an importer reads from the file (COMTRADE start stamp,
 * CSV date/time column or preamble) as seconds on one clock, and the place of the IEC 61000-4-30 ticks.
 */

/** Seconds between 10-minute ticks and between power-frequency values. Ref: IEC 61000-4-30:2015, 4.5.3 and 5.1.2 (from memory). */
export const TEN_MIN_S = 600;
export const FREQUENCY_INTERVAL_S = 10;

export interface ClockTime {
	/** Seconds since 1970-01-01T00:00:00 on the stated clock (UTC when the text has a zone). */
	unixS: number;
	/** 'stated': the text carried Z or an offset; 'as written': no zone, taken as written (the recorder's clock). */
	zone: 'stated' | 'as written';
}

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d+))?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/;

/**
 * Parses `2026-05-04T08:44:21.051` (optionally with Z or ±hh:mm) without the platform's local-time rules:
 * a text without a zone is taken as written, so the 10-minute ticks fall where the recorder's clock puts
 * them. Undefined for anything else. Fractions keep every digit given (COMTRADE 2013 has nanoseconds).
 * @example clockTimeOf('2026-05-04T08:44:21.051Z')?.unixS // 1777884261.051
 */
export function clockTimeOf(text: string | undefined | null): ClockTime | undefined {
	if (!text) return undefined;
	const m = ISO.exec(text.trim());
	if (!m) return undefined;
	const [y, mo, d, hh = '0', mi = '0', ss = '0'] = m.slice(1, 7);
	const month = Number(mo);
	const day = Number(d);
	if (month < 1 || month > 12 || day < 1 || day > 31 || Number(hh) > 23 || Number(mi) > 59 || Number(ss) > 60)
		return undefined;
	let unixS = Date.UTC(Number(y), month - 1, day, Number(hh), Number(mi), Number(ss)) / 1000;
	if (m[7]) unixS += Number(`0.${m[7]}`);
	const zone = m[8];
	if (zone && zone !== 'Z') {
		const z = /^([+-])(\d{2}):?(\d{2})$/.exec(zone)!;
		unixS -= (z[1] === '-' ? -1 : 1) * (Number(z[2]) * 3600 + Number(z[3]) * 60);
	}
	return { unixS, zone: zone ? 'stated' : 'as written' };
}

/** Seconds after the last tick of `periodS` at clock time `unixS` (in [0, periodS)). */
export function secondsPastTick(unixS: number, periodS: number): number {
	const r = unixS % periodS;
	return r < 0 ? r + periodS : r;
}
