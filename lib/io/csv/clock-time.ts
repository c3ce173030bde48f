/**
 * Time stamps written as a time of day, with or without a date: `12:00:00.125`, `2031-05-14 12:00:00,125`,
 * `14.05.2031 12:00:00.125`, `2031-05-14T12:00:00.125Z`. Read as seconds from midnight of the first day
 * seen (so 1 us steps keep their precision), the date by the proleptic Gregorian calendar (Date.UTC).
 * Zone suffixes are accepted and ignored: stamps in one file share one zone.
 */

const CLOCK =
	/^(?:(?:(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})|(\d{1,2})[./](\d{1,2})[./](\d{4}))[T ]+)?(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d{1,9}))?\s*(?:Z|[+-]\d{2}:?\d{2})?$/;

/** True for a cell that is a time of day (optionally with a date). */
export function isClockCell(cell: string): boolean {
	const t = cell.trim();
	return t.length <= 40 && CLOCK.test(t.replace(/^"|"$/g, ''));
}

const DATE = /^(?:\d{4}[-/.]\d{1,2}[-/.]\d{1,2}|\d{1,2}[./]\d{1,2}[./]\d{4})$/;

/** True for a cell that is a date alone (a Date column next to a Time column). */
export function isDateCell(cell: string): boolean {
	return DATE.test(cell.trim().replace(/^"|"$/g, ''));
}

/** Cells of a data row are numbers, except a clock stamp (or a date then a clock) at the start. */
export function isDataRow(cells: string[], isNumber: (cell: string) => boolean): boolean {
	let from = 0;
	if (cells.length > 0 && isClockCell(cells[0])) from = 1;
	else if (cells.length > 1 && isDateCell(cells[0]) && isClockCell(cells[1])) from = 2;
	for (let i = from; i < cells.length; i++) if (!isNumber(cells[i])) return false;
	return true;
}

/** Digits after the seconds' decimal mark of a clock cell, or -1 when it is not one. */
export function clockFractionDigits(cell: string): number {
	const m = CLOCK.exec(cell.trim());
	return m ? (m[10]?.length ?? 0) : -1;
}

/** Days since 1970-01-01 and seconds of that day, or null when the text is not a clock stamp. */
export function readClock(text: string): { day: number | null; secondsOfDay: number } | null {
	if (text.length > 40) return null;
	const m = CLOCK.exec(text.trim());
	if (!m) return null;
	const h = Number(m[7]);
	const min = Number(m[8]);
	const s = Number(m[9]);
	if (h > 23 || min > 59 || s > 60) return null;
	const secondsOfDay = h * 3600 + min * 60 + s + (m[10] ? Number(`0.${m[10]}`) : 0);
	let day: number | null = null;
	if (m[1] || m[6]) {
		const [y, mo, d] = m[1] ? [m[1], m[2], m[3]] : [m[6], m[5], m[4]];
		const month = Number(mo);
		const date = Number(d);
		if (month < 1 || month > 12 || date < 1 || date > 31) return null;
		day = Date.UTC(Number(y), month - 1, date) / 86_400_000;
	}
	return { day, secondsOfDay };
}

/**
 * Turns successive clock stamps into seconds from midnight of the first day: dated stamps by their date,
 * undated ones by counting a new day whenever the clock falls back by more than 12 h (midnight passed).
 */
export class ClockCounter {
	private firstDay: number | null = null;
	private dayOffset = 0;
	private prev = -Infinity;

	/** Seconds from midnight of the first day, or NaN when the text is not a clock stamp. */
	secondsOf(text: string): number {
		const c = readClock(text);
		if (!c) return NaN;
		let t: number;
		if (c.day !== null) {
			this.firstDay ??= c.day;
			t = (c.day - this.firstDay) * 86_400 + c.secondsOfDay;
		} else {
			if (c.secondsOfDay + this.dayOffset < this.prev - 43_200) this.dayOffset += 86_400;
			t = c.secondsOfDay + this.dayOffset;
		}
		this.prev = t;
		return t;
	}
}
