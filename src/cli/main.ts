#!/usr/bin/env node
// Entry of the sinecheck command: wiring only. Commands return exit codes; this file sets them.
import { cac, type Command } from 'cac';
import { fsErrorWords } from './file-checks.js';
import { ANALYSE_EXAMPLES, EXIT_CODES, SAFETY_CAUTION, TREND_EXAMPLES, wrap } from './help-text.js';
import { printable } from './printable.js';
import { UsageError } from './usage-error.js';

// A stack asked for with SINECHECK_DEBUG names the modules (dist/src/cli/...) through the bundle's source maps.
if (process.env.SINECHECK_DEBUG) process.setSourceMapsEnabled(true);

const cli = cac('sinecheck');

/**
 * The channel settings `analyse` and `trend` both take, in this order in their help (applied to any format by
 * lib/io/import-settings.ts).
 */
function withChannelSettings(command: Command): Command {
	return command
		.option('--rate <Hz>', 'Sample rate, for files without a time column or rate in their header')
		.option(
			'--scale <channel=factor>',
			'Multiply a channel by a factor (probe ratio, CT ratio, A per V of a clamp); repeatable',
			{ type: [String] },
		)
		.option(
			'--probe <channel=ratio>',
			"A voltage probe's attenuation on a channel (x10, x100): multiplies it and makes it a voltage; repeatable",
			{ type: [String] },
		)
		.option(
			'--clamp <channel=mV/A>',
			"A current clamp's output on a channel in mV per A: divides by it and makes it a current in A; repeatable",
			{ type: [String] },
		)
		.option('--unit <channel=unit>', 'Set the unit of a channel (V, mV, kV, A, mA, kA); repeatable', { type: [String] })
		.option('--quantity <channel=kind>', 'Say what a channel measures: voltage, current or other; repeatable', {
			type: [String],
		});
}

/** Paths after `--` are paths even when they start with a dash (cac keeps them under options['--']). */
function withAfterDashes(paths: string[], options: Record<string, unknown>): string[] {
	const rest = options['--'];
	return Array.isArray(rest) ? [...paths, ...rest.map(String)] : paths;
}

// Output closed early (`sinecheck analyse dir | head`): stop quietly, as a command in a pipe should.
for (const stream of [process.stdout, process.stderr]) {
	stream.on('error', (e: NodeJS.ErrnoException) => {
		if (e.code === 'EPIPE') process.exit(typeof process.exitCode === 'number' ? process.exitCode : 0);
		throw e;
	});
}

withChannelSettings(
	cli
		.command(
			'analyse [...paths]',
			'Analyse capture files and folders (CSV, WAV, COMTRADE): RMS, harmonics, THD, phase, power, three-phase, limits',
		)
		.alias('analyze')
		.option(
			'--json',
			'One JSON report per file on stdout, one line each (JSON Lines); schema: lib/report/report.schema.json',
		)
		.option('--csv', 'One summary row per channel per file, for spreadsheets')
		.option(
			'--limits <table>',
			'Evaluate harmonics against a limit table: en50160, iec61000-2-2, ieee519 (sets exit code 1 on a failure)',
		)
		.option(
			'--isc-il <ratio>',
			'IEEE 519: short-circuit to maximum demand load current ratio at the point of common coupling',
		)
		.option('--il <A>', 'IEEE 519: maximum demand load current I_L in A (for TDD)')
		.option(
			'--single-bins',
			"Judge limits on each order's single DFT bin instead of the harmonic subgroups the tables' standards use",
		)
		.option(
			'--declared <V>',
			'Declared supply voltage for dips, swells and interruptions, V (line-to-neutral for phase channels); inferred when absent',
		)
		.option(
			'--ieee519-edition <year>',
			'IEEE 519 even-harmonic current rule: 2022 (default; 50 % of the odd limit up to h6) or 2014 (25 %)',
		)
		.option(
			'--ref <channel>',
			'Reference channel for frequency, window and phase (default: the first voltage channel)',
		),
)
	.option('--delimiter <which>', 'CSV column separator when detection guesses wrong: comma, semicolon, tab or space')
	.option('--decimal <mark>', 'CSV decimal mark: point or comma (e.g. 0,707)')
	.option('--time-column <n>', 'CSV column (from 1) holding the time, or none')
	.option('--time-unit <unit>', 'Unit of the CSV time column: s, ms, us, ns, or index (a sample number; give --rate)')
	.option(
		'--gaps',
		'CSV: read cells that are not numbers (e.g. OVL) as gaps instead of refusing the file; they are listed, and the figures come from the longest stretch without gaps',
	)
	.option('--secondary', 'COMTRADE: report secondary values (what the recorder saw) instead of primary')
	.option(
		'--pair <voltage=current>',
		'Pair a voltage and a current channel for power (replaces pairing by phase label); repeatable',
		{ type: [String] },
	)
	.option('--window <cycles>', 'Harmonic window length in cycles (default 10 at 50 Hz, 12 at 60 Hz)')
	.option(
		'--nominal <V>',
		'Nominal system voltage in V, line-to-line (e.g. 400 for 230/400 V): chooses the IEEE 519 row; default from the measured voltage',
	)
	.option('--nominal-hz <Hz>', 'Nominal frequency, 50 or 60 (default: from the file, else the nearer one)')
	.option('--max-order <n>', 'Highest harmonic order reported (default 50)')
	.option(
		'--next-steps',
		'Show the next steps (capacitor bank, transformer, neutral, motors, meter) in the table; with --csv, their rows instead of the channel summary',
	)
	.option('--target-pf <pf>', 'Next steps: displacement power factor wanted after correction (e.g. 0.95)')
	.option('--supply-ssc-kva <kVA>', 'Next steps: short-circuit power at the board, kVA (for the capacitor resonance)')
	.option('--transformer-kva <kVA>', 'Next steps: rating of the transformer feeding the board, kVA')
	.option(
		'--transformer-z-pct <pct>',
		'Next steps: transformer impedance, % (Ssc = kVA / z when --supply-ssc-kva is not given)',
	)
	.option(
		'--transformer-pec-pu <pu>',
		'Next steps: transformer winding eddy-current loss, per unit of its I²R loss (from its test report)',
	)
	.option('--meter-crest <cf>', "Next steps: the meter's rated crest factor at full scale")
	.option('--meter-bandwidth-hz <Hz>', "Next steps: the meter's bandwidth, Hz")
	.option('--meter-range-v <V>', 'Next steps: full scale of the voltage range used on the meter')
	.option('--meter-range-a <A>', 'Next steps: full scale of the current range used on the meter')
	.option(
		'--meter-response <kind>',
		'Next steps: how the meter responds: true-rms or average (average-responding, calibrated on a sine)',
	)
	.option('--whole-record', 'Time-domain figures over every sample instead of whole cycles')
	.option(
		'--jobs <n>',
		'Files analysed at once, each in a helper process (default: one per core, up to 8; 0 = in this process, without the time and memory limits)',
	)
	.option('--time-limit <s>', 'Give up on a file after this many seconds (default: 60 s plus 1 s per MiB of the file)')
	.option(
		'--memory-limit <MiB>',
		'Memory one file may use for its analysis, MiB (default: up to half the machine shared among the workers)',
	)
	.option('--quiet', 'With --json/--csv: do not repeat the assumptions on stderr')
	.option('--no-progress', 'No progress bar (it is drawn only when stderr is a terminal anyway)')
	.action(async (paths: string[], options: Record<string, unknown>) => {
		// Command modules load on use: with worker threads the signal library loads in the workers only.
		const { analyseCommand } = await import('./analyse-command.js');
		process.exitCode = await analyseCommand(withAfterDashes(paths, options), options);
	});

withChannelSettings(
	cli
		.command(
			'trend [...paths]',
			'Per-cycle RMS trends (10/12-cycle, 150/180-cycle, 10-min) and dips, swells, interruptions of long recordings; folders are walked',
		)
		.usage('trend [...paths]  (recording files or folders; folders are walked for .csv .tsv .txt .wav .cfg .cff)')
		.option('--json', 'One JSON document per recording instead of CSV rows (an array when there are several)')
		.option(
			'--interval <which>',
			'Rows in the CSV: 10/12-cycle (default, also 200ms), 150/180-cycle (3s), 10-min (10min), or flicker (Pst per 10 min and Plt per 2 h per voltage channel)',
		)
		.option('--nominal <V>', 'Declared voltage Udin in V (line-to-neutral when the channels are); inferred when absent')
		.option('--frequency <Hz>', 'Nominal frequency, 50 or 60; from the file or the first cycles when absent')
		.option('--dip-percent <pct>', 'Dip threshold, % of the declared voltage')
		.option('--swell-percent <pct>', 'Swell threshold, % of the declared voltage')
		.option('--interruption-percent <pct>', 'Interruption threshold, % of the declared voltage')
		.option('--hysteresis-percent <pct>', 'Hysteresis, % of the declared voltage')
		.option('--no-thd', 'Skip the harmonic analysis (THD columns empty; faster)')
		.option('--harmonics', 'Also every harmonic order 2-50 per channel, % of the fundamental'),
)
	.option('--time-limit <s>', 'Give up on a file after this many seconds (default: 60 s plus 1 s per MiB of the file)')
	.option('--memory-limit <MiB>', 'Memory one file may use for its analysis, MiB (default: up to half the machine)')
	.option(
		'--one-recording',
		'The files and folders given are one recording cut into many files, even when they do not look it: read as one, gaps and overlaps between the files reported (files of one recording, with the same sample rate and channels and start times that follow on, are read as one without it)',
	)
	.option('--each-file', 'Each file is its own recording, with its own rows, even when the files make one recording')
	.option(
		'--threads <n>',
		'1, or 2 to share the analysis of a recording with a second thread (default 2 on a machine with 2 or more cores; the figures are the same)',
	)
	.action(async (given: string[], options: Record<string, unknown>) => {
		// the helper process that does the work starts first (trend/prestart.ts)
		const helper = (await import('./trend/prestart.js')).prestartTrendHelper(options.memoryLimit, options.threads);
		const { limitsFrom, settingsFromOptions } = await import('./options.js');
		const files = withAfterDashes(given, options);
		const settings = settingsFromOptions({
			rate: options.rate,
			scale: options.scale,
			probe: options.probe,
			clamp: options.clamp,
			unit: options.unit,
			quantity: options.quantity,
		}).import;
		const { importOptionsFrom } = await import('./import-settings.js');
		const { trendCommand } = await import('./trend/index.js');
		const open = importOptionsFrom(settings);
		const limits = limitsFrom(options.timeLimit, options.memoryLimit);
		process.exitCode = await trendCommand(files, {
			json: options.json === true,
			interval: options.interval === undefined ? undefined : String(options.interval),
			nominal: options.nominal as number | string | undefined,
			frequency: options.frequency as number | string | undefined,
			dipPercent: options.dipPercent as number | string | undefined,
			swellPercent: options.swellPercent as number | string | undefined,
			interruptionPercent: options.interruptionPercent as number | string | undefined,
			hysteresisPercent: options.hysteresisPercent as number | string | undefined,
			thd: options.thd !== false,
			harmonics: options.harmonics === true,
			oneRecording: options.oneRecording === true,
			eachFile: options.eachFile === true,
			threads: options.threads as string | undefined,
			helper,
			open,
			timeLimitS: limits.timeLimitS,
			memoryLimitMiB: limits.heapMiB,
		});
	});

cli
	.command(
		'survey [...paths]',
		'Voltage-characteristics survey of one recording over many files (EN 50160, IEC 61000-2-2): every rule, the dip table, verdicts; also merges trend --json outputs',
	)
	.usage('survey [...paths]  (recording files or folders of one recording, or JSON files written by trend --json)')
	.option('--standard <which>', 'en50160 (default) or iec61000-2-2')
	.option(
		'--nominal <V>',
		'Declared supply voltage Un in V (line-to-neutral when the channels are); inferred when absent',
	)
	.option('--frequency <Hz>', 'Nominal frequency, 50 or 60; from the file or the first cycles when absent')
	.option('--json', 'The survey as one JSON document')
	.option('--csv', 'The survey as CSV: one row per rule (every harmonic order) and per dip/swell table cell')
	.option('--rate <Hz>', 'Sample rate, for files without a time column or rate in their header')
	.option(
		'--threads <n>',
		'1, or 2 to share the analysis of the recording with a second thread (default 2 on a machine with 2 or more cores; the figures are the same)',
	)
	.action(async (paths: string[], options: Record<string, unknown>) => {
		const { settingsFromOptions } = await import('./options.js');
		const { importOptionsFrom } = await import('./import-settings.js');
		const { surveyCommand } = await import('./survey/index.js');
		const open = importOptionsFrom(settingsFromOptions({ rate: options.rate }).import);
		process.exitCode = await surveyCommand(paths, {
			standard: options.standard === undefined ? undefined : String(options.standard),
			nominal: options.nominal as number | string | undefined,
			frequency: options.frequency as number | string | undefined,
			json: options.json === true,
			csv: options.csv === true,
			threads: options.threads as string | undefined,
			open,
		});
	});

cli.help((sections) => {
	// cac gives a negated option (--no-progress, --no-thd) the default true and prints "(default: true)"
	// after it, which reads as if the option were on by default: that text is left out.
	for (const section of sections) {
		if (section.title === 'Options')
			section.body = section.body.replace(/^(\s+--no-\S+.*?)\s*\(default: true\)$/gm, '$1');
	}
	const examples = [...ANALYSE_EXAMPLES, ...TREND_EXAMPLES]
		.map((l) => (l.startsWith('#') ? `  ${l}` : `  $ ${l}`))
		.join('\n');
	sections.push({ title: 'Examples', body: examples });
	sections.push({ body: wrap(EXIT_CODES, 100, '') });
	sections.push({ body: wrap(SAFETY_CAUTION, 100, '') });
	return sections;
});
cli.version('0.1.0');

/**
 * cac (7.1.0) tells its parser (mri) which options are flags by their camelCase names (eachFile), while the
 * command line spells them in kebab case (--each-file): mri then took the word after such a flag as its
 * value, so `sinecheck trend --each-file a.csv` lost a.csv. Flags of more than one word are handed on in
 * the spelling the parser knows as a flag; nothing after `--` is touched (those are paths).
 */
function flagsAsParsed(argv: string[]): string[] {
	const flags = new Set<string>();
	for (const command of [cli.globalCommand, ...cli.commands])
		for (const o of command.options) if (o.isBoolean && !o.negated) for (const n of o.names) flags.add(n);
	const end = argv.indexOf('--');
	return argv.map((a, i) => {
		if ((end >= 0 && i > end) || !/^--[a-z]+(-[a-z]+)+$/.test(a)) return a;
		const camel = a.slice(2).replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
		return flags.has(camel) ? `--${camel}` : a;
	});
}

async function main(): Promise<number> {
	try {
		cli.parse(flagsAsParsed(process.argv), { run: false });
		if (cli.options.help || cli.options.version) return 0;
		if (!cli.matchedCommand) {
			if (cli.args.length > 0)
				throw new UsageError(`unknown command ${JSON.stringify(cli.args[0])}; try sinecheck --help`);
			cli.outputHelp();
			return 2;
		}
		await cli.runMatchedCommand();
		return typeof process.exitCode === 'number' ? process.exitCode : 0;
	} catch (e) {
		if (e instanceof UsageError || (e instanceof Error && e.name === 'CACError')) {
			process.stderr.write(`${printable(`sinecheck: ${e.message}`)}\n`);
			return 2;
		}
		const code = (e as NodeJS.ErrnoException)?.code;
		const why =
			typeof code === 'string' && /^E[A-Z]+$/.test(code)
				? fsErrorWords(code)
				: 'a fault in sinecheck: please report it with the command line; SINECHECK_DEBUG=1 shows the detail';
		process.stderr.write(`sinecheck: stopped by an unexpected error (${why})\n`);
		if (process.env.SINECHECK_DEBUG) process.stderr.write(`${e instanceof Error ? e.stack : String(e)}\n`);
		return 2;
	}
}

process.exitCode = await main();
