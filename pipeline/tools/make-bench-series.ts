/**
 * Writes the benchmark run series (pipeline/tools/bench-spec.ts):
 *
 *   npx tsx pipeline/tools/make-bench-series.ts <out-dir>
 */
import { resolve } from 'node:path';
import { formatDiagnostic } from '../core/diagnostics/format-diagnostic.js';
import { simulateSeries } from '../simulate/simulate-series.js';
import { BENCH_SPEC } from './bench-spec.js';

const outArg = process.argv[2];
if (outArg === undefined) {
  console.error('usage: npx tsx pipeline/tools/make-bench-series.ts <out-dir>');
  process.exit(2);
}

const started = performance.now();
const result = simulateSeries(BENCH_SPEC, resolve(outArg));
for (const d of result.diagnostics) console.error(formatDiagnostic(d));
console.log(`${result.seriesDir}: ${result.truth.length} truth rows in ${((performance.now() - started) / 1000).toFixed(1)} s`);
