import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import { Ledger, ledgerPath, type ReductionRow } from './ledger.js';
import { seriesInputFiles } from './series-input-files.js';
import { listVersions, readCurrent } from './version-store.js';

export interface SeriesStatus {
  series: string;
  seriesDir: string;
  current: string | null;
  versions: number;
  latest: Pick<ReductionRow, 'id' | 'command' | 'outcome' | 'started' | 'finished' | 'note' | 'exit_code'>;
  /** Runs of the current version by outcome (reduced and reused both count as reduced). */
  runs: { reduced: number; setAside: number; pending: number; notReduced: number };
  setAside: { run: string; reason: string }[];
  pending: { run: string; reason: string }[];
  /** Errors of the latest reduction when it failed (series-level errors, unwritable output). */
  errors: Diagnostic[];
  /** Input files new or modified since they were last hashed (null: series folder gone). */
  inputsChanged: number | null;
}

const reasonOf = (json: string) => {
  const ds = JSON.parse(json) as Diagnostic[];
  const d = ds[0];
  return d ? `${d.file ? `${d.file}${d.line ? `:${d.line}` : ''}: ` : ''}${d.message}` : '';
};

/**
 * `xsred status <out-root>`: per series what the current version holds (runs reduced, set
 * aside and why, pending), the latest reduction, and whether inputs changed since (read-only:
 * opens the ledger read-only and only stats the input files).
 */
export function archiveStatus(outRoot: string): SeriesStatus[] {
  if (!existsSync(ledgerPath(outRoot))) throw new Error(`${ledgerPath(outRoot)}: no ledger (run xsred nightly <archive-root> --out ${outRoot} first)`);
  const ledger = new Ledger(outRoot, { readonly: true });
  try {
    const known = ledger.db.prepare('SELECT size, mtime_ns, ino FROM file_hashes WHERE path = ?');
    return ledger.seriesNames().map((series) => {
      const latest = ledger.latest(series)!;
      const reduced = ledger.lastReduced(series);
      const results = reduced ? ledger.runResults(reduced.id) : [];
      const of = (o: string) => results.filter((r) => r.outcome === o);
      let inputsChanged: number | null = null;
      if (existsSync(latest.series_dir)) {
        inputsChanged = 0;
        for (const f of seriesInputFiles(latest.series_dir)) {
          const st = statSync(f.abs, { bigint: true });
          const k = known.get(f.abs) as { size: number; mtime_ns: string; ino: string } | undefined;
          if (!k || k.size !== Number(st.size) || k.mtime_ns !== String(st.mtimeNs) || k.ino !== String(st.ino)) inputsChanged++;
        }
      }
      const failed = latest.outcome === 'series-error' || latest.outcome === 'io-error' || latest.outcome === 'failed';
      const seriesOut = join(outRoot, series);
      return {
        series,
        seriesDir: latest.series_dir,
        current: readCurrent(seriesOut)?.version ?? null,
        versions: listVersions(seriesOut).length,
        latest: { id: latest.id, command: latest.command, outcome: latest.outcome, started: latest.started, finished: latest.finished, note: latest.note, exit_code: latest.exit_code },
        runs: { reduced: of('reduced').length + of('reused').length, setAside: of('set-aside').length, pending: of('pending').length, notReduced: of('not-reduced').length },
        setAside: of('set-aside').map((r) => ({ run: r.run, reason: reasonOf(r.diagnostics_json) })),
        pending: of('pending').map((r) => ({ run: r.run, reason: reasonOf(r.diagnostics_json) })),
        errors: failed ? (JSON.parse(latest.diagnostics_json) as Diagnostic[]) : [],
        inputsChanged,
      };
    });
  } finally {
    ledger.close();
  }
}

/** The status as text for a terminal. */
export function formatStatus(all: readonly SeriesStatus[]): string {
  if (all.length === 0) return 'no series in the ledger yet\n';
  return all
    .map((s) => {
      const lines = [
        `${s.series}  (${s.seriesDir})`,
        `  current version: ${s.current ?? 'none'} of ${s.versions}; latest ${s.latest.command} ${s.latest.finished ?? s.latest.started}: ${s.latest.outcome} — ${s.latest.note}`,
        `  runs: ${s.runs.reduced} reduced, ${s.runs.setAside} set aside, ${s.runs.pending} pending, ${s.runs.notReduced} not reduced (calibration/background)`,
        ...s.setAside.map((r) => `    set aside ${r.run}: ${r.reason}`),
        ...s.pending.map((r) => `    pending ${r.run}: ${r.reason}`),
        ...s.errors.map((d) => `    error: ${d.file ? `${d.file}: ` : ''}${d.message}`),
      ];
      if (s.inputsChanged === null) lines.push('  series folder not found');
      else if (s.inputsChanged > 0) lines.push(`  ${s.inputsChanged} input file(s) new or modified since the last run: pending for the next nightly`);
      return lines.join('\n');
    })
    .join('\n\n')
    .concat('\n');
}
