import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';
import { parse } from 'yaml';

export interface SeriesLocation {
  /** Absolute path of the series folder. */
  dir: string;
  /** Path relative to the archive root. */
  rel: string;
  /** The `series:` id of series.yaml, or null when it cannot be read (the reduction will say why). */
  id: string | null;
}

const SERIES_ID = /^[a-z0-9-]+$/;

/** The `series:` id of a series.yaml, without validating the rest (that is ingest's job). */
export function readSeriesId(seriesDir: string): string | null {
  for (const name of ['series.yaml', 'series.yml']) {
    const p = join(seriesDir, name);
    if (!existsSync(p)) continue;
    try {
      const doc = parse(readFileSync(p, 'utf8')) as { series?: unknown } | null;
      return typeof doc?.series === 'string' && SERIES_ID.test(doc.series) ? doc.series : null;
    } catch {
      return null;
    }
  }
  return null;
}

/**
 * Every series under an archive root: a folder holding series.yaml (or series.yml). A series
 * folder is not searched further; hidden folders, `node_modules` and the out-root (when it lies
 * inside the archive) are skipped. Sorted by relative path, so nights process series in a
 * fixed order.
 * @param maxDepth folders below the root to search (default 8)
 */
export function discoverSeries(archiveRoot: string, outRoot: string, maxDepth = 8): SeriesLocation[] {
  const root = resolve(archiveRoot);
  const out = resolve(outRoot);
  const found: SeriesLocation[] = [];
  const walk = (dir: string, depth: number) => {
    if (dir === out || dir.startsWith(out + sep)) return;
    if (existsSync(join(dir, 'series.yaml')) || existsSync(join(dir, 'series.yml'))) {
      found.push({ dir, rel: relative(root, dir) || '.', id: readSeriesId(dir) });
      return;
    }
    if (depth >= maxDepth) return;
    let entries;
    try {
      entries = readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries.sort((a, b) => (a.name < b.name ? -1 : 1))) {
      if (e.isDirectory() && !e.name.startsWith('.') && e.name !== 'node_modules') walk(join(dir, e.name), depth + 1);
    }
  };
  walk(root, 0);
  return found;
}
