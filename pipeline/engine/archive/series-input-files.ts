import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export interface InputFile {
  /** Path relative to the series folder, `/`-separated. */
  rel: string;
  abs: string;
  mtimeMs: number;
  /** For a spectrum: the run it belongs to (file name without `.csv`). */
  run?: string;
}

/**
 * The files a reduction of the series reads — the same selection as the engine's reader
 * (read-series-files.ts): series.yaml (or .yml), runlog.csv, scalers.csv, calibrations/*.yaml|yml
 * and spectra/*.csv, hidden files left out. Sorted by path.
 */
export function seriesInputFiles(seriesDir: string): InputFile[] {
  const out: InputFile[] = [];
  const add = (rel: string, run?: string) => {
    const abs = join(seriesDir, rel);
    if (!existsSync(abs)) return;
    const st = statSync(abs);
    if (st.isFile()) out.push({ rel, abs, mtimeMs: st.mtimeMs, ...(run === undefined ? {} : { run }) });
  };
  add(existsSync(join(seriesDir, 'series.yaml')) ? 'series.yaml' : 'series.yml');
  add('runlog.csv');
  add('scalers.csv');
  const list = (dir: string, re: RegExp) => {
    const p = join(seriesDir, dir);
    return existsSync(p) && statSync(p).isDirectory() ? readdirSync(p).filter((n) => re.test(n) && !n.startsWith('.')).sort() : [];
  };
  for (const n of list('calibrations', /\.ya?ml$/i)) add(`calibrations/${n}`);
  for (const n of list('spectra', /\.csv$/i)) add(`spectra/${n}`, n.replace(/\.csv$/i, ''));
  return out.sort((a, b) => (a.rel < b.rel ? -1 : a.rel > b.rel ? 1 : 0));
}
