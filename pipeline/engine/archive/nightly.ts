import { existsSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Logger } from 'pino';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import { formatDiagnostic } from '../../core/diagnostics/format-diagnostic.js';
import { ingest } from '../../../stages/ingest/index.js';
import { EXIT } from '../exit-codes.js';
import { readSeriesFiles } from '../read-series-files.js';
import { SOFTWARE } from '../software.js';
import { discoverSeries, type SeriesLocation } from './discover-series.js';
import { ioDiagnostic, isIoError } from './io-error.js';
import { Ledger } from './ledger.js';
import { acquireLock } from './lock.js';
import type { NightContext, SeriesNightResult } from './night-context.js';
import { createProgress } from './progress.js';
import { reduceSeriesNight } from './reduce-series-night.js';
import { removeTempFiles } from './version-store.js';
import { writeArchiveIndex } from './write-archive-index.js';

export interface ArchiveOptions {
  archiveRoot: string;
  outRoot: string;
  command: 'nightly' | 'rereduce';
  /** Only these series ids (default: every series found). */
  series?: string[];
  settleS: number;
  keep?: number;
  jobs: number;
  html: boolean;
  commandLine: string[];
  log: Logger;
  /** A progress bar when stderr is a terminal (default true). */
  progress?: boolean;
}

export interface ArchiveSummary {
  exitCode: number;
  series: SeriesNightResult[];
  durationMs: number;
}

const levelFor = (d: Diagnostic) => (d.severity === 'error' ? 'error' : d.severity === 'warning' ? 'warn' : 'info');

/**
 * Exit code of a night: the worst of its series, in the order internal error (1) > output not
 * written (5) > series-level error (2) > runs set aside (3) > 0.
 */
export function nightExitCode(codes: readonly number[]): number {
  for (const c of [EXIT.internal, EXIT.outputFailed, EXIT.usage, EXIT.someSetAside]) if (codes.includes(c)) return c;
  return EXIT.ok;
}

/**
 * `xsred nightly` and `xsred rereduce`: under the out-root's lock, every series under the
 * archive root is brought up to date (nightly: only what changed; rereduce: everything),
 * one new version per changed series, recorded in the ledger; then the archive index and
 * one summary log line.
 */
export async function runArchive(o: ArchiveOptions): Promise<ArchiveSummary> {
  const t0 = performance.now();
  const log = o.log;
  const outRoot = resolve(o.outRoot);
  const finish = (exitCode: number, series: SeriesNightResult[] = []) => ({ exitCode, series, durationMs: Math.round(performance.now() - t0) });
  if (!existsSync(o.archiveRoot) || !statSync(o.archiveRoot).isDirectory()) {
    log.error(`${o.archiveRoot}: not a folder; expected an archive root holding run-series folders (each with series.yaml)`);
    return finish(EXIT.usage);
  }
  let lock;
  try {
    lock = acquireLock(outRoot, `xsred ${o.command}`);
  } catch (e) {
    if (!isIoError(e)) throw e;
    const d = ioDiagnostic(e, 'cannot create the out-root lock', outRoot);
    log.error({ diagnostic: d }, formatDiagnostic(d));
    return finish(EXIT.outputFailed);
  }
  if (!lock.ok) {
    log.error({ lock: lock.path, holder: lock.holder }, lock.message);
    return finish(EXIT.locked);
  }
  const release = lock.release;
  const onSignal = (signal: NodeJS.Signals) => {
    release();
    process.exit(signal === 'SIGINT' ? 130 : 143);
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  let ledger: Ledger | null = null;
  try {
    if (lock.takenOver) log.warn({ lock: lock.path, stale: lock.takenOver }, `took over a stale lock of process ${lock.takenOver.pid} (${lock.takenOver.command}, since ${lock.takenOver.started}), which is no longer running`);
    try {
      ledger = new Ledger(outRoot);
    } catch (e) {
      if (!isIoError(e)) throw e;
      const d = ioDiagnostic(e, 'cannot open the ledger', outRoot);
      log.error({ diagnostic: d }, formatDiagnostic(d));
      return finish(EXIT.outputFailed);
    }
    const started = new Date();
    removeTempFiles(outRoot);
    const interrupted = ledger.markInterrupted(started.toISOString());
    if (interrupted > 0) log.warn(`${interrupted} reduction(s) of an earlier run were interrupted; their series are reduced again`);
    let found = discoverSeries(o.archiveRoot, outRoot);
    if (o.series && o.series.length > 0) {
      const unknown = o.series.filter((s) => !found.some((f) => f.id === s));
      if (unknown.length > 0) {
        log.error(`--series ${unknown.join(', ')}: not found under ${o.archiveRoot} (found: ${found.map((f) => f.id ?? f.rel).join(', ') || 'none'})`);
        return finish(EXIT.usage);
      }
      found = found.filter((f) => f.id !== null && o.series!.includes(f.id));
    }
    const ctx: NightContext = {
      ledger, outRoot, session: `${started.toISOString()}-${process.pid}`, command: o.command, force: o.command === 'rereduce', settleS: o.settleS, keep: o.keep,
      jobs: o.jobs, html: o.html, commandLine: o.commandLine, log, progress: await createProgress(o.progress ?? true), now: () => new Date(),
    };
    const results: SeriesNightResult[] = [];
    const owner = new Map<string, SeriesLocation>();
    for (const loc of found) {
      const clash = loc.id !== null ? owner.get(loc.id) : undefined;
      const r = loc.id === null || clash ? unusableSeries(ctx, loc, clash) : await reduceSeriesNight(ctx, loc, loc.id);
      if (loc.id !== null && !clash) owner.set(loc.id, loc);
      results.push(r);
      for (const d of r.diagnostics) if (d.severity !== 'info') log[levelFor(d)]({ series: r.series, diagnostic: d }, formatDiagnostic(d));
      log.info({ series: r.series, outcome: r.outcome, version: r.version, runs: r.runs, rows: r.rows, changes: r.changes, duration_ms: r.durationMs }, `${r.series}: ${r.outcome}; ${r.note}`);
    }
    const codes = results.map((r) => r.exitCode);
    try {
      writeArchiveIndex(outRoot, ledger);
    } catch (e) {
      if (!isIoError(e)) throw e;
      const d = ioDiagnostic(e, 'index.html not written', outRoot);
      log.error({ diagnostic: d }, formatDiagnostic(d));
      codes.push(EXIT.outputFailed);
    }
    const sum = (f: (r: SeriesNightResult) => number) => results.reduce((s, r) => s + f(r), 0);
    const by = (outcome: string) => results.filter((r) => r.outcome === outcome).length;
    const failed = results.filter((r) => r.outcome === 'series-error' || r.outcome === 'io-error' || r.outcome === 'failed').length;
    const summary = finish(nightExitCode(codes), results);
    const counts = {
      series: results.length, series_reduced: by('reduced'), series_unchanged: by('unchanged'), series_pending: by('pending'), series_failed: failed,
      runs_reduced: sum((r) => r.runs.reduced), runs_reused: sum((r) => r.runs.reused), runs_measured: sum((r) => r.runs.measured),
      runs_skipped: sum((r) => r.runs.pending), runs_set_aside: sum((r) => r.runs.setAside),
    };
    log.info(
      { command: o.command, software: SOFTWARE.version, ...counts, exit_code: summary.exitCode, duration_ms: summary.durationMs },
      `${o.command}: ${counts.series_reduced} of ${counts.series} series reduced (${counts.series_unchanged} unchanged, ${counts.series_pending} pending, ${counts.series_failed} failed); runs: ${counts.runs_reduced} reduced, ${counts.runs_reused} reused, ${counts.runs_skipped} skipped (still being written), ${counts.runs_set_aside} set aside; ${summary.durationMs} ms`,
    );
    return summary;
  } finally {
    process.removeListener('SIGINT', onSignal);
    process.removeListener('SIGTERM', onSignal);
    ledger?.close();
    release();
  }
}

/** A folder whose series.yaml gives no usable id, or whose id another folder already uses. */
function unusableSeries(ctx: NightContext, loc: SeriesLocation, clash: SeriesLocation | undefined): SeriesNightResult {
  const series = clash ? loc.id! : `dir:${loc.rel}`;
  let diagnostics: Diagnostic[];
  if (clash) {
    diagnostics = [{ severity: 'error', rule: 'series-id-duplicate', stage: 'engine', file: `${loc.rel}/series.yaml`, message: `series id "${loc.id}" is already used by ${clash.rel}; outputs would collide`, hint: 'give each series folder its own series: id' }];
  } else {
    const files = readSeriesFiles(loc.dir);
    const ing = ingest(files.input);
    diagnostics = [...files.diagnostics, ...(ing.ok ? ing.series.diagnostics : ing.diagnostics)].filter((d) => d.severity === 'error').map((d) => ({ ...d, file: d.file ? `${loc.rel}/${d.file}` : loc.rel }));
    if (diagnostics.length === 0) diagnostics = [{ severity: 'error', rule: 'series-id-unreadable', stage: 'engine', file: `${loc.rel}/series.yaml`, message: 'series.yaml gives no series id matching [a-z0-9-]+' }];
  }
  const now = ctx.now().toISOString();
  const note = `not reduced: ${diagnostics[0]!.message}`;
  const id = ctx.ledger.startReduction({ session: ctx.session, command: ctx.command, series, series_dir: loc.dir, started: now, pid: process.pid, software_version: SOFTWARE.version });
  ctx.ledger.finishReduction(id, { finished: now, outcome: 'series-error', exit_code: EXIT.usage, note, diagnostics_json: JSON.stringify(diagnostics) });
  return { series, seriesDir: loc.dir, outcome: 'series-error', exitCode: EXIT.usage, version: null, runs: { total: 0, reduced: 0, reused: 0, measured: 0, setAside: 0, pending: 0 }, rows: 0, note, diagnostics, changes: null, durationMs: 0 };
}
