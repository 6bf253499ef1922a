/**
 * `npm run bench`: the speed and memory figures the README quotes.
 *
 *  1. the byte-level spectrum parser on one core (bench-spectrum-parse);
 *  2. `xsred reduce` of the design-target series (1,000 runs × 16 detectors × 4,096 channels,
 *     generated once into the temp folder) as a user runs it: a fresh process, wall time
 *     including start-up, median of several runs, with 2 worker threads and with 1;
 *  3. peak memory (max RSS, worker threads included) for the first 250 and all 1,000 runs,
 *     to show it does not grow with the number of runs;
 *  4. `xsred nightly` over the same series: the first night, and a no-change night
 *     (bench-nightly, a child process; it fails if a no-change night does reduction work).
 *
 *   npm run bench [-- --write-readme]
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { cpus, tmpdir } from 'node:os';
import { copyFileSync, existsSync, mkdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { simulateSeries } from '../simulate/simulate-series.js';
import { BENCH_SPEC } from './bench-spec.js';
import { replaceBetween } from './schema-files.js';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const cli = join(root, 'dist/pipeline/engine/cli.js');
const work = join(tmpdir(), 'xsred-bench');
const full = join(work, BENCH_SPEC.series);

function ensureSeries(): void {
  if (existsSync(join(full, 'runlog.csv'))) return;
  mkdirSync(work, { recursive: true });
  const t0 = performance.now();
  simulateSeries(BENCH_SPEC, work);
  console.log(`generated ${full} in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
}

/** The first n runs of the full series (spectra linked, not copied). */
function subset(n: number): string {
  const dir = join(work, `first-${n}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(join(dir, 'spectra'), { recursive: true });
  mkdirSync(join(dir, 'calibrations'));
  const lines = readFileSync(join(full, 'runlog.csv'), 'utf8').trimEnd().split('\n');
  const kept = lines.slice(1, n + 1);
  writeFileSync(join(dir, 'runlog.csv'), `${[lines[0], ...kept].join('\n')}\n`);
  const runs = new Set(kept.map((l) => l.split(',')[0]));
  for (const f of ['series.yaml', 'scalers.csv']) copyFileSync(join(full, f), join(dir, f));
  for (const f of readdirSync(join(full, 'calibrations'))) {
    const text = readFileSync(join(full, 'calibrations', f), 'utf8');
    const from = /valid_from_run: (\S+)/.exec(text)?.[1];
    if (from === undefined || runs.has(from)) writeFileSync(join(dir, 'calibrations', f), text.replace(/valid_to_run: (\S+)\n/, (m, r: string) => (runs.has(r) ? m : '')));
  }
  for (const r of runs) symlinkSync(join(full, 'spectra', `${r}.csv`), join(dir, 'spectra', `${r}.csv`));
  return dir;
}

function timeReduce(series: string, args: string[], repeats: number): { medianS: number; all: number[] } {
  const out = join(work, 'out');
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [cli, 'reduce', series, '--out', out, '-q', ...args], { encoding: 'utf8' });
    times.push((performance.now() - t0) / 1000);
    if (r.status !== 0 && r.status !== 3) throw new Error(`reduce failed (${r.status}): ${r.stderr}`);
  }
  const sorted = [...times].sort((a, b) => a - b);
  return { medianS: sorted[Math.floor(sorted.length / 2)]!, all: times };
}

function maxRssMiB(series: string, jobs: number): number {
  const script = `import(${JSON.stringify(join(root, 'dist/pipeline/engine/reduce-series.js'))}).then(async (m) => {
    await m.reduceSeries({ seriesDir: ${JSON.stringify(series)}, outDir: ${JSON.stringify(join(work, 'out-mem'))}, jobs: ${jobs}, html: false, commandLine: [] });
    process.stdout.write(String(process.resourceUsage().maxRSS));
  });`;
  const kb = Number(execFileSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8' }));
  return kb / 1024;
}

ensureSeries();
const parse = execFileSync(process.execPath, [join(root, 'dist/pipeline/tools/bench-spectrum-parse.js')], { encoding: 'utf8' }).trim();
console.log(parse);
const sizeMB = Number(execFileSync('du', ['-sbL', full], { encoding: 'utf8' }).split('\t')[0]) / 1e6;
// Interleaved, so a slow patch of the machine does not favour one setting.
const oneTimes: number[] = [];
const twoTimes: number[] = [];
for (let i = 0; i < 5; i++) {
  oneTimes.push(...timeReduce(full, ['--jobs', '1', '--no-html'], 1).all);
  twoTimes.push(...timeReduce(full, ['--jobs', '2', '--no-html'], 1).all);
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const one = { medianS: median(oneTimes) };
const two = { medianS: median(twoTimes) };
const html = timeReduce(full, ['--jobs', '1'], 3);
const pageMB = statSync(join(work, 'out', BENCH_SPEC.series, 'summary.html')).size / 1e6;
const small = subset(250);
const rss250 = maxRssMiB(small, 1);
const rss1000 = maxRssMiB(full, 1);
// bench-nightly prints its figures as table rows ("| what | figure |"); they join the table as they are.
const nightly = execFileSync(process.execPath, [join(root, 'dist/pipeline/tools/bench-nightly.js')], { encoding: 'utf8' })
  .split('\n')
  .filter((l) => l.startsWith('| '));
if (nightly.length === 0) throw new Error('bench-nightly printed no figures');
const machine = `${cpus()[0]?.model ?? 'unknown CPU'}, ${cpus().length} cores, Node ${process.version}`;
const table = [
  `Measured by \`npm run bench\` on ${machine}, ${new Date().toISOString().slice(0, 10)}.`,
  '',
  '| what | figure |',
  '|---|---|',
  `| spectrum parser, one core | ${/(\d+) MB\/s/.exec(parse)?.[1] ?? '?'} MB/s |`,
  `| \`xsred reduce\`, 1,000 runs × 16 detectors × 4,096 channels (${sizeMB.toFixed(0)} MB of CSV), in one thread (\`--jobs 1\`), tables only (\`--no-html\`) | ${one.medianS.toFixed(2)} s wall, start-up included (median of 5) |`,
  `| the same with the main thread and one worker (\`--jobs 2\`, the default on 2 cores) | ${two.medianS.toFixed(2)} s (median of 5, interleaved with the line above) |`,
  `| the same with summary.html (charts as inline SVG, one thread) | ${html.medianS.toFixed(2)} s (median of 3; the page is ${pageMB.toFixed(1)} MB) |`,
  `| peak memory (max RSS, threads included), first 250 runs / all 1,000 runs | ${rss250.toFixed(0)} MiB / ${rss1000.toFixed(0)} MiB |`,
  ...nightly,
  '',
].join('\n');
console.log(`\n${table}`);
if (process.argv.includes('--write-readme')) {
  const p = join(root, 'README.md');
  writeFileSync(p, replaceBetween(readFileSync(p, 'utf8'), 'bench', `${table}`));
  console.log('README performance table written');
}
