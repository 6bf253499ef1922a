import { Option, type Command } from 'commander';
import { formatDiagnostic } from '../core/diagnostics/format-diagnostic.js';

/**
 * `xsred export <out>/<series> --format csv|parquet|arrow|json [--combined] [--frame lab|cm] [--out FILE]`:
 * a reduction's table for collaborators, with its data dictionary beside it. The work is in
 * export/run-export.ts (loaded only when the command runs); the exit code goes to `setExitCode`
 * (default: process.exitCode).
 */
export function registerExportCommand(program: Command, setExitCode: (code: number) => void = (code) => (process.exitCode = code)): void {
  program
    .command('export')
    .description('write a reduction\'s cross sections as CSV, Parquet, Arrow or JSON, with a data dictionary (<file>.dictionary.json and .md) beside it')
    .argument('<series-dir>', '<out>/<series> written by xsred reduce, or an archive series folder (current → versions/<V>/)')
    .addOption(new Option('-f, --format <format>', 'output format').choices(['csv', 'parquet', 'arrow', 'json']).makeOptionMandatory())
    .option('--combined', 'export combined.arrow (per-point combined uncertainties) instead of cross_sections.arrow')
    .addOption(new Option('--frame <frame>', 'keep only this frame\'s cross-section columns (default: both)').choices(['lab', 'cm']))
    .option('-o, --out <file>', 'output file (default: <series>-<table>[-<frame>].<ext> in the working folder)')
    .action(async (seriesDir: string, o: { format: 'csv' | 'parquet' | 'arrow' | 'json'; combined?: boolean; frame?: 'lab' | 'cm'; out?: string }) => {
      const { runExport } = await import('./export/run-export.js');
      const r = await runExport({ seriesDir, format: o.format, combined: o.combined === true, frame: o.frame, out: o.out });
      for (const d of r.diagnostics) process.stderr.write(`${formatDiagnostic(d)}\n`);
      if (r.written.length) process.stdout.write(`${r.written.join('\n')}\n`);
      setExitCode(r.exitCode);
    });
}
