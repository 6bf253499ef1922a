import type { CrossSectionRow } from '../../../pipeline/core/model/result-rows.js';
import { CHART_CONFIG, errorBarLayers, withBars } from './chart-config.js';

export type ExcitationQuantity = 'ratio' | 'lab';

/**
 * vega-lite specification of one peak's excitation function: σ/σ_R or dσ/dΩ (lab) against
 * beam energy, one panel per detector, statistical error bars (dark) and total ones (light).
 * Null when no row of the peak has a value.
 */
export function excitationChartSpec(rows: readonly CrossSectionRow[], quantity: ExcitationQuantity): object | null {
  const values = rows
    .filter((r) => Number.isFinite(quantity === 'ratio' ? r.ratioToRutherford : r.crossSectionLabMbPerSr))
    .map((r) => ({
      detector: `${r.detector} (${r.angleLabDeg}°)`,
      e: r.beamEnergyKeV,
      ...(quantity === 'ratio'
        ? withBars(r.ratioToRutherford, r.ratioToRutherfordStat, r.ratioToRutherfordSys)
        : withBars(r.crossSectionLabMbPerSr, r.crossSectionLabStatMbPerSr, r.crossSectionLabSysMbPerSr)),
    }));
  if (values.length === 0) return null;
  const yTitle = quantity === 'ratio' ? 'σ/σ_R' : 'dσ/dΩ lab (mb/sr)';
  const x = { field: 'e', type: 'quantitative', title: 'beam energy (keV)', scale: { zero: false } };
  return {
    data: { values },
    facet: { field: 'detector', type: 'nominal', title: null },
    columns: 4,
    spec: { width: 210, height: 140, layer: errorBarLayers(x, yTitle, undefined) },
    resolve: { scale: { y: 'independent' } },
    config: CHART_CONFIG,
  };
}
