import type { ChangeSummary } from './change-summary.js';
import { DIFF_QUANTITIES, type DiffResult, type DiffRow } from './diff-cross-sections.js';

const label = new Map<string, string>(DIFF_QUANTITIES.map((q) => [q.id, q.label]));
const num = (v: number | null) => (v === null ? '—' : Math.abs(v) >= 1e4 || (v !== 0 && Math.abs(v) < 1e-3) ? v.toExponential(4) : v.toPrecision(5));
const sig = (v: number | null) => (v === null ? '—' : `${v >= 0 ? '+' : ''}${v.toFixed(2)}`);

function table(header: string[], rows: string[][]): string {
  const width = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => cells.map((c, i) => (i >= 5 ? c.padStart(width[i]!) : c.padEnd(width[i]!))).join('  ').trimEnd();
  return [line(header), width.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/**
 * The diff for a terminal: a summary, then the changed rows with the largest shifts (at most
 * `limit`, largest |shift| first), one line each with the quantity that moved most.
 */
export function formatDiff(diff: DiffResult, summary: ChangeSummary, limit = 20): string {
  const head = [
    `${summary.from ?? '—'} → ${summary.to ?? '—'}: ${summary.rowsFrom} → ${summary.rowsTo} rows; ${summary.moved} moved, ${summary.relabelled} relabelled, ${summary.added} added, ${summary.removed} removed, ${summary.matched - summary.moved - summary.relabelled} unchanged`,
    `shifts in combined standard uncertainties √(u_old² + u_new²): ${summary.beyond1Sigma} beyond 1σ, ${summary.beyond3Sigma} beyond 3σ` +
      (summary.largest ? `; largest ${sig(summary.largest.shiftSigma)}σ (${summary.largest.run} ${summary.largest.detector} ${summary.largest.peak}, ${label.get(summary.largest.quantity)})` : ''),
  ];
  if (diff.rows.length === 0) return `${head.join('\n')}\n`;
  const abs = (r: DiffRow) => r.maxAbsShiftSigma ?? -1;
  const shown = [...diff.rows].sort((x, y) => abs(y) - abs(x)).slice(0, limit);
  const rows = shown.map((r) => {
    const q = r.maxQuantity ?? 'cross_section_lab';
    const c = r.quantities[q];
    return [r.run, r.detector, r.peak, r.change, label.get(q)!, num(c.from), num(c.to), sig(c.shiftSigma), r.change === 'moved' || r.change === 'relabelled' ? r.changedColumns.length.toString() : ''];
  });
  const more = diff.rows.length > shown.length ? `\n(${diff.rows.length - shown.length} more in diff.arrow)` : '';
  return `${head.join('\n')}\n\n${table(['run', 'detector', 'peak', 'change', 'quantity', 'old', 'new', 'shift/σ', 'columns'], rows)}${more}\n`;
}
