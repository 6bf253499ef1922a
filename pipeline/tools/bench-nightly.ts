/**
 * Benchmark of a no-change night: `xsred nightly` over the 1,000-run design-target series
 * (1,000 runs × 16 detectors × 4,096 channels, bench-spec.ts, generated once into the temp
 * folder) after a first night has reduced it. Each night is a fresh process, wall time with
 * start-up; the ledger must show zero runs reduced and zero spectra read, or this fails.
 *
 * `npm run bench` runs it and puts its two table rows in the README; alone:
 *
 *   npm run bench:nightly
 */
import { spawnSync } from 'node:child_process';
import { cpus, tmpdir } from 'node:os';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { simulateSeries } from '../simulate/simulate-series.js';
import { BENCH_SPEC } from './bench-spec.js';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const cli = join(root, 'dist/pipeline/engine/cli.js');
const work = join(tmpdir(), 'xsred-bench');
const series = join(work, BENCH_SPEC.series);
const out = join(work, 'out-nightly');

if (!existsSync(join(series, 'runlog.csv'))) {
  mkdirSync(work, { recursive: true });
  simulateSeries(BENCH_SPEC, work);
}
rmSync(out, { recursive: true, force: true });

function night(): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [cli, 'nightly', series, '--out', out, '--settle-s', '0', '--no-html', '-q'], { encoding: 'utf8' });
  const s = (performance.now() - t0) / 1000;
  if (r.status !== 0 && r.status !== 3) throw new Error(`nightly failed (${r.status}): ${r.stderr}`);
  return s;
}

const firstS = night();
const times: number[] = [];
for (let i = 0; i < 5; i++) times.push(night());
const db = new Database(join(out, 'ledger.sqlite'), { readonly: true });
const rows = db.prepare('SELECT outcome, runs_reduced, runs_measured, runs_reused FROM reductions ORDER BY id').all() as { outcome: string; runs_reduced: number; runs_measured: number; runs_reused: number }[];
db.close();
const quiet = rows.slice(1);
if (rows[0]?.outcome !== 'reduced' || quiet.length !== 5 || quiet.some((r) => r.outcome !== 'unchanged' || r.runs_reduced !== 0 || r.runs_measured !== 0)) {
  throw new Error(`a no-change night did reduction work: ${JSON.stringify(rows)}`);
}
const median = [...times].sort((a, b) => a - b)[2]!;
console.log(`Measured on ${cpus()[0]?.model ?? 'unknown CPU'}, ${cpus().length} cores, Node ${process.version}, ${new Date().toISOString().slice(0, 10)}.`);
console.log(`| \`xsred nightly\`, first night over the 1,000-run series (everything reduced, tables only) | ${firstS.toFixed(2)} s |`);
console.log(`| \`xsred nightly\`, a no-change night over the same series (ledger: 0 runs reduced, 0 spectra read, ${quiet[0]!.runs_reused} reused) | ${median.toFixed(2)} s wall, start-up included (median of 5) |`);
