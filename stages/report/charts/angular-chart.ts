import type { CrossSectionRow } from '../../../pipeline/core/model/result-rows.js';
import { CHART_CONFIG, errorBarLayers, withBars } from './chart-config.js';

/**
 * Beam energies to draw as angular distributions: those with at least two angles, at most
 * `max` of them spread evenly (first and last included). Returned in increasing order.
 */
export function angularEnergies(rows: readonly CrossSectionRow[], max: number): { shown: number[]; total: number } {
  const angles = new Map<number, Set<number>>();
  for (const r of rows) {
    if (!Number.isFinite(r.crossSectionCmMbPerSr)) continue;
    let s = angles.get(r.beamEnergyKeV);
    if (s === undefined) angles.set(r.beamEnergyKeV, (s = new Set()));
    s.add(r.angleCmDeg);
  }
  const all = [...angles].filter(([, s]) => s.size >= 2).map(([e]) => e).sort((a, b) => a - b);
  if (all.length <= max) return { shown: all, total: all.length };
  const k = Math.max(1, Math.floor(max));
  const shown = [...new Set(Array.from({ length: k }, (_, i) => all[k === 1 ? 0 : Math.round((i * (all.length - 1)) / (k - 1))]!))];
  return { shown, total: all.length };
}

/**
 * vega-lite specification of the angular distributions: dσ/dΩ (CM) against θ (CM), one panel
 * per beam energy, one colour per peak, statistical (dark) and total (light) error bars.
 */
export function angularChartSpec(rows: readonly CrossSectionRow[], energiesKeV: readonly number[]): object | null {
  const keep = new Set(energiesKeV);
  const values = rows
    .filter((r) => keep.has(r.beamEnergyKeV) && Number.isFinite(r.crossSectionCmMbPerSr))
    .map((r) => ({ energy: r.beamEnergyKeV, peak: r.peak, theta: r.angleCmDeg, ...withBars(r.crossSectionCmMbPerSr, r.crossSectionCmStatMbPerSr, r.crossSectionCmSysMbPerSr) }));
  if (values.length === 0) return null;
  const x = { field: 'theta', type: 'quantitative', title: 'θ CM (deg)', scale: { zero: false } };
  return {
    data: { values },
    facet: { field: 'energy', type: 'ordinal', title: 'beam energy (keV)', sort: 'ascending' },
    columns: 4,
    spec: { width: 210, height: 140, layer: errorBarLayers(x, 'dσ/dΩ CM (mb/sr)', { field: 'peak', type: 'nominal', title: 'peak' }) },
    resolve: { scale: { y: 'independent' } },
    config: CHART_CONFIG,
  };
}
