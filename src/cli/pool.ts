/**
 * Runs analysis units in helper processes (helper-process.ts), at most `jobs` at a time, and hands back
 * each result as it completes. Each helper has a heap cap and each unit a time limit: a unit that crashes
 * its helper, runs out of memory or runs out of time becomes that unit's error line, the helper is
 * replaced, and the other units carry on. When the compiled helper is absent (running from TypeScript
 * sources) or `jobs` is 0, units run in this process instead, without those limits.
 */
import { statSync } from 'node:fs';
import type { UnitResult } from './analyse-unit.js';
import type { AnalysisUnit } from './collect-files.js';
import { defaultHeapMiB, helperAvailable, HelperProcess, timeLimitFor } from './helper-process.js';
import type { CommandSettings } from './options.js';
import type { WorkRequest } from './worker.js';

export { defaultHeapMiB } from './helper-process.js';

/** Limits on one unit's analysis in a helper. */
export interface UnitLimits {
	/** Heap (V8 old generation) a helper process may use, MiB. */
	heapMiB: number;
	/** Fixed time limit per unit in s; undefined = the default, which grows with the unit's size. */
	timeLimitS?: number;
}

/** Total size of a unit's files in bytes (0 for any that cannot be read: the helper reports those). */
export function unitBytes(unit: AnalysisUnit): number {
	let total = 0;
	for (const f of unit.files) {
		try {
			total += statSync(f).size;
		} catch {
			// reported by the helper
		}
	}
	return total;
}

function failure(unit: AnalysisUnit, message: string): UnitResult {
	return { files: unit.files, reports: [], problems: [{ file: unit.files[0], code: 'stopped', message }] };
}

async function runInHelper(
	helper: HelperProcess,
	id: number,
	unit: AnalysisUnit,
	settings: CommandSettings,
	limits: UnitLimits,
): Promise<UnitResult> {
	let result: UnitResult | undefined;
	const req: WorkRequest = { kind: 'analyse', id, files: unit.files, settings };
	const stopped = await helper.run(
		req,
		(msg) => {
			const m = msg as { id: number; result: UnitResult };
			if (m.id !== id) return false;
			result = m.result;
			return true;
		},
		timeLimitFor(unitBytes(unit), limits.timeLimitS),
	);
	return stopped === undefined && result
		? result
		: failure(unit, stopped ?? 'could not analyse: no answer from the helper process');
}

/**
 * Analyses every unit; calls `onResult(index, result)` once per unit in completion order.
 * @param jobs  helper processes to use; 0 = in this process (no memory or time limit)
 */
export async function runUnits(
	units: AnalysisUnit[],
	settings: CommandSettings,
	jobs: number,
	onResult: (index: number, result: UnitResult) => void,
	limits: UnitLimits = { heapMiB: defaultHeapMiB(jobs) },
): Promise<void> {
	if (jobs <= 0 || !helperAvailable()) {
		const { analyseUnit } = await import('./analyse-unit.js');
		for (let i = 0; i < units.length; i++) {
			onResult(i, analyseUnit(units[i].files, settings));
			// Let the progress bar and stdout drain between files.
			await new Promise((r) => setImmediate(r));
		}
		return;
	}
	let next = 0;
	const drain = async () => {
		const helper = new HelperProcess(limits.heapMiB, '; for long recordings use `sinecheck trend`');
		try {
			while (next < units.length) {
				const i = next++;
				onResult(i, await runInHelper(helper, i, units[i], settings, limits));
			}
		} finally {
			helper.close();
		}
	};
	await Promise.all(Array.from({ length: Math.min(jobs, units.length) }, drain));
}
