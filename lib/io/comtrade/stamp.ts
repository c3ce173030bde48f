/**
 * COMTRADE .cfg time stamps: `dd/mm/yyyy,hh:mm:ss.ssssss` (1999, 2013: up to 9 fraction digits) and the
 * 1991 form `mm/dd/yy,hh:mm:ss.ssssss`. Kept as whole seconds plus a fraction so that differences of
 * nanoseconds survive double precision.
 * Ref: IEEE C37.111-1999 / IEC 60255-24:2013, configuration file, date/time stamps (from memory; layout
 * cross-checked with docs/methods.md §8.1).
 */

export interface CfgStamp {
	/** ISO 8601 local time as written, without zone: `2012-07-11T08:44:21.051022`. */
	iso: string;
	/** Whole seconds since 1970-01-01 00:00:00, taking the written time as if it were UTC. */
	wholeS: number;
	/** Fraction of a second, 0 <= fracS < 1. */
	fracS: number;
	/** Number of fraction digits written (6 = microseconds, 9 = nanoseconds). */
	fracDigits: number;
	/** True when the date was read in the 1991 order mm/dd/yy. */
	monthFirst: boolean;
}

/** Parse a date and a time field; undefined when they are not a valid stamp. */
export function parseCfgStamp(dateText: string, timeText: string): CfgStamp | undefined {
	const d = /^(\d{1,2})\/(\d{1,2})\/(\d{2}|\d{4})$/.exec(dateText.trim());
	const t = /^(\d{1,2}):(\d{1,2}):(\d{1,2})(?:\.(\d{1,12}))?$/.exec(timeText.trim());
	if (!d || !t) return undefined;
	const monthFirst = d[3].length === 2;
	const day = Number(monthFirst ? d[2] : d[1]);
	const month = Number(monthFirst ? d[1] : d[2]);
	// Two-digit years (1991 form): 70-99 -> 19xx, 00-69 -> 20xx (common practice, as POSIX strptime %y).
	const year = monthFirst ? (Number(d[3]) >= 70 ? 1900 : 2000) + Number(d[3]) : Number(d[3]);
	const [hh, mm, ss] = [Number(t[1]), Number(t[2]), Number(t[3])];
	if (month < 1 || month > 12 || day < 1 || day > 31 || hh > 23 || mm > 59 || ss > 60) return undefined;
	const ms = Date.UTC(year, month - 1, day, hh, mm, ss);
	const check = new Date(ms);
	if (check.getUTCDate() !== day || check.getUTCMonth() !== month - 1) return undefined;
	const frac = t[4] ?? '';
	const pad = (n: number, w = 2) => String(n).padStart(w, '0');
	const iso = `${pad(year, 4)}-${pad(month)}-${pad(day)}T${pad(hh)}:${pad(mm)}:${pad(ss)}${frac ? '.' + frac : ''}`;
	return { iso, wholeS: ms / 1000, fracS: frac ? Number('0.' + frac) : 0, fracDigits: frac.length, monthFirst };
}

/** a - b in seconds. */
export function stampDifferenceS(a: CfgStamp, b: CfgStamp): number {
	return a.wholeS - b.wholeS + (a.fracS - b.fracS);
}
