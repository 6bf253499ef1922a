import { readFileSync } from 'node:fs';

/** Name and version from package.json (read once; the same file in source and in dist/). */
function readPackage(): { name: string; version: string } {
  for (const rel of ['../../package.json', '../../../package.json']) {
    try {
      const p = JSON.parse(readFileSync(new URL(rel, import.meta.url), 'utf8')) as { name?: string; version?: string };
      if (p.name === 'xsred' && p.version) return { name: p.name, version: p.version };
    } catch {
      /* try the next candidate */
    }
  }
  return { name: 'xsred', version: 'unknown' };
}

export const SOFTWARE = readPackage();
