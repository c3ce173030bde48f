/** Help text the entry file adds to cac's: examples per common task and the safety caution. */

export const SAFETY_CAUTION =
	'Safety: sinecheck analyses recorded data only. Measuring live mains must follow your local electrical-safety rules ' +
	'(e.g. EN 50110, NFPA 70E): instruments and probes rated for the measurement category (CAT II/III/IV) and voltage, ' +
	'isolated or high-voltage differential probes for line voltages, and never a scope floated by defeating its protective earth.';

export const ANALYSE_EXAMPLES: string[] = [
	'# figures of one capture, as a table',
	'sinecheck analyse board.csv',
	'# every capture in a folder (walked; COMTRADE .cfg with its .dat), one JSON line per file',
	'sinecheck analyse surveys/ --json > reports.jsonl',
	'# one row per channel per file for a spreadsheet',
	'sinecheck analyse logger-week/ --csv > summary.csv',
	'# supply voltage harmonics against EN 50160 (exit code 1 when a limit is exceeded)',
	'sinecheck analyse feeder.wav --limits en50160',
	'# the same on single DFT bins instead of the harmonic subgroups the standard uses',
	'sinecheck analyse feeder.wav --limits en50160 --single-bins',
	'# load currents against IEEE 519 with ISC/IL = 35 and maximum demand current 120 A',
	'sinecheck analyse drive.cfg --limits ieee519 --isc-il 35 --il 120 --nominal 400',
	'# raw probe voltages: x100 probe on U1, clamp giving 10 mV per A on I1, file without a time column at 10 kS/s',
	'sinecheck analyse scope.csv --probe U1=x100 --clamp I1=10 --rate 10000',
	'# phase of every channel against I1, on 12-cycle windows of a 60 Hz supply',
	'sinecheck analyse motor.csv --ref I1 --window 12 --nominal-hz 60',
	'# pair U2 with I3 for power when the labels do not say so',
	'sinecheck analyse board.csv --pair U2=I3',
	'# next steps: capacitor bank to reach PF 0.95 and its resonance with a 630 kVA, 6 % transformer; the meter check',
	'sinecheck analyse board.csv --target-pf 0.95 --transformer-kva 630 --transformer-z-pct 6 --meter-crest 3 --meter-bandwidth-hz 1000',
];

export const TREND_EXAMPLES: string[] = [
	'# a week of logger files: 10/12-cycle RMS rows as CSV, dips and swells on stderr',
	'sinecheck trend logger/week1.csv --nominal 230 > week1-trend.csv',
	'# 10-minute aggregates with a 85 % dip threshold, as JSON',
	'sinecheck trend incomer.cfg --interval 10-min --dip-percent 85 --json',
	'# flicker: Pst per 10 minutes and Plt per 2 hours per voltage channel, flagged around dips',
	'sinecheck trend logger/week1.csv --nominal 230 --interval flicker > week1-flicker.csv',
	'# a folder of hourly files of one recording: read in start-time order as one, gaps reported (a note says so)',
	'sinecheck trend logger/week2/ --nominal 230 --interval 10-min > week2-10min.csv',
	'# the same files, one set of rows per file',
	'sinecheck trend logger/week2/ --each-file --nominal 230 --interval 10-min > week2-per-file.csv',
];

export const EXIT_CODES =
	'Exit codes: 0 analysed and within limits; 1 analysed but a limit failed; 2 bad input or usage ' +
	'(the message names file, line and column; a bad file in a folder does not stop the others).';

/** Wraps text at `width` columns with an indent (help reads better than one 300-character line). */
export function wrap(text: string, width = 100, indent = '  '): string {
	const words = text.split(/\s+/);
	const lines: string[] = [];
	let line = '';
	for (const w of words) {
		if (line && line.length + 1 + w.length > width - indent.length) {
			lines.push(indent + line);
			line = w;
		} else line = line ? `${line} ${w}` : w;
	}
	if (line) lines.push(indent + line);
	return lines.join('\n');
}
