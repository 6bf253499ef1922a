import type { CrossSectionRow } from '../../../pipeline/core/model/result-rows.js';
import { CHART_CONFIG, DENSE_PANEL_POINTS, errorBarLayers, withBars } from './chart-config.js';

export type ExcitationQuantity = 'ratio' | 'lab';

/** One point of an excitation function, as the chart's `points` data set holds it. */
export type ExcitationPoint = { detector: string; e: number } & ReturnType<typeof withBars>;

/** The `points` data set of one peak's excitation function (rows with no value left out). */
export function excitationPoints(rows: readonly CrossSectionRow[], quantity: ExcitationQuantity): ExcitationPoint[] {
  const out: ExcitationPoint[] = [];
  for (const r of rows) {
    const v = quantity === 'ratio' ? r.ratioToRutherford : r.crossSectionLabMbPerSr;
    if (!Number.isFinite(v)) continue;
    const bars = quantity === 'ratio' ? withBars(v, r.ratioToRutherfordStat, r.ratioToRutherfordSys) : withBars(v, r.crossSectionLabStatMbPerSr, r.crossSectionLabSysMbPerSr);
    out.push({ detector: `${r.detector} (${r.angleLabDeg}°)`, e: r.beamEnergyKeV, ...bars });
  }
  return out;
}

/** The most points any one detector panel of a data set holds. */
export function maxPanelPoints(points: readonly { detector: string }[]): number {
  const n = new Map<string, number>();
  let max = 0;
  for (const p of points) {
    const k = (n.get(p.detector) ?? 0) + 1;
    n.set(p.detector, k);
    if (k > max) max = k;
  }
  return max;
}

/**
 * vega-lite specification of an excitation function (σ/σ_R or dσ/dΩ lab against beam energy),
 * one panel per detector, reading the named data set `points` (see excitationPoints), so one
 * compiled view serves every peak: a point per row with statistical (dark) and total (light)
 * error bars. Dense data sets (isDense) are drawn by densePanelsSvg instead.
 */
export function excitationChartSpec(quantity: ExcitationQuantity): object {
  const x = { field: 'e', type: 'quantitative', title: EXCITATION_X_TITLE, scale: { zero: false } };
  return {
    data: { name: 'points' },
    facet: { field: 'detector', type: 'nominal', title: null },
    columns: 4,
    spec: { width: 210, height: 140, layer: errorBarLayers(x, excitationYTitle(quantity), undefined) },
    resolve: { scale: { y: 'independent' } },
    config: CHART_CONFIG,
  };
}

export const EXCITATION_X_TITLE = 'beam energy (keV)';
export const excitationYTitle = (quantity: ExcitationQuantity) => (quantity === 'ratio' ? 'σ/σ_R' : 'dσ/dΩ lab (mb/sr)');

/** Whether a data set has more than DENSE_PANEL_POINTS points in one panel (more than the panel's width in pixels). */
export const isDense = (points: readonly { detector: string }[]) => maxPanelPoints(points) > DENSE_PANEL_POINTS;
