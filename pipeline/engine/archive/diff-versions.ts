import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';
import { buildTable, tableToIpcFile } from '../../core/tables/arrow-table.js';
import { writeFileAtomic } from '../atomic-write.js';
import { SOFTWARE } from '../software.js';
import { summarizeDiff, type ChangeSummary } from './change-summary.js';
import { DIFF_COLUMNS } from './diff-columns.js';
import { diffCrossSections, type DiffResult } from './diff-cross-sections.js';
import { listVersions, readCurrent, versionDir } from './version-store.js';

export interface DiffVersionsResult {
  from: string;
  to: string;
  diff: DiffResult;
  summary: ChangeSummary;
  /** Where diff.arrow was written (null when not asked to write). */
  arrowPath: string | null;
}

/**
 * Which two versions to compare: `to` defaults to the current one, `from` to the version the
 * current one replaced (from the pointer) or else the newest version older than `to`.
 * Throws an Error whose message says what is missing.
 */
export function resolveVersions(seriesOut: string, from?: string, to?: string): { from: string; to: string } {
  const all = listVersions(seriesOut);
  if (all.length === 0) throw new Error(`${seriesOut}: no versions (expected ${join(seriesOut, 'versions', 'v000001')}, written by xsred nightly)`);
  const current = readCurrent(seriesOut);
  const t = to ?? current?.version ?? all.at(-1)!;
  const f = from ?? (to === undefined && current?.previous && all.includes(current.previous) ? current.previous : all.filter((v) => v < t).at(-1));
  for (const v of [t, f]) if (v === undefined || !all.includes(v)) throw new Error(`${seriesOut}: no version ${v ?? 'older than ' + t} to compare; versions: ${all.join(', ')}`);
  return { from: f!, to: t };
}

/** Arrow table of a diff (units and descriptions in the field metadata). */
export function diffTable(diff: DiffResult, series: string, from: string, to: string): arrow.Table {
  return buildTable(DIFF_COLUMNS, diff.rows, { table: `changes of cross_sections.arrow from ${from} to ${to}`, extra: { 'xsred.series': series, 'xsred.version': SOFTWARE.version, 'xsred.diff.from': from, 'xsred.diff.to': to } });
}

/**
 * `xsred diff`: compares cross_sections.arrow of two versions of a series and, unless
 * `out` is null, writes diff.arrow (default `<series-out>/diffs/<from>-<to>/diff.arrow`).
 */
export function diffVersions(seriesOut: string, opts: { from?: string; to?: string; out?: string | null; top?: number } = {}): DiffVersionsResult {
  const { from, to } = resolveVersions(seriesOut, opts.from, opts.to);
  const read = (v: string) => {
    const p = join(versionDir(seriesOut, v), 'cross_sections.arrow');
    if (!existsSync(p)) throw new Error(`${p}: missing`);
    return arrow.tableFromIPC(readFileSync(p));
  };
  const a = read(from);
  const b = read(to);
  const diff = diffCrossSections(a, b);
  const summary = summarizeDiff(diff, from, to, opts.top ?? 10);
  let arrowPath: string | null = null;
  if (opts.out !== null) {
    arrowPath = opts.out ?? join(seriesOut, 'diffs', `${from}-${to}`, 'diff.arrow');
    const series = b.schema.metadata.get('xsred.series') ?? '';
    writeFileAtomic(arrowPath, tableToIpcFile(diffTable(diff, series, from, to)));
  }
  return { from, to, diff, summary, arrowPath };
}
