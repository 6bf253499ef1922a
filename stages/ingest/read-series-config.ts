import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { loadYaml, zodIssuesToDiagnostics, type YamlSource } from '../../pipeline/core/formats/yaml-source.js';
import { seriesSchema, type SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { checkSeriesReferences } from '../../pipeline/core/config/check-series-references.js';

/** Parses and cross-checks series.yaml. Any error here is series-level: the series stops. */
export function readSeriesConfig(text: string, file: string): { config: SeriesConfig | null; source: YamlSource | null; diagnostics: Diagnostic[] } {
  const loaded = loadYaml(text, file);
  if (loaded.source === null) return { config: null, source: null, diagnostics: loaded.diagnostics };
  const src = loaded.source;
  const parsed = seriesSchema.safeParse(src.value);
  if (!parsed.success) {
    return { config: null, source: src, diagnostics: [...loaded.diagnostics, ...zodIssuesToDiagnostics(parsed.error.issues, src, 'ingest', 'series')] };
  }
  const config = parsed.data;
  const diagnostics: Diagnostic[] = [...loaded.diagnostics];
  for (const { path, atKey, ...issue } of checkSeriesReferences(config)) {
    const at = (atKey ? src.locateKey?.(path) : undefined) ?? src.locate(path) ?? {};
    diagnostics.push({ ...issue, file, ...at, stage: 'ingest' });
  }
  return { config: diagnostics.some((d) => d.severity === 'error') ? null : config, source: src, diagnostics };
}
