import { readFileSync } from 'node:fs';
import { formatDiagnostic } from '../core/diagnostics/format-diagnostic.js';
import { loadSimulationSpec } from '../simulate/load-simulation-spec.js';
import { simulateSeries } from '../simulate/simulate-series.js';
import { EXIT } from './exit-codes.js';

/**
 * `xsred simulate <spec.yaml> --out <dir>`: loads and validates the spec (diagnostics on stderr
 * as `file:line:col: …`), writes the series to `<outDir>/<series>/` and prints that path on
 * stdout. Returns the exit code.
 * @param specPath path of the simulation spec (YAML)
 * @param outDir folder to write the series folder into (created if missing)
 */
export async function runSimulateCommand(specPath: string, outDir: string): Promise<number> {
  let text: string;
  try {
    text = readFileSync(specPath, 'utf8');
  } catch (e) {
    process.stderr.write(`${formatDiagnostic({ severity: 'error', rule: 'spec-unreadable', stage: 'simulate', file: specPath, message: `cannot read the simulation spec: ${(e as Error).message}` })}\n`);
    return EXIT.usage;
  }
  const loaded = loadSimulationSpec(text, specPath);
  for (const d of loaded.diagnostics) process.stderr.write(`${formatDiagnostic(d)}\n`);
  if (loaded.spec === null) return EXIT.usage;
  try {
    const result = simulateSeries(loaded.spec, outDir);
    for (const d of result.diagnostics) process.stderr.write(`${formatDiagnostic({ ...d, file: specPath })}\n`);
    process.stdout.write(`${result.seriesDir}\n`);
    return EXIT.ok;
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    // File-system errors, an occupied output folder, and physics outside its validity for the
    // spec's values (RangeError, e.g. screening at too low an energy) are the user's to fix.
    const usage = err.code !== undefined || err instanceof RangeError || /not a simulated series/.test(err.message);
    process.stderr.write(`${formatDiagnostic({ severity: 'error', rule: usage ? 'simulate-output' : 'simulate-internal', stage: 'simulate', file: outDir, message: err.message })}\n`);
    return usage ? EXIT.usage : EXIT.internal;
  }
}
