#!/usr/bin/env node
import { availableParallelism } from 'node:os';
import { existsSync, statSync } from 'node:fs';
import { Command, InvalidArgumentError, Option } from 'commander';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { formatDiagnostic } from '../core/diagnostics/format-diagnostic.js';
import { EXIT } from './exit-codes.js';
import { registerExportCommand } from './export-command.js';
import { createLogger } from './logger.js';
import { SOFTWARE } from './software.js';

const EXIT_HELP = `
Exit codes:
  0  every run reduced
  3  reduced, but some runs were set aside (reasons in qc.arrow, diagnostics.json and the log)
  2  unusable arguments or a series-level error (nothing written)
  4  nightly/rereduce: another xsred run holds the out-root's lock
  5  nightly/rereduce: an output could not be written (disk full, permissions)
  1  internal error (a bug: please report it with the log)`;

function positiveInt(v: string): number {
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError(`expected a whole number ≥ 1, got "${v}"`);
  return n;
}

/** The tunable settings, from the same zod definitions the validator uses. */
async function settingsHelp(): Promise<string> {
  const rows = (await import('../core/config/series-schema.js')).seriesSettingRows();
  const width = Math.max(...rows.map((r) => r.key.length));
  return `Settings (keys in series.yaml; defaults in configs/defaults.json):\n${rows.map((r) => `  ${r.key.padEnd(width)}  ${r.description} [default ${r.default}${r.unit ? ` ${r.unit}` : ''}]`).join('\n')}`;
}

const levelFor = (d: Diagnostic) => (d.severity === 'error' ? 'error' : d.severity === 'warning' ? 'warn' : 'info');

async function main(argv: string[]): Promise<number> {
  // The settings table needs the schemas (zod): loaded only when help is asked for.
  const settings = argv.some((a) => a === '--help' || a === '-h' || a === 'help') ? await settingsHelp() : '';
  const program = new Command();
  let exitCode: number = EXIT.ok;
  program
    .name('xsred')
    .description('Reduce charged-particle scattering run series into absolute differential cross sections.')
    .version(SOFTWARE.version, '-V, --version')
    .showHelpAfterError('(add --help for usage, exit codes and settings)')
    .exitOverride()
    .addHelpText('after', EXIT_HELP);

  program
    .command('reduce')
    .description('reduce one run series (a folder with series.yaml, runlog.csv, spectra/, calibrations/) into <out>/<series>/')
    .argument('<series-dir>', 'the run-series folder')
    .requiredOption('-o, --out <out-dir>', 'output folder; results go to <out-dir>/<series>/')
    .addOption(new Option('-j, --jobs <n>', 'threads that read spectra: this one and n − 1 workers').argParser(positiveInt).default(availableParallelism(), 'the number of cores'))
    .option('--no-html', 'skip summary.html (tables and manifest only)')
    .addOption(new Option('--mc <n>', 'also propagate every row by Monte Carlo with n trials (JCGM 101; n >= 40): monte_carlo.arrow').argParser(positiveInt))
    .addOption(new Option('--mc-seed <s>', 'seed of the Monte Carlo streams').argParser(positiveInt).default(1))
    .option('-q, --quiet', 'log warnings and errors only')
    .addHelpText('after', () => `${EXIT_HELP}\n\n${settings}`)
    .action(async (seriesDir: string, o: { out: string; jobs: number; html: boolean; quiet?: boolean; mc?: number; mcSeed: number }) => {
      const log = await createLogger(o.quiet ? 'warn' : 'info');
      if (!existsSync(seriesDir) || !statSync(seriesDir).isDirectory()) {
        log.error(`${seriesDir}: not a folder; expected a run-series folder holding series.yaml`);
        exitCode = EXIT.usage;
        return;
      }
      const { reduceSeries } = await import('./reduce-series.js');
      const t0 = performance.now();
      if (o.mc !== undefined && o.mc < 40) {
        log.error(`--mc ${o.mc}: a 95 % coverage interval needs at least 40 trials (JCGM 101:2008 §7.2.2 asks for M >> 1/(1 − p))`);
        exitCode = EXIT.usage;
        return;
      }
      const r = await reduceSeries({ seriesDir, outDir: o.out, jobs: o.jobs, html: o.html, commandLine: ['xsred', ...argv.slice(2)], ...(o.mc !== undefined ? { monteCarlo: { trials: o.mc, seed: o.mcSeed } } : {}) });
      for (const d of r.diagnostics) log[levelFor(d)]({ diagnostic: d }, formatDiagnostic(d));
      const ms = Math.round(performance.now() - t0);
      if (r.exitCode === EXIT.usage) {
        log.error({ series_dir: seriesDir }, `series not reduced: ${r.diagnostics.filter((d) => d.severity === 'error').length} error(s) above`);
      } else {
        log.info({ series: r.series, ...r.counts, duration_ms: ms, phases_ms: r.phasesMs }, `${r.series}: ${r.counts.reduced} runs reduced, ${r.counts.setAside} set aside, ${r.counts.rows} cross-section rows in ${ms} ms`);
        process.stdout.write(`${r.outSeriesDir}\n${r.summaryPath ? `${r.summaryPath}\n` : ''}`);
      }
      exitCode = r.exitCode;
    });

  program
    .command('simulate')
    .description('write a simulated run series (and its truth table) from a simulation spec')
    .argument('<spec>', 'simulation spec (YAML)')
    .requiredOption('-o, --out <out-dir>', 'folder to write <out-dir>/<series>/ into')
    .action(async (spec: string, o: { out: string }) => {
      const { runSimulateCommand } = await import('./simulate-command.js');
      exitCode = await runSimulateCommand(spec, o.out);
    });

  program
    .command('calibrate')
    .description('fit energy calibrations from the runs of kind calibration (a mixed alpha source or elastic peaks of a known target) and write each as a new version in <series-dir>/calibrations/')
    .argument('<series-dir>', 'the run-series folder')
    .option('-n, --dry-run', 'fit and print the residual report, write no file')
    .option('-q, --quiet', 'log warnings and errors only')
    .addHelpText('after', `
Each calibration run gives calibrations/cal-<run>.yaml, valid from that run up to the run before the
next calibration run, superseding the versions that cover those runs. Existing files are never
changed. Peak search, line assignment and the fits are described in README, "Peak fitting, calibration from calibration runs, and gain drift".
Settings: calibrate.degree, calibrate.search_threshold, calibrate.match_tolerance_keV, calibrate.gain_range_rel.
Exit codes: 0 every calibration run fitted; 3 some could not be (see the log); 2 unusable series.`)
    .action(async (seriesDir: string, o: { dryRun?: boolean; quiet?: boolean }) => {
      const log = await createLogger(o.quiet ? 'warn' : 'info');
      if (!existsSync(seriesDir) || !statSync(seriesDir).isDirectory()) {
        log.error(`${seriesDir}: not a folder; expected a run-series folder holding series.yaml`);
        exitCode = EXIT.usage;
        return;
      }
      const { calibrateSeries } = await import('./calibrate-command.js');
      const r = calibrateSeries({ seriesDir, dryRun: o.dryRun ?? false });
      for (const d of r.diagnostics) log[levelFor(d)]({ diagnostic: d }, formatDiagnostic(d));
      process.stdout.write(r.report);
      exitCode = r.exitCode;
    });

  (await import('./archive-commands.js')).registerArchiveCommands(program, (code) => (exitCode = code));
  registerExportCommand(program, (code) => (exitCode = code));

  try {
    await program.parseAsync(argv);
  } catch (e) {
    const err = e as { code?: string; exitCode?: number };
    if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return EXIT.ok;
    if (typeof err.code === 'string' && err.code.startsWith('commander.')) return EXIT.usage;
    throw e;
  }
  return exitCode;
}

main(process.argv).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`xsred: internal error: ${(e as Error).stack ?? String(e)}\nPlease report this with the command line and the log.\n`);
    process.exitCode = EXIT.internal;
  },
);
