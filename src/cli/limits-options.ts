/**
 * --time-limit and --memory-limit, checked: its own module, light to load (trend/prestart.ts reads the
 * memory limit before anything heavy loads); options.ts re-exports it.
 */
import { UsageError } from './usage-error.js';

/** --time-limit and --memory-limit as numbers, or UsageError. */
export function limitsFrom(time: unknown, memory: unknown): { timeLimitS?: number; heapMiB?: number } {
	const out: { timeLimitS?: number; heapMiB?: number } = {};
	if (time !== undefined) {
		const s = Number(time);
		if (!Number.isFinite(s) || s <= 0)
			throw new UsageError(`--time-limit ${String(time)}: expected the seconds one file may take (a number above 0)`);
		out.timeLimitS = s;
	}
	if (memory !== undefined) {
		const m = Number(memory);
		if (!Number.isInteger(m) || m < 64)
			throw new UsageError(
				`--memory-limit ${String(memory)}: expected the MiB of memory one file may use (a whole number, at least 64)`,
			);
		out.heapMiB = m;
	}
	return out;
}
