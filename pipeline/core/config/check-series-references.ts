import { elementZ, naturalIsotopes, nuclide, parseNuclideName } from '../physics/nuclides.js';
import type { SeriesConfig } from './series-schema.js';

/** A cross-field problem of a series configuration, located by its path in the document. */
export interface ConfigIssue {
  path: (string | number)[];
  severity: 'error' | 'warning';
  rule: string;
  message: string;
  hint?: string;
  expected?: string;
  /** The problem is the mapping key at `path` (a composition key), not its value. */
  atKey?: boolean;
}

/** The parts of a series configuration (series.yaml or a simulation spec) the checks read. */
export type SeriesReferences = Pick<SeriesConfig, 'beam' | 'detectors' | 'targets' | 'peaks'> & Partial<Pick<SeriesConfig, 'calibration_sources'>> & {
  normalization: Pick<SeriesConfig['normalization'], 'reference_target' | 'reference_element'> & Partial<Pick<SeriesConfig['normalization'], 'method' | 'monitor_detector'>>;
};

function knownNuclide(name: string): boolean {
  try {
    nuclide(name);
    return true;
  } catch {
    return false;
  }
}

/**
 * Checks a per-field schema cannot state, shared by ingest and the simulator: ids unique,
 * nuclides and elements in the mass and abundance tables, referenced targets and elements
 * defined, and (a warning) a peak whose nuclide no target contains.
 */
export function checkSeriesReferences(config: SeriesReferences): ConfigIssue[] {
  const issues: ConfigIssue[] = [];
  const error = (path: ConfigIssue['path'], rule: string, message: string, extra: Partial<ConfigIssue> = {}) => issues.push({ path, severity: 'error', rule, message, ...extra });
  const unique = (ids: string[], list: string, key: string, what: string) => {
    const seen = new Set<string>();
    ids.forEach((v, i) => {
      if (seen.has(v)) error([list, i, key], 'series-duplicate-id', `${what} "${v}" is defined twice`);
      seen.add(v);
    });
  };
  unique(config.detectors.map((d) => d.id), 'detectors', 'id', 'detector');
  unique(config.targets.map((t) => t.id), 'targets', 'id', 'target');
  unique(config.peaks.map((p) => p.label), 'peaks', 'label', 'peak label');

  if (!knownNuclide(config.beam.projectile)) error(['beam', 'projectile'], 'series-unknown-nuclide', `projectile "${config.beam.projectile}" is not in the AME2020 mass table`, { hint: 'write it as mass number + symbol, e.g. 4He, 1H' });
  const nuclidesInTargets = new Set<string>();
  config.targets.forEach((t, ti) =>
    t.layers.forEach((l, li) => {
      for (const key of Object.keys(l.composition)) {
        const path = ['targets', ti, 'layers', li, 'composition', key];
        if (parseNuclideName(key) !== null) {
          if (knownNuclide(key)) nuclidesInTargets.add(key);
          else error(path, 'series-unknown-nuclide', `nuclide "${key}" is not in the AME2020 mass table`, { atKey: true });
        } else if (elementZ(key) === undefined) {
          error(path, 'series-unknown-element', `"${key}" is not an element symbol`, { hint: "write elements as 'Au', 'C'; nuclides as '13C'", atKey: true });
        } else {
          try {
            for (const iso of naturalIsotopes(key)) nuclidesInTargets.add(iso.nuclide.name);
          } catch {
            error(path, 'series-no-abundance', `no natural isotopic composition is tabulated for ${key}`, { hint: `name its nuclides explicitly, e.g. { 232${key}: 1 }`, atKey: true });
          }
        }
      }
    }),
  );
  config.peaks.forEach((p, i) => {
    if (!knownNuclide(p.target_nuclide)) error(['peaks', i, 'target_nuclide'], 'series-unknown-nuclide', `target_nuclide "${p.target_nuclide}" is not in the AME2020 mass table`);
    else if (!nuclidesInTargets.has(p.target_nuclide)) {
      issues.push({ path: ['peaks', i, 'target_nuclide'], severity: 'warning', rule: 'series-peak-not-in-targets', message: `no target contains ${p.target_nuclide}; peak "${p.label}" will give no rows` });
    }
  });
  const method = config.normalization.method ?? 'reference-run';
  const needsReferenceTarget = method === 'reference-run' || method === 'monitor';
  if (method === 'monitor') {
    const m = config.normalization.monitor_detector;
    if (m === undefined) error(['normalization', 'monitor_detector'], 'series-monitor-detector', 'method monitor needs normalization.monitor_detector, the detector whose reference-element yield normalizes each run', { expected: config.detectors.map((d) => d.id).join(', ') });
    else if (!config.detectors.some((d) => d.id === m)) error(['normalization', 'monitor_detector'], 'series-monitor-detector', `monitor_detector "${m}" is not a detector id`, { expected: config.detectors.map((d) => d.id).join(', ') });
  }
  if (method === 'internal-reference' && !config.targets.some((t) => t.layers.some((l) => l.role === 'reference'))) {
    error(['normalization', 'method'], 'series-no-reference-layer', 'method internal-reference needs a layer marked role: reference in the sample targets', { hint: 'add role: reference to the thin heavy layer of each sample target' });
  }
  const ref = config.targets.find((t) => t.id === config.normalization.reference_target);
  if (config.normalization.reference_target === undefined) {
    if (needsReferenceTarget) error(['normalization', 'reference_target'], 'series-unknown-target', `method ${method} needs normalization.reference_target, the target of the reference runs`, { expected: config.targets.map((t) => t.id).join(', ') });
  } else if (ref === undefined) {
    error(['normalization', 'reference_target'], 'series-unknown-target', `reference_target "${config.normalization.reference_target}" is not a target id`, { expected: config.targets.map((t) => t.id).join(', ') });
  } else if (config.normalization.reference_element !== undefined) {
    const el = config.normalization.reference_element;
    const has = ref.layers.some((l) => Object.keys(l.composition).some((k) => k === el || parseNuclideName(k)?.symbol === el));
    if (!has) error(['normalization', 'reference_element'], 'series-reference-element', `reference_element ${el} is not in reference target ${ref.id}`);
  }
  (config.calibration_sources ?? []).forEach((c, i) => {
    if (c.target !== undefined && !config.targets.some((t) => t.id === c.target)) {
      error(['calibration_sources', i, 'target'], 'series-unknown-target', `calibration source "${c.id}" names target "${c.target}", which is not a target id`, { expected: config.targets.map((t) => t.id).join(', ') });
    }
  });
  return issues;
}
