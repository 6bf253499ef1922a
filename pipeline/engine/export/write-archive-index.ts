import { isAbsolute, join, relative, resolve, sep } from 'node:path';
import { archiveIndexHtml } from '../../../stages/report/archive-index-html.js';
import { writeFileAtomic } from '../atomic-write.js';

export interface ArchiveIndexEntry {
  series: string;
  /** Free text: ok, failed, set-aside …; shown as given. */
  status: string;
  /** Path of the series' summary.html (absolute, or relative to outRoot); empty: no link. */
  summaryPath: string;
  version?: string;
}

/** Relative link from `outRoot` to `target`, each path segment percent-encoded (spaces, '#', '?' stay in the path). */
export function relativeHref(outRoot: string, target: string): string {
  const rel = relative(resolve(outRoot), isAbsolute(target) ? target : resolve(outRoot, target));
  return rel.split(sep).map(encodeURIComponent).join('/');
}

/** Writes <outRoot>/index.html (atomically): every series, its status and a relative link to its summary. Returns the path. */
export function writeArchiveIndex(outRoot: string, entries: readonly ArchiveIndexEntry[]): string {
  const page = archiveIndexHtml(entries.map((e) => ({ series: e.series, status: e.status, version: e.version, href: e.summaryPath ? relativeHref(outRoot, e.summaryPath) : null })));
  const path = join(outRoot, 'index.html');
  writeFileAtomic(path, new TextEncoder().encode(page));
  return path;
}
