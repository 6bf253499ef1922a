import { createHash } from 'node:crypto';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import { writeFileAtomic } from '../atomic-write.js';
import { EXIT } from '../exit-codes.js';
import { reduceSeries } from '../reduce-series.js';
import { SOFTWARE } from '../software.js';
import { changesSincePrevious, type ChangeSummary } from './change-summary.js';
import type { SeriesLocation } from './discover-series.js';
import { FileHashCache } from './file-hash-cache.js';
import { runInputHashes } from './input-hashes.js';
import { ioDiagnostic, isIoError } from './io-error.js';
import type { RunResultRow } from './ledger.js';
import { ledgerMeasureCache, pruneMeasureCache } from './measure-cache.js';
import type { NightContext, SeriesNightResult } from './night-context.js';
import { seriesInputFiles } from './series-input-files.js';
import { verifyVersion } from './verify-version.js';
import { buildDir, nextVersionName, publishVersion, pruneVersions, readCurrent, removeLeftovers, switchCurrent, versionDir } from './version-store.js';

const sha = (s: string) => createHash('sha256').update(s).digest('hex');
const noRuns = { total: 0, reduced: 0, reused: 0, measured: 0, setAside: 0, pending: 0 };

/**
 * One series in a nightly or rereduce run:
 *  1. list its input files; metadata younger than the settle time → the series waits (pending);
 *     a young spectrum → that run waits (set aside with a note in this version);
 *  2. hash the files (by stat through the ledger) into a fingerprint; the same fingerprint as
 *     the last reduction, whose version is still current → nothing to do (`unchanged`, no
 *     spectrum read);
 *  3. otherwise reduce into a hidden build folder, measured results of unchanged runs from the
 *     ledger, read the tables back, rename the folder to the next version (its version.json
 *     names the one it replaces), then swap the `current` link;
 *  4. record the reduction and each run's input hash and outcome in one transaction; a run is
 *     `reduced` when its input hash (own inputs and its normalizing reference runs) differs from
 *     the last reduction's, `reused` otherwise.
 * A crash at any point leaves the previous version current and the ledger at its last commit.
 */
export async function reduceSeriesNight(ctx: NightContext, loc: SeriesLocation, series: string): Promise<SeriesNightResult> {
  const t0 = performance.now();
  const started = ctx.now();
  const seriesOut = join(ctx.outRoot, series);
  const base = { series, seriesDir: loc.dir, changes: null };
  const done = (r: Omit<SeriesNightResult, 'series' | 'seriesDir' | 'durationMs' | 'changes'> & { changes?: SeriesNightResult['changes'] }): SeriesNightResult => ({ ...base, ...r, durationMs: Math.round(performance.now() - t0) });

  // 1. settle time
  const files = seriesInputFiles(loc.dir);
  const young = (mtimeMs: number) => started.getTime() - mtimeMs < ctx.settleS * 1000;
  const youngMeta = files.filter((f) => f.run === undefined && young(f.mtimeMs));
  const record = (fields: Parameters<typeof ctx.ledger.finishReduction>[1], runs: Omit<RunResultRow, 'reduction_id'>[] = []) => {
    const id = ctx.ledger.startReduction({ session: ctx.session, command: ctx.command, series, series_dir: loc.dir, started: started.toISOString(), pid: process.pid, software_version: SOFTWARE.version });
    ctx.ledger.finishReduction(id, { finished: ctx.now().toISOString(), ...fields }, runs);
  };
  if (youngMeta.length > 0) {
    const note = `${youngMeta.map((f) => f.rel).join(', ')} modified less than ${ctx.settleS} s ago (still being written?): series left for the next run`;
    record({ outcome: 'pending', note, exit_code: EXIT.ok });
    return done({ outcome: 'pending', exitCode: EXIT.ok, version: readCurrent(seriesOut)?.version ?? null, runs: noRuns, rows: 0, note, diagnostics: [] });
  }
  const heldBack = new Map<string, Diagnostic>();
  for (const f of files) {
    if (f.run === undefined || !young(f.mtimeMs)) continue;
    const ageS = Math.max(0, (started.getTime() - f.mtimeMs) / 1000);
    heldBack.set(f.run, { severity: 'warning', rule: 'spectrum-settling', stage: 'engine', file: f.rel, run: f.run, message: `${f.rel} was modified ${ageS.toFixed(0)} s ago, less than the settle time of ${ctx.settleS} s: still being written? Run left for the next night`, hint: 'lower --settle-s if files are complete when they appear' });
  }

  // 2. fingerprint
  const hashes = new FileHashCache(ctx.ledger, !ctx.force);
  const fileSha = new Map<string, string>();
  for (const f of files) if (!(f.run !== undefined && heldBack.has(f.run))) fileSha.set(f.rel, hashes.hash(f.abs));
  hashes.flush();
  const fingerprint = sha([`software ${SOFTWARE.version}`, ...files.map((f) => `${f.rel} ${fileSha.get(f.rel) ?? 'pending'}`)].join('\n'));
  const configHash = fileSha.get('series.yaml') ?? fileSha.get('series.yml') ?? '';
  const left = removeLeftovers(seriesOut);
  if (left.length > 0) ctx.log.info({ series, removed: left }, `${series}: removed ${left.length} unfinished folder(s) left by an interrupted run`);
  const current = readCurrent(seriesOut);
  const last = ctx.ledger.lastSettled(series);
  if (!ctx.force && last && last.fingerprint === fingerprint && last.config_hash === configHash) {
    const stands = last.outcome === 'series-error' || (last.version !== null && current?.version === last.version && existsSync(versionDir(seriesOut, last.version)));
    if (stands) {
      const runs = { total: last.runs_total, reduced: 0, reused: last.runs_reduced + last.runs_reused, measured: 0, setAside: last.runs_set_aside, pending: last.runs_pending };
      const note = last.outcome === 'series-error' ? 'inputs unchanged since the last attempt, which failed (see its diagnostics)' : 'inputs unchanged: nothing to reduce';
      record({ outcome: 'unchanged', fingerprint, config_hash: configHash, version: last.version, exit_code: last.outcome === 'series-error' ? EXIT.usage : EXIT.ok, runs_total: runs.total, runs_reused: runs.reused, runs_set_aside: runs.setAside, runs_pending: runs.pending, rows: last.rows, note });
      return done({ outcome: 'unchanged', exitCode: last.outcome === 'series-error' ? EXIT.usage : EXIT.ok, version: last.version, runs, rows: last.rows, note, diagnostics: [] });
    }
  }

  // 3. reduce into a new version
  const id = ctx.ledger.startReduction({ session: ctx.session, command: ctx.command, series, series_dir: loc.dir, started: started.toISOString(), pid: process.pid, software_version: SOFTWARE.version });
  const version = nextVersionName(seriesOut);
  let build: string | null = null;
  try {
    build = buildDir(seriesOut, version);
    const cache = ledgerMeasureCache(ctx.ledger, hashes, series, id);
    const measureCache = ctx.force ? { lookup: () => undefined, store: cache.store } : cache;
    const previous = current && existsSync(join(versionDir(seriesOut, current.version), 'cross_sections.arrow')) ? current.version : null;
    const previousIpc = previous ? readFileSync(join(versionDir(seriesOut, previous), 'cross_sections.arrow')) : null;
    // The diff is made once, from the new table's bytes, when the page is written (or below with --no-html).
    let changes: ChangeSummary | null | undefined;
    const diffWithPrevious = (ipc: Uint8Array) => (changes = previous ? changesSincePrevious({ version: previous, crossSectionsIpc: previousIpc! }, { version, table: arrow.tableFromIPC(ipc) }) : null);
    ctx.progress.start(series, 0);
    const r = await reduceSeries({ seriesDir: loc.dir, outDir: ctx.outRoot, outSeriesDir: build, jobs: ctx.jobs, html: ctx.html, commandLine: ctx.commandLine, measureCache, holdBack: heldBack, onProgress: (d, t) => ctx.progress.update(d, t), changes: diffWithPrevious });
    ctx.progress.stop();
    if (r.detail === undefined || r.exitCode === EXIT.usage) {
      rmSync(build, { recursive: true, force: true });
      const errors = r.diagnostics.filter((d) => d.severity === 'error');
      const note = `series not reduced: ${errors.length} error(s); the current version (${current?.version ?? 'none'}) stays`;
      ctx.ledger.finishReduction(id, { finished: ctx.now().toISOString(), outcome: 'series-error', exit_code: EXIT.usage, fingerprint, config_hash: configHash, version: current?.version ?? null, note, diagnostics_json: JSON.stringify(errors) });
      return done({ outcome: 'series-error', exitCode: EXIT.usage, version: current?.version ?? null, runs: noRuns, rows: 0, note, diagnostics: r.diagnostics });
    }
    verifyVersion(build, r.counts.rows, ctx.html);
    const summary: ChangeSummary | null = (changes as ChangeSummary | null | undefined) ?? diffWithPrevious(readFileSync(join(build, 'cross_sections.arrow')));
    writeFileAtomic(join(build, 'changes.json'), new TextEncoder().encode(`${JSON.stringify(summary, null, 2)}\n`));
    publishVersion(seriesOut, build, version, previous, ctx.now());
    build = null;
    switchCurrent(seriesOut, version);

    // 4. ledger
    const detail = r.detail;
    const runHashes = runInputHashes(detail, configHash, SOFTWARE.version, new Set(heldBack.keys()), fileSha);
    const before = ctx.ledger.lastReduced(series);
    const prior = new Map((before ? ctx.ledger.runResults(before.id) : []).filter((x) => x.outcome === 'reduced' || x.outcome === 'reused').map((x) => [x.run, x.input_hash]));
    const runRows: Omit<RunResultRow, 'reduction_id'>[] = detail.series.runs.map((run) => {
      const h = runHashes.get(run.run)!;
      const aside = detail.setAside.get(run.run);
      const outcome: RunResultRow['outcome'] = heldBack.has(run.run)
        ? 'pending'
        : aside
          ? 'set-aside'
          : run.kind === 'calibration' || run.kind === 'background'
            ? 'not-reduced'
            : ctx.force || prior.get(run.run) !== h.input
              ? 'reduced'
              : 'reused';
      return { series, run: run.run, kind: run.kind, input_hash: h.input, own_hash: h.own, calibration_version: h.calibrationVersion, reference_runs: h.referenceRuns.join('+'), outcome, diagnostics_json: JSON.stringify(aside ?? []) };
    });
    const count = (o: RunResultRow['outcome']) => runRows.filter((x) => x.outcome === o).length;
    const runs = { total: runRows.length, reduced: count('reduced'), reused: count('reused'), measured: detail.measuredRuns.length, setAside: count('set-aside'), pending: count('pending') };
    const exitCode = runs.setAside > 0 ? EXIT.someSetAside : EXIT.ok;
    const note = `${version}: ${runs.reduced} runs reduced, ${runs.reused} reused, ${runs.measured} spectra read`;
    ctx.ledger.finishReduction(
      id,
      {
        finished: ctx.now().toISOString(), outcome: 'reduced', exit_code: exitCode, fingerprint, config_hash: configHash, version, previous_version: previous,
        runs_total: runs.total, runs_reduced: runs.reduced, runs_reused: runs.reused, runs_measured: runs.measured, runs_set_aside: runs.setAside, runs_pending: runs.pending,
        rows: r.counts.rows, note, diagnostics_json: JSON.stringify(r.diagnostics.filter((d) => d.severity === 'error')), changes_json: summary ? JSON.stringify(summary) : null,
      },
      runRows,
    );
    pruneMeasureCache(ctx.ledger, series, id);
    if (ctx.keep !== undefined) {
      const removed = pruneVersions(seriesOut, ctx.keep, [version, previous]);
      if (removed.length > 0) ctx.log.info({ series, removed }, `${series}: pruned ${removed.length} old version(s) (--keep ${ctx.keep})`);
    }
    return done({ outcome: 'reduced', exitCode, version, runs, rows: r.counts.rows, note, diagnostics: r.diagnostics, changes: summary });
  } catch (e) {
    ctx.progress.stop();
    if (build !== null) {
      try {
        rmSync(build, { recursive: true, force: true });
      } catch {
        /* removed by the next run (removeLeftovers) */
      }
    }
    const io = isIoError(e);
    const d = io ? ioDiagnostic(e, `${series}: the new version could not be written`, seriesOut) : { severity: 'error' as const, rule: 'internal-error', stage: 'engine' as const, message: `${series}: internal error: ${(e as Error).stack ?? String(e)}` };
    try {
      ctx.ledger.finishReduction(id, { finished: ctx.now().toISOString(), outcome: io ? 'io-error' : 'failed', exit_code: io ? EXIT.outputFailed : EXIT.internal, fingerprint, note: d.message, diagnostics_json: JSON.stringify([d]) });
    } catch {
      /* the ledger's own storage failed too: its last commit stands */
    }
    const stays = readCurrent(seriesOut)?.version ?? null;
    return done({ outcome: io ? 'io-error' : 'failed', exitCode: io ? EXIT.outputFailed : EXIT.internal, version: stays, runs: noRuns, rows: 0, note: d.message, diagnostics: [d] });
  }
}

