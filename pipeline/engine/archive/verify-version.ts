import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';

export const VERSION_TABLES = ['cross_sections.arrow', 'normalization.arrow', 'yields.arrow', 'qc.arrow'] as const;

/**
 * Reads a built version back before it is published: every Arrow table opens and has a
 * schema, cross_sections.arrow has the expected number of rows, manifest.json and
 * diagnostics.json parse, summary.html is there when asked for. Throws an Error naming the
 * first problem.
 */
export function verifyVersion(dir: string, expectedRows: number, html: boolean): void {
  for (const name of VERSION_TABLES) {
    const p = join(dir, name);
    if (!existsSync(p)) throw new Error(`${p}: missing`);
    const t = arrow.tableFromIPC(readFileSync(p));
    if (t.schema.fields.length === 0) throw new Error(`${p}: no columns`);
    if (name === 'cross_sections.arrow' && t.numRows !== expectedRows) throw new Error(`${p}: ${t.numRows} rows read back, ${expectedRows} written`);
  }
  for (const name of ['manifest.json', 'diagnostics.json']) JSON.parse(readFileSync(join(dir, name), 'utf8'));
  if (html && !existsSync(join(dir, 'summary.html'))) throw new Error(`${join(dir, 'summary.html')}: missing`);
}
