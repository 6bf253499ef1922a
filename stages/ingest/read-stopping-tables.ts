import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { nistMaterials } from '../../pipeline/core/physics/stopping/nist-star-materials.js';
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

/**
 * Every `stopping_material` a layer or foil names must be a user table's material or a NIST
 * material: checked once here, so a typo is one series error, not a failure in every run.
 */
export function checkStoppingMaterials(config: SeriesConfig, tables: UserStoppingTables | undefined): Diagnostic[] {
  const known = new Set([...nistMaterials().keys(), ...(tables?.keys() ?? [])]);
  const out: Diagnostic[] = [];
  const check = (name: string | undefined, where: string) => {
    if (name !== undefined && !known.has(name)) {
      out.push({ severity: 'error', rule: 'series-unknown-stopping-material', stage: 'ingest', file: 'series.yaml', message: `${where}: stopping_material "${name}" is neither a material of physics.stopping_tables nor a NIST material`, expected: [...known].join(', ') });
    }
  };
  for (const t of config.targets) t.layers.forEach((l, i) => check(l.stopping_material, `target ${t.id}, layer ${i + 1}`));
  for (const d of config.detectors) {
    d.absorber.forEach((f, i) => check(f.stopping_material, `detector ${d.id}, absorber ${i + 1}`));
    check(d.dead_layer?.stopping_material, `detector ${d.id}, dead layer`);
  }
  return out;
}
