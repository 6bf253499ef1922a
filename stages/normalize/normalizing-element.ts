import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import { elementZ } from '../../pipeline/core/physics/nuclides.js';
import { referenceComposition } from './reference-nuclides.js';

/**
 * The element whose Rutherford yield normalizes, by method:
 * reference-run and monitor: `normalization.reference_element`, else the heaviest element of the
 * reference target (referenceComposition); internal-reference: `reference_element`, else the
 * heaviest element of the layers marked role: reference; absolute: none (null).
 */
export function normalizingElement(config: SeriesConfig): string | null {
  const n = config.normalization;
  if (n.method === 'absolute') return null;
  if (n.method !== 'internal-reference') return referenceComposition(config).element;
  if (n.reference_element !== undefined) return n.reference_element;
  const elements = new Set<string>();
  for (const t of config.targets) {
    const resolved = resolveTarget(t);
    for (const r of resolved) if (t.layers[r.layer]!.role === 'reference') elements.add(r.element);
  }
  return [...elements].sort((a, b) => (elementZ(b) ?? 0) - (elementZ(a) ?? 0))[0] ?? null;
}
