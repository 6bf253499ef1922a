import { existsSync, readFileSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import * as arrow from 'apache-arrow';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import { writeFileAtomic } from '../atomic-write.js';
import { EXIT } from '../exit-codes.js';
import { dataDictionary, dictionaryMarkdown } from './data-dictionary.js';
import { resolveReductionDir } from './resolve-reduction-dir.js';
import { selectFrame, type Frame } from './select-frame.js';
import { tableToCsv } from './table-to-csv.js';
import { tableToJson } from './table-to-json.js';
import { tableToParquet } from './table-to-parquet.js';

export const EXPORT_FORMATS = ['csv', 'parquet', 'arrow', 'json'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export interface ExportOptions {
  /** `<out>/<series>` of xsred reduce, or an archive series folder with a `current` link. */
  seriesDir: string;
  format: ExportFormat;
  combined: boolean;
  frame?: Frame;
  /** Output file; default `<series>-<table>[-<frame>].<ext>` in the working folder. */
  out?: string;
}

export interface ExportResult {
  exitCode: number;
  diagnostics: Diagnostic[];
  /** The data file and its two dictionary files (JSON, Markdown). */
  written: string[];
}

const EXT: Record<ExportFormat, string> = { csv: 'csv', parquet: 'parquet', arrow: 'arrow', json: 'json' };
const MISSING: Record<ExportFormat, string> = {
  csv: 'empty field',
  json: 'null',
  parquet: 'null (Parquet null)',
  arrow: 'null (Arrow validity bitmap)',
};

/**
 * `xsred export`: one table of a reduction (cross_sections.arrow, or combined.arrow with
 * --combined) as CSV, Parquet, Arrow or JSON, optionally one frame's cross sections only, with
 * its data dictionary beside it as `<file>.dictionary.json` and `<file>.dictionary.md`.
 */
export async function runExport(o: ExportOptions): Promise<ExportResult> {
  const where = resolveReductionDir(o.seriesDir);
  if ('diagnostic' in where) return { exitCode: EXIT.usage, diagnostics: [where.diagnostic], written: [] };
  const name = o.combined ? 'combined.arrow' : 'cross_sections.arrow';
  const source = join(where.dir, name);
  if (!existsSync(source)) {
    return {
      exitCode: EXIT.usage,
      written: [],
      diagnostics: [{
        severity: 'error', stage: 'report', rule: 'export-no-combined-table', file: source,
        message: `${source} does not exist: this reduction has no combined table`,
        expected: 'combined.arrow (written by the reductions that combine statistical and systematic uncertainties per point)',
        hint: 'drop --combined to export cross_sections.arrow, or reduce again with a version of xsred that writes combined.arrow',
      }],
    };
  }
  const table = selectFrame(arrow.tableFromIPC(readFileSync(source)), o.frame);
  const series = table.schema.metadata.get('xsred.series') ?? basename(resolve(o.seriesDir));
  const out = resolve(o.out ?? `${series}-${name.replace(/\.arrow$/, '')}${o.frame ? `-${o.frame}` : ''}.${EXT[o.format]}`);
  const bytes =
    o.format === 'csv' ? new TextEncoder().encode(tableToCsv(table))
    : o.format === 'json' ? new TextEncoder().encode(tableToJson(table))
    : o.format === 'parquet' ? await tableToParquet(table)
    : arrow.tableToIPC(table, 'file');
  const dictionary = dataDictionary(table, { file: basename(out), format: o.format, source: name, version: where.version ?? '', frame: o.frame ?? 'lab and cm', missingValues: MISSING[o.format] });
  writeFileAtomic(out, bytes);
  writeFileAtomic(`${out}.dictionary.json`, new TextEncoder().encode(`${JSON.stringify(dictionary, null, 2)}\n`));
  writeFileAtomic(`${out}.dictionary.md`, new TextEncoder().encode(dictionaryMarkdown(dictionary)));
  return { exitCode: EXIT.ok, diagnostics: [], written: [out, `${out}.dictionary.json`, `${out}.dictionary.md`] };
}
