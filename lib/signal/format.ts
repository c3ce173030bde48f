/** Numbers in user-facing messages: 4 significant digits, plain notation. Internal to lib/signal. */
export function fmt(x: number): string {
	if (!Number.isFinite(x)) return String(x);
	return Number(x.toPrecision(4)).toString();
}
