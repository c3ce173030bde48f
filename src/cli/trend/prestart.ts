/**
 * The helper process of `trend`, started before anything else of the command loads: node's own start
 * and the helper's loading of the trend code then overlap this process loading the command and walking
 * the paths. The command takes it over (trend-command.ts `helper`) or closes it.
 */
import { defaultHeapMiB, helperAvailable, HelperProcess } from '../helper-process.js';
import { limitsFrom } from '../limits-options.js';

/**
 * @param memoryLimit  the --memory-limit value as given
 * @param threads      the --threads value as given
 * @returns the started helper; undefined when either value is bad (the command reports it) or there is
 *   no built helper file
 */
export function prestartTrendHelper(memoryLimit: unknown, threads: unknown): HelperProcess | undefined {
	if (!helperAvailable()) return undefined;
	let heapMiB: number | undefined;
	try {
		heapMiB = limitsFrom(undefined, memoryLimit).heapMiB;
	} catch {
		return undefined;
	}
	const t = threads === undefined ? 2 : Number(threads);
	if (t !== 1 && t !== 2) return undefined;
	const helper = new HelperProcess(heapMiB ?? defaultHeapMiB(1), '', ['trend', String(t)]);
	helper.start();
	return helper;
}
