import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { StoppingTable } from '../../pipeline/core/physics/stopping/stopping-table.js';
import { parseUserStoppingTables, type UserStoppingTables } from '../../pipeline/core/physics/stopping/user-stopping-table.js';

/**
 * The user stopping tables series.yaml lists (physics.stopping_tables), merged in order: a later
 * file's table for the same material and projectile adds to the list the stopping code searches.
 * A missing file or a bad row is a series error: the physics the series asks for cannot be done
 * as asked without it.
 */
export function readStoppingTables(files: readonly string[], readFile: (rel: string) => { file: string; text: string } | null): { tables: UserStoppingTables | undefined; diagnostics: Diagnostic[]; fatal: boolean } {
  const diagnostics: Diagnostic[] = [];
  if (files.length === 0) return { tables: undefined, diagnostics, fatal: false };
  const merged = new Map<string, StoppingTable[]>();
  let fatal = false;
  for (const rel of files) {
    const f = readFile(rel);
    if (f === null) {
      fatal = true;
      diagnostics.push({ severity: 'error', rule: 'series-missing-file', stage: 'ingest', file: 'series.yaml', message: `stopping table ${rel} (physics.stopping_tables) does not exist in the series folder` });
      continue;
    }
    const parsed = parseUserStoppingTables(f.text, f.file);
    diagnostics.push(...parsed.diagnostics.map((d) => ({ ...d, stage: d.stage ?? ('ingest' as const) })));
    // A dropped row would change the physics without a trace in the results: the series stops instead.
    if (parsed.diagnostics.some((d) => d.severity === 'error')) fatal = true;
    for (const [material, list] of parsed.tables) merged.set(material, [...(merged.get(material) ?? []), ...list]);
  }
  return { tables: merged, diagnostics, fatal };
}
