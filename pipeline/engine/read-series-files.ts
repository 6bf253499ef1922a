import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import type { IngestInput } from '../../stages/ingest/index.js';
import { decodeText } from './decode-text.js';

export interface SeriesFiles {
  input: IngestInput;
  /** sha256 of every metadata file read, by path relative to the series folder. */
  hashes: Map<string, string>;
  diagnostics: Diagnostic[];
}

/** Reads a series folder's metadata files for ingest (spectra are streamed later, per run). */
export function readSeriesFiles(seriesDir: string): SeriesFiles {
  const hashes = new Map<string, string>();
  const diagnostics: Diagnostic[] = [];
  const read = (rel: string): { file: string; text: string } | null => {
    const p = join(seriesDir, rel);
    if (!existsSync(p) || !statSync(p).isFile()) return null;
    const bytes = readFileSync(p);
    hashes.set(rel, createHash('sha256').update(bytes).digest('hex'));
    const d = decodeText(bytes, rel);
    diagnostics.push(...d.diagnostics);
    return { file: rel, text: d.text };
  };
  const list = (rel: string, re: RegExp): string[] => {
    const p = join(seriesDir, rel);
    if (!existsSync(p) || !statSync(p).isDirectory()) return [];
    return readdirSync(p)
      .filter((n) => re.test(n) && !n.startsWith('.'))
      .sort();
  };
  const calibrations = list('calibrations', /\.ya?ml$/i)
    .map((n) => read(`calibrations/${n}`))
    .filter((x): x is { file: string; text: string } => x !== null);
  return {
    input: {
      seriesDir,
      seriesYaml: read('series.yaml') ?? read('series.yml'),
      runlog: read('runlog.csv'),
      scalers: read('scalers.csv'),
      calibrations,
      spectra: list('spectra', /\.csv$/i),
      readFile: read,
    },
    hashes,
    diagnostics,
  };
}
