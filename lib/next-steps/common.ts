/** Small helpers the next-step files share: rounding for sentences, inputs, status from what is missing. */
import { NEXT_STEP_CAUTION, type NextStep, type NextStepId, type NextStepInput, type NextStepStatus } from './types.js';

/** A number rounded to `decimals` for a sentence; 'n/a' for NaN. */
export function fmt(x: number, decimals: number): string {
	if (!Number.isFinite(x)) return 'n/a';
	const t = x.toFixed(decimals);
	return /^-0\.?0*$/.test(t) ? t.slice(1) : t;
}

/** A recorded figure as an input of a step. */
export function recorded(name: string, value: number | string, unit: string): NextStepInput {
	return { name, value: typeof value === 'number' && !Number.isFinite(value) ? null : value, unit, from: 'recording' };
}

/** A site value as an input of a step (null when not given). */
export function given(name: string, value: number | undefined, unit: string): NextStepInput {
	return { name, value: value ?? null, unit, from: 'site' };
}

/** Status from what is missing: nothing computed -> needs-input; some -> partial; none -> result. */
export function statusOf(computedSomething: boolean, needs: string[]): NextStepStatus {
	if (needs.length === 0) return 'result';
	return computedSomething ? 'partial' : 'needs-input';
}

/** A step that does not apply to this recording; `finding` says why. */
export function notApplicable(step: NextStepId, title: string, finding: string, method: string[]): NextStep {
	return {
		step,
		title,
		status: 'not-applicable',
		finding,
		method,
		inputs: [],
		needs: [],
		result: null,
		conclusions: [],
		assumptions: [],
		warnings: [],
		caution: NEXT_STEP_CAUTION,
	};
}

/** Linear interpolation in a table of [x, y] points sorted by x; NaN outside it. */
export function interpolate(points: readonly (readonly [number, number])[], x: number): number {
	if (!Number.isFinite(x) || x < points[0][0] || x > points[points.length - 1][0]) return NaN;
	for (let k = 1; k < points.length; k++) {
		const [x0, y0] = points[k - 1];
		const [x1, y1] = points[k];
		if (x <= x1) return x1 === x0 ? y1 : y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
	}
	return NaN;
}
