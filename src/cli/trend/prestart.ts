/**
 * The helper process of `trend`, started before anything else of the command loads: node's own start
 * and the helper's loading of the trend code then overlap this process loading the command and walking
 * the paths. The command takes it over (trend-command.ts `helper`) or closes it.
 */
import { defaultHeapMiB, helperAvailable, HelperProcess } from '../helper-process.js';

/**
 * @param memoryLimit  the --memory-limit value as given
 * @param threads      the --threads value as given
 * @returns the started helper; undefined when either value is bad (the command reports it) or there is
 *   no built helper file
 */
export function prestartTrendHelper(memoryLimit: unknown, threads: unknown): HelperProcess | undefined {
	if (!helperAvailable()) return undefined;
	// the same checks as options.ts limitsFrom and trend-command.ts (not loaded here: they load the signal library)
	const heapMiB = memoryLimit === undefined ? undefined : Number(memoryLimit);
	if (heapMiB !== undefined && !(Number.isInteger(heapMiB) && heapMiB >= 64)) return undefined;
	const t = threads === undefined ? 2 : Number(threads);
	if (t !== 1 && t !== 2) return undefined;
	const helper = new HelperProcess(heapMiB ?? defaultHeapMiB(1), '', ['trend', String(t)]);
	helper.start();
	return helper;
}
