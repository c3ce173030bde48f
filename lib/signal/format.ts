/** Numbers in user-facing messages: 4 significant digits, plain notation. Internal to lib/signal (cyclesText is exported). */
export function fmt(x: number): string {
	if (!Number.isFinite(x)) return String(x);
	return Number(x.toPrecision(4)).toString();
}

/** A count of cycles as printed, with the noun: '1 cycle', '0.998 cycles', '9 cycles'. */
export function cyclesText(count: string): string {
	return `${count} ${count === '1' ? 'cycle' : 'cycles'}`;
}
