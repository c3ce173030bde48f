/**
 * The measurement basis each limit table's standard judges harmonics on, named in every output.
 *
 * EN 50160 and IEC 61000-2-2 take their values from IEC 61000-4-30 class A measurement, which uses the
 * harmonic subgroups of IEC 61000-4-7 over 10/12-cycle windows (a harmonic bin with its two neighbours, so
 * a harmonic whose frequency wanders by a few hertz is still counted whole). IEEE 519-2014 clause 4 asks
 * for measurement per IEC 61000-4-7 and IEC 61000-4-30 on the same 10/12-cycle windows; the report uses
 * the same subgroups there. Single DFT bins (each order's own 5 Hz bin) only when asked for.
 * Ref: IEC 61000-4-30:2015, 5.8 (class A harmonics: subgroups per IEC 61000-4-7); IEC 61000-4-7:2002+A1:2008,
 * 3.2 (harmonic subgroup); IEEE 519-2014, 4.1 (from memory).
 */
import type { ReportLimitTableId } from './types.js';

export type ReportHarmonicBasis = 'standard' | 'single-bins';

export interface ReportLimitBasis {
	kind: 'harmonic-subgroups' | 'single-bins' | 'short-record-fit';
	/** The basis in words, with the standard that sets it. */
	text: string;
}

const SUBGROUPS = 'harmonic subgroups of 10/12-cycle windows';

const BASIS: Record<ReportLimitTableId, ReportLimitBasis> = {
	en50160: { kind: 'harmonic-subgroups', text: `${SUBGROUPS} (IEC 61000-4-30 class A with IEC 61000-4-7)` },
	'iec61000-2-2': { kind: 'harmonic-subgroups', text: `${SUBGROUPS} (IEC 61000-4-30 class A with IEC 61000-4-7)` },
	ieee519: {
		kind: 'harmonic-subgroups',
		text: `${SUBGROUPS} (IEEE 519-2014 clause 4: measured per IEC 61000-4-7 and IEC 61000-4-30)`,
	},
};

/** The basis for a table: the standard's own, or single DFT bins when asked for. */
export function limitBasis(table: ReportLimitTableId, basis: ReportHarmonicBasis): ReportLimitBasis {
	if (basis === 'single-bins')
		return {
			kind: 'single-bins',
			text: "single DFT bins of 10/12-cycle windows (as asked; not the basis the table's standard uses)",
		};
	return BASIS[table];
}

/**
 * The basis on a short record (under two whole cycles): the fitted harmonics, with neither 10/12-cycle
 * windows nor subgroups to judge on; said so, since the tables' standards assume them.
 */
export const SHORT_RECORD_BASIS: ReportLimitBasis = {
	kind: 'short-record-fit',
	text: "harmonics fitted over a short record (no 10/12-cycle windows or subgroups as the table's standard assumes: an indication only)",
};
