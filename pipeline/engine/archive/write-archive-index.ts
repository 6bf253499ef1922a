import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { escapeHtml } from '../../core/text/escape-html.js';
import { writeFileAtomic } from '../atomic-write.js';
import type { ChangeSummary } from './change-summary.js';
import type { Ledger, ReductionRow } from './ledger.js';
import { readCurrent } from './version-store.js';

/** One line of the archive index: a series, its current version, its latest reduction. */
export interface ArchiveIndexEntry {
  series: string;
  current: string | null;
  /** Path of the current summary.html relative to the out-root (null when absent). */
  summaryHref: string | null;
  latest: ReductionRow;
  changes: ChangeSummary | null;
}

/** The entries of the archive index, from the ledger and the pointers. */
export function archiveIndexEntries(outRoot: string, ledger: Ledger): ArchiveIndexEntry[] {
  return ledger.seriesNames().map((series) => {
    const latest = ledger.latest(series)!;
    const current = series.startsWith('dir:') ? null : (readCurrent(join(outRoot, series))?.version ?? null);
    const href = current ? `${series}/versions/${current}/summary.html` : null;
    const reduced = ledger.lastReduced(series);
    return { series, current, summaryHref: href && existsSync(join(outRoot, href)) ? href : null, latest, changes: reduced?.changes_json ? (JSON.parse(reduced.changes_json) as ChangeSummary) : null };
  });
}

/**
 * `<out-root>/index.html`: a self-contained page listing every series with its current
 * version (linked to its summary.html), its latest reduction and the changes its current
 * version made. Kept plain on purpose; the report stage may render a richer page from
 * `archiveIndexEntries`.
 */
export function writeArchiveIndex(outRoot: string, ledger: Ledger): void {
  const rows = archiveIndexEntries(outRoot, ledger)
    .map((e) => {
      const c = e.changes;
      const changes = c ? `${c.moved} moved, ${c.relabelled} relabelled, ${c.added} added, ${c.removed} removed; ${c.beyond1Sigma} beyond 1σ, ${c.beyond3Sigma} beyond 3σ (since ${c.from ?? '—'})` : '—';
      const l = e.latest;
      const version = e.current ? (e.summaryHref ? `<a href="${escapeHtml(e.summaryHref)}">${escapeHtml(e.current)}</a>` : escapeHtml(e.current)) : '—';
      return `<tr><td>${escapeHtml(e.series)}</td><td>${version}</td><td>${escapeHtml(l.outcome)}</td><td>${escapeHtml(l.finished ?? l.started)}</td><td>${l.runs_reduced} / ${l.runs_reused} / ${l.runs_set_aside} / ${l.runs_pending}</td><td>${escapeHtml(changes)}</td><td>${escapeHtml(l.note)}</td></tr>`;
    })
    .join('\n');
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>xsred archive</title>
<style>body{font:14px system-ui,sans-serif;margin:2em}table{border-collapse:collapse}td,th{border:1px solid #ccc;padding:.3em .6em;text-align:left;vertical-align:top}th{background:#f4f4f4}</style>
</head><body>
<h1>xsred archive</h1>
<table><thead><tr><th>series</th><th>current version</th><th>latest reduction</th><th>finished</th><th>runs reduced / reused / set aside / pending</th><th>changes of the current version</th><th>note</th></tr></thead>
<tbody>
${rows}
</tbody></table>
</body></html>
`;
  writeFileAtomic(join(outRoot, 'index.html'), new TextEncoder().encode(html));
}
