import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { loadYaml, zodIssuesToDiagnostics, type YamlSource } from '../../pipeline/core/formats/yaml-source.js';
import { seriesSchema, type SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { elementZ, naturalIsotopes, nuclide, parseNuclideName } from '../../pipeline/core/physics/nuclides.js';

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
  const err = (path: (string | number)[], rule: string, message: string, extra: Partial<Diagnostic> = {}) =>
    diagnostics.push({ severity: 'error', rule, message, file, ...(src.locate(path) ?? {}), stage: 'ingest', ...extra });
  const warn = (path: (string | number)[], rule: string, message: string, extra: Partial<Diagnostic> = {}) =>
    diagnostics.push({ severity: 'warning', rule, message, file, ...(src.locate(path) ?? {}), stage: 'ingest', ...extra });

  const unique = (items: readonly { v: string }[], path: string, key: string, what: string) => {
    const seen = new Set<string>();
    items.forEach(({ v }, i) => {
      if (seen.has(v)) err([path, i, key], 'series-duplicate-id', `${what} "${v}" is defined twice`);
      seen.add(v);
    });
  };
  unique(config.detectors.map((d) => ({ v: d.id })), 'detectors', 'id', 'detector');
  unique(config.targets.map((t) => ({ v: t.id })), 'targets', 'id', 'target');
  unique(config.peaks.map((p) => ({ v: p.label })), 'peaks', 'label', 'peak label');

  const knownNuclide = (name: string) => {
    try {
      nuclide(name);
      return true;
    } catch {
      return false;
    }
  };
  if (!knownNuclide(config.beam.projectile)) err(['beam', 'projectile'], 'series-unknown-nuclide', `projectile "${config.beam.projectile}" is not in the AME2020 mass table`);

  const nuclidesInTargets = new Set<string>();
  config.targets.forEach((t, ti) =>
    t.layers.forEach((l, li) => {
      for (const key of Object.keys(l.composition)) {
        const path = ['targets', ti, 'layers', li, 'composition', key];
        const keyAt = src.locateKey?.(path);
        if (parseNuclideName(key) !== null) {
          if (knownNuclide(key)) nuclidesInTargets.add(key);
          else err(path, 'series-unknown-nuclide', `nuclide "${key}" is not in the AME2020 mass table`);
        } else if (elementZ(key) === undefined) {
          err(path, 'series-unknown-element', `"${key}" is not an element symbol`, { hint: "write elements as 'Au', 'C'; nuclides as '13C'", ...(keyAt ?? {}) });
        } else {
          try {
            for (const iso of naturalIsotopes(key)) nuclidesInTargets.add(iso.nuclide.name);
          } catch {
            err(path, 'series-no-abundance', `no natural isotopic composition is tabulated for ${key}`, { hint: `name the nuclides explicitly, e.g. { 1${key}: 1 }` });
          }
        }
      }
    }),
  );

  config.peaks.forEach((p, i) => {
    if (!knownNuclide(p.target_nuclide)) err(['peaks', i, 'target_nuclide'], 'series-unknown-nuclide', `target_nuclide "${p.target_nuclide}" is not in the AME2020 mass table`);
    else if (!nuclidesInTargets.has(p.target_nuclide)) warn(['peaks', i, 'target_nuclide'], 'series-peak-not-in-targets', `no target contains ${p.target_nuclide}; peak "${p.label}" will give no rows`);
  });

  const ref = config.targets.find((t) => t.id === config.normalization.reference_target);
  if (ref === undefined) {
    err(['normalization', 'reference_target'], 'series-unknown-target', `reference_target "${config.normalization.reference_target}" is not a target id`, {
      expected: config.targets.map((t) => t.id).join(', '),
    });
  } else if (config.normalization.reference_element !== undefined) {
    const el = config.normalization.reference_element;
    const has = ref.layers.some((l) => Object.keys(l.composition).some((k) => k === el || parseNuclideName(k)?.symbol === el));
    if (!has) err(['normalization', 'reference_element'], 'series-reference-element', `reference_element ${el} is not in reference target ${ref.id}`);
  }
  return { config: diagnostics.some((d) => d.severity === 'error') ? null : config, source: src, diagnostics };
}
