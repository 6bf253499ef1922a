import { availableParallelism } from 'node:os';
import { type Command, InvalidArgumentError, Option } from 'commander';
import { EXIT } from './exit-codes.js';
import { createLogger } from './logger.js';

export const ARCHIVE_EXIT_HELP = `
Exit codes (nightly, rereduce):
  0  every series up to date
  3  some runs set aside (reasons: xsred status, qc.arrow, the log)
  2  unusable arguments, or a series could not be reduced (its previous version stays)
  4  another xsred run holds the out-root's lock (.xsred.lock): nothing done
  5  an output could not be written (disk full, permissions, read-only): nothing half-written
  1  internal error (a bug: please report it with the log)`;

const whole = (min: number) => (v: string): number => {
  const n = Number(v);
  if (!Number.isInteger(n) || n < min) throw new InvalidArgumentError(`expected a whole number ≥ ${min}, got "${v}"`);
  return n;
};
const seconds = (v: string): number => {
  const n = Number(v);
  if (!Number.isFinite(n) || n < 0) throw new InvalidArgumentError(`expected seconds ≥ 0, got "${v}"`);
  return n;
};
const collect = (v: string, prev: string[] = []) => [...prev, v];

interface ArchiveCommandOptions {
  out: string;
  series?: string[];
  settleS: number;
  keep?: number;
  jobs: number;
  html: boolean;
  quiet?: boolean;
  progress: boolean;
}

/**
 * The archive commands — nightly, rereduce, status, diff — on the program of cli.ts. Heavy
 * modules (the ledger, the reduction) load only when a command runs.
 * @param setExitCode receives the command's exit code (cli.ts returns it)
 */
export function registerArchiveCommands(program: Command, setExitCode: (code: number) => void): void {
  const archive = (name: 'nightly' | 'rereduce', description: string) =>
    program
      .command(name)
      .description(description)
      .argument('<archive-root>', 'folder holding run-series folders (each with series.yaml), searched recursively')
      .requiredOption('-o, --out <out-root>', 'output root: <out-root>/<series>/versions/, current pointers, ledger.sqlite, index.html')
      .option('-s, --series <id>', 'only this series (repeatable)', collect)
      .addOption(new Option('--settle-s <seconds>', 'files modified less than this long ago are still being written: left for the next run').argParser(seconds).default(120))
      .addOption(new Option('--keep <n>', 'keep the newest n versions of each series (and always the current and previous one)').argParser(whole(1)))
      .addOption(new Option('-j, --jobs <n>', 'threads that read spectra').argParser(whole(1)).default(availableParallelism(), 'the number of cores'))
      .option('--no-html', 'skip summary.html in each version')
      .option('--no-progress', 'no progress bar even on a terminal')
      .option('-q, --quiet', 'log warnings and errors only (the summary line is kept)')
      .addHelpText('after', ARCHIVE_EXIT_HELP)
      .action(async (archiveRoot: string, o: ArchiveCommandOptions) => {
        const log = await createLogger(o.quiet ? 'warn' : 'info');
        const { runArchive } = await import('./archive/nightly.js');
        const r = await runArchive({ archiveRoot, outRoot: o.out, command: name, series: o.series, settleS: o.settleS, keep: o.keep, jobs: o.jobs, html: o.html, commandLine: ['xsred', ...process.argv.slice(2)], log, progress: o.progress });
        if (o.quiet) process.stderr.write(`xsred ${name}: ${r.series.filter((s) => s.outcome === 'reduced').length} of ${r.series.length} series reduced, exit ${r.exitCode}, ${r.durationMs} ms\n`);
        setExitCode(r.exitCode);
      });
  archive('nightly', 'bring every series under <archive-root> up to date: only runs whose inputs changed are reduced; each changed series gets a new version');
  archive('rereduce', 'reduce every series (or --series) afresh, e.g. after revising calibrations: every spectrum is read again and a new version written');

  program
    .command('status')
    .description('per series: current version, runs reduced, set aside (and why) and pending, the latest reduction, inputs changed since')
    .argument('<out-root>', 'the output root of nightly/rereduce')
    .option('--json', 'print JSON instead of text')
    .action(async (outRoot: string, o: { json?: boolean }) => {
      const { archiveStatus, formatStatus } = await import('./archive/status.js');
      try {
        const s = archiveStatus(outRoot);
        process.stdout.write(o.json ? `${JSON.stringify(s, null, 2)}\n` : formatStatus(s));
        setExitCode(EXIT.ok);
      } catch (e) {
        process.stderr.write(`xsred status: ${(e as Error).message}\n`);
        setExitCode(EXIT.usage);
      }
    });

  program
    .command('diff')
    .description('compare cross_sections.arrow of two versions of a series row by row; writes diff.arrow and prints the largest shifts')
    .argument('<series-out>', 'a series folder of the output root: <out-root>/<series>')
    .option('--from <version>', 'old version (default: the one the current version replaced)')
    .option('--to <version>', 'new version (default: the current one)')
    .option('--out <file>', 'where to write diff.arrow (default <series-out>/diffs/<from>-<to>/diff.arrow)')
    .addOption(new Option('--limit <n>', 'rows shown in the terminal table').argParser(whole(0)).default(20))
    .option('--json', 'print the summary as JSON instead of the table')
    .addHelpText('after', '\nShift = (new − old) / √(u_old² + u_new²), u = stat ⊕ sys of each version (README, "Operating guide").')
    .action(async (seriesOut: string, o: { from?: string; to?: string; out?: string; limit: number; json?: boolean }) => {
      const [{ diffVersions }, { formatDiff }] = await Promise.all([import('./archive/diff-versions.js'), import('./archive/format-diff.js')]);
      try {
        const r = diffVersions(seriesOut, { from: o.from, to: o.to, out: o.out, top: o.limit });
        process.stdout.write(o.json ? `${JSON.stringify(r.summary, null, 2)}\n` : `${formatDiff(r.diff, r.summary, o.limit)}diff.arrow: ${r.arrowPath}\n`);
        setExitCode(EXIT.ok);
      } catch (e) {
        process.stderr.write(`xsred diff: ${(e as Error).message}\n`);
        setExitCode(EXIT.usage);
      }
    });
}
