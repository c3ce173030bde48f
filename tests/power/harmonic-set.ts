/**
 * Test helper: a HarmonicSet built straight from closed-form components, so tests of lib/power and
 * lib/polyphase do not depend on lib/spectrum. Phases are given with the SINE reference used by
 * tests/helpers/synth.ts (x = √2·rms·sin(hωt + φ)) and stored with the set's COSINE reference (φ − 90°).
 */
import type { HarmonicSet } from '../../lib/spectrum/types.js';

export interface SineTone {
	order: number;
	rms: number;
	/** Phase, sine reference, degrees. */
	phaseDeg?: number;
}

export function setFromSineTones(
	tones: SineTone[],
	opts: { fundamentalHz?: number; maxOrder?: number; dc?: number } = {},
): HarmonicSet {
	const maxOrder = opts.maxOrder ?? Math.max(1, ...tones.map((t) => t.order));
	const orders = Array.from({ length: maxOrder + 1 }, (_, h) => ({ order: h, rms: 0, phaseDeg: NaN }));
	if (opts.dc) orders[0] = { order: 0, rms: Math.abs(opts.dc), phaseDeg: opts.dc > 0 ? 0 : 180 };
	for (const t of tones) {
		let ph = (t.phaseDeg ?? 0) - 90;
		ph = ((((ph + 180) % 360) + 360) % 360) - 180;
		if (ph === -180) ph = 180;
		orders[t.order] = { order: t.order, rms: t.rms, phaseDeg: ph };
	}
	return { fundamentalHz: opts.fundamentalHz ?? 50, startS: 0, cycles: 10, orders };
}
