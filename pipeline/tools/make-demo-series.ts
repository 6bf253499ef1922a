/**
 * Regenerates the demo run series in sample-runs/ from pipeline/simulate/specs/demo.yaml:
 *
 *   npx tsx pipeline/tools/make-demo-series.ts [out-dir]      (default: sample-runs)
 *
 * Deterministic: the same spec gives the same bytes, so a diff after running it shows only
 * what a change to the simulator or the spec did.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { formatDiagnostic } from '../core/diagnostics/format-diagnostic.js';
import { loadSimulationSpec } from '../simulate/load-simulation-spec.js';
import { simulateSeries } from '../simulate/simulate-series.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const specPath = join(root, 'pipeline', 'simulate', 'specs', 'demo.yaml');
const outDir = resolve(process.argv[2] ?? join(root, 'sample-runs'));

const loaded = loadSimulationSpec(readFileSync(specPath, 'utf8'), specPath);
for (const d of loaded.diagnostics) console.error(formatDiagnostic(d));
if (loaded.spec === null) process.exit(2);
const started = performance.now();
const result = simulateSeries(loaded.spec, outDir);
const elapsedMs = performance.now() - started;
for (const d of result.diagnostics) console.error(formatDiagnostic(d));

const sizeOf = (dir: string): { files: number; bytes: number } =>
  readdirSync(dir, { withFileTypes: true }).reduce((acc, e) => {
    if (e.isDirectory()) {
      const sub = sizeOf(join(dir, e.name));
      return { files: acc.files + sub.files, bytes: acc.bytes + sub.bytes };
    }
    return { files: acc.files + 1, bytes: acc.bytes + statSync(join(dir, e.name)).size };
  }, { files: 0, bytes: 0 });
const size = sizeOf(result.seriesDir);
console.log(`${result.seriesDir}: ${size.files} files, ${(size.bytes / 1024).toFixed(0)} KiB, ${result.truth.length} truth rows, ${elapsedMs.toFixed(0)} ms`);
