import { CHART_CONFIG } from './chart-config.js';

export interface RunTrendPoint {
  /** Position of the run in runlog.csv (0-based). */
  order: number;
  run: string;
  detector: string;
  value: number;
}

/**
 * vega-lite specification of a per-run figure against run order, one line per detector
 * (dead time per run, the peak centroid shift that shows gain drift). Lines, not points, so a
 * 1,000-run series stays a handful of SVG paths.
 */
export function runTrendChartSpec(points: readonly RunTrendPoint[], yTitle: string): object | null {
  const values = points.filter((p) => Number.isFinite(p.value));
  if (values.length === 0) return null;
  const many = new Set(values.map((p) => p.order)).size > 60;
  return {
    data: { values },
    width: 700,
    height: 170,
    mark: { type: 'line', point: many ? false : { size: 18, filled: true }, strokeWidth: 1.2 },
    encoding: {
      x: { field: 'order', type: 'quantitative', title: 'run (position in runlog.csv, from 0)', scale: { zero: false } },
      y: { field: 'value', type: 'quantitative', title: yTitle, scale: { zero: false } },
      color: { field: 'detector', type: 'nominal', title: 'detector' },
    },
    config: CHART_CONFIG,
  };
}
